/**
 * Isotherms from the Arrott–Noakes equation of state (REFERENCE.md B6) with
 * 3D Heisenberg exponents β = 0.3689, γ = 1.396 (C2, Campostrini et al.,
 * Phys. Rev. B 65, 144520 (2002)) and 0.1 % Gaussian noise on M (seeded).
 * Material constants Tc = 300 K, T1 = 5 K, M1 = 1e5 A/m are arbitrary.
 */
import { describe, expect, it } from 'vitest';
import { messageText } from '../../../src/core/messages';
import { bootstrapModifiedArrott, collapseCost, exponentWindowScan, globalEquationOfStateFit, modifiedArrottIteration, scalingCollapse, solveEquationOfState } from '../../../src/core/sweeps/index';
import { anField, anSet, linspace } from './generators';

const P = { Tc: 300, beta: 0.3689, gamma: 1.396, T1: 5, M1: 1e5 };
const Ts = linspace(285, 315, 31);
const Hs = linspace(1e3, 1e5, 200);

describe('Arrott–Noakes equation of state', () => {
  it('the implicit solver inverts the equation of state', () => {
    for (const [T, M] of [[290, 1.5e5], [300, 5e4], [310, 2e4]]) {
      const H = anField(P, T, M);
      expect(Number.isFinite(H)).toBe(true);
      const u = solveEquationOfState(Math.log(H), (T - P.Tc) / P.T1, Math.log(P.M1), P.beta, P.gamma, Math.log(M) + 3);
      expect(Math.exp(u)).toBeCloseTo(M, 6);
    }
  });

  for (const seed of [1, 3]) {
    it(`iteration from mean-field trial exponents: beta, gamma within 0.01, Tc within 0.1 % (seed ${seed})`, () => {
      const set = anSet(P, Ts, Hs, 1e-3, seed);
      const r = modifiedArrottIteration(set, { start: { beta: 0.5, gamma: 1 } });
      expect(r.converged).toBe(true);
      expect(Math.abs(r.beta.value - P.beta)).toBeLessThan(0.01);
      expect(Math.abs(r.gamma.value - P.gamma)).toBeLessThan(0.01);
      expect(Math.abs(r.Tc.value - P.Tc) / P.Tc).toBeLessThan(1e-3);
      expect(r.beta.sigma).toBeGreaterThan(0);
      expect(r.gamma.sigma).toBeGreaterThan(0);
      expect(messageText(r.conventions.t)).toContain('(T − Tc)/Tc');
    });

    it(`global fit of all points: beta, gamma within 0.01, Tc within 0.1 % (seed ${seed})`, () => {
      const set = anSet(P, Ts, Hs, 1e-3, seed);
      const g = globalEquationOfStateFit(set, { tMax: 0.05 });
      expect(g.converged).toBe(true);
      expect(Math.abs(g.beta.value - P.beta)).toBeLessThan(0.01);
      expect(Math.abs(g.gamma.value - P.gamma)).toBeLessThan(0.01);
      expect(Math.abs(g.Tc.value - P.Tc) / P.Tc).toBeLessThan(1e-3);
      expect(Math.abs(g.T1.value - P.T1) / P.T1).toBeLessThan(0.01);
      // σ from the covariance: the truth lies within 5 σ
      expect(Math.abs(g.beta.value - P.beta)).toBeLessThan(5 * g.beta.sigma);
      expect(Math.abs(g.delta.value - (1 + P.gamma / P.beta))).toBeLessThan(0.05);
      expect(g.warnings.some(w => w.code === 'sweeps.tc-beta-correlated')).toBe(true);
    });
  }

  it('noise-free data: the iteration is a fixed point at the true exponents', () => {
    const set = anSet(P, Ts, Hs, 0, 1);
    const r = modifiedArrottIteration(set, { start: { beta: 0.33, gamma: 1.25 } });
    expect(r.beta.value).toBeCloseTo(P.beta, 4);
    expect(r.gamma.value).toBeCloseTo(P.gamma, 4);
    expect(r.Tc.value).toBeCloseTo(P.Tc, 2);
  });

  it('scaling collapse: lower cost at the true exponents than at mean field; minimum near the truth', () => {
    const set = anSet(P, Ts, Hs, 1e-3, 2);
    const atTruth = collapseCost(set.isotherms, 300, P.beta, P.gamma).cost;
    const atMF = collapseCost(set.isotherms, 300, 0.5, 1).cost;
    expect(atTruth).toBeLessThan(atMF / 100);
    const c = scalingCollapse(set.isotherms, { Tc: 301, beta: 0.45, gamma: 1.2 });
    expect(c.converged).toBe(true);
    expect(c.cost).toBeLessThan(c.startCost);
    expect(Math.abs(c.beta.value - P.beta)).toBeLessThan(0.01);
    expect(Math.abs(c.gamma.value - P.gamma)).toBeLessThan(0.02);
    expect(Math.abs(c.Tc.value - P.Tc)).toBeLessThan(0.3);
    expect(c.Tc.sigma).toBeGreaterThan(0);
  });

  it('exponents against the window (t_max, H_min) with sigma for both methods', () => {
    const set = anSet(P, Ts, Hs, 1e-3, 4);
    const scan = exponentWindowScan(set, { tMaxs: [0.03, 0.05], hMins: [2e4, 5e4], methods: ['iteration', 'global'] });
    expect(scan.cells.length).toBe(8);
    for (const c of scan.cells) {
      expect(Number.isFinite(c.beta.sigma)).toBe(true);
      expect(Math.abs(c.beta.value - P.beta)).toBeLessThan(0.03);
      expect(Math.abs(c.gamma.value - P.gamma)).toBeLessThan(0.06);
      expect(Number.isFinite(c.deltaCriticalIsotherm.value)).toBe(true);
      if (c.method === 'iteration') {
        expect(Math.abs(c.kouvelFisherBeta.value - P.beta)).toBeLessThan(0.03);
        expect(c.kouvelFisherGamma.sigma).toBeGreaterThan(0);
      }
    }
    expect(() => exponentWindowScan(set, { tMaxs: [], hMins: [0] })).toThrow();
    expect(() => exponentWindowScan(set, { tMaxs: [-1], hMins: [0] })).toThrow();
  });

  it('bootstrap over isotherms: seeded, reproducible, spread comparable to the scatter of the estimate', () => {
    const set = anSet(P, Ts, Hs, 1e-3, 3);
    const a = bootstrapModifiedArrott(set, { samples: 12, seed: 9, start: { beta: 0.5, gamma: 1 } });
    const b = bootstrapModifiedArrott(set, { samples: 12, seed: 9, start: { beta: 0.5, gamma: 1 } });
    expect(a.beta).toEqual(b.beta);
    expect(a.failed).toBeLessThan(4);
    expect(a.beta.sd).toBeGreaterThan(0);
    expect(a.beta.sd).toBeLessThan(0.02);
    expect(Math.abs(a.beta.mean - P.beta)).toBeLessThan(0.015);
    expect(Math.abs(a.Tc.mean - P.Tc)).toBeLessThan(1);
    expect(() => bootstrapModifiedArrott(set, { samples: 1 })).toThrow();
  });
});

