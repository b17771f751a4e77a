/**
 * The analysis worker protocol: the handler gives the outcome of a direct
 * run for Float64Array columns, reports the best point so far with its
 * progress, answers failures with core messages, and stops at the best
 * point when the shared cancel flag is set — also from another thread.
 */
import { createRequire } from 'node:module';
import * as path from 'node:path';
import { Worker } from 'node:worker_threads';
import { describe, expect, it } from 'vitest';
import { runAnalysisJob } from '../../../src/core/analysis/run';
import type { IAnalysisJob } from '../../../src/core/analysis/types';
import { PROGRESS_INTERVAL_MS, handleAnalysisMessage } from '../../../src/core/analysis/protocol';
import type { AnalysisResponse, IProgressReply, IRunRequest } from '../../../src/core/analysis/protocol';
import { messageOf } from '../../../src/core/messages';
import { mulberry32, normalGenerator } from '../fit/prng';

function decayData(n: number, seed = 77): { x: number[]; y: number[] } {
  const g = normalGenerator(mulberry32(seed));
  const x = Array.from({ length: n }, (_, i) => (5 * i) / (n - 1));
  return { x, y: x.map(v => 1.5 * Math.exp(-0.6 * v) + 0.2 + 0.02 * g()) };
}

/** An expression fit started far from the optimum, so it needs several iterations. */
function decayJob(n = 40, seed = 77): IAnalysisJob {
  const { x, y } = decayData(n, seed);
  return { kind: 'expression', x, y, window: { min: -1, max: 10 }, options: { expression: 'a*exp(-b*x) + c', starts: 'a = 10, b = 5, c = 3' } };
}

function sharedFlag(): Int32Array {
  return new Int32Array(new SharedArrayBuffer(Int32Array.BYTES_PER_ELEMENT));
}

/** Runs a request in this thread; every progress report is posted (the clock advances a second per call). */
function inThread(request: unknown, onReply?: (r: AnalysisResponse) => void, now?: () => number): AnalysisResponse[] {
  const replies: AnalysisResponse[] = [];
  let clock = 0;
  handleAnalysisMessage(
    request,
    r => {
      replies.push(r);
      onReply?.(r);
    },
    now ?? (() => (clock += 1000))
  );
  return replies;
}

function progressOf(replies: AnalysisResponse[]): IProgressReply[] {
  return replies.filter((r): r is IProgressReply => r.kind === 'progress');
}

describe('handleAnalysisMessage', () => {
  it('should give the outcome of a direct run for Float64Array columns', () => {
    const job = decayJob();
    const sigma = Array.from({ length: job.x.length }, () => 0.02);
    const typed: IAnalysisJob = { ...job, x: Float64Array.from(job.x), y: Float64Array.from(job.y), sigma: Float64Array.from(sigma) };
    const replies = inThread({ id: 7, kind: 'run', job: typed } satisfies IRunRequest);
    const done = replies.at(-1)!;
    expect(done.kind).toBe('done');
    expect(replies.every(r => r.id === 7)).toBe(true);
    const direct = runAnalysisJob({ ...job, sigma });
    expect(direct.fit.converged).toBe(true);
    expect(done.kind === 'done' && done.outcome.fit).toEqual(direct.fit);
    expect(done.kind === 'done' && done.outcome.curve).toEqual(direct.curve);
  });

  it('should report progress with the best point so far, throttled', () => {
    const replies = inThread({ id: 1, kind: 'run', job: decayJob() });
    const done = replies.at(-1)!;
    if (done.kind !== 'done') {
      throw new Error(`expected done, got ${JSON.stringify(done)}`);
    }
    const progress = progressOf(replies);
    expect(progress.length).toBeGreaterThan(3);
    for (const p of progress) {
      expect(p.best).not.toBeNull();
      expect(p.best!.parameters).toEqual(done.outcome.fit.parameters);
      expect(p.best!.values).toHaveLength(3);
      expect(p.best!.values.every(Number.isFinite)).toBe(true);
      expect(p.best!.chi2).toBe(p.cost);
      expect(p.best!.iteration).toBe(p.iteration);
    }
    // The reports come down from far above the final χ² to it.
    expect(progress[0].best!.values).not.toEqual(done.outcome.fit.values);
    expect(progress[0].cost).toBeGreaterThan(100 * done.outcome.fit.chi2);
    expect(progress.at(-1)!.cost).toBeCloseTo(done.outcome.fit.chi2, 12);

    // A clock that stands still lets only the first report through.
    const still = progressOf(inThread({ id: 2, kind: 'run', job: decayJob() }, undefined, () => 5));
    expect(still).toHaveLength(1);
    // One just under the interval apart: every second report.
    let t = 0;
    const half = progressOf(inThread({ id: 3, kind: 'run', job: decayJob() }, undefined, () => (t += PROGRESS_INTERVAL_MS / 2)));
    expect(half.length).toBe(Math.ceil(progress.length / 2));
  });

  it('should answer failures with the core message of the error', () => {
    const malformed = [
      inThread('nonsense'),
      inThread({ id: 4, kind: 'fit', job: decayJob() }),
      inThread({ id: 5, kind: 'run', job: { ...decayJob(), x: 'abc' } }),
      inThread({ id: 6, kind: 'run', job: decayJob(), cancelFlag: [0] })
    ];
    expect(malformed.map(r => r.map(m => [m.id, m.kind, m.kind === 'failed' && m.message.code]))).toEqual([
      [[-1, 'failed', 'analysis.malformed-request']],
      [[4, 'failed', 'analysis.malformed-request']],
      [[5, 'failed', 'analysis.malformed-request']],
      [[6, 'failed', 'analysis.malformed-request']]
    ]);

    // Bad jobs: the reply carries exactly the message the job throws.
    const bad: IAnalysisJob[] = [
      { ...decayJob(), y: [1, 2] },
      { ...decayJob(), options: { expression: '' } },
      { ...decayJob(), kind: 'no-such-kind' }
    ];
    for (const job of bad) {
      let thrown: unknown = null;
      try {
        runAnalysisJob(job);
      } catch (e) {
        thrown = e;
      }
      expect(thrown).not.toBeNull();
      const replies = inThread({ id: 9, kind: 'run', job });
      expect(replies).toEqual([{ id: 9, kind: 'failed', message: messageOf(thrown) }]);
      expect(replies[0].kind === 'failed' && replies[0].message.code).not.toBe('error.unexpected');
    }
  });

  it('should stop at the best point so far when the cancel flag is set', () => {
    const full = runAnalysisJob(decayJob());
    const flag = sharedFlag();
    const replies = inThread({ id: 11, kind: 'run', job: decayJob(), cancelFlag: flag }, r => {
      if (r.kind === 'progress' && r.iteration >= 2) {
        Atomics.store(flag, 0, 1);
      }
    });
    const last = replies.at(-1)!;
    expect(last.kind).toBe('cancelled');
    if (last.kind !== 'cancelled') {
      return;
    }
    const progress = progressOf(replies);
    expect(last.best).not.toBeNull();
    expect(last.best!.parameters).toEqual(full.fit.parameters);
    expect(last.best!.iteration).toBe(2);
    expect(last.best!.iteration).toBeLessThan(full.fit.iterations);
    // The engine's best point is the one of the last report, not yet the optimum.
    expect(last.best!.chi2).toBe(progress.at(-1)!.cost);
    expect(last.best!.values).toEqual(progress.at(-1)!.best!.values);
    expect(last.best!.chi2).toBeGreaterThan(full.fit.chi2);

    // A flag set before the job starts stops it at the start values.
    const early = sharedFlag();
    Atomics.store(early, 0, 1);
    const stopped = inThread({ id: 12, kind: 'run', job: decayJob(), cancelFlag: early }).at(-1)!;
    expect(stopped.kind === 'cancelled' && stopped.best).toMatchObject({ values: [10, 5, 3], iteration: 0 });

    // An unset flag changes nothing.
    const untouched = inThread({ id: 13, kind: 'run', job: decayJob(), cancelFlag: sharedFlag() }).at(-1)!;
    expect(untouched.kind === 'done' && untouched.outcome.fit).toEqual(full.fit);
  });
});

