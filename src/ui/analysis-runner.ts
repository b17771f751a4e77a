/**
 * Runs analysis jobs off the main thread. Each job gets a fresh Web Worker;
 * cancelling ends the worker at once, so a long fit never blocks the page.
 * Where workers are unavailable (tests under jsdom), jobs run on the main
 * thread after a yield, through the same message handler.
 */
import type { IAnalysisJob, IAnalysisOutcome } from '../core/analysis';
import { handleAnalysisMessage } from '../core/analysis/protocol';
import type { AnalysisResponse, IRunRequest } from '../core/analysis/protocol';

/** Progress of a running job. */
export interface IRunProgress {
  iteration: number;
  evaluations: number;
  cost: number;
}

/** Thrown (as a rejection) when a job is cancelled. */
export class AnalysisCancelled extends Error {
  constructor() {
    super('cancelled');
    this.name = 'AnalysisCancelled';
  }
}

/** Creates the worker; replaced in tests. */
export type WorkerFactory = () => Worker;

function defaultWorkerFactory(): Worker | null {
  if (typeof Worker === 'undefined') {
    return null;
  }
  return new Worker(new URL('../worker/analysis.worker.js', import.meta.url));
}

/** Runs one job at a time; a new run cancels the previous one. */
export class AnalysisRunner {
  constructor(options: { workerFactory?: () => Worker | null } = {}) {
    this._factory = options.workerFactory ?? defaultWorkerFactory;
  }

  /** True while a job runs. */
  get busy(): boolean {
    return this._pending !== null;
  }

  /** Whether jobs run in a worker (false: main thread). */
  get usesWorker(): boolean {
    return this._usesWorker;
  }

  /**
   * Run a job.
   *
   * @returns the outcome; rejects with an Error carrying the handler's message
   * when the job fails, or with {@link AnalysisCancelled}.
   */
  run(job: IAnalysisJob, starts: Record<string, number>, onProgress: (p: IRunProgress) => void): Promise<IAnalysisOutcome> {
    this.cancel();
    const id = ++this._id;
    const request: IRunRequest = { id, kind: 'run', job, starts };
    return new Promise<IAnalysisOutcome>((resolve, reject) => {
      this._pending = { id, reject };
      const reply = (message: AnalysisResponse): void => {
        if (!this._pending || this._pending.id !== message.id) {
          return;
        }
        if (message.kind === 'progress') {
          onProgress(message);
          return;
        }
        this._finish();
        if (message.kind === 'done') {
          resolve(message.outcome);
        } else {
          reject(new Error(message.message));
        }
      };
      let worker: Worker | null = null;
      try {
        worker = this._factory();
      } catch (reason) {
        console.warn('psiscape: analysis worker unavailable, running on the main thread', reason);
      }
      this._usesWorker = worker !== null;
      if (worker) {
        this._worker = worker;
        worker.onmessage = (event: MessageEvent<AnalysisResponse>) => reply(event.data);
        worker.onerror = event => {
          if (this._pending?.id === id) {
            this._finish();
            reject(new Error(`the analysis worker failed: ${event.message}`));
          }
        };
        worker.postMessage(request);
      } else {
        setTimeout(() => {
          if (this._pending?.id === id) {
            handleAnalysisMessage(request, reply);
          }
        }, 0);
      }
    });
  }

  /** Cancel the running job, if any (its promise rejects with AnalysisCancelled). */
  cancel(): void {
    const pending = this._pending;
    this._finish();
    pending?.reject(new AnalysisCancelled());
  }

  /** End any worker. */
  dispose(): void {
    this.cancel();
  }

  private _finish(): void {
    this._pending = null;
    if (this._worker) {
      this._worker.terminate();
      this._worker = null;
    }
  }

  private _factory: () => Worker | null;
  private _worker: Worker | null = null;
  private _pending: { id: number; reject: (reason: unknown) => void } | null = null;
  private _id = 0;
  private _usesWorker = false;
}
