import { describe, expect, it } from 'vitest';
import {
  PhysicsInputError,
  R_GAS,
  solveWeiss,
  weissConstants,
  weissInverseIsotherm,
  weissMagnetisation
} from '../../../src/core/physics/index';
import { rel } from './prng';

const JS = [0.5, 1, 3.5, Infinity];

// [REFERENCE.md C3, computed here: mpmath 1.2.1 60-digit bisection and scipy 1.10.1 brentq] — 13 digits given.
const ZERO_FIELD: [number, number[]][] = [
  [0.1, [0.9999999958777, 0.9999996940962, 0.9996350389832, 0.9654746681256]],
  [0.3, [0.997413816892, 0.9929730826059, 0.9617852325227, 0.8872983796037]],
  [0.5, [0.9575040240773, 0.936574706454, 0.8696609034513, 0.7888865666292]],
  [0.7, [0.8286347986408, 0.7962384472098, 0.719041223636, 0.6473920730364]],
  [0.9, [0.525429512658, 0.4980611779241, 0.4421827955873, 0.3965996229299]],
  [0.95, [0.3794852066781, 0.3587123210511, 0.3174663463827, 0.2845525117284]],
  [0.99, [0.1725110699751, 0.1627269533147, 0.1436878404273, 0.1287305938098]]
];
// [REFERENCE.md C3 "With applied field", computed here: same two solvers]
const IN_FIELD: [number, number, number[]][] = [
  [1.0, 0.01, [0.3047732572086, 0.2572416651122, 0.2049844448949, 0.1753758450951]],
  [1.2, 0.1, [0.379822123217, 0.2808358325869, 0.1929286294468, 0.1533810622034]],
  [0.8, 0.05, [0.773816157039, 0.7244595915393, 0.6390115558209, 0.5707587351160]],
  [2.0, 1.0, [0.6878939988285, 0.5298095050286, 0.3726928370174, 0.298472340027]]
];

