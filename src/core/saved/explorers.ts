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
  /** Preset the free energy was set from (absent: none, or an unknown one). */
  preset?: (typeof EXPLORER_PRESETS)[number];
  /** The preset's own parameters by name. */
  presetValues?: Record<string, number>;
  /** A free energy typed by the user, with its coefficients' values. */
  typed?: { text: string; values: Record<string, number> };
  /** Coefficients of the two-order-parameter landscape. */
  coupled?: { a1: number; T1: number; b1: number; a2: number; T2: number; b2: number; lambda: number };
  /** The chart tab shown (absent: the landscape, or an unknown one). */
  view?: (typeof EXPLORER_VIEWS)[number];
  /** Measured points and fitted curve drawn over the branches, as columns (see {@link OVERLAY_LIMITS}). */
  overlay?: ISavedOverlay;
}

/** Points as two columns of equal length. */
export interface ISavedColumns {
  T: number[];
  psi: number[];
}

/** The data and fitted curve of a fit, drawn over an explorer's branches. */
export interface ISavedOverlay {
  data: ISavedColumns;
  fitted: ISavedColumns;
}

/**
 * Most points kept of each overlay series: a longer series is thinned to
 * every k-th point (the first and last kept), so an explorer stays a few kB
 * in the notebook.
 */
export const OVERLAY_LIMITS = { data: 2000, fitted: 400 } as const;

/** Rows as columns, finite points only, thinned to at most `limit` points. */
export function overlayColumns(rows: readonly { T: number; psi: number }[], limit: number): ISavedColumns {
  const ok = rows.filter(r => finite(r.T) && finite(r.psi));
  const step = Math.max(1, Math.ceil(ok.length / Math.max(2, limit)));
  const T: number[] = [];
  const psi: number[] = [];
  for (let i = 0; i < ok.length; i += step) {
    T.push(ok[i].T);
    psi.push(ok[i].psi);
  }
  const last = ok[ok.length - 1];
  if (last && T.length > 0 && (T[T.length - 1] !== last.T || psi[psi.length - 1] !== last.psi) && T.length < limit) {
    T.push(last.T);
    psi.push(last.psi);
  }
  return { T, psi };
}

/** Columns as rows. */
export function overlayRows(c: ISavedColumns): { T: number; psi: number }[] {
  return c.T.map((T, i) => ({ T, psi: c.psi[i] }));
}

/** Two finite columns of equal length, or undefined. */
function columnsOf(v: unknown): ISavedColumns | undefined {
  if (!isRecord(v)) {
    return undefined;
  }
  const T = own(v, 'T');
  const psi = own(v, 'psi');
  if (!Array.isArray(T) || !Array.isArray(psi) || T.length !== psi.length || !T.every(finite) || !psi.every(finite)) {
    return undefined;
  }
  return { T: T.slice() as number[], psi: psi.slice() as number[] };
}

/** Presets of the workbench. */
export const EXPLORER_PRESETS = ['bean-rodbell', 'devonshire', 'de-gennes'] as const;

/** Chart tabs of the workbench. */
export const EXPLORER_VIEWS = ['landscape', 'branches', 'phase-diagram', 'landscape-2d', 'loop'] as const;

const COUPLED_KEYS = ['a1', 'T1', 'b1', 'a2', 'T2', 'b2', 'lambda'] as const;

/** A record of finite numbers by name, or undefined. */
function numbersOf(v: unknown): Record<string, number> | undefined {
  if (!isRecord(v)) {
    return undefined;
  }
  const out: Record<string, number> = {};
  for (const key of Object.keys(v)) {
    const x = own(v, key);
    if (!finite(x)) {
      return undefined;
    }
    out[key] = x;
  }
  return out;
}

/** The optional workbench fields of an entry; malformed ones are left out (and kept in the notebook as they are). */
function optionalFields(raw: JsonRecord): Partial<ISavedExplorer> {
  const out: Partial<ISavedExplorer> = {};
  const preset = own(raw, 'preset');
  if ((EXPLORER_PRESETS as readonly unknown[]).includes(preset)) {
    out.preset = preset as ISavedExplorer['preset'];
  }
  const values = numbersOf(own(raw, 'presetValues'));
  if (values) {
    out.presetValues = values;
  }
  const typed = own(raw, 'typed');
  if (isRecord(typed) && typeof own(typed, 'text') === 'string') {
    const tv = numbersOf(own(typed, 'values'));
    if (tv) {
      out.typed = { text: own(typed, 'text') as string, values: tv };
    }
  }
  const coupled = numbersOf(own(raw, 'coupled'));
  if (coupled && COUPLED_KEYS.every(k => finite(coupled[k]))) {
    out.coupled = { a1: coupled.a1, T1: coupled.T1, b1: coupled.b1, a2: coupled.a2, T2: coupled.T2, b2: coupled.b2, lambda: coupled.lambda };
  }
  const view = own(raw, 'view');
  if ((EXPLORER_VIEWS as readonly unknown[]).includes(view)) {
    out.view = view as ISavedExplorer['view'];
  }
  const overlay = own(raw, 'overlay');
  if (isRecord(overlay)) {
    const data = columnsOf(own(overlay, 'data'));
    const fitted = columnsOf(own(overlay, 'fitted'));
    if (data && fitted) {
      out.overlay = { data, fitted };
    }
  }
  return out;
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
    h,
    ...optionalFields(raw)
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

const KNOWN = ['id', 'coefficients', 'convention', 'T', 'h', 'preset', 'presetValues', 'typed', 'coupled', 'view', 'overlay'];
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
  const out: JsonRecord = { id: e.id, coefficients: { a: k.a, T0: k.T0, b: k.b, c: k.c, d: k.d }, convention: e.convention, T: e.T, h: e.h };
  if (e.preset !== undefined) {
    out.preset = e.preset;
  }
  if (e.presetValues !== undefined) {
    out.presetValues = { ...e.presetValues };
  }
  if (e.typed !== undefined) {
    out.typed = { text: e.typed.text, values: { ...e.typed.values } };
  }
  if (e.coupled !== undefined) {
    out.coupled = { ...e.coupled };
  }
  if (e.view !== undefined) {
    out.view = e.view;
  }
  if (e.overlay !== undefined) {
    out.overlay = {
      data: { T: e.overlay.data.T.slice(), psi: e.overlay.data.psi.slice() },
      fitted: { T: e.overlay.fitted.T.slice(), psi: e.overlay.fitted.psi.slice() }
    };
  }
  return out;
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
  const extra = [...Object.values(e.presetValues ?? {}), ...Object.values(e.typed?.values ?? {}), ...Object.values(e.coupled ?? {})];
  const o = e.overlay;
  const columnsBad = (c: ISavedColumns): boolean => c.T.length !== c.psi.length || !c.T.every(finite) || !c.psi.every(finite);
  return e.id === '' || ![k.a, k.T0, k.b, k.c, k.d, e.T, e.h, ...extra].every(v => Number.isFinite(v)) || (o !== undefined && (columnsBad(o.data) || columnsBad(o.fitted)));
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
