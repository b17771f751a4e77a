#!/usr/bin/env node
// Builds the kernel-free demo lab into demo/dist:
//   static/      the host application (webpack, built once, reused while its inputs are unchanged)
//   extensions/  the prebuilt psiscape labextension, loaded by the host as a federated extension
//   schemas/     every plugin's settings schema (all.json core, all_federated.json extensions)
//   themes/      light and dark themes
//   api/, files/ the demo notebooks, served as read-only "server" contents; edits live in the browser
import fs from 'node:fs';
import path from 'node:path';
import { createRequire } from 'node:module';
import { fileURLToPath } from 'node:url';
import { execFileSync } from 'node:child_process';

const demoDir = path.dirname(fileURLToPath(import.meta.url));
const root = path.resolve(demoDir, '..');
const require = createRequire(path.join(root, 'package.json'));
const buildDir = path.join(demoDir, 'build');
const distDir = path.join(demoDir, 'dist');
const notebooksDir = path.join(demoDir, 'notebooks');

const log = msg => console.log(`[demo] ${msg}`);

/** Newest modification time of the host's inputs. */
function hostInputsMtime() {
  const files = ['host/bootstrap.js', 'host/main.js', 'host/start-lab.js', 'host/shared-modules.js', 'host/extensions.js', 'host/webpack.config.js'].map(f => path.join(demoDir, f));
  files.push(path.join(root, 'package-lock.json'));
  return Math.max(...files.map(f => fs.statSync(f).mtimeMs));
}

function buildHost(force) {
  const stamp = path.join(buildDir, 'entry.json');
  if (!force && fs.existsSync(stamp) && fs.statSync(stamp).mtimeMs > hostInputsMtime()) {
    log('host application is up to date');
    return;
  }
  log('building the host application (webpack; about two minutes on two cores)');
  const t0 = Date.now();
  execFileSync(process.execPath, [require.resolve('webpack-cli/bin/cli.js'), '--config', path.join(demoDir, 'host/webpack.config.js')], {
    stdio: 'inherit',
    cwd: root
  });
  log(`host built in ${((Date.now() - t0) / 1000).toFixed(0)} s`);
}

function writeJson(file, data) {
  fs.mkdirSync(path.dirname(file), { recursive: true });
  fs.writeFileSync(file, JSON.stringify(data));
}

/** Every schema under a folder laid out as <package>/<plugin>.json. */
function collectSchemas(schemasRoot) {
  const out = [];
  const walk = dir => {
    for (const entry of fs.readdirSync(dir, { withFileTypes: true })) {
      const full = path.join(dir, entry.name);
      if (entry.isDirectory()) {
        walk(full);
      } else if (entry.name.endsWith('.json') && entry.name !== 'package.json.orig') {
        const rel = path.relative(schemasRoot, full);
        const pkgName = path.dirname(rel).split(path.sep).join('/');
        const plugin = path.basename(rel, '.json');
        const pkgFile = path.join(path.dirname(full), 'package.json.orig');
        const version = fs.existsSync(pkgFile) ? JSON.parse(fs.readFileSync(pkgFile, 'utf8')).version : '0.0.0';
        out.push({ id: `${pkgName}:${plugin}`, raw: '{}', schema: JSON.parse(fs.readFileSync(full, 'utf8')), settings: {}, version });
      }
    }
  };
  if (fs.existsSync(schemasRoot)) {
    walk(schemasRoot);
  }
  return out;
}

/** Jupyter servers join multi-line strings of a notebook; do the same at build time. */
function joinNotebook(nb) {
  const join = v => (Array.isArray(v) ? v.join('') : v);
  for (const cell of nb.cells) {
    cell.source = join(cell.source);
    for (const output of cell.outputs ?? []) {
      if (output.text !== undefined) {
        output.text = join(output.text);
      }
      for (const [mime, value] of Object.entries(output.data ?? {})) {
        if (!mime.endsWith('json')) {
          output.data[mime] = join(value);
        }
      }
    }
  }
  return nb;
}

