/**
 * Brillouin function B_J(x) for any J (½, integer, half-integer) and its
 * classical limit J → ∞ (Langevin L(x) = coth x − 1/x), with derivative and
 * inverse. Written as B_J(x) = a L(a x) − b L(b x), a = (2J+1)/(2J),
 * b = 1/(2J): the 1/x poles cancel exactly, so no catastrophic cancellation at
 * small x; L uses its Taylor series for |y| < 0.3 and an expm1 form beyond,
 * which stays finite (→ 1) for huge x.
 */
import { msg } from '../messages';
import { requireSpin, PhysicsInputError } from './errors';

/** Taylor coefficients of coth(y) − 1/y (odd powers y, y³, …). */
const L_SERIES = [
  1 / 3, -1 / 45, 2 / 945, -1 / 4725, 2 / 93555, -1382 / 638512875, 4 / 18243225, -3617 / 162820783125,
  2.25078465168089928542e-9
];
const SERIES_LIMIT = 0.3;

/** Langevin function L(y) = coth y − 1/y, accurate for all real y. */
export function langevin(y: number): number {
  const ay = Math.abs(y);
  if (ay < SERIES_LIMIT) {
    const y2 = y * y;
    let s = 0;
    for (let i = L_SERIES.length - 1; i >= 0; i--) {
      s = s * y2 + L_SERIES[i];
    }
    return s * y;
  }
  if (ay > 40) {
    return Math.sign(y) * (1 - 1 / ay);
  }
  // coth(y) = 1 + 2/expm1(2y) for y > 0
  const v = 1 + 2 / Math.expm1(2 * ay) - 1 / ay;
  return y < 0 ? -v : v;
}

/** Derivative L′(y) = 1/y² − 1/sinh² y. */
export function langevinDerivative(y: number): number {
  const ay = Math.abs(y);
  if (ay < SERIES_LIMIT) {
    const y2 = y * y;
    let s = 0;
    for (let i = L_SERIES.length - 1; i >= 0; i--) {
      s = s * y2 + (2 * i + 1) * L_SERIES[i];
    }
    return s;
  }
  if (ay > 350) {
    return 1 / (ay * ay);
  }
  const sh = Math.sinh(ay);
  return 1 / (ay * ay) - 1 / (sh * sh);
}

/** The two scale factors a = (2J+1)/(2J), b = 1/(2J). */
function scales(J: number): [number, number] {
  return [(2 * J + 1) / (2 * J), 1 / (2 * J)];
}

/**
 * Brillouin function B_J(x). `J = Infinity` gives the Langevin function.
 * J = ½ is evaluated as tanh(x) (identical, faster).
 */
export function brillouin(J: number, x: number): number {
  if (J === 0.5) {
    return Math.tanh(x);
  }
  if (J === Infinity) {
    return langevin(x);
  }
  const [a, b] = scales(J);
  return a * langevin(a * x) - b * langevin(b * x);
}

/** dB_J/dx. */
export function brillouinDerivative(J: number, x: number): number {
  if (J === 0.5) {
    if (Math.abs(x) > 350) {
      return 0;
    }
    const c = Math.cosh(x);
    return 1 / (c * c);
  }
  if (J === Infinity) {
    return langevinDerivative(x);
  }
  const [a, b] = scales(J);
  return a * a * langevinDerivative(a * x) - b * b * langevinDerivative(b * x);
}

/** Checked variant of `brillouin` for calls at the API boundary. */
export function brillouinChecked(J: number, x: number): number {
  requireSpin(J);
  if (Number.isNaN(x)) {
    throw new PhysicsInputError(msg('physics.brillouin-argument', 'The argument x of the Brillouin function is not a number.'));
  }
  if (x === Infinity) {
    return 1;
  }
  if (x === -Infinity) {
    return -1;
  }
  return brillouin(J, x);
}

/** Mean-field coupling 3J/(J+1) (3 for J → ∞); also 1/B_J′(0). */
export function weissCoupling(J: number): number {
  return J === Infinity ? 3 : (3 * J) / (J + 1);
}

/**
 * Inverse Brillouin function: the x with B_J(x) = m, for −1 < m < 1
 * (±1 give ±∞). J = ½ uses artanh. Otherwise safeguarded Newton from the left
 * on the concave branch (monotone convergence), with bisection fallback.
 */
