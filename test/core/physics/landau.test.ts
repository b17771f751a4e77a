import { describe, expect, it } from 'vitest';
import {
  landauDerived,
  landauTransitionNumeric,
  landauStationary,
  landauEquilibrium,
  landauDF,
  landauD2F,
  landauF,
  landauOrderParameterClosedForm,
  toConventionL,
  toNoFractions,
  toDevonshire,
  toGinzburgLandau,
  PhysicsInputError
} from '../../../src/core/physics/index';
import type { ILandauCoefficients } from '../../../src/core/physics/index';
import { mulberry32, rel } from './prng';

// [REFERENCE.md C5 first-order example, computed here: closed forms (mpmath 50 digits) and brute-force scipy 1.10.1]
const FIRST: ILandauCoefficients = { a: 0.5, b: -2, c: 4, T0: 100 };
// [REFERENCE.md C5 second-order example, computed here: closed forms]
const SECOND: ILandauCoefficients = { a: 0.5, b: 2, c: 0, T0: 100 };
// [REFERENCE.md C5 tricritical example, computed here: closed form]
const TRI: ILandauCoefficients = { a: 0.5, b: 0, c: 4, T0: 100 };

describe('Landau closed forms (REFERENCE.md C5, convention L)', () => {
  it('first-order example: T1, T**, jump, latent heat, chi, barrier, critical end point', () => {
    const d = landauDerived(FIRST);
    expect(d.convention).toBe('L');
    expect(d.regime).toBe('first-order');
    expect(d.Ttransition).toBeCloseTo(100.375, 12);
    expect(d.Tsuperheat).toBeCloseTo(100.5, 12);
    expect(rel(d.psiJump, 0.612372435695795)).toBeLessThan(1e-10); // 15 digits given
    expect(d.latentHeat).toBeCloseTo(9.41015625, 12);
    expect(d.inverseChiDisordered).toBeCloseTo(0.1875, 14);
    expect(d.inverseChiOrdered).toBeCloseTo(0.75, 14);
    expect(d.inverseChiSlopeOrdered / d.inverseChiSlopeDisordered).toBeCloseTo(-8, 14);
    expect(Math.abs(d.barrierPsi - 0.3535533906)).toBeLessThan(5e-11);
    expect(Math.abs(d.barrierHeight - 0.005208333333)).toBeLessThan(5e-13);
    expect(d.criticalEndPoint.T).toBeCloseTo(100.9, 12);
    expect(rel(d.criticalEndPoint.psi, 0.387298334620742)).toBeLessThan(1e-10);
    expect(rel(d.criticalEndPoint.h, 0.092951600308978)).toBeLessThan(1e-10);
    expect(d.psiOrderedAtT0).toBeCloseTo(0.707106781186548, 14);
    // numerical counterparts at T1 from the stationary points (C5 "Numerical" column)
    const at1 = landauStationary(FIRST, 100.375);
    const barrier = at1.points.find(p => p.kind === 'unstable' && p.psi > 0);
    expect(Math.abs((barrier?.psi ?? NaN) - 0.3535533906)).toBeLessThan(5e-11);
    expect(Math.abs((barrier?.F ?? NaN) - 0.005208333333)).toBeLessThan(5e-13);
    const ordered1 = at1.points.find(p => p.kind !== 'unstable' && p.psi > 0.5);
    expect(Math.abs((ordered1?.curvature ?? NaN) - 0.75)).toBeLessThan(5e-10);
    expect(Math.abs((at1.points.find(p => p.psi === 0)?.curvature ?? NaN) - 0.1875)).toBeLessThan(5e-11);
    // critical end point: the isotherm h(psi) has a horizontal inflection there, F″ = F‴ = 0
    const cp = d.criticalEndPoint;
    expect(Math.abs(landauD2F(FIRST, cp.T, cp.psi))).toBeLessThan(1e-13);
    expect(Math.abs(6 * FIRST.b * cp.psi + 20 * FIRST.c * cp.psi ** 3)).toBeLessThan(1e-13);
    expect(Math.abs(landauDF(FIRST, cp.T, 0, cp.psi) - cp.h)).toBeLessThan(1e-14);
    // psi at T** = sqrt(|b|/(2c)) = 0.5
    const r = landauStationary(FIRST, 100.5 - 1e-9);
    const ordered = r.points.filter(p => p.psi > 0.1 && p.kind !== 'unstable');
    expect(ordered.length).toBe(1);
    expect(Math.abs(ordered[0].psi - 0.5)).toBeLessThan(1e-4);
  });

  it('first-order example found numerically (no closed forms) agrees with the table', () => {
    const n = landauTransitionNumeric(FIRST);
    expect(n.converged).toBe(true);
    expect(n.firstOrder).toBe(true);
    expect(rel(n.Ttransition, 100.375)).toBeLessThan(1e-12);
    expect(rel(n.Tsuperheat, 100.5)).toBeLessThan(1e-12);
    expect(rel(n.psiJump, 0.612372435695795)).toBeLessThan(1e-9);
    expect(rel(n.latentHeat, 9.41015625)).toBeLessThan(1e-9);
    // latent heat by finite-differencing F_min(T) across T1 (entropy S = −dF/dT), as in the C5 "numerical" column
    const T1 = n.Ttransition;
    const e = 1e-5;
    const Fmin = (T: number): number => landauEquilibrium(FIRST, T).F;
    const sBelow = -(Fmin(T1 - e) - Fmin(T1 - 2 * e)) / e;
    const sAbove = -(Fmin(T1 + 2 * e) - Fmin(T1 + e)) / e;
    expect(rel(T1 * (sAbove - sBelow), 9.41015625)).toBeLessThan(1e-4);
    // d(1/chi)/dT on the ordered branch at T1 by finite difference: −8a vs +a (ratio −8)
    const chiInv = (T: number): number => {
      const r = landauStationary(FIRST, T);
      const p = r.points.filter(q => q.psi > 0.3 && q.kind !== 'unstable')[0];
      return p.curvature;
    };
    const slope = (chiInv(T1 + 1e-6) - chiInv(T1 - 1e-6)) / 2e-6;
    expect(Math.abs(slope / FIRST.a + 8)).toBeLessThan(1e-3);
  });

  it('second-order example: psi, chi ratio 2, dC, critical isotherm', () => {
    expect(landauEquilibrium(SECOND, 96).psi).toBeCloseTo(1, 14);
    expect(landauEquilibrium(SECOND, 99).psi).toBeCloseTo(0.5, 14);
    expect(landauEquilibrium(SECOND, 104).chi).toBeCloseTo(0.5, 14);
    expect(landauEquilibrium(SECOND, 96).chi).toBeCloseTo(0.25, 14);
    expect(landauDerived(SECOND).specificHeatJump).toBeCloseTo(6.25, 14);
    expect(landauEquilibrium(SECOND, 100, 0.016).psi).toBeCloseTo(0.2, 14);
    // dC numerically: C = −T d²F_min/dT² just below T0, zero above
    const T = 99.999;
    const hh = 1e-3;
    const F = (t: number): number => landauEquilibrium(SECOND, t).F;
    const C = (-T * (F(T + hh) - 2 * F(T) + F(T - hh))) / (hh * hh);
    expect(rel(C, 6.25 * (T / 100))).toBeLessThan(1e-6);
  });

  it('tricritical example: psi(92) = 1, psi(99) = 0.125^(1/4)', () => {
    expect(landauDerived(TRI).regime).toBe('tricritical');
    expect(landauEquilibrium(TRI, 92).psi).toBeCloseTo(1, 13);
    expect(rel(landauEquilibrium(TRI, 99).psi, 0.5946035575)).toBeLessThan(1e-10);
    expect(rel(landauOrderParameterClosedForm(TRI, 99), 0.5946035575)).toBeLessThan(1e-10);
  });

  it('convention-free ratios of REFERENCE.md C9 hold for random coefficients', () => {
    // [REFERENCE.md C9, computed here: exact rational arithmetic on the B3 closed forms]
    const u = mulberry32(42);
    for (let i = 0; i < 50; i++) {
      const k = { a: 0.1 + u() * 3, b: -(0.1 + u() * 5), c: 0.1 + u() * 5, T0: 50 + 500 * u() };
      const d = landauDerived(k);
      expect((d.Ttransition - k.T0) / (d.Tsuperheat - k.T0)).toBeCloseTo(0.75, 10);
      expect(d.inverseChiOrdered / d.inverseChiDisordered).toBeCloseTo(4, 10);
      expect(d.inverseChiSlopeOrdered / d.inverseChiSlopeDisordered).toBeCloseTo(-8, 10);
      expect((d.criticalEndPoint.T - k.T0) / (d.Tsuperheat - k.T0)).toBeCloseTo(9 / 5, 10);
      const n = landauTransitionNumeric(k);
      expect(rel(n.Ttransition - k.T0, d.Ttransition - k.T0)).toBeLessThan(1e-7);
    }
    const s = landauDerived(SECOND);
    expect(s.inverseChiSlopeOrdered / s.inverseChiSlopeDisordered).toBe(-2);
    expect(landauEquilibrium(SECOND, 103).chi / landauEquilibrium(SECOND, 97).chi).toBeCloseTo(2, 12);
  });
});

