/**
 * Landau explorers saved in a notebook's metadata: the optional `explorers`
 * list of the format 2 block, beside `analyses`. Read entry by entry (what
 * cannot be read is described and kept); written like analyses, building on
 * the raw value, so unknown fields and entries stay as they were.
 */
import { msg } from '../messages';
import type { ICoreMessage } from '../messages';
import { excerpt, has, isRecord, jsonEqual, own, recordOf } from './json';
import type { JsonRecord } from './json';
import { migrateV1Entry } from './migrate';
import { classifyBlock } from './read';
import type { ISavedKinds, SavedWriteResult } from './types';
import { SAVED_VERSION } from './types';

/** Conventions an explorer can display its coefficients in. */
export const EXPLORER_CONVENTIONS = ['L', 'no-fractions', 'devonshire', 'ginzburg-landau'] as const;

/** One saved Landau explorer. */
export interface ISavedExplorer {
  id: string;
  /** Coefficients in convention L. */
  coefficients: { a: number; T0: number; b: number; c: number; d: number };
  /** Convention the coefficients are displayed in (an unknown one reads as "L"). */
  convention: (typeof EXPLORER_CONVENTIONS)[number];
  T: number;
  h: number;
}

/** What {@link readSavedExplorers} found. */
export interface ISavedExplorersRead {
  explorers: ISavedExplorer[];
  problems: ICoreMessage[];
}

const finite = (v: unknown): v is number => typeof v === 'number' && Number.isFinite(v);

/** The explorers list of a readable block: absent (undefined), a list, or something else (null). */
function listOf(block: JsonRecord): unknown[] | undefined | null {
  const list = own(block, 'explorers');
  return list === undefined ? undefined : Array.isArray(list) ? list : null;
}

/** One entry, or why it is not opened. */
function readExplorer(raw: unknown, index: number): ISavedExplorer | ICoreMessage {
  const label = String(index + 1);
  if (!isRecord(raw)) {
    return msg('saved.explorer-not-record', 'saved explorer %1 is %2, not a record; it is kept in the notebook unchanged', label, excerpt(raw));
  }
  const id = own(raw, 'id');
  const k = own(raw, 'coefficients');
  const T = own(raw, 'T');
  const h = own(raw, 'h');
  const d = isRecord(k) ? (own(k, 'd') ?? 0) : 0;
  if (typeof id !== 'string' || id === '' || !isRecord(k) || !['a', 'T0', 'b', 'c'].every(key => finite(own(k, key))) || !finite(d) || !finite(T) || !finite(h)) {
    return msg('saved.explorer-invalid', 'saved explorer %1 lacks an id, finite coefficients a, T0, b, c, or finite T and h; it is kept in the notebook unchanged and not opened', label);
  }
  const convention = own(raw, 'convention');
  return {
    id,
    coefficients: { a: own(k, 'a') as number, T0: own(k, 'T0') as number, b: own(k, 'b') as number, c: own(k, 'c') as number, d },
    convention: (EXPLORER_CONVENTIONS as readonly unknown[]).includes(convention) ? (convention as ISavedExplorer['convention']) : 'L',
    T,
    h
  };
}

/** The explorers a notebook's `psiscape` metadata holds. Never throws. */
export function readSavedExplorers(value: unknown): ISavedExplorersRead {
  try {
    const block = classifyBlock(value);
    if (block.state !== 'readable') {
      return { explorers: [], problems: [] };
    }
    const list = listOf(block.block);
    if (list === null) {
      return { explorers: [], problems: [msg('saved.explorers-not-list', 'the explorers in the psiscape metadata are %1, not a list; psiscape leaves them as they are', excerpt(own(block.block, 'explorers')))] };
    }
    const explorers: ISavedExplorer[] = [];
    const problems: ICoreMessage[] = [];
    const ids = new Set<string>();
    (list ?? []).forEach((raw, i) => {
      const read = readExplorer(raw, i);
      if ('code' in read) {
        problems.push(read);
      } else if (!ids.has(read.id)) {
        ids.add(read.id);
        explorers.push(read);
      }
    });
    return { explorers, problems };
  } catch {
    return { explorers: [], problems: [] };
  }
}

const KNOWN = ['id', 'coefficients', 'convention', 'T', 'h'];
const KNOWN_COEFFICIENTS = ['a', 'T0', 'b', 'c', 'd'];