describe('analysis protocol through a Node worker thread', () => {
  it('should take transferred Float64Arrays and stop a running fit through the shared flag', async () => {
    // The worker loads the TypeScript host through tsx's CommonJS register API.
    const req = createRequire(__filename);
    const bootstrap = `require(${JSON.stringify(req.resolve('tsx/cjs/api'))}).register();
require(${JSON.stringify(path.resolve(__dirname, 'nodeAnalysisWorker.ts'))});`;
    const worker = new Worker(bootstrap, { eval: true });
    const failed = new Promise<never>((_, reject) => worker.on('error', reject));
    const replies: AnalysisResponse[] = [];
    const waiters: { id: number; resolve: (r: AnalysisResponse) => void; onProgress?: (r: IProgressReply) => void }[] = [];
    worker.on('message', (r: AnalysisResponse) => {
      replies.push(r);
      const w = waiters.find(v => v.id === r.id);
      if (r.kind === 'progress') {
        w?.onProgress?.(r);
      } else {
        w?.resolve(r);
      }
    });
    const answer = (id: number, onProgress?: (r: IProgressReply) => void): Promise<AnalysisResponse> =>
      Promise.race([new Promise<AnalysisResponse>(resolve => waiters.push({ id, resolve, onProgress })), failed]);
    try {
      const job = decayJob();
      const x = Float64Array.from(job.x);
      const y = Float64Array.from(job.y);
      const pending = answer(1);
      worker.postMessage({ id: 1, kind: 'run', job: { ...job, x, y } } satisfies IRunRequest, [x.buffer, y.buffer]);
      expect(x.byteLength).toBe(0);
      expect(y.byteLength).toBe(0);
      const done = await pending;
      expect(done.kind === 'done' && done.outcome.fit).toEqual(runAnalysisJob(job).fit);

      // A large fit, stopped from this thread once it has reported a point.
      const big = decayData(1_000_000, 5);
      const bx = Float64Array.from(big.x);
      const by = Float64Array.from(big.y);
      const flag = sharedFlag();
      let reports = 0;
      const pending2 = answer(2, () => {
        reports++;
        Atomics.store(flag, 0, 1);
      });
      const request: IRunRequest = { id: 2, kind: 'run', job: { ...decayJob(), x: bx, y: by }, cancelFlag: flag };
      worker.postMessage(request, [bx.buffer, by.buffer]);
      const stopped = await pending2;
      expect(reports).toBeGreaterThan(0);
      expect(stopped.kind).toBe('cancelled');
      if (stopped.kind === 'cancelled') {
        expect(stopped.best!.parameters).toEqual(['a', 'b', 'c']);
        expect(stopped.best!.values.every(Number.isFinite)).toBe(true);
        // Converged, χ² would be about n·0.02² = 400 (the noise); stopped early, it is far above.
        expect(stopped.best!.chi2).toBeGreaterThan(440);
      }
      // The worker is free again at once.
      const pending3 = answer(3);
      worker.postMessage({ id: 3, kind: 'run', job: decayJob(40, 9) } satisfies IRunRequest);
      expect((await pending3).kind).toBe('done');
    } finally {
      await worker.terminate();
    }
  });
});
