/**
 * Benchmark: the whole isotherm analysis job with the panel's default controls
 * (global equation-of-state fit from its multi-start, modified Arrott,
 * Kouvel–Fisher, critical isotherm and collapse cross-checks, window scan,
 * ΔS_M) on 40 isotherms × 200 points, run in a Node worker thread through
 * handleAnalysisMessage — the handler the browser's analysis worker uses —
 * and timed from posting the request to receiving the report (its structured
 * clone included). Target: median ≤ 200 ms.
 * Data: Arrott–Noakes equation of state with 3D Heisenberg exponents, 0.1 %
 * seeded noise on M, columns T (K), H (Oe), M (emu/cm3).
 *
 * Run alone: npx tsx bench/isotherm-job.bench.ts
 *   --repeats N        median of N runs after one warm-up run (default 15, at least 10)
 *   --json-part FILE   also write the figures as JSON (used by scripts/bench.mjs --json)
 * Exit status is non-zero only when the job itself fails (no report or NaN exponents).
 */
import { writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { loadavg } from 'node:os';
import * as path from 'node:path';
import { fileURLToPath } from 'node:url';
import { Worker } from 'node:worker_threads';
import type { AnalysisResponse, IIsothermRequest } from '../src/core/analysis/protocol';
import { DEFAULT_ISOTHERM_CONTROLS } from '../src/core/sweeps/job-types';
import type { IIsothermJob, IsothermJobAnswer } from '../src/core/sweeps/job-types';

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

/** M at (T, H) of (H/M)^(1/γ) = (T − Tc)/T1 + (M/M1)^(1/β), by bisection in ln M (SI). */
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

/** The table as the panel sends it: T in K, H in Oe (1 Oe = 1000/(4π) A/m), M in emu/cm³ (= 1e3 A/m). */
function makeJob(): IIsothermJob {
  const g = normal(2024);
  const T: number[] = [];
  const H: number[] = [];
  const M: number[] = [];
  for (let k = 0; k < ISOTHERMS; k++) {
    const t = 280 + (40 * k) / (ISOTHERMS - 1);
    for (let i = 0; i < POINTS; i++) {
      const h = 1e3 + ((1e5 - 1e3) * i) / (POINTS - 1);
      T.push(t);
      H.push((h * 4 * Math.PI) / 1000);
      M.push((magnetisation(t, h) * (1 + 1e-3 * g())) / 1e3);
    }
  }
  return {
    temperature: { name: 'T (K)', unit: 'K', values: Float64Array.from(T) },
    field: { name: 'H (Oe)', unit: 'Oe', values: Float64Array.from(H) },
    magnetisation: { name: 'M (emu/cm3)', unit: 'emu/cm3', values: Float64Array.from(M) },
    controls: { ...DEFAULT_ISOTHERM_CONTROLS, units: { ...DEFAULT_ISOTHERM_CONTROLS.units } }
  };
}

/** A worker thread running handleAnalysisMessage on its port (TypeScript loaded through tsx). */
function startWorker(): Worker {
  const here = path.dirname(fileURLToPath(import.meta.url));
  const req = createRequire(import.meta.url);
  const protocol = path.resolve(here, '../src/core/analysis/protocol.ts');
  const code = `require(${JSON.stringify(req.resolve('tsx/cjs/api'))}).register();
const { parentPort } = require('node:worker_threads');
const { handleAnalysisMessage } = require(${JSON.stringify(protocol)});
parentPort.on('message', data => handleAnalysisMessage(data, message => parentPort.postMessage(message)));`;
  return new Worker(code, { eval: true });
}

/** Posts one request and resolves with the final answer and the wall time. */
function runOnce(worker: Worker, id: number, job: IIsothermJob): Promise<{ ms: number; answer: IsothermJobAnswer | null; kind: string }> {
  return new Promise((resolve, reject) => {
    const onMessage = (r: AnalysisResponse): void => {
      if (r.id !== id || r.kind === 'isotherm-progress') {
        return;
      }
      worker.off('message', onMessage);
      worker.off('error', reject);
      resolve({ ms: performance.now() - t0, answer: r.kind === 'isotherms-done' ? r.answer : null, kind: r.kind });
    };
    worker.on('message', onMessage);
    worker.on('error', reject);
    // the panel sends copies of the columns and transfers their buffers
    const copy: IIsothermJob = {
      ...job,
      temperature: { ...job.temperature, values: Float64Array.from(job.temperature.values) },
      field: { ...job.field, values: Float64Array.from(job.field.values) },
      magnetisation: { ...job.magnetisation, values: Float64Array.from(job.magnetisation.values) }
    };
    const transfer = [copy.temperature, copy.field, copy.magnetisation].map(c => (c.values as Float64Array).buffer as ArrayBuffer);
    const t0 = performance.now();
    worker.postMessage({ id, kind: 'isotherms', job: copy } satisfies IIsothermRequest, transfer);
  });
}

/** Runs the benchmark; returns false when the job failed. */
export async function runIsothermJobBench(): Promise<boolean> {
  const repeats = Math.max(10, Number(arg('--repeats') ?? 15));
  const job = makeJob();
  const worker = startWorker();
  try {
    let last = await runOnce(worker, 0, job); // warm-up (module load, JIT)
    const first = last.ms;
    const times: number[] = [];
    for (let r = 1; r <= repeats; r++) {
      last = await runOnce(worker, r, job);
      times.push(last.ms);
    }
    times.sort((a, b) => a - b);
    const best = times[0];
    const median = times[Math.floor(times.length / 2)];
    const pass = median <= TARGET_MS;
    const answer = last.answer;
    const report = answer !== null && answer.status === 'ok' ? answer.report : null;
    const ok = report !== null && [report.summary.Tc, report.summary.beta, report.summary.gamma].every(v => Number.isFinite(v.value));
    console.log(`isotherm-job.bench: ${ISOTHERMS} isotherms x ${POINTS} points, default controls, in a worker thread through handleAnalysisMessage`);
    if (report === null) {
      console.log(`  no report: ${last.kind} ${answer !== null ? JSON.stringify(answer) : ''}`);
    } else {
      const s = report.summary;
      console.log(
        `  Tc = ${s.Tc.value.toFixed(3)} ± ${s.Tc.sigma.toFixed(3)} K, beta = ${s.beta.value.toFixed(4)} ± ${s.beta.sigma.toFixed(4)}, gamma = ${s.gamma.value.toFixed(4)} ± ${s.gamma.sigma.toFixed(4)} (truth 300, ${P.beta}, ${P.gamma}); verdict ${report.primary.verdict.state}`
      );
    }
    console.log(`  first ${first.toFixed(1)} ms; best ${best.toFixed(1)} ms, median ${median.toFixed(1)} ms of ${repeats} (load ${loadavg()[0].toFixed(2)})`);
    console.log(`isotherm-job.bench: median ${median.toFixed(1)} ms (target <= ${TARGET_MS} ms) ${pass ? 'PASS' : 'FAIL'}`);
    const jsonPart = arg('--json-part');
    if (jsonPart) {
      writeFileSync(
        jsonPart,
        JSON.stringify({
          workload: 'isotherm job, default controls, worker thread',
          isotherms: ISOTHERMS,
          points: POINTS,
          firstMs: first,
          bestMs: best,
          medianMs: median,
          repeats,
          loadAverage1: loadavg()[0],
          targetMs: TARGET_MS,
          pass,
          Tc: report ? [report.summary.Tc.value, report.summary.Tc.sigma] : null,
          beta: report ? [report.summary.beta.value, report.summary.beta.sigma] : null,
          gamma: report ? [report.summary.gamma.value, report.summary.gamma.sigma] : null
        })
      );
    }
    return ok;
  } finally {
    await worker.terminate();
  }
}

const isMain = typeof process !== 'undefined' && process.argv[1] !== undefined && /isotherm-job\.bench\.(ts|cjs)$/.test(process.argv[1]);
if (isMain) {
  runIsothermJobBench().then(
    ok => {
      process.exitCode = ok ? 0 : 1;
    },
    e => {
      console.error(e);
      process.exitCode = 1;
    }
  );
}
