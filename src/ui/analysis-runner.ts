/**
 * Runs analysis jobs in the one analysis worker of the lab session.
 *
 * {@link AnalysisWorkerHost.shared} owns a single Web Worker, started on the
 * first job and reused by every panel. Jobs of all panels wait in one FIFO
 * queue on this side and go to the worker one at a time, so a job never sits
 * in a worker that may have to be ended. Each panel has an
 * {@link AnalysisRunner}, which cancels only its own previous job.
 *
 * The job's x, y and σ are copied into Float64Arrays whose buffers are
 * transferred, not cloned.
 *
 * Cancel stops the engine and gives the best point so far:
 * - with shared memory (a cross-origin isolated page), each job carries an
 *   Int32Array flag over a SharedArrayBuffer; the engine reads it at every
 *   iteration and stops, and the worker stays warm (if it has not answered
 *   within {@link CANCEL_GRACE_MS}, it is ended as below);
 * - otherwise a busy worker cannot read messages, so the host ends it,
 *   answers with the best point of the job's last progress report, and
 *   starts a fresh worker at once so the next job finds it ready.
 *
 * Where workers are unavailable (tests under jsdom), jobs run on the main
 * thread after a yield, through the same handler and queue.
 */
import type { IAnalysisJob, IAnalysisOutcome } from '../core/analysis/types';
import { bestOfFit, handleAnalysisMessage, parseSource } from '../core/analysis/protocol';
import type { AnalysisResponse, IBestSoFar, IIsothermRequest, IParseRequest, IRunRequest, ITaskRequest, ParseSource } from '../core/analysis/protocol';
import type { AnalysisTask, AnalysisTaskResult } from '../core/analysis/tasks-types';
import type { IIsothermJob, IIsothermJobColumn, IsothermJobAnswer, IsothermStage } from '../core/sweeps/job-types';
import type { ParseResult } from '../core/table';
import { CoreMessageError, messageOf, msg } from '../core/messages';
import type { ICoreMessage } from '../core/messages';

export type { IBestSoFar } from '../core/analysis/protocol';

/** Progress of a running job. */
export interface IRunProgress {
  iteration: number;
  evaluations: number;
  /** χ² at the best point so far (the residual sum of squares when no σ were given). */
  cost: number;
  /** The best point so far, or null before the engine's first report. */
  best: IBestSoFar | null;
}

/** The job finished: its outcome. */
export interface IRunDone {
  kind: 'done';
  outcome: IAnalysisOutcome;
}

/**
 * The user stopped the job. `best` holds the best values reached so far and
 * their χ², without uncertainties ("Stopped by you: best values so far (no
 * uncertainties)"); null when the job was stopped before the engine reported
 * a point (e.g. while it waited its turn).
 */
export interface IRunCancelled {
  kind: 'cancelled';
  cancelled: true;
  bestSoFar: true;
  best: IBestSoFar | null;
}

/** What {@link AnalysisRunner.run} resolves to. Failures reject with a {@link CoreMessageError}. */
export type AnalysisRunResult = IRunDone | IRunCancelled;

/** What an isotherm analysis resolves to: the job's answer, or cancelled. Failures reject with a {@link CoreMessageError}. */
export type IsothermRunResult = { kind: 'done'; answer: IsothermJobAnswer } | { kind: 'cancelled' };

/** What a task (comparison, window scan, bootstrap) resolves to. Failures reject with a {@link CoreMessageError}. */
export type TaskRunResult = { kind: 'done'; result: Exclude<AnalysisTaskResult, { type: 'cancelled' }> } | { kind: 'cancelled' };

/** Progress of an isotherm analysis: the stage running and the fraction of the whole job done. */
export type IsothermProgress = (stage: IsothermStage, fraction: number) => void;

/** Creates the worker (null: run on the main thread); replaced in tests. */
export type WorkerFactory = () => Worker | null;

/** Longest wait for a worker to answer a shared-memory cancel before it is ended, in ms. */
export const CANCEL_GRACE_MS = 1000;

