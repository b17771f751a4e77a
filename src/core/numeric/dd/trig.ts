/**
 * Sine, cosine, tangent and arctangent in double-double arithmetic.
 *
 * sin/cos: reduction x = k·π/2 + r with π/2 as a sum of three binary64
 * numbers (Cody–Waite [N12 in REFERENCES.md]; absolute reduction error ≈ 1e-32 + |k|·1e-49, so the
 * absolute accuracy stays ≈ 1e-31 up to |x| ≈ 1e9 and the relative one
 * away from the zeros of sin and cos), Taylor series at r/8, and three
 * double-angle steps. atan2: one Newton step on the binary64 angle z,
 * z ← z + (ŷ − sin z)/cos z or z − (x̂ − cos z)/sin z with (x̂, ŷ) the unit
 * vector, which doubles the number of correct digits.
 */
import { DD_HALF_PI, DD_ONE, inverseFactorial } from './constants';
import type { IDoubleDouble } from './core';
import { add, div, mul, neg, scale2, sqr, sqrt, sub, twoProd } from './core';

const TAYLOR_TOLERANCE = 1e-36;
/** π/2 − DD_HALF_PI.hi − DD_HALF_PI.lo, rounded (from 80-digit arithmetic). */
const HALF_PI_TAIL = -1.4973849048591698e-33;
/** Beyond this |x| the reduction by a double-double π/2 loses accuracy: NaN is returned. */
const TRIG_LIMIT = 1e9;

interface ISinCos {
  sin: IDoubleDouble;
  cos: IDoubleDouble;
}

/** sin t and cos t by Taylor series for |t| ≤ 0.1. */
function sinCosTaylor(t: IDoubleDouble): ISinCos {
  const t2 = sqr(t);
  // sin: Σ (−1)^m t^(2m+1)/(2m+1)!, cos: Σ (−1)^m t^(2m)/(2m)! (no cancellation for |t| ≤ 0.1).
  let power: IDoubleDouble = t;
  let s = t;
  for (let n = 3; n < 40; n += 2) {
    power = neg(mul(power, t2));
    const term = mul(power, inverseFactorial(n));
    s = add(s, term);
    if (Math.abs(term.hi) <= TAYLOR_TOLERANCE * Math.abs(s.hi)) {
      break;
    }
  }
  power = DD_ONE;
  let c: IDoubleDouble = DD_ONE;
  for (let n = 2; n < 40; n += 2) {
    power = neg(mul(power, t2));
    const term = mul(power, inverseFactorial(n));
    c = add(c, term);
    if (Math.abs(term.hi) <= TAYLOR_TOLERANCE) {
      break;
    }
  }
  return { sin: s, cos: c };
}

/** sin r, cos r for |r| ≤ π/4 (+ tiny). */
function sinCosReduced(r: IDoubleDouble): ISinCos {
  let { sin: s, cos: c } = sinCosTaylor(scale2(r, -3));
  for (let i = 0; i < 3; i++) {
    // sin 2t = 2 sin t cos t; cos 2t = (cos t − sin t)(cos t + sin t).
    const s2 = scale2(mul(s, c), 1);
    c = mul(sub(c, s), add(c, s));
    s = s2;
  }
  return { sin: s, cos: c };
}

/** sin a and cos a together. */
export function sinCos(a: IDoubleDouble): ISinCos {
  if (!Number.isFinite(a.hi) || Math.abs(a.hi) > TRIG_LIMIT) {
    return { sin: { hi: Number.NaN, lo: 0 }, cos: { hi: Number.NaN, lo: 0 } };
  }
  if (a.hi === 0) {
    return { sin: a, cos: DD_ONE };
  }
  const k = Math.round(a.hi / DD_HALF_PI.hi);
  // r = a − k·(P1 + P2 + P3), each k·Pᵢ an exact TwoProduct (k is an integer
  // below 2^30), subtracted in double-double.
  let r = sub(a, twoProd(k, DD_HALF_PI.hi));
  r = sub(r, twoProd(k, DD_HALF_PI.lo));
  r = sub(r, twoProd(k, HALF_PI_TAIL));
  const { sin: s, cos: c } = sinCosReduced(r);
  switch (((k % 4) + 4) % 4) {
    case 0:
      return { sin: s, cos: c };
    case 1:
      return { sin: c, cos: neg(s) };
    case 2:
      return { sin: neg(s), cos: neg(c) };
    default:
      return { sin: neg(c), cos: s };
  }
}

/** sin a (NaN for non-finite a or |a| > 1e9). */
export function sin(a: IDoubleDouble): IDoubleDouble {
  return sinCos(a).sin;
}

/** cos a (NaN for non-finite a or |a| > 1e9). */
export function cos(a: IDoubleDouble): IDoubleDouble {
  return sinCos(a).cos;
}

/** tan a = sin a / cos a. */
export function tan(a: IDoubleDouble): IDoubleDouble {
  const sc = sinCos(a);
  return div(sc.sin, sc.cos);
}

/** Angle of the point (x, y) in (−π, π], like Math.atan2. */
export function atan2(y: IDoubleDouble, x: IDoubleDouble): IDoubleDouble {
  if (Number.isNaN(x.hi) || Number.isNaN(y.hi)) {
    return { hi: Number.NaN, lo: 0 };
  }
  const z0 = Math.atan2(y.hi, x.hi);
  if (!Number.isFinite(x.hi) || !Number.isFinite(y.hi) || (x.hi === 0 && y.hi === 0)) {
    return { hi: z0, lo: 0 };
  }
  const r = sqrt(add(sqr(x), sqr(y)));
  const xx = div(x, r);
  const yy = div(y, r);
  const z = { hi: z0, lo: 0 };
  const sc = sinCos(z);
  if (Math.abs(xx.hi) > Math.abs(yy.hi)) {
    return add(z, div(sub(yy, sc.sin), sc.cos));
  }
  return sub(z, div(sub(xx, sc.cos), sc.sin));
}

/** arctan a in (−π/2, π/2). */
export function atan(a: IDoubleDouble): IDoubleDouble {
  if (Number.isNaN(a.hi)) {
    return { hi: Number.NaN, lo: 0 };
  }
  if (!Number.isFinite(a.hi)) {
    return a.hi > 0 ? DD_HALF_PI : neg(DD_HALF_PI);
  }
  return atan2(a, DD_ONE);
}
