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
