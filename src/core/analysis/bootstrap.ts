/**
 * Bootstrap of one job by resampling residuals (B. Efron & R. J. Tibshirani,
 * "An Introduction to the Bootstrap", Chapman & Hall 1993, ch. 9, "bootstrapping
 * residuals"; A. C. Davison & D. V. Hinkley, "Bootstrap Methods and their
 * Application", CUP 1997, Algorithm 6.1 for the centring and n/(n − k) inflation).
 *
 * Residuals, not pairs: temperature (or field) is set by the experiment, so
 * the x of every resample are those of the data (a fixed design), and
 * resampling pairs would drop or repeat points of the transition, where the
 * information on Tc and the exponents sits.
 *
 * Scheme: fit the job; take the standardised residuals e_i = (y_i − ŷ_i)/s_i
 * with s_i the scale of point i under the job's weights (the σ column,
 * |y_i| for relative weights, 1 for equal weights), centre them and inflate
 * them by √(n/(n − k)) (least-squares residuals are smaller than the errors);
 * then for each sample draw e*_i from them with replacement (seeded
 * mulberry32, src/core/numeric/random.ts), set y*_i = ŷ_i + s_i e*_i and fit
 * again with the same kind, options and weighting. Samples whose fit throws
 * or does not converge are counted and left out. Percentiles are by linear
 * interpolation between order statistics (R. J. Hyndman & Y. Fan, Am. Stat.
 * 50, 361 (1996), definition 7).
 */
import { messageText, msg } from '../messages';
import { mulberry32 } from '../numeric/random';
import { AnalysisInputError } from './errors';
import { freeCount, runAnalysisJob } from './run';
import type { IBootstrapSummary, ITaskHooks } from './tasks-types';
import type { IAnalysisJob } from './types';
import { windowedPoints } from './window';

/** Largest number of samples a bootstrap runs. */
export const BOOTSTRAP_MAX_SAMPLES = 100000;

/** The q-quantile (0 ≤ q ≤ 1) of sorted values, linear between order statistics (Hyndman & Fan definition 7). */
export function quantileSorted(sorted: ArrayLike<number>, q: number): number {
  const n = sorted.length;
  if (n === 0) {
    return Number.NaN;
  }
  const h = (n - 1) * q;
  const lo = Math.floor(h);
  const hi = Math.min(n - 1, lo + 1);
  return sorted[lo] + (h - lo) * (sorted[hi] - sorted[lo]);
}

/**
 * Bootstrap a job (see the module comment). Returns null when cancelled.
 *
 * @throws AnalysisInputError for a sample count that is not a whole number
 * in 1…{@link BOOTSTRAP_MAX_SAMPLES}, or a job whose own fit does not converge.
 */
