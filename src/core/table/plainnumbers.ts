/**
 * Reading a decimal number straight from a stretch of text, without making
 * a string of it: the hot path of large all-numeric CSV/TSV files.
 *
 * Accepted: [-]digits[.digits][(e|E)[+|-]digits] with at least one digit
 * before the exponent — text for which `readNumber` returns `+text`. Anything
 * else (spaces, '+', other minus signs, missing-value markers …) is left to
 * the caller, which reads the cell as a string the ordinary way.
 *
 * Method: Clinger's fast path (W. D. Clinger, "How to read floating point
 * numbers accurately", PLDI 1990; from memory): a significand of at most 15
 * digits is an exact double, and so is 10^k for |k| ≤ 22, so one IEEE
 * multiplication or division gives the correctly rounded value, the same
 * double as `Number(text)`. Longer significands or larger exponents go
 * through `Number` on the slice.
 */

/** 10^k, k = 0 … 22 (all exact in binary64). */
const POW10 = Float64Array.from({ length: 23 }, (_, k) => Number(`1e${k}`));

/** Result of {@link readPlainNumber}: the value, and whether the text had a decimal point. */
export interface IPlainNumber {
  value: number;
  point: boolean;
}

/**
 * The number written in text[start, end) when it is a plain decimal (see
 * above), else undefined. `out` is reused and returned.
 */
export function readPlainNumber(text: string, start: number, end: number, out: IPlainNumber): IPlainNumber | undefined {
  let i = start;
  if (i >= end) {
    return undefined;
  }
  let negative = false;
  if (text.charCodeAt(i) === 45) {
    negative = true;
    i++;
  }
  let significand = 0;
  let digits = 0; // significant digits taken into `significand`
  let anyDigit = false;
  let scale = 0; // decimal exponent correction
  let point = false;
  let c = 0;
  for (; i < end; i++) {
    c = text.charCodeAt(i);
    if (c >= 48 && c <= 57) {
      anyDigit = true;
      if (digits > 0 || c !== 48) {
        significand = significand * 10 + (c - 48);
        digits++;
      }
      if (point) {
        scale--;
      }
    } else if (c === 46 && !point) {
      point = true;
    } else {
      break;
    }
  }
  if (!anyDigit) {
    return undefined;
  }
  let exponent = 0;
  if (i < end) {
    if (c !== 101 && c !== 69) {
      return undefined;
    }
    i++;
    let expNegative = false;
    if (i < end && (text.charCodeAt(i) === 45 || text.charCodeAt(i) === 43)) {
      expNegative = text.charCodeAt(i) === 45;
      i++;
    }
    if (i >= end) {
      return undefined;
    }
    for (; i < end; i++) {
      c = text.charCodeAt(i);
      if (c < 48 || c > 57) {
        return undefined;
      }
      if (exponent < 100000) {
        exponent = exponent * 10 + (c - 48);
      }
    }
    if (expNegative) {
      exponent = -exponent;
    }
  }
  out.point = point;
  const e10 = exponent + scale;
  let value: number;
  if (digits <= 15 && e10 >= -22 && e10 <= 22) {
    value = e10 >= 0 ? significand * POW10[e10] : significand / POW10[-e10];
    if (digits === 0) {
      value = 0;
    }
  } else {
    value = +text.slice(negative ? start + 1 : start, end);
  }
  out.value = negative ? -value : value;
  return out;
}
