#!/usr/bin/env node
/**
 * Benchmark runner: runs every `bench/*.bench.ts` with `npx tsx`, in file
 * order, one after the other (never in parallel; never part of the tests).
 *
 *   npm run bench [-- --json FILE] [--only NAME] [other args passed to each bench]
 *
 * Each bench prints its own report. With `--json FILE`, each bench is given
 * `--json-part PART` and writes its JSON there; the runner merges the parts
 * into FILE as { "<bench name>": <part>, … }.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import * as path from 'node:path';
import { fileURLToPath } from 'node:url';

const repoRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const benchDir = path.join(repoRoot, 'bench');

const args = process.argv.slice(2);
let jsonFile = null;
let only = null;
const passThrough = [];
for (let i = 0; i < args.length; i++) {
  if (args[i] === '--json') {
    jsonFile = path.resolve(args[++i] ?? '');
  } else if (args[i] === '--only') {
    only = args[++i] ?? '';
  } else {
    passThrough.push(args[i]);
  }
}

const files = existsSync(benchDir)
  ? readdirSync(benchDir)
      .filter((f) => f.endsWith('.bench.ts'))
      .filter((f) => only === null || f.includes(only))
      .sort()
  : [];
if (files.length === 0) {
  console.error('no bench/*.bench.ts files found');
  process.exit(1);
}

const partsDir = mkdtempSync(path.join(tmpdir(), 'psiscape-bench-'));
const merged = {};
let failures = 0;
for (const file of files) {
  const name = file.replace(/\.bench\.ts$/, '');
  const part = path.join(partsDir, `${name}.json`);
  console.log(`\n=== bench/${file} ===`);
  const extra = jsonFile ? ['--json-part', part] : [];
  const run = spawnSync('npx', ['tsx', path.join(benchDir, file), ...passThrough, ...extra], {
    cwd: repoRoot,
    stdio: 'inherit'
  });
  if (run.status !== 0) {
    failures++;
    console.error(`bench/${file} exited with status ${run.status}`);
    continue;
  }
  if (jsonFile && existsSync(part)) {
    merged[name] = JSON.parse(readFileSync(part, 'utf8'));
  }
}
if (jsonFile) {
  writeFileSync(jsonFile, JSON.stringify(merged, null, 1) + '\n');
  console.log(`\nwrote ${jsonFile}`);
}
rmSync(partsDir, { recursive: true, force: true });
process.exit(failures > 0 ? 1 : 0);