export function inverseBrillouin(J: number, m: number): number {
  requireSpin(J);
  if (Number.isNaN(m) || Math.abs(m) > 1) {
    throw new PhysicsInputError(msg('physics.reduced-magnetisation-range', 'The reduced magnetisation m must lie between −1 and 1, but it is %1.', m));
  }
  if (m === 1) {
    return Infinity;
  }
  if (m === -1) {
    return -Infinity;
  }
  if (m < 0) {
    return -inverseBrillouin(J, -m);
  }
  if (m === 0) {
    return 0;
  }
  if (J === 0.5) {
    return Math.atanh(m);
  }
  const k = weissCoupling(J);
  // Bracket: B_J(x) ≤ k⁻¹ x gives lower bound x ≥ k m; upper bound from the tail.
  let lo = k * m;
  let hi = Math.max(2 * lo, 1);
  while (brillouin(J, hi) < m) {
    lo = hi;
    hi *= 2;
    if (hi > 1e300) {
      return Infinity;
    }
  }
  let x = lo;
  for (let it = 0; it < 200; it++) {
    const f = brillouin(J, x) - m;
    if (f === 0) {
      return x;
    }
    if (f < 0) {
      lo = Math.max(lo, x);
    } else {
      hi = Math.min(hi, x);
    }
    const d = brillouinDerivative(J, x);
    let next = d > 0 ? x - f / d : NaN;
    if (!(next >= lo && next <= hi)) {
      next = 0.5 * (lo + hi);
    }
    if (Math.abs(next - x) <= 4 * Number.EPSILON * Math.abs(next) || hi - lo <= 4 * Number.EPSILON * hi) {
      return next;
    }
    x = next;
  }
  return x;
}

/*
 * Derivatives in the spin, for fits with J free. They take u = 1/J ≥ 0
 * (u = 0: the classical limit J = ∞, u = 2: J = ½). With b = u/2 and
 * a = 1 + b the function above is B(x; u) = a L(a x) − b L(b x), and since
 * ∂a/∂u = ∂b/∂u = ½,
 *   ∂B/∂u = ½ [G(a x) − G(b x)],   G(z) = d(z L(z))/dz = L(z) + z L′(z) = coth z − z/sinh² z.
 * G is odd, G(0) = 0, so the same formula holds at u = 0 (b = 0):
 * ∂B/∂u = ½ G(x), i.e. B(x; u) = L(x) + (u/2)(coth x − x/sinh² x) + O(u²)
 * around the Langevin function. G rises from 0 to 1 and 1 − G(z) = E(z)
 * vanishes like (4z − 2) e^{−2z}: for b x ≥ 1 the difference is taken as
 * E(b x) − E(a x) (no cancellation of the 1s in the tail); below, G(b x) is
 * at most about 2/3 of G(a x) (a x ≥ 2 b x).
 */

/** G(z) = L(z) + z L′(z) = coth z − z/sinh² z (odd); Taylor series Σ (2i+2) c_i z^{2i+1} for |z| < 0.3. */
function langevinG(z: number): number {
  const az = Math.abs(z);
  if (az < SERIES_LIMIT) {
    const z2 = z * z;
    let s = 0;
    for (let i = L_SERIES.length - 1; i >= 0; i--) {
      s = s * z2 + (2 * i + 2) * L_SERIES[i];
    }
    return s * z;
  }
  const v = 1 - langevinGComplement(az);
  return z < 0 ? -v : v;
}

/**
 * E(z) = 1 − G(z) for z ≥ 0.3: with w = e^{2z} − 1, 1 − coth z = −2/w and
 * z/sinh² z = 4z (w + 1)/w², so E = (2/w)(2z (w + 1)/w − 1);
 * (4z − 2) e^{−2z} beyond z = 20 (relative error below 1e-16).
 */
function langevinGComplement(z: number): number {
  if (z > 20) {
    return z > 400 ? 0 : Math.exp(-2 * z) * (4 * z - 2);
  }
  const w = Math.expm1(2 * z);
  return (2 / w) * ((2 * z * (w + 1)) / w - 1);
}

/**
 * ∂B_J(x)/∂u at fixed x, u = 1/J ≥ 0 (u = 0: the Langevin limit; see the
 * formula above). Relative error about 1e-14 against mpmath for x up to 100
 * (6e-14 at x = 500, the conditioning of e^{−u x}).
 */
export function brillouinInverseSpinDerivative(u: number, x: number): number {
  const ax = Math.abs(x);
  const b = 0.5 * u;
  const a = 1 + b;
  let d: number;
  if (b === 0) {
    d = 0.5 * langevinG(ax);
  } else if (b * ax < 1) {
    d = 0.5 * (langevinG(a * ax) - langevinG(b * ax));
  } else {
    d = 0.5 * (langevinGComplement(b * ax) - langevinGComplement(a * ax));
  }
  return x < 0 ? -d : d;
}

