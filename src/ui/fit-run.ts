/**
 * Running a session's fit: build the job from the session, run it in the
 * shared analysis worker, and report progress, the outcome, a failure or a
 * cancel (with the best values so far) back to the session.
 */
import type { AnalysisSession } from '../core/analysis/session';
import { messageOf } from '../core/messages';
import type { AnalysisRunner } from './analysis-runner';

/** Run the fit the session's controls describe; never rejects. */
export async function runSessionFit(session: AnalysisSession, runner: AnalysisRunner): Promise<void> {
  const job = session.job();
  const token = session.beginRun();
  if (!('kind' in job && 'x' in job)) {
    session.failRun(token, job);
    return;
  }
  try {
    const result = await runner.run(job, p => session.reportProgress(token, { iteration: p.iteration, evaluations: p.evaluations, cost: p.cost }));
    if (result.kind === 'done') {
      session.finishRun(token, result.outcome);
    } else {
      session.cancelRun(token, result.best);
    }
  } catch (error) {
    session.failRun(token, messageOf(error));
  }
}
