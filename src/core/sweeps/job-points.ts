/**
 * The points of an isotherm set the analysis uses: the field range of the
 * controls (on the applied field), fields above 0 only, points whose internal
 * field the demagnetisation correction makes zero or negative left out with
 * one warning naming the isotherms, repeated (H, M) points taken once, and
 * isotherms left with fewer than three points dropped.
 */
import { formatNumberArg, msg } from '../messages';
import type { ICoreMessage } from '../messages';
import { wholeNumber } from '../numeric/messageArgs';
import type { IFieldUse } from './job-types';
import type { IIsotherm, IIsothermSet } from './types';

/** Fewest points an isotherm keeps to stay in the analysis. */
export const MIN_POINTS_PER_ISOTHERM = 3;

/** The filtered set, what was used, and what was said about it. */
export interface IPointSelection {
  set: IIsothermSet;
  fieldUse: IFieldUse;
  /** Points the correction made H_int ≤ 0 (applied field above 0). */
  demagDropped: number;
  warnings: ICoreMessage[];
  conventions: ICoreMessage[];
}

const temperatures = (list: readonly number[]): string => list.map(t => formatNumberArg(t, 5)).join(', ');

/**
 * Filters the set's points. `rows` is the number of rows in the table;
 * `nSI` the demagnetising factor the set was built with (the applied field is
 * H + N_d·M), `hMin`/`hMax` the range of the applied field in A/m.
 */
export function selectPoints(set: IIsothermSet, rows: number, nSI: number | null, hMin: number, hMax: number): IPointSelection {
  const warnings: ICoreMessage[] = [];
  const conventions: ICoreMessage[] = [];
  const demagAt: number[] = [];
  let demagDropped = 0;
  let nonPositive = 0;
  let repeated = 0;
  const short: number[] = [];
  const isotherms: IIsotherm[] = [];
  let lo = Infinity;
  let hi = -Infinity;
  let used = 0;
  for (const iso of set.isotherms) {
    const keep: number[] = [];
    let fromDemag = 0;
    for (let i = 0; i < iso.H.length; i++) {
      const H = iso.H[i];
      const Ha = nSI === null ? H : H + nSI * iso.M[i];
      if (!(Ha >= hMin && Ha <= hMax)) {
        continue;
      }
      if (!(H > 0)) {
        if (Ha > 0) {
          fromDemag++;
        } else {
          nonPositive++;
        }
        continue;
      }
      const last = keep.length > 0 ? keep[keep.length - 1] : -1;
      // points are sorted by H: a repeat of the previous (H, M) is the same measurement twice
      if (last >= 0 && iso.H[last] === H && iso.M[last] === iso.M[i]) {
        repeated++;
        continue;
      }
      keep.push(i);
    }
    if (fromDemag > 0) {
      demagAt.push(iso.T);
      demagDropped += fromDemag;
    }
    if (keep.length < MIN_POINTS_PER_ISOTHERM) {
      if (keep.length > 0 || fromDemag === 0) {
        short.push(iso.T);
      }
      continue;
    }
    const H = Float64Array.from(keep, i => iso.H[i]);
    const M = Float64Array.from(keep, i => iso.M[i]);
    lo = Math.min(lo, H[0]);
    hi = Math.max(hi, H[H.length - 1]);
    used += keep.length;
    isotherms.push({ ...iso, H, M, rows: iso.rows.length === iso.H.length ? keep.map(i => iso.rows[i]) : [] });
  }
  if (demagDropped > 0) {
    warnings.push(
      msg(
        'sweeps.job.demag-negative',
        'With N_d = %1 (SI) the internal field H_a − N_d·M is zero or negative at %2 points of the isotherms at %3 K: those points were left out. A demagnetising factor this large may not fit the sample’s shape.',
        { value: nSI ?? NaN, digits: 4 },
        wholeNumber(demagDropped),
        temperatures(demagAt)
      )
    );
  }
  if (nonPositive > 0) {
    warnings.push(msg('sweeps.job.non-positive-field', 'Points at zero or negative applied field (%1) were left out: the analyses use fields above 0.', wholeNumber(nonPositive)));
  }
  if (repeated > 0) {
    warnings.push(msg('sweeps.job.repeated-points', 'Repeated points (the same field and magnetisation in one isotherm) were taken once: %1 repeats.', wholeNumber(repeated)));
  }
  if (short.length > 0) {
    warnings.push(
      msg('sweeps.job.short-isotherms', 'The isotherms at %1 K have fewer than %2 usable points and were left out.', temperatures(short), MIN_POINTS_PER_ISOTHERM)
    );
  }
  if (Number.isFinite(hMin) || Number.isFinite(hMax)) {
    conventions.push(
      msg(
        'sweeps.convention.field-range',
        'Field range applied to the applied field (the column’s values): %1 to %2 A/m.',
        Number.isFinite(hMin) ? hMin : '−∞',
        Number.isFinite(hMax) ? hMax : '∞'
      )
    );
  }
  return {
    set: { ...set, isotherms },
    fieldUse: { used, total: rows, hMin: used > 0 ? lo : NaN, hMax: used > 0 ? hi : NaN },
    demagDropped,
    warnings,
    conventions
  };
}