/** Stored fields in their order, known ones replaced by the new ones, unknown ones kept; then new fields. */
function mergeRecord(raw: JsonRecord, next: JsonRecord, known: readonly string[], child?: (key: string, a: unknown, b: unknown) => unknown): JsonRecord {
  const out: [string, unknown][] = [];
  for (const key of Object.keys(raw)) {
    if (has(next, key)) {
      out.push([key, child ? child(key, raw[key], next[key]) : next[key]]);
    } else if (!known.includes(key)) {
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

function encode(e: ISavedExplorer): JsonRecord {
  const k = e.coefficients;
  return { id: e.id, coefficients: { a: k.a, T0: k.T0, b: k.b, c: k.c, d: k.d }, convention: e.convention, T: e.T, h: e.h };
}

/** The block with a new explorers list (dropped when empty); a format 1 block's analyses migrated. */
function rebuild(block: JsonRecord, version: 1 | 2, entries: unknown[], explorers: unknown[], kinds: ISavedKinds): JsonRecord | undefined {
  const analyses = version === 1 ? entries.map(e => migrateV1Entry(e, kinds)) : entries;
  const out: [string, unknown][] = [];
  for (const key of Object.keys(block)) {
    if (key === 'explorers') {
      if (explorers.length > 0) {
        out.push([key, explorers]);
      }
    } else {
      out.push([key, key === 'version' ? SAVED_VERSION : key === 'analyses' ? analyses : block[key]]);
    }
  }
  if (!has(block, 'explorers') && explorers.length > 0) {
    out.push(['explorers', explorers]);
  }
  const next = recordOf(out);
  return analyses.length === 0 && Object.keys(next).every(key => key === 'version' || key === 'analyses') ? undefined : next;
}

function invalid(e: ISavedExplorer): boolean {
  const k = e.coefficients;
  return e.id === '' || ![k.a, k.T0, k.b, k.c, k.d, e.T, e.h].every(v => Number.isFinite(v));
}

/**
 * Add or replace one explorer (by id) in the metadata value `raw`, keeping
 * everything else. Never throws.
 */
export function upsertExplorerWith(raw: unknown, entry: ISavedExplorer, kinds: ISavedKinds): SavedWriteResult {
  try {
    if (invalid(entry)) {
      return { blocked: msg('saved.explorer-write-invalid', 'psiscape did not save the explorer %1 in the notebook: its values are not all finite numbers', entry.id) };
    }
    const encoded = encode(entry);
    const block = classifyBlock(raw);
    if (block.state === 'blocked') {
      return { blocked: block.problem };
    }
    if (block.state === 'absent') {
      return { value: { version: SAVED_VERSION, analyses: [], explorers: [encoded] }, changed: true };
    }
    const list = listOf(block.block);
    if (list === null) {
      return { blocked: msg('saved.explorers-not-list', 'the explorers in the psiscape metadata are %1, not a list; psiscape leaves them as they are', excerpt(own(block.block, 'explorers'))) };
    }
    const explorers = (list ?? []).slice();
    const at = explorers.findIndex(e => isRecord(e) && own(e, 'id') === entry.id);
    if (at >= 0) {
      const stored = explorers[at] as JsonRecord;
      const merged = mergeRecord(stored, encoded, KNOWN, (key, a, b) => (key === 'coefficients' && isRecord(a) && isRecord(b) ? mergeRecord(a, b, KNOWN_COEFFICIENTS) : b));
      if (jsonEqual(merged, stored) && block.version === SAVED_VERSION) {
        return { value: raw, changed: false };
      }
      explorers[at] = merged;
    } else {
      explorers.push(encoded);
    }
    return { value: rebuild(block.block, block.version, block.entries, explorers, kinds), changed: true };
  } catch (error) {
    return { blocked: msg('saved.write-failed', 'psiscape could not update the analyses saved in this notebook (%1); it left them as they are', error instanceof Error ? error.message : String(error)) };
  }
}

/**
 * Remove one explorer (by id) from the metadata value `raw`; the list goes
 * when it is empty, the key when nothing at all is left. Never throws.
 */
export function removeExplorerWith(raw: unknown, id: string, kinds: ISavedKinds): SavedWriteResult {
  try {
    const block = classifyBlock(raw);
    if (block.state === 'blocked') {
      return { blocked: block.problem };
    }
    const list = block.state === 'readable' ? listOf(block.block) : undefined;
    if (block.state !== 'readable' || !list) {
      return { value: raw, changed: false };
    }
    const at = list.findIndex(e => isRecord(e) && own(e, 'id') === id);
    if (at < 0) {
      return { value: raw, changed: false };
    }
    const explorers = list.slice();
    explorers.splice(at, 1);
    return { value: rebuild(block.block, block.version, block.entries, explorers, kinds), changed: true };
  } catch (error) {
    return { blocked: msg('saved.write-failed', 'psiscape could not update the analyses saved in this notebook (%1); it left them as they are', error instanceof Error ? error.message : String(error)) };
  }
}
