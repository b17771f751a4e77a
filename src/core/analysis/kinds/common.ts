/**
 * Pieces every analysis kind uses: reading a parameter and its error from a
 * fit, the model curve over the window, the fewest-points check and the
 * cautions that go with any windowed fit.
 */
import type { IFitModel, IFitResult } from '../../fit/types';
import { msg } from '../../messages';
import type { ICoreMessage } from '../../messages';
import { chiSquareUpperTail } from '../../numeric/chi2';
import { AnalysisInputError } from '../errors';
import type { IWindowedPoints } from '../window';
import { grid } from '../window';

/** Points drawn on a model curve. */
export const CURVE_POINTS = 300;

/** The caution that goes with every fit over a window. */
export function windowCaution(): ICoreMessage {
  return msg('caution.window', 'Fitted values depend on the fit window: compare several windows before quoting them (exponents especially).');
}

/** A fitted parameter and its standard error (NaN when the fit has no such parameter). */
export function valueOf(fit: IFitResult, name: string): { value: number; sigma: number } {
  const i = fit.parameters.indexOf(name);
  return i < 0 ? { value: Number.NaN, sigma: Number.NaN } : { value: fit.values[i], sigma: fit.standardErrors[i] };
}

/** The job's start value of a parameter (`job.start`), or undefined when none is given or it is not finite. */
export function startValue(job: { start?: Readonly<Record<string, number>> }, name: string): number | undefined {
  const start = job.start;
  if (!start || !Object.prototype.hasOwnProperty.call(start, name)) {
    return undefined;
  }
  const v = start[name];
  return typeof v === 'number' && Number.isFinite(v) ? v : undefined;
}

/** The job's start values of `names` over `fallback` (same order): each given finite start replaces its entry. */
export function startsOver(job: { start?: Readonly<Record<string, number>> }, names: readonly string[], fallback: readonly number[]): number[] {
  return names.map((name, i) => startValue(job, name) ?? fallback[i]);
}

/** Correlation coefficient of two fitted parameters (NaN when either is missing). */
export function correlation(fit: IFitResult, a: string, b: string): number {
  const i = fit.parameters.indexOf(a);
  const j = fit.parameters.indexOf(b);
  return i < 0 || j < 0 ? Number.NaN : fit.correlation[i][j];
}

/** Smallest and largest of the fitted x. */
export function extent(values: ArrayLike<number>): { min: number; max: number } {
  let min = Infinity;
  let max = -Infinity;
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    if (v < min) {
      min = v;
    }
    if (v > max) {
      max = v;
    }
  }
  return { min, max };
}

/** The model evaluated on an even grid over the fitted x range. */
export function curveOf(model: IFitModel, values: number[], x: ArrayLike<number>): { x: number[]; y: number[] } {
  const { min, max } = extent(x);
  const xs = grid(min, max, CURVE_POINTS);
  const out = new Float64Array(xs.length);
  model.evaluate(Float64Array.from(values), Float64Array.from(xs), out);
  return { x: xs, y: Array.from(out) };
}

/**
 * Limits of the values a fit can work with, all in one place.
 *
 * The engine sums squares of residuals and of slopes in binary64, whose
 * range is about 1e±308: a column whose values reach beyond ±1e150 has
 * squares that overflow to ∞, and one whose largest value is below 1e-150
 * has squares that underflow to 0, so the optimiser steers by infinities or
 * zeros. Both limits are the square root of the range with a margin of
 * about 1e4 for sums over many points; no unit a measurement is quoted in
 * comes near either.
 */
export const VALUE_LIMITS = {
  /** Largest |value| of x, y or σ in the window. */
  largest: 1e150,
  /** Smallest allowed largest-|value| of a column that is not all zero. */
  smallestScale: 1e-150
} as const;

/**
 * Two x values closer than this, relative to the larger of their
 * magnitudes, count as one value when counting the distinct x a fit can
 * tell apart: their difference keeps fewer than 4 of the ≈ 16 significant
 * digits of binary64, so it is rounding, not a different temperature
 * (or field). A clock in seconds since 1970 (≈ 1.7e9 s) still resolves
 * 1 s (relative 6e-10).
 */
export const DISTINCT_X_RELATIVE = 1e-12;

