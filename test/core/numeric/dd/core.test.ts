/**
 * Double-double core operations: error-free transformations checked
 * exactly with BigInt fractions, compound operations against √2 and
 * round trips, and edge inputs.
 */
import { describe, expect, it } from 'vitest';
import * as DD from '../../../../src/core/numeric/dd/index';
import { mulberry32 } from '../../../../src/core/numeric/random';
import { absoluteError, fromDD, fromDecimal, fromDouble, plus, relativeError, times } from './exact';

/** √2 to 50 decimals: OEIS A002193 (decimal expansion of the square root of 2). */
const SQRT2 = '1.41421356237309504880168872420969807856967187537694';

function same(a: { num: bigint; den: bigint }, b: { num: bigint; den: bigint }): boolean {
  return a.num * b.den === b.num * a.den;
}

/** Random doubles over many binades, both signs (seeded). */
function randomDoubles(seed: number, count: number, span = 40): number[] {
  const rand = mulberry32(seed);
  return Array.from({ length: count }, () => (rand() < 0.5 ? -1 : 1) * (1 + rand()) * 2 ** Math.round((rand() - 0.5) * span));
}

describe('error-free transformations', () => {
  it('twoSum: s + e equals a + b exactly and s = fl(a + b)', () => {
    const xs = randomDoubles(1, 400);
    for (let i = 0; i + 1 < xs.length; i += 2) {
      const [a, b] = [xs[i], xs[i + 1]];
      const r = DD.twoSum(a, b);
      expect(r.hi).toBe(a + b);
      expect(same(fromDD(r), plus(fromDouble(a), fromDouble(b)))).toBe(true);
    }
  });

  it('twoProd: p + e equals a·b exactly, also above the splitting overflow threshold', () => {
    const xs = randomDoubles(2, 400);
    const pairs: [number, number][] = [];
    for (let i = 0; i + 1 < xs.length; i += 2) {
      pairs.push([xs[i], xs[i + 1]]);
    }
    // |a| > 6.7e299 takes the scaled split.
    pairs.push([1.2345678901234567e300, 3.3333333333333335e-10], [-9.87654321e305, 1.0000000000000002e-300]);
    for (const [a, b] of pairs) {
      const r = DD.twoProd(a, b);
      expect(r.hi).toBe(a * b);
      expect(same(fromDD(r), times(fromDouble(a), fromDouble(b))), `${a}·${b}`).toBe(true);
    }
  });

  it('split: hi + lo = a exactly with hi of at most 26 significant bits', () => {
    for (const a of [...randomDoubles(3, 100), 1e308, -7e299]) {
      const s = DD.split(a);
      expect(s.hi + s.lo).toBe(a);
      // hi·2^k is an integer below 2^27 for the k that brings it into [2^26, 2^27).
      const k = 26 - Math.floor(Math.log2(Math.abs(s.hi)));
      expect(Number.isInteger(s.hi * 2 ** k) && Math.abs(s.hi * 2 ** k) < 2 ** 27).toBe(true);
    }
  });
});

