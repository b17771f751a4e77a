/**
 * Why the explorer cannot draw the values entered, as one message, or null
 * when they give a landscape.
 */
import { messageOf } from '../../core/messages';
import { translateMessage } from '../translate';
import type { TranslationBundle } from '@jupyterlab/translation';
import type { ILandauCoefficients } from '../../core/physics/landau/index';
import { validateLandau } from '../../core/physics/landau/index';

/** What was entered, as the explorer holds it. */
export interface IEnteredValues {
  /** Message about a number field that holds no finite number, or null. */
  badText: string | null;
  /** Message of a refused conversion to convention L, or null. */
  conversionError: string | null;
  /** Coefficients in convention L (null when the conversion failed). */
  k: ILandauCoefficients | null;
  T: number;
  h: number;
}

/** The message shown instead of a new picture, or null when the values can be drawn. */
export function explorerProblem(v: IEnteredValues, trans: TranslationBundle): string | null {
  const keep = trans.__('The charts and the table still show the last valid values.');
  if (v.badText) {
    return `${v.badText} ${keep}`;
  }
  if (v.conversionError !== null || !v.k) {
    return trans.__('These coefficients cannot be converted to convention L: %1. %2', v.conversionError ?? '', keep);
  }
  try {
    validateLandau(v.k);
  } catch (e) {
    return trans.__('No landscape for these values (checked in convention L): %1 %2', translateMessage(trans, messageOf(e)), keep);
  }
  if (!Number.isFinite(v.T) || !Number.isFinite(v.h)) {
    return trans.__('No landscape for these values: T and h must be finite numbers. %1', keep);
  }
  return null;
}
