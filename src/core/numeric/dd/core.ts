/**
 * Double-double arithmetic: a value is the unevaluated sum hi + lo of two
 * binary64 numbers with |lo| ≤ ulp(hi)/2, giving about 106 bits (≈ 32
 * decimal digits) of precision. Error-free transformations after Knuth
 * (TwoSum) and Dekker (splitting, TwoProduct; JavaScript has no fused
 * multiply-add); the compound operations follow the usual double-double
 * algorithms of Hida, Li & Bailey (accurate addition with two TwoSums,
 * division with three quotient digits, square root with one Newton
 * correction) [N11 in REFERENCES.md].
 *
 * Accuracy (tested against exact rational arithmetic): add and sub within
 * 1e-31 of the operands' magnitude, mul, sqr, div and sqrt within 1e-31
 * relative; TwoSum, TwoProduct and split are exact.
 *
 * Below about 1e-292 in magnitude the low part becomes subnormal and the
 * precision degrades gradually to that of binary64.
 *
 * Non-finite inputs propagate: any operation whose binary64 leading part is
 * not finite returns { hi: that value, lo: 0 }.
 */

/** A double-double number hi + lo (|lo| ≤ ulp(hi)/2 after normalisation). */
export interface IDoubleDouble {
  readonly hi: number;
  readonly lo: number;
}

/** Arrays of double-double numbers as two parallel binary64 arrays. */
export interface IDoubleDoubleArray {
  hi: Float64Array;
  lo: Float64Array;
}

/** Dekker's splitting constant 2^27 + 1. */
const SPLITTER = 134217729;
/** Above this magnitude a·SPLITTER could overflow: split a scaled copy. */
const SPLIT_THRESHOLD = 6.69692879491417e299;
const TWO_M28 = 3.7252902984619140625e-9;
const TWO_28 = 268435456;

/** The double-double hi + lo, renormalised (hi = fl(hi + lo)). */
export function dd(hi: number, lo = 0): IDoubleDouble {
  const s = hi + lo;
  if (!Number.isFinite(s)) {
    return { hi: s, lo: 0 };
  }
  return { hi: s, lo: lo - (s - hi) };
}

/** Rounds a double-double to the nearest binary64 (hi + lo). */
export function toNumber(a: IDoubleDouble): number {
  return a.hi + a.lo;
}

/** True when both parts are finite. */
export function isFiniteDD(a: IDoubleDouble): boolean {
  return Number.isFinite(a.hi) && Number.isFinite(a.lo);
}

function special(v: number): IDoubleDouble {
  return { hi: v, lo: 0 };
}

/** Knuth's TwoSum: s + e = a + b exactly, s = fl(a + b). */
export function twoSum(a: number, b: number): IDoubleDouble {
  const s = a + b;
  if (!Number.isFinite(s)) {
    return special(s);
  }
  const bb = s - a;
  return { hi: s, lo: a - (s - bb) + (b - bb) };
}

/** Fast TwoSum, valid when |a| ≥ |b| (or a = 0): s + e = a + b exactly. */
export function quickTwoSum(a: number, b: number): IDoubleDouble {
  const s = a + b;
  if (!Number.isFinite(s)) {
    return special(s);
  }
  return { hi: s, lo: b - (s - a) };
}

/** Dekker's split of `a` into two 26-bit halves, hi + lo = a exactly. */
export function split(a: number): IDoubleDouble {
  if (a > SPLIT_THRESHOLD || a < -SPLIT_THRESHOLD) {
    const s = a * TWO_M28;
    const t = SPLITTER * s;
    const hi = t - (t - s);
    return { hi: hi * TWO_28, lo: (s - hi) * TWO_28 };
  }
  const t = SPLITTER * a;
  const hi = t - (t - a);
  return { hi, lo: a - hi };
}

/** Dekker's TwoProduct: p + e = a·b exactly (barring underflow), p = fl(a·b). */
export function twoProd(a: number, b: number): IDoubleDouble {
  const p = a * b;
  if (!Number.isFinite(p)) {
    return special(p);
  }
  const as = split(a);
  const bs = split(b);
  const err = as.hi * bs.hi - p + as.hi * bs.lo + as.lo * bs.hi + as.lo * bs.lo;
  return { hi: p, lo: err };
}

