/**
 * Invariants at the solution: zero gradient, covariance = s²(JᵀJ)⁻¹,
 * symmetric positive semi-definite covariance, consistent correlations,
 * unweighted residuals; plus Student-t / normal quantiles.
 */
import fc from 'fast-check';
import { EigenvalueDecomposition, Matrix, inverse } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import { fitCurve } from '../../../src/core/fit/index';
import { decay, expectStationary, linspace } from './models';
import { mulberry32, normalGenerator } from './prng';

function data(seed: number, n: number): { x: number[]; y: number[] } {
  const x = linspace(0, 5, n);
  const g = normalGenerator(mulberry32(seed));
  return { x, y: x.map((v) => 1.5 * Math.exp(-0.6 * v) + 0.2 + 0.02 * g()) };
}

describe('invariants at the solution', () => {
  it('gradient vanishes, covariance is s²(JᵀJ)⁻¹, symmetric and PSD (property over seeds)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 1e6 }), fc.integer({ min: 8, max: 60 }), (seed, n) => {
        const { x, y } = data(seed, n);
        const r = fitCurve(decay, { x, y }, { start: [1, 1, 0] });
        expect(r.converged).toBe(true);
        const p = Float64Array.from(r.values);
        const jac = new Float64Array(n * 3);
        decay.jacobian!(p, Float64Array.from(x), jac);
        const J = new Matrix(n, 3);
        for (let i = 0; i < n; i++) {
          for (let j = 0; j < 3; j++) {
            J.set(i, j, jac[i * 3 + j]);
          }
        }
        // gradient Jᵀr relative to ‖J_j‖‖r‖
        expectStationary(jac, r.residuals, n, 3, 1e-8);
        const s2 = r.chi2 / (n - 3);
        const expected = inverse(J.transpose().mmul(J)).mul(s2);
        for (let a = 0; a < 3; a++) {
          for (let b = 0; b < 3; b++) {
            expect(r.covariance[a][b]).toBe(r.covariance[b][a]);
            expect(Math.abs(r.covariance[a][b] - expected.get(a, b))).toBeLessThan(1e-7 * Math.sqrt(expected.get(a, a) * expected.get(b, b)));
            expect(Math.abs(r.correlation[a][b])).toBeLessThanOrEqual(1 + 1e-12);
          }
          expect(r.correlation[a][a]).toBe(1);
          expect(r.standardErrors[a]).toBeCloseTo(Math.sqrt(r.covariance[a][a]), 15);
        }
        const eig = new EigenvalueDecomposition(new Matrix(r.covariance), { assumeSymmetric: true });
        eig.realEigenvalues.forEach((e) => expect(e).toBeGreaterThanOrEqual(0));
        // residuals are observed minus model
        const f = new Float64Array(n);
        decay.evaluate(p, Float64Array.from(x), f);
        r.residuals.forEach((ri, i) => expect(ri).toBeCloseTo(y[i] - f[i], 14));
      }),
      { numRuns: 25, seed: 42 }
    );
  });

  it('warns about strongly correlated parameters', () => {
    // y = a·exp(−b·x) + c on a short range: a and c nearly degenerate.
    const x = linspace(0, 0.05, 30);
    const g = normalGenerator(mulberry32(9));
    const y = x.map((v) => 1.5 * Math.exp(-0.6 * v) + 0.2 + 1e-4 * g());
    const r = fitCurve(decay, { x, y }, { start: [1, 1, 0] });
    const warning = r.warnings.find((w) => w.code === 'fit.strong-correlation' && w.args[0] === 'a' && w.args[1] === 'c');
    expect(warning).toBeDefined();
    expect(Math.abs((warning!.args[2] as { value: number }).value)).toBeGreaterThan(0.99);
  });
});
