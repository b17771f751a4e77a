/**
 * Runs an analysis job: looks its kind up in the catalogue, picks the points
 * in the fit window, weights them (weights.ts), runs the kind's fit, and
 * judges whether the result describes the data (the verdict), so that no
 * caller can show a result without one. Equal and σ fits also get the
 * residual check of weights.ts (does the scatter grow with |y|?).
 */
import { msg } from '../messages';
import { AnalysisInputError } from './errors';
import type { IAnalysisHooks } from './hooks';
import { kindById, optionsFromJson } from './kinds';
import type { IAnalysisKind, IKindResult } from './kinds/types';
import type { IAnalysisJob, IAnalysisOutcome, IResidualCheck, IWeighting } from './types';
import { judgeFit } from './verdict';
import { compareScatterModels, errorFactors, factorsText, relativeSigma, resolveWeights, weightingNote } from './weights';
import { windowedPoints } from './window';
import type { IWindowedPoints } from './window';

/** How a job is run (for callers that run many fits of one job: comparisons, bootstrap). */
export interface IRunOptions {
  /** Make the residual check of equal and σ fits (default true); it may refit once with relative weights. */
  residualCheck?: boolean;
}

/** Number of free parameters of a fit. */
export function freeCount(fixed: readonly boolean[]): number {
  return fixed.filter(f => !f).length;
}

/**
 * Run a job. Bad inputs throw {@link AnalysisInputError} (or the physics
 * module's input error) with a message naming the input; a fit that does not
 * converge returns normally with `fit.converged = false`, its reason and a
 * 'not-converged' verdict.
 */
export function runAnalysisJob(job: IAnalysisJob, hooks: IAnalysisHooks = {}, runOptions: IRunOptions = {}): IAnalysisOutcome {
  const kind = kindById(job.kind);
  if (!kind) {
    throw new AnalysisInputError(msg('analysis.unknown-kind', 'This psiscape has no analysis called "%1".', String(job.kind).slice(0, 40)));
  }
  const options = optionsFromJson(kind.id, job.options as Record<string, unknown>);
  const pts = windowedPoints(job);
  const plan = resolveWeights(job, pts);
  const kindJob = { ...job, options };
  let fraction = plan.fraction;
  let sigma = plan.sigma;
  let estimated = false;
  if (plan.mode === 'relative' && plan.fraction === null) {
    // f̂ = √(χ²/(n − k)) of the fit with σ = |y| (see weights.ts).
    const first = kind.run(kindJob, { ...pts, sigma }, hooks).outcome.fit;
    const dof = first.dof;
    const f = dof > 0 ? Math.sqrt(first.chi2 / dof) : Number.NaN;
    if (!(f > 0) || !Number.isFinite(f)) {
      throw new AnalysisInputError(
        msg('weights.fraction-not-estimated', 'The relative error f of σ = f·|y| could not be estimated from the residuals (%1 points, %2 degrees of freedom): give f, or use equal weights.', pts.x.length, dof)
      );
    }
    fraction = f;
    estimated = true;
    sigma = relativeSigma(pts.y, f);
  }
  const weighted: IWindowedPoints = { ...pts, sigma };
  const outcome = judged(kind, kindJob, weighted, hooks);
  const weighting: IWeighting = { mode: plan.mode, fraction, fractionEstimated: estimated, note: weightingNote(plan.mode, fraction, estimated), check: null };
  if (plan.mode !== 'relative' && runOptions.residualCheck !== false && outcome.fit.converged) {
    weighting.check = residualCheck(job, weighted, outcome, hooks);
  }
  return { ...outcome, weighting };
}