function assemble() {
  const extPkg = JSON.parse(fs.readFileSync(path.join(root, 'package.json'), 'utf8'));
  const extOut = path.join(root, extPkg.jupyterlab.outputDir);
  const built = JSON.parse(fs.readFileSync(path.join(extOut, 'package.json'), 'utf8'));

  fs.rmSync(distDir, { recursive: true, force: true });
  fs.mkdirSync(distDir, { recursive: true });
  fs.cpSync(path.join(buildDir, 'static'), path.join(distDir, 'static'), { recursive: true });
  fs.cpSync(path.join(buildDir, 'themes'), path.join(distDir, 'themes'), { recursive: true });
  fs.cpSync(extOut, path.join(distDir, 'extensions', extPkg.name), { recursive: true });

  // Settings schemas: core packages, then the federated extension's own.
  writeJson(path.join(distDir, 'schemas', 'all.json'), collectSchemas(path.join(buildDir, 'schemas')));
  writeJson(path.join(distDir, 'schemas', 'all_federated.json'), collectSchemas(path.join(extOut, 'schemas')));

  // Translations: English only, no language packs.
  writeJson(path.join(distDir, 'api', 'translations', 'all.json'), {
    data: { en: { displayName: 'English', nativeName: 'English' } },
    message: ''
  });
  writeJson(path.join(distDir, 'api', 'translations', 'en.json'), { data: {}, message: '' });

  // Contents: the committed notebooks and their data files.
  const listing = [];
  const stamp = new Date(0).toISOString();
  for (const name of fs.readdirSync(notebooksDir).sort()) {
    const src = path.join(notebooksDir, name);
    if (!fs.statSync(src).isFile()) {
      continue;
    }
    const isNotebook = name.endsWith('.ipynb');
    const text = isNotebook ? JSON.stringify(joinNotebook(JSON.parse(fs.readFileSync(src, 'utf8')))) : fs.readFileSync(src, 'utf8');
    fs.mkdirSync(path.join(distDir, 'files'), { recursive: true });
    fs.writeFileSync(path.join(distDir, 'files', name), text);
    listing.push({
      name,
      path: name,
      type: isNotebook ? 'notebook' : 'file',
      format: null,
      mimetype: isNotebook ? 'application/x-ipynb+json' : name.endsWith('.csv') ? 'text/csv' : 'text/plain',
      size: Buffer.byteLength(text),
      created: stamp,
      last_modified: stamp,
      writable: true,
      content: null
    });
  }
  writeJson(path.join(distDir, 'api', 'contents', 'all.json'), {
    name: '',
    path: '',
    type: 'directory',
    format: 'json',
    mimetype: '',
    created: stamp,
    last_modified: stamp,
    writable: true,
    content: listing
  });

  const { files } = JSON.parse(fs.readFileSync(path.join(buildDir, 'entry.json'), 'utf8'));
  const ext = built.jupyterlab;
  const config = {
    appName: 'psiscape demo lab',
    appVersion: require('@jupyterlab/application/package.json').version,
    baseUrl: '/',
    appUrl: '/lab',
    fullStaticUrl: '/static',
    fullLabextensionsUrl: '/extensions',
    settingsUrl: '/schemas',
    themesUrl: '/themes',
    contentsAllJsonFile: 'all.json',
    notebookStartsKernel: 'false',
    defaultKernelName: '',
    treePath: '',
    openPath: 'am17-demo.ipynb',
    federated_extensions: [
      {
        name: extPkg.name,
        load: ext._build.load,
        extension: ext._build.extension,
        mimeExtension: ext._build.mimeExtension,
        style: ext._build.style
      }
    ]
  };
  const scripts = files.filter(f => f.endsWith('.js')).map(f => `<script defer src="/static/${f}"></script>`).join('\n    ');
  const html = `<!doctype html>
<html lang="en">
  <head>
    <meta charset="utf-8" />
    <title>psiscape demo lab</title>
    <script id="jupyter-config-data" type="application/json">${JSON.stringify(config)}</script>
    ${scripts}
  </head>
  <body></body>
</html>
`;
  fs.mkdirSync(path.join(distDir, 'lab'), { recursive: true });
  fs.writeFileSync(path.join(distDir, 'lab', 'index.html'), html);
  fs.writeFileSync(path.join(distDir, 'index.html'), '<!doctype html><meta http-equiv="refresh" content="0; url=/lab/index.html">');
  log(`assembled ${path.relative(root, distDir)} (${listing.length} files in contents)`);
}

export function buildDemo({ forceHost = false } = {}) {
  buildHost(forceHost);
  assemble();
}

if (process.argv[1] && fileURLToPath(import.meta.url) === path.resolve(process.argv[1])) {
  buildDemo({ forceHost: process.argv.includes('--force') });
}
