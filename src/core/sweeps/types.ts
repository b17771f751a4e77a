/**
 * Data model of field sweeps: a family of M(H) isotherms in SI units, with
 * the conventions used to build it and the warnings collected on the way.
 */
import { CoreMessageError, msg } from '../messages';
import type { ICoreMessage } from '../messages';

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
  /** How the table was read: unit conversions, normalisations, the field correction (codes `sweeps.convention.*`). */
  conventions: ICoreMessage[];
  /** What limits every analysis of the set (codes `sweeps.*`). */
  warnings: ICoreMessage[];
}

/** Invalid input to a sweep analysis (thrown at the boundary; `detail` holds the message, codes `sweeps.*`). */
export class SweepInputError extends CoreMessageError {
  constructor(detail: ICoreMessage) {
    super(detail);
    this.name = 'SweepInputError';
  }
}

/** Field and temperature conventions written into every analysis result. */
export interface ISweepConventions {
  /** Reduced temperature definition (code `sweeps.convention.t`). */
  t: ICoreMessage;
  /** 'internal' or 'applied' field. */
  field: 'internal' | 'applied';
  units: { T: 'K'; H: 'A/m'; M: 'A/m' | 'A m^2/kg' };
  /** How the analysis was done (plots, fitted forms, windows). */
  notes: ICoreMessage[];
}

/** Standard text of the reduced temperature used throughout. */
export const T_CONVENTION: ICoreMessage = Object.freeze(msg('sweeps.convention.t', 't = (T − Tc)/Tc, negative in the ordered phase.'));

/** Conventions block for a set. */
export function conventionsOf(set: IIsothermSet, notes: ICoreMessage[] = []): ISweepConventions {
  return {
    t: T_CONVENTION,
    field: set.fieldKind,
    units: { T: 'K', H: 'A/m', M: set.magnetisationUnit },
    notes
  };
}

/** The plain warning every Arrott-type analysis carries while N_d is unset. */
export const DEMAG_UNSET_WARNING: ICoreMessage = Object.freeze(
  msg(
    'sweeps.demag-unset',
    'The demagnetising factor N_d is not set, so the field is the applied field, not the internal one. Arrott isotherms may then curve at low field, and Tc and δ may come out shifted: give N_d.'
  )
);

/** Warnings inherited by every analysis of a set. */
export function setWarnings(set: IIsothermSet): ICoreMessage[] {
  const out = set.warnings.slice();
  if (set.fieldKind === 'applied' && !out.some(w => w.code === DEMAG_UNSET_WARNING.code)) {
    out.push(DEMAG_UNSET_WARNING);
  }
  return out;
}

/** The messages without repeats (same code and arguments), in their first order. */
export function uniqueMessages(messages: readonly ICoreMessage[]): ICoreMessage[] {
  const seen = new Set<string>();
  const out: ICoreMessage[] = [];
  for (const m of messages) {
    const key = `${m.code}\u0000${JSON.stringify(m.args)}`;
    if (!seen.has(key)) {
      seen.add(key);
      out.push(m);
    }
  }
  return out;
}
