/**
 * The field loop and the (T, h) phase diagram of a free energy typed by the
 * user, checked against the closed forms of the Landau 2-4-6 free energy
 * (src/core/physics/landau/phase-diagram.ts and paths.ts, themselves checked
 * against [C5 in REFERENCES.md] and equal-F invariants): typed as text, the
 * same free energy must give the same critical end point, wings, spinodals
 * and loop jumps, within the grids' resolution.
 */
import { describe, expect, it } from 'vitest';
import { compileFreeEnergy } from '../../../src/core/expr/index';
import { landauFieldLoop, landauPhaseDiagram } from '../../../src/core/physics/landau/index';
import { typedFieldLoop, typedLoopRange } from '../../../src/core/physics/landau/typed-loop';
import { typedPhaseDiagram } from '../../../src/core/physics/landau/typed-phase-diagram';
import { PhysicsInputError } from '../../../src/core/physics/errors';

const LANDAU = 'a/2*(T - T0)*ψ^2 + b/4*ψ^4 + c/6*ψ^6 - h*ψ';
// First-order example of [C5]: a = 0.5, b = −2, c = 4, T0 = 100 (T1 = 100.375, critical end points at T = 100.9).
const k = { a: 0.5, T0: 100, b: -2, c: 4, d: 0 };
const values = { a: k.a, T0: k.T0, b: k.b, c: k.c };

/** h of a line at T by linear interpolation (NaN outside it). */
function hAt(line: { T: number[]; h: number[] }, T: number): number {
  for (let i = 0; i + 1 < line.T.length; i++) {
    const [t0, t1] = [line.T[i], line.T[i + 1]];
    if ((T - t0) * (T - t1) <= 0 && t0 !== t1) {
      return line.h[i] + ((T - t0) / (t1 - t0)) * (line.h[i + 1] - line.h[i]);
    }
  }
  return Number.NaN;
}

describe('typed free energy: phase diagram in (T, h)', () => {
  const f = compileFreeEnergy(LANDAU);
  const typed = typedPhaseDiagram(f, values, { Tmin: 98, Tmax: 102, psiMax: 1.2, nT: 97, nPsi: 1601 });
  const exact = landauPhaseDiagram(k, { Tmin: 98, Tmax: 102 });

  it('should find the critical end points of the closed form (ψ² = 3|b|/10c, T = T0 + 9b²/20ac)', () => {
    const ends = typed.points.filter(p => p.kind === 'critical-end');
    const exactEnds = exact.points.filter(p => p.kind === 'critical-end');
    expect(exactEnds.length).toBe(2);
    expect(ends.length).toBe(2);
    for (const e of exactEnds) {
      const m = ends.find(p => Math.sign(p.h) === Math.sign(e.h))!;
      // T grid step 4/96 = 0.042; the end is extrapolated along width² ∝ (T_end − T)
      expect(Math.abs(m.T - e.T)).toBeLessThan(0.01);
      expect(Math.abs(m.h - e.h) / Math.abs(e.h)).toBeLessThan(0.005);
      expect(Math.abs(m.psi - e.psi)).toBeLessThan(0.01);
    }
    expect(typed.regime).toBe('first-order');
    // the default grids (65 × 801, drawn while sliders move) within 0.5 % in h
    const coarseAll = typedPhaseDiagram(f, values, { Tmin: 98, Tmax: 102, psiMax: 1.2 }).points;
    // one triple point even where the wings are first seen off h = 0; a wider T window (coarser step) too
    expect(coarseAll.filter(p => p.kind === 'triple').length).toBe(1);
    expect(typedPhaseDiagram(f, values, { Tmin: 60, Tmax: 110, psiMax: 2 }).points.filter(p => p.kind === 'triple').length).toBe(1);
    const coarse = coarseAll.filter(p => p.kind === 'critical-end');
    expect(coarse.length).toBe(2);
    for (const p of coarse) {
      expect(Math.abs(Math.abs(p.h) - exactEnds[0].h * Math.sign(exactEnds[0].h)) / Math.abs(exactEnds[0].h)).toBeLessThan(0.005);
      expect(Math.abs(p.T - 100.9)).toBeLessThan(0.01);
    }
    // three equal minima at T1 = 100.375 where the h = 0 line meets the wings (one grid step of T)
    const triple = typed.points.filter(p => p.kind === 'triple');
    expect(triple.length).toBe(1);
    expect(Math.abs(triple[0].T - 100.375)).toBeLessThan(0.042);
    expect(triple[0].h).toBe(0);
  });

  it('should follow the first-order wings and the spinodals of the closed form', () => {
    const wing = typed.lines.find(l => l.kind === 'first-order' && l.h.some(h => h > 1e-6))!;
    const exactWing = exact.lines.find(l => l.kind === 'first-order' && l.h.some(h => h > 1e-6))!;
    for (const T of [100.5, 100.7]) {
      const want = hAt(exactWing, T);
      expect(Math.abs(hAt(wing, T) - want) / want).toBeLessThan(0.02);
    }
    // below T1 the equal minima ±ψ sit at h = 0
    const zero = typed.lines.find(l => l.kind === 'first-order' && l.h.every(h => Math.abs(h) < 1e-9))!;
    expect(Math.min(...zero.T)).toBeLessThan(98.1);
    expect(Math.abs(Math.max(...zero.T) - 100.375)).toBeLessThan(0.05);
    // a spinodal's h at 99 K matches the closed form's line through the same T (largest |h| of the pair)
    const spin = (lines: { kind: string; T: number[]; h: number[] }[]) =>
      Math.max(...lines.filter(l => l.kind === 'spinodal').map(l => Math.abs(hAt(l, 99))).filter(Number.isFinite));
    expect(Math.abs(spin(typed.lines) - spin(exact.lines)) / spin(exact.lines)).toBeLessThan(0.02);
  });

  it('should call a continuous transition second order, with a critical point at Tc on h = 0', () => {
    const second = typedPhaseDiagram(f, { ...values, b: 1, c: 0 }, { Tmin: 95, Tmax: 105, psiMax: 4, nT: 97, nPsi: 1601 });
    expect(second.regime).toBe('second-order');
    const critical = second.points.filter(p => p.kind === 'critical');
    expect(critical.length).toBe(1);
    // Tc = T0 = 100 (T step 10/96 ≈ 0.1; the end extrapolated along width² ∝ Tc − T)
    expect(Math.abs(critical[0].T - 100)).toBeLessThan(0.01);
    expect(critical[0].h).toBe(0);
    expect(second.lines.filter(l => l.kind === 'second-order').length).toBe(1);
    expect(second.lines.filter(l => l.kind === 'first-order').length).toBe(0);
  });

  it('should refuse a field that does not enter as −hψ, and a bad range, in words', () => {
    expect(() => typedPhaseDiagram(compileFreeEnergy('a/2*(T - T0)*ψ^2 + b/4*ψ^4 - h^2*ψ'), { a: 1, T0: 100, b: 1 }, { Tmin: 90, Tmax: 110, psiMax: 3 })).toThrow(/field enters as −h·ψ/);
    expect(() => typedPhaseDiagram(f, values, { Tmin: 102, Tmax: 98, psiMax: 1 })).toThrow(PhysicsInputError);
    expect(() => typedPhaseDiagram(f, values, { Tmin: Number.NaN, Tmax: 98, psiMax: 1 })).toThrow(PhysicsInputError);
    expect(() => typedPhaseDiagram(f, values, { Tmin: 98, Tmax: 102, psiMax: 0 })).toThrow(PhysicsInputError);
  });
});

