/**
 * χ² tail probabilities and the incomplete gamma functions behind them:
 * table values, closed forms, tiny tails with their relative precision,
 * large degrees of freedom, and invalid inputs.
 */
import { describe, expect, it } from 'vitest';
import {
  chiSquareLowerTail,
  chiSquareUpperTail,
  normalCdf,
  regularizedGammaP,
  regularizedGammaQ
} from '../../../src/core/numeric/chi2';

function rel(a: number, b: number): number {
  return Math.abs(a - b) / Math.abs(b);
}

describe('chiSquareUpperTail', () => {
  // Percentage points of the χ² distribution, Abramowitz & Stegun 1964,
  // Handbook of Mathematical Functions, Table 26.8 (upper-tail Q(χ²|ν)).
  const table: [number, number, number][] = [
    [3.84146, 1, 0.05],
    [6.6349, 1, 0.01],
    [10.8276, 1, 0.001],
    [18.307, 10, 0.05],
    [23.2093, 10, 0.01],
    [29.5883, 10, 0.001],
    [124.342, 100, 0.05],
    [135.807, 100, 0.01],
    [149.449, 100, 0.001],
    // lower percentage points of the same table: Q = 0.95 and 0.99
    [3.9403, 10, 0.95],
    [2.55821, 10, 0.99]
  ];
  it.each(table)('χ² = %f with ν = %i has upper tail %f (A&S Table 26.8)', (chi2, dof, p) => {
    // Table values are given to 6 significant figures of χ², so p agrees to ~1e-4 relative.
    expect(rel(chiSquareUpperTail(chi2, dof), p)).toBeLessThan(2e-4);
    expect(rel(chiSquareLowerTail(chi2, dof), 1 - p)).toBeLessThan(2e-4);
  });

  it('matches the tabulated values χ² = 3.841, ν = 1 and χ² = 18.307, ν = 10 → p ≈ 0.05 (A&S Table 26.8)', () => {
    expect(chiSquareUpperTail(3.841, 1)).toBeCloseTo(0.05, 4);
    expect(chiSquareUpperTail(18.307, 10)).toBeCloseTo(0.05, 5);
  });

  it('equals the closed forms for even ν: Q = e^(−x/2) Σ_{j<ν/2} (x/2)^j / j! (A&S 1964, §26.4, Poisson relation)', () => {
    for (const dof of [2, 4, 6, 20]) {
      for (const x of [0.01, 0.5, 1, 3, 7.5, 20, 60, 200]) {
        let sum = 0;
        let term = 1;
        for (let j = 0; j < dof / 2; j++) {
          if (j > 0) {
            term *= x / 2 / j;
          }
          sum += term;
        }
        const q = Math.exp(-x / 2) * sum;
        expect(rel(chiSquareUpperTail(x, dof), q)).toBeLessThan(1e-12);
      }
    }
  });

  it('keeps the relative precision of a tiny lower tail (ν = 2: P = 1 − e^(−x/2) = −expm1(−x/2))', () => {
    for (const x of [1e-12, 1e-6, 1e-3, 0.1]) {
      expect(rel(chiSquareLowerTail(x, 2), -Math.expm1(-x / 2))).toBeLessThan(1e-13);
    }
    // ν = 100, χ² = 20 (χ²_red = 0.2): P(χ² ≤ x | 2m) = Σ_{j ≥ m} e^(−x/2) (x/2)^j / j!
    // (A&S 1964, §26.4, Poisson relation), summed term by term without cancellation.
    let tail = 0;
    for (let j = 50; j < 400; j++) {
      let lnj = 0;
      for (let i = 2; i <= j; i++) {
        lnj += Math.log(i);
      }
      tail += Math.exp(-10 + j * Math.log(10) - lnj);
    }
    expect(tail).toBeLessThan(1e-18);
    expect(rel(chiSquareLowerTail(20, 100), tail)).toBeLessThan(1e-12);
  });

  it('keeps the relative precision of a tiny upper tail (ν = 2: Q = e^(−x/2))', () => {
    for (const x of [50, 200, 1000]) {
      expect(rel(chiSquareUpperTail(x, 2), Math.exp(-x / 2))).toBeLessThan(1e-12);
    }
  });

  it('the two tails add to 1 on both sides of the series/continued-fraction switch', () => {
    for (const dof of [1, 3, 7, 50, 333]) {
      for (const f of [0.3, 0.9, 1, 1.1, 2, 4]) {
        const x = f * dof;
        expect(Math.abs(chiSquareUpperTail(x, dof) + chiSquareLowerTail(x, dof) - 1)).toBeLessThan(1e-13);
      }
    }
  });

  it('agrees with the Wilson–Hilferty normal approximation for large ν (Wilson & Hilferty 1931, PNAS 17, 684)', () => {
    for (const dof of [1000, 100000]) {
      for (const x of [dof, dof + 3 * Math.sqrt(2 * dof), dof - 2 * Math.sqrt(2 * dof)]) {
        const z = (Math.cbrt(x / dof) - (1 - 2 / (9 * dof))) / Math.sqrt(2 / (9 * dof));
        const approx = 1 - normalCdf(z);
        expect(rel(chiSquareUpperTail(x, dof), approx)).toBeLessThan(0.01);
      }
    }
  });

  it('edge values: χ² = 0 and ∞, invalid ν or χ²', () => {
    expect(chiSquareUpperTail(0, 5)).toBe(1);
    expect(chiSquareLowerTail(0, 5)).toBe(0);
    expect(chiSquareUpperTail(Infinity, 5)).toBe(0);
    expect(chiSquareLowerTail(Infinity, 5)).toBe(1);
    expect(chiSquareUpperTail(3, 0)).toBeNaN();
    expect(chiSquareUpperTail(3, -2)).toBeNaN();
    expect(chiSquareUpperTail(-1, 3)).toBeNaN();
    expect(chiSquareLowerTail(Number.NaN, 3)).toBeNaN();
    expect(chiSquareUpperTail(3, Number.NaN)).toBeNaN();
  });
});