describe('Landau stationary points: invariants', () => {
  it('every minimum has F′ ≈ 0 and F″ > 0; the global minimum is never above a local one', () => {
    const u = mulberry32(7);
    let minima = 0;
    for (let i = 0; i < 400; i++) {
      const k: ILandauCoefficients = {
        a: 0.2 + 2 * u(),
        T0: 100,
        b: -3 + 6 * u(),
        c: 0.2 + 3 * u(),
        d: i % 3 === 0 ? -1 + 2 * u() : 0
      };
      const T = 97 + 6 * u();
      const h = i % 2 === 0 ? 0 : -0.3 + 0.6 * u();
      const r = landauStationary(k, T, h);
      expect(r.global).toBeGreaterThanOrEqual(0);
      const g = r.points[r.global];
      for (const p of r.points) {
        const scale = Math.abs(k.a * (T - k.T0) * p.psi) + Math.abs(k.b * p.psi ** 3) + Math.abs(k.c * p.psi ** 5) + Math.abs(h) + 1e-12;
        expect(Math.abs(landauDF(k, T, h, p.psi))).toBeLessThan(1e-11 * scale);
        expect(p.F).toBeCloseTo(landauF(k, T, h, p.psi), 14);
        if (p.kind === 'stable' || p.kind === 'metastable') {
          minima++;
          expect(landauD2F(k, T, p.psi)).toBeGreaterThan(0);
          expect(g.F).toBeLessThanOrEqual(p.F);
        }
        if (p.kind === 'unstable') {
          expect(landauD2F(k, T, p.psi)).toBeLessThan(0);
        }
      }
      // brute force: no grid point has lower F than the global minimum
      for (let j = 0; j <= 400; j++) {
        const psi = -2 + j * 0.01;
        expect(landauF(k, T, h, psi)).toBeGreaterThanOrEqual(g.F - 1e-12);
      }
      // minima and maxima alternate
      for (let j = 1; j < r.points.length; j++) {
        const a = r.points[j - 1].kind === 'unstable';
        const b = r.points[j].kind === 'unstable';
        expect(a !== b).toBe(true);
      }
    }
    expect(minima).toBeGreaterThan(400);
  });

  it('picks psi >= 0 on the symmetric tie at h = 0 and flags it', () => {
    const r = landauStationary(SECOND, 96);
    expect(r.degenerate).toBe(true);
    expect(r.points[r.global].psi).toBeCloseTo(1, 14);
    expect(r.convention).toBe('L');
  });

  it('handles T exactly at T0 (degenerate quartic minimum at 0)', () => {
    const r = landauStationary(SECOND, 100);
    expect(r.points.length).toBe(1);
    expect(r.points[0].psi).toBe(0);
    expect(r.points[0].kind).toBe('stable');
  });

  it('rejects unbounded or invalid coefficients and non-finite inputs', () => {
    expect(() => landauStationary({ a: 1, b: -1, c: 0, T0: 0 }, 1)).toThrow(PhysicsInputError);
    expect(() => landauStationary({ a: 1, b: 1, c: -1, T0: 0 }, 1)).toThrow(PhysicsInputError);
    expect(() => landauStationary({ a: -1, b: 1, c: 1, T0: 0 }, 1)).toThrow(PhysicsInputError);
    expect(() => landauStationary({ a: 1, b: 1, c: 1, T0: NaN }, 1)).toThrow(PhysicsInputError);
    expect(() => landauStationary(SECOND, NaN)).toThrow(PhysicsInputError);
    expect(() => landauStationary(SECOND, 1, Infinity)).toThrow(PhysicsInputError);
    expect(() => landauDerived({ ...FIRST, d: 1 })).toThrow(PhysicsInputError);
  });
});

