import { describe, expect, it } from 'vitest';
import { messageText } from '../../../src/core/messages';
import * as mathjs from 'mathjs';
import { PHYS } from '../../../src/core/physics/index';
import { convertQuantity, fromSI, magnetisationFromFourPiMGauss, muBPerFormulaUnit, readColumnUnit, susceptibilityCgsToSI, toSI, UnitInputError } from '../../../src/core/units/index';
import type { IUnitConversion } from '../../../src/core/units/index';

function ok(a: ReturnType<typeof readColumnUnit>): IUnitConversion {
  expect(a.status).toBe('ok');
  return a as IUnitConversion;
}

/** Relative difference. */
const rel = (a: number, b: number): number => Math.abs(a - b) / Math.abs(b);

describe('unit conversions against REFERENCE.md C7', () => {
  it('1 Oe = 79.5774715459 A/m and 1 A/m = 0.0125663706144 Oe (C7, NBS SP 696; digits computed here)', () => {
    expect(rel(ok(readColumnUnit('H', 'Oe', 'field')).factor, 79.5774715459)).toBeLessThan(1e-11);
    expect(rel(convertQuantity(1, 'A/m', 'Oe'), 0.0125663706144)).toBeLessThan(1e-11);
    expect(rel(ok(readColumnUnit('H', 'kOe', 'field')).factor, 79577.4715459)).toBeLessThan(1e-11);
  });

  it('mu0H in tesla: 1 T <-> 10 kOe, to the 1.00000000054e-4 T per Oe of C7 (CODATA 2018 mu0)', () => {
    const t = ok(readColumnUnit('mu0H', 'T', 'field'));
    expect(t.fieldForm).toBe('mu0H');
    // 1 Oe of applied field expressed as mu0 H in tesla: 1.00000000054e-4 T (C7, computed here with CODATA 2018 mu0)
    const oe = ok(readColumnUnit('H', 'Oe', 'field')).factor;
    expect(rel(oe / t.factor, 1.00000000054e-4)).toBeLessThan(1e-11);
    expect(rel(10000 * oe, t.factor)).toBeLessThan(1e-9);
    expect(rel(ok(readColumnUnit('B', 'mT', 'field')).factor, t.factor / 1000)).toBeLessThan(1e-14);
  });

  it('moments and magnetisations (C7, NBS SP 696): emu = 1e-3 A m^2, emu/g = A m^2/kg, emu/cm^3 = 1e3 A/m', () => {
    const emu = ok(readColumnUnit('m', 'emu', 'magnetisation'));
    expect(emu.basis).toBe('moment');
    expect(rel(emu.factor, 1e-3)).toBeLessThan(1e-15);
    const g = ok(readColumnUnit('M', 'emu/g', 'magnetisation'));
    expect(g.basis).toBe('mass');
    expect(rel(g.factor, 1)).toBeLessThan(1e-15);
    for (const u of ['emu/cm^3', 'emu/cm3', 'emu/cc']) {
      const v = ok(readColumnUnit('M', u, 'magnetisation'));
      expect(v.basis).toBe('volume');
      expect(rel(v.factor, 1e3)).toBeLessThan(1e-12);
    }
    for (const u of ['A m^2/kg', 'A m2/kg', 'Am2/kg']) {
      expect(ok(readColumnUnit('M', u, 'magnetisation')).basis).toBe('mass');
    }
    expect(ok(readColumnUnit('M', 'A/m', 'magnetisation')).basis).toBe('volume');
    expect(ok(readColumnUnit('M', 'kA/m', 'magnetisation')).factor).toBeCloseTo(1000, 9);
  });

  it('volume magnetisation: 4 pi M (G) x 1e3/(4 pi) = M (A/m); mu0 M (T) = 4 pi 1e-4 x M (emu/cm^3) (C7, NBS SP 696)', () => {
    expect(magnetisationFromFourPiMGauss(4 * Math.PI)).toBeCloseTo(1e3, 10);
    const Msi = convertQuantity(1, 'emu/cm^3', 'A/m');
    // CODATA 2018 mu0 differs from 4 pi 1e-7 by 5e-10 relative (C7)
    expect(rel(PHYS.mu0 * Msi, 4 * Math.PI * 1e-4)).toBeLessThan(1e-9);
  });

  it('susceptibilities: volume x 4 pi, mass 1 cm^3/g = 4 pi 1e-3 m^3/kg, molar 1 cm^3/mol = 4 pi 1e-6 m^3/mol (C7)', () => {
    expect(susceptibilityCgsToSI(1, 'volume')).toBeCloseTo(4 * Math.PI, 14);
    expect(rel(susceptibilityCgsToSI(1, 'mass'), 4 * Math.PI * 1e-3)).toBeLessThan(1e-15);
    expect(rel(susceptibilityCgsToSI(1, 'molar'), 4 * Math.PI * 1e-6)).toBeLessThan(1e-15);
    // the cm^3/g part of the factor is the plain volume/mass ratio
    expect(rel(convertQuantity(1, 'cm^3/g', 'm^3/kg'), 1e-3)).toBeLessThan(1e-12);
  });

  it('muB = 9.2740100783e-21 emu (C7, CODATA 2018, computed here)', () => {
    expect(rel(convertQuantity(1, 'muB', 'emu'), 9.2740100783e-21)).toBeLessThan(1e-12);
  });

  it('moment per formula unit: p = M[emu/g] Mw[g/mol] / 5584.93941 (C7, CODATA 2018, computed here)', () => {
    // 100 emu/g with Mw = 150 g/mol
    expect(rel(muBPerFormulaUnit(100, 0.15), (100 * 150) / 5584.93941)).toBeLessThan(1e-9);
    const fu = ok(readColumnUnit('M', 'μB/f.u.', 'magnetisation'));
    expect(fu.basis).toBe('molar');
    // N_A muB = 5.58493941 A m^2/mol (C7 SI form)
    expect(rel(fu.factor, 5.58493941)).toBeLessThan(1e-9);
    expect(() => muBPerFormulaUnit(1, 0)).toThrow(UnitInputError);
  });

  it('temperatures: K and degrees C (0 degC = 273.15 K, SI definition)', () => {
    const c = ok(readColumnUnit('T', '°C', 'temperature'));
    expect(toSI([25], c)[0]).toBeCloseTo(298.15, 12);
    expect(fromSI([298.15], c)[0]).toBeCloseTo(25, 12);
    expect(ok(readColumnUnit('T', 'degC', 'temperature')).offset).toBe(273.15);
    expect(ok(readColumnUnit('T', 'mK', 'temperature')).factor).toBeCloseTo(1e-3, 15);
  });

  it('round trip SI and back keeps values, NaN stays NaN', () => {
    const c = ok(readColumnUnit('H', 'kOe', 'field'));
    const back = fromSI(toSI([1, -2.5, NaN, 0], c), c);
    expect(back[0]).toBeCloseTo(1, 12);
    expect(back[1]).toBeCloseTo(-2.5, 12);
    expect(Number.isNaN(back[2])).toBe(true);
    expect(back[3]).toBe(0);
  });
});

