/**
 * Self-consistent Weiss mean field in reduced units (convention of
 * [B1 in REFERENCES.md]): m = B_J(x), x = (k m + h)/τ with k = 3J/(J+1)
 * (k = 3 for J → ∞), τ = T/Tc, h = g μB J B_a/(kB Tc).
 *
 * The solver works on whole arrays. Below Tc at h = 0 it returns the
 * positive ordered root (never the trivial m = 0); for h ≠ 0 the stable root
 * has the sign of h. Each point is a safeguarded Newton iteration on the
 * convex function g(m) = m − B_J(x(m)) inside the bracket (0, 1].
 */
import { brillouin, brillouinDerivative, inverseBrillouin, weissCoupling } from './brillouin';
import { msg } from '../messages';
import { wholeNumber } from '../numeric/messageArgs';
import { lengthsDiffer, PhysicsInputError, pointNotFinite, requireSpin } from './errors';

/** Point-wise result with the implicit derivatives used by fit Jacobians. */
export interface IWeissSolution {
  /** Reduced magnetisation m = M/Ms. */
  m: Float64Array;
  /** ∂m/∂τ at fixed h. */
  dmdtau: Float64Array;
  /** ∂m/∂h at fixed τ (reduced susceptibility). */
  dmdh: Float64Array;
  /** Number of points whose iteration hit the limit (0 when all converged). */
  unconverged: number;
}

/** Initial upper estimate of the root (Newton from above converges monotonically). */
function startEstimate(J: number, tau: number, h: number): number {
  let m0 = 0;
  if (tau < 1) {
    const A = J === Infinity ? 5 / 3 : ((10 / 3) * (J + 1) * (J + 1)) / ((J + 1) * (J + 1) + J * J);
    m0 = Math.sqrt(A * (1 - tau)) * 1.02;
  }
  if (h > 0) {
    const bJ = J === Infinity ? 9 / 5 : (0.9 * J * ((J + 1) * (J + 1) + J * J)) / ((J + 1) * (J + 1) * (J + 1));
    m0 = Math.max(m0 * 1.02, Math.cbrt(h / bJ) * 1.05, tau > 1 ? (1.05 * h) / (weissCoupling(J) * (tau - 1)) : 0);
  }
  return Math.min(1, m0);
}

/**
 * Solves one point for h ≥ 0; returns the root (0 when τ ≥ 1 and h = 0) and
 * the number of iterations (negative when the limit was hit).
 */
export function solveWeissPoint(J: number, k: number, tau: number, h: number): { m: number; iterations: number } {
  if (!(tau > 0) || !Number.isFinite(h) || !Number.isFinite(tau)) {
    return { m: NaN, iterations: 0 };
  }
  if (h === 0 && tau >= 1) {
    return { m: 0, iterations: 0 };
  }
  const half = J === 0.5;
  const inv = 1 / tau;
  let lo = 0;
  let hi = 1;
  let m = startEstimate(J, tau, h);
  if (!(m > 0)) {
    m = 1;
  }
  for (let it = 1; it <= 100; it++) {
    const x = (k * m + h) * inv;
    let B: number;
    let dB: number;
    if (half) {
      B = Math.tanh(x);
      dB = x > 350 ? 0 : 1 - B * B;
    } else {
      B = brillouin(J, x);
      dB = brillouinDerivative(J, x);
    }
    const g = m - B;
    if (g > 0) {
      hi = m;
    } else if (g < 0) {
      lo = m;
    } else {
      return { m, iterations: it };
    }
    const dg = 1 - k * dB * inv;
    let next = dg > 0 ? m - g / dg : NaN;
    if (!(next > lo && next < hi) || (g < 0 && h === 0 && next <= lo)) {
      next = 0.5 * (lo + hi);
    }
    if (Math.abs(next - m) <= 4 * Number.EPSILON * next) {
      return { m: next, iterations: it };
    }
    m = next;
  }
  return { m, iterations: -100 };
}

function toArray(v: ArrayLike<number> | number, n: number): ArrayLike<number> {
  if (typeof v === 'number') {
    const a = new Float64Array(n);
    a.fill(v);
    return a;
  }
  return v;
}

/**
 * m(τ, h) over whole arrays (or a scalar h broadcast), with implicit
 * derivatives. Invalid points (τ ≤ 0 or non-finite) give NaN; the public
 * wrapper `weissMagnetisation` rejects them instead.
 */
export function solveWeiss(J: number, tau: ArrayLike<number>, h: ArrayLike<number> | number = 0): IWeissSolution {
  const n = tau.length;
  const hh = toArray(h, n);
  if (hh.length !== n) {
    throw new PhysicsInputError(lengthsDiffer({ tau: n, h: hh.length }));
  }
  const k = weissCoupling(J);
  const m = new Float64Array(n);
  const dmdtau = new Float64Array(n);
  const dmdh = new Float64Array(n);
  let unconverged = 0;
  if (J === 0.5 && typeof h === 'number' && h === 0) {
    unconverged = solveSpinHalfZeroField(tau, m, dmdtau, dmdh);
    return { m, dmdtau, dmdh, unconverged };
  }
  for (let i = 0; i < n; i++) {
    const t = tau[i];
    const hi = hh[i];
    const s = hi < 0 ? -1 : 1;
    const r = solveWeissPoint(J, k, t, s * hi);
    if (r.iterations < 0) {
      unconverged++;
    }
    const mi = r.m;
    m[i] = s * mi;
    const x = (k * mi + s * hi) / t;
    const dB = brillouinDerivative(J, x);
    const D = t - k * dB;
    if (mi === 0 && hi === 0) {
      dmdtau[i] = 0;
      dmdh[i] = D > 0 ? dB / D : Infinity;
    } else {
      dmdtau[i] = D > 0 ? (s * (-dB * x)) / D : NaN;
      dmdh[i] = D > 0 ? dB / D : Infinity;
    }
  }
  return { m, dmdtau, dmdh, unconverged };
}

