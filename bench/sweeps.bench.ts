/**
 * Benchmark: the isotherm analysis (Arrott plot, modified Arrott iteration,
 * Kouvel–Fisher) on 40 isotherms × 200 points. Target: ≤ 200 ms per run.
 * Data: Arrott–Noakes equation of state with 3D Heisenberg exponents and
 * 0.1 % seeded noise; the iteration starts from mean-field exponents.
 *
 * Run alone: npx tsx bench/sweeps.bench.ts
 *   --repeats N        best and median of N runs (default 15)
 *   --json-part FILE   also write the figures as JSON (used by scripts/bench.mjs --json)
 * Exit status is non-zero only when the analysis itself fails (NaN exponents).
 */
import { writeFileSync } from 'node:fs';
import { loadavg } from 'node:os';
import { arrottAnalysis, isothermSetFromArrays, kouvelFisher, modifiedArrottIteration } from '../src/core/sweeps/index';
import type { IIsothermSet } from '../src/core/sweeps/index';

const ISOTHERMS = 40;
const POINTS = 200;
const TARGET_MS = 200;
const P = { Tc: 300, beta: 0.3689, gamma: 1.396, T1: 5, M1: 1e5 };

function arg(name: string): string | undefined {
  const i = process.argv.indexOf(name);
  return i >= 0 ? process.argv[i + 1] : undefined;
}

/** Seeded normal deviates (mulberry32 + Box–Muller). */
function normal(seed: number): () => number {
  let a = seed >>> 0;
  const u = (): number => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  return () => Math.sqrt(-2 * Math.log(Math.max(u(), 1e-300))) * Math.cos(2 * Math.PI * u());
}

/** M at (T, H) of (H/M)^(1/γ) = (T − Tc)/T1 + (M/M1)^(1/β), by bisection in ln M. */
function magnetisation(T: number, H: number): number {
  let lo = Math.log(P.M1) - 60;
  let hi = Math.log(P.M1) + 10;
  for (let i = 0; i < 100; i++) {
    const mid = 0.5 * (lo + hi);
    const M = Math.exp(mid);
    const b = (T - P.Tc) / P.T1 + Math.pow(M / P.M1, 1 / P.beta);
    if (!(b > 0) || M * Math.pow(b, P.gamma) < H) {
      lo = mid;
    } else {
      hi = mid;
    }
  }
  return Math.exp(0.5 * (lo + hi));
}

function makeSet(): IIsothermSet {
  const g = normal(2024);
  const list = [];
  for (let k = 0; k < ISOTHERMS; k++) {
    const T = 280 + (40 * k) / (ISOTHERMS - 1);
    const H = Array.from({ length: POINTS }, (_v, i) => 1e3 + ((1e5 - 1e3) * i) / (POINTS - 1));
    list.push({ T, H, M: H.map(h => magnetisation(T, h) * (1 + 1e-3 * g())) });
  }
  return isothermSetFromArrays(list);
}

function analyse(set: IIsothermSet) {
  const arrott = arrottAnalysis(set);
  const map = modifiedArrottIteration(set, { start: { beta: 0.5, gamma: 1 } });
  const kf = kouvelFisher(map.spontaneous, map.inverseChi, 5, { below: 1 / map.beta.value, above: 1 / map.gamma.value });
  return { arrott, map, kf };
}

/** Runs the benchmark; returns false when the analysis failed. */
export function runSweepsBench(): boolean {
  const repeats = Number(arg('--repeats') ?? 15);
  const set = makeSet();
  let last = analyse(set); // warm-up (JIT)
  const times: number[] = [];
  const cpuStart = process.cpuUsage();
  for (let r = 0; r < repeats; r++) {
    const t0 = performance.now();
    last = analyse(set);
    times.push(performance.now() - t0);
  }
  const cpu = process.cpuUsage(cpuStart);
  times.sort((a, b) => a - b);
  const best = times[0];
  const median = times[Math.floor(times.length / 2)];
  const pass = median <= TARGET_MS;
  const { map, kf, arrott } = last;
  const ok = Number.isFinite(map.beta.value) && Number.isFinite(map.gamma.value) && Number.isFinite(kf.below.exponent.value);
  console.log(`sweeps.bench: ${ISOTHERMS} isotherms x ${POINTS} points, Arrott + modified Arrott iteration (${map.iterations} iterations) + Kouvel-Fisher`);
  console.log(`  best ${best.toFixed(1)} ms, median ${median.toFixed(1)} ms of ${repeats} (CPU ${(cpu.user / 1000 / repeats).toFixed(1)} ms/run user, load ${loadavg()[0].toFixed(2)})`);
  console.log(`  beta = ${map.beta.value.toFixed(4)} ± ${map.beta.sigma.toFixed(4)}, gamma = ${map.gamma.value.toFixed(4)} ± ${map.gamma.sigma.toFixed(4)}, Tc = ${map.Tc.value.toFixed(3)} K; KF beta = ${kf.below.exponent.value.toFixed(4)}, gamma = ${kf.above.exponent.value.toFixed(4)}; Arrott Tc = ${arrott.Tc.value.toFixed(3)}`);
  console.log(`sweeps.bench: median ${median.toFixed(1)} ms (target <= ${TARGET_MS} ms) ${pass ? 'PASS' : 'FAIL'}`);
  const jsonPart = arg('--json-part');
  if (jsonPart) {
    writeFileSync(
      jsonPart,
      JSON.stringify({
        workload: 'arrott + modified-arrott iteration + kouvel-fisher',
        isotherms: ISOTHERMS,
        points: POINTS,
        bestMs: best,
        medianMs: median,
        cpuUserMsPerRun: cpu.user / 1000 / repeats,
        loadAverage1: loadavg()[0],
        targetMs: TARGET_MS,
        pass,
        iterations: map.iterations,
        beta: [map.beta.value, map.beta.sigma],
        gamma: [map.gamma.value, map.gamma.sigma],
        Tc: [map.Tc.value, map.Tc.sigma]
      })
    );
  }
  return ok;
}

const isMain = typeof process !== 'undefined' && process.argv[1] !== undefined && /sweeps\.bench\.(ts|cjs)$/.test(process.argv[1]);
if (isMain) {
  process.exitCode = runSweepsBench() ? 0 : 1;
}