/** Whether a SharedArrayBuffer can be shared with a worker on this page. */
export function sharedMemoryUsable(): boolean {
  return (
    typeof SharedArrayBuffer === 'function' &&
    typeof Atomics === 'object' &&
    (globalThis as { crossOriginIsolated?: boolean }).crossOriginIsolated === true
  );
}

function defaultWorkerFactory(): Worker | null {
  if (typeof Worker === 'undefined') {
    return null;
  }
  return new Worker(new URL('../worker/analysis.worker.js', import.meta.url));
}

function cancelledResult(best: IBestSoFar | null): IRunCancelled {
  return { kind: 'cancelled', cancelled: true, bestSoFar: true, best };
}

/** A submitted job. */
interface ITask {
  readonly id: number;
  readonly request: IRunRequest | IParseRequest | IIsothermRequest | ITaskRequest;
  /** Parse tasks: receives the parsed table. */
  readonly onParsed?: (result: ParseResult) => void;
  /** Isotherm tasks: receives the job's answer, and its progress. */
  readonly onIsotherms?: (answer: IsothermJobAnswer) => void;
  readonly onStage?: IsothermProgress;
  /** Task requests: receives the result, and the fraction done. */
  readonly onTask?: (result: AnalysisTaskResult) => void;
  readonly onFraction?: (fraction: number) => void;
  readonly transfer: Transferable[];
  readonly onProgress: ((p: IRunProgress) => void) | undefined;
  readonly resolve: (result: AnalysisRunResult) => void;
  readonly reject: (reason: Error) => void;
  /** The best point of the last progress report. */
  best: IBestSoFar | null;
  cancelRequested: boolean;
  graceTimer: ReturnType<typeof setTimeout> | null;
}

let sharedHost: AnalysisWorkerHost | null = null;

/** The analysis worker and its queue of jobs; one per lab session ({@link AnalysisWorkerHost.shared}). */
export class AnalysisWorkerHost {
  /** The host of the lab session, created on first use; its worker starts with the first job. */
  static shared(): AnalysisWorkerHost {
    sharedHost ??= new AnalysisWorkerHost();
    return sharedHost;
  }

  constructor(options: AnalysisWorkerHost.IOptions = {}) {
    this._factory = options.workerFactory ?? defaultWorkerFactory;
    this._sharedMemory = options.sharedMemory ?? sharedMemoryUsable();
    this._graceMs = options.cancelGraceMs ?? CANCEL_GRACE_MS;
  }

  /** Whether jobs run in a worker: null until the first job decides it. */
  get usesWorker(): boolean | null {
    return this._mode === 'unknown' ? null : this._mode === 'worker';
  }

  /** Whether cancel uses a shared-memory flag (false: the worker is ended). */
  get sharedMemory(): boolean {
    return this._sharedMemory;
  }

  /**
   * Start the worker now if it is not running, so that the first fit does not
   * wait for its scripts (called when the pointer or focus first reaches a
   * panel's fit controls).
   */
  warm(): void {
    if (!this._worker && this._mode !== 'main-thread' && !this._disposed) {
      this._startWorker();
    }
  }

  /** Jobs waiting or running. */
  get pending(): number {
    return this._queue.length + (this._running ? 1 : 0);
  }

  /**
   * Queue a job. Its x, y and σ are copied at once (the caller may keep
   * using its arrays).
   */
  submit(job: IAnalysisJob, onProgress?: (p: IRunProgress) => void): { id: number; result: Promise<AnalysisRunResult> } {
    const id = ++this._lastId;
    const x = Float64Array.from(job.x);
    const y = Float64Array.from(job.y);
    const sigma = job.sigma ? Float64Array.from(job.sigma) : undefined;
    const copy: IAnalysisJob = { ...job, x, y, sigma };
    if (!sigma) {
      delete copy.sigma;
    }
    const request: IRunRequest = { id, kind: 'run', job: copy };
    if (this._sharedMemory) {
      request.cancelFlag = new Int32Array(new SharedArrayBuffer(Int32Array.BYTES_PER_ELEMENT));
    }
    const transfer: Transferable[] = sigma ? [x.buffer, y.buffer, sigma.buffer] : [x.buffer, y.buffer];
    let task!: ITask;
    const result = new Promise<AnalysisRunResult>((resolve, reject) => {
      task = { id, request, transfer, onProgress, resolve, reject, best: null, cancelRequested: false, graceTimer: null };
    });
    if (this._disposed) {
      task.resolve(cancelledResult(null));
    } else {
      this._queue.push(task);
      this._pump();
    }
    return { id, result };
  }