/** Run the kind on weighted points and attach the verdict. */
function judged(kind: IAnalysisKind, job: IAnalysisJob, pts: IWindowedPoints, hooks: IAnalysisHooks): IAnalysisOutcome {
  const { outcome, fitted, bounds }: IKindResult = kind.run(job, pts, hooks);
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

/**
 * Does the scatter of an equal or σ fit grow with |y|? When σ ∝ |y| is
 * clearly better, refit with relative weights (f estimated) and say by what
 * factor the standard errors change.
 */
function residualCheck(job: IAnalysisJob, pts: IWindowedPoints, outcome: IAnalysisOutcome, hooks: IAnalysisHooks): IResidualCheck {
  const fit = outcome.fit;
  const base = { errorFactors: [] as { name: string; factor: number }[], suggestion: null };
  // Kinds that fit other points than the window's (e.g. Landau: T against ψ) are not checked.
  if (fit.residuals.length !== pts.y.length || outcome.used !== pts.y.length) {
    return {
      ...base,
      gain: Number.NaN,
      spearman: Number.NaN,
      fraction: Number.NaN,
      relativeBetter: false,
      message: msg('weights.check.other-points', 'The scatter was not compared with σ ∝ |y|: this analysis fits other quantities than y against x.')
    };
  }
  const cmp = compareScatterModels(fit.residuals, pts.y, pts.sigma, freeCount(fit.fixed));
  if (cmp.untested) {
    return { ...base, gain: cmp.gain, spearman: cmp.spearman, fraction: cmp.fraction, relativeBetter: false, message: cmp.untested };
  }
  const numbers = { gain: cmp.gain, spearman: cmp.spearman, fraction: cmp.fraction, relativeBetter: cmp.relativeBetter };
  if (!cmp.relativeBetter) {
    return {
      ...base,
      ...numbers,
      message: pts.sigma
        ? msg('weights.check.sigma-fine', 'The scatter about the fit is described at least as well by the σ column as by σ ∝ |y| (−2 ln L difference %1; rank correlation of |residual| with |y| %2).', { value: cmp.gain, digits: 3 }, { value: cmp.spearman, digits: 2 })
        : msg('weights.check.equal-fine', 'The scatter about the fit does not grow with |y| enough to prefer σ ∝ |y| over equal weights (−2 ln L difference %1; rank correlation of |residual| with |y| %2).', { value: cmp.gain, digits: 3 }, { value: cmp.spearman, digits: 2 })
    };
  }
  const gain = { value: cmp.gain, digits: 3 };
  const rho = { value: cmp.spearman, digits: 2 };
  const f0 = { value: cmp.fraction, digits: 3 };
  const found = pts.sigma
    ? msg('weights.check.relative-better.sigma', 'The scatter grows with |y|: σ ∝ |y| (f ≈ %1) describes the residuals better than the σ column (−2 ln L lower by %2; rank correlation of |residual| with |y| %3).', f0, gain, rho)
    : msg('weights.check.relative-better.equal', 'The scatter grows with |y|: σ ∝ |y| (f ≈ %1) describes the residuals better than equal weights (−2 ln L lower by %2; rank correlation of |residual| with |y| %3).', f0, gain, rho);
  let factors: { name: string; factor: number }[] = [];
  let refitF = cmp.fraction;
  try {
    const refit = runAnalysisJob({ ...job, weights: { mode: 'relative', fraction: null } }, hooks, { residualCheck: false });
    if (refit.fit.converged) {
      factors = errorFactors(outcome.derived, refit.derived);
      refitF = refit.weighting?.fraction ?? refitF;
    }
  } catch {
    // The refit is advice only; without it the suggestion names no factors.
  }
  const f = { value: refitF, digits: 3 };
  let suggestion;
  if (factors.length > 0) {
    suggestion = pts.sigma
      ? msg('weights.suggest-relative.sigma', 'Relative weights σ = f·|y| fit the scatter better than the σ column (−2 ln L lower by %1). Refitted with them (f = %2 estimated), the standard errors change by %3: choose relative weights.', gain, f, factorsText(factors))
      : msg('weights.suggest-relative.equal', 'Relative weights σ = f·|y| fit the scatter better than equal weights (−2 ln L lower by %1). Refitted with them (f = %2 estimated), the standard errors change by %3: choose relative weights.', gain, f, factorsText(factors));
  } else {
    suggestion = msg('weights.suggest-relative.no-refit', 'Relative weights σ = f·|y| fit the scatter better (−2 ln L lower by %1): choose relative weights.', gain);
  }
  return { ...numbers, errorFactors: factors, message: found, suggestion };
}