/**
 * When y "hardly changes" over the window, so that no transition can be
 * fitted. Either rule refuses:
 *
 * - `relativeRange`: max(y) − min(y) is at most this fraction of max |y|
 *   (one part in a million: constant to the digits a column typically
 *   holds, noise-free or rounded to a constant).
 * - `scatterP`: the spread of y is no larger than its scatter from point to
 *   point. The scatter σ̂ is estimated from the pseudo-residuals of
 *   Gasser, Sroka & Jennen-Steinmetz (1986, Biometrika 73, 625): each point
 *   against the straight line through its two neighbours in x, so a smooth
 *   trend (a transition) hardly enters it while noise does. Then
 *   S = Σ(y − ȳ)²/σ̂² would be χ²-distributed with n − 1 degrees of freedom
 *   if y were constant plus noise; y is flat when the upper-tail
 *   probability of S is at least this (1e-3, the level of the verdict's
 *   tests). Flat data give S ≈ n − 1; a transition of a few σ̂ amplitude
 *   over tens of points gives S in the thousands.
 */
export const FLAT_Y = {
  relativeRange: 1e-6,
  scatterP: 1e-3
} as const;

/** Indices of the points in order of increasing x (ties in the order given). */
function orderByX(x: ArrayLike<number>): number[] {
  const order = Array.from({ length: x.length }, (_, i) => i);
  order.sort((a, b) => x[a] - x[b] || a - b);
  return order;
}

/**
 * Number of distinct x values, two values within {@link DISTINCT_X_RELATIVE}
 * of each other (relative to the larger magnitude) counting as one.
 */
export function distinctCount(values: ArrayLike<number>): number {
  if (values.length === 0) {
    return 0;
  }
  const sorted = Float64Array.from(values).sort();
  let count = 1;
  for (let i = 1; i < sorted.length; i++) {
    const a = sorted[i - 1];
    const b = sorted[i];
    if (b - a > DISTINCT_X_RELATIVE * Math.max(Math.abs(a), Math.abs(b))) {
      count++;
    }
  }
  return count;
}

/** Refuse a column with values beyond {@link VALUE_LIMITS} (`symbol` is the column's symbol: x, y, σ). */
function requireRepresentable(symbol: string, values: ArrayLike<number> | undefined): void {
  if (values === undefined || values.length === 0) {
    return;
  }
  let largest = 0;
  for (let i = 0; i < values.length; i++) {
    largest = Math.max(largest, Math.abs(values[i]));
  }
  if (largest > VALUE_LIMITS.largest) {
    throw new AnalysisInputError(
      msg(
        'analysis.column-too-large',
        'The %1 column reaches %2 in the fit window; beyond ±%3 the squares the fit sums overflow. Rescale the column (e.g. change its unit) before fitting.',
        symbol,
        largest,
        VALUE_LIMITS.largest
      )
    );
  }
  if (largest > 0 && largest < VALUE_LIMITS.smallestScale) {
    throw new AnalysisInputError(
      msg(
        'analysis.column-too-small',
        'The largest value of the %1 column in the fit window is %2 in magnitude; below %3 the squares the fit sums vanish. Rescale the column (e.g. change its unit) before fitting.',
        symbol,
        largest,
        VALUE_LIMITS.smallestScale
      )
    );
  }
}

/**
 * Refuse x values a curve with `free` parameters cannot be fitted against:
 * fewer than `free` + 1 distinct x (see {@link distinctCount}).
 */
export function requireDistinctX(x: ArrayLike<number>, free: number): void {
  const distinct = distinctCount(x);
  if (distinct === 1 && x.length > 1) {
    throw new AnalysisInputError(
      msg(
        'analysis.x-constant',
        'All %1 points in the fit window have the same x (%2): no curve against x can be fitted. Widen the window or choose another x column.',
        x.length,
        { value: x[0], digits: 6 }
      )
    );
  }
  if (distinct < free + 1) {
    throw new AnalysisInputError(
      msg(
        'analysis.too-few-distinct-x',
        'The %1 points in the fit window have only %2 different x values, but this fit has %3 free parameters and needs at least %4 different x values to determine them. Widen the window or choose another x column.',
        x.length,
        distinct,
        free,
        free + 1
      )
    );
  }
}

/**
 * Refuse a window the fit cannot work with: fewer than `needed` points,
 * values beyond {@link VALUE_LIMITS}, or fewer distinct x values than `free`
 * (the number of free parameters, default `needed` − 1) + 1. A translated
 * kind label is not available in core, so the messages name the counts.
 */
export function requirePoints(pts: IWindowedPoints, needed: number, free = needed - 1): void {
  if (pts.x.length < needed) {
    throw new AnalysisInputError(
      pts.skipped > 0
        ? msg('analysis.too-few-points-skipped', 'This analysis needs at least %1 points in the fit window, but the window holds %2 (%3 more were left out for missing values). Widen the window.', needed, pts.x.length, pts.skipped)
        : msg('analysis.too-few-points', 'This analysis needs at least %1 points in the fit window, but the window holds %2. Widen the window.', needed, pts.x.length)
    );
  }
  requireRepresentable('x', pts.x);
  requireRepresentable('y', pts.y);
  requireRepresentable('σ', pts.sigma);
  requireDistinctX(pts.x, free);
}

