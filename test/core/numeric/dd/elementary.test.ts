/**
 * exp, expm1, log and pow in double-double: published constants, identities
 * and inverse round trips at ~1e-30, edge inputs.
 */
import { describe, expect, it } from 'vitest';
import * as DD from '../../../../src/core/numeric/dd/index';
import { mulberry32 } from '../../../../src/core/numeric/random';
import { fromDD, fromDecimal, relativeError } from './exact';

/** e to 50 decimals: OEIS A001113 (decimal expansion of e). */
const E = '2.71828182845904523536028747135266249775724709369995';
/** ln 2 to 50 decimals: OEIS A002162 (decimal expansion of the natural logarithm of 2). */
const LN2 = '0.69314718055994530941723212145817656807550013436025';
/** √2 to 50 decimals: OEIS A002193. */
const SQRT2 = '1.41421356237309504880168872420969807856967187537694';

function sample(seed: number, count: number, lo: number, hi: number): DD.IDoubleDouble[] {
  const rand = mulberry32(seed);
  return Array.from({ length: count }, () => DD.dd(lo + (hi - lo) * rand(), (rand() - 0.5) * 1e-17));
}

describe('published constants', () => {
  it('exp(1) = e (OEIS A001113) and the DD_E constant', () => {
    expect(relativeError(DD.exp(DD.DD_ONE), fromDecimal(E))).toBeLessThan(1e-31);
    expect(relativeError(DD.DD_E, fromDecimal(E))).toBeLessThan(1e-32);
  });

  it('log(2) = ln 2 (OEIS A002162) and the DD_LN2 constant', () => {
    expect(relativeError(DD.log(DD.dd(2)), fromDecimal(LN2))).toBeLessThan(1e-31);
    expect(relativeError(DD.DD_LN2, fromDecimal(LN2))).toBeLessThan(1e-32);
  });

  it('pow(2, 1/2) = √2 (OEIS A002193) through exp(b·log a)', () => {
    expect(relativeError(DD.pow(DD.dd(2), DD.dd(0.5)), fromDecimal(SQRT2))).toBeLessThan(1e-30);
  });
});

describe('identities and round trips', () => {
  it('log(exp(x)) = x and exp(log(y)) = y to 1e-30', () => {
    for (const x of sample(11, 60, -50, 50)) {
      if (Math.abs(x.hi) > 1e-3) {
        expect(relativeError(DD.log(DD.exp(x)), fromDD(x))).toBeLessThan(1e-30);
      }
    }
    for (const y of sample(12, 60, 1e-3, 1e3)) {
      expect(relativeError(DD.exp(DD.log(y)), fromDD(y))).toBeLessThan(1e-30);
    }
  });

  it('exp(a + b) = exp(a)·exp(b) to 1e-30', () => {
    const xs = sample(13, 80, -20, 20);
    for (let i = 0; i + 1 < xs.length; i += 2) {
      const lhs = DD.exp(DD.add(xs[i], xs[i + 1]));
      expect(relativeError(lhs, fromDD(DD.mul(DD.exp(xs[i]), DD.exp(xs[i + 1]))))).toBeLessThan(1e-30);
    }
  });

  it('exp far out keeps ~1e-30 while the low part stays normal (exp(650)·exp(−650) = 1)', () => {
    const p = DD.exp(DD.dd(650));
    const m = DD.exp(DD.dd(-650));
    expect(relativeError(DD.mul(p, m), fromDD(DD.DD_ONE))).toBeLessThan(1e-29);
  });

  it('expm1 is accurate in relative terms for small arguments and matches exp − 1 elsewhere', () => {
    // expm1(t) = t + t²/2 + t³/6 + … ; for t = 2⁻⁴⁰ the terms are exact fractions.
    const t = 2 ** -40;
    const series = fromDD(DD.add(DD.add(DD.dd(t), DD.dd(t * t / 2)), DD.div(DD.dd(t * t * t), DD.dd(6))));
    expect(relativeError(DD.expm1(DD.dd(t)), series)).toBeLessThan(1e-30);
    for (const x of sample(14, 20, -5, 5)) {
      expect(relativeError(DD.expm1(x), fromDD(DD.sub(DD.exp(x), DD.DD_ONE)))).toBeLessThan(1e-29);
    }
  });

  it('integer powers equal repeated multiplication; negative powers their reciprocals', () => {
    for (const a of sample(15, 10, 0.5, 2)) {
      let prod: DD.IDoubleDouble = DD.DD_ONE;
      for (let n = 1; n <= 13; n++) {
        prod = DD.mul(prod, a);
        expect(relativeError(DD.pow(a, DD.dd(n)), fromDD(prod))).toBeLessThan(1e-30);
        expect(relativeError(DD.mul(DD.powInt(a, -n), prod), fromDD(DD.DD_ONE))).toBeLessThan(1e-30);
      }
    }
  });

  it('general powers invert: (a^(−1/3))^(−3) = a', () => {
    const third = DD.div(DD.dd(-1), DD.dd(3));
    for (const a of sample(16, 30, 0.01, 100)) {
      expect(relativeError(DD.powInt(DD.pow(a, third), -3), fromDD(a))).toBeLessThan(1e-29);
    }
  });
});

describe('edge inputs', () => {
  it('log of 0, negative, ∞ and NaN', () => {
    expect(DD.log(DD.DD_ZERO).hi).toBe(-Infinity);
    expect(DD.log(DD.dd(-1)).hi).toBeNaN();
    expect(DD.log(DD.dd(Infinity)).hi).toBe(Infinity);
    expect(DD.log(DD.dd(Number.NaN)).hi).toBeNaN();
    expect(DD.log(DD.DD_ONE)).toEqual({ hi: 0, lo: 0 });
  });

  it('exp overflow, underflow, ±∞ and NaN', () => {
    expect(DD.exp(DD.dd(710)).hi).toBe(Infinity);
    expect(DD.exp(DD.dd(-746)).hi).toBe(0);
    expect(DD.exp(DD.dd(Infinity)).hi).toBe(Infinity);
    expect(DD.exp(DD.dd(-Infinity)).hi).toBe(0);
    expect(DD.exp(DD.dd(Number.NaN)).hi).toBeNaN();
    expect(DD.exp(DD.DD_ZERO)).toEqual({ hi: 1, lo: 0 });
  });

  it('pow: zero base, negative base, x⁰', () => {
    expect(DD.pow(DD.DD_ZERO, DD.dd(2)).hi).toBe(0);
    expect(DD.pow(DD.DD_ZERO, DD.dd(-1)).hi).toBe(Infinity);
    expect(DD.pow(DD.DD_ZERO, DD.dd(0.5)).hi).toBe(0);
    expect(DD.pow(DD.DD_ZERO, DD.dd(-0.5)).hi).toBe(Infinity);
    expect(DD.pow(DD.dd(-8), DD.div(DD.DD_ONE, DD.dd(3))).hi).toBeNaN();
    expect(DD.toNumber(DD.pow(DD.dd(-2), DD.dd(3)))).toBe(-8);
    expect(DD.pow(DD.dd(Number.NaN), DD.DD_ZERO)).toEqual({ hi: 1, lo: 0 });
    expect(DD.powInt(DD.dd(2), 0.5).hi).toBeNaN();
  });
});
