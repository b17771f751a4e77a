#!/usr/bin/env node
// Builds the server-flavoured lab into demo/server/build (static/, templates/,
// schemas/, themes/), skipped while its inputs are unchanged. The Jupyter
// server launcher (serve.py) serves that folder. `--force` rebuilds.
import fs from 'node:fs';
import path from 'node:path';
import { createRequire } from 'node:module';
import { fileURLToPath } from 'node:url';
import { execFileSync } from 'node:child_process';

const serverDir = path.dirname(fileURLToPath(import.meta.url));
const root = path.resolve(serverDir, '..', '..');
const require = createRequire(path.join(root, 'package.json'));
export const buildDir = path.join(serverDir, 'build');
const stamp = path.join(buildDir, 'entry.json');

const log = msg => console.log(`[server-lab] ${msg}`);

/** Newest modification time of the build's inputs. */
function inputsMtime() {
  const files = ['main.js', 'webpack.config.js', 'build.mjs', '../host/bootstrap.js', '../host/start-lab.js', '../host/shared-modules.js'].map(f => path.join(serverDir, f));
  files.push(path.join(serverDir, '..', 'host', 'extensions.js'), path.join(root, 'package-lock.json'));
  return Math.max(...files.map(f => fs.statSync(f).mtimeMs));
}

/** True when the build is present and newer than every input. */
export function serverLabUpToDate() {
  const needed = [stamp, path.join(buildDir, 'templates', 'index.html'), path.join(buildDir, 'schemas'), path.join(buildDir, 'themes')];
  return needed.every(f => fs.existsSync(f)) && fs.statSync(stamp).mtimeMs > inputsMtime();
}

/** Build the server-flavoured lab unless it is up to date. */
export function buildServerLab({ force = false } = {}) {
  if (!force && serverLabUpToDate()) {
    log('server-flavoured lab is up to date');
    return;
  }
  log('building the server-flavoured lab (webpack; about two minutes on two cores)');
  const t0 = Date.now();
  fs.rmSync(stamp, { force: true });
  execFileSync(process.execPath, [require.resolve('webpack-cli/bin/cli.js'), '--config', path.join(serverDir, 'webpack.config.js')], {
    stdio: 'inherit',
    cwd: root
  });
  if (!fs.existsSync(stamp)) {
    throw new Error('the server-flavoured lab build did not complete (no build/entry.json)');
  }
  log(`built in ${((Date.now() - t0) / 1000).toFixed(0)} s`);
}

if (process.argv[1] && fileURLToPath(import.meta.url) === path.resolve(process.argv[1])) {
  buildServerLab({ force: process.argv.includes('--force') });
}
