/**
 * Exponential, logarithm and powers in double-double arithmetic
 * (relative error ≈ 1e-31 over the normal range; tested against published
 * digit sequences of e, ln 2 and √2) [N11, N12 in REFERENCES.md].
 *
 * exp: argument reduction x = k·ln 2 + r, r scaled by 2⁻⁹, Taylor series of
 * expm1 at the scaled argument, nine squarings in the expm1 form
 * ((1 + s)² − 1 = 2s + s², which keeps the relative accuracy of s), then
 * the factor 2^k. log: one Newton step x ← x + a·e⁻ˣ − 1 from the binary64
 * logarithm (quadratic convergence: ≈ 1e-16 → ≈ 1e-32).
 */
import { DD_LN2, DD_ONE, inverseFactorial } from './constants';
import type { IDoubleDouble } from './core';
import { abs, add, div, mul, mulNumber, neg, scale2, sqr, sub } from './core';

/** Beyond these arguments exp overflows to ∞ or underflows to 0 in binary64. */
const EXP_OVERFLOW = 709.782712893384;
const EXP_UNDERFLOW = -745.1332191019412;
/** Number of halvings of the reduced argument (and of squarings afterwards). */
const HALVINGS = 9;
const TAYLOR_TOLERANCE = 1e-36;

/** expm1(t) by its Taylor series, for |t| ≲ 1e-3. */
function expm1Taylor(t: IDoubleDouble): IDoubleDouble {
  let power = t;
  let sum = t;
  for (let n = 2; n < 30; n++) {
    power = mul(power, t);
    const term = mul(power, inverseFactorial(n));
    sum = add(sum, term);
    if (Math.abs(term.hi) <= TAYLOR_TOLERANCE * Math.abs(sum.hi)) {
      break;
    }
  }
  return sum;
}

/** expm1(r) for |r| ≤ ln2/2 + tiny, through halving and squaring. */
function expm1Reduced(r: IDoubleDouble): IDoubleDouble {
  let s = expm1Taylor(scale2(r, -HALVINGS));
  for (let i = 0; i < HALVINGS; i++) {
    s = add(scale2(s, 1), sqr(s));
  }
  return s;
}

/** eᵃ. */
export function exp(a: IDoubleDouble): IDoubleDouble {
  if (Number.isNaN(a.hi)) {
    return { hi: Number.NaN, lo: 0 };
  }
  if (a.hi > EXP_OVERFLOW) {
    return { hi: Infinity, lo: 0 };
  }
  if (a.hi < EXP_UNDERFLOW) {
    return { hi: 0, lo: 0 };
  }
  if (a.hi === 0) {
    return DD_ONE;
  }
  const k = Math.round(a.hi / DD_LN2.hi);
  const r = sub(a, mulNumber(DD_LN2, k));
  const e = add(expm1Reduced(r), DD_ONE);
  // 2^k in two factors so that neither overflows nor underflows early.
  const k1 = Math.trunc(k / 2);
  return scale2(scale2(e, k1), k - k1);
}

/** eᵃ − 1, accurate in relative terms also for small |a|. */
export function expm1(a: IDoubleDouble): IDoubleDouble {
  if (Math.abs(a.hi) <= 0.5 * DD_LN2.hi) {
    return expm1Reduced(a);
  }
  return sub(exp(a), DD_ONE);
}

/** ln a (NaN for a < 0, −∞ for a = 0). */
export function log(a: IDoubleDouble): IDoubleDouble {
  if (Number.isNaN(a.hi) || a.hi < 0) {
    return { hi: Number.NaN, lo: 0 };
  }
  if (a.hi === 0) {
    return { hi: -Infinity, lo: 0 };
  }
  if (a.hi === Infinity) {
    return { hi: Infinity, lo: 0 };
  }
  if (a.hi === 1 && a.lo === 0) {
    return { hi: 0, lo: 0 };
  }
  const x = { hi: Math.log(a.hi), lo: 0 };
  return add(x, sub(mul(a, exp(neg(x))), DD_ONE));
}

/** aⁿ for an integer n by repeated squaring (a⁰ = 1). */
export function powInt(a: IDoubleDouble, n: number): IDoubleDouble {
  if (!Number.isInteger(n)) {
    return { hi: Number.NaN, lo: 0 };
  }
  let m = Math.abs(n);
  let result: IDoubleDouble = DD_ONE;
  let base = a;
  while (m > 0) {
    if (m % 2 === 1) {
      result = mul(result, base);
    }
    m = Math.floor(m / 2);
    if (m > 0) {
      base = sqr(base);
    }
  }
  return n < 0 ? div(DD_ONE, result) : result;
}

/**
 * aᵇ: integer b (exactly, |b| ≤ 2⁵³) by repeated squaring, otherwise
 * exp(b·ln a) for a > 0; 0ᵇ = 0 (b > 0) or ∞ (b < 0); NaN for a < 0 with
 * a non-integer b.
 */
export function pow(a: IDoubleDouble, b: IDoubleDouble): IDoubleDouble {
  if (b.lo === 0 && Number.isInteger(b.hi) && Math.abs(b.hi) <= Number.MAX_SAFE_INTEGER) {
    return powInt(a, b.hi);
  }
  if (Number.isNaN(a.hi) || Number.isNaN(b.hi)) {
    return { hi: Number.NaN, lo: 0 };
  }
  if (a.hi === 0) {
    return { hi: b.hi > 0 ? 0 : Infinity, lo: 0 };
  }
  if (a.hi < 0) {
    return { hi: Number.NaN, lo: 0 };
  }
  return exp(mul(b, log(abs(a))));
}
