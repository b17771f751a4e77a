/**
 * Exact rational arithmetic with BigInt for checking double-double results
 * (test helper): binary64 numbers and decimal strings as fractions, and the
 * relative difference of a double-double from a fraction.
 */
import type { IDoubleDouble } from '../../../../src/core/numeric/dd/index';

/** num/den with den > 0. */
export interface IFraction {
  num: bigint;
  den: bigint;
}

/** A finite binary64 number as an exact fraction (den a power of two). */
export function fromDouble(v: number): IFraction {
  if (!Number.isFinite(v)) {
    throw new Error(`not finite: ${v}`);
  }
  let m = v;
  let e = 0;
  while (!Number.isInteger(m)) {
    m *= 2;
    e += 1;
  }
  return { num: BigInt(m), den: 1n << BigInt(e) };
}

/** A decimal string ("3.14", "-1.5E-3") as an exact fraction. */
export function fromDecimal(text: string): IFraction {
  const m = /^([-+]?)(\d*)\.?(\d*)(?:[eE]([-+]?\d+))?$/.exec(text.trim());
  if (!m) {
    throw new Error(`not a decimal: ${text}`);
  }
  const digits = BigInt(`${m[2]}${m[3]}` || '0') * (m[1] === '-' ? -1n : 1n);
  const exp = Number(m[4] ?? 0) - m[3].length;
  return exp >= 0 ? { num: digits * 10n ** BigInt(exp), den: 1n } : { num: digits, den: 10n ** BigInt(-exp) };
}

/** a + b. */
export function plus(a: IFraction, b: IFraction): IFraction {
  return { num: a.num * b.den + b.num * a.den, den: a.den * b.den };
}

/** a − b. */
export function minus(a: IFraction, b: IFraction): IFraction {
  return { num: a.num * b.den - b.num * a.den, den: a.den * b.den };
}

/** a · b. */
export function times(a: IFraction, b: IFraction): IFraction {
  return { num: a.num * b.num, den: a.den * b.den };
}

/** hi + lo exactly. */
export function fromDD(a: IDoubleDouble): IFraction {
  return plus(fromDouble(a.hi), fromDouble(a.lo));
}

/** a/b as a binary64 (both may be huge), via 60 significant digits of the quotient. */
export function ratio(a: bigint, b: bigint): number {
  if (b === 0n) {
    return a === 0n ? Number.NaN : Infinity;
  }
  const neg = a < 0n !== b < 0n;
  const x = a < 0n ? -a : a;
  const y = b < 0n ? -b : b;
  if (x === 0n) {
    return 0;
  }
  // Scale so that the integer quotient has ~60 digits.
  const shift = y.toString().length - x.toString().length + 60;
  const q = shift >= 0 ? (x * 10n ** BigInt(shift)) / y : x / (y * 10n ** BigInt(-shift));
  const v = Number(q) * 10 ** -shift;
  return neg ? -v : v;
}

/** Fraction → nearest binary64 (to about 1e-16 relative). */
export function toNumber(a: IFraction): number {
  return ratio(a.num, a.den);
}

/** |dd − ref| / |ref|, exactly evaluated then rounded. */
export function relativeError(a: IDoubleDouble, ref: IFraction): number {
  const d = minus(fromDD(a), ref);
  const num = d.num < 0n ? -d.num : d.num;
  const r = ref.num < 0n ? -ref.num : ref.num;
  return ratio(num * ref.den, r * d.den);
}

/** |dd − ref|, exactly evaluated then rounded. */
export function absoluteError(a: IDoubleDouble, ref: IFraction): number {
  const d = minus(fromDD(a), ref);
  return Math.abs(toNumber(d));
}
