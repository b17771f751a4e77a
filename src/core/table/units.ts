/**
 * Split a column header into a quantity name and a unit:
 * `T (K)`, `M [emu/g]`, `mu0H (T)` and `H_Oe` style headers.
 */

/**
 * Unit tokens accepted after an underscore (`H_Oe`, `T_K`, `M_emu/g`).
 * Only these are split off, so headers such as `T_set`, `M_s`, `T_C` or `H_c`
 * keep their subscript. Single letters other than K and T are left out on purpose
 * (`M_s`, `T_C`, `T_N`, `H_A` are common quantity names, not units).
 */
const UNDERSCORE_UNITS: ReadonlySet<string> = new Set([
  'K', 'mK', 'degC', 'degF', 'T', 'mT', 'uT', 'µT', 'μT', 'kG', 'Oe', 'kOe', 'mOe',
  'emu', 'emu/g', 'emu/mol', 'emu/cm3', 'emu/cc', 'A/m', 'kA/m', 'MA/m', 'Am2', 'Am2/kg',
  'muB', 'μB', 'µB', 'muB/fu', 'J', 'mJ', 'kJ', 'J/mol', 'J/molK', 'J/mol/K', 'J/kg', 'J/kgK',
  'J/kg/K', 'J/g', 'J/gK', 'J/g/K', 'mJ/molK', 'mJ/mol/K', 'eV', 'meV', 'ueV', 'μeV', 'cm-1',
  'Pa', 'kPa', 'MPa', 'GPa', 'bar', 'kbar', 'mbar', 'Torr', 'mV', 'uV', 'μV', 'µV', 'nV',
  'mA', 'uA', 'μA', 'µA', 'nA', 'Ohm', 'ohm', 'mOhm', 'kOhm', 'MOhm', 'Ω', 'mΩ', 'kΩ',
  'Ohmcm', 'Ohm.cm', 'Ωcm', 'Hz', 'kHz', 'MHz', 'GHz', 'THz', 'ms', 'us', 'μs', 'µs', 'ns',
  'min', 'sec', 'mm', 'um', 'μm', 'µm', 'nm', 'cm', 'mg', 'kg', 'mol', 'mW', 'uW', 'μW', 'µW',
  'deg', 'rad', 'mrad', 'arb', 'au', 'a.u.', 'pct', 'percent', 'ppm', 'cm3/mol', 'cm3/g'
]);

/** Bracketed text accepted as a unit: short, no spaces, or a known multi-word form. */
const BRACKET_UNIT = /^[^\s()[\]]{1,24}$/;
const BRACKET_WORDS: ReadonlySet<string> = new Set(['arb. u.', 'arb. units', 'a. u.', 'arb units']);

/** Name and unit of one header. */
export interface ISplitHeader {
  name: string;
  unit: string | null;
}

/**
 * Split a header into name and unit.
 * `T (K)` → T, K; `M [emu/g]` → M, emu/g; `H_Oe` → H, Oe; `T_set` → T_set, null.
 */
export function splitHeader(header: string): ISplitHeader {
  const text = header.trim();
  const bracket = /^(.*?\S)\s*(?:\(([^()]*)\)|\[([^[\]]*)\])$/.exec(text);
  if (bracket) {
    const unit = (bracket[2] ?? bracket[3] ?? '').trim();
    if (BRACKET_UNIT.test(unit) || BRACKET_WORDS.has(unit)) {
      return { name: bracket[1].trim(), unit };
    }
  }
  const underscore = text.lastIndexOf('_');
  if (underscore > 0 && underscore < text.length - 1) {
    const unit = text.slice(underscore + 1);
    if (UNDERSCORE_UNITS.has(unit)) {
      return { name: text.slice(0, underscore), unit };
    }
  }
  return { name: text, unit: null };
}
