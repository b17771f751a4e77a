// Runs `npm run build` when the labextension is missing or older than any
// source, style or schema file. Shared by `npm start` and the e2e runner.
import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');

function newestMtime(dir) {
  let newest = 0;
  for (const entry of fs.readdirSync(dir, { withFileTypes: true })) {
    const full = path.join(dir, entry.name);
    newest = Math.max(newest, entry.isDirectory() ? newestMtime(full) : fs.statSync(full).mtimeMs);
  }
  return newest;
}

/** Build the extension unless its output is newer than every input. */
export function ensureExtensionBuilt() {
  const pkg = JSON.parse(fs.readFileSync(path.join(root, 'package.json'), 'utf8'));
  const built = path.join(root, pkg.jupyterlab.outputDir, 'package.json');
  const inputs = Math.max(
    ...['src', 'style', 'schema'].map(d => newestMtime(path.join(root, d))),
    fs.statSync(path.join(root, 'package.json')).mtimeMs
  );
  if (!fs.existsSync(built) || fs.statSync(built).mtimeMs < inputs) {
    console.log('[build] the extension is missing or out of date: npm run build');
    execFileSync('npm', ['run', 'build'], { stdio: 'inherit', cwd: root });
  }
}
