/**
 * Unit in the last place of binary64 `v` (the spacing at |v|; 2⁻¹⁰⁷⁴ for
 * subnormals and 0). Method: the exponent from Math.log2, corrected by
 * exact comparisons with powers of two; the result is exact.
 */
export function ulp(v: number): number {
  const a = Math.abs(v);
  if (a < 2 ** -1022) {
    return 2 ** -1074;
  }
  let e = Math.floor(Math.log2(a));
  if (2 ** e > a) {
    e -= 1;
  } else if (2 ** (e + 1) <= a) {
    e += 1;
  }
  return 2 ** (e - 52);
}
