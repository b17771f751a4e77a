/**
 * Selecting the points a fit uses: inside the x window and finite.
 */
import { msg } from '../messages';
import { AnalysisInputError } from './errors';
import type { IAnalysisJob } from './types';

/** The points of a job that will be fitted. */
export interface IWindowedPoints {
  x: number[];
  y: number[];
  sigma?: number[];
  /** Points inside the window left out because x, y or σ was not finite. */
  skipped: number;
  /** Row of the job's columns each point came from (to align `job.columns` with the points). */
  rows?: number[];
}

/**
 * Points with window.min ≤ x ≤ window.max and finite x, y (and σ > 0 when σ is given).
 *
 * @throws AnalysisInputError when the columns differ in length, σ is not
 * positive, or the window is empty or inverted.
 */
export function windowedPoints(job: Pick<IAnalysisJob, 'x' | 'y' | 'sigma' | 'window'>): IWindowedPoints {
  const { x, y, sigma, window } = job;
  if (x.length !== y.length) {
    throw new AnalysisInputError(msg('window.length-mismatch', 'The x column has %1 values but the y column has %2.', x.length, y.length));
  }
  if (sigma && sigma.length !== x.length) {
    throw new AnalysisInputError(msg('window.sigma-length-mismatch', 'The σ column has %1 values but the x column has %2.', sigma.length, x.length));
  }
  if (!(window.min <= window.max)) {
    throw new AnalysisInputError(msg('window.empty', 'The fit window is empty: it runs from %1 to %2. Make the lower end smaller than the upper.', window.min, window.max));
  }
  const out: IWindowedPoints = { x: [], y: [], sigma: sigma ? [] : undefined, skipped: 0, rows: [] };
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
      throw new AnalysisInputError(msg('window.sigma-not-positive', 'Every σ must be greater than 0, but row %1 has σ = %2. Choose another σ column or none.', i + 1, si));
    }
    out.x.push(xi);
    out.y.push(y[i]);
    out.sigma?.push(si);
    out.rows?.push(i);
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