describe('ambiguous units are questions or refusals, never guesses (REFERENCE.md D2)', () => {
  it('a missing unit asks, naming the column', () => {
    const a = readColumnUnit('M', null, 'magnetisation');
    expect(a.status).toBe('needs-unit');
    if (a.status === 'needs-unit') {
      expect(a.column).toBe('M');
      expect(a.options).toContain('emu/g');
      expect(a.message.code).toBe('units.missing.magnetisation');
      expect(messageText(a.message)).toContain('“M”');
    }
    expect(readColumnUnit('T', '  ', 'temperature').status).toBe('needs-unit');
  });

  it('"G" asks (gauss of B or 4 pi M)', () => {
    for (const role of ['field', 'magnetisation'] as const) {
      const a = readColumnUnit('X', 'G', role);
      expect(a.status).toBe('needs-unit');
      expect(a.status === 'needs-unit' && a.message.code).toBe('units.ambiguous-gauss');
    }
  });

  it('"T" as a temperature unit is refused; "T" as a field unit is tesla', () => {
    const a = readColumnUnit('T', 'T', 'temperature');
    expect(a.status).toBe('refused');
    expect(ok(readColumnUnit('H', 'T', 'field')).fieldForm).toBe('mu0H');
  });

  it('wrong dimensions and unknown units are refused with the column named', () => {
    for (const [u, role] of [['K', 'field'], ['Oe', 'temperature'], ['furlong', 'field'], ['T', 'magnetisation'], ['kg', 'magnetisation']] as const) {
      const a = readColumnUnit('col', u, role);
      expect(a.status).toBe('refused');
      if (a.status === 'refused') {
        expect(messageText(a.message)).toMatch(/^Column “col”: /);
      }
    }
  });

  it('convertQuantity refuses unknown units and mismatched dimensions', () => {
    expect(() => convertQuantity(1, 'blorp', 'A/m')).toThrow(UnitInputError);
    expect(() => convertQuantity(1, 'Oe', 'K')).toThrow(UnitInputError);
    expect(() => convertQuantity(1, 'Oe', 'K')).toThrow('A quantity in “Oe” cannot be expressed in “K”: they measure different things.');
    expect(() => convertQuantity(1, 'Oe', 'blorp')).toThrow('The unit “blorp” is not known.');
  });
});

describe('isolation', () => {
  it('the global mathjs instance does not learn Oe or emu', () => {
    readColumnUnit('H', 'Oe', 'field');
    expect(() => mathjs.unit(1, 'Oe')).toThrow();
    expect(() => mathjs.unit(1, 'emu')).toThrow();
  });
});