/** ∂B_J(x)/∂J = −(1/J²) ∂B/∂u (0 at J = ∞). */
export function brillouinSpinDerivative(J: number, x: number): number {
  if (J === Infinity) {
    return 0;
  }
  const u = 1 / J;
  return -u * u * brillouinInverseSpinDerivative(u, x);
}

/**
 * dB/dx for u = 1/J, x ≥ 0, accurate also far in the tail: B = a coth(a x) − b coth(b x)
 * gives B′ = b²/sinh²(b x) − a²/sinh²(a x), used for b x ≥ 1, where the
 * form a² L′(a x) − b² L′(b x) would cancel its 1/x² terms.
 */
function brillouinSlope(u: number, x: number): number {
  const b = 0.5 * u;
  const a = 1 + b;
  if (b * x < 1) {
    return a * a * langevinDerivative(a * x) - (b === 0 ? 0 : b * b * langevinDerivative(b * x));
  }
  const sa = Math.sinh(a * x);
  const sb = Math.sinh(b * x);
  return (b * b) / (sb * sb) - (a * a) / (sa * sa);
}

/**
 * Tangent intercept B(x) − x B′(x) of B_J, u = 1/J ≥ 0 (odd in x;
 * (2/45)(a⁴ − b⁴) x³ at small x). The Taylor series
 * −Σ_{i≥1} 2i c_i (a^{2i+2} − b^{2i+2}) x^{2i+1} (c_i: the coefficients of L,
 * `L_SERIES`) is used for a|x| < 0.3, where the difference would cancel.
 * Relative error below 1e-12 against mpmath (largest just above the switch).
 */
export function brillouinTangentIntercept(u: number, x: number): number {
  const ax = Math.abs(x);
  const b = 0.5 * u;
  const a = 1 + b;
  let v: number;
  if (a * ax < SERIES_LIMIT) {
    const x2 = ax * ax;
    // powers a^{2i+2}, b^{2i+2} from i = 1
    let pa = a * a * a * a;
    let pb = b * b * b * b;
    let xp = x2 * ax;
    v = 0;
    for (let i = 1; i < L_SERIES.length; i++) {
      v -= 2 * i * L_SERIES[i] * (pa - pb) * xp;
      pa *= a * a;
      pb *= b * b;
      xp *= x2;
    }
  } else {
    const B = a * langevin(a * ax) - (b === 0 ? 0 : b * langevin(b * ax));
    v = B - ax * brillouinSlope(u, ax);
  }
  return x < 0 ? -v : v;
}

/**
 * ∂/∂u of B_J(k z) at fixed z, with the mean-field coupling
 * k = 3J/(J + 1) = 3/(1 + u) (`weissCoupling`), written in x = k z:
 *   ∂B/∂u + x B′ d(ln k)/du = ∂B/∂u − x B′/(1 + u),   u = 1/J ≥ 0.
 * The x/3 terms of both cancel; the Taylor series
 *   Σ_{i≥1} c_i [(i+1)(a^{2i+1} − b^{2i+1}) − (2i+1)(a^{2i+2} − b^{2i+2})/(a + b)] x^{2i+1}
 * (leading term x³/45 for every u) is used for a|x| < 0.3. Odd in x.
 * Relative error below 1e-11 against mpmath (7e-12 just above the switch,
 * where about two digits cancel).
 */
export function brillouinCoupledInverseSpinDerivative(u: number, x: number): number {
  const ax = Math.abs(x);
  const b = 0.5 * u;
  const a = 1 + b;
  let v: number;
  if (a * ax < SERIES_LIMIT) {
    const x2 = ax * ax;
    const apb = a + b;
    let pa = a * a * a; // a^{2i+1}, i = 1
    let pb = b * b * b;
    let xp = x2 * ax;
    v = 0;
    for (let i = 1; i < L_SERIES.length; i++) {
      const n = (i + 1) * (pa - pb) - ((2 * i + 1) * (pa * a - pb * b)) / apb;
      v += L_SERIES[i] * n * xp;
      pa *= a * a;
      pb *= b * b;
      xp *= x2;
    }
  } else {
    v = brillouinInverseSpinDerivative(u, ax) - (ax * brillouinSlope(u, ax)) / (1 + u);
  }
  return x < 0 ? -v : v;
}