describe('compound operations', () => {
  it('√2 agrees with OEIS A002193 to 1e-31', () => {
    expect(relativeError(DD.sqrt(DD.dd(2)), fromDecimal(SQRT2))).toBeLessThan(1e-31);
  });

  it('add and sub are accurate to ~1e-32 of the operands (exact check)', () => {
    const xs = randomDoubles(4, 200, 10);
    for (let i = 0; i + 3 < xs.length; i += 4) {
      const a = DD.dd(xs[i], xs[i + 1] * 1e-17);
      const b = DD.dd(xs[i + 2], xs[i + 3] * 1e-17);
      const exactSum = plus(fromDD(a), fromDD(b));
      const s = DD.add(a, b);
      const scale = Math.abs(a.hi) + Math.abs(b.hi);
      expect(absoluteError(s, exactSum) / scale).toBeLessThan(1e-31);
      expect(DD.toNumber(DD.sub(DD.add(a, b), b))).toBeCloseTo(DD.toNumber(a), 14);
    }
  });

  it('mul and div: exact-product error ≤ 1e-31 and (a/b)·b = a to 1e-31', () => {
    const xs = randomDoubles(5, 200, 20);
    for (let i = 0; i + 3 < xs.length; i += 4) {
      const a = DD.dd(xs[i], xs[i + 1] * 1e-17);
      const b = DD.dd(xs[i + 2], xs[i + 3] * 1e-17);
      expect(relativeError(DD.mul(a, b), times(fromDD(a), fromDD(b)))).toBeLessThan(1e-31);
      expect(relativeError(DD.mul(DD.div(a, b), b), fromDD(a))).toBeLessThan(1e-31);
      expect(relativeError(DD.sqr(a), times(fromDD(a), fromDD(a)))).toBeLessThan(1e-31);
    }
  });

  it('sqrt(x)² = x to 1e-31 over many binades', () => {
    for (const v of randomDoubles(6, 100, 200).map(Math.abs)) {
      const a = DD.dd(v, v * 3e-17);
      expect(relativeError(DD.sqr(DD.sqrt(a)), fromDD(a))).toBeLessThan(1e-31);
    }
  });

  it('results are normalised: |lo| ≤ ulp(hi)/2', () => {
    const xs = randomDoubles(7, 100, 10);
    for (let i = 0; i + 1 < xs.length; i += 2) {
      for (const r of [DD.add(DD.dd(xs[i]), DD.dd(xs[i + 1])), DD.div(DD.dd(xs[i]), DD.dd(xs[i + 1])), DD.sqrt(DD.dd(Math.abs(xs[i])))]) {
        expect(r.hi + r.lo).toBe(r.hi);
      }
    }
  });
});

describe('edge inputs', () => {
  it('NaN and ±∞ propagate like binary64', () => {
    const nan = DD.dd(Number.NaN);
    const inf = DD.dd(Infinity);
    expect(DD.add(nan, DD.DD_ONE).hi).toBeNaN();
    expect(DD.mul(inf, DD.dd(2)).hi).toBe(Infinity);
    expect(DD.add(inf, DD.dd(-Infinity)).hi).toBeNaN();
    expect(DD.div(DD.DD_ONE, DD.DD_ZERO).hi).toBe(Infinity);
    expect(DD.div(DD.dd(-1), DD.DD_ZERO).hi).toBe(-Infinity);
    expect(DD.div(DD.DD_ZERO, DD.DD_ZERO).hi).toBeNaN();
    expect(DD.mul(DD.dd(1e200), DD.dd(1e200)).hi).toBe(Infinity);
    expect(DD.isFiniteDD(DD.mul(DD.dd(1e200), DD.dd(1e200)))).toBe(false);
  });

  it('sqrt of 0, of a negative number, of ∞', () => {
    expect(DD.sqrt(DD.DD_ZERO)).toEqual({ hi: 0, lo: 0 });
    expect(DD.sqrt(DD.dd(-1)).hi).toBeNaN();
    expect(DD.sqrt(DD.dd(Infinity)).hi).toBe(Infinity);
    expect(DD.sqrt(DD.dd(Number.NaN)).hi).toBeNaN();
  });

  it('compare, abs and neg', () => {
    expect(DD.compare(DD.dd(1, 1e-20), DD.dd(1, 2e-20))).toBeLessThan(0);
    expect(DD.compare(DD.dd(2), DD.dd(1, 1e-17))).toBeGreaterThan(0);
    expect(DD.compare(DD.dd(1, 1e-20), DD.dd(1, 1e-20))).toBe(0);
    expect(DD.abs(DD.dd(-3, 1e-17))).toEqual({ hi: 3, lo: -1e-17 });
    expect(DD.neg(DD.dd(3, 1e-17))).toEqual({ hi: -3, lo: -1e-17 });
  });
});