/**
 * Hot path for J = ½ at h = 0: m = tanh(m/τ). Newton on g(m) = m − tanh(m/τ)
 * inside the bracket (0, 1], warm-started from the previous point's root
 * when that lies on the safe (upper) side, else from the √(3(1 − τ)) /
 * saturation estimate. Returns the number of unconverged points.
 */
function solveSpinHalfZeroField(tau: ArrayLike<number>, m: Float64Array, dmdtau: Float64Array, dmdh: Float64Array): number {
  let bad = 0;
  let prev = NaN;
  for (let i = 0; i < tau.length; i++) {
    const t = tau[i];
    if (!(t > 0) || !Number.isFinite(t)) {
      m[i] = NaN;
      dmdtau[i] = NaN;
      dmdh[i] = NaN;
      prev = NaN;
      bad++;
      continue;
    }
    if (t >= 1) {
      m[i] = 0;
      dmdtau[i] = 0;
      dmdh[i] = 1 / (t - 1);
      prev = NaN;
      continue;
    }
    const inv = 1 / t;
    let x: number;
    let B: number;
    // warm start from the previous point's root when it is an upper point (g ≥ 0);
    // its tanh is reused as the first iteration
    if (prev > 0 && prev < 1) {
      x = prev;
      B = Math.tanh(x * inv);
      if (x - B < 0) {
        x = t < 0.6 ? 1 : Math.min(1, 1.02 * Math.sqrt(3 * (1 - t)));
        B = Math.tanh(x * inv);
      }
    } else {
      x = t < 0.6 ? 1 : Math.min(1, 1.02 * Math.sqrt(3 * (1 - t)));
      B = Math.tanh(x * inv);
    }
    let lo = 0;
    let hi = 1;
    let ok = false;
    for (let it = 0; it < 100; it++) {
      const g = x - B;
      if (g > 0) {
        hi = x;
      } else if (g < 0) {
        lo = x;
      } else {
        ok = true;
        break;
      }
      const dg = 1 - (1 - B * B) * inv;
      let next = dg > 0 ? x - g / dg : NaN;
      if (!(next > lo && next < hi)) {
        next = 0.5 * (lo + hi);
      }
      if (Math.abs(next - x) <= 4 * Number.EPSILON * next) {
        x = next;
        ok = true;
        break;
      }
      x = next;
      B = Math.tanh(x * inv);
    }
    if (!ok) {
      bad++;
    }
    m[i] = x;
    prev = x;
    // at the root B = tanh(x/τ) = x, so B′ = 1 − x²
    const dB = 1 - x * x;
    const D = t - dB;
    dmdtau[i] = D > 0 ? (-dB * x * inv) / D : NaN;
    dmdh[i] = D > 0 ? dB / D : Infinity;
  }
  return bad;
}

/**
 * Reduced Weiss magnetisation m(τ, h) for every τ (h scalar or per point).
 * Throws `PhysicsInputError` for a bad J, τ ≤ 0, or non-finite inputs.
 */
export function weissMagnetisation(J: number, tau: ArrayLike<number>, h: ArrayLike<number> | number = 0): Float64Array {
  requireSpin(J);
  for (let i = 0; i < tau.length; i++) {
    if (!(tau[i] > 0) || !Number.isFinite(tau[i])) {
      throw new PhysicsInputError(
        msg('physics.tau-not-positive-at', 'Point %1 has τ = %2: every reduced temperature must be a finite number above 0.', wholeNumber(i + 1), tau[i])
      );
    }
  }
  const hh = toArray(h, tau.length);
  for (let i = 0; i < hh.length; i++) {
    if (!Number.isFinite(hh[i])) {
      throw new PhysicsInputError(pointNotFinite(i, 'h', hh[i]));
    }
  }
  return solveWeiss(J, tau, hh).m;
}

/**
 * Inverse isotherm without root finding: h = τ B_J⁻¹(m) − k m.
 * For J = ½ this is h = τ artanh(m) − m.
 */
export function weissInverseIsotherm(J: number, tau: number, m: number): number {
  requireSpin(J);
  if (!(tau > 0)) {
    throw new PhysicsInputError(msg('physics.tau-not-positive', 'The reduced temperature τ must be above 0, but it is %1.', tau));
  }
  return tau * inverseBrillouin(J, m) - weissCoupling(J) * m;
}

/** Closed-form mean-field consequences for spin J [B1 in REFERENCES.md]. */
export interface IWeissConstants {
  J: number;
  /** k = 3J/(J+1). */
  coupling: number;
  /** m² ≈ A_J (1 − τ) near Tc. */
  A: number;
  /** h ≈ b_J m³ on the critical isotherm. */
  b: number;
  /** Specific-heat jump at Tc in units of N kB (C is larger below Tc). */
  specificHeatJumpPerNkB: number;
}

/** A_J, b_J and ΔC/(N kB) for spin J (J = ∞: Langevin limit). */
export function weissConstants(J: number): IWeissConstants {
  requireSpin(J);
  if (J === Infinity) {
    return { J, coupling: 3, A: 5 / 3, b: 9 / 5, specificHeatJumpPerNkB: 5 / 2 };
  }
  const q = (J + 1) * (J + 1) + J * J;
  return {
    J,
    coupling: weissCoupling(J),
    A: ((10 / 3) * (J + 1) * (J + 1)) / q,
    b: (0.9 * J * q) / ((J + 1) * (J + 1) * (J + 1)),
    specificHeatJumpPerNkB: (5 * J * (J + 1)) / q
  };
}
