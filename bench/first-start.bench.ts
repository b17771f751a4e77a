/**
 * First start on this machine (never a test): a fresh clone of the committed
 * HEAD, `npm ci`, then `npm start` until the demo lab page answers. Prints the
 * wall time of each stage and of `npm start` after `npm ci` (the figure a new
 * user waits for), then the same `npm start` once more with everything built
 * (the developer's loop).
 *
 *   npm run bench -- --only first-start [--keep]
 *
 * Needs the npm registry (for `npm ci`); takes a minute or two. With
 * --json-part FILE writes the figures as JSON.
 */
import { execFileSync, spawn } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import * as path from 'node:path';
import { jsonPartArg } from './browserLab';

const repoRoot = path.resolve(__dirname, '..');
const PORT = 8971;
/** Target for `npm start` after `npm ci` on a fresh clone, in seconds. */
const START_TARGET_S = 60;

function seconds(ms: number): string {
  return `${(ms / 1000).toFixed(1)} s`;
}

async function pageAnswers(url: string): Promise<boolean> {
  try {
    const res = await fetch(url);
    return res.ok;
  } catch {
    return false;
  }
}

/** Run `npm start` in `dir`; resolve with the time until the lab page answers, then stop it. */
async function timeStart(dir: string): Promise<{ ms: number; lines: string[] }> {
  const t0 = Date.now();
  const child = spawn('npm', ['start', '--', '--port', String(PORT)], { cwd: dir, stdio: ['ignore', 'pipe', 'pipe'], detached: true });
  const lines: string[] = [];
  const onData = (chunk: Buffer): void => {
    for (const line of chunk.toString().split('\n')) {
      if (line.startsWith('[start]')) {
        lines.push(line);
        console.log(`    ${line}`);
      }
    }
  };
  child.stdout.on('data', onData);
  child.stderr.on('data', onData);
  let exited = false;
  child.on('exit', () => {
    exited = true;
  });
  const url = `http://127.0.0.1:${PORT}/lab/index.html`;
  try {
    for (;;) {
      if (exited) {
        throw new Error('npm start exited before serving');
      }
      if (await pageAnswers(url)) {
        return { ms: Date.now() - t0, lines };
      }
      await new Promise(resolve => setTimeout(resolve, 200));
    }
  } finally {
    if (child.pid !== undefined && !exited) {
      process.kill(-child.pid, 'SIGTERM');
    }
    await new Promise(resolve => setTimeout(resolve, 500));
  }
}

async function main(): Promise<void> {
  const keep = process.argv.includes('--keep');
  const jsonPart = jsonPartArg();
  const dir = mkdtempSync(path.join(tmpdir(), 'psiscape-first-start-'));
  const head = execFileSync('git', ['rev-parse', '--short', 'HEAD'], { cwd: repoRoot }).toString().trim();
  try {
    console.log(`fresh clone of ${head} in ${dir}`);
    let t = Date.now();
    execFileSync('git', ['clone', '-q', repoRoot, dir]);
    const cloneMs = Date.now() - t;
    t = Date.now();
    execFileSync('npm', ['ci', '--no-audit', '--no-fund'], { cwd: dir, stdio: 'ignore' });
    const ciMs = Date.now() - t;
    console.log(`  git clone ${seconds(cloneMs)}, npm ci ${seconds(ciMs)}`);
    console.log('  npm start (nothing built yet):');
    const cold = await timeStart(dir);
    console.log('  npm start again (everything built):');
    const warm = await timeStart(dir);
    const verdict = cold.ms <= START_TARGET_S * 1000 ? 'PASS' : 'FAIL';
    console.log('');
    console.log(`first start after npm ci: ${seconds(cold.ms)} to a serving demo lab (target ≤ ${START_TARGET_S} s): ${verdict}`);
    console.log(`second start:             ${seconds(warm.ms)}`);
    console.log(`clone → serving:          ${seconds(cloneMs + ciMs + cold.ms)}`);
    if (jsonPart) {
      writeFileSync(jsonPart, JSON.stringify({ head, cloneMs, npmCiMs: ciMs, firstStartMs: cold.ms, secondStartMs: warm.ms, targetS: START_TARGET_S, verdict }));
    }
  } finally {
    if (keep) {
      console.log(`kept ${dir}`);
    } else {
      rmSync(dir, { recursive: true, force: true });
    }
  }
}

main().catch(error => {
  console.error(error instanceof Error ? error.message : error);
  process.exit(1);
});
