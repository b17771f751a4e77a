/**
 * Benchmark: Weiss spin-½ mean-field fit M(T) = Ms·m(T/Tc) at n = 1e4 on the
 * reference data of /work/shared/bench (same numbers SciPy fits), compared
 * with SciPy's time measured in the same run. Target: ≤ 0.1 × SciPy's best.
 *
 * Run alone: npx tsx bench/physics.bench.ts
 *   --reference-json FILE   use SciPy results already produced by reference_fits.py in this run
 *   --synthetic-dir DIR     directory of the dumped float64 files (default: a fresh temp dir)
 *   --repeats N             best of N (default 7)
 *   --json-part FILE        also write the figures as JSON (used by scripts/bench.mjs --json)
 * Without --reference-json the script runs reference_fits.py itself
 * (/usr/bin/python3, --skip-nist --max-n 10000) when numpy/scipy are present;
 * otherwise it prints our absolute time only and reports the ratio as unavailable.
 */
import { execFileSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { messageText } from '../src/core/messages';
import { fitWeissMT } from '../src/core/physics/index';

const REFERENCE_SCRIPT = '/work/shared/bench/reference_fits.py';
const STEM = 'weiss_mean_field_spin_half_n10000';
const TARGET_RATIO = 0.1;

interface IRefFit {
  method: string;
  time_best_s: number;
  params: number[] | null;
}
interface IRefEntry {
  workload: string;
  n: number;
  start: number[];
  fits: IRefFit[];
}

function arg(name: string): string | undefined {
  const i = process.argv.indexOf(name);
  return i >= 0 ? process.argv[i + 1] : undefined;
}

function readF64(path: string): Float64Array {
  const buf = readFileSync(path);
  const out = new Float64Array(buf.length / 8);
  for (let i = 0; i < out.length; i++) {
    out[i] = buf.readDoubleLE(i * 8);
  }
  return out;
}

function isRefDoc(v: unknown): v is { synthetic: IRefEntry[] } {
  return typeof v === 'object' && v !== null && Array.isArray((v as { synthetic?: unknown }).synthetic);
}

/** Runs (or reads) the SciPy reference; returns the n = 1e4 Weiss entry and the data directory. */
function reference(): { entry: IRefEntry | null; dir: string | null; note: string } {
  const json = arg('--reference-json');
  let dir = arg('--synthetic-dir') ?? null;
  let text: string | null = null;
  if (json) {
    text = readFileSync(json, 'utf8');
  } else if (existsSync(REFERENCE_SCRIPT)) {
    dir = dir ?? mkdtempSync(join(tmpdir(), 'psiscape-synth-'));
    try {
      text = execFileSync(
        '/usr/bin/python3',
        [REFERENCE_SCRIPT, '--skip-nist', '--max-n', '10000', '--repeats', '5', '--dump-synthetic', dir],
        { encoding: 'utf8', stdio: ['ignore', 'pipe', 'ignore'], maxBuffer: 1 << 28 }
      );
    } catch (e) {
      return { entry: null, dir: null, note: `reference run failed (${(e as Error).message.split('\n')[0]})` };
    }
  } else {
    return { entry: null, dir, note: 'reference script not found' };
  }
  const doc: unknown = JSON.parse(text);
  if (!isRefDoc(doc)) {
    return { entry: null, dir, note: 'reference JSON has no synthetic section' };
  }
  const entry = doc.synthetic.find(e => e.workload === 'weiss_mean_field_spin_half' && e.n === 10000) ?? null;
  return { entry, dir, note: json ? `SciPy timings from ${json}` : 'SciPy run in this process tree' };
}

/** Runs the benchmark and returns whether the target ratio was met (null when no reference). */
export function runPhysicsBench(): boolean | null {
  const repeats = Number(arg('--repeats') ?? 7);
  const ref = reference();
  let T: Float64Array;
  let y: Float64Array;
  if (ref.dir && existsSync(join(ref.dir, `${STEM}_T.f64`))) {
    T = readF64(join(ref.dir, `${STEM}_T.f64`));
    y = readF64(join(ref.dir, `${STEM}_y.f64`));
  } else {
    console.log(`physics.bench: no dumped reference data (${ref.note}); cannot run on the reference numbers`);
    return null;
  }
  const start: [number, number] = ref.entry ? [ref.entry.start[0], ref.entry.start[1]] : [1, 500];
  let best = Infinity;
  let res = fitWeissMT({ T, M: y }, { J: 0.5, start });
  for (let r = 0; r < repeats; r++) {
    const t0 = performance.now();
    res = fitWeissMT({ T, M: y }, { J: 0.5, start });
    best = Math.min(best, performance.now() - t0);
  }
  console.log(
    `physics.bench: Weiss J=1/2 fit, n = ${T.length}: Ms = ${res.values[0].toPrecision(7)} ± ${res.standardErrors[0].toPrecision(2)}, ` +
      `Tc = ${res.values[1].toPrecision(7)} ± ${res.standardErrors[1].toPrecision(2)}; converged ${res.converged} (${messageText(res.reason)}); ` +
      `${res.evaluations} evaluations, ${res.iterations} iterations`
  );
  console.log(`physics.bench: psiscape best of ${repeats}: ${best.toFixed(2)} ms (coarse-to-fine, ftol = xtol = 1e-8, SciPy's start)`);
  // Variants for transparency: strict engine tolerances, and no coarse stage.
  const variants: [string, Parameters<typeof fitWeissMT>[1]][] = [
    ['engine default tolerances (1e-15)', { J: 0.5, start, engine: { ftol: 1e-15, xtol: 1e-15 } }],
    ['single stage (no coarse fit)', { J: 0.5, start, coarseAbove: Infinity }],
    ['automatic start values', { J: 0.5 }]
  ];
  for (const [label, opts] of variants) {
    let b = Infinity;
    let rv = fitWeissMT({ T, M: y }, opts);
    for (let r = 0; r < Math.max(1, Math.floor(repeats / 2)); r++) {
      const t0 = performance.now();
      rv = fitWeissMT({ T, M: y }, opts);
      b = Math.min(b, performance.now() - t0);
    }
    console.log(
      `physics.bench:   variant ${label}: ${b.toFixed(2)} ms, ${rv.iterations} iterations, Tc = ${rv.values[1].toFixed(6)} (Δ vs main ${(rv.values[1] - res.values[1]).toExponential(2)} K)`
    );
  }
  if (!ref.entry) {
    console.log(`physics.bench: SciPy reference unavailable (${ref.note}); ratio not computed`);
    return null;
  }
  let scipyBest = Infinity;
  for (const f of ref.entry.fits) {
    console.log(
      `physics.bench: ${f.method}: ${(f.time_best_s * 1000).toFixed(1)} ms` +
        (f.params ? ` (Ms = ${f.params[0].toPrecision(7)}, Tc = ${f.params[1].toPrecision(7)})` : '')
    );
    if (Number.isFinite(f.time_best_s)) {
      scipyBest = Math.min(scipyBest, f.time_best_s * 1000);
    }
    if (f.params) {
      const dTc = Math.abs(f.params[1] - res.values[1]);
      console.log(`physics.bench:   |ΔTc| vs ${f.method} = ${dTc.toExponential(2)} K (σ_Tc = ${res.standardErrors[1].toExponential(2)})`);
    }
  }
  const ratio = best / scipyBest;
  const ok = ratio <= TARGET_RATIO;
  const jsonPart = arg('--json-part');
  if (jsonPart) {
    writeFileSync(
      jsonPart,
      JSON.stringify({
        workload: 'weiss_mean_field_spin_half',
        n: T.length,
        psiscapeBestMs: best,
        scipyBestMs: scipyBest,
        ratio,
        target: TARGET_RATIO,
        pass: ok,
        Ms: [res.values[0], res.standardErrors[0]],
        Tc: [res.values[1], res.standardErrors[1]],
        iterations: res.iterations,
        source: ref.note
      })
    );
  }
  console.log(`physics.bench: ratio psiscape / fastest SciPy = ${ratio.toFixed(4)} (target ≤ ${TARGET_RATIO}) ${ok ? 'PASS' : 'FAIL'} [${ref.note}]`);
  return ok;
}

const isMain = typeof process !== 'undefined' && process.argv[1] !== undefined && /physics\.bench\.(ts|cjs)$/.test(process.argv[1]);
if (isMain) {
  const ok = runPhysicsBench();
  process.exitCode = ok === false ? 1 : 0;
}