/** a + b (relative error ≲ 2⁻¹⁰⁴ barring cancellation of exact inputs). */
export function add(a: IDoubleDouble, b: IDoubleDouble): IDoubleDouble {
  const s = twoSum(a.hi, b.hi);
  if (!Number.isFinite(s.hi)) {
    return s;
  }
  const t = twoSum(a.lo, b.lo);
  let u = quickTwoSum(s.hi, s.lo + t.hi);
  u = quickTwoSum(u.hi, u.lo + t.lo);
  return u;
}

/** −a. */
export function neg(a: IDoubleDouble): IDoubleDouble {
  return { hi: -a.hi, lo: -a.lo };
}

/** a − b. */
export function sub(a: IDoubleDouble, b: IDoubleDouble): IDoubleDouble {
  return add(a, neg(b));
}

/** a · b. */
export function mul(a: IDoubleDouble, b: IDoubleDouble): IDoubleDouble {
  const p = twoProd(a.hi, b.hi);
  if (!Number.isFinite(p.hi)) {
    return p;
  }
  return quickTwoSum(p.hi, p.lo + (a.hi * b.lo + a.lo * b.hi));
}

/** a · b for a binary64 `b`. */
export function mulNumber(a: IDoubleDouble, b: number): IDoubleDouble {
  const p = twoProd(a.hi, b);
  if (!Number.isFinite(p.hi)) {
    return p;
  }
  return quickTwoSum(p.hi, p.lo + a.lo * b);
}

/** a · 2^k exactly (k integer, no overflow). */
export function scale2(a: IDoubleDouble, k: number): IDoubleDouble {
  const f = 2 ** k;
  return { hi: a.hi * f, lo: a.lo * f };
}

/** a / b (three quotient digits; ±∞ / NaN as in binary64 for b = 0). */
export function div(a: IDoubleDouble, b: IDoubleDouble): IDoubleDouble {
  const q1 = a.hi / b.hi;
  if (!Number.isFinite(q1)) {
    return special(q1);
  }
  let r = sub(a, mulNumber(b, q1));
  const q2 = r.hi / b.hi;
  r = sub(r, mulNumber(b, q2));
  const q3 = r.hi / b.hi;
  const q = quickTwoSum(q1, q2);
  return add(q, { hi: q3, lo: 0 });
}

/** a² (slightly cheaper than mul(a, a)). */
export function sqr(a: IDoubleDouble): IDoubleDouble {
  const p = twoProd(a.hi, a.hi);
  if (!Number.isFinite(p.hi)) {
    return p;
  }
  return quickTwoSum(p.hi, p.lo + 2 * a.hi * a.lo);
}

/** √a (NaN for a < 0, 0 for a = 0). */
export function sqrt(a: IDoubleDouble): IDoubleDouble {
  if (a.hi === 0) {
    return { hi: a.hi, lo: 0 };
  }
  if (!(a.hi > 0)) {
    return special(Number.NaN);
  }
  if (a.hi === Infinity) {
    return special(Infinity);
  }
  // Newton's correction of the binary64 root: s + (a − s²)/(2s), done in
  // double-double (one step doubles the number of correct digits).
  const s = { hi: Math.sqrt(a.hi), lo: 0 };
  const r = sub(a, sqr(s));
  return add(s, div(r, { hi: 2 * s.hi, lo: 0 }));
}

/** |a|. */
export function abs(a: IDoubleDouble): IDoubleDouble {
  return a.hi < 0 || (a.hi === 0 && a.lo < 0) ? neg(a) : a;
}

/** Sign comparison: negative when a < b, 0 when equal, positive when a > b (NaN if either is NaN). */
export function compare(a: IDoubleDouble, b: IDoubleDouble): number {
  if (a.hi !== b.hi) {
    return a.hi - b.hi;
  }
  return a.lo - b.lo;
}
