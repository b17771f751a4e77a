/**
 * The explorer's pure helpers: slider ranges and steps, the opening
 * temperature, and convention fields and their conversion.
 */
import { describe, expect, it } from 'vitest';
import { CONVENTIONS, CONVENTION_FIELDS, coefficientsFrom, valuesIn } from '../../../src/ui/landau/fields';
import { coefficientRange, defaultTemperature, niceStep, snap, stateRanges, temperatureScale } from '../../../src/ui/landau/ranges';

/** First-order example of REFERENCE.md C5 [computed here]: a = 0.5, b = −2, c = 4, T0 = 100; T** − T0 = 0.5, h_cp = 0.092951600308978. */
const K = { a: 0.5, b: -2, c: 4, T0: 100, d: 0 };

describe('slider ranges', () => {
  it('should pick 1-2-5 steps', () => {
    expect(niceStep(2.5)).toBe(0.01);
    expect(niceStep(100)).toBe(0.5);
    expect(niceStep(8)).toBe(0.05);
    expect(niceStep(0)).toBe(1);
    expect(niceStep(Number.NaN)).toBe(1);
    expect(snap(100.37499999, 0.01)).toBe(100.37);
    expect(snap(0.1 + 0.2, 0.1)).toBe(0.3);
  });

  it('should span a coefficient by its sign and size', () => {
    expect(coefficientRange(0.5, 'positive')).toEqual({ min: 0.005, max: 1, step: 0.005 });
    expect(coefficientRange(4, 'non-negative')).toEqual({ min: 0, max: 8, step: 0.05 });
    expect(coefficientRange(-2, 'signed')).toEqual({ min: -4, max: 4, step: 0.05 });
    expect(coefficientRange(0, 'signed')).toEqual({ min: -2, max: 2, step: 0.02 });
    expect(coefficientRange(100, 'temperature')).toEqual({ min: 50, max: 150, step: 0.5 });
    expect(coefficientRange(Number.NaN, 'positive').max).toBe(2);
  });

  it('should centre T on T0 with a width set by T** − T0 and cover twice the critical end-point field', () => {
    // T** − T0 = 0.5 (C5): T from T0 − 2·0.5 to T0 + 3·0.5
    const r = stateRanges(K, 100.5, 0.092951600308978);
    expect(r.T.min).toBe(99);
    expect(r.T.max).toBe(101.5);
    expect(r.h.max).toBeGreaterThanOrEqual(2 * 0.092951600308978 - r.h.step);
    expect(r.h.min).toBe(-r.h.max);
    // continuous: b²/(4ac) with c > 0, else 1 % of T0
    expect(temperatureScale({ a: 0.5, b: 2, c: 4, T0: 100 }, 100)).toBeCloseTo(0.5, 15);
    expect(temperatureScale({ a: 0.5, b: 2, c: 0, T0: 300 }, 300)).toBe(3);
    expect(temperatureScale({ a: 0.5, b: 2, c: 0, T0: 0 }, 0)).toBe(1e-3);
  });
});

describe('opening temperature', () => {
  it('should open at T1 for a first-order transition, half a scale below T0 otherwise, T0 for bad coefficients', () => {
    // T1 = T0 + 3b²/(16ac) = 100.375 (C5)
    expect(defaultTemperature(K)).toBeCloseTo(100.375, 12);
    // second order: S = b²/(4ac) = 0.5, T0 − S/2
    expect(defaultTemperature({ a: 0.5, b: 2, c: 4, T0: 100 })).toBeCloseTo(99.75, 12);
    expect(defaultTemperature({ a: -1, b: 2, c: 4, T0: 100 })).toBe(100);
  });
});

describe('convention fields', () => {
  it('should round-trip every representable convention through the core conversions', () => {
    const second = { a: 0.5, b: 2, c: 0, T0: 100, d: 0 };
    for (const convention of CONVENTIONS) {
      const k = convention === 'ginzburg-landau' ? second : K;
      const values = valuesIn(k, convention);
      expect(Object.keys(values)).toEqual(CONVENTION_FIELDS[convention].map(f => f.key));
      const back = coefficientsFrom(convention, values);
      for (const name of ['a', 'b', 'c', 'T0'] as const) {
        expect(back[name]).toBeCloseTo(k[name], 12);
      }
    }
  });

  it('should refuse forms that cannot hold the coefficients', () => {
    expect(() => valuesIn(K, 'ginzburg-landau')).toThrow(/no sextic or cubic term/);
    expect(() => valuesIn({ ...K, d: 0.1 }, 'devonshire')).toThrow(/no cubic term/);
    expect(() => coefficientsFrom('devonshire', { curieConstant: -1, T0: 100, alpha11: 1, alpha111: 1 })).toThrow(/Curie constant of the Devonshire form must be above 0/);
  });
});
