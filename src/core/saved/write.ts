/**
 * Writing analyses into the metadata value without losing anything: the new
 * value is built from the raw one, so unknown top-level fields, entries this
 * version cannot read and fields it does not know stay as they were, in
 * place. Only the entry that changes is encoded and compared; the others are
 * carried over untouched (format 1 blocks are migrated once, when a change
 * is actually written).
 */
import { messageText, msg } from '../messages';
import { has, isRecord, jsonEqual, own, recordOf } from './json';
import type { JsonRecord } from './json';
import { migrateV1Entry } from './migrate';
import { classifyBlock, readEntry } from './read';
import { hashSnapshotValues, snapshotToJson } from './snapshot';
import type { ISavedAnalysis, ISavedKinds, SavedWriteResult } from './types';
import { SAVED_VERSION } from './types';
import { entryLabel } from './validate';

/**
 * A window end as JSON can hold it: null for the open end (−∞ below, +∞
 * above); undefined for what cannot be saved (NaN, or the other infinity).
 */
function windowEnd(v: number, open: number): number | null | undefined {
  return Number.isFinite(v) ? v : v === open ? null : undefined;
}

/** The JSON form of an entry, or why it cannot be written. */
function encodeEntry(entry: ISavedAnalysis): JsonRecord | string {
  const { source, columns, settings } = entry;
  const ref = (r: { index: number; header: string }) => ({ index: r.index, header: r.header });
  let jsonSettings: JsonRecord | null = null;
  if (settings) {
    const min = windowEnd(settings.window.min, -Infinity);
    const max = windowEnd(settings.window.max, Infinity);
    if (min === undefined || max === undefined) {
      return `its fit window (${settings.window.min} to ${settings.window.max}) has an end that is neither a number nor open`;
    }
    const options: [string, unknown][] = [];
    for (const key of Object.keys(settings.options)) {
      const v: unknown = settings.options[key];
      if (v === undefined) {
        continue;
      }
      if (typeof v === 'number' && Number.isNaN(v)) {
        return `its option "${key}" is not a number`;
      }
      options.push([key, typeof v === 'number' && !Number.isFinite(v) ? (v > 0 ? 'inf' : '-inf') : v]);
    }
    jsonSettings = { kind: settings.kind, options: recordOf(options), window: { min, max } };
    if (settings.weights) {
      jsonSettings.weights = { mode: settings.weights.mode, fraction: settings.weights.fraction };
    }
  }
  const json: JsonRecord = {
    id: entry.id,
    source: { notebookPath: source.notebookPath, cellId: source.cellId, outputIndex: source.outputIndex, contentHash: source.contentHash },
    columns: { x: ref(columns.x), y: ref(columns.y), sigma: columns.sigma ? ref(columns.sigma) : null },
    snapshot: snapshotToJson(entry.snapshot) as unknown as JsonRecord,
    settings: jsonSettings
  };
  const iso = entry.isotherms;
  if (iso) {
    json.isotherms = {
      columns: { temperature: ref(iso.columns.temperature), field: ref(iso.columns.field), magnetisation: ref(iso.columns.magnetisation) },
      units: { temperature: iso.units.temperature, field: iso.units.field, magnetisation: iso.units.magnetisation },
      demagnetisingFactorSI: iso.demagnetisingFactorSI,
      temperatureToleranceK: iso.temperatureToleranceK,
      sampleMassMg: iso.sampleMassMg,
      densityGPerCm3: iso.densityGPerCm3
    };
    for (const key of ['demagnetisingConvention', 'demagnetisingFactorCgs', 'sampleShape', 'fieldMin', 'fieldMax', 'tMax', 'bootstrapSamples', 'view'] as const) {
      if (iso[key] !== undefined) {
        (json.isotherms as JsonRecord)[key] = iso[key] ?? null;
      }
    }
  }
  return json;
}

interface IMergeSpec {
  /** Fields this version writes: a stored one the new entry lacks is dropped; other stored fields are kept. */
  known: readonly string[];
  children?: Readonly<Record<string, IMergeSpec>>;
}

