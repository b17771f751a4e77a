/**
 * Unit of a measured column, read for a declared role (temperature, field,
 * magnetisation). The answer is either a conversion to SI, or a structured
 * question ('needs-unit') naming the column, or a refusal: an ambiguous or
 * missing unit is never guessed.
 *
 * SI targets: temperature K; field H in A/m (a field in tesla is read as
 * μ0H and divided by μ0); magnetisation as volume (A/m), mass (A m²/kg),
 * moment (A m²), molar (A m²/mol, from muB/fu or emu/mol).
 */
import { msg } from '../messages';
import type { ICoreMessage } from '../messages';
import { PHYS } from './constants';
import { normaliseUnitText, parseMathUnit, unitMath } from './mathUnits';

/** What a column holds. */
export type ColumnRole = 'temperature' | 'field' | 'magnetisation';

/** Physical basis of a magnetisation column. */
export type MagnetisationBasis = 'volume' | 'mass' | 'moment' | 'molar';

/** A successful reading: SI = factor·value + offset. */
export interface IUnitConversion {
  status: 'ok';
  column: string;
  role: ColumnRole;
  /** The unit as the user wrote it (kept for display). */
  userUnit: string;
  /** SI unit of the converted values. */
  siUnit: string;
  factor: number;
  offset: number;
  /** For magnetisation columns: which normalisation the values carry. */
  basis?: MagnetisationBasis;
  /** For field columns: 'H' (A/m, Oe) or 'mu0H' (T, mT: divided by μ0). */
  fieldForm?: 'H' | 'mu0H';
}

/** A question for the user: the column's unit is missing or ambiguous. */
export interface INeedsUnit {
  status: 'needs-unit';
  column: string;
  role: ColumnRole;
  /** What is missing or ambiguous (codes `units.missing.*`, `units.ambiguous-*`, `units.arbitrary`). */
  message: ICoreMessage;
  /** Units that would be accepted for this column. */
  options: string[];
}

/** The unit is understood but not acceptable for the role (or unknown). */
export interface IUnitRefusal {
  status: 'refused';
  column: string;
  role: ColumnRole;
  /** Why the unit does not fit the role (codes `units.not-*`, `units.*-not-*`). */
  message: ICoreMessage;
}

/** Outcome of reading one column's unit. */
export type UnitAnswer = IUnitConversion | INeedsUnit | IUnitRefusal;

const OPTIONS: Record<ColumnRole, string[]> = {
  temperature: ['K', 'degC', 'mK'],
  field: ['Oe', 'kOe', 'A/m', 'kA/m', 'T', 'mT'],
  magnetisation: ['emu', 'emu/g', 'emu/cm^3', 'emu/mol', 'A m^2', 'A m^2/kg', 'A/m', 'muB/fu']
};

/** Units refused as ambiguous whatever the role (G: gauss of B, or 4πM in G?), with the question they raise. */
const AMBIGUOUS: Record<string, (column: string, unit: string) => ICoreMessage> = {
  G: gaussQuestion,
  kG: gaussQuestion,
  gauss: gaussQuestion,
  'arb. u.': arbitraryUnits,
  'a.u.': arbitraryUnits,
  arb: arbitraryUnits,
  au: arbitraryUnits
};

function gaussQuestion(column: string, unit: string): ICoreMessage {
  return msg(
    'units.ambiguous-gauss',
    'Column “%1”: “%2” may be the induction B (μ0H) or 4πM in gauss: say which (Oe or T for a field, emu/cm^3 for M).',
    column,
    unit
  );
}

function arbitraryUnits(column: string): ICoreMessage {
  return msg('units.arbitrary', 'Column “%1” is in arbitrary units, which cannot be normalised: give its unit.', column);
}

function missingUnit(column: string, role: ColumnRole): ICoreMessage {
  switch (role) {
    case 'temperature':
      return msg('units.missing.temperature', 'Column “%1” has no unit: state the unit of its temperatures.', column);
    case 'field':
      return msg('units.missing.field', 'Column “%1” has no unit: state the unit of its fields.', column);
    default:
      return msg('units.missing.magnetisation', 'Column “%1” has no unit: state the unit of its magnetisations or moments.', column);
  }
}

function needs(column: string, role: ColumnRole, message: ICoreMessage): INeedsUnit {
  return { status: 'needs-unit', column, role, message, options: OPTIONS[role].slice() };
}

function refuse(column: string, role: ColumnRole, message: ICoreMessage): IUnitRefusal {
  return { status: 'refused', column, role, message };
}

