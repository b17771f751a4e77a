/**
 * The modified Arrott iteration from its default (3D Heisenberg) start on
 * noise-free Arrott–Noakes isotherms (REFERENCE.md B6) of other classes
 * (C2: mean field β = 1/2, γ = 1; tricritical β = 1/4, γ = 1; 2D Ising
 * β = 1/8, γ = 7/4 — Stanley 1971, Griffiths 1970); display units; duplicates.
 */
import { describe, expect, it } from 'vitest';
import { arrottAnalysis, buildIsothermSet, globalEquationOfStateFit, modifiedArrottIteration, SweepInputError, toDisplayUnits } from '../../../src/core/sweeps/index';
import { anSet, linspace } from './generators';

const Ts = linspace(285, 315, 31);

describe('modified Arrott iteration from the default start', () => {
  for (const [name, beta, gamma] of [['mean field', 0.5, 1], ['tricritical', 0.25, 1], ['2D Ising', 0.125, 1.75]] as const) {
    it(`recovers ${name} exponents (beta = ${beta}, gamma = ${gamma})`, () => {
      const set = anSet({ Tc: 300, beta, gamma, T1: 5, M1: 1e5 }, Ts, linspace(1e3, 1e5, 120), 0, 1);
      const r = modifiedArrottIteration(set);
      expect(r.converged).toBe(true);
      expect(r.beta.value).toBeCloseTo(beta, 4);
      expect(r.gamma.value).toBeCloseTo(gamma, 4);
      expect(r.Tc.value).toBeCloseTo(300, 3);
    });
  }

  it('falls back to another class of C2 when the default trial exponents give no intercept crossing, and says so', () => {
    const set = anSet({ Tc: 300, beta: 0.5, gamma: 1, T1: 20, M1: 1e5 }, Ts, linspace(5e3, 5e5, 120), 0, 1);
    const r = modifiedArrottIteration(set);
    expect(r.warnings.some(w => w.code === 'sweeps.map.other-start')).toBe(true);
    expect(r.beta.value).toBeCloseTo(0.5, 4);
    expect(r.gamma.value).toBeCloseTo(1, 4);
  });
});

describe('display in the user units', () => {
  it('fields in kOe and temperatures in degC come back in those units; normalised moments are shown in SI with a note', () => {
    const a = buildIsothermSet({
      temperature: { name: 'T', unit: 'degC', values: [20, 20, 20] },
      field: { name: 'H', unit: 'kOe', values: [1, 2, 3] },
      magnetisation: { name: 'm', unit: 'emu', values: [1, 2, 3] },
      sample: { massKg: 1e-5 }
    });
    expect(a.status).toBe('ok');
    if (a.status !== 'ok') {
      return;
    }
    const iso = a.set.isotherms[0];
    const H = toDisplayUnits(a.set, 'field', iso.H);
    expect(H.unit).toBe('kOe');
    expect(H.values[2]).toBeCloseTo(3, 12);
    const T = toDisplayUnits(a.set, 'temperature', [iso.T]);
    expect(T.values[0]).toBeCloseTo(20, 10);
    const M = toDisplayUnits(a.set, 'magnetisation', iso.M);
    expect(M.unit).toBe('A m^2/kg');
    expect(M.note?.code).toBe('sweeps.display.si');
    // 1 emu / 10 mg = 100 A m^2/kg (C7)
    expect(M.values[0]).toBeCloseTo(100, 9);
  });

  it('duplicate rows stay as points of one isotherm', () => {
    const a = buildIsothermSet({
      temperature: { name: 'T', unit: 'K', values: [10, 10, 10, 10] },
      field: { name: 'H', unit: 'Oe', values: [1, 1, 2, 2] },
      magnetisation: { name: 'M', unit: 'emu/g', values: [5, 5, 6, 6] }
    });
    expect(a.status === 'ok' && a.set.isotherms.length === 1 && a.set.isotherms[0].H.length === 4).toBe(true);
  });
});

describe('boundary validation', () => {
  const set = anSet({ Tc: 300, beta: 0.5, gamma: 1, T1: 5, M1: 1e5 }, Ts, linspace(1e3, 1e5, 20), 0, 1);
  it('rejects windows and trial exponents that cannot work, with typed errors', () => {
    expect(() => arrottAnalysis(set, { region: { topFraction: 0 } })).toThrow(SweepInputError);
    expect(() => arrottAnalysis(set, { region: { topFraction: 1.5 } })).toThrow(SweepInputError);
    expect(() => arrottAnalysis(set, { region: { hMin: NaN } })).toThrow(SweepInputError);
    expect(() => modifiedArrottIteration(set, { tMax: 0 })).toThrow(SweepInputError);
    expect(() => modifiedArrottIteration(set, { tMax: Infinity })).toThrow(SweepInputError);
    expect(() => modifiedArrottIteration(set, { start: { beta: -0.3, gamma: 1 } })).toThrow(SweepInputError);
    expect(() => globalEquationOfStateFit(set, { tMax: -1 })).toThrow(SweepInputError);
  });
});