const REF: IMergeSpec = { known: ['index', 'header'] };
const SPEC: IMergeSpec = {
  known: ['id', 'source', 'columns', 'snapshot', 'settings', 'isotherms'],
  children: {
    isotherms: {
      known: [
        'columns',
        'units',
        'demagnetisingFactorSI',
        'temperatureToleranceK',
        'sampleMassMg',
        'densityGPerCm3',
        'demagnetisingConvention',
        'demagnetisingFactorCgs',
        'sampleShape',
        'fieldMin',
        'fieldMax',
        'tMax',
        'bootstrapSamples',
        'view'
      ],
      children: {
        columns: { known: ['temperature', 'field', 'magnetisation'], children: { temperature: REF, field: REF, magnetisation: REF } },
        units: { known: ['temperature', 'field', 'magnetisation'] }
      }
    },
    source: { known: ['notebookPath', 'cellId', 'outputIndex', 'contentHash'] },
    columns: { known: ['x', 'y', 'sigma'], children: { x: REF, y: REF, sigma: REF } },
    snapshot: { known: ['headers', 'units', 'values', 'rows', 'hash', 'omitted'] },
    settings: { known: ['kind', 'options', 'window', 'weights'], children: { window: { known: ['min', 'max'] }, weights: { known: ['mode', 'fraction'] } } }
  }
};

/**
 * The new value of a stored record: the stored fields in their order, known
 * ones replaced by (or, when absent, dropped for) the new ones, unknown ones
 * kept; then fields new to the record. `options` merges by the kind's option
 * names when the kind is unchanged, else is replaced.
 */
function merge(raw: unknown, next: unknown, spec: IMergeSpec | undefined, kinds: ISavedKinds): unknown {
  if (!spec || !isRecord(raw) || !isRecord(next)) {
    return next;
  }
  const sameKind = spec === SPEC.children!.settings && own(raw, 'kind') === own(next, 'kind');
  const out: [string, unknown][] = [];
  for (const key of Object.keys(raw)) {
    if (has(next, key)) {
      const value =
        key === 'options' && sameKind
          ? merge(raw[key], next[key], { known: kinds.optionNames(own(next, 'kind') as string) }, kinds)
          : merge(raw[key], next[key], spec.children?.[key], kinds);
      out.push([key, value]);
    } else if (!spec.known.includes(key)) {
      out.push([key, raw[key]]);
    }
  }
  for (const key of Object.keys(next)) {
    if (!has(raw, key)) {
      out.push([key, next[key]]);
    }
  }
  return recordOf(out);
}

/**
 * A stored snapshot with values stays when the new one would omit the same
 * data (same headers, rows and hash): a large table saved by format 1, or
 * shown from its saved copy, keeps its copy.
 */
function keepStoredValues(raw: JsonRecord, next: JsonRecord): JsonRecord {
  const stored = own(raw, 'snapshot');
  const fresh = own(next, 'snapshot') as JsonRecord;
  if (own(fresh, 'omitted') !== true || !isRecord(stored) || !Array.isArray(own(stored, 'values'))) {
    return next;
  }
  const values = own(stored, 'values') as (number | null)[][];
  const same =
    jsonEqual(own(stored, 'headers'), own(fresh, 'headers')) &&
    (values[0]?.length ?? 0) === own(fresh, 'rows') &&
    hashSnapshotValues(values) === own(fresh, 'hash');
  return same ? { ...next, snapshot: { headers: own(fresh, 'headers'), units: own(fresh, 'units'), values } } : next;
}

/** The block with new entries, its other fields kept in their order; `version` becomes 2. */
function rebuild(block: JsonRecord, entries: unknown[]): JsonRecord {
  return recordOf(Object.keys(block).map(k => [k, k === 'version' ? SAVED_VERSION : k === 'analyses' ? entries : block[k]] as const));
}

/** A write that fails unexpectedly writes nothing and says so (writes never throw). */
function guarded(write: () => SavedWriteResult): SavedWriteResult {
  try {
    return write();
  } catch (error) {
    return {
      blocked: msg('saved.write-failed', 'psiscape could not update the analyses saved in this notebook (%1); it left them as they are', error instanceof Error ? error.message : String(error))
    };
  }
}

type Target = { index: number; json: JsonRecord } | { keptIndex: number } | null;

