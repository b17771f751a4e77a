#!/usr/bin/env node
// `npm run package`: a wheel users can pip-install into their own JupyterLab.
// Builds offline with Debian's hatchling (python3-hatchling, python3-build);
// runs `npm run build` first when the labextension is missing.
import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const pkg = JSON.parse(fs.readFileSync(path.join(root, 'package.json'), 'utf8'));
if (!fs.existsSync(path.join(root, pkg.jupyterlab.outputDir, 'package.json'))) {
  execFileSync('npm', ['run', 'build'], { stdio: 'inherit', cwd: root });
}
const python = process.env.PSISCAPE_PYTHON ?? '/usr/bin/python3';
try {
  execFileSync(python, ['-c', 'import build, hatchling'], { stdio: 'ignore' });
} catch {
  console.error(`${python} lacks the wheel builder; install it with:\n    sudo apt-get install -y python3-build python3-hatchling python3-wheel`);
  process.exit(1);
}
const outdir = path.join(root, 'dist');
fs.rmSync(outdir, { recursive: true, force: true });
execFileSync(python, ['-m', 'build', '--no-isolation', '--skip-dependency-check', '--wheel', '--outdir', outdir], { stdio: 'inherit', cwd: root });
const wheel = fs.readdirSync(outdir).find(f => f.endsWith('.whl'));
console.log(`wheel: ${path.relative(root, path.join(outdir, wheel))}`);
