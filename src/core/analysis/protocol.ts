/**
 * Messages between the analysis panel and its worker. The handler is pure:
 * the worker entry wires it to `postMessage`, tests call it directly.
 *
 * Request:  { id, kind: 'run', job, starts? }
 * Replies:  { id, kind: 'progress', iteration, evaluations, cost }
 *           { id, kind: 'done', outcome } | { id, kind: 'failed', message }
 * Cancelling is done by the client (it ends the worker and keeps the
 * previous outcome); a fit itself never blocks the page.
 */
import type { IAnalysisJob, IAnalysisOutcome } from './types';
import { runAnalysisJob } from './run';

/** A request to run one job. */
export interface IRunRequest {
  id: number;
  kind: 'run';
  job: IAnalysisJob;
  /** Start values for expression models, by parameter name. */
  starts?: Record<string, number>;
}
export type AnalysisRequest = IRunRequest;

export type AnalysisResponse =
  | { id: number; kind: 'progress'; iteration: number; evaluations: number; cost: number }
  | { id: number; kind: 'done'; outcome: IAnalysisOutcome }
  | { id: number; kind: 'failed'; message: string };

/** Least time between two progress messages, in ms. */
export const PROGRESS_INTERVAL_MS = 100;

/** Run a request and post its replies. Never throws: failures become 'failed' replies. */
export function handleAnalysisMessage(request: unknown, post: (response: AnalysisResponse) => void, now: () => number = Date.now): void {
  const r = request as Partial<IRunRequest> | null;
  const id = r && typeof r.id === 'number' ? r.id : -1;
  if (!r || r.kind !== 'run' || !r.job) {
    post({ id, kind: 'failed', message: 'malformed analysis request' });
    return;
  }
  let last = -Infinity;
  try {
    const outcome = runAnalysisJob(
      r.job,
      {
        onProgress: p => {
          const t = now();
          if (t - last >= PROGRESS_INTERVAL_MS) {
            last = t;
            post({ id, kind: 'progress', iteration: p.iteration, evaluations: p.evaluations, cost: p.cost });
          }
        }
      },
      r.starts ?? {}
    );
    post({ id, kind: 'done', outcome });
  } catch (e) {
    post({ id, kind: 'failed', message: e instanceof Error ? e.message : String(e) });
  }
}
