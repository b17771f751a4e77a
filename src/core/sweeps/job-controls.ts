/**
 * The controls of the isotherm analysis checked at the boundary, and the
 * table read into an isotherm set with them: units typed over the headers,
 * sample mass and density, the grouping tolerance and N_d in either
 * convention. Every refusal says which control is wrong and why.
 */
import { messageOf, msg } from '../messages';
import type { ICoreMessage } from '../messages';
import { readColumnUnit } from '../units/index';
import { demagnetisingFactorSI } from './demag';
import type { IIsothermControls, IIsothermJob, IIsothermJobColumn } from './job-types';
import { buildIsothermSet } from './table';
import type { ISweepColumn } from './table';
import type { IIsothermSet } from './types';

/** Default |t| window of the exponent fits. */
export const DEFAULT_T_MAX = 0.1;
/** Most bootstrap resamples accepted. */
export const MAX_BOOTSTRAP_SAMPLES = 1000;

/** The controls as the job uses them (defaults applied, SI where it matters). */
export interface IResolvedControls {
  tMax: number;
  /** N_d in SI (0–1), or null when unset. */
  demagSI: number | null;
  /** Field range of the applied field, A/m (±∞ when open). */
  hAppliedMin: number;
  hAppliedMax: number;
  bootstrapSamples: number;
}

/** A refusal or needs-unit answer of the boundary. */
export type ControlProblem = { status: 'refused'; message: ICoreMessage } | { status: 'needs-unit'; message: ICoreMessage; options: string[] };

function shown(v: unknown): number | string {
  return typeof v === 'number' ? v : String(v);
}

const refuse = (message: ICoreMessage): ControlProblem => ({ status: 'refused', message });

/** Checks the controls that do not depend on the table; null when all are usable. */
export function checkControls(c: IIsothermControls): ControlProblem | null {
  if (c.temperatureToleranceK !== null && !(Number.isFinite(c.temperatureToleranceK) && c.temperatureToleranceK >= 0)) {
    return refuse(
      msg('sweeps.job.tolerance', 'The temperature tolerance must be a finite number of kelvin, at least 0, but it is %1.', shown(c.temperatureToleranceK))
    );
  }
  if (c.sampleMassMg !== null && !(Number.isFinite(c.sampleMassMg) && c.sampleMassMg > 0)) {
    return refuse(msg('sweeps.job.mass', 'The sample mass must be a finite number of milligrams above 0, but it is %1.', shown(c.sampleMassMg)));
  }
  if (c.densityGPerCm3 !== null && !(Number.isFinite(c.densityGPerCm3) && c.densityGPerCm3 > 0)) {
    return refuse(msg('sweeps.job.density', 'The density must be a finite number of g/cm³ above 0, but it is %1.', shown(c.densityGPerCm3)));
  }
  if (c.fieldMin !== null && !Number.isFinite(c.fieldMin)) {
    return refuse(msg('sweeps.job.field-min', 'The lowest field of the range must be a finite number, but it is %1.', shown(c.fieldMin)));
  }
  if (c.fieldMax !== null && !Number.isFinite(c.fieldMax)) {
    return refuse(msg('sweeps.job.field-max', 'The highest field of the range must be a finite number, but it is %1.', shown(c.fieldMax)));
  }
  if (c.fieldMin !== null && c.fieldMax !== null && !(c.fieldMin < c.fieldMax)) {
    return refuse(msg('sweeps.job.field-range', 'The field range is empty: its lowest field (%1) is not below its highest (%2).', c.fieldMin, c.fieldMax));
  }
  if (c.tMax !== null && !(Number.isFinite(c.tMax) && c.tMax > 0 && c.tMax <= 1)) {
    return refuse(msg('sweeps.job.t-max', 'The largest |t| must be a finite number above 0 and at most 1, but it is %1.', shown(c.tMax)));
  }
  if (c.bootstrapSamples !== null && c.bootstrapSamples !== 0) {
    const b = c.bootstrapSamples;
    if (!(Number.isInteger(b) && b >= 2 && b <= MAX_BOOTSTRAP_SAMPLES)) {
      return refuse(
        msg('sweeps.job.bootstrap', 'The number of bootstrap resamples must be 0 or a whole number from 2 to %1, but it is %2.', MAX_BOOTSTRAP_SAMPLES, shown(b))
      );
    }
  }
  if (c.demag !== null) {
    if (c.demag.convention !== 'SI' && c.demag.convention !== 'cgs') {
      return refuse(msg('sweeps.job.demag-convention', 'The convention of the demagnetising factor must be SI (0 to 1) or cgs (0 to 4π), but it is %1.', shown(c.demag.convention)));
    }
    try {
      demagnetisingFactorSI(c.demag);
    } catch (e) {
      return refuse(messageOf(e));
    }
  }
  return null;
}

/** A unit typed over the header ('' counts as blank). */
function overridden(col: IIsothermJobColumn, unit: string | null): ISweepColumn {
  const u = unit !== null && unit.trim() !== '' ? unit.trim() : col.unit;
  return { name: col.name, unit: u, values: col.values };
}

/** Reads the table into an isotherm set with the controls (no field range or point filtering yet). */
export function readIsothermTable(job: IIsothermJob): { set: IIsothermSet; controls: IResolvedControls } | ControlProblem {
  const c = job.controls;
  const T = overridden(job.temperature, c.units.temperature);
  const H = overridden(job.field, c.units.field);
  const M = overridden(job.magnetisation, c.units.magnetisation);
  const n = T.values.length;
  if (n === 0 && H.values.length === 0 && M.values.length === 0) {
    return refuse(msg('sweeps.job.empty', 'The columns are empty: there are no rows to analyse.'));
  }
  let answer;
  try {
    answer = buildIsothermSet({
      temperature: T,
      field: H,
      magnetisation: M,
      sample: {
        massKg: c.sampleMassMg !== null ? c.sampleMassMg * 1e-6 : undefined,
        densityKgPerM3: c.densityGPerCm3 !== null ? c.densityGPerCm3 * 1e3 : undefined
      },
      demag: c.demag ?? undefined,
      temperatureTolerance: c.temperatureToleranceK ?? undefined
    });
  } catch (e) {
    return refuse(messageOf(e));
  }
  if (answer.status === 'needs-unit') {
    return { status: 'needs-unit', message: answer.message, options: answer.options };
  }
  if (answer.status !== 'ok') {
    return refuse(answer.message);
  }
  // the field range is typed in the field column's unit: convert it with that column's factor
  const unit = c.fieldMin !== null || c.fieldMax !== null ? readColumnUnit(H.name, H.unit, 'field') : null;
  const toSI = (v: number | null, open: number): number => (v === null || unit === null || unit.status !== 'ok' ? open : unit.factor * v + unit.offset);
  return {
    set: answer.set,
    controls: {
      tMax: c.tMax ?? DEFAULT_T_MAX,
      demagSI: c.demag !== null ? demagnetisingFactorSI(c.demag) : null,
      hAppliedMin: toSI(c.fieldMin, -Infinity),
      hAppliedMax: toSI(c.fieldMax, Infinity),
      bootstrapSamples: c.bootstrapSamples ?? 0
    }
  };
}
