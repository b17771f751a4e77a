/**
 * Magnetic normalisations that need sample data: moment per formula unit
 * from a mass magnetisation and the molar mass, and free conversions of a
 * quantity between two units of the private mathjs instance.
 */
import { CoreMessageError, msg } from '../messages';
import type { ICoreMessage } from '../messages';
import { PHYS } from './constants';
import { normaliseUnitText, parseMathUnit, unitMath } from './mathUnits';

/** Error for an invalid unit or sample parameter at the boundary (codes `units.*`). */
export class UnitInputError extends CoreMessageError {
  constructor(detail: ICoreMessage) {
    super(detail);
    this.name = 'UnitInputError';
  }
}

function requireMolarMass(molarMassKgPerMol: number): void {
  if (!(molarMassKgPerMol > 0) || !Number.isFinite(molarMassKgPerMol)) {
    throw new UnitInputError(
      msg(
        'units.molar-mass-invalid',
        'The molar mass must be a finite number of kg/mol above 0, but it is %1.',
        typeof molarMassKgPerMol === 'number' ? molarMassKgPerMol : String(molarMassKgPerMol)
      )
    );
  }
}

/**
 * Moment per formula unit in μB from a mass magnetisation σ (A m²/kg):
 * p = σ·Mw/(N_A μB) (CODATA 2018 μB, [C7 in REFERENCES.md]).
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
  for (const unit of [from, to]) {
    if (parseMathUnit(normaliseUnitText(unit)) === null) {
      throw new UnitInputError(msg('units.unknown', 'The unit “%1” is not known.', unit));
    }
  }
  try {
    return unitMath().unit(value, normaliseUnitText(from)).to(normaliseUnitText(to)).toNumber();
  } catch {
    throw new UnitInputError(msg('units.cannot-convert', 'A quantity in “%1” cannot be expressed in “%2”: they measure different things.', from, to));
  }
}

/** Which normalisation a susceptibility carries. */
export type SusceptibilityKind = 'volume' | 'mass' | 'molar';

/**
 * cgs-emu susceptibility to SI (NBS SP 696, [C7 in REFERENCES.md]): volume χ_SI = 4π χ_cgs
 * (dimensionless); mass 1 cm³/g = 4π·1e-3 m³/kg; molar 1 cm³/mol = 4π·1e-6 m³/mol.
 */
export function susceptibilityCgsToSI(value: number, kind: SusceptibilityKind): number {
  const f = kind === 'volume' ? 4 * Math.PI : kind === 'mass' ? 4 * Math.PI * 1e-3 : 4 * Math.PI * 1e-6;
  return value * f;
}

/** Volume magnetisation in A/m from 4πM given in gauss (× 1e3/(4π), [C7 in REFERENCES.md]). */
export function magnetisationFromFourPiMGauss(fourPiM: number): number {
  return (fourPiM * 1e3) / (4 * Math.PI);
}
