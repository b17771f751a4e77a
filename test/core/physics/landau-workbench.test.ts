/**
 * The landscape workbench's numerics: the (T, h) phase diagram of the 2-4-6
 * free energy, the two-order-parameter landscape on a grid, and free
 * energies typed by the user.
 */
import { describe, expect, it } from 'vitest';
import { ExpressionError, compileFreeEnergy, typedErrorText } from '../../../src/core/expr/index';
import {
  coupledLandscape,
  landauF,
  landauPhaseDiagram,
  phaseDiagramClosedForms,
  stationaryPoints,
  typedStationary,
  wingAt
} from '../../../src/core/physics/landau/index';

/** First-order example of [C5 in REFERENCES.md]: a = 0.5, b = −2, c = 4, T0 = 100. */
const K = { a: 0.5, b: -2, c: 4, T0: 100, d: 0 };

describe('phase diagram in (T, h)', () => {
  it('should start the first-order wings at T1 and the spinodals at T0 and T** on h = 0 (closed forms of [B3], values of [C5])', () => {
    const pd = landauPhaseDiagram(K, { Tmin: 98, Tmax: 102 });
    const cf = phaseDiagramClosedForms(K);
    // [C5]: T1 = 100.375, T** = 100.5, critical end point (100.9, 0.387298334620742, 0.092951600308978)
    expect(cf.T1).toBeCloseTo(100.375, 12);
    expect(cf.Tsuperheat).toBeCloseTo(100.5, 12);
    expect(cf.Tcp).toBeCloseTo(100.9, 12);
    expect(cf.psiCp).toBeCloseTo(0.387298334620742, 12);
    expect(cf.hCp).toBeCloseTo(0.092951600308978, 12);
    const wing = pd.lines.find(l => l.id === 'wing-up')!;
    expect(wing.T[0]).toBeCloseTo(100.375, 12);
    expect(wing.h[0]).toBe(0);
    expect(wing.T[wing.T.length - 1]).toBeCloseTo(100.9, 12);
    expect(wing.h[wing.h.length - 1]).toBeCloseTo(0.092951600308978, 12);
    // spinodals cross h = 0 at T0 (ψ = 0) and at T** (ψ² = |b|/(2c))
    const small = pd.lines.find(l => l.id === 'spinodal-small-up')!;
    expect(small.T[0]).toBeCloseTo(100, 12);
    expect(small.h[0]).toBe(0);
    const large = pd.lines.find(l => l.id === 'spinodal-large-up')!;
    let crossing = Number.NaN;
    for (let i = 1; i < large.h.length; i++) {
      if (large.h[i - 1] > 0 && large.h[i] <= 0) {
        const t = large.h[i - 1] / (large.h[i - 1] - large.h[i]);
        crossing = large.T[i - 1] + t * (large.T[i] - large.T[i - 1]);
      }
    }
    expect(crossing).toBeCloseTo(100.5, 3);
    expect(pd.points.filter(p => p.kind === 'critical-end')).toHaveLength(2);
    expect(pd.points.find(p => p.kind === 'triple')!.T).toBeCloseTo(100.375, 12);
  });

  it('should put two minima of equal F on both sides of every point of a wing (invariant)', () => {
    for (const T of [100.4, 100.6, 100.8, 100.89]) {
      const w = wingAt(K, T)!;
      expect(w).not.toBeNull();
      const Flow = landauF(K, T, w.h, w.psiLow);
      const Fhigh = landauF(K, T, w.h, w.psiHigh);
      expect(Math.abs(Fhigh - Flow)).toBeLessThan(1e-12);
      expect(w.psiHigh - w.psiLow).toBeGreaterThan(1e-3);
      // both are minima of the full landscape there, and the global ones just below / above the line
      const below = stationaryPoints(K, T, w.h * (1 - 1e-6));
      const above = stationaryPoints(K, T, w.h * (1 + 1e-6));
      expect(below.points[below.global].psi).toBeCloseTo(w.psiLow, 3);
      expect(above.points[above.global].psi).toBeCloseTo(w.psiHigh, 3);
    }
    // the wing leaves (T1, 0) and the jump vanishes at the critical end point
    expect(wingAt(K, 100.376)!.h).toBeLessThan(1e-3);
    expect(wingAt(K, 101)).toBeNull();
  });

  it('should lose or gain a minimum across every spinodal point (F′ = F″ = 0: a saddle-node, invariant)', () => {
    const pd = landauPhaseDiagram(K, { Tmin: 98, Tmax: 102, n: 40 });
    const minima = (T: number, h: number): number => stationaryPoints(K, T, h).points.filter(p => p.kind === 'stable' || p.kind === 'metastable').length;
    let checked = 0;
    for (const line of pd.lines.filter(l => l.kind === 'spinodal')) {
      for (let i = 0; i < line.T.length; i++) {
        const T = line.T[i];
        const h = line.h[i];
        // skip h = 0 (the pitchfork at T0) and the cusp, where two saddle-nodes meet
        if (Math.abs(h) < 1e-6 || Math.abs(T - 100.9) < 0.02) {
          continue;
        }
        const dh = 1e-7 * Math.max(1, Math.abs(h));
        expect(Math.abs(minima(T, h + dh) - minima(T, h - dh))).toBe(1);
        checked++;
      }
    }
    expect(checked).toBeGreaterThan(50);
  });

  it('should end the h = 0 line at Tc = T0 for b ≥ 0 (second order, [B3 i])', () => {
    const pd = landauPhaseDiagram({ a: 0.5, b: 2, c: 0, T0: 100 }, { Tmin: 95, Tmax: 105 });
    expect(pd.regime).toBe('second-order');
    const zero = pd.lines.find(l => l.kind === 'second-order')!;
    expect(zero.T).toEqual([95, 100]);
    expect(pd.points).toEqual([{ kind: 'critical', T: 100, h: 0, psi: 0 }]);
    // the spinodal in h below Tc is the intrinsic coercive field E_c = (2/(3√3)) [a(T0 − T)]^{3/2}/√b [B12]
    const up = pd.lines.find(l => l.id === 'spinodal-up')!;
    const i = up.T.findIndex(t => t < 96.0001);
    expect(i).toBeGreaterThan(0);
    const T = up.T[i];
    const Ec = ((2 / (3 * Math.sqrt(3))) * Math.pow(0.5 * (100 - T), 1.5)) / Math.sqrt(2);
    expect(Math.abs(up.h[i])).toBeCloseTo(Ec, 10);
    expect(landauPhaseDiagram({ a: 0.5, b: 0, c: 4, T0: 100 }, { Tmin: 95, Tmax: 105 }).points[0].kind).toBe('tricritical');
  });

  it('should refuse a cubic term and an empty window', () => {
    expect(() => landauPhaseDiagram({ ...K, d: 0.3 }, { Tmin: 98, Tmax: 102 })).toThrow(/cubic/);
    expect(() => landauPhaseDiagram(K, { Tmin: 102, Tmax: 98 })).toThrow(/Tmax/);
  });

  it('should have no non-finite number anywhere', () => {
    const pd = landauPhaseDiagram(K, { Tmin: 90, Tmax: 110 });
    for (const l of pd.lines) {
      expect([...l.T, ...l.h].every(Number.isFinite)).toBe(true);
    }
  });
});

