/**
 * The isotherm request of the analysis worker protocol: the answer is the
 * job's own, progress comes by stage (throttled), the cancel flag stops the
 * job — also from another thread — and a throwing job answers as failed.
 * Data: Arrott–Noakes isotherms (REFERENCES.md B6) with 3D Ising exponents
 * β = 0.3265, γ = 1.2372 (Pelissetto & Vicari, Phys. Rep. 368, 549 (2002); C2),
 * invented Tc = 245 K, T1 = 2 K, M1 = 4e5 A/m, N_d = 0.2 (SI).
 */
import { createRequire } from 'node:module';
import * as path from 'node:path';
import { Worker } from 'node:worker_threads';
import { describe, expect, it } from 'vitest';
import { handleAnalysisMessage, PROGRESS_INTERVAL_MS } from '../../../src/core/analysis/protocol';
import type { AnalysisResponse, IIsothermProgressReply, IIsothermRequest } from '../../../src/core/analysis/protocol';
import { runIsothermJob } from '../../../src/core/sweeps/index';
import type { IIsothermJob, IsothermStage } from '../../../src/core/sweeps/index';
import { jobOf, jobTable, linspace } from '../sweeps/job-data';

function job(): IIsothermJob {
  const t = jobTable({
    params: { Tc: 245, T1: 2, M1: 4e5, beta: 0.3265, gamma: 1.2372 },
    temperatures: linspace(237, 253, 17),
    fields: linspace(2e4, 1.6e6, 40),
    demagSI: 0.2,
    relNoise: 1.5e-3,
    jitterK: 0.01,
    seed: 3
  });
  return jobOf(t, { value: 0.2, convention: 'SI' });
}

function sharedFlag(): Int32Array {
  return new Int32Array(new SharedArrayBuffer(Int32Array.BYTES_PER_ELEMENT));
}

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

const progressOf = (replies: AnalysisResponse[]): IIsothermProgressReply[] => replies.filter((r): r is IIsothermProgressReply => r.kind === 'isotherm-progress');

describe('handleAnalysisMessage: isotherm requests', () => {
  it('answers with the job’s own answer, after progress by stage', () => {
    const replies = inThread({ id: 3, kind: 'isotherms', job: job() } satisfies IIsothermRequest);
    const done = replies.at(-1)!;
    expect(done.kind).toBe('isotherms-done');
    expect(replies.every(r => r.id === 3)).toBe(true);
    expect(done.kind === 'isotherms-done' && done.answer).toEqual(runIsothermJob(job()));
    const stages = progressOf(replies).map(p => p.stage);
    const order: IsothermStage[] = ['grouping', 'global', 'cross-checks', 'collapse', 'window', 'entropy'];
    expect(stages.filter((s, i) => i === 0 || stages[i - 1] !== s)).toEqual(order);
    const f = progressOf(replies).map(p => p.fraction);
    expect(f.every((v, i) => i === 0 || v >= f[i - 1])).toBe(true);
    // the answer survives postMessage
    expect(structuredClone(done)).toEqual(done);
  });

  it('throttles progress: a clock standing still lets one reply per stage through', () => {
    const still = progressOf(inThread({ id: 4, kind: 'isotherms', job: job() }, undefined, () => 5));
    expect(still.map(p => p.stage)).toEqual(['grouping', 'global', 'cross-checks', 'collapse', 'window', 'entropy']);
    let t = 0;
    const half = progressOf(inThread({ id: 5, kind: 'isotherms', job: job() }, undefined, () => (t += PROGRESS_INTERVAL_MS / 2)));
    const every = progressOf(inThread({ id: 6, kind: 'isotherms', job: job() }));
    expect(half.length).toBeLessThan(every.length);
  });

  it('answers refusals as done, throws as failed, malformed requests as failed', () => {
    const bad = job();
    const refused = inThread({ id: 7, kind: 'isotherms', job: { ...bad, controls: { ...bad.controls, tMax: -1 } } }).at(-1)!;
    expect(refused.kind === 'isotherms-done' && refused.answer.status).toBe('refused');
    const throwing = {
      ...bad,
      get temperature(): never {
        throw new Error('no column');
      }
    };
    const failed = inThread({ id: 8, kind: 'isotherms', job: throwing }).at(-1)!;
    expect(failed).toMatchObject({ id: 8, kind: 'failed', message: { code: 'error.unexpected' } });
    expect(inThread({ id: 9, kind: 'isotherms' })).toEqual([{ id: 9, kind: 'failed', message: expect.objectContaining({ code: 'analysis.malformed-request' }) }]);
    expect(inThread({ id: 10, kind: 'isotherms', job: bad, cancelFlag: [0] }).at(-1)!.kind).toBe('failed');
  });

  it('stops when the cancel flag is set: before the start or during a stage', () => {
    const early = sharedFlag();
    Atomics.store(early, 0, 1);
    expect(inThread({ id: 11, kind: 'isotherms', job: job(), cancelFlag: early }).at(-1)).toEqual({ id: 11, kind: 'cancelled', best: null });
    const flag = sharedFlag();
    const replies = inThread({ id: 12, kind: 'isotherms', job: job(), cancelFlag: flag }, r => {
      if (r.kind === 'isotherm-progress' && r.stage === 'cross-checks') {
        Atomics.store(flag, 0, 1);
      }
    });
    expect(replies.at(-1)).toEqual({ id: 12, kind: 'cancelled', best: null });
    expect(progressOf(replies).some(p => p.stage === 'window')).toBe(false);
    // an unset flag changes nothing
    const untouched = inThread({ id: 13, kind: 'isotherms', job: job(), cancelFlag: sharedFlag() }).at(-1)!;
    expect(untouched.kind === 'isotherms-done' && untouched.answer.status).toBe('ok');
  });
});