  /**
   * Parse a table in the worker (large outputs would hold the page's thread
   * for hundreds of milliseconds); queued like the fits. Never rejects: a
   * failure is a parse result with its message.
   */
  parse(source: ParseSource): Promise<ParseResult> {
    const id = ++this._lastId;
    return new Promise<ParseResult>(done => {
      if (this._disposed) {
        done(parseSource(source));
        return;
      }
      const task: ITask = {
        id,
        request: { id, kind: 'parse', source },
        transfer: [],
        onProgress: undefined,
        onParsed: done,
        resolve: () => undefined,
        reject: reason => done({ ok: false, message: messageOf(reason) }),
        best: null,
        cancelRequested: false,
        graceTimer: null
      };
      this._queue.push(task);
      this._pump();
    });
  }

  /**
   * Queue an isotherm analysis. Its columns are copied at once and the
   * copies' buffers transferred; progress reports the stage and the fraction
   * done; cancel stops it between stages and inside the long fits.
   */
  submitIsotherms(job: IIsothermJob, onProgress?: IsothermProgress): { id: number; result: Promise<IsothermRunResult> } {
    const id = ++this._lastId;
    const column = (c: IIsothermJobColumn): IIsothermJobColumn => ({ name: c.name, unit: c.unit, values: Float64Array.from(c.values) });
    const copy: IIsothermJob = {
      temperature: column(job.temperature),
      field: column(job.field),
      magnetisation: column(job.magnetisation),
      controls: structuredClone(job.controls)
    };
    const request: IIsothermRequest = { id, kind: 'isotherms', job: copy };
    const transfer = [copy.temperature, copy.field, copy.magnetisation].map(c => (c.values as Float64Array).buffer as ArrayBuffer);
    const result = this._enqueue<IsothermRunResult>(request, transfer, { kind: 'cancelled' }, resolve => ({
      onIsotherms: answer => resolve({ kind: 'done', answer }),
      onStage: onProgress
    }));
    return { id, result };
  }

  /**
   * Queue a task of several fits of one job. The job's columns are copied
   * and their buffers transferred; cancel stops it between and inside fits.
   */
  submitTask(task: AnalysisTask, onProgress?: (fraction: number) => void): { id: number; result: Promise<TaskRunResult> } {
    const id = ++this._lastId;
    const transfer: ArrayBuffer[] = [];
    const copy = (v: ArrayLike<number>): Float64Array => {
      const out = Float64Array.from(v);
      transfer.push(out.buffer as ArrayBuffer);
      return out;
    };
    const job = task.job;
    const columns = job.columns ? Object.fromEntries(Object.entries(job.columns).map(([k, v]) => [k, copy(v)])) : undefined;
    const jobCopy = { ...job, x: copy(job.x), y: copy(job.y), ...(job.sigma ? { sigma: copy(job.sigma) } : {}), ...(columns ? { columns } : {}) };
    const request: ITaskRequest = { id, kind: 'task', task: { ...task, job: jobCopy } };
    const result = this._enqueue<TaskRunResult>(request, transfer, { kind: 'cancelled' }, resolve => ({
      onTask: r => resolve(r.type === 'cancelled' ? { kind: 'cancelled' } : { kind: 'done', result: r }),
      onFraction: onProgress
    }));
    return { id, result };
  }