/** SI value of 1 user unit, expressed in `target` (mathjs), or null when dimensions differ. */
function factorTo(text: string, target: string): number | null {
  const u = parseMathUnit(text);
  if (u === null) {
    return null;
  }
  try {
    return u.to(target).toNumber();
  } catch {
    return null;
  }
}

function readTemperature(column: string, unit: string): UnitAnswer {
  if (unit === 'T') {
    return refuse(column, 'temperature', msg('units.tesla-not-temperature', 'Column “%1”: “T” is the tesla, not a unit of temperature: give K or degC.', column));
  }
  const text = unit === 'C' || unit === '°C' ? 'degC' : normaliseUnitText(unit);
  if (text === 'degC' || text === 'celsius') {
    return { status: 'ok', column, role: 'temperature', userUnit: unit, siUnit: 'K', factor: 1, offset: 273.15 };
  }
  if (text === 'degF' || text === 'fahrenheit') {
    return { status: 'ok', column, role: 'temperature', userUnit: unit, siUnit: 'K', factor: 5 / 9, offset: 273.15 - (32 * 5) / 9 };
  }
  const f = factorTo(text, 'K');
  if (f === null) {
    return refuse(column, 'temperature', msg('units.not-temperature', 'Column “%1”: “%2” is not a unit of temperature.', column, unit));
  }
  return { status: 'ok', column, role: 'temperature', userUnit: unit, siUnit: 'K', factor: f, offset: 0 };
}

function readField(column: string, unit: string): UnitAnswer {
  const text = normaliseUnitText(unit);
  const fH = factorTo(text, 'A/m');
  if (fH !== null) {
    return { status: 'ok', column, role: 'field', userUnit: unit, siUnit: 'A/m', factor: fH, offset: 0, fieldForm: 'H' };
  }
  const fB = factorTo(text, 'T');
  if (fB !== null) {
    return { status: 'ok', column, role: 'field', userUnit: unit, siUnit: 'A/m', factor: fB / PHYS.mu0, offset: 0, fieldForm: 'mu0H' };
  }
  return refuse(column, 'field', msg('units.not-field', 'Column “%1”: “%2” is not a unit of magnetic field (H or μ0H).', column, unit));
}

function readMagnetisation(column: string, unit: string): UnitAnswer {
  const text = normaliseUnitText(unit);
  const targets: [MagnetisationBasis, string][] = [
    ['volume', 'A/m'],
    ['mass', 'A m^2/kg'],
    ['moment', 'A m^2'],
    ['molar', 'A m^2/mol']
  ];
  for (const [basis, target] of targets) {
    const f = factorTo(text, target);
    if (f !== null) {
      return { status: 'ok', column, role: 'magnetisation', userUnit: unit, siUnit: target, factor: f, offset: 0, basis };
    }
  }
  if (factorTo(text, 'T') !== null) {
    return refuse(
      column,
      'magnetisation',
      msg('units.induction-not-magnetisation', 'Column “%1”: “%2” is an induction (μ0M or 4πM): give M in A/m, emu/cm^3, emu/g or emu.', column, unit)
    );
  }
  return refuse(column, 'magnetisation', msg('units.not-magnetisation', 'Column “%1”: “%2” is not a unit of moment or magnetisation.', column, unit));
}

/**
 * Reads the unit of a column for its role. `unit` null or empty gives a
 * 'needs-unit' question; ambiguous units ("G", arbitrary units) too.
 */
export function readColumnUnit(column: string, unit: string | null, role: ColumnRole): UnitAnswer {
  const u = unit === null ? '' : unit.trim();
  if (u === '') {
    return needs(column, role, missingUnit(column, role));
  }
  const ambiguous = Object.prototype.hasOwnProperty.call(AMBIGUOUS, u) ? AMBIGUOUS[u] : undefined;
  if (ambiguous !== undefined) {
    return needs(column, role, ambiguous(column, u));
  }
  unitMath();
  if (role === 'temperature') {
    return readTemperature(column, u);
  }
  if (role === 'field') {
    return readField(column, u);
  }
  return readMagnetisation(column, u);
}

/** Converts values with a successful reading (new array; NaN stays NaN). */
export function toSI(values: ArrayLike<number>, c: IUnitConversion): Float64Array {
  const out = new Float64Array(values.length);
  for (let i = 0; i < values.length; i++) {
    out[i] = c.factor * values[i] + c.offset;
  }
  return out;
}

/** Converts SI values back to the user's unit of a reading (for display). */
export function fromSI(values: ArrayLike<number>, c: IUnitConversion): Float64Array {
  const out = new Float64Array(values.length);
  for (let i = 0; i < values.length; i++) {
    out[i] = (values[i] - c.offset) / c.factor;
  }
  return out;
}
