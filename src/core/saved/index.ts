/**
 * Analyses saved in a notebook's metadata (key `psiscape`, format version 2,
 * schema in `schema/saved-analyses.v2.json`), so that whoever opens the
 * notebook sees them again without a kernel. Reading never throws and never
 * loses what it cannot read; writing builds on the raw metadata value and
 * keeps what this version does not know.
 */
import type { ISavedAnalysis, ISavedDeps, ISavedRead, SavedWriteResult } from './types';
import { catalogueKinds } from './kinds';
import { readSavedWith } from './read';
import { removeSavedWith, upsertSavedWith } from './write';
import { removeExplorerWith, upsertExplorerWith } from './explorers';
import type { ISavedExplorer } from './explorers';

/**
 * Read what a notebook holds under {@link SAVED_KEY}. Never throws: see
 * {@link readSavedWith}. `deps.kinds` defaults to the analysis-kind catalogue.
 */
export function readSaved(value: unknown, deps: ISavedDeps = {}): ISavedRead {
  return readSavedWith(value, deps.kinds ?? catalogueKinds);
}

/**
 * Add or replace one analysis in the metadata value `raw`, keeping all else.
 * Never throws: see {@link upsertSavedWith}.
 */
export function upsertSaved(raw: unknown, entry: ISavedAnalysis, deps: ISavedDeps = {}): SavedWriteResult {
  return upsertSavedWith(raw, entry, deps.kinds ?? catalogueKinds);
}

/**
 * Remove one analysis from the metadata value `raw`, keeping all else.
 * Never throws: see {@link removeSavedWith}.
 */
export function removeSaved(raw: unknown, id: string, deps: ISavedDeps = {}): SavedWriteResult {
  return removeSavedWith(raw, id, deps.kinds ?? catalogueKinds);
}

/** Add or replace one Landau explorer in the metadata value `raw`, keeping all else. Never throws. */
export function upsertExplorer(raw: unknown, entry: ISavedExplorer, deps: ISavedDeps = {}): SavedWriteResult {
  return upsertExplorerWith(raw, entry, deps.kinds ?? catalogueKinds);
}

/** Remove one Landau explorer from the metadata value `raw`, keeping all else. Never throws. */
export function removeExplorer(raw: unknown, id: string, deps: ISavedDeps = {}): SavedWriteResult {
  return removeExplorerWith(raw, id, deps.kinds ?? catalogueKinds);
}

export { EXPLORER_CONVENTIONS, readSavedExplorers, removeExplorerWith, upsertExplorerWith } from './explorers';
export type { ISavedExplorer, ISavedExplorersRead } from './explorers';
export { classifyBlock, readSavedWith } from './read';
export type { BlockState } from './read';
export { removeSavedWith, upsertSavedWith } from './write';
export { migrateV1Block, migrateV1Entry } from './migrate';
export { hashSnapshotValues, snapshotOf, snapshotRows } from './snapshot';
export { SAVED_SCHEMA, SAVED_SCHEMA_ID } from './schema';
export { catalogueKinds } from './kinds';
export { jsonEqual } from './json';
export { isSnapshotOmitted, SAVED_KEY, SAVED_VERSION, SNAPSHOT_CELL_LIMIT } from './types';
export type {
  ISavedAnalysis,
  ISavedColumnRef,
  ISavedDeps,
  ISavedKinds,
  ISavedRead,
  ISavedSettings,
  ISavedSnapshotOmitted,
  ISavedSnapshotValues,
  SavedOptionValue,
  SavedSnapshot,
  SavedWriteResult
} from './types';