export function bootstrapJob(job: IAnalysisJob, options: { samples: number; seed: number }, hooks: ITaskHooks = {}): IBootstrapSummary | null {
  const { samples, seed } = options;
  if (!Number.isInteger(samples) || samples < 1 || samples > BOOTSTRAP_MAX_SAMPLES) {
    throw new AnalysisInputError(msg('bootstrap.bad-samples', 'The bootstrap needs a whole number of samples from 1 to %1, but %2 was asked for.', BOOTSTRAP_MAX_SAMPLES, String(samples)));
  }
  if (!Number.isFinite(seed)) {
    throw new AnalysisInputError(msg('bootstrap.bad-seed', 'The bootstrap seed must be a finite number, but it is %1.', String(seed)));
  }
  const stop = (): boolean => hooks.shouldStop?.() === true;
  const fitHooks = { shouldStop: hooks.shouldStop };
  const original = runAnalysisJob(job, fitHooks, { residualCheck: false });
  if (stop()) {
    return null;
  }
  const fit = original.fit;
  const pts = windowedPoints(job);
  const n = pts.x.length;
  if (!fit.converged) {
    throw new AnalysisInputError(msg('bootstrap.not-converged', 'The fit to the data did not converge (%1), so there is nothing to resample around. Make it converge first.', messageText(fit.reason)));
  }
  if (fit.residuals.length !== n || original.used !== n) {
    // e.g. Landau, fitted as T against ψ
    throw new AnalysisInputError(msg('bootstrap.other-points', 'This analysis fits other quantities than y against x, so its residuals cannot be resampled onto y.'));
  }
  const k = freeCount(fit.fixed);
  if (n - k < 2) {
    throw new AnalysisInputError(msg('bootstrap.too-few-points', 'The bootstrap needs at least 2 more points than free parameters, but there are %1 points and %2 parameters.', n, k));
  }
  const mode = original.weighting?.mode ?? 'equal';
  const scale = Float64Array.from({ length: n }, (_, i) => (mode === 'sigma' && pts.sigma ? pts.sigma[i] : mode === 'relative' ? Math.abs(pts.y[i]) : 1));
  const fitted = Float64Array.from({ length: n }, (_, i) => pts.y[i] - fit.residuals[i]);
  const e = Float64Array.from({ length: n }, (_, i) => fit.residuals[i] / scale[i]);
  let mean = 0;
  for (let i = 0; i < n; i++) {
    mean += e[i];
  }
  mean /= n;
  const inflate = Math.sqrt(n / (n - k));
  for (let i = 0; i < n; i++) {
    e[i] = (e[i] - mean) * inflate;
  }
  const rnd = mulberry32(seed);
  const names = fit.parameters.slice();
  const draws: number[][] = names.map(() => []);
  let failed = 0;
  // Rows of the job that windowedPoints keeps, in its order: each resample replaces y there only,
  // so the other columns (σ, column options) stay aligned with their rows.
  const rows: number[] = [];
  for (let i = 0; i < job.x.length; i++) {
    const xi = job.x[i];
    const si = job.sigma ? job.sigma[i] : 1;
    if (xi >= job.window.min && xi <= job.window.max && Number.isFinite(xi) && Number.isFinite(job.y[i]) && Number.isFinite(si)) {
      rows.push(i);
    }
  }
  for (let b = 0; b < samples; b++) {
    if (stop()) {
      return null;
    }
    const y = Array.from(job.y);
    for (let i = 0; i < n; i++) {
      y[rows[i]] = fitted[i] + scale[i] * e[Math.min(n - 1, Math.floor(rnd() * n))];
    }
    try {
      const out = runAnalysisJob({ ...job, y }, fitHooks, { residualCheck: false });
      if (stop()) {
        return null;
      }
      if (out.fit.converged && out.fit.values.every(Number.isFinite)) {
        names.forEach((name, j) => {
          const at = out.fit.parameters.indexOf(name);
          draws[j].push(out.fit.values[at]);
        });
      } else {
        failed++;
      }
    } catch {
      failed++;
    }
    hooks.onProgress?.((b + 1) / samples);
  }
  const stats = names.map((name, j) => {
    const v = Float64Array.from(draws[j]).sort();
    const m = v.length;
    let sum = 0;
    for (const x of v) {
      sum += x;
    }
    const avg = m > 0 ? sum / m : Number.NaN;
    let ss = 0;
    for (const x of v) {
      ss += (x - avg) ** 2;
    }
    return {
      name,
      fitted: fit.values[j],
      mean: avg,
      sd: m > 1 ? Math.sqrt(ss / (m - 1)) : Number.NaN,
      p16: quantileSorted(v, 0.16),
      p84: quantileSorted(v, 0.84),
      p025: quantileSorted(v, 0.025),
      p975: quantileSorted(v, 0.975)
    };
  });
  return {
    parameters: names,
    stats,
    samples,
    failed,
    seed,
    convention: msg(
      'bootstrap.convention.residuals',
      'Residual bootstrap: %1 resamples y* = fit + s·e* with e* drawn with replacement from the centred residuals divided by each point\'s scale s (%2) and inflated by √(n/(n − k)); the same x, kind, options and weights for every refit; %3 refits failed or did not converge and are left out; percentiles linear between order statistics (seed %4).',
      samples,
      mode === 'sigma' ? 'the σ column' : mode === 'relative' ? '|y|' : '1',
      failed,
      String(seed)
    )
  };
}
