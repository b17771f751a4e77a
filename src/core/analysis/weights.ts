/**
 * How the points of a fit are weighted, and a check of the residuals that
 * says when σ ∝ |y| would describe the scatter better.
 *
 * Modes (IAnalysisJob.weights):
 * - 'sigma': σ_i from the σ column (the default when a σ column is given).
 *   The standard errors rest on those σ.
 * - 'relative': σ_i = f·|y_i|. With f given, the standard errors rest on it
 *   (known σ). With f = null it is estimated: the kind is first fitted with
 *   σ_i = |y_i| (its parameters do not depend on f), then
 *   f̂ = √(χ²/(n − k)) of that fit, i.e. the rms of the relative residuals
 *   (y_i − ŷ_i)/|y_i| with n − k degrees of freedom (the usual residual
 *   variance of weighted least squares: N. R. Draper & H. Smith, "Applied
 *   Regression Analysis", 3rd ed., Wiley 1998, on generalised and weighted
 *   least squares), and the fit is
 *   repeated with σ_i = f̂·|y_i|. The standard errors are then those of an
 *   equal-scale fit scaled by the residual variance, and χ²_red ≈ 1 by
 *   construction (the χ² test then says nothing about the level of the
 *   scatter). Relative weights are refused when some |y_i| is near zero.
 * - 'equal': every point the same weight (the default without σ); the
 *   covariance is scaled by the residual variance (χ²_red).
 *
 * The residual check (equal and σ fits): the two variance models σ_i = s·c_i
 * (c_i = 1 or the σ column) and σ_i = f·|y_i|, each with its scale
 * maximum-likelihood profiled, are compared on the residuals r_i of the
 * fit made:
 *   −2 ln L(c) = n ln(Σ(r_i/c_i)²/n) + 2 Σ ln c_i + n (1 + ln 2π).
 * Both have one free scale, so the difference (the "gain") is their AIC
 * difference; above {@link WEIGHT_LIMITS}.preferRelative (10: "essentially
 * no support" for the worse model, K. P. Burnham & D. R. Anderson, "Model
 * Selection and Multimodel Inference", 2nd ed., Springer 2002, their rules
 * of thumb for AIC differences) the
 * relative weights are suggested, with the factors by which a refit with them
 * changes the standard errors. The Spearman rank correlation of |r_i| with
 * |y_i| (C. Spearman, Am. J. Psychol. 15, 72 (1904)) is reported beside it.
 */
import { formatNumberArg, msg } from '../messages';
import type { ICoreMessage } from '../messages';
import { AnalysisInputError } from './errors';
import type { IAnalysisJob, IDerivedValue } from './types';
import type { IWindowedPoints } from './window';

/** Thresholds of the weighting, all in one place. */
export const WEIGHT_LIMITS = {
  /**
   * Relative weights are refused when some |y_i| is below this fraction of
   * the largest |y| in the window: that point's weight would exceed the
   * others' by more than 1e12 and decide the fit alone (common practice, no
   * source).
   */
  nearZeroRelative: 1e-6,
  /** Gain (−2 ln L difference) above which σ ∝ |y| is suggested (see the module comment). */
  preferRelative: 10
} as const;

/** A weighting mode. */
export type WeightMode = 'sigma' | 'relative' | 'equal';

/** The mode of a job: as asked, else 'sigma' with a σ column and 'equal' without. */
export function weightMode(job: Pick<IAnalysisJob, 'weights' | 'sigma'>): WeightMode {
  return job.weights?.mode ?? (job.sigma ? 'sigma' : 'equal');
}

/** The weights of a job resolved against its windowed points (f still null when it is to be estimated). */
export interface IWeightPlan {
  mode: WeightMode;
  /** Given f (relative mode), or null (estimate it; other modes). */
  fraction: number | null;
  /** σ to fit with: the column ('sigma'), f·|y| (relative, f given), |y| (relative, f to be estimated), none ('equal'). */
  sigma: number[] | undefined;
}

