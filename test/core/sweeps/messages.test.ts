/**
 * Messages of the isotherm analyses as thrown and returned: refusals,
 * set and analysis warnings, conventions, reasons, the Banerjee evidence.
 */
import { describe, expect, it } from 'vitest';
import { messageText } from '../../../src/core/messages';
import type { ICoreMessage } from '../../../src/core/messages';
import {
  analyseIsotherms,
  bootstrapModifiedArrott,
  buildIsothermSet,
  criticalIsotherm,
  demagnetisingFactorSI,
  exponentWindowScan,
  globalEquationOfStateFit,
  internalField,
  isothermSetFromArrays,
  kouvelFisher,
  magneticEntropyChange,
  modifiedArrottIteration,
  scalingChecks,
  SweepInputError,
  toDisplayUnits,
  volumeMagnetisation
} from '../../../src/core/sweeps/index';
import type { ISweepConventions } from '../../../src/core/sweeps/index';
import { expectGoodMessages, thrownMessage } from '../numeric/messageRules';
import { anSet, beanRodbellSet, linspace, weissSet } from './generators';

const set = weissSet(linspace(0.985, 1.015, 31), linspace(1e-5, 2e-3, 200));
const col = (name: string, unit: string | null, values: (number | string | null)[]) => ({ name, unit, values: values as number[] });

function conventions(c: ISweepConventions): ICoreMessage[] {
  return [c.t, ...c.notes];
}

const bad: [string, () => unknown][] = [
  ['arrays', () => isothermSetFromArrays([{ T: 1, H: [1, 2], M: [1] }])],
  ['demag finite', () => demagnetisingFactorSI({ value: NaN, convention: 'SI' })],
  ['demag SI', () => demagnetisingFactorSI({ value: 1.2, convention: 'SI' })],
  ['demag cgs', () => demagnetisingFactorSI({ value: 13, convention: 'cgs' })],
  ['internal field', () => internalField([1, 2], [1], { value: 0, convention: 'SI' })],
  ['density', () => volumeMagnetisation([1], -1)],
  ['columns', () => buildIsothermSet({ temperature: col('T', 'K', [1, 2]), field: col('H', 'Oe', [1]), magnetisation: col('M', 'emu/g', [1, 2]) })],
  ['branch column', () => buildIsothermSet({ temperature: col('T', 'K', [1]), field: col('H', 'Oe', [1]), magnetisation: col('M', 'emu/g', [1]), branch: col('b', null, []) })],
  ['tolerance', () => buildIsothermSet({ temperature: col('T', 'K', [1]), field: col('H', 'Oe', [1]), magnetisation: col('M', 'emu/g', [1]), temperatureTolerance: -1 })],
  ['mass', () => buildIsothermSet({ temperature: col('T', 'K', [1]), field: col('H', 'Oe', [1]), magnetisation: col('m', 'emu', [1]), sample: { massKg: -1 } })],
  ['top fraction', () => modifiedArrottIteration(set, { region: { topFraction: 2 } })],
  ['h min', () => modifiedArrottIteration(set, { region: { hMin: NaN } })],
  ['t max', () => modifiedArrottIteration(set, { tMax: Infinity })],
  ['trial exponents', () => modifiedArrottIteration(set, { start: { beta: -1, gamma: 1 } })],
  ['kouvel powers', () => kouvelFisher([], [], 5, { below: 0, above: 1 })],
  ['window scan empty', () => exponentWindowScan(set, { tMaxs: [], hMins: [0] })],
  ['window scan t max', () => exponentWindowScan(set, { tMaxs: [-1], hMins: [0] })],
  ['entropy', () => magneticEntropyChange(set, [-1])],
  ['bootstrap', () => bootstrapModifiedArrott(set, { samples: 1 })]
];

