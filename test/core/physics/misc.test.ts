import { describe, expect, it } from 'vitest';
import {
  ISING2D_TC,
  ising2dMagnetisation,
  meanFieldIsingTc,
  referenceCurve,
  curiePrefactor,
  effectiveMoment,
  freeIonMoment,
  fitCurieWeiss,
  R_GAS,
  PHYS,
  PhysicsInputError
} from '../../../src/core/physics/index';
import { normal, rel } from './prng';

describe('exact 2D Ising (REFERENCE.md C1)', () => {
  it('Onsager Tc: kB Tc/J = 2.2691853142130219681 and J/(kB Tc) = 0.44068679350977151262', () => {
    // [REFERENCE.md C1, computed here: mpmath 1.2.1, 40 digits; formula from L. Onsager, Phys. Rev. 65, 117 (1944)]
    expect(rel(ISING2D_TC, 2.2691853142130219681)).toBeLessThan(1e-15);
    expect(rel(1 / ISING2D_TC, 0.44068679350977151262)).toBeLessThan(1e-15);
    expect(Math.sinh(2 / ISING2D_TC)).toBeCloseTo(1, 15);
  });

  it("Yang's M(T) table", () => {
    // [REFERENCE.md C1, computed here: mpmath 1.2.1 40-digit arithmetic; formula C. N. Yang, Phys. Rev. 85, 808 (1952)]
    // kB T/J given to 12 digits; M to 15 digits: compare M at the exact T = (T/Tc)·Tc to 1e-10 relative
    const rows: [number, number, number][] = [
      [0.5, 1.13459265711, 0.998033391692164],
      [0.8, 1.81534825137, 0.95441041190749],
      [0.9, 2.04226678279, 0.895937537079965],
      [0.95, 2.1557260485, 0.831099423459838],
      [0.99, 2.24649346107, 0.685860425733879]
    ];
    for (const [tt, kT, M] of rows) {
      expect(Math.abs(tt * ISING2D_TC - kT)).toBeLessThan(5e-12);
      expect(rel(ising2dMagnetisation(tt * ISING2D_TC), M)).toBeLessThan(1e-10);
    }
    expect(rel(ising2dMagnetisation(1.0), 0.999275751957061)).toBeLessThan(1e-10);
    expect(rel(ising2dMagnetisation(2.0), 0.911319377877496)).toBeLessThan(1e-10);
    expect(rel(ising2dMagnetisation(2.2), 0.784755131383922)).toBeLessThan(1e-10);
    expect(ising2dMagnetisation(ISING2D_TC)).toBe(0);
    expect(ising2dMagnetisation(3)).toBe(0);
    expect(() => ising2dMagnetisation(0)).toThrow(PhysicsInputError);
  });

  it('mean field overestimates Tc by 76 % on the square lattice (REFERENCE.md C1, C9)', () => {
    // [REFERENCE.md C1: "kB Tc = 4J, an overestimate of 76 %"]
    expect(Math.round((meanFieldIsingTc(4) / ISING2D_TC - 1) * 100)).toBe(76);
  });

  it('reference curves', () => {
    const tau = [0.5, 0.9, 0.99, 1.2];
    const w = referenceCurve('weiss', tau, 0.5);
    expect(rel(w.m[0], 0.9575040240773)).toBeLessThan(1e-10); // REFERENCE.md C3
    expect(referenceCurve('landau-mean-field', tau).m[1]).toBeCloseTo(Math.sqrt(0.1), 15);
    expect(referenceCurve('tricritical', tau).m[1]).toBeCloseTo(Math.pow(0.1, 0.25), 15);
    expect(rel(referenceCurve('ising-2d', tau).m[2], 0.685860425733879)).toBeLessThan(1e-10); // REFERENCE.md C1
    expect(referenceCurve('ising-2d', tau).m[3]).toBe(0);
    expect(() => referenceCurve('weiss', [0])).toThrow(PhysicsInputError);
  });
});