  /**
   * Queue an isotherm or task request (with a cancel flag where memory is
   * shared); its promise resolves through `handlers`, or with `cancelled`.
   */
  private _enqueue<R>(
    request: IIsothermRequest | ITaskRequest,
    transfer: Transferable[],
    cancelled: R,
    handlers: (resolve: (r: R) => void) => Pick<ITask, 'onIsotherms' | 'onStage' | 'onTask' | 'onFraction'>
  ): Promise<R> {
    if (this._sharedMemory) {
      request.cancelFlag = new Int32Array(new SharedArrayBuffer(Int32Array.BYTES_PER_ELEMENT));
    }
    return new Promise<R>((resolve, reject) => {
      const entry: ITask = {
        id: request.id,
        request,
        transfer,
        onProgress: undefined,
        ...handlers(resolve),
        resolve: () => resolve(cancelled),
        reject,
        best: null,
        cancelRequested: false,
        graceTimer: null
      };
      if (this._disposed) {
        resolve(cancelled);
      } else {
        this._queue.push(entry);
        this._pump();
      }
    });
  }

  /**
   * Stop job `id`: a waiting job leaves the queue; a running one stops at
   * its best point so far. Its promise resolves with a cancelled result.
   */
  cancel(id: number): void {
    const i = this._queue.findIndex(t => t.id === id);
    if (i >= 0) {
      const [task] = this._queue.splice(i, 1);
      task.resolve(cancelledResult(null));
      return;
    }
    const task = this._running;
    if (!task || task.id !== id || task.cancelRequested) {
      return;
    }
    task.cancelRequested = true;
    if (!this._worker) {
      // Main thread: the job has not started (it runs in one piece after a yield).
      this._settle(task, cancelledResult(task.best));
    } else if (task.request.kind !== 'parse' && task.request.cancelFlag) {
      Atomics.store(task.request.cancelFlag, 0, 1);
      task.graceTimer = setTimeout(() => this._abandon(task), this._graceMs);
    } else {
      this._abandon(task);
    }
  }

  /** End the worker; waiting and running jobs resolve as cancelled. */
  dispose(): void {
    if (this._disposed) {
      return;
    }
    this._disposed = true;
    const tasks = this._running ? [this._running, ...this._queue] : [...this._queue];
    this._queue = [];
    this._running = null;
    this._endWorker();
    for (const task of tasks) {
      this._clearTimer(task);
      if (task.onParsed) {
        task.onParsed(parseSource(task.request.kind === 'parse' ? task.request.source : { mime: 'text/csv', text: '' }));
      } else {
        task.resolve(cancelledResult(task.best));
      }
    }
    if (sharedHost === this) {
      sharedHost = null;
    }
  }

  /** Send the next job when none runs. */
  private _pump(): void {
    if (this._running || this._queue.length === 0 || this._disposed) {
      return;
    }
    const task = this._queue.shift()!;
    this._running = task;
    const worker = this._worker ?? (this._mode === 'main-thread' ? null : this._startWorker());
    if (!worker) {
      setTimeout(() => {
        if (this._running === task) {
          handleAnalysisMessage(task.request, message => this._onReply(null, message));
        }
      }, 0);
      return;
    }
    try {
      worker.postMessage(task.request, task.transfer);
    } catch (reason) {
      this._settleFailure(task, messageOf(reason));
    }
  }

  private _startWorker(): Worker | null {
    let worker: Worker | null = null;
    try {
      worker = this._factory();
    } catch (reason) {
      console.warn('psiscape: analysis worker unavailable, running on the main thread', reason);
    }
    if (!worker) {
      this._mode = 'main-thread';
      return null;
    }
    this._mode = 'worker';
    this._worker = worker;
    worker.onmessage = (event: MessageEvent<AnalysisResponse>) => this._onReply(worker, event.data);
    worker.onerror = (event: ErrorEvent) => this._onWorkerError(worker, event.message || 'the worker script could not run');
    worker.onmessageerror = () => this._onWorkerError(worker, 'a reply could not be read');
    return worker;
  }

  private _endWorker(): void {
    if (this._worker) {
      const worker = this._worker;
      this._worker = null;
      worker.onmessage = null;
      worker.onerror = null;
      worker.onmessageerror = null;
      worker.terminate();
    }
  }

