/**
 * What the Landau explorer draws (src/core/physics/landau/explorer.ts):
 * degenerate minima, the derived values with a cubic term, the closed-form
 * barrier and the ψ range of the branches.
 */
import { describe, expect, it } from 'vitest';
import { branchesData, explorerDerived, landauTransitionNumeric, stationaryPoints } from '../../../src/core/physics/landau/index';

/** First-order example of [C5 in REFERENCES.md]: a = 0.5, b = −2, c = 4, T0 = 100. */
const K = { a: 0.5, b: -2, c: 4, T0: 100, d: 0 };

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
