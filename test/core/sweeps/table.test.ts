import { describe, expect, it } from 'vitest';
import { messageText } from '../../../src/core/messages';
import { branchHysteresis, buildIsothermSet, DEMAG_UNSET_WARNING, isothermSetFromArrays, selectBranch, SweepInputError } from '../../../src/core/sweeps/index';
import type { IIsothermSet, ISweepColumn } from '../../../src/core/sweeps/index';
import { mulberry32 } from './generators';

/** A long-format table: 3 setpoints (40, 50, 60 K) read with ±0.03 K jitter, fields 0..10 kOe up then down. */
function longTable(): { T: number[]; H: number[]; M: number[]; dir: string[] } {
  const u = mulberry32(11);
  const out = { T: [] as number[], H: [] as number[], M: [] as number[], dir: [] as string[] };
  for (const Ts of [40, 50, 60]) {
    const up = Array.from({ length: 11 }, (_v, i) => i * 1000);
    const down = up.slice(0, -1).reverse();
    for (const [H, d] of [...up.map(h => [h, 'up'] as const), ...down.map(h => [h, 'down'] as const)]) {
      out.T.push(Ts + (u() - 0.5) * 0.06);
      out.H.push(H);
      out.M.push(H / (Ts + 10) + (d === 'down' ? 0.5 : 0));
      out.dir.push(d);
    }
  }
  return out;
}

const col = (name: string, unit: string | null, values: ArrayLike<number> | (string | null)[]): ISweepColumn => ({ name, unit, values });

function okSet(a: ReturnType<typeof buildIsothermSet>): IIsothermSet {
  expect(a.status).toBe('ok');
  if (a.status !== 'ok') {
    throw new Error(JSON.stringify(a));
  }
  return a.set;
}

