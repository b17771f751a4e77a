/**
 * Coarse-to-fine start of large problems (src/core/fit/warmStart.ts): the
 * answer is the full-data least-squares solution, whichever path led there;
 * failures of the subsample stage fall back to the plain fit; cancellation
 * keeps the best point. Synthetic data (common practice, no source).
 */
import { describe, expect, it } from 'vitest';
import { FIT_DEFAULTS, fitCurve } from '../../../src/core/fit/index';
import type { IFitModel } from '../../../src/core/fit/index';
import { powerLawModel } from '../../../src/core/physics/critical/index';
import { warmStartSampleSize, warmStartStrideFor } from '../../../src/core/fit/warmStart';
import { mulberry32, normalGenerator } from './prng';

const N = 120000;
const T = Float64Array.from({ length: N }, (_, i) => 150 + (149.5 * i) / (N - 1));
const noise = normalGenerator(mulberry32(2024));
const Y = Float64Array.from(T, (t) => Math.pow(1 - t / 300, 0.33) + 0.005 * noise());
const START = [0.8, 310, 0.5];

function notPointwise(m: IFitModel): IFitModel {
  return { ...m, pointwise: false };
}

describe('warm start from a strided subsample', () => {
  it('applies from warmStartRows points on, for pointwise models only, and lands on the same minimum', () => {
    expect(N).toBeGreaterThanOrEqual(FIT_DEFAULTS.warmStartRows);
    const warm = fitCurve(powerLawModel({ aboveTc: 'signed' }), { x: T, y: Y }, { start: START });
    const plain = fitCurve(notPointwise(powerLawModel({ aboveTc: 'signed' })), { x: T, y: Y }, { start: START });
    expect(warm.converged).toBe(true);
    expect(plain.converged).toBe(true);
    expect(plain.warmStart).toBeUndefined();
    expect(warm.warmStart).toMatchObject({ stride: warmStartStrideFor(N, true), converged: true, used: true });
    expect(warm.warmStart!.stride).toBe(Math.floor(N / warmStartSampleSize(N)));
    expect(warm.warmStart!.points).toBe(Math.ceil(N / warm.warmStart!.stride));
    // same minimum: values within 1e-4 standard errors, χ² equal to 1e-12
    warm.values.forEach((v, j) => {
      expect(Math.abs(v - plain.values[j])).toBeLessThan(1e-4 * plain.standardErrors[j]);
    });
    expect(Math.abs(warm.chi2 - plain.chi2) / plain.chi2).toBeLessThan(1e-12);
    // and the full-data work is smaller
    expect(warm.evaluations + warm.jacobianEvaluations).toBeLessThan(plain.evaluations + plain.jacobianEvaluations);
  });

  it('falls back to the fit from the original start when the subsample stage fails', () => {
    const base = powerLawModel({ aboveTc: 'signed' });
    // Fails (NaN) on any call with fewer points than the full data.
    const picky: IFitModel = {
      ...base,
      evaluate(p, x, out) {
        base.evaluate(p, x, out);
        if (x.length < N) {
          out.fill(NaN);
        }
      },
      evaluateWithJacobian(p, x, out, jac) {
        base.evaluateWithJacobian!(p, x, out, jac);
        if (x.length < N) {
          out.fill(NaN);
        }
      }
    };
    const r = fitCurve(picky, { x: T, y: Y }, { start: START });
    expect(r.converged).toBe(true);
    expect(r.warmStart).toMatchObject({ converged: false, used: false });
    const plain = fitCurve(notPointwise(base), { x: T, y: Y }, { start: START });
    expect(Math.abs(r.chi2 - plain.chi2) / plain.chi2).toBeLessThan(1e-12);
  });

  it('cancellation during the subsample stage returns its best point on the full data, not converged', () => {
    let calls = 0;
    const r = fitCurve(powerLawModel({ aboveTc: 'signed' }), { x: T, y: Y }, { start: START, shouldStop: () => ++calls > 4 });
    expect(r.converged).toBe(false);
    expect(r.reason.code).toBe('fit.stop.cancelled');
    expect(r.residuals).toHaveLength(N);
    expect(Number.isFinite(r.chi2)).toBe(true);
    // the subsample stage moved away from the start before the stop
    expect(r.values.some((v, j) => v !== START[j])).toBe(true);
  });

  it('progress reports of the subsample stage are in full-data χ² units', () => {
    const costs: number[] = [];
    const r = fitCurve(powerLawModel({ aboveTc: 'signed' }), { x: T, y: Y }, { start: START, onProgress: (p) => costs.push(p.cost) });
    expect(r.converged).toBe(true);
    // the last report is within a few per cent of the final χ² (subsample χ² scaled by n/m is comparable)
    const last = costs[costs.length - 1];
    expect(Math.abs(last - r.chi2) / r.chi2).toBeLessThan(0.05);
    const firstFull = costs.findIndex((c, i) => i > 0 && Math.abs(c - r.chi2) / r.chi2 < 0.05);
    expect(firstFull).toBeGreaterThan(0);
  });
});

describe('subsample size', () => {
  it('grows like 10·√n while it has a subsample of its own, like 5·√n (at least warmStartMinSample) for the innermost stage, is warmStartSample from warmStartFullSampleRows points on, and applies from warmStartRows points on', () => {
    expect(warmStartStrideFor(FIT_DEFAULTS.warmStartRows - 1, true)).toBe(0);
    expect(warmStartStrideFor(1e6, false)).toBe(0);
    expect(warmStartSampleSize(300)).toBe(FIT_DEFAULTS.warmStartMinSample);
    // 10·√1000 = 317 points would have no subsample of their own: the innermost size 5·√1000
    expect(warmStartSampleSize(1000)).toBe(159);
    expect(warmStartStrideFor(1000, true)).toBe(6);
    expect(warmStartSampleSize(9800)).toBe(495);
    expect(warmStartSampleSize(1e4)).toBe(1000);
    expect(warmStartSampleSize(1e9)).toBe(FIT_DEFAULTS.warmStartSample);
    expect(warmStartStrideFor(1e4, true)).toBe(10);
    expect(warmStartSampleSize(FIT_DEFAULTS.warmStartFullSampleRows - 1)).toBe(2237);
    expect(warmStartSampleSize(FIT_DEFAULTS.warmStartFullSampleRows)).toBe(FIT_DEFAULTS.warmStartSample);
  });
});
