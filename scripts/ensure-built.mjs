// Builds the labextension (`npm run build`) when it is missing or older than
// any source, style or schema file. Shared by `npm start`, the e2e runner and
// the browser benches.
import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { runStep } from './steps.mjs';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');

function newestMtime(dir) {
  let newest = 0;
  for (const entry of fs.readdirSync(dir, { withFileTypes: true })) {
    const full = path.join(dir, entry.name);
    newest = Math.max(newest, entry.isDirectory() ? newestMtime(full) : fs.statSync(full).mtimeMs);
  }
  return newest;
}

/** True when the built labextension is newer than every input. */
export function extensionUpToDate() {
  const pkg = JSON.parse(fs.readFileSync(path.join(root, 'package.json'), 'utf8'));
  const built = path.join(root, pkg.jupyterlab.outputDir, 'package.json');
  const inputs = Math.max(
    ...['src', 'style', 'schema'].map(d => newestMtime(path.join(root, d))),
    fs.statSync(path.join(root, 'package.json')).mtimeMs
  );
  return fs.existsSync(built) && fs.statSync(built).mtimeMs >= inputs;
}

/** Build the extension unless it is up to date (blocking; output shown). */
export function ensureExtensionBuilt() {
  if (!extensionUpToDate()) {
    console.log('[build] the extension is missing or out of date: npm run build');
    execFileSync(process.execPath, [path.join(root, 'scripts', 'build.mjs')], { stdio: 'inherit', cwd: root });
  }
}

/**
 * The same as one progress step: resolves when the extension is up to date.
 * @param {string} tag prefix of the progress lines
 */
export async function ensureExtensionBuiltStep(tag) {
  if (extensionUpToDate()) {
    return false;
  }
  await runStep(tag, 'building the psiscape labextension (TypeScript, then JupyterLab’s builder)', process.execPath, [path.join(root, 'scripts', 'build.mjs')], { cwd: root });
  return true;
}
