/**
 * Exact J = ½ Weiss isotherms h = τ artanh(m) − m (REFERENCE.md B1, C3;
 * computed here by the repository's Weiss solver, itself checked against C3):
 * mean-field Tc = 1, β = ½, γ = 1, δ = 3 (B1, C2 mean-field row).
 */
import { describe, expect, it } from 'vitest';
import { messageText } from '../../../src/core/messages';
import { PHYS, solveWeiss } from '../../../src/core/physics/index';
import { analyseIsotherms, arrottAnalysis, criticalIsotherm, isothermSetFromArrays, kouvelFisher, magneticEntropyChange, modifiedArrottIteration } from '../../../src/core/sweeps/index';
import { linspace, weissSet } from './generators';

// fields low enough that the m^4 term of h/m = (τ−1) + τm²/3 + τm⁴/5 (B5) stays below the 1e-3 target
const taus = linspace(0.985, 1.015, 31);
const hs = linspace(1e-5, 2e-3, 200);
const set = weissSet(taus, hs);

describe('exact Weiss J = 1/2 isotherms', () => {
  it('the generator reproduces C3: (tau, m) = (1.1, 0.2) gives h = 0.023005809459', () => {
    const m = solveWeiss(0.5, [1.1], 0.023005809459).m[0];
    expect(m).toBeCloseTo(0.2, 10);
  });

  it('Arrott Tc = 1 within 1e-3, with Ms^2 and 1/chi0 on the right sides', () => {
    const a = arrottAnalysis(set);
    expect(Math.abs(a.Tc.value - 1)).toBeLessThan(1e-3);
    expect(a.Tc.sigma).toBeGreaterThanOrEqual(0);
    expect(a.spontaneousSquared.every(p => p.T < 1.001)).toBe(true);
    expect(a.inverseChi.every(p => p.T > 0.999)).toBe(true);
    // above Tc, 1/chi0 = (tau − 1) in reduced units (Curie–Weiss, B1), read off the Arrott intercept
    const p = a.inverseChi.find(q => Math.abs(q.T - 1.015) < 1e-9);
    expect(p?.value).toBeCloseTo(0.015, 3);
    expect(a.banerjee.negativeCount).toBe(0);
    expect(a.conventions.field).toBe('internal');
  });

  it('modified Arrott iteration from 3D Heisenberg trial exponents converges to beta = 1/2, gamma = 1 within 0.02', () => {
    const r = modifiedArrottIteration(set, { tMax: 0.015 });
    expect(r.converged).toBe(true);
    expect(r.history[0].beta).toBeCloseTo(0.3689, 4);
    expect(Math.abs(r.beta.value - 0.5)).toBeLessThan(0.02);
    expect(Math.abs(r.gamma.value - 1)).toBeLessThan(0.02);
    expect(Math.abs(r.Tc.value - 1)).toBeLessThan(1e-3);
    expect(Math.abs(r.deltaWidom.value - 3)).toBeLessThan(0.02);
    expect(r.beta.sigma).toBeGreaterThan(0);
  });

  it('Kouvel–Fisher on the iteration output gives beta = 1/2, gamma = 1 within 0.02 and Tc = 1', () => {
    const r = modifiedArrottIteration(set, { tMax: 0.015 });
    // plain derivatives of Ms and 1/chi0, and derivatives of the linearised Ms^(1/β), (1/chi0)^(1/γ)
    for (const kf of [kouvelFisher(r.spontaneous, r.inverseChi), kouvelFisher(r.spontaneous, r.inverseChi, 5, { below: 1 / r.beta.value, above: 1 / r.gamma.value })]) {
      expect(Math.abs(kf.below.exponent.value - 0.5)).toBeLessThan(0.02);
      expect(Math.abs(kf.above.exponent.value - 1)).toBeLessThan(0.02);
      expect(Math.abs(kf.Tc.value - 1)).toBeLessThan(1e-3);
      expect(kf.below.exponent.sigma).toBeGreaterThan(0);
      expect(messageText(kf.convention)).toContain('(T − Tc)/β');
    }
    const lin = kouvelFisher(r.spontaneous, r.inverseChi, 5, { below: 1 / r.beta.value, above: 1 / r.gamma.value });
    expect(Math.abs(1 + lin.above.exponent.value / lin.below.exponent.value - 3)).toBeLessThan(0.02);
    expect(() => kouvelFisher(r.spontaneous, r.inverseChi, 5, { below: 0, above: 1 })).toThrow();
  });

  it('critical isotherm at Tc gives delta = 3 within 0.02; Widom is reported', () => {
    const c = criticalIsotherm(set.isotherms, 1);
    expect(c.source).toBe('isotherm');
    expect(Math.abs(c.delta.value - 3)).toBeLessThan(0.02);
    // D of m = D h^(1/δ): b_J = 1/3 for J = 1/2 (C3) gives h ≈ m³/3, so D ≈ 3^(1/3)
    expect(c.D.value).toBeCloseTo(Math.cbrt(3), 1);
    const all = analyseIsotherms(set, { tMax: 0.015 });
    expect(all.checks.relations.map(r => r.relation)).toEqual(['Widom']);
    expect(all.checks.alphaFromRushbrooke).not.toBeNull();
    // Rushbrooke with the mean-field alpha = 0 (C2) when supplied
    const withAlpha = analyseIsotherms(set, { tMax: 0.015, alpha: { value: 0, error: 0.01 } });
    expect(withAlpha.checks.relations.map(r => r.relation)).toEqual(['Rushbrooke', 'Widom']);
    const rb = withAlpha.checks.relations[0];
    const m = withAlpha.modifiedArrott;
    expect(rb.deviation).toBeCloseTo(0 + 2 * m.beta.value + m.gamma.value - 2, 12);
    expect(Math.abs(rb.deviation)).toBeLessThan(0.05);
  });

  it('interpolating the critical isotherm between isotherms is flagged', () => {
    const c = criticalIsotherm(set.isotherms, 1.00125);
    expect(c.source).toBe('interpolated');
    expect(c.warnings.some(w => w.code === 'sweeps.critical.interpolated')).toBe(true);
  });

  it('too few isotherms and applied fields are warned about', () => {
    const two = weissSet([0.99, 1.01], hs);
    const r = arrottAnalysis(two);
    expect(r.warnings.some(w => w.code === 'sweeps.arrott.few-isotherms')).toBe(true);
    const applied = isothermSetFromArrays(set.isotherms.map(i => ({ T: i.T, H: i.H, M: i.M })), { fieldKind: 'applied' });
    expect(arrottAnalysis(applied).warnings.some(w => w.code === 'sweeps.demag-unset')).toBe(true);
    expect(modifiedArrottIteration(applied, { tMax: 0.015 }).warnings.some(w => w.code === 'sweeps.demag-unset')).toBe(true);
  });

  it('edge inputs: no isotherms and a one-point isotherm give flagged results, not throws', () => {
    const empty = isothermSetFromArrays([]);
    const a = arrottAnalysis(empty);
    expect(Number.isNaN(a.Tc.value)).toBe(true);
    expect(a.TcCrossing.converged).toBe(false);
    const m = modifiedArrottIteration(empty);
    expect(m.converged).toBe(false);
    const one = isothermSetFromArrays([{ T: 1, H: [0.01], M: [0.2] }, { T: 2, H: [0.01, NaN], M: [0.1, 0.2] }]);
    expect(arrottAnalysis(one).TcCrossing.converged).toBe(false);
    expect(Number.isNaN(criticalIsotherm([], 1).delta.value)).toBe(true);
  });
});

