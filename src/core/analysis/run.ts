/**
 * Runs an analysis job: looks its kind up in the catalogue, picks the points
 * in the fit window, runs the kind's fit, and judges whether the result
 * describes the data (the verdict), so that no caller can show a result
 * without one.
 */
import { msg } from '../messages';
import { AnalysisInputError } from './errors';
import type { IAnalysisHooks } from './hooks';
import { kindById, optionsFromJson } from './kinds';
import type { IAnalysisJob, IAnalysisOutcome } from './types';
import { judgeFit } from './verdict';
import { windowedPoints } from './window';

/**
 * Run a job. Bad inputs throw {@link AnalysisInputError} (or the physics
 * module's input error) with a message naming the input; a fit that does not
 * converge returns normally with `fit.converged = false`, its reason and a
 * 'not-converged' verdict.
 */
export function runAnalysisJob(job: IAnalysisJob, hooks: IAnalysisHooks = {}): IAnalysisOutcome {
  const kind = kindById(job.kind);
  if (!kind) {
    throw new AnalysisInputError(msg('analysis.unknown-kind', 'This psiscape has no analysis called "%1".', String(job.kind).slice(0, 40)));
  }
  const options = optionsFromJson(kind.id, job.options as Record<string, unknown>);
  const pts = windowedPoints(job);
  const { outcome, fitted, bounds } = kind.run({ ...job, options }, pts, hooks);
  const cautions = [...outcome.cautions];
  const warm = outcome.fit.warmStart;
  if (warm?.used) {
    cautions.push(
      msg('caution.warm-start', 'Large table: the iteration started from a fit to one point in %1 (%2 points); the values are those of the fit to all %3 points.', warm.stride, warm.points, outcome.used)
    );
  }
  // Every kind's drawn curve is checked, whether or not the kind passed it along with its points.
  const verdict = judgeFit(outcome.fit, { ...fitted, curve: fitted.curve ?? outcome.curve.y, lower: (bounds ?? outcome.fit.bounds)?.lower, upper: (bounds ?? outcome.fit.bounds)?.upper });
  return { ...outcome, cautions, kind: kind.id, window: { ...job.window }, skipped: pts.skipped, verdict };
}
