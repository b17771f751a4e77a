/**
 * Selecting the points a fit uses: inside the x window and finite.
 */
import type { IAnalysisJob } from './types';
import { AnalysisInputError } from './types';

/** The points of a job that will be fitted. */
export interface IWindowedPoints {
  x: number[];
  y: number[];
  sigma?: number[];
  /** Points inside the window left out because x, y or σ was not finite. */
  skipped: number;
}

/**
 * Points with window.min ≤ x ≤ window.max and finite x, y (and σ > 0 when σ is given).
 *
 * @throws AnalysisInputError when the columns differ in length, σ is not
 * positive, or the window is empty or inverted.
 */
export function windowedPoints(job: IAnalysisJob): IWindowedPoints {
  const { x, y, sigma, window } = job;
  if (x.length !== y.length) {
    throw new AnalysisInputError(`the x column has ${x.length} values but the y column has ${y.length}`);
  }
  if (sigma && sigma.length !== x.length) {
    throw new AnalysisInputError(`the σ column has ${sigma.length} values but the x column has ${x.length}`);
  }
  if (!(window.min <= window.max)) {
    throw new AnalysisInputError(`the fit window is empty: from ${window.min} to ${window.max}`);
  }
  const out: IWindowedPoints = { x: [], y: [], sigma: sigma ? [] : undefined, skipped: 0 };
  for (let i = 0; i < x.length; i++) {
    const xi = x[i];
    if (!(xi >= window.min && xi <= window.max)) {
      continue;
    }
    const si = sigma ? sigma[i] : 1;
    if (!Number.isFinite(xi) || !Number.isFinite(y[i]) || !Number.isFinite(si)) {
      out.skipped++;
      continue;
    }
    if (!(si > 0)) {
      throw new AnalysisInputError(`σ must be > 0, but row ${i + 1} has σ = ${si}`);
    }
    out.x.push(xi);
    out.y.push(y[i]);
    out.sigma?.push(si);
  }
  return out;
}

/** n points evenly spaced over [min, max] (one point when min = max). */
export function grid(min: number, max: number, n: number): number[] {
  if (n < 2 || min === max) {
    return [min];
  }
  const step = (max - min) / (n - 1);
  return Array.from({ length: n }, (_, i) => min + i * step);
}
