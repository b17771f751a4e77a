/**
 * SI values of a set back in the user's units, for display: the units the
 * table was read in, when the normalisation allows it, otherwise SI with a
 * note (a moment normalised by mass cannot be shown in emu without the mass).
 */
import { msg } from '../messages';
import type { ICoreMessage } from '../messages';
import { fromSI, readColumnUnit } from '../units/index';
import type { IIsothermSet } from './types';

/** Values converted for display with the unit they are in. */
export interface IDisplayValues {
  values: Float64Array;
  unit: string;
  /** Why the values are in SI rather than the table's unit (code `sweeps.display.si`), else null. */
  note: ICoreMessage | null;
}

/** Converts SI temperature (K), field (A/m) or magnetisation values of `set` to the user's unit. */
export function toDisplayUnits(set: IIsothermSet, quantity: 'temperature' | 'field' | 'magnetisation', values: ArrayLike<number>): IDisplayValues {
  const unit = set.display[quantity];
  const siUnit = quantity === 'temperature' ? 'K' : quantity === 'field' ? 'A/m' : set.magnetisationUnit;
  const reading = readColumnUnit(quantity, unit, quantity);
  if (reading.status === 'ok' && reading.siUnit === siUnit) {
    return { values: fromSI(values, reading), unit, note: null };
  }
  return {
    values: Float64Array.from(values),
    unit: siUnit,
    note: msg('sweeps.display.si', 'Shown in %1: the data were normalised from %2, which cannot be shown directly.', siUnit, unit)
  };
}
