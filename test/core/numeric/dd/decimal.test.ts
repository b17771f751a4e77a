/**
 * decimalToDoubleDouble: hi = Number(text), lo = the correctly rounded
 * remainder, checked exactly with BigInt fractions.
 */
import { describe, expect, it } from 'vitest';
import { DecimalFormatError, decimalToDoubleDouble } from '../../../../src/core/numeric/dd/index';
import { mulberry32 } from '../../../../src/core/numeric/random';
import { ulp } from '../../../../src/core/numeric/ulp';
import { fromDecimal, fromDouble, minus, relativeError, toNumber } from './exact';

/** Checks hi = Number(text) and that lo is the binary64 nearest to text − hi. */
function checkExact(text: string): void {
  const r = decimalToDoubleDouble(text);
  expect(r.hi, text).toBe(Number(text));
  const remainder = minus(fromDecimal(text), fromDouble(r.hi));
  const rest = Math.abs(toNumber(minus(remainder, fromDouble(r.lo))));
  // lo correctly rounded: the exact remainder lies within half an ulp of lo.
  expect(rest, text).toBeLessThanOrEqual((ulp(r.lo) / 2) * (1 + 1e-12));
  expect(Math.abs(r.lo), text).toBeLessThanOrEqual(ulp(r.hi) / 2);
}

describe('decimalToDoubleDouble', () => {
  it('"0.1": hi + lo equals 1/10 to better than 1e-32 relative (exact BigInt check)', () => {
    const r = decimalToDoubleDouble('0.1');
    expect(r.hi).toBe(0.1);
    expect(r.lo).not.toBe(0);
    expect(relativeError(r, fromDecimal('0.1'))).toBeLessThan(1e-32);
    checkExact('0.1');
  });

  it('NIST-style data strings and exponent forms', () => {
    for (const t of ['2.5134E+00', '2.044333373291E+00', '5.000000000000E-02', '0.05', '-0.05', '+3.75', '.5', '7.', '1e-3', '1E3', '123456789012345678901234567890', '9.9999999999999999999e22', '6.02214076E23', '-1.602176634e-19']) {
      checkExact(t);
    }
  });

  it('values exactly representable in binary64 have lo = 0', () => {
    for (const t of ['0', '1', '-2.5', '0.375', '1024', '1.5e3', '9007199254740993e0']) {
      const r = decimalToDoubleDouble(t);
      expect(r.hi).toBe(Number(t));
      if (t !== '9007199254740993e0') {
        expect(r.lo, t).toBe(0);
      } else {
        // 2⁵³ + 1: hi rounds to 2⁵³ (even), lo = 1 exactly.
        expect(r.lo).toBe(1);
      }
    }
  });

  it('random decimals with 12 to 25 significant digits (seeded) round exactly', () => {
    const rand = mulberry32(31);
    for (let i = 0; i < 300; i++) {
      const digits = 12 + Math.floor(rand() * 14);
      let mant = String(1 + Math.floor(rand() * 9));
      for (let d = 1; d < digits; d++) {
        mant += String(Math.floor(rand() * 10));
      }
      const exp = Math.floor((rand() - 0.5) * 80);
      checkExact(`${rand() < 0.5 ? '-' : ''}${mant[0]}.${mant.slice(1)}E${exp >= 0 ? '+' : ''}${exp}`);
    }
  });

  it('subnormal, overflowing and signed-zero inputs', () => {
    checkExact('1e-320');
    checkExact('4.9406564584124654e-324');
    expect(decimalToDoubleDouble('1e-400')).toEqual({ hi: 0, lo: 0 });
    expect(decimalToDoubleDouble('1e400')).toEqual({ hi: Infinity, lo: 0 });
    expect(decimalToDoubleDouble('-1e400')).toEqual({ hi: -Infinity, lo: 0 });
    expect(Object.is(decimalToDoubleDouble('-0').hi, -0)).toBe(true);
    expect(Object.is(decimalToDoubleDouble('-0.1').lo, 5.551115123125783e-18)).toBe(true);
  });

  it('rejects text that is not a decimal number', () => {
    for (const t of ['', 'abc', '1.2.3', 'NaN', 'Infinity', '0x10', '1e', '--1', '1,5']) {
      expect(() => decimalToDoubleDouble(t), t).toThrow(DecimalFormatError);
    }
    let caught: unknown = null;
    try {
      decimalToDoubleDouble('1,5');
    } catch (e) {
      caught = e;
    }
    expect((caught as DecimalFormatError).name).toBe('DecimalFormatError');
    expect((caught as DecimalFormatError).detail.code).toBe('numeric.not-a-decimal');
    expect((caught as Error).message).toBe('“1,5” is not a decimal number such as 2.5, -0.05 or 1e-3.');
  });
});
