#!/usr/bin/env node
// Builds the prebuilt (federated) labextension from npm packages alone.
// JupyterLab's core metadata (@jupyterlab/core-meta) stands in for an installed
// JupyterLab: it tells the builder which packages the host shares as singletons.
import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { createRequire } from 'node:module';
import { fileURLToPath } from 'node:url';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const require = createRequire(path.join(root, 'package.json'));

const coreDir = path.join(root, '.core-meta');
fs.mkdirSync(coreDir, { recursive: true });
const coreMeta = JSON.parse(fs.readFileSync(require.resolve('@jupyterlab/core-meta/core.package.json'), 'utf8'));
// The metadata pins patch releases (~4.6.6); the extension works with any
// JupyterLab of the same minor line, so require ^major.minor.0 instead and
// avoid "unsatisfied version" warnings in labs a patch release behind.
const relax = ranges => {
  for (const [name, range] of Object.entries(ranges ?? {})) {
    const m = /^~(\d+)\.(\d+)\.\d+$/.exec(range);
    if (m) {
      ranges[name] = `^${m[1]}.${m[2]}.0`;
    }
  }
};
relax(coreMeta.dependencies);
relax(coreMeta.resolutions);
fs.writeFileSync(path.join(coreDir, 'package.json'), JSON.stringify(coreMeta, null, 2));

// The builder adds to its output folder; start clean so stale chunks never ship.
const pkgJson = JSON.parse(fs.readFileSync(path.join(root, 'package.json'), 'utf8'));
fs.rmSync(path.join(root, pkgJson.jupyterlab.outputDir), { recursive: true, force: true });

const builder = require.resolve('@jupyterlab/builder/lib/build-labextension.js');
const args = [builder, '--core-path', coreDir];
if (process.argv.includes('--development')) {
  args.push('--development');
}
args.push(root);
execFileSync(process.execPath, args, { stdio: 'inherit', cwd: root });

// Sanity: the output must be loadable as a federated extension.
const out = path.join(root, pkgJson.jupyterlab.outputDir);
const built = JSON.parse(fs.readFileSync(path.join(out, 'package.json'), 'utf8'));
const load = built.jupyterlab?._build?.load;
if (!load || !fs.existsSync(path.join(out, load))) {
  console.error(`labextension build is incomplete: no _build.load entry in ${out}/package.json`);
  process.exit(1);
}
console.log(`labextension: ${path.relative(root, out)} (${load})`);