describe('long-format M(H, T) tables (REFERENCE.md A3)', () => {
  it('groups jittered temperatures by setpoint and keeps up and down branches apart (detected from field steps)', () => {
    const t = longTable();
    const set = okSet(buildIsothermSet({ temperature: col('T', 'K', t.T), field: col('H', 'Oe', t.H), magnetisation: col('M', 'emu/g', t.M), temperatureTolerance: 0.5 }));
    expect(set.isotherms.length).toBe(6);
    const ups = set.isotherms.filter(i => i.branch === 'up');
    const downs = set.isotherms.filter(i => i.branch === 'down');
    expect(ups.map(i => Math.round(i.T))).toEqual([40, 50, 60]);
    expect(downs.length).toBe(3);
    for (const i of ups) {
      expect(i.H.length).toBe(11);
      expect(i.TSpread).toBeLessThan(0.07);
    }
    // the down sweep starts at the turning point's successor: 10 points, all with the +0.5 offset
    for (const i of downs) {
      expect(i.H.length).toBe(10);
    }
    // SI inside: 10 kOe = 795774.7 A/m; emu/g = A m^2/kg; fields sorted ascending
    expect(ups[0].H[10]).toBeCloseTo(795774.715459, 4);
    expect(set.magnetisationUnit).toBe('A m^2/kg');
    expect(set.display).toEqual({ temperature: 'K', field: 'Oe', magnetisation: 'emu/g' });
    expect(set.fieldKind).toBe('applied');
    expect(set.warnings).toContain(DEMAG_UNSET_WARNING);
    const sel = selectBranch(set);
    expect(sel.isotherms.every(i => i.branch === 'up')).toBe(true);
    expect(sel.warnings.length).toBe(1);
  });

  it('uses a branch column when given', () => {
    const t = longTable();
    const set = okSet(buildIsothermSet({ temperature: col('T', 'K', t.T), field: col('H', 'Oe', t.H), magnetisation: col('M', 'emu/g', t.M), branch: col('dir', null, t.dir) }));
    const up40 = set.isotherms.find(i => i.branch === 'up' && Math.round(i.T) === 40);
    expect(up40?.H.length).toBe(11);
    const down40 = set.isotherms.find(i => i.branch === 'down' && Math.round(i.T) === 40);
    expect(down40?.M[0]).toBeCloseTo(0.5, 12);
  });

  it('a tolerance smaller than the jitter splits a setpoint, larger merges neighbours', () => {
    const t = longTable();
    const fine = okSet(buildIsothermSet({ temperature: col('T', 'K', t.T), field: col('H', 'Oe', t.H), magnetisation: col('M', 'emu/g', t.M), temperatureTolerance: 1e-4 }));
    expect(fine.isotherms.length).toBeGreaterThan(6);
    const coarse = okSet(buildIsothermSet({ temperature: col('T', 'K', t.T), field: col('H', 'Oe', t.H), magnetisation: col('M', 'emu/g', t.M), temperatureTolerance: 15 }));
    expect(coarse.isotherms.filter(i => i.branch === 'up').length).toBe(1);
    expect(coarse.warnings.some(w => w.code === 'sweeps.isotherm-spread')).toBe(false);
  });

  it('degrees C are converted to kelvin before grouping', () => {
    const set = okSet(buildIsothermSet({ temperature: col('T', 'degC', [20, 20, 20]), field: col('H', 'T', [0, 1, 2]), magnetisation: col('M', 'A/m', [0, 1, 2]) }));
    expect(set.isotherms[0].T).toBeCloseTo(293.15, 12);
    expect(set.magnetisationUnit).toBe('A/m');
  });

  it('asks for units and sample data instead of guessing', () => {
    const base = { temperature: col('T', 'K', [10, 10]), field: col('H', 'Oe', [1, 2]) };
    const a = buildIsothermSet({ ...base, magnetisation: col('M', null, [1, 2]) });
    expect(a.status).toBe('needs-unit');
    if (a.status === 'needs-unit') {
      expect(a.column).toBe('M');
    }
    expect(buildIsothermSet({ ...base, field: col('H', 'G', [1, 2]), magnetisation: col('M', 'emu/g', [1, 2]) }).status).toBe('needs-unit');
    expect(buildIsothermSet({ ...base, temperature: col('T', 'T', [1, 2]), magnetisation: col('M', 'emu/g', [1, 2]) }).status).toBe('refused');
    const noMass = buildIsothermSet({ ...base, magnetisation: col('m', 'emu', [1, 2]) });
    expect(noMass.status).toBe('needs-sample');
    if (noMass.status === 'needs-sample') {
      expect(noMass.parameter).toBe('massKg');
      expect(noMass.message.code).toBe('sweeps.needs-mass');
    }
    const noMw = buildIsothermSet({ ...base, magnetisation: col('M', 'muB/fu', [1, 2]) });
    expect(noMw.status === 'needs-sample' && noMw.parameter === 'molarMassKgPerMol').toBe(true);
    const noDensity = buildIsothermSet({ ...base, magnetisation: col('M', 'emu/g', [1, 2]), demag: { value: 1 / 3, convention: 'SI' } });
    expect(noDensity.status === 'needs-sample' && noDensity.parameter === 'densityKgPerM3').toBe(true);
    // a user-supplied unit answers the question
    const answered = buildIsothermSet({ ...base, magnetisation: col('M', null, [1, 2]), unitOverrides: { M: 'emu/g' } });
    expect(answered.status).toBe('ok');
  });

  it('normalises moments by mass and molar values by molar mass; density gives A/m', () => {
    const base = { temperature: col('T', 'K', [10, 10]), field: col('H', 'A/m', [1, 2]) };
    // 1 emu on 10 mg = 1e-3 A m^2 / 1e-5 kg = 100 A m^2/kg (C7: emu = 1e-3 A m^2)
    const s1 = okSet(buildIsothermSet({ ...base, magnetisation: col('m', 'emu', [1, 2]), sample: { massKg: 1e-5 } }));
    expect(s1.isotherms[0].M[0]).toBeCloseTo(100, 9);
    // 1 muB/f.u. with Mw = 0.1 kg/mol = 55.8493941 A m^2/kg (C7)
    const s2 = okSet(buildIsothermSet({ ...base, magnetisation: col('M', 'muB/fu', [1, 2]), sample: { molarMassKgPerMol: 0.1 } }));
    expect(s2.isotherms[0].M[0]).toBeCloseTo(55.8493941, 6);
    const s3 = okSet(buildIsothermSet({ ...base, magnetisation: col('M', 'emu/g', [1, 2]), sample: { densityKgPerM3: 5000 } }));
    expect(s3.magnetisationUnit).toBe('A/m');
    expect(s3.isotherms[0].M[0]).toBeCloseTo(5000, 9);
  });

  it('applies the demagnetisation correction when N_d and density are given', () => {
    const set = okSet(
      buildIsothermSet({
        temperature: col('T', 'K', [10, 10]),
        field: col('H', 'A/m', [1e5, 2e5]),
        magnetisation: col('M', 'emu/cm^3', [30, 60]),
        demag: { value: 4 * Math.PI / 3, convention: 'cgs' }
      })
    );
    expect(set.fieldKind).toBe('internal');
    expect(set.demagnetisingFactorSI).toBeCloseTo(1 / 3, 14);
    // H_int = 1e5 − (1/3)·3e4 A/m
    expect(set.isotherms[0].H[0]).toBeCloseTo(9e4, 6);
    expect(set.warnings).not.toContain(DEMAG_UNSET_WARNING);
  });

  it('edge inputs: NaN rows are dropped with a warning; empty tables give no isotherms; mismatched lengths throw', () => {
    const set = okSet(buildIsothermSet({ temperature: col('T', 'K', [10, NaN, 10, 10]), field: col('H', 'Oe', [1, 2, Infinity, 3]), magnetisation: col('M', 'emu/g', [1, 2, 3, 4]) }));
    expect(set.isotherms.reduce((s, i) => s + i.H.length, 0)).toBe(2);
    expect(set.warnings.some(w => w.code === 'sweeps.rows-dropped' && messageText(w) === 'Rows left out for a missing or non-finite T, H or M: 2.')).toBe(true);
    const empty = okSet(buildIsothermSet({ temperature: col('T', 'K', []), field: col('H', 'Oe', []), magnetisation: col('M', 'emu/g', []) }));
    expect(empty.isotherms.length).toBe(0);
    expect(() => buildIsothermSet({ temperature: col('T', 'K', [1]), field: col('H', 'Oe', [1, 2]), magnetisation: col('M', 'emu/g', [1]) })).toThrow(SweepInputError);
    expect(() => buildIsothermSet({ temperature: col('T', 'K', [1]), field: col('H', 'Oe', [1]), magnetisation: col('M', 'emu/g', [1]), temperatureTolerance: -1 })).toThrow(SweepInputError);
  });

  it('does not mutate its input columns', () => {
    const t = longTable();
    const T = Float64Array.from(t.T);
    const copy = Float64Array.from(T);
    buildIsothermSet({ temperature: col('T', 'K', T), field: col('H', 'Oe', t.H), magnetisation: col('M', 'emu/g', t.M), demag: undefined });
    expect(Array.from(T)).toEqual(Array.from(copy));
  });

  it('branch hysteresis: the down branch offset (0.5 emu/g = 0.5 A m^2/kg, C7) is found at every temperature', () => {
    const t = longTable();
    const set = okSet(buildIsothermSet({ temperature: col('T', 'K', t.T), field: col('H', 'Oe', t.H), magnetisation: col('M', 'emu/g', t.M) }));
    const h = branchHysteresis(set);
    expect(h.map(x => Math.round(x.T))).toEqual([40, 50, 60]);
    for (const x of h) {
      expect(x.maxDifference).toBeCloseTo(0.5, 10);
      expect(x.compared).toBe(10);
    }
    expect(branchHysteresis(isothermSetFromArrays([{ T: 1, H: [1, 2], M: [1, 2] }]))).toEqual([]);
  });
});

