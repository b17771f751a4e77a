/**
 * Unit in the last place of binary64 `v` (the spacing at |v|; 2⁻¹⁰⁷⁴ for
 * subnormals and 0). Method: the biased exponent read from the bits of
 * |v| (IEEE 754 binary64: 11 exponent bits above 52 fraction bits), so
 * ulp = 2^(e − 1075) for a normal number with biased exponent e; exact.
 * Infinity and NaN give Infinity and NaN.
 */
const bits = new Float64Array(1);
const words = new Uint32Array(bits.buffer);
/** Index of the 32-bit word holding the sign and exponent (1 on little-endian machines). */
const HIGH = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1 ? 1 : 0;

export function ulp(v: number): number {
  bits[0] = v;
  const e = (words[HIGH] >>> 20) & 0x7ff;
  if (e === 0x7ff) {
    return v === v ? Infinity : Number.NaN;
  }
  if (e <= 1) {
    return 2 ** -1074;
  }
  // 2^(e − 1075) for e ≥ 2, built from its bits (exact, no Math.pow).
  words[HIGH] = (e - 52) << 20;
  words[1 - HIGH] = 0;
  return e - 52 >= 1 ? bits[0] : 2 ** (e - 1075);
}
