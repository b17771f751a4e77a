import { describe, expect, it } from 'vitest';
import {
  brillouin,
  brillouinChecked,
  brillouinDerivative,
  inverseBrillouin,
  langevin,
  PhysicsInputError
} from '../../../src/core/physics/index';
import { rel } from './prng';

// [REFERENCE.md C3 "Brillouin values"; computed here: mpmath 1.2.1] — 13 significant digits given,
// so compared to relative 1e-10 (the 13-digit strings are rounded at ~5e-14).
const TABLE: [number, number[]][] = [
  [0.5, [0.09966799462496, 0.7615941559558, 0.9950547536867, 0.9999999958777]],
  [1, [0.0665557957552, 0.5752103826044, 0.9479745786166, 0.9999545980093]],
  [3.5, [0.04281928907822, 0.3948421135942, 0.7917681588764, 0.9825908260023]],
  [Infinity, [0.03331113225399, 0.3130352854993, 0.6716364899804, 0.9000000041223]]
];
const XS = [0.1, 1, 3, 10];

describe('Brillouin function', () => {
  it('reproduces REFERENCE.md C3 Brillouin/Langevin values', () => {
    for (const [J, vals] of TABLE) {
      XS.forEach((x, i) => expect(rel(brillouin(J, x), vals[i])).toBeLessThan(1e-10));
    }
  });

  it('matches the small-x series of B1 at tiny x, with no cancellation', () => {
    // REFERENCE.md B1: B_J ≈ ((J+1)/(3J)) x − ((J+1)² + J²)(J+1)/(90 J³) x³
    for (const J of [0.5, 1, 2.5, 7]) {
      for (const x of [1e-12, 1e-8, 1e-5, 1e-4]) {
        const s = ((J + 1) / (3 * J)) * x - ((((J + 1) ** 2 + J * J) * (J + 1)) / (90 * J ** 3)) * x ** 3;
        expect(rel(brillouin(J, x), s)).toBeLessThan(1e-13);
      }
    }
    // Langevin: x/3 − x³/45
    expect(rel(langevin(1e-4), 1e-4 / 3 - 1e-12 / 45)).toBeLessThan(1e-14);
  });

  it('is continuous across the series/closed-form switch (|y| = 0.3)', () => {
    for (const J of [1, 3.5, Infinity]) {
      const a = J === Infinity ? 1 : (2 * J + 1) / (2 * J);
      const x0 = 0.3 / a;
      const dx = 2e-12 * x0;
      const lo = brillouin(J, x0 * (1 - 1e-12));
      const hi = brillouin(J, x0 * (1 + 1e-12));
      expect(Math.abs(hi - lo - brillouinDerivative(J, x0) * dx)).toBeLessThan(2e-15);
    }
  });

  it('saturates at huge x with the asymptotic tail 1 − B_J ~ (1/J) exp(−x/J)', () => {
    for (const J of [0.5, 1, 3.5, Infinity]) {
      expect(brillouin(J, 1e6)).toBeLessThanOrEqual(1);
      expect(brillouin(J, 1e300)).toBeCloseTo(1, 12);
      expect(brillouin(J, -1e300)).toBeCloseTo(-1, 12);
      expect(Number.isFinite(brillouinDerivative(J, 1e300))).toBe(true);
    }
    // REFERENCE.md B1 large-x form, J = 2 at x = 40: 1 − B ≈ (1/J) e^{−x/J} to leading order
    const J = 2;
    const x = 40;
    expect(rel(1 - brillouin(J, x), Math.exp(-x / J) / J)).toBeLessThan(1e-3);
    expect(brillouinChecked(1, Infinity)).toBe(1);
  });

  it('is odd and its derivative matches a central difference', () => {
    for (const J of [0.5, 1.5, 4, Infinity]) {
      for (const x of [0.01, 0.29, 0.7, 2, 8]) {
        expect(brillouin(J, -x)).toBe(-brillouin(J, x));
        const h = 1e-6;
        const fd = (brillouin(J, x + h) - brillouin(J, x - h)) / (2 * h);
        expect(Math.abs(brillouinDerivative(J, x) - fd)).toBeLessThan(1e-8);
      }
    }
  });

  it('inverse round-trips, including m near 0 and near 1', () => {
    for (const J of [0.5, 1, 3.5, 10, Infinity]) {
      for (const m of [1e-9, 1e-4, 0.2, 0.6, 0.9, 0.999, 1 - 1e-9]) {
        const x = inverseBrillouin(J, m);
        expect(rel(brillouin(J, x), m)).toBeLessThan(1e-12);
        expect(inverseBrillouin(J, -m)).toBe(-x);
      }
    }
    expect(inverseBrillouin(2, 1)).toBe(Infinity);
    expect(inverseBrillouin(2, 0)).toBe(0);
  });

  it('rejects invalid J and m', () => {
    expect(() => brillouinChecked(0.3, 1)).toThrow(PhysicsInputError);
    expect(() => brillouinChecked(-1, 1)).toThrow(PhysicsInputError);
    expect(() => brillouinChecked(1, NaN)).toThrow(PhysicsInputError);
    expect(() => inverseBrillouin(1, 1.5)).toThrow(PhysicsInputError);
    expect(() => inverseBrillouin(1, NaN)).toThrow(PhysicsInputError);
  });
});
