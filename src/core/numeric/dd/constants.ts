/**
 * Double-double constants: hi = the binary64 nearest the constant, lo = the
 * binary64 nearest the remainder (computed with 60-digit arithmetic; the
 * tests check them against the published digit sequences).
 */
import type { IDoubleDouble } from './core';
import { div } from './core';

/** π. */
export const DD_PI: IDoubleDouble = Object.freeze({ hi: 3.141592653589793, lo: 1.2246467991473532e-16 });
/** π/2. */
export const DD_HALF_PI: IDoubleDouble = Object.freeze({ hi: 1.5707963267948966, lo: 6.123233995736766e-17 });
/** ln 2. */
export const DD_LN2: IDoubleDouble = Object.freeze({ hi: 0.6931471805599453, lo: 2.3190468138462996e-17 });
/** e = exp(1). */
export const DD_E: IDoubleDouble = Object.freeze({ hi: 2.718281828459045, lo: 1.4456468917292502e-16 });
/** 1. */
export const DD_ONE: IDoubleDouble = Object.freeze({ hi: 1, lo: 0 });
/** 0. */
export const DD_ZERO: IDoubleDouble = Object.freeze({ hi: 0, lo: 0 });

/** 1/n! for n = 0 … 39, each to double-double precision (computed once by division). */
const INVERSE_FACTORIALS: readonly IDoubleDouble[] = (() => {
  const out: IDoubleDouble[] = [DD_ONE];
  for (let n = 1; n < 40; n++) {
    out.push(div(out[n - 1], { hi: n, lo: 0 }));
  }
  return out;
})();

/** 1/n! to double-double precision, for integers 0 ≤ n < 40 (series coefficients). */
export function inverseFactorial(n: number): IDoubleDouble {
  return INVERSE_FACTORIALS[n];
}