/** Refuse relative weights when some |y| is (near) zero (see {@link WEIGHT_LIMITS}). */
export function requireRelativeY(pts: Pick<IWindowedPoints, 'x' | 'y'>): void {
  let largest = 0;
  for (let i = 0; i < pts.y.length; i++) {
    largest = Math.max(largest, Math.abs(pts.y[i]));
  }
  for (let i = 0; i < pts.y.length; i++) {
    if (!(Math.abs(pts.y[i]) > WEIGHT_LIMITS.nearZeroRelative * largest)) {
      throw new AnalysisInputError(
        msg(
          'weights.relative-zero-y',
          'Relative weights σ = f·|y| need y away from zero, but y = %1 at x = %2 (the largest |y| in the window is %3): that point would get an almost infinite weight. Use equal weights or a σ column, or move the window off that point.',
          pts.y[i],
          pts.x[i],
          largest
        )
      );
    }
  }
}

/** Whether every |y| is far enough from zero for relative weights. */
export function relativeAllowed(y: ArrayLike<number>): boolean {
  let largest = 0;
  for (let i = 0; i < y.length; i++) {
    largest = Math.max(largest, Math.abs(y[i]));
  }
  for (let i = 0; i < y.length; i++) {
    if (!(Math.abs(y[i]) > WEIGHT_LIMITS.nearZeroRelative * largest)) {
      return false;
    }
  }
  return y.length > 0;
}

/** σ_i = f·|y_i|. */
export function relativeSigma(y: ArrayLike<number>, f: number): number[] {
  return Array.from(y, v => f * Math.abs(v));
}

/**
 * The weights of a job on its windowed points.
 *
 * @throws AnalysisInputError for 'sigma' without a σ column, a relative
 * fraction that is not a finite number above 0, or relative weights with a
 * (near-)zero y.
 */
export function resolveWeights(job: Pick<IAnalysisJob, 'weights' | 'sigma'>, pts: IWindowedPoints): IWeightPlan {
  const mode = weightMode(job);
  if (mode === 'sigma') {
    if (!pts.sigma) {
      throw new AnalysisInputError(msg('weights.no-sigma-column', 'Weights from a σ column were asked for, but no σ column is chosen. Choose one, or equal or relative weights.'));
    }
    return { mode, fraction: null, sigma: pts.sigma };
  }
  if (mode === 'equal') {
    return { mode, fraction: null, sigma: undefined };
  }
  const f = job.weights?.fraction ?? null;
  if (f !== null && !(typeof f === 'number' && f > 0 && Number.isFinite(f))) {
    throw new AnalysisInputError(msg('weights.bad-fraction', 'The relative error f of σ = f·|y| must be a finite number above 0, but it is %1. Leave it empty to estimate it from the residuals.', String(f)));
  }
  requireRelativeY(pts);
  return { mode, fraction: f, sigma: relativeSigma(pts.y, f ?? 1) };
}

/** The note of a weighting (what the standard errors rest on). */
export function weightingNote(mode: WeightMode, fraction: number | null, estimated: boolean): ICoreMessage {
  if (mode === 'sigma') {
    return msg('weights.note.sigma', 'Weighted by the σ column: the standard errors rest on those σ, and χ² tests them.');
  }
  if (mode === 'equal') {
    return msg('weights.note.equal', 'Equal weights: the covariance is scaled by the residual variance (χ²_red), so the standard errors assume the same scatter at every point.');
  }
  return estimated
    ? msg(
        'weights.note.relative-estimated',
        'Relative weights σ = f·|y| with f = %1 estimated as the rms of (y − fit)/|y| of the fit with weights 1/y² (n − k degrees of freedom); χ²_red is then 1 by construction and does not test the scatter.',
        { value: fraction ?? Number.NaN, digits: 3 }
      )
    : msg('weights.note.relative', 'Relative weights σ = f·|y| with f = %1 as given: the standard errors rest on that f, and χ² tests it.', { value: fraction ?? Number.NaN, digits: 3 });
}

/** −2 ln L (without the constant n(1 + ln 2π)) of residuals r under σ_i = s·c_i with s profiled; c absent means c_i = 1. */
export function profiledMinus2LogL(r: ArrayLike<number>, c: ArrayLike<number> | undefined): number {
  const n = r.length;
  let ss = 0;
  let logs = 0;
  for (let i = 0; i < n; i++) {
    const ci = c ? Math.abs(c[i]) : 1;
    ss += (r[i] / ci) ** 2;
    logs += Math.log(ci);
  }
  return n * Math.log(ss / n) + 2 * logs;
}

