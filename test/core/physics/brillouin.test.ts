import { describe, expect, it } from 'vitest';
import {
  brillouin,
  brillouinChecked,
  brillouinCoupledInverseSpinDerivative,
  brillouinDerivative,
  brillouinInverseSpinDerivative,
  brillouinSpinDerivative,
  brillouinTangentIntercept,
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

/** Central differences at h, h/2, h/4, extrapolated twice (error O(h⁶) plus rounding ≈ ε|f|/h). */
function richardson(f: (v: number) => number, v: number, h: number): number {
  const d = (s: number): number => (f(v + s) - f(v - s)) / (2 * s);
  const [d0, d1, d2] = [d(h), d(h / 2), d(h / 4)];
  const r0 = (4 * d1 - d0) / 3;
  const r1 = (4 * d2 - d1) / 3;
  return (16 * r1 - r0) / 15;
}

/**
 * 1 − B_J(x) = b c(b x) − a c(a x), c(z) = coth z − 1 = 2/expm1(2z), with u = 1/J, b = u/2,
 * a = 1 + b: exact in the tail b x ≥ 1, where B itself rounds to 1 and its differences lose
 * the derivative.
 */
function tailOfB(u: number, x: number): number {
  const b = u / 2;
  const a = 1 + b;
  return (2 * b) / Math.expm1(2 * b * x) - (2 * a) / Math.expm1(2 * a * x);
}

const SPIN_XS = [1e-8, 1e-6, 1e-4, 0.01, 0.1, 0.29, 0.31, 0.7, 1, 2, 5, 10, 20, 50];
const SPINS = [0.5, 1, 3.5, 100, 1e6];

describe('derivatives of B_J in the spin (u = 1/J)', () => {
  it('∂B/∂u matches Richardson-extrapolated central differences in u to 1e-10', () => {
    // Differences of B(x; v) = brillouin(1/v, x) (analytic in v, also for v < 0 near u = 1e-6),
    // of −(1 − B) from tailOfB where b x ≥ 1. Steps min(0.02, 0.1/x): the measured agreement is
    // 3e-12 or better.
    for (const J of SPINS) {
      const u = 1 / J;
      for (const x of SPIN_XS) {
        const f = (u / 2) * x >= 1 ? (v: number): number => -tailOfB(v, x) : (v: number): number => brillouin(1 / v, x);
        const ref = richardson(f, u, Math.min(0.02, 0.1 / x));
        expect(rel(brillouinInverseSpinDerivative(u, x), ref)).toBeLessThan(1e-10);
        expect(brillouinInverseSpinDerivative(u, -x)).toBe(-brillouinInverseSpinDerivative(u, x));
      }
    }
  });

  it('∂B/∂J matches Richardson-extrapolated central differences in J', () => {
    // Steps 1 % of J (of 1/(u x) in the tail). The differences of B are about 1e-2·J·∂B/∂J:
    // rounding limits the reference to ≈ 1e-11 up to J = 100 (tolerance 2e-10) and to ≈ 1e-6 at
    // J = 1e6, where ∂B/∂J ≈ −½ G(x)/J² ≈ 1e-13 (tolerance 1e-5).
    for (const J of SPINS) {
      const u = 1 / J;
      for (const x of SPIN_XS) {
        const tail = (u / 2) * x >= 1;
        const ref = tail ? richardson(v => -tailOfB(1 / v, x), J, Math.min(0.01, 0.05 / (u * x)) * J) : richardson(v => brillouin(v, x), J, 0.01 * J);
        expect(rel(brillouinSpinDerivative(J, x), ref)).toBeLessThan(J < 1e6 ? 2e-10 : 1e-5);
        expect(brillouinSpinDerivative(J, x)).toBe(-u * u * brillouinInverseSpinDerivative(u, x));
      }
    }
    expect(brillouinSpinDerivative(Infinity, 3)).toBe(0);
  });

  it('u → 0: ∂B/∂u tends to ½(coth x − x/sinh² x), the first-order term of B around the Langevin function', () => {
    // ½ G(x) between 0.1 and 0.31 [computed here: mpmath 1.3.0, 40 digits], where the closed form cancels
    const MID = new Map([
      [0.1, 0.03328895229640306],
      [0.29, 0.09559558956712436],
      [0.31, 0.1020272360100789]
    ]);
    for (const x of [1e-8, 1e-4, 0.1, 0.29, 0.31, 0.5, 1, 3, 10, 50, 1e3]) {
      // closed form for x ≥ 0.5 (at most one digit cancels); Taylor series (2x/3 − 4x³/45 + …)/2 at x ≤ 1e-4
      const g = x >= 0.5 ? (1 / Math.tanh(x) - x / Math.sinh(x) ** 2) / 2 : (MID.get(x) ?? x / 3 - (2 * x ** 3) / 45);
      const d0 = brillouinInverseSpinDerivative(0, x);
      expect(rel(d0, g)).toBeLessThan(1e-13);
      // B(x; u) = L(x) + (u/2) G(x) + O(u²): at u = 1e-6, rounding ≈ 4e-10 and the O(u x) remainder
      expect(rel((brillouin(1e6, x) - langevin(x)) / 1e-6, d0)).toBeLessThan(1e-6 * (10 + x));
      // the small-u values approach the limit linearly (on the scale u x ≪ 1): differences at
      // u = 1e-4 and 1e-6 in the ratio 100
      const e4 = brillouinInverseSpinDerivative(1e-4, x) - d0;
      const e6 = brillouinInverseSpinDerivative(1e-6, x) - d0;
      expect(Math.abs(e6)).toBeLessThan(1e-6 * (1 + x) * Math.abs(d0));
      if (x >= 0.1 && x <= 50) {
        expect(Math.abs(e4 / e6 / 100 - 1)).toBeLessThan(0.02);
      }
    }
  });
});

// [computed here: mpmath 1.3.0, 80 digits, from B = a coth(a x) − b coth(b x), b = u/2, a = 1 + b]
// u, x, Q = B − x B′, N = ∂B/∂u − x B′/(1 + u); 16 significant digits.
const SLOPE_TABLE: [number, number, number, number][] = [
  [0, 1e-6, 4.444444444443598e-20, 2.222222222221799e-20],
  [0, 0.1, 4.435991517310913e-5, 2.217995758655456e-5],
  [0, 0.16, 0.0001811601580477933, 9.058007902389666e-5],
  [0, 0.4, 0.002759793179686577, 0.001379896589843289],
  [0, 1, 0.03709694646564177, 0.01854847323282089],
  [0, 3, 0.3681961939604654, 0.1840980969802327],
  [0, 30, 0.9333333333333333, 0.4666666666666667],
  [2 / 7, 1e-6, 7.580174927111816e-20, 2.222222222221626e-20],
  [2 / 7, 0.1, 7.561348929452282e-5, 2.216273697988069e-5],
  [2 / 7, 0.16, 0.000308515923585807, 9.040042097291882e-5],
  [2 / 7, 0.4, 0.004664044822492561, 0.001363094675931034],
  [2 / 7, 1, 0.06007705661231581, 0.01727669739519423],
  [2 / 7, 3, 0.4946365093812938, 0.1232740954132513],
  [2 / 7, 30, 0.9994817485157413, 0.001073946426725434],
  [1, 1e-6, 2.222222222221259e-19, 2.222222222221005e-20],
  [1, 0.1, 0.0002212625033936729, 2.210098004735712e-5],
  [1, 0.16, 0.0009002114989539475, 8.975822275807869e-5],
  [1, 0.4, 0.01328698878191079, 0.00130466013994465],
  [1, 1, 0.150805837915187, 0.01346729497891533],
  [1, 3, 0.7858844493919168, 0.03099471801136545],
  [1, 30, 0.9999999999970991, 1.310067215637878e-12],
  [2, 1e-6, 6.666666666661333e-19, 2.222222222219683e-20],
  [2, 0.1, 0.0006613655402118393, 2.197008430876167e-5],
  [2, 0.16, 0.002675599964032284, 8.840785344500273e-5],
  [2, 0.4, 0.03769344782275381, 0.001189675073261097],
  [2, 1, 0.3416198143417388, 0.008157271054517174],
  [2, 3, 0.9654566421904099, 0.002527982630260995],
  [2, 30, 1, 1.663737044912339e-25]
];

describe('tangent intercept B − x B′ and the coupled spin derivative ∂B/∂u − x B′/(1 + u)', () => {
  it('reproduce the mpmath table to 2e-11 (both ∝ x³ at small x, where the differences cancel)', () => {
    // measured worst over a dense grid of x and u against mpmath: 7e-12, just above the series
    // range a x < 0.3
    for (const [u, x, Q, N] of SLOPE_TABLE) {
      expect(rel(brillouinTangentIntercept(u, x), Q)).toBeLessThan(2e-11);
      expect(rel(brillouinCoupledInverseSpinDerivative(u, x), N)).toBeLessThan(2e-11);
      expect(brillouinTangentIntercept(u, -x)).toBe(-brillouinTangentIntercept(u, x));
      expect(brillouinCoupledInverseSpinDerivative(u, -x)).toBe(-brillouinCoupledInverseSpinDerivative(u, x));
    }
  });

  it('have the leading terms (2/45)(a⁴ − b⁴) x³ and x³/45, and N = Q/2 at u = 0', () => {
    for (const u of [0, 0.01, 2 / 7, 1, 2]) {
      const b = u / 2;
      const a = 1 + b;
      const x = 1e-5;
      expect(rel(brillouinTangentIntercept(u, x), (2 / 45) * (a ** 4 - b ** 4) * x ** 3)).toBeLessThan(1e-8);
      expect(rel(brillouinCoupledInverseSpinDerivative(u, x), x ** 3 / 45)).toBeLessThan(1e-8);
    }
    // Langevin limit: ∂B/∂u = (L + x L′)/2, so N = (L − x L′)/2 = Q/2 for every x
    for (const x of [1e-7, 0.1, 0.29, 0.31, 1, 5, 40, 300]) {
      expect(rel(brillouinCoupledInverseSpinDerivative(0, x), brillouinTangentIntercept(0, x) / 2)).toBeLessThan(1e-12);
    }
  });

  it('are continuous across the series switch at a x = 0.3', () => {
    for (const u of [0, 2 / 7, 1, 2]) {
      const x0 = 0.3 / (1 + u / 2);
      for (const f of [brillouinTangentIntercept, brillouinCoupledInverseSpinDerivative]) {
        const lo = f(u, x0 * (1 - 1e-13));
        const hi = f(u, x0 * (1 + 1e-13));
        expect(Math.abs(hi - lo) / Math.abs(hi)).toBeLessThan(2e-11);
      }
    }
  });
});