describe('Weiss mean field m(tau, h)', () => {
  it('reproduces REFERENCE.md C3 zero-field table (relative 1e-10)', () => {
    JS.forEach((J, col) => {
      const m = weissMagnetisation(J, ZERO_FIELD.map(r => r[0]));
      ZERO_FIELD.forEach((row, i) => expect(rel(m[i], row[1][col])).toBeLessThan(1e-10));
    });
  });

  it('reproduces REFERENCE.md C3 in-field table (relative 1e-10)', () => {
    JS.forEach((J, col) => {
      const m = weissMagnetisation(J, IN_FIELD.map(r => r[0]), IN_FIELD.map(r => r[1]));
      IN_FIELD.forEach((row, i) => expect(rel(m[i], row[2][col])).toBeLessThan(1e-10));
    });
  });

  it('never returns the trivial root below Tc and is 0 above Tc at h = 0', () => {
    const taus = Array.from({ length: 200 }, (_, i) => 0.005 + i * 0.01);
    for (const J of JS) {
      const m = weissMagnetisation(J, taus);
      taus.forEach((t, i) => {
        if (t < 1) {
          expect(m[i]).toBeGreaterThan(0);
        } else {
          expect(m[i]).toBe(0);
        }
      });
      // very close to Tc the root is still non-trivial: m ≈ sqrt(A_J (1 − τ))
      const A = weissConstants(J).A;
      const close = weissMagnetisation(J, [1 - 1e-10])[0];
      expect(rel(close, Math.sqrt(A * 1e-10))).toBeLessThan(1e-4);
    }
  });

  it('honours the sign of h (odd in h) and is monotone in h', () => {
    for (const J of JS) {
      const taus = [0.5, 0.9, 1, 1.5];
      const plus = weissMagnetisation(J, taus, 0.02);
      const minus = weissMagnetisation(J, taus, -0.02);
      taus.forEach((_, i) => {
        expect(plus[i]).toBeGreaterThan(0);
        expect(minus[i]).toBe(-plus[i]);
      });
      const hs = [-0.2, -0.05, -0.001, 0.001, 0.05, 0.2];
      const m = weissMagnetisation(J, hs.map(() => 1.1), hs);
      for (let i = 1; i < hs.length; i++) {
        expect(m[i]).toBeGreaterThan(m[i - 1]);
      }
    }
  });

  it('satisfies the self-consistency equation to rounding over a wide grid', () => {
    const taus: number[] = [];
    const hs: number[] = [];
    for (let i = 0; i < 40; i++) {
      for (const h of [0, 1e-6, 0.3, -2, 50]) {
        taus.push(0.02 + i * 0.05);
        hs.push(h);
      }
    }
    for (const J of [0.5, 2, Infinity]) {
      const k = J === Infinity ? 3 : (3 * J) / (J + 1);
      const s = solveWeiss(J, taus, hs);
      expect(s.unconverged).toBe(0);
      for (let i = 0; i < taus.length; i++) {
        // inverse isotherm as an independent check where |m| < 1 is representable
        if (Math.abs(s.m[i]) > 1e-8 && Math.abs(s.m[i]) < 1 - 1e-9) {
          const h = weissInverseIsotherm(J, taus[i], s.m[i]);
          expect(Math.abs(h - hs[i])).toBeLessThan(1e-7 * (1 + Math.abs(hs[i])) + (taus[i] * 1e-9) / (1 - Math.abs(s.m[i])));
        }
        expect(Number.isFinite(s.m[i])).toBe(true);
        expect(Math.abs(s.m[i])).toBeLessThanOrEqual(1);
        expect(k).toBeGreaterThan(0);
      }
    }
  });

  it('implicit derivatives agree with finite differences', () => {
    for (const J of [0.5, 1, Infinity]) {
      for (const [t, h] of [
        [0.6, 0],
        [0.95, 0],
        [1.3, 0.05],
        [0.8, -0.1]
      ]) {
        const s = solveWeiss(J, [t], h);
        const d = 1e-6;
        const dt = (solveWeiss(J, [t + d], h).m[0] - solveWeiss(J, [t - d], h).m[0]) / (2 * d);
        // at h = 0 below Tc the root changes sign with h, so differentiate one-sided there
        const dh =
          h === 0
            ? (solveWeiss(J, [t], 1e-8).m[0] - s.m[0]) / 1e-8
            : (solveWeiss(J, [t], h + d).m[0] - solveWeiss(J, [t], h - d).m[0]) / (2 * d);
        expect(Math.abs(s.dmdtau[0] - dt)).toBeLessThan(1e-6 * (1 + Math.abs(dt)));
        expect(Math.abs(s.dmdh[0] - dh)).toBeLessThan(1e-5 * (1 + Math.abs(dh)));
      }
    }
    // above Tc at h = 0: Curie–Weiss, dm/dh = (1/k)/(τ − 1) [REFERENCE.md B1]
    const s = solveWeiss(0.5, [1.25], 0);
    expect(rel(s.dmdh[0], 1 / 0.25)).toBeLessThan(1e-14);
  });

  it('reproduces the exact J = 1/2 isotherms of REFERENCE.md C3 (12 digits given)', () => {
    // [REFERENCE.md C3, computed here: mpmath 1.2.1] h = tau artanh(m) − m
    expect(rel(weissInverseIsotherm(0.5, 1.0, 0.3), 0.009519604203)).toBeLessThan(5e-11 / 0.0095);
    expect(rel(weissInverseIsotherm(0.5, 1.0, 0.3) / 0.3, 0.03173201401)).toBeLessThan(5e-12 / 0.0317);
    expect(rel(weissInverseIsotherm(0.5, 1.1, 0.2), 0.023005809459)).toBeLessThan(5e-13 / 0.023);
    expect(rel(weissInverseIsotherm(0.5, 0.9, 0.6), 0.023832462504)).toBeLessThan(5e-13 / 0.0238);
  });

  it('reproduces the derived constants of REFERENCE.md C3', () => {
    // [REFERENCE.md C3, computed here: mpmath 1.2.1] ΔC/(N kB) = 3/2, 2, 315/130, 5/2
    expect(weissConstants(0.5).specificHeatJumpPerNkB).toBeCloseTo(1.5, 14);
    expect(weissConstants(1).specificHeatJumpPerNkB).toBeCloseTo(2, 14);
    expect(weissConstants(3.5).specificHeatJumpPerNkB).toBeCloseTo(2.423076923, 9);
    expect(weissConstants(Infinity).specificHeatJumpPerNkB).toBe(2.5);
    // per mole: 1.5R = 12.471694, 2.5R = 20.786157, J = 7/2: 20.146582 J/(mol K) (7 digits given)
    expect(Math.abs(1.5 * R_GAS - 12.471694)).toBeLessThan(5e-7);
    expect(Math.abs(2.5 * R_GAS - 20.786157)).toBeLessThan(5e-7);
    expect(Math.abs(weissConstants(3.5).specificHeatJumpPerNkB * R_GAS - 20.146582)).toBeLessThan(5e-7);
    // A_J = 3, 8/3, 27/13 = 2.076923077, 5/3 ; b_J = 1/3, 9/16, 91/81 = 1.12345679, 9/5
    expect(weissConstants(0.5).A).toBeCloseTo(3, 14);
    expect(weissConstants(1).A).toBeCloseTo(8 / 3, 14);
    expect(Math.abs(weissConstants(3.5).A - 2.076923077)).toBeLessThan(5e-10);
    expect(weissConstants(Infinity).A).toBeCloseTo(5 / 3, 14);
    expect(weissConstants(0.5).b).toBeCloseTo(1 / 3, 14);
    expect(weissConstants(1).b).toBeCloseTo(0.5625, 14);
    expect(Math.abs(weissConstants(3.5).b - 1.12345679)).toBeLessThan(5e-9);
    expect(weissConstants(Infinity).b).toBeCloseTo(1.8, 14);
    // asymptotic vs exact at tau = 0.99, J = 1/2: 0.1732050808 vs 0.1725110700 (trap noted in C3)
    expect(Math.abs(Math.sqrt(3 * 0.01) - 0.1732050808)).toBeLessThan(5e-11);
  });

  it('specific-heat jump by finite differences of U = −(k/2) N kB Tc m² just below Tc (REFERENCE.md C3)', () => {
    // [REFERENCE.md C3: "A finite-difference value of U(m(tau)) just below Tc reproduced these to about 5e-6"]
    for (const J of JS) {
      const k = J === Infinity ? 3 : (3 * J) / (J + 1);
      const t1 = 0.999999;
      const t2 = 0.999998;
      const [m1, m2] = weissMagnetisation(J, [t1, t2]);
      const C = (-(k / 2) * (m1 * m1 - m2 * m2)) / (t1 - t2);
      expect(Math.abs(C - weissConstants(J).specificHeatJumpPerNkB)).toBeLessThan(2e-5);
    }
  });

  it('Arrott slope at Tc: h/m^3 tends to b_J (inverse isotherm at m = 1e-4)', () => {
    // [REFERENCE.md C3: "confirmed by inverting B_J at m = 1e-4"]
    for (const J of JS) {
      const m = 1e-4;
      expect(rel(weissInverseIsotherm(J, 1, m) / m ** 3, weissConstants(J).b)).toBeLessThan(1e-6);
    }
  });

  it('reduces to kB Tc = z J_ex for the Ising lattice mean field (REFERENCE.md C9)', () => {
    // [REFERENCE.md C9, computed here: analytic linearisation] m = tanh(z J m/(kB T)) is J = 1/2 with Tc = z J/kB:
    // solving with tau = kB T/(z J) reproduces tanh self-consistency exactly.
    const z = 4;
    const Jex = 1;
    const kT = 3.2;
    const m = weissMagnetisation(0.5, [kT / (z * Jex)])[0];
    expect(Math.abs(m - Math.tanh((z * Jex * m) / kT))).toBeLessThan(1e-15);
    // just above z J no order
    expect(weissMagnetisation(0.5, [(z * Jex + 1e-9) / (z * Jex)])[0]).toBe(0);
  });

  it('rejects bad inputs at the boundary', () => {
    expect(() => weissMagnetisation(0.5, [0])).toThrow(PhysicsInputError);
    expect(() => weissMagnetisation(0.5, [NaN])).toThrow(PhysicsInputError);
    expect(() => weissMagnetisation(0.5, [-1])).toThrow(PhysicsInputError);
    expect(() => weissMagnetisation(0.5, [0.5], [Infinity])).toThrow(PhysicsInputError);
    expect(() => weissMagnetisation(0.7, [0.5])).toThrow(PhysicsInputError);
    expect(() => weissMagnetisation(0.5, [0.5, 0.6], [0.1])).toThrow(PhysicsInputError);
    expect(weissMagnetisation(0.5, []).length).toBe(0);
    expect(weissMagnetisation(0.5, [1e300])[0]).toBe(0);
    expect(weissMagnetisation(0.5, [1e-300])[0]).toBe(1);
  });
});
