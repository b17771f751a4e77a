/**
 * The explorer's pure helpers: slider ranges and steps, convention fields and
 * their conversion, degenerate minima, and the derived values with a cubic term.
 */
import { describe, expect, it } from 'vitest';
import { landauTransitionNumeric } from '../../../src/core/physics/landau/index';
import { branchesData, explorerDerived, stationaryPoints } from '../../../src/ui/landau/compute';
import { CONVENTIONS, CONVENTION_FIELDS, coefficientsFrom, valuesIn } from '../../../src/ui/landau/fields';
import { coefficientRange, niceStep, snap, stateRanges, temperatureScale } from '../../../src/ui/landau/ranges';

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
    expect(() => coefficientsFrom('devonshire', { curieConstant: -1, T0: 100, alpha11: 1, alpha111: 1 })).toThrow(/curieConstant must be > 0/);
  });
});

describe('explorer computations', () => {
  it('should call every minimum as low as the global one stable (±ψ at h = 0; three minima at T1)', () => {
    expect(stationaryPoints(K, 99, 0).points.map(p => p.kind)).toEqual(['stable', 'unstable', 'stable']);
    // at T1 = 100.375 (C5) the three minima have equal F
    expect(stationaryPoints(K, 100.375, 0).points.map(p => p.kind)).toEqual(['stable', 'unstable', 'stable', 'unstable', 'stable']);
    // a field lifts the degeneracy
    expect(stationaryPoints(K, 99, 0.01).points.map(p => p.kind)).toEqual(['metastable', 'unstable', 'stable']);
  });

  it('should take the cubic-term transition from the core numerics and find the barrier between the minima', () => {
    const k = { ...K, d: 0.3 };
    const d = explorerDerived(k);
    const n = landauTransitionNumeric(k);
    expect(d.method).toBe('numeric');
    expect(d.T1).toBe(n.Ttransition);
    expect(d.Tsuperheat).toBe(n.Tsuperheat);
    expect(d.barrierHeight!).toBeGreaterThan(0);
    // with d > 0 the term (d/3)ψ³ lowers F at ψ < 0: the ordered minimum and the barrier before it lie there
    expect(d.barrierPsi!).toBeLessThan(0);
    expect(Math.abs(d.barrierPsi!)).toBeLessThan(d.psiJump!);
  });

  it('should give the closed-form barrier at T1 for d = 0 (REFERENCE.md C5: ψ_b = 0.3535533906, F_b = 0.005208333333)', () => {
    const d = explorerDerived(K);
    expect(d.barrierPsi!).toBeCloseTo(0.3535533906, 9);
    expect(d.barrierHeight!).toBeCloseTo(0.005208333333, 11);
  });

  it('should bound the ψ range of the charts by the largest stationary ψ', () => {
    const b = branchesData(K, 99, 101.5, 0, 51);
    // largest |ψ| at T = 99: ψ² = (|b| + √(b² + 4ac(T0 − T)))/(2c) (B3 ii) = (2 + √12)/8
    expect(b.psiMax).toBeCloseTo(Math.sqrt((2 + Math.sqrt(12)) / 8), 9);
    expect(b.heating.jumps).toHaveLength(1);
    expect(b.cooling.jumps).toHaveLength(1);
  });
});