describe('Curie–Weiss and effective moments (REFERENCE.md B2, C4, C7)', () => {
  it('prefactors: C_mol = 0.125049365 p² (cgs), p = 2.82786878 sqrt(C) = 797.727056 sqrt(C_SI)', () => {
    // [REFERENCE.md C7, computed here: N_A muB²/(3 kB), CODATA 2018, scipy 1.10.1 + mpmath 1.2.1]; 9 digits given
    expect(Math.abs(curiePrefactor('cgs-emu') - 0.125049365)).toBeLessThan(5e-10);
    expect(Math.abs(1 / Math.sqrt(curiePrefactor('cgs-emu')) - 2.82786878)).toBeLessThan(5e-9);
    expect(Math.abs(1 / Math.sqrt(curiePrefactor('SI')) - 797.727056)).toBeLessThan(5e-7);
  });

  it('Gd3+ free ion: p_eff = sqrt(63) = 7.93725393319, C_mol = 7.878110 (cgs) and 9.899925e-5 (SI)', () => {
    // [REFERENCE.md C4, computed here: mpmath 1.2.1, CODATA 2018 via scipy 1.10.1]
    const p = freeIonMoment(2, 3.5);
    expect(Math.abs(p - 7.93725393319)).toBeLessThan(5e-12);
    expect(Math.abs(curiePrefactor('cgs-emu') * 63 - 7.87811)).toBeLessThan(5e-7);
    expect(Math.abs(curiePrefactor('SI') * 63 - 9.899925e-5)).toBeLessThan(5e-12);
    expect(rel(effectiveMoment(7.87811, 'cgs-emu').pEff, p)).toBeLessThan(1e-7);
    expect(rel(effectiveMoment(9.899925e-5, 'SI').pEff, p)).toBeLessThan(1e-7);
    // two ions per formula unit: p per ion = 2.8279 sqrt(C/n)
    expect(rel(effectiveMoment(2 * 7.87811, 'cgs-emu', 2).pEff, p)).toBeLessThan(1e-7);
    // free-electron g_e: p_eff = 7.946458
    expect(Math.abs(freeIonMoment(2.00231930436, 3.5) - 7.946458)).toBeLessThan(5e-7);
    expect(() => effectiveMoment(-1, 'SI')).toThrow(PhysicsInputError);
  });

  it('R = N_A kB = 8.31446261815 J/(mol K) (REFERENCE.md C7)', () => {
    // [REFERENCE.md C7, computed here: product of the exact SI values, mpmath 1.2.1]
    expect(rel(R_GAS, 8.31446261815)).toBeLessThan(1e-11);
    expect(rel(PHYS.muB / PHYS.kB, 0.671713815626)).toBeLessThan(1e-11); // C7 muB/kB
  });

  it('recovers C, theta, chi0 from seeded noisy data and propagates p_eff', () => {
    const T = Array.from({ length: 300 }, (_, i) => 30 + (320 * i) / 299);
    const g = normal(31);
    const chi = T.map(t => 1.2 / (t - 15) + 0.002 + 2e-4 * g());
    const r = fitCurieWeiss({ T, chi }, { units: 'cgs-emu' });
    expect(r.converged).toBe(true);
    expect(Math.abs(r.values[0] - 1.2)).toBeLessThan(3 * r.standardErrors[0]);
    expect(Math.abs(r.values[1] - 15)).toBeLessThan(3 * r.standardErrors[1]);
    expect(Math.abs(r.values[2] - 0.002)).toBeLessThan(3 * r.standardErrors[2]);
    expect(rel(r.pEff, 2.82786878 * Math.sqrt(r.values[0]))).toBeLessThan(1e-7);
    expect(r.pEffError).toBeGreaterThan(0);
    const w = fitCurieWeiss({ T, chi }, { units: 'SI', Tmin: 100 });
    expect(w.Tmin).toBe(100);
    expect(w.residuals.length).toBe(T.filter(t => t >= 100).length);
    expect(() => fitCurieWeiss({ T: [1, 2, 3], chi: [1, 2, 3] }, { units: 'SI' })).toThrow(PhysicsInputError);
    expect(() => fitCurieWeiss({ T: [1, 2, 3, NaN], chi: [1, 2, 3, 4] }, { units: 'SI' })).toThrow(PhysicsInputError);
  });
});
