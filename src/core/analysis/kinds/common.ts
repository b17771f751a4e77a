/**
 * Pieces every analysis kind uses: reading a parameter and its error from a
 * fit, the model curve over the window, the fewest-points check and the
 * cautions that go with any windowed fit.
 */
import type { IFitModel, IFitResult } from '../../fit/types';
import { msg } from '../../messages';
import type { ICoreMessage } from '../../messages';
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
 * Refuse a window that holds too few points for `what` (a translated-later
 * kind label is not available in core, so the message names the count).
 */
export function requirePoints(pts: IWindowedPoints, needed: number): void {
  if (pts.x.length < needed) {
    throw new AnalysisInputError(
      pts.skipped > 0
        ? msg('analysis.too-few-points-skipped', 'This analysis needs at least %1 points in the fit window, but the window holds %2 (%3 more were left out for missing values). Widen the window.', needed, pts.x.length, pts.skipped)
        : msg('analysis.too-few-points', 'This analysis needs at least %1 points in the fit window, but the window holds %2. Widen the window.', needed, pts.x.length)
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