describe('Landau conventions', () => {
  it('maps "no fractions" both ways and reproduces the B3 formulas T1 = T0 + B²/(4AC), T** = T0 + B²/(3AC)', () => {
    // [REFERENCE.md B3, "no fractions" row and the sentence below the table]
    const nf = { A: 0.7, B: -0.9, C: 1.3, T0: 50 };
    const L = toConventionL({ convention: 'no-fractions', coefficients: nf });
    expect(L).toEqual({ a: 1.4, b: -3.6, c: 7.800000000000001, T0: 50, d: 0 });
    const d = landauDerived(L);
    expect(rel(d.Ttransition - 50, (nf.B * nf.B) / (4 * nf.A * nf.C))).toBeLessThan(1e-14);
    expect(rel(d.Tsuperheat - 50, (nf.B * nf.B) / (3 * nf.A * nf.C))).toBeLessThan(1e-14);
    expect(rel(d.psiJump ** 2, Math.abs(nf.B) / (2 * nf.C))).toBeLessThan(1e-14);
    const back = toNoFractions(L);
    expect(back.A).toBeCloseTo(nf.A, 15);
    expect(back.B).toBeCloseTo(nf.B, 15);
    expect(back.C).toBeCloseTo(nf.C, 15);
  });

  it('maps Devonshire (a = 1/(eps0 C_CW), b = 4 alpha11, c = 6 alpha111) and Ginzburg–Landau (a = 2 alpha′, b = 2 beta)', () => {
    // [REFERENCE.md B3 table]
    const dv = { curieConstant: 1.5e5, T0: 400, alpha11: -2e7, alpha111: 3e8, eps0: 8.8541878128e-12 };
    const L = toConventionL({ convention: 'devonshire', coefficients: dv });
    expect(rel(L.a, 1 / (8.8541878128e-12 * 1.5e5))).toBeLessThan(1e-15);
    expect(L.b).toBe(-8e7);
    expect(L.c).toBe(1.8e9);
    const back = toDevonshire(L, dv.eps0);
    expect(rel(back.curieConstant, dv.curieConstant)).toBeLessThan(1e-14);
    const gl = toConventionL({ convention: 'ginzburg-landau', coefficients: { alphaPrime: 0.3, beta: 0.8, Tc: 9 } });
    expect(gl).toEqual({ a: 0.6, b: 1.6, c: 0, T0: 9, d: 0 });
    expect(toGinzburgLandau(gl)).toEqual({ alphaPrime: 0.3, Tc: 9, beta: 0.8 });
    // GL: |psi|² = alpha′(Tc − T)/beta and ΔC = Tc alpha′²/beta (REFERENCE.md B15)
    expect(landauEquilibrium(gl, 8).psi ** 2).toBeCloseTo((0.3 * 1) / 0.8, 14);
    expect(landauDerived(gl).specificHeatJump).toBeCloseTo((9 * 0.09) / 0.8, 14);
    expect(() => toGinzburgLandau(FIRST)).toThrow(PhysicsInputError);
  });
});

