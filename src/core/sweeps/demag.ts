/**
 * Demagnetisation correction ([C7 in REFERENCES.md]): SI H_int = H_a − N_d·M with
 * N_d dimensionless (0..1, sphere 1/3), cgs H_int = H_a − 4π N_d M, and
 * tables that quote N_cgs = 4π N_d (0..4π). M must be a volume magnetisation.
 */
import { msg } from '../messages';
import { wholeNumber } from '../numeric/messageArgs';
import { SweepInputError } from './types';

/** Demagnetising factor as given by the user. */
export interface IDemagnetisingFactor {
  value: number;
  /** 'SI': N_d in 0..1; 'cgs': N_cgs = 4π N_d in 0..4π. */
  convention: 'SI' | 'cgs';
}

/** N_d (SI, dimensionless) from either convention; throws on values outside the physical range. */
export function demagnetisingFactorSI(N: IDemagnetisingFactor): number {
  if (!Number.isFinite(N.value)) {
    throw new SweepInputError(
      msg('sweeps.demag-not-finite', 'The demagnetising factor must be a finite number, but it is %1.', typeof N.value === 'number' ? N.value : String(N.value))
    );
  }
  const si = N.convention === 'cgs' ? N.value / (4 * Math.PI) : N.value;
  if (si < 0 || si > 1) {
    throw new SweepInputError(
      N.convention === 'cgs'
        ? msg('sweeps.demag-out-of-range-cgs', 'The demagnetising factor %1 (cgs) is outside 0 to 4π.', N.value)
        : msg('sweeps.demag-out-of-range-si', 'The demagnetising factor %1 (SI) is outside 0 to 1.', N.value)
    );
  }
  return si;
}

/** H_int = H_a − N_d·M, all in A/m (SI). Returns a new array. */
export function internalField(Ha: ArrayLike<number>, M: ArrayLike<number>, N: IDemagnetisingFactor): Float64Array {
  if (Ha.length !== M.length) {
    throw new SweepInputError(
      msg('sweeps.field-magnetisation-lengths', 'There are %1 fields but %2 magnetisations: give one of each per point.', wholeNumber(Ha.length), wholeNumber(M.length))
    );
  }
  const n = demagnetisingFactorSI(N);
  const out = new Float64Array(Ha.length);
  for (let i = 0; i < Ha.length; i++) {
    out[i] = Ha[i] - n * M[i];
  }
  return out;
}

/** cgs form: H_int (Oe) = H_a (Oe) − 4π N_d M (emu/cm³). */
export function internalFieldCgs(HaOe: number, MemuPerCm3: number, N: IDemagnetisingFactor): number {
  return HaOe - 4 * Math.PI * demagnetisingFactorSI(N) * MemuPerCm3;
}

/** Volume magnetisation (A/m) from a mass magnetisation (A m²/kg) and the density (kg/m³). */
export function volumeMagnetisation(sigma: ArrayLike<number>, densityKgPerM3: number): Float64Array {
  if (!(densityKgPerM3 > 0) || !Number.isFinite(densityKgPerM3)) {
    throw new SweepInputError(
      msg('sweeps.density-invalid', 'The density must be a finite number of kg/m³ above 0, but it is %1.', typeof densityKgPerM3 === 'number' ? densityKgPerM3 : String(densityKgPerM3))
    );
  }
  const out = new Float64Array(sigma.length);
  for (let i = 0; i < sigma.length; i++) {
    out[i] = sigma[i] * densityKgPerM3;
  }
  return out;
}

/** Measured (apparent) susceptibility of a sample of true χ: χ/(1 + N_d χ). */
export function apparentSusceptibility(chi: number, N: IDemagnetisingFactor): number {
  return chi / (1 + demagnetisingFactorSI(N) * chi);
}