  private _onReply(source: Worker | null, message: AnalysisResponse): void {
    const task = this._running;
    if (source !== this._worker || !task || !message || message.id !== task.id) {
      return;
    }
    switch (message.kind) {
      case 'parsed':
        this._finish(task);
        task.onParsed?.(message.result);
        this._pump();
        return;
      case 'progress':
        task.best = message.best ?? task.best;
        if (!task.cancelRequested && task.onProgress) {
          try {
            task.onProgress({ iteration: message.iteration, evaluations: message.evaluations, cost: message.cost, best: message.best });
          } catch (reason) {
            console.error('psiscape: analysis progress handler failed', reason);
          }
        }
        return;
      case 'isotherm-progress':
        if (!task.cancelRequested && task.onStage) {
          try {
            task.onStage(message.stage, message.fraction);
          } catch (reason) {
            console.error('psiscape: analysis progress handler failed', reason);
          }
        }
        return;
      case 'isotherms-done':
        this._finish(task);
        if (task.cancelRequested || message.answer.status === 'cancelled') {
          task.resolve(cancelledResult(null));
        } else {
          task.onIsotherms?.(message.answer);
        }
        this._pump();
        return;
      case 'task-progress':
        if (!task.cancelRequested && task.onFraction) {
          try {
            task.onFraction(message.fraction);
          } catch (reason) {
            console.error('psiscape: analysis progress handler failed', reason);
          }
        }
        return;
      case 'task-done':
        this._finish(task);
        if (task.cancelRequested) {
          task.resolve(cancelledResult(null));
        } else {
          task.onTask?.(message.result);
        }
        this._pump();
        return;
      case 'done':
        // A job cancelled after it had finished still answers as cancelled: the caller asked to stop.
        this._settle(task, task.cancelRequested ? cancelledResult(bestOfFit(message.outcome.fit)) : { kind: 'done', outcome: message.outcome });
        return;
      case 'cancelled':
        this._settle(task, cancelledResult(message.best ?? task.best));
        return;
      case 'failed':
        if (task.cancelRequested) {
          this._settle(task, cancelledResult(task.best));
        } else {
          this._settleFailure(task, message.message);
        }
        return;
    }
  }

  private _onWorkerError(source: Worker, text: string): void {
    if (source !== this._worker) {
      return;
    }
    // The worker's state is unknown: end it; the next job starts a fresh one.
    this._endWorker();
    const task = this._running;
    if (!task) {
      return;
    }
    if (task.cancelRequested) {
      this._settle(task, cancelledResult(task.best));
    } else {
      this._settleFailure(task, msg('analysis.worker-failed', 'The analysis worker stopped: %1', text));
    }
  }

  /** End the worker running `task` (it cannot see a cancel), answer with the last best point, start a fresh worker. */
  private _abandon(task: ITask): void {
    if (this._running !== task) {
      return;
    }
    this._endWorker();
    this._startWorker();
    this._settle(task, cancelledResult(task.best));
  }

  private _settle(task: ITask, result: AnalysisRunResult): void {
    this._finish(task);
    task.resolve(result);
    this._pump();
  }

  private _settleFailure(task: ITask, message: ICoreMessage): void {
    this._finish(task);
    task.reject(new CoreMessageError(message));
    this._pump();
  }

  private _finish(task: ITask): void {
    this._clearTimer(task);
    if (this._running === task) {
      this._running = null;
    }
  }

  private _clearTimer(task: ITask): void {
    if (task.graceTimer !== null) {
      clearTimeout(task.graceTimer);
      task.graceTimer = null;
    }
  }

  private readonly _factory: WorkerFactory;
  private readonly _sharedMemory: boolean;
  private readonly _graceMs: number;
  private _mode: 'unknown' | 'worker' | 'main-thread' = 'unknown';
  private _worker: Worker | null = null;
  private _queue: ITask[] = [];
  private _running: ITask | null = null;
  private _lastId = 0;
  private _disposed = false;
}

export namespace AnalysisWorkerHost {
  export interface IOptions {
    /** Creates the worker; default: the bundled analysis worker, or null where Worker is missing. */
    workerFactory?: WorkerFactory;
    /** Cancel through a SharedArrayBuffer flag; default: {@link sharedMemoryUsable}. */
    sharedMemory?: boolean;
    /** Longest wait for a shared-memory cancel, in ms; default {@link CANCEL_GRACE_MS}. */
    cancelGraceMs?: number;
  }
}

