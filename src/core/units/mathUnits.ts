/**
 * An isolated mathjs instance with the magnetism units that mathjs lacks:
 * oersted (Oe, with SI prefixes: kOe, mOe), emu (= 1e-3 A m²), Bohr magneton
 * (muB, CODATA 2018) and formula unit (fu = 1/N_A mol, so muB/fu is a molar
 * moment). The global mathjs instance is never modified.
 */
import { create } from 'mathjs';
import type { MathJsInstance, Unit } from 'mathjs';
import { PHYS } from './constants';
import { unitMathFactories } from '../numeric/mathjs';

let instance: MathJsInstance | null = null;

/** The private mathjs instance with the extra units defined (created on first use). */
export function unitMath(): MathJsInstance {
  if (instance !== null) {
    return instance;
  }
  const m = create(unitMathFactories, {});
  // 1 Oe = 1000/(4π) A/m (NBS SP 696, [C7 in REFERENCES.md])
  m.createUnit('Oe', { definition: m.unit(1000 / (4 * Math.PI), 'A/m'), prefixes: 'short' });
  // 1 emu = 1 erg/G = 1e-3 A m² [C7 in REFERENCES.md]
  m.createUnit('emu', { definition: m.unit(1e-3, 'A m^2'), prefixes: 'short' });
  m.createUnit('muB', { definition: m.unit(PHYS.muB, 'J/T') });
  m.createUnit('fu', { definition: m.unit(1 / PHYS.NA, 'mol') });
  instance = m;
  return m;
}

/** Parses a (normalised) unit text into a mathjs Unit of value 1; null when mathjs rejects it. */
export function parseMathUnit(text: string): Unit | null {
  try {
    return unitMath().unit(1, text);
  } catch {
    return null;
  }
}

/**
 * Rewrites common spellings into mathjs syntax: 'µB'/'μB' → 'muB', 'f.u.' →
 * 'fu', 'cm3' → 'cm^3', 'emu/cc' → 'emu/cm^3', 'Am2/kg' → 'A m^2/kg',
 * '°C'/'C' (temperature only, see callers) → 'degC', 'A m-1' → 'A/m'.
 */
export function normaliseUnitText(raw: string): string {
  let s = raw.trim();
  s = s.replace(/[µμ]B/g, 'muB').replace(/mu_B/g, 'muB');
  s = s.replace(/f\.u\.?/g, 'fu').replace(/\bf\.?u\b/g, 'fu');
  s = s.replace(/°\s*C/g, 'degC').replace(/^deg\s*C$/i, 'degC').replace(/^celsius$/i, 'degC');
  s = s.replace(/\bcc\b/g, 'cm^3');
  s = s.replace(/([a-zA-Z])([23])(?![\d^])/g, '$1^$2');
  s = s.replace(/\bAm\^2/g, 'A m^2');
  s = s.replace(/\s*·\s*/g, ' ');
  s = s.replace(/([a-zA-Z])\^?-1\b/g, (_m, u: string) => `/${u}`);
  s = s.replace(/\s+\//g, '/').replace(/\/\s+/g, '/');
  return s;
}
