/** Nelder–Mead, finite-difference Hessian and small inverse (src/core/numeric/simplex.ts). */
import { describe, expect, it } from 'vitest';
import { hessian, invert, nelderMead } from '../../../src/core/numeric/simplex';

describe('nelderMead', () => {
  it('finds the minimum of the Rosenbrock function from the classic start', () => {
    const rosen = (p: number[]): number => 100 * (p[1] - p[0] * p[0]) ** 2 + (1 - p[0]) ** 2;
    const r = nelderMead(rosen, [-1.2, 1], [0.1, 0.1], 5000, 1e-14, 1e-10);
    expect(r.converged).toBe(true);
    expect(r.x[0]).toBeCloseTo(1, 5);
    expect(r.x[1]).toBeCloseTo(1, 5);
  });

  it('treats non-finite values as +∞ and reports the evaluation limit', () => {
    const f = (p: number[]): number => (p[0] < 0 ? NaN : (p[0] - 2) ** 2);
    const r = nelderMead(f, [1], [0.5]);
    expect(r.converged).toBe(true);
    expect(r.x[0]).toBeCloseTo(2, 6);
    const short = nelderMead((p) => p[0] * p[0] + p[1] * p[1], [5, 5], [1, 1], 10);
    expect(short.converged).toBe(false);
    expect(short.reason.code).toBe('numeric.simplex.budget');
  });
});

describe('hessian and invert', () => {
  it('reproduce a quadratic form and its inverse', () => {
    // f = ½ pᵀAp with A = [[4, 1], [1, 3]]
    const f = (p: number[]): number => 0.5 * (4 * p[0] * p[0] + 2 * p[0] * p[1] + 3 * p[1] * p[1]);
    const H = hessian(f, [0.3, -0.7], [1e-3, 1e-3]);
    expect(H[0][0]).toBeCloseTo(4, 6);
    expect(H[0][1]).toBeCloseTo(1, 6);
    expect(H[1][0]).toBeCloseTo(1, 6);
    expect(H[1][1]).toBeCloseTo(3, 6);
    const inv = invert([
      [4, 1],
      [1, 3]
    ])!;
    expect(inv[0][0]).toBeCloseTo(3 / 11, 14);
    expect(inv[0][1]).toBeCloseTo(-1 / 11, 14);
    expect(inv[1][1]).toBeCloseTo(4 / 11, 14);
    expect(
      invert([
        [1, 2],
        [2, 4]
      ])
    ).toBeNull();
  });
});