/** What a flat y column is judged against: a transition, or the Curie–Weiss law. */
export type FlatSubject = 'transition' | 'curie-weiss';

/** Spread and point-to-point scatter of y (see {@link FLAT_Y}). */
export interface IYVariation {
  /** Standard deviation of y about its mean. */
  spread: number;
  /** σ̂ from the neighbour pseudo-residuals (0 when y lies on straight segments, NaN below 3 points). */
  scatter: number;
  /** max(y) − min(y). */
  range: number;
  /** Largest |y|. */
  scale: number;
  /** Upper-tail χ² probability of Σ(y − ȳ)²/σ̂² with n − 1 degrees of freedom (0 when σ̂ = 0). */
  pValue: number;
}

/** How much y changes over the points, against its scatter from point to point (see {@link FLAT_Y}). */
export function yVariation(x: ArrayLike<number>, y: ArrayLike<number>): IYVariation {
  const n = y.length;
  let mean = 0;
  let min = Infinity;
  let max = -Infinity;
  let scale = 0;
  for (let i = 0; i < n; i++) {
    mean += y[i];
    min = Math.min(min, y[i]);
    max = Math.max(max, y[i]);
    scale = Math.max(scale, Math.abs(y[i]));
  }
  mean /= n;
  let sst = 0;
  for (let i = 0; i < n; i++) {
    sst += (y[i] - mean) * (y[i] - mean);
  }
  const order = orderByX(x);
  let sum = 0;
  let m = 0;
  for (let k = 1; k + 1 < n; k++) {
    const [a, i, b] = [order[k - 1], order[k], order[k + 1]];
    const width = x[b] - x[a];
    // Weight of the left neighbour in the straight line through both (½ when the three x coincide).
    const w = width > 0 ? (x[b] - x[i]) / width : 0.5;
    const r = y[i] - (w * y[a] + (1 - w) * y[b]);
    sum += (r * r) / (1 + w * w + (1 - w) * (1 - w));
    m++;
  }
  const scatter = m > 0 ? Math.sqrt(sum / m) : Number.NaN;
  const spread = n > 1 ? Math.sqrt(sst / (n - 1)) : 0;
  const pValue = scatter > 0 ? chiSquareUpperTail(sst / (scatter * scatter), n - 1) : scatter === 0 ? 0 : Number.NaN;
  return { spread, scatter, range: max - min, scale, pValue };
}

/**
 * Refuse a y column that hardly changes over the window (see {@link FLAT_Y}):
 * a model of a transition fitted to it returns numbers (a Tc far outside the
 * data, say) that describe nothing.
 */
export function requireChangingY(pts: IWindowedPoints, subject: FlatSubject): void {
  const v = yVariation(pts.x, pts.y);
  const constant = v.range <= FLAT_Y.relativeRange * v.scale;
  if (constant) {
    throw new AnalysisInputError(
      subject === 'transition'
        ? msg('analysis.constant-y', 'The y column is constant over the fit window: its %1 points differ by at most %2 at a level of %3, so there is no transition to fit. Widen the window or choose another y column.', pts.y.length, v.range, { value: pts.y[0], digits: 6 })
        : msg('analysis.constant-y.curie-weiss', 'The susceptibility is constant over the fit window: its %1 points differ by at most %2 at a level of %3, so there is no Curie–Weiss 1/(T − θ) dependence to fit. Widen the window or choose another y column.', pts.y.length, v.range, { value: pts.y[0], digits: 6 })
    );
  }
  if (v.pValue >= FLAT_Y.scatterP) {
    throw new AnalysisInputError(
      subject === 'transition'
        ? msg('analysis.flat-y', 'The y column hardly changes over the fit window: its spread (%1) is what its scatter from point to point (%2) alone gives over %3 points, so there is no transition to fit. Widen the window to include the transition, or choose another y column.', { value: v.spread, digits: 3 }, { value: v.scatter, digits: 3 }, pts.y.length)
        : msg('analysis.flat-y.curie-weiss', 'The susceptibility hardly changes over the fit window: its spread (%1) is what its scatter from point to point (%2) alone gives over %3 points, so there is no Curie–Weiss 1/(T − θ) dependence to fit. Widen the window or choose another y column.', { value: v.spread, digits: 3 }, { value: v.scatter, digits: 3 }, pts.y.length)
    );
  }
}

/** A convention given by the physics layer as text or as a message. */
export function conventionOf(convention: unknown): ICoreMessage {
  if (convention && typeof convention === 'object' && typeof (convention as ICoreMessage).code === 'string') {
    return convention as ICoreMessage;
  }
  return msg('convention.formula', 'Convention: %1', String(convention ?? ''));
}
