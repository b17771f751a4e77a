#!/usr/bin/env node
// `npm run package`: a wheel users can pip-install into their own JupyterLab,
// in dist/. Builds offline with Debian's hatchling (python3-hatchling,
// python3-build, python3-wheel). The wheel's version is package.json's
// (pyproject.toml reads it); the build hook hatch_build.py runs `npm run build`
// first when the labextension is missing.
import { execFileSync, spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const python = process.env.PSISCAPE_PYTHON ?? '/usr/bin/python3';
try {
  execFileSync(python, ['-c', 'import build, hatchling, wheel'], { stdio: 'ignore' });
} catch {
  const sudo = process.getuid?.() === 0 ? '' : 'sudo ';
  console.error(
    `${python} cannot build the wheel: it lacks Debian's wheel builder. Install it with:\n` +
      `    ${sudo}apt-get install -y --no-install-recommends python3-build python3-hatchling python3-wheel`
  );
  process.exit(1);
}
const outdir = path.join(root, 'dist');
fs.rmSync(outdir, { recursive: true, force: true });
const result = spawnSync(python, ['-m', 'build', '--no-isolation', '--skip-dependency-check', '--wheel', '--outdir', outdir], {
  stdio: 'inherit',
  cwd: root
});
const wheel = result.status === 0 && fs.existsSync(outdir) ? fs.readdirSync(outdir).find(f => f.endsWith('.whl')) : undefined;
if (!wheel) {
  console.error('The wheel was not built (see the messages above).');
  process.exit(1);
}
console.log(`wheel: ${path.relative(root, path.join(outdir, wheel))}`);
