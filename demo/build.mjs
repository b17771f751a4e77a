#!/usr/bin/env node
// Builds the kernel-free demo lab into demo/dist:
//   static/      the lab frontend (webpack into demo/build, reused while its inputs are unchanged;
//                the server flavour, demo/server/serve.py, serves the same build)
//   extensions/  the prebuilt psiscape labextension, loaded by the host as a federated extension
//   schemas/     every plugin's settings schema (all.json core, all_federated.json extensions)
//   themes/      light and dark themes
//   api/, files/ the demo notebooks, served as read-only "server" contents; edits live in the browser
import fs from 'node:fs';
import path from 'node:path';
import { createRequire } from 'node:module';
import { fileURLToPath } from 'node:url';
import { execFileSync } from 'node:child_process';
import { runStep } from '../scripts/steps.mjs';

const demoDir = path.dirname(fileURLToPath(import.meta.url));
const root = path.resolve(demoDir, '..');
const require = createRequire(path.join(root, 'package.json'));
const buildDir = path.join(demoDir, 'build');
const distDir = path.join(demoDir, 'dist');
const notebooksDir = path.join(demoDir, 'notebooks');

const log = msg => console.log(`[demo] ${msg}`);

/** The host's own sources: any change rebuilds it. */
const HOST_INPUTS = ['bootstrap.js', 'main.js', 'start-lab.js', 'shared-modules.js', 'extensions.js', 'webpack.config.js'];

/** Newest modification time of the host's inputs. */
function hostInputsMtime() {
  const files = HOST_INPUTS.map(f => path.join(demoDir, 'host', f));
  files.push(path.join(root, 'package-lock.json'));
  return Math.max(...files.map(f => fs.statSync(f).mtimeMs));
}

/** True when the host build (both flavours) is present and newer than its inputs. */
export function hostUpToDate() {
  const stamp = path.join(buildDir, 'entry.json');
  const needed = [stamp, path.join(buildDir, 'templates', 'index.html'), path.join(buildDir, 'schemas'), path.join(buildDir, 'themes')];
  return needed.every(f => fs.existsSync(f)) && fs.statSync(stamp).mtimeMs > hostInputsMtime();
}

function webpackArgs() {
  return [require.resolve('webpack-cli/bin/cli.js'), '--config', path.join(demoDir, 'host/webpack.config.js'), '--stats', 'errors-warnings'];
}

/**
 * Build the one lab frontend both flavours run on (blocking; output shown),
 * unless it is up to date. Set PSISCAPE_MINIFY=1 for a minified build.
 */
export function buildHost({ force = false } = {}) {
  if (!force && hostUpToDate()) {
    log('host application is up to date');
    return;
  }
  log('building the host application (webpack, no minification; about 20 s on two cores, less with a warm cache)');
  const t0 = Date.now();
  fs.rmSync(path.join(buildDir, 'entry.json'), { force: true });
  execFileSync(process.execPath, webpackArgs(), { stdio: 'inherit', cwd: root });
  if (!fs.existsSync(path.join(buildDir, 'entry.json'))) {
    throw new Error('the host build did not complete (no demo/build/entry.json)');
  }
  log(`host built in ${((Date.now() - t0) / 1000).toFixed(0)} s`);
}

/**
 * The same as one progress step (for `npm start`): resolves when the host is built.
 * @param {string} tag prefix of the progress lines
 */
export async function buildHostStep(tag, { force = false } = {}) {
  if (!force && hostUpToDate()) {
    return false;
  }
  fs.rmSync(path.join(buildDir, 'entry.json'), { force: true });
  await runStep(tag, 'building the lab frontend (webpack)', process.execPath, webpackArgs(), { cwd: root });
  if (!fs.existsSync(path.join(buildDir, 'entry.json'))) {
    throw new Error('the host build did not complete (no demo/build/entry.json)');
  }
  return true;
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
    // The flavour demo/host/main.js starts: contents and settings in the browser.
    labFlavour: 'in-browser',
    // As a Jupyter server's page says: JupyterLab then restores the main area's dock layout on reload.
    mode: 'multiple-document',
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
  buildHost({ force: forceHost });
  assemble();
}

export { assemble as assembleDemo };

if (process.argv[1] && fileURLToPath(import.meta.url) === path.resolve(process.argv[1])) {
  buildDemo({ forceHost: process.argv.includes('--force') });
}