/** Ranks 1…n, ties given their average rank. */
function ranks(v: ArrayLike<number>): number[] {
  const order = Array.from({ length: v.length }, (_, i) => i).sort((a, b) => v[a] - v[b]);
  const out = new Array<number>(v.length);
  let i = 0;
  while (i < order.length) {
    let j = i;
    while (j + 1 < order.length && v[order[j + 1]] === v[order[i]]) {
      j++;
    }
    for (let m = i; m <= j; m++) {
      out[order[m]] = (i + j) / 2 + 1;
    }
    i = j + 1;
  }
  return out;
}

/** Spearman rank correlation (Pearson correlation of the ranks); NaN below 3 points or for a constant column. */
export function spearman(a: ArrayLike<number>, b: ArrayLike<number>): number {
  const n = a.length;
  if (n < 3 || b.length !== n) {
    return Number.NaN;
  }
  const ra = ranks(a);
  const rb = ranks(b);
  const mean = (n + 1) / 2;
  let sab = 0;
  let saa = 0;
  let sbb = 0;
  for (let i = 0; i < n; i++) {
    sab += (ra[i] - mean) * (rb[i] - mean);
    saa += (ra[i] - mean) ** 2;
    sbb += (rb[i] - mean) ** 2;
  }
  return saa > 0 && sbb > 0 ? sab / Math.sqrt(saa * sbb) : Number.NaN;
}

/** What the residual check found before any refit. */
export interface IScatterComparison {
  gain: number;
  spearman: number;
  fraction: number;
  relativeBetter: boolean;
  /** Why it was not tested, when it was not. */
  untested: ICoreMessage | null;
}

/**
 * Compare σ ∝ c (c = the σ column, or constant) with σ ∝ |y| on residuals r
 * of a fit with k free parameters (see the module comment).
 */
export function compareScatterModels(r: ArrayLike<number>, y: ArrayLike<number>, c: ArrayLike<number> | undefined, k: number): IScatterComparison {
  const n = r.length;
  const none = (why: ICoreMessage): IScatterComparison => ({ gain: Number.NaN, spearman: Number.NaN, fraction: Number.NaN, relativeBetter: false, untested: why });
  if (n - k < 3) {
    return none(msg('weights.check.too-few', 'The scatter was not compared with σ ∝ |y|: %1 points leave too few degrees of freedom beyond the %2 parameters.', n, k));
  }
  if (!relativeAllowed(y)) {
    return none(msg('weights.check.zero-y', 'The scatter was not compared with σ ∝ |y|: y comes (near) zero in the window, where relative weights are undefined.'));
  }
  let ss = 0;
  let rel = 0;
  const absR = new Array<number>(n);
  const absY = new Array<number>(n);
  for (let i = 0; i < n; i++) {
    ss += r[i] * r[i];
    rel += (r[i] / y[i]) ** 2;
    absR[i] = Math.abs(r[i]);
    absY[i] = Math.abs(y[i]);
  }
  if (!(ss > 0) || !Number.isFinite(ss)) {
    return none(msg('weights.check.no-scatter', 'The scatter was not compared with σ ∝ |y|: the residuals are all zero or not finite.'));
  }
  const gain = profiledMinus2LogL(r, c) - profiledMinus2LogL(r, y);
  return {
    gain,
    spearman: spearman(absR, absY),
    fraction: Math.sqrt(rel / (n - k)),
    relativeBetter: gain > WEIGHT_LIMITS.preferRelative,
    untested: null
  };
}

/** Factors σ(refit)/σ(fit) of the derived values both give with a finite σ above 0. */
export function errorFactors(before: readonly IDerivedValue[], after: readonly IDerivedValue[]): { name: string; factor: number }[] {
  const out: { name: string; factor: number }[] = [];
  for (const d of before) {
    const e = after.find(a => a.name === d.name);
    if (e && d.sigma > 0 && e.sigma > 0 && Number.isFinite(d.sigma) && Number.isFinite(e.sigma)) {
      out.push({ name: d.name, factor: e.sigma / d.sigma });
    }
  }
  return out;
}

/** "θ ×0.45, C ×0.6" for a message. */
export function factorsText(factors: readonly { name: string; factor: number }[]): string {
  return factors.map(f => `${f.name} ×${formatNumberArg(f.factor, 2)}`).join(', ');
}
