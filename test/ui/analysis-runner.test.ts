/**
 * The analysis runner with a fake Worker class: one worker for every run and
 * every runner, jobs one at a time in order, columns transferred as copies,
 * cancel with the best point so far (shared-memory flag, or ending the
 * worker and starting a fresh one), failures as core messages.
 */
import { afterEach, describe, expect, it, vi } from 'vitest';
import { handleAnalysisMessage } from '../../src/core/analysis/protocol';
import type { AnalysisResponse, IBestSoFar, IRunRequest } from '../../src/core/analysis/protocol';
import { runAnalysisJob } from '../../src/core/analysis/run';
import type { IAnalysisJob } from '../../src/core/analysis/types';
import { CoreMessageError, messageOf, msg } from '../../src/core/messages';
import { AnalysisRunner, AnalysisWorkerHost } from '../../src/ui/analysis-runner';
import { DEFAULT_ISOTHERM_CONTROLS } from '../../src/core/sweeps/job-types';
import type { AnalysisRunResult, IRunProgress } from '../../src/ui/analysis-runner';

/** A Worker stand-in: records what it is sent; `auto` ones answer through the real handler after a yield. */
class FakeWorker {
  static instances: FakeWorker[] = [];
  static auto = true;

  constructor(readonly url?: URL | string) {
    this.auto = FakeWorker.auto;
    FakeWorker.instances.push(this);
  }

  readonly auto: boolean;
  onmessage: ((event: MessageEvent<AnalysisResponse>) => void) | null = null;
  onerror: ((event: ErrorEvent) => void) | null = null;
  onmessageerror: ((event: MessageEvent) => void) | null = null;
  readonly posted: { message: IRunRequest; transfer: Transferable[] }[] = [];
  terminated = false;

  postMessage(message: IRunRequest, transfer: Transferable[] = []): void {
    this.posted.push({ message, transfer });
    if (this.auto) {
      setTimeout(() => handleAnalysisMessage(message, r => this.reply(r)), 0);
    }
  }

  reply(r: AnalysisResponse): void {
    if (!this.terminated) {
      this.onmessage?.({ data: r } as MessageEvent<AnalysisResponse>);
    }
  }

  fail(message: string): void {
    this.onerror?.({ message } as ErrorEvent);
  }

  terminate(): void {
    this.terminated = true;
  }

  /** The id of the last job sent. */
  get lastId(): number {
    return this.posted.at(-1)!.message.id;
  }
}

function fakeFactory(): Worker {
  return new FakeWorker() as unknown as Worker;
}

function host(options: Partial<AnalysisWorkerHost.IOptions> = {}): AnalysisWorkerHost {
  return new AnalysisWorkerHost({ workerFactory: fakeFactory, sharedMemory: false, ...options });
}

function decayJob(seed = 1, n = 30): IAnalysisJob & { x: number[]; y: number[] } {
  const x = Array.from({ length: n }, (_, i) => (5 * i) / (n - 1));
  const y = x.map((v, i) => 1.5 * Math.exp(-0.6 * v) + 0.2 + 0.01 * Math.sin(seed * 7 + 3 * i));
  return { kind: 'expression', x, y, window: { min: -1, max: 10 }, options: { expression: 'a*exp(-b*x) + c', starts: 'a = 2, b = 1, c = 0' } };
}

const BEST: IBestSoFar = { parameters: ['a', 'b', 'c'], values: [1.2, 0.7, 0.1], chi2: 3.5, iteration: 4 };

function progress(id: number, best: IBestSoFar | null = BEST): AnalysisResponse {
  return { id, kind: 'progress', iteration: best?.iteration ?? 0, evaluations: 20, cost: best?.chi2 ?? 9, best };
}

function doneOf(result: AnalysisRunResult): ReturnType<typeof runAnalysisJob> {
  if (result.kind !== 'done') {
    throw new Error(`expected a finished job, got ${JSON.stringify(result)}`);
  }
  return result.outcome;
}