describe('regularised incomplete gamma', () => {
  it('P(1, x) = 1 − e^(−x) and Q(1, x) = e^(−x) (A&S 1964, §6.5: Γ(1, x) = e^(−x))', () => {
    for (const x of [1e-8, 0.2, 1, 1.9, 2.1, 10, 40]) {
      expect(rel(regularizedGammaP(1, x), -Math.expm1(-x))).toBeLessThan(1e-13);
      expect(rel(regularizedGammaQ(1, x), Math.exp(-x))).toBeLessThan(1e-13);
    }
  });

  it('non-integer a: Q(a, x) against the recurrence Q(a + 1, x) = Q(a, x) + x^a e^(−x)/Γ(a + 1) (A&S 1964, §6.5, recurrence in a)', () => {
    // Γ(3.5) = 15√π/8 exactly (A&S 1964, §6.1, Γ(n + ½)).
    const gamma35 = (15 * Math.sqrt(Math.PI)) / 8;
    for (const x of [0.5, 2.5, 3.6, 9]) {
      const lhs = regularizedGammaQ(3.5, x);
      const rhs = regularizedGammaQ(2.5, x) + (Math.pow(x, 2.5) * Math.exp(-x)) / gamma35;
      expect(rel(lhs, rhs)).toBeLessThan(1e-12);
    }
  });

  it('invalid arguments give NaN', () => {
    expect(regularizedGammaP(0, 1)).toBeNaN();
    expect(regularizedGammaQ(1, -1)).toBeNaN();
    expect(regularizedGammaQ(Infinity, 1)).toBeNaN();
  });
});

describe('normalCdf', () => {
  // Standard normal table, Abramowitz & Stegun 1964, Table 26.1: P(1.96) = 0.9750021,
  // and the tail Q(3.09) = 1.0008e-3 (same table).
  it('matches tabulated values', () => {
    expect(normalCdf(0)).toBe(0.5);
    expect(normalCdf(1.96)).toBeCloseTo(0.9750021, 7);
    expect(normalCdf(-1.96)).toBeCloseTo(0.0249979, 7);
    expect(rel(normalCdf(-3.09), 1.0008e-3)).toBeLessThan(1e-3);
    expect(normalCdf(Number.NaN)).toBeNaN();
  });
});
