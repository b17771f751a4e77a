/**
 * Coarse-to-fine start for large problems: with many more points than
 * needed to locate the minimum roughly, the iteration first runs on an
 * evenly strided subsample (every s-th point, about
 * `warmStartSampleSize(n)` points, itself started from a coarser subsample
 * when it is large enough), then continues on all points from that solution. The final
 * answer and every stopping rule are those of the full data; only the path
 * to the full-data minimum is cheaper (the subsample's minimum lies within
 * about √s standard errors of it, one or two Gauss–Newton steps away).
 *
 * Only for models that declare `pointwise` (f(xᵢ) depends on xᵢ alone).
 * If the continuation from the subsample's solution does not converge, the
 * full-data fit runs again from the original start, and the better of the
 * two (lower χ²) is kept — the warm start never costs a fit its
 * convergence.
 */
import { FIT_DEFAULTS } from './defaults';
import { ResidualEvaluator } from './evaluator';
import { levenbergMarquardtSteps } from './lm';
import type { ILmHooks, ILmOutcome } from './lm';
import type { IFitProblem } from './problem';
import type { IFitResult } from './types';

/** What the subsample stage did (reported with the result). */
export interface IWarmStartInfo {
  /** Every `stride`-th point was used. */
  stride: number;
  /** Points in the subsample. */
  points: number;
  /** Model calls on the subsample. */
  evaluations: number;
  /** Whether the subsample fit converged. */
  converged: boolean;
  /** Whether the full-data continuation from it was kept (else: the fit from the original start). */
  used: boolean;
}

/**
 * Points of the subsample for a problem of n points: `warmStartSample`
 * from `warmStartFullSampleRows` points on (the continuation then starts
 * within a few standard errors of the full-data minimum), otherwise about
 * `warmStartSampleFactor`·√n (the subsample's own minimum then lies about
 * (n/m)^½ standard errors away, and its iterations cost a small part of
 * one full-data pass each). A subsample below `warmStartRows` points has
 * no subsample of its own: it is the innermost stage, which runs from the
 * user's start and takes most of the iterations, so it is smaller, about
 * `warmStartInnerFactor`·√n points, at least `warmStartMinSample` (the
 * next stage then starts about √stride ≈ 2.5 of its standard errors away,
 * as the full data do from `warmStartFullSampleRows` points on).
 */
export function warmStartSampleSize(n: number): number {
  if (n >= FIT_DEFAULTS.warmStartFullSampleRows) {
    return FIT_DEFAULTS.warmStartSample;
  }
  const m = Math.min(FIT_DEFAULTS.warmStartSample, Math.ceil(FIT_DEFAULTS.warmStartSampleFactor * Math.sqrt(n)));
  if (m >= FIT_DEFAULTS.warmStartRows) {
    return m;
  }
  return Math.max(FIT_DEFAULTS.warmStartMinSample, Math.ceil(FIT_DEFAULTS.warmStartInnerFactor * Math.sqrt(n)));
}

/** Stride for n points of a pointwise model, or 0 when no warm start applies. */
export function warmStartStrideFor(n: number, pointwise: boolean): number {
  if (!pointwise || n < FIT_DEFAULTS.warmStartRows) {
    return 0;
  }
  return Math.max(2, Math.floor(n / warmStartSampleSize(n)));
}

/** Stride for the problem, or 0 when no warm start applies. */
export function warmStartStride(problem: IFitProblem): number {
  return warmStartStrideFor(problem.n, problem.model.pointwise === true);
}

function subsample(problem: IFitProblem, stride: number): IFitProblem {
  const m = Math.ceil(problem.n / stride);
  const pick = (a: Float64Array): Float64Array => {
    const out = problem.workspace.take(m);
    for (let i = 0, j = 0; j < m; i += stride, j++) {
      out[j] = a[i];
    }
    return out;
  };
  return {
    ...problem,
    n: m,
    x: pick(problem.x),
    y: pick(problem.y),
    xLow: null,
    yLow: null,
    weights: problem.weights ? pick(problem.weights) : null
  };
}

/**
 * The iteration for `problem` with `ev` (the full-data evaluator), preceded
 * by a subsample stage when `warmStartStride` allows. Yields after every
 * trial step of every stage; returns the full-data outcome and what the
 * warm start did (null when there was none).
 */
export function* warmStartedSteps(
  problem: IFitProblem,
  ev: ResidualEvaluator,
  hooks: ILmHooks
): Generator<void, { outcome: ILmOutcome; warmStart: IWarmStartInfo | null }, void> {
  const stride = warmStartStride(problem);
  if (stride === 0) {
    return { outcome: yield* levenbergMarquardtSteps(problem, ev, hooks), warmStart: null };
  }
  const sub = subsample(problem, stride);
  const subEv = new ResidualEvaluator(sub);
  // Progress of the subsample stage in full-data units (χ² scaled by n/m).
  const scale = problem.n / sub.n;
  // The subsample stage may itself start from a coarser subsample.
  const { outcome: coarse, warmStart: inner } = yield* warmStartedSteps(sub, subEv, {
    coarse: true,
    shouldStop: hooks.shouldStop,
    onProgress: hooks.onProgress
      ? (p) => hooks.onProgress!({ ...p, evaluations: 0, cost: p.cost * scale })
      : undefined
  });
  const info: IWarmStartInfo = {
    stride,
    points: sub.n,
    evaluations: subEv.evaluations + (inner ? inner.evaluations : 0),
    converged: coarse.converged,
    used: false
  };
  if (coarse.reason.code === 'fit.stop.cancelled') {
    // Nothing on the full data yet: the best point is the subsample's, evaluated on all points.
    const best = { ...problem, start: ev.fullParameters(coarse.p) };
    return { outcome: yield* levenbergMarquardtSteps(best, ev, { ...hooks, shouldStop: () => true }), warmStart: info };
  }
  if (!Number.isFinite(coarse.cost)) {
    return { outcome: yield* levenbergMarquardtSteps(problem, ev, hooks), warmStart: info };
  }
  const start = ev.fullParameters(coarse.p);
  const fine = yield* levenbergMarquardtSteps({ ...problem, start }, ev, hooks);
  if (fine.converged || fine.reason.code === 'fit.stop.cancelled') {
    info.used = true;
    return { outcome: fine, warmStart: info };
  }
  const again = yield* levenbergMarquardtSteps(problem, ev, hooks);
  info.used = !(again.converged || again.cost < fine.cost);
  return { outcome: info.used ? fine : again, warmStart: info };
}

/** The result with what the warm start did (unchanged without one); sets `warmStart` on `result` itself. */
export function withWarmStart(result: IFitResult, info: IWarmStartInfo | null): IFitResult {
  if (info === null) {
    return result;
  }
  result.warmStart = { ...info };
  return result;
}