describe('magnetic entropy change from the Maxwell relation', () => {
  // SI Weiss magnet: N = 1e28 m^-3, g = 2, J = 1/2, Tc = 300 K; h = muB mu0 H/(kB Tc) (B1)
  const N = 1e28;
  const Tc = 300;
  const Ms = N * PHYS.muB;
  const toH = (h: number): number => (h * PHYS.kB * Tc) / (PHYS.muB * PHYS.mu0);
  // uniform steps plus fine low-field steps (near Tc, m ∝ h^(1/3) is steep at small h)
  const hGrid = [0, ...Array.from({ length: 30 }, (_v, i) => 1e-6 * Math.pow(10, (3 * i) / 30)), ...linspace(0.001, 0.05, 197)];
  const tauGrid = linspace(0.8, 1.2, 81);
  const mf = isothermSetFromArrays(
    tauGrid.map(tau => ({
      T: tau * Tc,
      H: hGrid.map(toH),
      M: Array.from(solveWeiss(0.5, new Float64Array(hGrid.length).fill(tau), Float64Array.from(hGrid)).m, m => m * Ms)
    }))
  );
  // closed-form mean-field entropy of spins ½: S/(N kB) = ln 2 − ((1+m)/2)ln(1+m) − ((1−m)/2)ln(1−m)
  // (standard two-level entropy; B1 gives the same free energy), so ΔS = N kB [S(m(τ,h)) − S(m(τ,0))]
  const S = (m: number): number => Math.LN2 - 0.5 * (1 + m) * Math.log1p(m) - 0.5 * (1 - m) * Math.log1p(-m);
  const dSexact = (tau: number, h: number): number => N * PHYS.kB * (S(solveWeiss(0.5, [tau], h).m[0]) - S(solveWeiss(0.5, [tau], 0).m[0]));
  /** Mean of the closed form over [τ1, τ2] (what a finite difference between isotherms estimates), Simpson, split at Tc. */
  const meanExact = (t1: number, t2: number, h: number): number => {
    const pieces = t1 < 1 && t2 > 1 ? [[t1, 1], [1, t2]] : [[t1, t2]];
    let sum = 0;
    for (const [a, b] of pieces) {
      const n = 40;
      const dx = (b - a) / n;
      let s = dSexact(a, h) + dSexact(b, h);
      for (let i = 1; i < n; i++) {
        s += (i % 2 === 1 ? 4 : 2) * dSexact(a + i * dx, h);
      }
      sum += (s * dx) / 3;
    }
    return sum / (t2 - t1);
  };

  it('matches the closed-form mean-field entropy difference within 1 %', () => {
    const r = magneticEntropyChange(mf, [toH(0.05), toH(0.02)]);
    expect(r.unit).toBe('J/(m^3 K)');
    for (const c of r.curves) {
      expect(c.points.length).toBe(80);
      expect(c.warnings).toEqual([]);
      const h = (c.deltaH * PHYS.mu0 * PHYS.muB) / (PHYS.kB * Tc);
      for (const p of c.points) {
        const tau = p.T / Tc;
        const exact = meanExact(tau - 0.0025, tau + 0.0025, h);
        expect(Math.abs(p.dS - exact) / Math.abs(exact)).toBeLessThan(0.01);
      }
      // the peak lies at Tc (within one isotherm step)
      expect(Math.abs((c.peak?.T ?? 0) / Tc - 1)).toBeLessThan(0.006);
    }
  });

  it('refrigerant capacity: RC = integral over the FWHM, RCP = peak x FWHM, and RC < RCP', () => {
    const r = magneticEntropyChange(mf, [toH(0.05)]);
    const c = r.curves[0];
    expect(c.fwhm).toBeGreaterThan(0);
    const [a, b] = c.halfMaximumAt as [number, number];
    expect(b - a).toBeCloseTo(c.fwhm, 12);
    expect(c.relativeCoolingPower).toBeCloseTo(Math.abs(c.peak?.dS ?? NaN) * c.fwhm, 6);
    expect(c.refrigerantCapacity).toBeGreaterThan(0.5 * c.relativeCoolingPower);
    expect(c.refrigerantCapacity).toBeLessThan(c.relativeCoolingPower);
    // independent trapezoid of |ΔS| between the half-maximum points
    const inside = c.points.filter(p => p.T > a && p.T < b);
    let rc = 0;
    for (let i = 0; i + 1 < inside.length; i++) {
      rc += 0.5 * (Math.abs(inside[i].dS) + Math.abs(inside[i + 1].dS)) * (inside[i + 1].T - inside[i].T);
    }
    expect(c.refrigerantCapacity).toBeGreaterThan(rc);
  });

  it('warns when isotherms stop short of the field change, and rejects bad field changes', () => {
    const r = magneticEntropyChange(mf, [toH(0.06)]);
    expect(r.curves[0].points.length).toBe(0);
    expect(r.curves[0].warnings.some(w => w.code === 'sweeps.entropy.short-isotherms')).toBe(true);
    expect(() => magneticEntropyChange(mf, [])).toThrow();
    expect(() => magneticEntropyChange(mf, [-1])).toThrow();
    expect(() => magneticEntropyChange(mf, [NaN])).toThrow();
  });
});