describe('sweep messages', () => {
  it('every refusal throws a SweepInputError with a good message', () => {
    const messages = bad.map(([what, fn]) => {
      const m = thrownMessage(fn, SweepInputError);
      expect(m.code, what).toMatch(/^sweeps\./);
      return m;
    });
    expect(expectGoodMessages(messages)).toBe(bad.length);
  });

  it('the messages of a whole analysis, of a set built from a table and of the other analyses are good', () => {
    const out: (ICoreMessage | null)[] = [];
    const a = analyseIsotherms(set, { tMax: 0.015, global: true, collapse: true });
    out.push(...a.warnings, ...conventions(a.conventions), a.arrott.banerjee.evidence, ...a.arrott.banerjee.caveats, a.arrott.TcCrossing.reason);
    out.push(a.modifiedArrott.reason, a.modifiedArrott.MsFit.reason, a.modifiedArrott.chiFit.reason, ...conventions(a.modifiedArrott.conventions));
    out.push(a.kouvelFisher.convention, a.kouvelFisher.below.reason, a.kouvelFisher.above.reason, ...a.criticalIsotherm.warnings, ...a.checks.notes);
    out.push(...(a.global ? [a.global.reason, ...a.global.warnings, ...conventions(a.global.conventions)] : []));
    out.push(...(a.collapse ? [a.collapse.reason, ...a.collapse.warnings] : []));
    // few isotherms, applied field, no crossing
    const few = isothermSetFromArrays(set.isotherms.slice(0, 3).map(i => ({ T: i.T, H: i.H, M: i.M })), { fieldKind: 'applied' });
    const b = analyseIsotherms(few, { tMax: 0.015 });
    out.push(...b.warnings, ...conventions(b.conventions), b.arrott.TcCrossing.reason, b.modifiedArrott.reason);
    expect(b.warnings.map(w => w.code)).toContain('sweeps.demag-unset');
    // first-order evidence and entropy across a jump
    const br = beanRodbellSet(2, linspace(1.0, 1.1, 21), linspace(0, 0.02, 41));
    out.push(...analyseIsotherms(br).arrott.warnings, analyseIsotherms(br).arrott.banerjee.evidence);
    const s = magneticEntropyChange(br, [0.02, 1]);
    out.push(...s.warnings, ...conventions(s.conventions), ...s.curves.flatMap(c => c.warnings));
    // a set from a table: conventions, warnings, questions
    const built = buildIsothermSet({
      temperature: col('T', 'degC', [10, 10.1, 20, 20, 30, 30, null]),
      field: col('H', 'T', [0.1, 0.2, 0.1, 0.2, 0.1, 0.2, 0.3]),
      magnetisation: col('m', 'emu', [1, 2, 1, 2, 1, 2, 3]),
      sample: { massKg: 1e-5, densityKgPerM3: 7000 },
      temperatureTolerance: 0.01
    });
    expect(built.status).toBe('ok');
    if (built.status === 'ok') {
      out.push(...built.set.conventions, ...built.set.warnings);
      out.push(toDisplayUnits(built.set, 'magnetisation', [1]).note);
    }
    for (const input of [
      { magnetisation: col('m', 'emu', [1]) },
      { magnetisation: col('m', 'muB/fu', [1]) },
      { magnetisation: col('m', 'emu/g', [1]), demag: { value: 0.3, convention: 'SI' as const } }
    ]) {
      const q = buildIsothermSet({ temperature: col('T', 'K', [1]), field: col('H', 'Oe', [1]), ...input });
      expect(q.status).toBe('needs-sample');
      out.push(q.status === 'needs-sample' ? q.message : null);
    }
    const molar = buildIsothermSet({ temperature: col('T', 'K', [1, 1]), field: col('H', 'Oe', [1, 2]), magnetisation: col('m', 'muB/fu', [1, 2]), sample: { molarMassKgPerMol: 0.1 }, demag: { value: 1 / 3, convention: 'SI' } });
    out.push(...(molar.status === 'ok' ? molar.set.conventions : []));
    // window scan, bootstrap, critical isotherm failures, scaling checks
    const scan = exponentWindowScan(set, { tMaxs: [0.005, 0.015], hMins: [0, 1e-3], methods: ['iteration', 'global'] });
    out.push(...scan.warnings, ...conventions(scan.conventions), ...scan.cells.map(c => c.reason));
    out.push(bootstrapModifiedArrott(set, { samples: 2, tMax: 0.015 }).convention);
    out.push(...criticalIsotherm(set.isotherms, NaN).warnings, ...criticalIsotherm(set.isotherms, 2).warnings);
    out.push(...scalingChecks({ beta: { value: 0.5, error: 0.01 }, gamma: { value: 1, error: 0.01 } }).notes);
    const an = anSet({ Tc: 300, beta: 0.365, gamma: 1.386, T1: 10, M1: 5e5 }, linspace(285, 315, 13), linspace(1e4, 5e5, 30), 1e-3, 3);
    const g = globalEquationOfStateFit(an, { tMax: 0.05 });
    out.push(g.reason, ...g.warnings);
    expect(expectGoodMessages(out)).toBeGreaterThan(60);
    expect(messageText(a.arrott.TcCrossing.reason)).toMatch(/^Tc from a straight line through \d+ isotherms/);
  });
});
