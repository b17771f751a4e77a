/**
 * The analysis-kind catalogue as the saved format uses it: which kinds exist,
 * whether saved settings suit their kind, and each kind's option names.
 */
import { isKnownKind, kindById, validateKindSettings } from '../analysis/kinds';
import type { ISavedKinds } from './types';

/** The catalogue of src/core/analysis/kinds. */
export const catalogueKinds: ISavedKinds = {
  isKnownKind,
  validateKindSettings,
  optionNames: kind => Object.keys(kindById(kind)?.options ?? {})
};
