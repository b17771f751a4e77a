/**
 * Messages between the UI and the one analysis worker. The handler is pure:
 * the worker entry (src/worker/analysis.worker.ts) wires it to `postMessage`,
 * tests call it directly or from a Node worker thread.
 *
 * Request:  { id, kind: 'parse', source }  → { id, kind: 'parsed', result }
 *           Parses a cell output's MIME bundle, or a file's text, off the
 *           page's thread; the parsed table's number columns come back as
 *           Float64Arrays (the worker transfers their buffers).
 *           { id, kind: 'run', job, cancelFlag? }
 *           The job's x, y and σ may be Float64Arrays (the UI transfers
 *           their buffers). `cancelFlag` is an Int32Array over a
 *           SharedArrayBuffer: the client stores a non-zero value in element
 *           0 to stop the job; the engine reads it with Atomics at every
 *           iteration and stops at the best point so far.
 * Replies:  { id, kind: 'progress', iteration, evaluations, cost, best }  (at most every PROGRESS_INTERVAL_MS)
 *           { id, kind: 'done', outcome }
 *           { id, kind: 'cancelled', best }   (the flag stopped the job)
 *           { id, kind: 'failed', message }   (an ICoreMessage, for the UI to translate)
 *
 * Request:  { id, kind: 'isotherms', job, cancelFlag? }
 *           The isotherm analysis (runIsothermJob) on three columns and its
 *           controls; the columns' values may be Float64Arrays (transferred).
 * Replies:  { id, kind: 'isotherm-progress', stage, fraction }  (at most every PROGRESS_INTERVAL_MS, and at each new stage)
 *           { id, kind: 'isotherms-done', answer }   (ok, needs-unit or refused)
 *           { id, kind: 'cancelled', best: null }    (the flag stopped the job)
 *           { id, kind: 'failed', message }
 *
 * Without shared memory a busy worker cannot see a cancel request, so the
 * client ends the worker instead and keeps the best point of the last
 * progress reply: that is why every progress reply carries it.
 */
import { msg, messageOf } from '../messages';
import type { ICoreMessage } from '../messages';
import type { IFitProgress, IFitResult } from '../fit/types';
import type { IAnalysisJob, IAnalysisOutcome } from './types';
import { runAnalysisJob } from './run';
import { parseMime, parseOutput } from '../table';
import { runIsothermJob } from '../sweeps/job';
import { runAnalysisTask } from './tasks';
import type { AnalysisTask, AnalysisTaskResult } from './tasks-types';
import type { IIsothermJob, IsothermJobAnswer, IsothermStage } from '../sweeps/job-types';
import type { ParseResult } from '../table';

/** A request to run one job. */
export interface IRunRequest {
  id: number;
  kind: 'run';
  job: IAnalysisJob;
  /** Cooperative cancel: element 0 ≠ 0 stops the job (Int32Array over a SharedArrayBuffer). */
  cancelFlag?: Int32Array;
}
/** What a parse request reads: a cell output's MIME bundle, or a file's text with its MIME type. */
export type ParseSource = { bundle: Readonly<Record<string, unknown>> } | { mime: string; text: string };

/** A request to parse a table. */
export interface IParseRequest {
  id: number;
  kind: 'parse';
  source: ParseSource;
}

/** A request to run the isotherm analysis. */
export interface IIsothermRequest {
  id: number;
  kind: 'isotherms';
  job: IIsothermJob;
  /** Cooperative cancel, as for a run request. */
  cancelFlag?: Int32Array;
}

/** A request to run several fits of one job: model comparison, window scan or bootstrap. */
export interface ITaskRequest {
  id: number;
  kind: 'task';
  task: AnalysisTask;
  /** Cooperative cancel, as for a run request. */
  cancelFlag?: Int32Array;
}

export type AnalysisRequest = IRunRequest | IParseRequest | IIsothermRequest | ITaskRequest;

/** Parse a table source (the worker's job for a parse request; also the main-thread fallback). */
export function parseSource(source: ParseSource): ParseResult {
  return 'bundle' in source ? parseOutput(source.bundle) : parseMime(source.mime, source.text);
}

/** The buffers of a parsed table's number columns, to transfer. */
export function parseTransfer(result: ParseResult): ArrayBuffer[] {
  const buffers = new Set<ArrayBuffer>();
  for (const c of result.ok ? result.table.columns : []) {
    if (c.values instanceof Float64Array) {
      buffers.add(c.values.buffer as ArrayBuffer);
    }
  }
  return [...buffers];
}

/**
 * The best point a fit has reached so far: values and χ² without
 * uncertainties (a stopped fit has no covariance worth quoting).
 */
export interface IBestSoFar {
  /** Parameter names, in the order of `values`. */
  parameters: string[];
  values: number[];
  /** χ² at `values` (the residual sum of squares when no σ were given). */
  chi2: number;
  /** Iterations done when this point was reached. */
  iteration: number;
}

