import { describe, expect, it } from 'vitest';
import { realPolynomialRoots, polyEval, bracketRoot, goldenMinimum } from '../../../src/core/numeric/index';
import { mulberry32 } from '../../../src/core/numeric/random';
import { NumericInputError } from '../../../src/core/numeric/errors';


function fromRoots(roots: number[], lead = 1): number[] {
  let c = [lead];
  for (const r of roots) {
    const next = new Array<number>(c.length + 1).fill(0);
    for (let i = 0; i < c.length; i++) {
      next[i + 1] += c[i];
      next[i] -= r * c[i];
    }
    c = next;
  }
  return c;
}

describe('real polynomial roots', () => {
  it('finds all roots of polynomials built from known distinct roots (degree 1–7)', () => {
    const u = mulberry32(1);
    for (let trial = 0; trial < 300; trial++) {
      const deg = 1 + (trial % 7);
      const roots = Array.from({ length: deg }, () => -3 + 6 * u()).sort((a, b) => a - b);
      let ok = true;
      for (let i = 1; i < roots.length; i++) {
        if (roots[i] - roots[i - 1] < 1e-3) {
          ok = false;
        }
      }
      if (!ok) {
        continue;
      }
      const found = realPolynomialRoots(fromRoots(roots, 0.5 + u()));
      expect(found.length).toBe(deg);
      found.forEach((r, i) => expect(Math.abs(r - roots[i])).toBeLessThan(1e-8));
    }
  });

  it('ignores complex pairs and reports double roots once', () => {
    // (x² + 1)(x − 2) → only 2
    expect(realPolynomialRoots([-2, 1, -2, 1])).toEqual([2]);
    // (x − 1)² (x + 3)
    const r = realPolynomialRoots(fromRoots([1, 1, -3]));
    expect(r.length).toBe(2);
    expect(r[0]).toBeCloseTo(-3, 12);
    expect(r[1]).toBeCloseTo(1, 6);
    // x³ (triple root at 0) and trailing zero coefficients
    expect(realPolynomialRoots([0, 0, 0, 1, 0, 0])).toEqual([0]);
  });

  it('edge inputs: constants, linear, non-finite, zero polynomial', () => {
    expect(realPolynomialRoots([3])).toEqual([]);
    expect(realPolynomialRoots([2, 4])).toEqual([-0.5]);
    expect(() => realPolynomialRoots([0, 0])).toThrow(NumericInputError);
    expect(() => realPolynomialRoots([1, NaN])).toThrow('A coefficient of the polynomial is NaN: every coefficient must be a finite number.');
    expect(polyEval([1, 2, 3], 2).value).toBe(17);
  });
});

describe('scalar helpers', () => {
  it("Brent's method converges and reports failures", () => {
    const r = bracketRoot(x => Math.cos(x) - x, 0, 1);
    expect(r.converged).toBe(true);
    expect(Math.abs(Math.cos(r.root) - r.root)).toBeLessThan(1e-14);
    expect(bracketRoot(x => x * x + 1, -1, 1).converged).toBe(false);
    expect(bracketRoot(() => NaN, -1, 1).converged).toBe(false);
  });

  it('golden-section minimum', () => {
    const m = goldenMinimum(x => (x - 0.3) ** 2, 0, 1);
    expect(m.converged).toBe(true);
    expect(m.x).toBeCloseTo(0.3, 6);
  });
});
