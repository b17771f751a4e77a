#!/usr/bin/env node
/**
 * Benchmark runner: runs every `bench/*.bench.ts`, in file order, one after
 * the other (never in parallel; never part of the tests).
 *
 * Each bench is first bundled by esbuild into one scope-hoisted file (npm
 * packages left as imports), the form in which the lab ships the same code
 * (one bundle per chunk), and run with node. Run through `tsx` instead, every
 * module is transformed and loaded on its own, and the hot loops of the fit
 * engine measured 20–30 % slower than in the bundle. A bench that bundles a
 * file reading `import.meta` (the browser benches, through the demo lab's
 * build script) is run with `tsx` as before. Each file's `__dirname` is kept
 * (replaced by its own folder at bundle time).
 *
 *   npm run bench [-- --json FILE] [--only NAME] [other args passed to each bench]
 *
 * Each bench prints its own report. With `--json FILE`, each bench is given
 * `--json-part PART` and writes its JSON there; the runner merges the parts
 * into FILE as { "<bench name>": <part>, … }.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
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
// Inside the repository, so that the bundles find node_modules.
const bundleDir = path.join(repoRoot, '.bench', 'bundled');

/**
 * `__dirname` in each source file becomes that file's own folder (a bundle
 * has one `__dirname`); `state.importMeta` records whether any bundled file
 * of the repository reads `import.meta` (which a CommonJS bundle cannot keep).
 */
function repositoryFiles(state) {
  return {
    name: 'repository-files',
    setup(build) {
      build.onLoad({ filter: /\.[cm]?[jt]s$/ }, (args) => {
        if (args.path.includes(`${path.sep}node_modules${path.sep}`)) {
          return undefined;
        }
        const source = readFileSync(args.path, 'utf8');
        if (source.includes('import.meta')) {
          state.importMeta = true;
        }
        if (!/\.[cm]?ts$/.test(args.path) || !source.includes('__dirname')) {
          return undefined;
        }
        return { contents: source.replace(/\b__dirname\b/g, JSON.stringify(path.dirname(args.path))), loader: 'ts' };
      });
    }
  };
}

/** The command that runs one bench: node on its bundle, or tsx when a file it bundles reads import.meta. */
async function benchCommand(file) {
  const source = path.join(benchDir, file);
  const { build } = await import('esbuild');
  mkdirSync(bundleDir, { recursive: true });
  const out = path.join(bundleDir, file.replace(/\.ts$/, '.cjs'));
  const state = { importMeta: false };
  await build({
    entryPoints: [source],
    outfile: out,
    bundle: true,
    platform: 'node',
    format: 'cjs',
    target: 'node20',
    packages: 'external',
    sourcemap: 'inline',
    logLevel: 'error',
    plugins: [repositoryFiles(state)]
  });
  if (state.importMeta) {
    return ['npx', ['tsx', source]];
  }
  return [process.execPath, ['--enable-source-maps', out]];
}

const merged = {};
let failures = 0;
for (const file of files) {
  const name = file.replace(/\.bench\.ts$/, '');
  const part = path.join(partsDir, `${name}.json`);
  const extra = jsonFile ? ['--json-part', part] : [];
  const [command, commandArgs] = await benchCommand(file);
  console.log(`\n=== bench/${file} (${command === 'npx' ? 'tsx' : 'bundled'}) ===`);
  const run = spawnSync(command, [...commandArgs, ...passThrough, ...extra], {
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
