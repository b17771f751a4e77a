/**
 * |x|^a over whole arrays as exp(a·log|x|) with the array logarithm and
 * exponential. Relative error ≤ (2 + 2|a·log|x||) ulp: the absolute error
 * of the logarithm is amplified by the exponent, as in any exp-log power
 * (≈ 7 ulp for |x| = 1e−6, a = 0.5). |x| = 0 gives 0 for a > 0, 1 for
 * a = 0 and ∞ for a < 0.
 */
import { expArray } from './exp';
import { logArray } from './log';

/**
 * Writes |x[i]|^a into out[i] for i < n, and log|x[i]| into `logOut` when
 * given (derivatives with respect to the exponent need it). `out` may be `x`.
 */
export function powAbsArray(
  x: Float64Array,
  a: number,
  out: Float64Array,
  n: number = x.length,
  logOut?: Float64Array
): void {
  const lg = logOut ?? out;
  for (let i = 0; i < n; i++) {
    lg[i] = Math.abs(x[i]);
  }
  logArray(lg, lg, n);
  for (let i = 0; i < n; i++) {
    // 0·(−∞) would give NaN for a = 0: |x|^0 = 1
    out[i] = a === 0 ? 0 : a * lg[i];
  }
  expArray(out, out, n);
}
