/**
 * Tables for the isotherm job: Arrott–Noakes isotherms (REFERENCE.md B6) on
 * a grid of internal fields, turned into what a magnetometer records — the
 * applied field H_a = H_int + N_d·M (SI, REFERENCE.md A5.1) in Oe
 * (1 Oe = 1000/(4π) A/m, C7), M in emu/cm³ (1 emu/cm³ = 1e3 A/m, C7) with
 * relative Gaussian noise, and the thermometer reading with Gaussian jitter.
 */
import type { IIsothermJob, IIsothermControls } from '../../../src/core/sweeps/index';
import { DEFAULT_ISOTHERM_CONTROLS } from '../../../src/core/sweeps/index';
import type { IANParams } from './generators';
import { anMagnetisation, linspace, normal } from './generators';

/** Oe per A/m (C7). */
export const OE_PER_A_PER_M = (4 * Math.PI) / 1000;

export interface IJobTableOptions {
  params: IANParams;
  temperatures: readonly number[];
  /** Internal fields, A/m. */
  fields: readonly number[];
  /** N_d (SI) of the sample: the table holds H_a = H_int + N_d·M. */
  demagSI: number;
  relNoise: number;
  /** σ of the thermometer reading, K. */
  jitterK: number;
  seed: number;
}

/** Columns T (K), H (Oe), M (emu/cm3), one row per point, isotherm after isotherm. */
export function jobTable(o: IJobTableOptions): { T: number[]; H: number[]; M: number[] } {
  const g = normal(o.seed);
  const T: number[] = [];
  const H: number[] = [];
  const M: number[] = [];
  for (const Tset of o.temperatures) {
    for (const Hint of o.fields) {
      const m = anMagnetisation(o.params, Tset, Hint);
      const Ha = Hint + o.demagSI * m;
      T.push(Tset + o.jitterK * g());
      H.push(Ha * OE_PER_A_PER_M);
      M.push((m * (1 + o.relNoise * g())) / 1e3);
    }
  }
  return { T, H, M };
}

/** The job of a table with the default controls, `demag` changed. */
export function jobOf(t: { T: readonly number[]; H: readonly number[]; M: readonly number[] }, demag: IIsothermControls['demag'] = null, units = { T: 'K', H: 'Oe', M: 'emu/cm3' }): IIsothermJob {
  return {
    temperature: { name: `T (${units.T})`, unit: units.T, values: Float64Array.from(t.T) },
    field: { name: `H (${units.H})`, unit: units.H, values: Float64Array.from(t.H) },
    magnetisation: { name: `M (${units.M})`, unit: units.M, values: Float64Array.from(t.M) },
    controls: { ...DEFAULT_ISOTHERM_CONTROLS, units: { ...DEFAULT_ISOTHERM_CONTROLS.units }, demag }
  };
}

export { linspace };
