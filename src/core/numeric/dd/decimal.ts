/**
 * Exact conversion of decimal text to double-double with BigInt rational
 * arithmetic: hi = Number(text) (the binary64 nearest the decimal), lo =
 * the binary64 nearest the exact remainder text − hi.
 *
 * Accuracy: exact rational arithmetic, so hi is correctly rounded and
 * hi + lo is the decimal to within half an ulp of lo (≈ 1e-32 relative).
 */
import { CoreMessageError, msg } from '../../messages';
import type { ICoreMessage } from '../../messages';
import type { IDoubleDouble } from './core';

const DECIMAL = /^([-+]?)(\d+\.?\d*|\.\d+)(?:[eE]([-+]?\d+))?$/;

/** Error for text that is not a plain decimal number (code `numeric.not-a-decimal`). */
export class DecimalFormatError extends CoreMessageError {
  constructor(detail: ICoreMessage) {
    super(detail);
    this.name = 'DecimalFormatError';
  }
}

function bitLength(v: bigint): number {
  return v === 0n ? 0 : v.toString(2).length;
}

/**
 * The binary64 nearest the positive rational num/den (round half to even),
 * computed exactly (+∞ beyond the binary64 range).
 */
function nearestDouble(num: bigint, den: bigint): number {
  if (num === 0n) {
    return 0;
  }
  // Choose e so that q = num·2^(−e)/den has 53 significant bits (or fewer
  // for subnormals, where e is clamped to −1074).
  let e = Math.max(bitLength(num) - bitLength(den) - 53, -1074);
  let q: bigint;
  let rem: bigint;
  let d: bigint;
  for (;;) {
    const n = e >= 0 ? num : num << BigInt(-e);
    d = e >= 0 ? den << BigInt(e) : den;
    q = n / d;
    rem = n - q * d;
    if (q >= 1n << 53n) {
      e += 1;
    } else if (q < 1n << 52n && e > -1074) {
      e -= 1;
    } else {
      break;
    }
  }
  // Round half to even.
  const twice = rem * 2n;
  if (twice > d || (twice === d && (q & 1n) === 1n)) {
    q += 1n;
  }
  if (e > 971 || (e === 971 && q >= 1n << 53n)) {
    return Infinity;
  }
  return Number(q) * 2 ** e;
}

/** Exact rational value m·2^e as [num, den] (den a power of two when e < 0). */
function doubleAsRational(v: number): [bigint, bigint] {
  if (v === 0) {
    return [0n, 1n];
  }
  let e = 0;
  let m = Math.abs(v);
  // Scale to an integer mantissa exactly (powers of two are exact).
  while (!Number.isInteger(m)) {
    m *= 2;
    e -= 1;
  }
  const sign = v < 0 ? -1n : 1n;
  return e < 0 ? [sign * BigInt(m), 1n << BigInt(-e)] : [sign * BigInt(m), 1n];
}

/**
 * Exact decimal text (e.g. "2.5134E+00", "-0.05", "1e-3") → double-double
 * with hi = Number(text) and lo = the correctly rounded remainder, so that
 * hi + lo equals the decimal to about 2⁻¹⁰⁶ relative. Throws
 * `DecimalFormatError` for text that is not a finite decimal number; a
 * decimal beyond the binary64 range gives { hi: ±∞, lo: 0 }.
 */
export function decimalToDoubleDouble(text: string): IDoubleDouble {
  const m = DECIMAL.exec(typeof text === 'string' ? text.trim() : '');
  if (!m) {
    const shown = String(text);
    throw new DecimalFormatError(
      msg('numeric.not-a-decimal', '“%1” is not a decimal number such as 2.5, -0.05 or 1e-3.', shown.length > 40 ? `${shown.slice(0, 40)}…` : shown)
    );
  }
  const negative = m[1] === '-';
  const [intPart, fracPart = ''] = m[2].split('.');
  const exponent = (m[3] === undefined ? 0 : Number(m[3])) - fracPart.length;
  const digits = BigInt((intPart + fracPart).replace(/^0+(?=\d)/, '') || '0');
  let num: bigint;
  let den: bigint;
  if (exponent >= 0) {
    num = digits * 10n ** BigInt(exponent);
    den = 1n;
  } else {
    num = digits;
    den = 10n ** BigInt(-exponent);
  }
  const sign = negative ? -1 : 1;
  // Number() rounds correctly; it is the authority for hi.
  const hiAbs = Math.abs(Number(m[0]));
  if (!Number.isFinite(hiAbs)) {
    return { hi: sign * Infinity, lo: 0 };
  }
  // Remainder num/den − hi, exactly, then rounded to the nearest double.
  const [hn, hd] = doubleAsRational(hiAbs);
  const rn = num * hd - hn * den;
  const rd = den * hd;
  const loAbs = rn >= 0n ? nearestDouble(rn, rd) : -nearestDouble(-rn, rd);
  return { hi: sign * hiAbs, lo: sign * loAbs + 0 };
}