/** Biquadratic coupling, each order parameter in convention L. */
const C = { a1: 1, T1: 100, b1: 1, a2: 1, T2: 90, b2: 1, lambda: 0.5 };

describe('coupled landscape on a grid', () => {
  it('should match F on the grid and name the phase with its minima', () => {
    const L = coupledLandscape(C, 95);
    expect(L.n).toBe(200);
    expect(L.F.length).toBe(40000);
    // F at an arbitrary grid node, written out
    const i = 37;
    const j = 151;
    const p = L.psi[i];
    const q = L.phi[j];
    const F = 0.5 * (95 - 100) * p * p + 0.25 * p ** 4 + 0.5 * (95 - 90) * q * q + 0.25 * q ** 4 + 0.25 * p * p * q * q;
    expect(L.F[j * 200 + i]).toBeCloseTo(F, 12);
    // ψ only below T1 = 100 and above T2: u = −A1/b1 = 5 [coupled.ts]
    expect(L.phase).toBe('psi');
    expect(L.minima.map(m => [m.psi, m.phi])).toEqual([
      [Math.sqrt(5), 0],
      [-Math.sqrt(5), 0]
    ]);
    expect(L.minima.every(m => m.global)).toBe(true);
    // the grid's lowest value is no lower than the exact minimum
    expect(L.Fmin).toBeGreaterThanOrEqual(L.minima[0].F - 1e-12);
  });

  it('should find both order parameters at low T with weak coupling, and neither above both', () => {
    expect(coupledLandscape(C, 70).phase).toBe('mixed');
    expect(coupledLandscape(C, 70).minima).toHaveLength(4);
    const hot = coupledLandscape(C, 110);
    expect(hot.phase).toBe('disordered');
    expect(hot.minima).toEqual([{ psi: 0, phi: 0, F: 0, phase: 'disordered', global: true }]);
    // strong coupling (λ² > b1 b2): no mixed minimum, φ only when its minimum is lower
    expect(coupledLandscape({ ...C, lambda: 2, T2: 99.5 }, 70).phase).not.toBe('mixed');
  });
});

