/**
 * Known-parameter recovery from seeded noisy synthetic data, weights,
 * bounds, fixed parameters and the uncertainty conventions.
 */
import { describe, expect, it } from 'vitest';
import { messageText } from '../../../src/core/messages';
import { fitCurve } from '../../../src/core/fit/index';
import { decay, line, linspace, powerLaw } from './models';
import { mulberry32, normalGenerator } from './prng';

function noisy(f: (x: number) => number, xs: number[], sd: number, seed: number): number[] {
  const g = normalGenerator(mulberry32(seed));
  return xs.map((x) => f(x) + sd * g());
}

describe('recovery of known parameters', () => {
  it('recovers a power law A(1−T/Tc)^β within 3σ', () => {
    const T = linspace(150, 299, 60);
    const y = noisy((t) => 1.0 * Math.pow(1 - t / 300, 0.33), T, 0.005, 11);
    const r = fitCurve(powerLaw, { x: T, y }, { start: [0.8, 310, 0.5] });
    expect(r.converged).toBe(true);
    const truth = [1.0, 300, 0.33];
    truth.forEach((v, j) => expect(Math.abs(r.values[j] - v)).toBeLessThan(3 * r.standardErrors[j]));
    expect(r.errorScaling).toBe('scaled-by-reduced-chi2');
    expect(r.reducedChi2).toBeGreaterThan(0.5 * 0.005 ** 2);
    expect(r.reducedChi2).toBeLessThan(2 * 0.005 ** 2);
  });

  it('recovers a decay with per-point σ and reports unscaled errors', () => {
    const x = linspace(0, 5, 80);
    const sigma = x.map((v) => 0.01 + 0.02 * v);
    const g = normalGenerator(mulberry32(5));
    const y = x.map((v, i) => 2 * Math.exp(-1.3 * v) + 0.5 + sigma[i] * g());
    const r = fitCurve(decay, { x, y, sigma }, { start: [1, 1, 0] });
    expect(r.converged).toBe(true);
    expect(r.errorScaling).toBe('from-sigma');
    expect(r.criteriaConvention).toBe('known-sigma');
    [2, 1.3, 0.5].forEach((v, j) => expect(Math.abs(r.values[j] - v)).toBeLessThan(4 * r.standardErrors[j]));
    // χ² of a correct model with correct σ is near its dof (common practice, no source).
    expect(r.chi2 / r.dof).toBeGreaterThan(0.6);
    expect(r.chi2 / r.dof).toBeLessThan(1.5);
    expect(r.aic).toBeCloseTo(r.chi2 + 2 * 3, 10);
    expect(r.bic).toBeCloseTo(r.chi2 + 3 * Math.log(80), 10);
    expect(r.aicc).toBeCloseTo(r.aic + (2 * 3 * 4) / (80 - 3 - 1), 10);
  });

  it('matches the closed-form straight-line fit (ordinary least squares)', () => {
    const x = [1, 2, 3, 4, 5, 6];
    const y = [2.1, 3.9, 6.2, 7.8, 10.1, 12.2];
    const n = x.length;
    const sx = x.reduce((a, b) => a + b, 0);
    const sy = y.reduce((a, b) => a + b, 0);
    const sxx = x.reduce((a, b) => a + b * b, 0);
    const sxy = x.reduce((a, b, i) => a + b * y[i], 0);
    const den = n * sxx - sx * sx;
    const m = (n * sxy - sx * sy) / den;
    const q = (sy - m * sx) / n;
    const rss = y.reduce((a, yi, i) => a + (yi - m * x[i] - q) ** 2, 0);
    const s2 = rss / (n - 2);
    const r = fitCurve(line, { x, y }, { start: [0, 0] });
    expect(r.values[0]).toBeCloseTo(m, 10);
    expect(r.values[1]).toBeCloseTo(q, 10);
    expect(r.standardErrors[0]).toBeCloseTo(Math.sqrt((n * s2) / den), 9);
    expect(r.standardErrors[1]).toBeCloseTo(Math.sqrt((sxx * s2) / den), 9);
    expect(r.chi2).toBeCloseTo(rss, 12);
    expect(r.aic).toBeCloseTo(n * Math.log(rss / n) + 4, 9);
    // Student-t, 4 dof, two-sided 95 %: 2.776 (standard t tables, e.g. Abramowitz & Stegun Table 26.10).
    const r95 = fitCurve(line, { x, y }, { start: [0, 0], confidenceLevel: 0.95 });
    expect(r95.intervalQuantile).toBeCloseTo(2.776445, 5);
    expect(r95.confidenceIntervals[0][1] - r95.values[0]).toBeCloseTo(2.776445 * r95.standardErrors[0], 5);
  });

  it('keeps fixed parameters at their start and gives them zero error', () => {
    const x = linspace(0, 4, 40);
    const y = noisy((v) => 3 * Math.exp(-0.7 * v) + 1, x, 0.01, 3);
    const r = fitCurve(decay, { x, y }, { start: [2, 0.5, 1], fixed: [false, false, true] });
    expect(r.converged).toBe(true);
    expect(r.values[2]).toBe(1);
    expect(r.standardErrors[2]).toBe(0);
    expect(r.dof).toBe(38);
    expect(Math.abs(r.values[0] - 3)).toBeLessThan(0.05);
  });

  it('respects bounds and warns when a parameter ends on one', () => {
    const x = linspace(0, 4, 40);
    const y = noisy((v) => 3 * Math.exp(-0.7 * v) + 1, x, 0.01, 4);
    const r = fitCurve(decay, { x, y }, { start: [2, 0.3, 0.5], upper: [10, 0.5, 10] });
    expect(r.values[1]).toBeLessThanOrEqual(0.5);
    expect(r.values[1]).toBe(0.5);
    expect(r.warnings.some((w) => w.code === 'fit.at-bound' && messageText(w).startsWith('b = 0.5 is at the edge'))).toBe(true);
    const inside = fitCurve(decay, { x, y }, { start: [2, 0.3, 0.5], lower: [0, 0, 0], upper: [10, 2, 10] });
    expect(inside.converged).toBe(true);
    expect(Math.abs(inside.values[1] - 0.7)).toBeLessThan(0.05);
    expect(inside.warnings.some((w) => w.code === 'fit.at-bound')).toBe(false);
  });

  it('finite-difference and analytic Jacobians reach the same optimum', () => {
    const x = linspace(0, 6, 50);
    const y = noisy((v) => 2 * Math.exp(-0.9 * v) + 0.3, x, 0.02, 8);
    const a = fitCurve(decay, { x, y }, { start: [1, 0.5, 0] });
    const fd = fitCurve({ parameters: decay.parameters, evaluate: decay.evaluate }, { x, y }, { start: [1, 0.5, 0] });
    a.values.forEach((v, j) => expect(fd.values[j]).toBeCloseTo(v, 8));
    a.standardErrors.forEach((v, j) => expect(fd.standardErrors[j] / v).toBeCloseTo(1, 6));
  });
});