/** Lets pending timers and promise callbacks run. */
function settle(ms = 0): Promise<void> {
  return new Promise(resolve => setTimeout(resolve, ms));
}

afterEach(() => {
  FakeWorker.instances = [];
  FakeWorker.auto = true;
  vi.unstubAllGlobals();
});

describe('AnalysisRunner', () => {
  it('should run every job of every runner in one worker, one at a time, in order', async () => {
    const h = host();
    const first = new AnalysisRunner({ host: h });
    const second = new AnalysisRunner({ host: h });
    const a = doneOf(await first.run(decayJob(1)));
    expect(a.fit.values).toEqual(runAnalysisJob(decayJob(1)).fit.values);
    doneOf(await first.run(decayJob(2)));
    expect(first.usesWorker).toBe(true);

    // Two panels at once: the second job waits until the first has answered.
    const p1 = first.run(decayJob(3));
    const p2 = second.run(decayJob(4));
    expect(second.busy).toBe(true);
    const worker = FakeWorker.instances[0];
    expect(worker.posted).toHaveLength(3);
    const [r1, r2] = await Promise.all([p1, p2]);
    expect(doneOf(r1).fit.values).toEqual(runAnalysisJob(decayJob(3)).fit.values);
    expect(doneOf(r2).fit.values).toEqual(runAnalysisJob(decayJob(4)).fit.values);
    expect(worker.posted).toHaveLength(4);
    expect(worker.posted.map(p => p.message.job.y[0])).toEqual([1, 2, 3, 4].map(s => decayJob(s).y[0]));
    expect(new Set(worker.posted.map(p => p.message.id)).size).toBe(4);
    expect(FakeWorker.instances).toHaveLength(1);
    expect(worker.terminated).toBe(false);
    expect(first.busy || second.busy).toBe(false);
  });

  it('should send copies of x, y and σ as Float64Arrays with their buffers transferred', async () => {
    const job = { ...decayJob(), sigma: Array.from({ length: 30 }, () => 0.01) };
    const kept = { x: Float64Array.from(job.x) };
    const runner = new AnalysisRunner({ host: host() });
    doneOf(await runner.run({ ...job, x: kept.x }));
    const { message, transfer } = FakeWorker.instances[0].posted[0];
    const sent = message.job;
    expect(sent.x).toBeInstanceOf(Float64Array);
    expect(sent.y).toBeInstanceOf(Float64Array);
    expect(sent.sigma).toBeInstanceOf(Float64Array);
    expect(Array.from(sent.x)).toEqual(job.x);
    expect(Array.from(sent.sigma!)).toEqual(job.sigma);
    expect(transfer).toEqual([(sent.x as Float64Array).buffer, (sent.y as Float64Array).buffer, (sent.sigma as Float64Array).buffer]);
    // The caller's arrays are not the ones sent, so they survive the transfer.
    expect(sent.x).not.toBe(kept.x);
    expect(transfer).not.toContain(kept.x.buffer);

    // Without σ, two buffers and no σ key.
    doneOf(await runner.run(decayJob()));
    const noSigma = FakeWorker.instances[0].posted[1];
    expect(noSigma.transfer).toHaveLength(2);
    expect('sigma' in noSigma.message.job).toBe(false);
  });

  it('should answer a cancel with the best point so far, end the busy worker and start a fresh one', async () => {
    FakeWorker.auto = false;
    const h = host();
    const runner = new AnalysisRunner({ host: h });
    const seen: IRunProgress[] = [];
    const pending = runner.run(decayJob(), p => seen.push(p));
    await settle();
    const busy = FakeWorker.instances[0];
    expect(busy.posted[0].message.cancelFlag).toBeUndefined();
    busy.reply(progress(busy.lastId, { ...BEST, chi2: 8, iteration: 1 }));
    busy.reply(progress(busy.lastId));
    expect(seen.map(p => p.best?.chi2)).toEqual([8, 3.5]);
    runner.cancel();
    expect(runner.busy).toBe(false);
    // The fresh worker is started at once, before any new job.
    expect(busy.terminated).toBe(true);
    expect(FakeWorker.instances).toHaveLength(2);
    expect(await pending).toEqual({ kind: 'cancelled', cancelled: true, bestSoFar: true, best: BEST });

    // The next job goes to the fresh worker.
    FakeWorker.instances[1].posted.length = 0;
    const next = runner.run(decayJob(5));
    const fresh = FakeWorker.instances[1];
    expect(fresh.posted).toHaveLength(1);
    fresh.reply(progress(fresh.lastId));
    const outcome = runAnalysisJob(decayJob(5));
    fresh.reply({ id: fresh.lastId, kind: 'done', outcome });
    expect(doneOf(await next)).toBe(outcome);
    expect(FakeWorker.instances).toHaveLength(2);
  });

  it('should run an isotherm analysis in the worker with its columns transferred, stage progress, and cancel through the flag', async () => {
    // Weiss isotherms in reduced units (REFERENCE.md B1: h = τ·artanh m − m), here only as a job to carry.
    const T: number[] = [];
    const H: number[] = [];
    const M: number[] = [];
    for (const tau of [0.97, 0.98, 0.99, 1.0, 1.01, 1.02, 1.03]) {
      for (let k = 1; k <= 20; k++) {
        const m = 0.05 + 0.02 * k;
        const h = tau * Math.atanh(m) - m;
        if (h > 0) {
          T.push(300 * tau);
          H.push(1e4 * h);
          M.push(100 * m);
        }
      }
    }
    const job = {
      temperature: { name: 'T', unit: 'K', values: T },
      field: { name: 'H', unit: 'Oe', values: H },
      magnetisation: { name: 'M', unit: 'emu/g', values: M },
      controls: { ...DEFAULT_ISOTHERM_CONTROLS }
    };
    const runner = new AnalysisRunner({ host: host() });
    const stages: string[] = [];
    const result = await runner.runIsotherms(job, stage => stages.push(stage));
    const sent = FakeWorker.instances[0].posted[0];
    expect(sent.message.kind).toBe('isotherms');
    expect(stages[0]).toBe('grouping');
    expect(sent.transfer).toHaveLength(3);
    expect(H).toHaveLength((job.field.values as number[]).length); // the caller's arrays are untouched
    expect(result.kind).toBe('done');
    expect(result.kind === 'done' && result.answer.status).toBe('ok');

    // Shared memory: Cancel stores the flag the job polls; the job answers as cancelled.
    FakeWorker.auto = false;
    const flagged = host({ sharedMemory: true });
    const second = new AnalysisRunner({ host: flagged });
    const pending = second.runIsotherms(job);
    await settle();
    const worker = FakeWorker.instances.at(-1)!;
    const request = worker.posted[0].message as unknown as { cancelFlag: Int32Array; id: number };
    second.cancel();
    expect(Atomics.load(request.cancelFlag, 0)).toBe(1);
    handleAnalysisMessage(worker.posted[0].message, r => worker.reply(r));
    expect(await pending).toEqual({ kind: 'cancelled' });
    expect(worker.terminated).toBe(false);
  });

  it('should cancel before any report with no best point', async () => {
    FakeWorker.auto = false;
    const runner = new AnalysisRunner({ host: host() });
    const pending = runner.run(decayJob());
    runner.cancel();
    expect(await pending).toEqual({ kind: 'cancelled', cancelled: true, bestSoFar: true, best: null });
  });

  it('should cancel only the runner’s own job, leaving other panels’ jobs in the queue', async () => {
    FakeWorker.auto = false;
    const h = host();
    const one = new AnalysisRunner({ host: h });
    const two = new AnalysisRunner({ host: h });
    const three = new AnalysisRunner({ host: h });
    const a = one.run(decayJob(1));
    const b = two.run(decayJob(2));
    const c = three.run(decayJob(3));
    const first = FakeWorker.instances[0];
    expect(first.posted).toHaveLength(1);

    // A waiting job leaves the queue; the running one is not disturbed.
    three.cancel();
    expect(await c).toEqual({ kind: 'cancelled', cancelled: true, bestSoFar: true, best: null });
    expect(first.terminated).toBe(false);

    // A new run of panel one replaces its own running job; panel two's job runs next, then panel one's.
    first.reply(progress(first.lastId));
    const a2 = one.run(decayJob(6));
    expect((await a).kind).toBe('cancelled');
    expect(first.terminated).toBe(true);
    const second = FakeWorker.instances[1];
    expect(second.posted.map(p => p.message.job.y[0])).toEqual([decayJob(2).y[0]]);
    const outB = runAnalysisJob(decayJob(2));
    second.reply({ id: second.lastId, kind: 'done', outcome: outB });
    expect(doneOf(await b)).toBe(outB);
    expect(second.posted.map(p => p.message.job.y[0])).toEqual([decayJob(2).y[0], decayJob(6).y[0]]);
    const outA2 = runAnalysisJob(decayJob(6));
    second.reply({ id: second.lastId, kind: 'done', outcome: outA2 });
    expect(doneOf(await a2)).toBe(outA2);
    expect(FakeWorker.instances).toHaveLength(2);
  });

  it('should cancel through the shared flag and keep the worker when it can share memory', async () => {
    FakeWorker.auto = false;
    const h = host({ sharedMemory: true, cancelGraceMs: 30 });
    const runner = new AnalysisRunner({ host: h });
    const pending = runner.run(decayJob());
    const worker = FakeWorker.instances[0];
    const flag = worker.posted[0].message.cancelFlag!;
    expect(flag).toBeInstanceOf(Int32Array);
    expect(flag.buffer).toBeInstanceOf(SharedArrayBuffer);
    expect(worker.posted[0].transfer).not.toContain(flag.buffer);
    worker.reply(progress(worker.lastId, { ...BEST, chi2: 8 }));
    runner.cancel();
    expect(Atomics.load(flag, 0)).toBe(1);
    expect(worker.terminated).toBe(false);
    // The engine stops at its best point, which the worker sends back.
    worker.reply({ id: worker.lastId, kind: 'cancelled', best: BEST });
    expect(await pending).toEqual({ kind: 'cancelled', cancelled: true, bestSoFar: true, best: BEST });
    await settle(60);
    expect(worker.terminated).toBe(false);

    // The same worker takes the next job; a worker that does not answer in time is ended.
    const late = runner.run(decayJob(2));
    expect(worker.posted).toHaveLength(2);
    worker.reply(progress(worker.lastId));
    runner.cancel();
    expect(worker.terminated).toBe(false);
    expect(await late).toEqual({ kind: 'cancelled', cancelled: true, bestSoFar: true, best: BEST });
    expect(worker.terminated).toBe(true);
    expect(FakeWorker.instances).toHaveLength(2);
  });

  it('should turn a job that finished as it was cancelled into a cancelled result', async () => {
    FakeWorker.auto = false;
    const runner = new AnalysisRunner({ host: host({ sharedMemory: true, cancelGraceMs: 10_000 }) });
    const pending = runner.run(decayJob());
    const worker = FakeWorker.instances[0];
    runner.cancel();
    const outcome = runAnalysisJob(decayJob());
    worker.reply({ id: worker.lastId, kind: 'done', outcome });
    const result = await pending;
    expect(result.kind).toBe('cancelled');
    expect(result.kind === 'cancelled' && result.best).toEqual({
      parameters: outcome.fit.parameters,
      values: outcome.fit.values,
      chi2: outcome.fit.chi2,
      iteration: outcome.fit.iterations
    });
  });

  it('should reject a failed job with its core message and go on with the next', async () => {
    const runner = new AnalysisRunner({ host: host() });
    const bad: IAnalysisJob = { ...decayJob(), y: [1, 2, 3] };
    let thrown: unknown = null;
    try {
      runAnalysisJob(bad);
    } catch (e) {
      thrown = e;
    }
    const failure = await runner.run(bad).then(
      () => null,
      (e: unknown) => e
    );
    expect(failure).toBeInstanceOf(CoreMessageError);
    expect((failure as CoreMessageError).detail).toEqual(messageOf(thrown));
    expect((failure as CoreMessageError).message).toBe((thrown as Error).message);
    doneOf(await runner.run(decayJob()));
    expect(FakeWorker.instances).toHaveLength(1);

    // A failed reply from the worker, as sent.
    FakeWorker.auto = false;
    const manual = new AnalysisRunner({ host: host() });
    const pending = manual.run(decayJob());
    const worker = FakeWorker.instances[1];
    const message = msg('test.failure', 'No fit for %1 points', 30);
    worker.reply({ id: worker.lastId, kind: 'failed', message });
    await expect(pending).rejects.toMatchObject({ detail: message, message: 'No fit for 30 points' });

    // A crashed worker: the job fails with a message; the next job gets a new worker.
    const crashed = manual.run(decayJob());
    worker.fail('out of memory');
    await expect(crashed).rejects.toMatchObject({ detail: { code: 'analysis.worker-failed', args: ['out of memory'] } });
    expect(worker.terminated).toBe(true);
    const after = manual.run(decayJob());
    expect(FakeWorker.instances).toHaveLength(3);
    const replacement = FakeWorker.instances[2];
    const outcome = runAnalysisJob(decayJob());
    replacement.reply({ id: replacement.lastId, kind: 'done', outcome });
    expect(doneOf(await after)).toBe(outcome);
  });

  it('should run jobs on the main thread after a yield where there is no worker', async () => {
    const runner = new AnalysisRunner({ workerFactory: () => null });
    const seen: IRunProgress[] = [];
    const pending = runner.run(decayJob(), p => seen.push(p));
    expect(seen).toHaveLength(0);
    const outcome = doneOf(await pending);
    expect(outcome.fit).toEqual(runAnalysisJob(decayJob()).fit);
    expect(seen.length).toBeGreaterThan(0);
    expect(seen[0].best?.parameters).toEqual(outcome.fit.parameters);
    expect(runner.usesWorker).toBe(false);

    // Cancelled before its turn, the job never runs.
    const onProgress = vi.fn();
    const cancelled = runner.run(decayJob(2), onProgress);
    runner.cancel();
    expect(await cancelled).toEqual({ kind: 'cancelled', cancelled: true, bestSoFar: true, best: null });
    await settle();
    expect(onProgress).not.toHaveBeenCalled();
    runner.dispose();
  });

  it('should start the lab session’s one worker lazily and share it between runners by default', async () => {
    vi.stubGlobal('Worker', FakeWorker);
    vi.resetModules();
    const fresh = await import('../../src/ui/analysis-runner');
    const one = new fresh.AnalysisRunner();
    const two = new fresh.AnalysisRunner();
    expect(one.host).toBe(fresh.AnalysisWorkerHost.shared());
    expect(two.host).toBe(one.host);
    expect(FakeWorker.instances).toHaveLength(0);
    doneOf(await one.run(decayJob(1)));
    two.dispose();
    doneOf(await new fresh.AnalysisRunner().run(decayJob(2)));
    expect(FakeWorker.instances).toHaveLength(1);
    expect(String(FakeWorker.instances[0].url)).toMatch(/\/worker\/analysis\.worker\./);
    expect(FakeWorker.instances[0].posted).toHaveLength(2);
    fresh.AnalysisWorkerHost.shared().dispose();
    expect(FakeWorker.instances[0].terminated).toBe(true);
  });
});