/** Progress of a running job, with the best point so far (null before the engine's first report). */
export interface IProgressReply {
  id: number;
  kind: 'progress';
  iteration: number;
  evaluations: number;
  /** χ² at the best point so far. */
  cost: number;
  best: IBestSoFar | null;
}

export interface IDoneReply {
  id: number;
  kind: 'done';
  outcome: IAnalysisOutcome;
}

/** The cancel flag stopped the job: the best point the engine had reached (null when it had none). */
export interface ICancelledReply {
  id: number;
  kind: 'cancelled';
  best: IBestSoFar | null;
}

export interface IFailedReply {
  id: number;
  kind: 'failed';
  message: ICoreMessage;
}

/** A parsed table (or why there is none). */
export interface IParsedReply {
  id: number;
  kind: 'parsed';
  result: ParseResult;
}

/** Progress of an isotherm analysis: the stage running and the fraction of the whole job done. */
export interface IIsothermProgressReply {
  id: number;
  kind: 'isotherm-progress';
  stage: IsothermStage;
  fraction: number;
}

/** The isotherm analysis's answer (its report, or why there is none). */
export interface IIsothermsDoneReply {
  id: number;
  kind: 'isotherms-done';
  answer: IsothermJobAnswer;
}

/** Progress of a task: the fraction of its fits done. */
export interface ITaskProgressReply {
  id: number;
  kind: 'task-progress';
  fraction: number;
}

/** A task's result. */
export interface ITaskDoneReply {
  id: number;
  kind: 'task-done';
  result: AnalysisTaskResult;
}

export type AnalysisResponse =
  | IProgressReply
  | IDoneReply
  | ICancelledReply
  | IFailedReply
  | IParsedReply
  | IIsothermProgressReply
  | IIsothermsDoneReply
  | ITaskProgressReply
  | ITaskDoneReply;

/** Least time between two progress replies, in ms. */
export const PROGRESS_INTERVAL_MS = 100;

/** The best point of an engine progress report, or null when the report carries no values. */
export function bestOfProgress(p: IFitProgress): IBestSoFar | null {
  if (!p.values || !p.parameters) {
    return null;
  }
  return { parameters: [...p.parameters], values: [...p.values], chi2: p.cost, iteration: p.iteration };
}

/** The point a finished (or stopped) fit returned, as a best-so-far point. */
export function bestOfFit(fit: IFitResult): IBestSoFar {
  return { parameters: [...fit.parameters], values: [...fit.values], chi2: fit.chi2, iteration: fit.iterations };
}

function isArrayLikeOfNumbers(v: unknown): boolean {
  return Array.isArray(v) || v instanceof Float64Array;
}

/** Whether `v` looks like a run request (the job itself is checked by the job's own validation). */
function isRunRequest(v: unknown): v is IRunRequest {
  const r = v as Partial<IRunRequest> | null;
  return (
    typeof r === 'object' &&
    r !== null &&
    r.kind === 'run' &&
    typeof r.id === 'number' &&
    typeof r.job === 'object' &&
    r.job !== null &&
    isArrayLikeOfNumbers(r.job.x) &&
    isArrayLikeOfNumbers(r.job.y) &&
    (r.job.sigma === undefined || isArrayLikeOfNumbers(r.job.sigma)) &&
    (r.cancelFlag === undefined || (r.cancelFlag instanceof Int32Array && r.cancelFlag.length >= 1))
  );
}

/** Whether `v` looks like an isotherm request (the job itself is checked by the job). */
function isIsothermRequest(v: unknown): v is IIsothermRequest {
  const r = v as Partial<IIsothermRequest> | null;
  return (
    typeof r === 'object' &&
    r !== null &&
    r.kind === 'isotherms' &&
    typeof r.id === 'number' &&
    typeof r.job === 'object' &&
    r.job !== null &&
    (r.cancelFlag === undefined || (r.cancelFlag instanceof Int32Array && r.cancelFlag.length >= 1))
  );
}

/** Runs an isotherm request: progress (throttled, and at each new stage), then one answer. */
function handleIsotherms(request: IIsothermRequest, post: (response: AnalysisResponse) => void, now: () => number): void {
  const { id, job, cancelFlag } = request;
  const stopped = cancelFlag ? (): boolean => Atomics.load(cancelFlag, 0) !== 0 : (): boolean => false;
  let last = -Infinity;
  let lastStage: IsothermStage | null = null;
  let answer: IsothermJobAnswer;
  try {
    answer = runIsothermJob(job, {
      shouldStop: cancelFlag ? stopped : undefined,
      onProgress: (stage, fraction) => {
        const t = now();
        if (stage !== lastStage || t - last >= PROGRESS_INTERVAL_MS) {
          last = t;
          lastStage = stage;
          post({ id, kind: 'isotherm-progress', stage, fraction });
        }
      }
    });
  } catch (e) {
    post(stopped() ? { id, kind: 'cancelled', best: null } : { id, kind: 'failed', message: messageOf(e) });
    return;
  }
  post(stopped() || answer.status === 'cancelled' ? { id, kind: 'cancelled', best: null } : { id, kind: 'isotherms-done', answer });
}