/** The entry an id refers to: the first readable one with it (the one that was opened). */
function findTarget(entries: unknown[], id: string, version: 1 | 2, kinds: ISavedKinds): Target {
  let keptIndex = -1;
  for (let i = 0; i < entries.length; i++) {
    const e = entries[i];
    if (!isRecord(e) || own(e, 'id') !== id) {
      continue;
    }
    const read = readEntry(e, i, version, kinds);
    if (read.ok) {
      return { index: i, json: read.json };
    }
    keptIndex = keptIndex < 0 ? i : keptIndex;
  }
  return keptIndex >= 0 ? { keptIndex } : null;
}

function entriesToWrite(entries: unknown[], version: 1 | 2, kinds: ISavedKinds): unknown[] {
  return version === 1 ? entries.map(e => migrateV1Entry(e, kinds)) : entries.slice();
}

/**
 * Add or replace one analysis in the metadata value `raw`.
 *
 * @returns the new value and whether it differs from `raw` (when it does
 * not, `value` is `raw` and nothing needs writing); or, when `raw` is
 * unreadable or newer, or the entry could not be read back, why nothing may
 * be written.
 */
export function upsertSavedWith(raw: unknown, entry: ISavedAnalysis, kinds: ISavedKinds): SavedWriteResult {
  return guarded(() => upsert(raw, entry, kinds));
}

function upsert(raw: unknown, entry: ISavedAnalysis, kinds: ISavedKinds): SavedWriteResult {
  const encoded = encodeEntry(entry);
  const check = typeof encoded === 'string' ? null : readEntry(encoded, 0, 2, kinds);
  if (typeof encoded === 'string' || !check?.ok) {
    const why = typeof encoded === 'string' ? encoded : check && !check.ok ? check.problems.map(messageText).join(' ') : '';
    return { blocked: msg('saved.write-invalid', 'psiscape did not save the analysis %1 in the notebook, because what it would write is not valid: %2', entry.id, why) };
  }
  const block = classifyBlock(raw);
  if (block.state === 'blocked') {
    return { blocked: block.problem };
  }
  if (block.state === 'absent') {
    return { value: { version: SAVED_VERSION, analyses: [encoded] }, changed: true };
  }
  const target = findTarget(block.entries, entry.id, block.version, kinds);
  if (target && 'keptIndex' in target) {
    return {
      blocked: msg(
        'saved.write-over-kept',
        'saved analysis %1 has the id of this analysis but cannot be read; psiscape keeps it unchanged and did not save this analysis over it',
        entryLabel(block.entries[target.keptIndex], target.keptIndex)
      )
    };
  }
  const entries = entriesToWrite(block.entries, block.version, kinds);
  if (target) {
    const merged = merge(target.json, keepStoredValues(target.json, encoded), SPEC, kinds);
    if (jsonEqual(merged, target.json)) {
      return { value: raw, changed: false };
    }
    entries[target.index] = merged;
  } else {
    entries.push(encoded);
  }
  return { value: rebuild(block.block, entries), changed: true };
}

/**
 * Remove one analysis (the readable entry with this id) from the metadata
 * value `raw`. Entries this version cannot read, and fields it does not
 * know, stay; when nothing at all is left, the value is undefined (delete
 * the key).
 *
 * @returns as {@link upsertSavedWith}; an unreadable or newer block is never
 * removed or changed.
 */
export function removeSavedWith(raw: unknown, id: string, kinds: ISavedKinds): SavedWriteResult {
  return guarded(() => remove(raw, id, kinds));
}

function remove(raw: unknown, id: string, kinds: ISavedKinds): SavedWriteResult {
  const block = classifyBlock(raw);
  if (block.state === 'blocked') {
    return { blocked: block.problem };
  }
  if (block.state === 'absent') {
    return { value: raw, changed: false };
  }
  const target = findTarget(block.entries, id, block.version, kinds);
  if (!target || 'keptIndex' in target) {
    return { value: raw, changed: false };
  }
  const entries = entriesToWrite(block.entries, block.version, kinds);
  entries.splice(target.index, 1);
  if (entries.length === 0 && Object.keys(block.block).every(k => k === 'version' || k === 'analyses')) {
    return { value: undefined, changed: true };
  }
  return { value: rebuild(block.block, entries), changed: true };
}
