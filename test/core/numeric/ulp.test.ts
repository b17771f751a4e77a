/**
 * ulp(v): the spacing of binary64 numbers at |v| (IEEE 754-2019 binary64:
 * 52 fraction bits, smallest subnormal 2⁻¹⁰⁷⁴, largest finite
 * (2 − 2⁻⁵²)·2¹⁰²³). Expected values follow from that format definition.
 */
import { describe, expect, it } from 'vitest';
import { ulp } from '../../../src/core/numeric/ulp';

describe('ulp', () => {
  it('gives 2^(e−52) for normal numbers with exponent e, either sign', () => {
    expect(ulp(1)).toBe(2 ** -52);
    expect(ulp(1.5)).toBe(2 ** -52);
    expect(ulp(2 - 2 ** -52)).toBe(2 ** -52);
    expect(ulp(2)).toBe(2 ** -51);
    expect(ulp(-3)).toBe(2 ** -51);
    expect(ulp(0.1)).toBe(2 ** -56);
    expect(ulp(1e300)).toBe(2 ** (Math.floor(Math.log2(1e300)) - 52));
    expect(ulp(Number.MAX_VALUE)).toBe(2 ** 971);
  });

  it('gives the subnormal spacing 2^−1074 at and below the smallest normal exponents, and at zero', () => {
    expect(ulp(0)).toBe(2 ** -1074);
    expect(ulp(-0)).toBe(2 ** -1074);
    expect(ulp(Number.MIN_VALUE)).toBe(2 ** -1074);
    expect(ulp(2 ** -1022)).toBe(2 ** -1074);
    expect(ulp(2 ** -1021)).toBe(2 ** -1073);
    // a result that is itself subnormal
    expect(ulp(2 ** -1000)).toBe(2 ** -1052);
  });

  it('is the distance to the next representable number', () => {
    for (const v of [1, 3.7, 12345.678, 6.02e23, 1.6e-19, 2 ** -1030]) {
      const next = v + ulp(v);
      expect(next).toBeGreaterThan(v);
      expect(v + ulp(v) / 4).toBe(v);
    }
  });

  it('passes infinities and NaN through', () => {
    expect(ulp(Infinity)).toBe(Infinity);
    expect(ulp(-Infinity)).toBe(Infinity);
    expect(ulp(Number.NaN)).toBeNaN();
  });
});
