/**
 * Magnetic normalisations that need sample data: moment per formula unit
 * from a mass magnetisation and the molar mass, and free conversions of a
 * quantity between two units of the private mathjs instance.
 */
import { PHYS } from '../physics/constants';
import { normaliseUnitText, parseMathUnit, unitMath } from './mathUnits';

/** Error for an invalid unit or sample parameter at the boundary. */
export class UnitInputError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'UnitInputError';
  }
}

function requireMolarMass(molarMassKgPerMol: number): void {
  if (!(molarMassKgPerMol > 0) || !Number.isFinite(molarMassKgPerMol)) {
    throw new UnitInputError(`molar mass must be a finite number > 0 in kg/mol, got ${String(molarMassKgPerMol)}`);
  }
}

/**
 * Moment per formula unit in μB from a mass magnetisation σ (A m²/kg):
 * p = σ·Mw/(N_A μB) (reference C7, CODATA 2018 μB).
 */
export function muBPerFormulaUnit(sigmaAm2PerKg: number, molarMassKgPerMol: number): number {
  requireMolarMass(molarMassKgPerMol);
  return (sigmaAm2PerKg * molarMassKgPerMol) / (PHYS.NA * PHYS.muB);
}

/** Mass magnetisation (A m²/kg) from a molar one (A m²/mol). */
export function massFromMolar(values: ArrayLike<number>, molarMassKgPerMol: number): Float64Array {
  requireMolarMass(molarMassKgPerMol);
  const out = new Float64Array(values.length);
  for (let i = 0; i < values.length; i++) {
    out[i] = values[i] / molarMassKgPerMol;
  }
  return out;
}

/**
 * Converts a value between two units of the private mathjs instance (e.g.
 * 'kOe' → 'A/m', 'emu/g' → 'A m^2/kg'). Throws `UnitInputError` when a unit is
 * unknown or the dimensions differ. Temperatures with offsets (degC) are
 * converted as absolute temperatures.
 */
export function convertQuantity(value: number, from: string, to: string): number {
  if (parseMathUnit(normaliseUnitText(from)) === null) {
    throw new UnitInputError(`unknown unit "${from}"`);
  }
  try {
    return unitMath().unit(value, normaliseUnitText(from)).to(normaliseUnitText(to)).toNumber();
  } catch (e) {
    throw new UnitInputError(`cannot convert "${from}" to "${to}": ${(e as Error).message}`);
  }
}