describe('Landau thermal response', () => {
  it('C = T a² psi²/F″ reproduces the B3 closed forms', async () => {
    const { landauThermal } = await import('../../../src/core/physics/index');
    // second order: C just below T0 → T a²/(2b) (REFERENCE.md C5: dC = 6.25 at T0 = 100)
    expect(rel(landauThermal(SECOND, 99.9999).specificHeat, (99.9999 * 0.25) / 4)).toBeLessThan(1e-12);
    expect(landauThermal(SECOND, 100.5).specificHeat).toBe(0);
    // tricritical: C = (T/4) sqrt(a³/(c (T0 − T))) (REFERENCE.md B3 iii)
    const T = 97;
    expect(rel(landauThermal(TRI, T).specificHeat, (T / 4) * Math.sqrt(0.125 / (4 * 3)))).toBeLessThan(1e-12);
    // entropy S − S0 = −(a/2) psi²; latent heat at T1 = T1 ΔS (REFERENCE.md C5: 9.41015625)
    const below = landauThermal(FIRST, 100.375 - 1e-12).entropy;
    const above = landauThermal(FIRST, 100.375 + 1e-9).entropy;
    expect(rel(100.375 * (above - below), 9.41015625)).toBeLessThan(1e-8);
  });

  it('Devonshire-convention coercive field (2√2/(3√3)) |alpha1|^(3/2)/√alpha11 (REFERENCE.md B12)', async () => {
    const { devonshireCoerciveField, toConventionL } = await import('../../../src/core/physics/index');
    const dv = { curieConstant: 1.2e5, T0: 400, alpha11: 3e8, alpha111: 0, eps0: 8.8541878128e-12 };
    const L = toConventionL({ convention: 'devonshire', coefficients: dv });
    const T = 350;
    const alpha1 = (T - dv.T0) / (2 * dv.eps0 * dv.curieConstant);
    const want = ((2 * Math.SQRT2) / (3 * Math.sqrt(3))) * Math.pow(Math.abs(alpha1), 1.5) / Math.sqrt(dv.alpha11);
    expect(rel(devonshireCoerciveField(L, T).Ec, want)).toBeLessThan(1e-12);
  });
});