describe('isotherm requests through a Node worker thread', () => {
  it('takes transferred columns, answers with a report, and stops through the shared flag', async () => {
    const req = createRequire(__filename);
    const bootstrap = `require(${JSON.stringify(req.resolve('tsx/cjs/api'))}).register();
require(${JSON.stringify(path.resolve(__dirname, 'nodeAnalysisWorker.ts'))});`;
    const worker = new Worker(bootstrap, { eval: true });
    const failed = new Promise<never>((_, reject) => worker.on('error', reject));
    const waiters: { id: number; resolve: (r: AnalysisResponse) => void; onProgress?: (r: IIsothermProgressReply) => void }[] = [];
    worker.on('message', (r: AnalysisResponse) => {
      const w = waiters.find(v => v.id === r.id);
      if (r.kind === 'isotherm-progress') {
        w?.onProgress?.(r);
      } else {
        w?.resolve(r);
      }
    });
    const answer = (id: number, onProgress?: (r: IIsothermProgressReply) => void): Promise<AnalysisResponse> =>
      Promise.race([new Promise<AnalysisResponse>(resolve => waiters.push({ id, resolve, onProgress })), failed]);
    try {
      const j = job();
      const cols = [j.temperature, j.field, j.magnetisation].map(c => c.values as Float64Array);
      const pending = answer(1);
      worker.postMessage({ id: 1, kind: 'isotherms', job: j } satisfies IIsothermRequest, cols.map(c => c.buffer as ArrayBuffer));
      expect(cols.every(c => c.byteLength === 0)).toBe(true);
      const done = await pending;
      expect(done.kind === 'isotherms-done' && done.answer).toEqual(runIsothermJob(job()));

      const flag = sharedFlag();
      const pending2 = answer(2, p => {
        if (p.stage === 'global') {
          Atomics.store(flag, 0, 1);
        }
      });
      worker.postMessage({ id: 2, kind: 'isotherms', job: job(), cancelFlag: flag } satisfies IIsothermRequest);
      expect(await pending2).toEqual({ id: 2, kind: 'cancelled', best: null });
    } finally {
      await worker.terminate();
    }
  });
});