describe('typed free energy: field loop', () => {
  const f = compileFreeEnergy(LANDAU);

  it('should jump where the Landau form jumps (coercive field), both ways', () => {
    const T = 99;
    const hMax = 1.5;
    const n = 301;
    const typed = typedFieldLoop(f, values, T, hMax, n, 2);
    const exact = landauFieldLoop(k, T, hMax, n);
    expect(typed.points.length).toBe(exact.points.length);
    expect(typed.jumps.length).toBe(exact.jumps.length);
    expect(exact.jumps.length).toBe(2);
    typed.jumps.forEach((j, i) => {
      // same state of the same h grid
      expect(j.index).toBe(exact.jumps[i].index);
      expect(j.psiAfter).toBeCloseTo(exact.jumps[i].psiAfter, 6);
    });
    // ψ at every state agrees with the closed form
    const worst = Math.max(...typed.points.map((p, i) => Math.abs(p.psi - exact.points[i].psi)));
    expect(worst).toBeLessThan(1e-8);
  });

  it('should give the same loop when the field also enters otherwise (sampled anew at each field)', () => {
    // + e·h² does not depend on ψ: the same stationary points, but F − F(h = 0) is no longer −hψ
    const other = compileFreeEnergy(`${LANDAU} + e*h^2`);
    const T = 99;
    const a = typedFieldLoop(other, { ...values, e: 0.3 }, T, 1.5, 121, 2);
    const b = landauFieldLoop(k, T, 1.5, 121);
    expect(a.jumps.map(j => j.index)).toEqual(b.jumps.map(j => j.index));
    expect(Math.max(...a.points.map((p, i) => Math.abs(p.psi - b.points[i].psi)))).toBeLessThan(1e-8);
  });

  it('should reach past the coercive field with its default range, and give 0 where no minimum can end', () => {
    const T = 99;
    const range = typedLoopRange(f, values, T, 2);
    // the loop over that range jumps both ways, as the Landau form's does
    expect(typedFieldLoop(f, values, T, range, 161, 2).jumps.length).toBe(2);
    // far above the critical end points (100.9 K), at 110 K, F is convex on the range: no range of its own
    expect(typedLoopRange(f, values, 110, 2)).toBe(0);
  });

  it('should refuse a non-finite temperature or a field range of 0', () => {
    expect(() => typedFieldLoop(f, values, Number.POSITIVE_INFINITY, 1, 11, 2)).toThrow(PhysicsInputError);
    expect(() => typedFieldLoop(f, values, 99, 0, 11, 2)).toThrow(PhysicsInputError);
  });
});