describe('free energy typed by the user', () => {
  it('should find the stationary points of the 2-4-6 form as the Landau numerics do', () => {
    const f = compileFreeEnergy('a/2*(T - T0)*ψ^2 + b/4*ψ^4 + c/6*ψ^6 - h*ψ');
    expect(f.coefficients).toEqual(['a', 'T0', 'b', 'c']);
    const values = { a: 0.5, T0: 100, b: -2, c: 4 };
    for (const [T, h] of [
      [99, 0],
      [100.375, 0],
      [100.2, 0.01],
      [102, 0.05]
    ]) {
      const typed = typedStationary(f, T, h, values, { psiMax: 3 });
      const exact = stationaryPoints(K, T, h);
      expect(typed.points.map(p => p.kind)).toEqual(exact.points.map(p => p.kind));
      typed.points.forEach((p, i) => expect(p.psi).toBeCloseTo(exact.points[i].psi, 10));
      expect(typed.global >= 0 ? typed.points[typed.global].F : NaN).toBeCloseTo(exact.points[exact.global].F, 12);
    }
  });

  it('should take psi as the order parameter and functions with symbolic derivatives', () => {
    const f = compileFreeEnergy('F = A*(T - Tc)*psi^2 + B*psi^4 + w*cosh(psi) - h*psi');
    expect(f.coefficients).toEqual(['A', 'Tc', 'B', 'w']);
    const r = typedStationary(f, 90, 0, { A: 1, Tc: 100, B: 1, w: 0 }, { psiMax: 5 });
    // A(T − Tc) = −10, B = 1: ψ² = 10/2 = 5
    expect(r.points.filter(p => p.kind === 'stable').map(p => p.psi)).toEqual([expect.closeTo(-Math.sqrt(5), 10), expect.closeTo(Math.sqrt(5), 10)]);
  });

  it('should say in words, with a caret, what is wrong', () => {
    expect(() => compileFreeEnergy('a*T^2')).toThrow(/order parameter/);
    try {
      compileFreeEnergy('a*ψ^2 + (b*ψ^4');
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(ExpressionError);
      const err = e as ExpressionError;
      const text = typedErrorText('a*ψ^2 + (b*ψ^4', err.message, err.position);
      expect(text).toContain('^');
      expect(text.split('\n')[1]).toBe('a*ψ^2 + (b*ψ^4');
    }
  });
});
