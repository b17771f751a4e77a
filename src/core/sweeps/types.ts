/**
 * Data model of field sweeps: a family of M(H) isotherms in SI units, with
 * the conventions used to build it and the warnings collected on the way.
 */

/** A value with its standard uncertainty σ (NaN when unknown). */
export interface IValueSigma {
  value: number;
  sigma: number;
}

/** Sweep direction of a branch. */
export type Branch = 'up' | 'down' | 'unspecified';

/** One isotherm: field and magnetisation at one temperature setpoint. */
export interface IIsotherm {
  /** Mean temperature of the rows grouped into this isotherm, K. */
  T: number;
  /** Largest − smallest temperature of those rows, K. */
  TSpread: number;
  branch: Branch;
  /** Field in A/m: internal when the set's `fieldKind` is 'internal', else applied. */
  H: Float64Array;
  /** Magnetisation in the set's `magnetisationUnit`. */
  M: Float64Array;
  /** Source rows of each point (empty when built from arrays). */
  rows: number[];
}

/** Units the user's table used, kept for display. */
export interface IDisplayUnits {
  temperature: string;
  field: string;
  magnetisation: string;
}

/** A family of isotherms, SI inside. */
export interface IIsothermSet {
  isotherms: IIsotherm[];
  /** 'internal': H_int = H_a − N_d·M applied; 'applied': no demagnetisation correction. */
  fieldKind: 'internal' | 'applied';
  /** 'A/m' (volume magnetisation) or 'A m^2/kg' (mass magnetisation). */
  magnetisationUnit: 'A/m' | 'A m^2/kg';
  /** Demagnetising factor used (SI, 0..1), or null when unset. */
  demagnetisingFactorSI: number | null;
  display: IDisplayUnits;
  conventions: string[];
  warnings: string[];
}

/** Invalid input to a sweep analysis (thrown at the boundary with a precise message). */
export class SweepInputError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'SweepInputError';
  }
}

/** Field and temperature conventions written into every analysis result. */
export interface ISweepConventions {
  /** Reduced temperature definition. */
  t: string;
  /** 'internal' or 'applied' field. */
  field: 'internal' | 'applied';
  units: { T: 'K'; H: 'A/m'; M: 'A/m' | 'A m^2/kg' };
  notes: string[];
}

/** Standard text of the reduced temperature used throughout. */
export const T_CONVENTION = 't = (T - Tc)/Tc, negative in the ordered phase';

/** Conventions block for a set. */
export function conventionsOf(set: IIsothermSet, notes: string[] = []): ISweepConventions {
  return {
    t: T_CONVENTION,
    field: set.fieldKind,
    units: { T: 'K', H: 'A/m', M: set.magnetisationUnit },
    notes
  };
}

/** The plain warning every Arrott-type analysis carries while N_d is unset. */
export const DEMAG_UNSET_WARNING =
  'demagnetising factor N_d is not set: the field is the applied field, not the internal field. ' +
  'Low-field curvature of Arrott isotherms, a shifted Tc and a wrong delta can follow.';

/** Warnings inherited by every analysis of a set. */
export function setWarnings(set: IIsothermSet): string[] {
  const out = set.warnings.slice();
  if (set.fieldKind === 'applied' && !out.includes(DEMAG_UNSET_WARNING)) {
    out.push(DEMAG_UNSET_WARNING);
  }
  return out;
}
