/**
 * Format 1 → format 2. Format 1 named the plotted columns by header alone and
 * held the settings of the last fit under `fit` ({model, options, window,
 * starts}). Migrated entries name columns by `{ index: -1, header }` ("the
 * first column with this header"), and `fit` becomes `settings` ({kind,
 * options, window}, the start values of the expression model moving into
 * options.starts). Fields format 1 did not know are kept, in their order.
 */
import { msg } from '../messages';
import type { ICoreMessage } from '../messages';
import { has, isRecord, own, recordOf } from './json';
import type { JsonRecord } from './json';
import type { ISavedKinds } from './types';

function columnRef(header: unknown): JsonRecord | null {
  return header === null ? null : { index: -1, header };
}

function migrateColumns(columns: JsonRecord): JsonRecord {
  return recordOf(Object.keys(columns).map(k => [k, k === 'x' || k === 'y' || k === 'sigma' ? columnRef(columns[k]) : columns[k]] as const));
}

/**
 * Options of a format 1 fit. Format 1 wrote every model's options for every
 * model, so a known kind keeps only its own; ±∞ (null for J) becomes "inf",
 * other nulls (NaN written by format 1) are dropped.
 */
function migrateOptions(options: JsonRecord, kind: unknown, starts: unknown, kinds: ISavedKinds): JsonRecord {
  const known = typeof kind === 'string' && kinds.isKnownKind(kind) ? new Set(kinds.optionNames(kind)) : null;
  const entries: [string, unknown][] = [];
  for (const key of Object.keys(options)) {
    const value = options[key];
    if (known && !known.has(key)) {
      continue;
    }
    if (value === null) {
      if (key === 'J') {
        entries.push([key, 'inf']);
      }
      continue;
    }
    entries.push([key, value]);
  }
  if (kind === 'expression' && typeof starts === 'string' && !entries.some(([k]) => k === 'starts')) {
    entries.push(['starts', starts]);
  }
  return recordOf(entries);
}

function migrateFit(fit: JsonRecord, kinds: ISavedKinds): JsonRecord {
  const model = own(fit, 'model');
  const entries: [string, unknown][] = [];
  for (const key of Object.keys(fit)) {
    if (key === 'model') {
      entries.push(['kind', model]);
    } else if (key === 'options') {
      entries.push([key, isRecord(fit[key]) ? migrateOptions(fit[key] as JsonRecord, model, own(fit, 'starts'), kinds) : fit[key]]);
    } else if (key !== 'starts') {
      entries.push([key, fit[key]]);
    }
  }
  return recordOf(entries);
}

/**
 * Why a format 1 entry (a record) cannot be migrated, or null when it can.
 * Such entries are kept as they are.
 */
export function v1Problem(entry: JsonRecord, label: string): ICoreMessage | null {
  const columns = own(entry, 'columns');
  const fit = own(entry, 'fit');
  const header = (v: unknown) => typeof v === 'string';
  if (!isRecord(columns) || !header(own(columns, 'x')) || !header(own(columns, 'y')) || !(own(columns, 'sigma') === null || header(own(columns, 'sigma')))) {
    return msg('saved.v1-columns', 'saved analysis %1 (format 1) does not name its x and y columns by header, and its σ column by header or null', label);
  }
  if (!(fit === null || fit === undefined || isRecord(fit)) || has(entry, 'settings')) {
    return msg('saved.v1-fit', 'saved analysis %1 (format 1) has fit settings that are not a record', label);
  }
  return null;
}

/** One format 1 entry in format 2; an entry that cannot be migrated is returned as it is. */
export function migrateV1Entry(entry: unknown, kinds: ISavedKinds): unknown {
  if (!isRecord(entry) || v1Problem(entry, '') !== null) {
    return entry;
  }
  const entries: [string, unknown][] = [];
  for (const key of Object.keys(entry)) {
    const value = entry[key];
    if (key === 'columns') {
      entries.push([key, migrateColumns(value as JsonRecord)]);
    } else if (key === 'fit') {
      entries.push(['settings', isRecord(value) ? migrateFit(value, kinds) : null]);
    } else {
      entries.push([key, value]);
    }
  }
  if (!has(entry, 'fit')) {
    entries.push(['settings', null]);
  }
  return recordOf(entries);
}

/** A format 1 block in format 2: `version` 2, every migratable entry migrated, other fields kept. */
export function migrateV1Block(block: JsonRecord, kinds: ISavedKinds): JsonRecord {
  return recordOf(
    Object.keys(block).map(key => {
      if (key === 'version') {
        return [key, 2] as const;
      }
      if (key === 'analyses') {
        return [key, (block[key] as unknown[]).map(e => migrateV1Entry(e, kinds))] as const;
      }
      return [key, block[key]] as const;
    })
  );
}
