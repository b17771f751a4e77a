/**
 * Parameter units from column units: Curie–Weiss χ = C/(T − θ) + χ0 gives
 * θ in K, χ0 in the χ unit and C in χ unit × K (the formula's dimensions);
 * exponents and spins are pure numbers; unknown names and missing column
 * units give no unit.
 */
import { describe, expect, it } from 'vitest';
import { parameterUnit } from '../../../src/core/analysis/parameter-units';

describe('parameterUnit', () => {
  it('derives the units of the Curie–Weiss parameters from χ = C/(T − θ) + χ0', () => {
    expect(parameterUnit('theta', 'K', 'emu/mol/Oe')).toBe('K');
    expect(parameterUnit('chi0', 'K', 'emu/mol/Oe')).toBe('emu/mol/Oe');
    expect(parameterUnit('C', 'K', 'emu/mol/Oe')).toBe('emu/mol/Oe·K');
  });

  it('gives temperatures the x unit, amplitudes the y unit and exponents none', () => {
    expect(parameterUnit('Tc', 'K', 'emu/g')).toBe('K');
    expect(parameterUnit('Ms', 'K', 'emu/g')).toBe('emu/g');
    expect(parameterUnit('beta', 'K', 'emu/g')).toBe('1');
    expect(parameterUnit('J', 'K', 'emu/g')).toBe('1');
  });

  it('gives no unit when the column has none or the parameter is unknown', () => {
    expect(parameterUnit('Tc', null, 'emu/g')).toBeNull();
    expect(parameterUnit('C', 'K', null)).toBeNull();
    expect(parameterUnit('k', 'K', 'emu/g')).toBeNull();
  });
});