/** Whether `v` looks like a task request (the job inside is checked by the task's fits). */
function isTaskRequest(v: unknown): v is ITaskRequest {
  const r = v as Partial<ITaskRequest> | null;
  const task = r?.task as Partial<AnalysisTask> | undefined;
  return (
    typeof r === 'object' &&
    r !== null &&
    r.kind === 'task' &&
    typeof r.id === 'number' &&
    typeof task === 'object' &&
    task !== null &&
    (task.type === 'compare' || task.type === 'window-scan' || task.type === 'bootstrap') &&
    typeof task.job === 'object' &&
    task.job !== null &&
    isArrayLikeOfNumbers(task.job.x) &&
    isArrayLikeOfNumbers(task.job.y) &&
    (r.cancelFlag === undefined || (r.cancelFlag instanceof Int32Array && r.cancelFlag.length >= 1))
  );
}

/** Runs a task request: progress (throttled), then one result, cancelled or failed. */
function handleTask(request: ITaskRequest, post: (response: AnalysisResponse) => void, now: () => number): void {
  const { id, task, cancelFlag } = request;
  const stopped = cancelFlag ? (): boolean => Atomics.load(cancelFlag, 0) !== 0 : (): boolean => false;
  let last = -Infinity;
  let result: AnalysisTaskResult;
  try {
    result = runAnalysisTask(task, {
      shouldStop: cancelFlag ? stopped : undefined,
      onProgress: fraction => {
        const t = now();
        if (t - last >= PROGRESS_INTERVAL_MS) {
          last = t;
          post({ id, kind: 'task-progress', fraction });
        }
      }
    });
  } catch (e) {
    post(stopped() ? { id, kind: 'cancelled', best: null } : { id, kind: 'failed', message: messageOf(e) });
    return;
  }
  post(stopped() || result.type === 'cancelled' ? { id, kind: 'cancelled', best: null } : { id, kind: 'task-done', result });
}

/**
 * Run a request and post its replies: progress (throttled), then exactly one
 * of done, cancelled or failed. Never throws.
 *
 * @param now - clock for the progress throttle, in ms (tests pass their own)
 */
export function handleAnalysisMessage(request: unknown, post: (response: AnalysisResponse) => void, now: () => number = Date.now): void {
  const r = request as Partial<IParseRequest> | null;
  if (r && typeof r === 'object' && r.kind === 'parse' && typeof r.id === 'number' && r.source && typeof r.source === 'object') {
    let result: ParseResult;
    try {
      result = parseSource(r.source);
    } catch (e) {
      result = { ok: false, message: messageOf(e) };
    }
    post({ id: r.id, kind: 'parsed', result });
    return;
  }
  if (isIsothermRequest(request)) {
    handleIsotherms(request, post, now);
    return;
  }
  if (isTaskRequest(request)) {
    handleTask(request, post, now);
    return;
  }
  if (!isRunRequest(request)) {
    const id = typeof (request as { id?: unknown } | null)?.id === 'number' ? (request as { id: number }).id : -1;
    post({ id, kind: 'failed', message: msg('analysis.malformed-request', 'The analysis worker received a request it cannot read.') });
    return;
  }
  const { id, job, cancelFlag } = request;
  const stopped = cancelFlag ? (): boolean => Atomics.load(cancelFlag, 0) !== 0 : (): boolean => false;
  let last = -Infinity;
  let best: IBestSoFar | null = null;
  let outcome: IAnalysisOutcome;
  try {
    outcome = runAnalysisJob(job, {
      shouldStop: cancelFlag ? stopped : undefined,
      onProgress: p => {
        best = bestOfProgress(p) ?? best;
        const t = now();
        if (t - last >= PROGRESS_INTERVAL_MS) {
          last = t;
          post({ id, kind: 'progress', iteration: p.iteration, evaluations: p.evaluations, cost: p.cost, best });
        }
      }
    });
  } catch (e) {
    // A job stopped by its flag may still fail afterwards (e.g. a curve at a wild point): the stop wins.
    post(stopped() ? { id, kind: 'cancelled', best } : { id, kind: 'failed', message: messageOf(e) });
    return;
  }
  post(stopped() ? { id, kind: 'cancelled', best: bestOfFit(outcome.fit) } : { id, kind: 'done', outcome });
}