/** One panel's access to the analysis worker: one job at a time; a new run cancels its previous one. */
export class AnalysisRunner {
  constructor(options: AnalysisRunner.IOptions = {}) {
    if (options.host) {
      this._host = options.host;
    } else if (options.workerFactory) {
      this._host = new AnalysisWorkerHost({ workerFactory: options.workerFactory });
      this._ownsHost = true;
    } else {
      this._host = AnalysisWorkerHost.shared();
    }
  }

  /** Start the shared worker ahead of the first job. */
  warm(): void {
    this._host.warm();
  }

  /** The host whose worker runs this runner's jobs. */
  get host(): AnalysisWorkerHost {
    return this._host;
  }

  /** True while this runner's job waits or runs (false from the moment it is cancelled). */
  get busy(): boolean {
    return this._current !== null;
  }

  /** Whether jobs run in a worker (false: main thread, or not known before the first job). */
  get usesWorker(): boolean {
    return this._host.usesWorker === true;
  }

  /**
   * Run a job, cancelling this runner's previous one (other runners' jobs are
   * left alone; they share the worker's queue).
   *
   * @returns `{ kind: 'done', outcome }`, or `{ kind: 'cancelled', best }`
   * when {@link cancel} (or a later run) stopped it; rejects with a
   * {@link CoreMessageError} (its `detail` is the message to translate) when
   * the job fails.
   */
  run(job: IAnalysisJob, onProgress?: (p: IRunProgress) => void): Promise<AnalysisRunResult> {
    if (this._disposed) {
      return Promise.resolve(cancelledResult(null));
    }
    return this._own(() => this._host.submit(job, onProgress));
  }

  /**
   * Run an isotherm analysis, cancelling this runner's previous job.
   *
   * @returns the job's answer, or `{ kind: 'cancelled' }`; rejects with a
   * {@link CoreMessageError} when the job fails.
   */
  runIsotherms(job: IIsothermJob, onProgress?: IsothermProgress): Promise<IsothermRunResult> {
    if (this._disposed) {
      return Promise.resolve({ kind: 'cancelled' });
    }
    return this._own(() => this._host.submitIsotherms(job, onProgress));
  }

  /**
   * Run a task (comparison, window scan, bootstrap), cancelling this runner's
   * previous job.
   */
  runTask(task: AnalysisTask, onProgress?: (fraction: number) => void): Promise<TaskRunResult> {
    if (this._disposed) {
      return Promise.resolve({ kind: 'cancelled' });
    }
    return this._own(() => this._host.submitTask(task, onProgress));
  }

  /** Cancel this runner's previous job, submit the next one and follow it until it settles. */
  private _own<R>(submit: () => { id: number; result: Promise<R> }): Promise<R> {
    this.cancel();
    const { id, result } = submit();
    this._current = id;
    const clear = (): void => {
      if (this._current === id) {
        this._current = null;
      }
    };
    result.then(clear, clear);
    return result;
  }

  /** Cancel this runner's job, if any (its promise resolves with a cancelled result). */
  cancel(): void {
    const id = this._current;
    this._current = null;
    if (id !== null) {
      this._host.cancel(id);
    }
  }

  /** Cancel this runner's job; the shared worker stays for the other panels. */
  dispose(): void {
    if (this._disposed) {
      return;
    }
    this.cancel();
    this._disposed = true;
    if (this._ownsHost) {
      this._host.dispose();
    }
  }

  private readonly _host: AnalysisWorkerHost;
  private readonly _ownsHost: boolean = false;
  private _current: number | null = null;
  private _disposed = false;
}

export namespace AnalysisRunner {
  export interface IOptions {
    /** The host to share (default: {@link AnalysisWorkerHost.shared}). */
    host?: AnalysisWorkerHost;
    /** A private host with this worker factory (null from it: main thread); ended with the runner. */
    workerFactory?: WorkerFactory;
  }
}
