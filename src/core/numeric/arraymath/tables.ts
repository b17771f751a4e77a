/**
 * Shared constants of the array exponential and logarithm: powers of two
 * for exact scaling, and the split of ln 2 whose high part times any
 * exponent in range is exact.
 */

/** `POW2[e + POW2_OFFSET]` = 2^e for every integer e in [−1074, 1023]. */
export const POW2_OFFSET = 1075;

/** Powers of two 2^−1074 … 2^1023 (each exact in binary64). */
export const POW2: Float64Array = (() => {
  const t = new Float64Array(2100);
  let v = 1;
  for (let e = 0; e <= 1023; e++) {
    t[e + POW2_OFFSET] = v;
    v *= 2;
  }
  v = 1;
  for (let e = 0; e >= -1074; e--) {
    t[e + POW2_OFFSET] = v;
    v *= 0.5;
  }
  return t;
})();

/**
 * ln 2 split as LN2_HI + LN2_LO, LN2_HI with 32 significant bits so that
 * k·LN2_HI is exact for |k| < 2^21 (the values used by fdlibm's exp and log,
 * which these are: 6.93147180369123816490e−01 and 1.90821492927058770002e−10).
 */
export const LN2_HI = 6.9314718036912381649e-1;
export const LN2_LO = 1.90821492927058770002e-10;

/** 1.5·2^52: adding and subtracting it rounds a double of magnitude < 2^51 to the nearest integer. */
export const ROUND_SHIFT = 6755399441055744;

/** True when typed arrays store the high word of a double second (every mainstream platform). */
export const LITTLE_ENDIAN: boolean = (() => {
  const f = new Float64Array([1]);
  return new Uint32Array(f.buffer)[1] === 0x3ff00000;
})();
