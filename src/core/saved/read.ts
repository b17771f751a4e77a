/**
 * Reading the analyses a notebook holds. Notebook metadata is untrusted
 * input: the block is checked as a whole (version, list of analyses), then
 * entry by entry; what cannot be read is described and kept, never thrown.
 */
import { msg } from '../messages';
import type { ICoreMessage } from '../messages';
import { excerpt, isRecord, own, recordOf, textExcerpt } from './json';
import type { JsonRecord } from './json';
import { migrateV1Entry, v1Problem } from './migrate';
import type { ISavedAnalysis, ISavedIsotherms, ISavedKinds, ISavedRead, ISavedSettings, SavedOptionValue, SavedSnapshot } from './types';
import { SAVED_VERSION } from './types';
import { checkEntry, entryLabel } from './validate';

/** What the metadata value is as a whole. */
export type BlockState =
  | { state: 'absent' }
  | { state: 'blocked'; problem: ICoreMessage }
  | { state: 'readable'; version: 1 | 2; block: JsonRecord; entries: unknown[] };

/** Classify the metadata value: absent, readable (version 1 or 2), or to be left alone. */
export function classifyBlock(value: unknown): BlockState {
  if (value === undefined || value === null) {
    return { state: 'absent' };
  }
  if (!isRecord(value)) {
    return {
      state: 'blocked',
      problem: msg('saved.block-not-record', 'the psiscape metadata of this notebook is %1, not a record with a version and a list of analyses; psiscape leaves it as it is and saves nothing to it', excerpt(value))
    };
  }
  const version = own(value, 'version');
  if (version === undefined) {
    return { state: 'blocked', problem: msg('saved.block-no-version', 'the psiscape metadata of this notebook has no version; psiscape leaves it as it is and saves nothing to it') };
  }
  if (typeof version === 'string') {
    return {
      state: 'blocked',
      problem: msg('saved.block-version-text', 'the psiscape metadata has a version written as text (%1) instead of a number; psiscape leaves it as it is and saves nothing to it', excerpt(version))
    };
  }
  if (typeof version !== 'number' || !Number.isInteger(version) || version < 1) {
    return {
      state: 'blocked',
      problem: msg('saved.block-version-unknown', 'the psiscape metadata has version %1, which no psiscape writes; psiscape leaves it as it is and saves nothing to it', excerpt(version))
    };
  }
  if (version > SAVED_VERSION) {
    return {
      state: 'blocked',
      problem: msg(
        'saved.block-newer',
        'the psiscape metadata has version %1, newer than this psiscape reads (up to %2); psiscape leaves it as it is and saves nothing to it until psiscape is updated',
        String(version),
        String(SAVED_VERSION)
      )
    };
  }
  const analyses = own(value, 'analyses');
  if (!Array.isArray(analyses)) {
    return {
      state: 'blocked',
      problem: msg('saved.block-no-list', 'the analyses in the psiscape metadata are %1, not a list; psiscape leaves them as they are and saves nothing to them', excerpt(analyses))
    };
  }
  return { state: 'readable', version: version as 1 | 2, block: value, entries: analyses };
}

/** An entry that reads, or why it is kept unopened. */
export type EntryRead = { ok: true; analysis: ISavedAnalysis; json: JsonRecord } | { ok: false; problems: ICoreMessage[] };

function decodeWindow(window: JsonRecord): { min: number; max: number } {
  const min = own(window, 'min');
  const max = own(window, 'max');
  return { min: typeof min === 'number' ? min : -Infinity, max: typeof max === 'number' ? max : Infinity };
}

function decodeSettings(settings: JsonRecord): ISavedSettings {
  const options = own(settings, 'options') as JsonRecord;
  return {
    kind: own(settings, 'kind') as string,
    options: recordOf(Object.keys(options).map(k => [k, options[k]] as const)) as Record<string, SavedOptionValue>,
    window: decodeWindow(own(settings, 'window') as JsonRecord),
    ...(isRecord(own(settings, 'weights'))
      ? {
          weights: {
            mode: own(own(settings, 'weights') as JsonRecord, 'mode') as 'sigma' | 'relative' | 'equal',
            fraction: (own(own(settings, 'weights') as JsonRecord, 'fraction') as number | null) ?? null
          }
        }
      : {})
  };
}

function decodeRef(ref: JsonRecord): { index: number; header: string } {
  return { index: own(ref, 'index') as number, header: own(ref, 'header') as string };
}

function decodeSnapshot(snapshot: JsonRecord): SavedSnapshot {
  const headers = own(snapshot, 'headers') as string[];
  const units = own(snapshot, 'units') as (string | null)[];
  if (own(snapshot, 'omitted') === true) {
    return { headers, units, rows: own(snapshot, 'rows') as number, hash: own(snapshot, 'hash') as string, omitted: true };
  }
  return { headers, units, values: own(snapshot, 'values') as (number | null)[][] };
}

/** The in-memory form of a valid format 2 entry (shares the snapshot arrays with it). */
function decodeEntry(entry: JsonRecord, settings: ISavedSettings | null): ISavedAnalysis {
  const source = own(entry, 'source') as JsonRecord;
  const columns = own(entry, 'columns') as JsonRecord;
  const sigma = own(columns, 'sigma');
  return {
    id: own(entry, 'id') as string,
    source: {
      notebookPath: own(source, 'notebookPath') as string,
      cellId: own(source, 'cellId') as string,
      outputIndex: own(source, 'outputIndex') as number,
      contentHash: own(source, 'contentHash') as string
    },
    columns: { x: decodeRef(own(columns, 'x') as JsonRecord), y: decodeRef(own(columns, 'y') as JsonRecord), sigma: isRecord(sigma) ? decodeRef(sigma) : null },
    snapshot: decodeSnapshot(own(entry, 'snapshot') as JsonRecord),
    settings,
    ...(isRecord(own(entry, 'isotherms')) ? { isotherms: decodeIsotherms(own(entry, 'isotherms') as JsonRecord) } : {})
  };
}

/** Optional text controls of the isotherm analysis (written by newer files; absent in older ones). */
const OPTIONAL_ISOTHERM_TEXTS = ['demagnetisingFactorCgs', 'sampleShape', 'fieldMin', 'fieldMax', 'tMax', 'bootstrapSamples', 'view'] as const;

/** The optional text fields present in `r`, each as string or null. */
function optionalTexts(r: JsonRecord, keys: readonly (typeof OPTIONAL_ISOTHERM_TEXTS)[number][]): Partial<ISavedIsotherms> {
  const out: Partial<Record<(typeof OPTIONAL_ISOTHERM_TEXTS)[number], string | null>> = {};
  for (const key of keys) {
    const v = own(r, key);
    if (typeof v === 'string' || v === null) {
      out[key] = v;
    }
  }
  return out;
}

/** The isotherm analysis of a valid entry (the schema has checked every field). */
function decodeIsotherms(iso: JsonRecord): ISavedIsotherms {
  const columns = own(iso, 'columns') as JsonRecord;
  const units = own(iso, 'units') as JsonRecord;
  const text = (r: JsonRecord, key: string): string | null => (own(r, key) as string | null | undefined) ?? null;
  return {
    columns: {
      temperature: decodeRef(own(columns, 'temperature') as JsonRecord),
      field: decodeRef(own(columns, 'field') as JsonRecord),
      magnetisation: decodeRef(own(columns, 'magnetisation') as JsonRecord)
    },
    units: { temperature: text(units, 'temperature'), field: text(units, 'field'), magnetisation: text(units, 'magnetisation') },
    demagnetisingFactorSI: text(iso, 'demagnetisingFactorSI'),
    temperatureToleranceK: text(iso, 'temperatureToleranceK'),
    sampleMassMg: text(iso, 'sampleMassMg'),
    densityGPerCm3: text(iso, 'densityGPerCm3'),
    ...optionalTexts(iso, OPTIONAL_ISOTHERM_TEXTS),
    ...(own(iso, 'demagnetisingConvention') === 'cgs' || own(iso, 'demagnetisingConvention') === 'SI'
      ? { demagnetisingConvention: own(iso, 'demagnetisingConvention') as 'SI' | 'cgs' }
      : {})
  };
}

/**
 * Read one entry: migrate it when the block is format 1, check it against
 * the schema, then its kind and settings against the catalogue.
 */
export function readEntry(raw: unknown, index: number, version: 1 | 2, kinds: ISavedKinds): EntryRead {
  const entry = version === 1 ? migrateV1Entry(raw, kinds) : raw;
  const label = entryLabel(entry, index);
  const fault = (version === 1 && entry === raw && isRecord(raw) ? v1Problem(raw, label) : null) ?? checkEntry(entry, label);
  if (fault) {
    return { ok: false, problems: [fault] };
  }
  const json = entry as JsonRecord;
  const rawSettings = own(json, 'settings');
  let settings: ISavedSettings | null = null;
  if (isRecord(rawSettings)) {
    settings = decodeSettings(rawSettings);
    if (!kinds.isKnownKind(settings.kind)) {
      return {
        ok: false,
        problems: [
          msg('saved.entry-unknown-kind', 'saved analysis %1 uses the analysis kind "%2", which this psiscape does not know; it is kept in the notebook unchanged', label, textExcerpt(settings.kind))
        ]
      };
    }
    const unusable = kinds.validateKindSettings(settings);
    if (unusable) {
      return {
        ok: false,
        problems: [
          msg('saved.entry-settings-unusable', 'saved analysis %1 is kept in the notebook unchanged and not opened: its settings do not suit its kind "%2", as follows.', label, textExcerpt(settings.kind)),
          unusable
        ]
      };
    }
  }
  return { ok: true, analysis: decodeEntry(json, settings), json };
}

/**
 * Read what a notebook holds under the `psiscape` key, with a catalogue of
 * kinds (the public `readSaved` passes the real one). Never throws.
 *
 * - undefined or null: nothing saved (writable);
 * - format 1: migrated on reading (written as format 2 at the next change);
 * - newer, or not a readable block: nothing opened, `writable` false, and a
 *   problem saying what was found;
 * - entries that do not match the schema, of unknown kinds, with settings
 *   their kind refuses, or repeating an id: kept unopened, each described.
 */
export function readSavedWith(value: unknown, kinds: ISavedKinds): ISavedRead {
  try {
    const block = classifyBlock(value);
    if (block.state === 'absent') {
      return { analyses: [], problems: [], writable: true, version: null, kept: 0 };
    }
    if (block.state === 'blocked') {
      return { analyses: [], problems: [block.problem], writable: false, version: null, kept: 0 };
    }
    const analyses: ISavedAnalysis[] = [];
    const problems: ICoreMessage[] = [];
    const firstWithId = new Map<string, number>();
    let kept = 0;
    block.entries.forEach((raw, i) => {
      const read = readEntry(raw, i, block.version, kinds);
      if (!read.ok) {
        problems.push(...read.problems);
        kept++;
        return;
      }
      const first = firstWithId.get(read.analysis.id);
      if (first !== undefined) {
        problems.push(
          msg('saved.entry-duplicate', 'saved analysis %1 has the same id as saved analysis %2; it is kept in the notebook unchanged and not opened', entryLabel(read.json, i), String(first + 1))
        );
        kept++;
        return;
      }
      firstWithId.set(read.analysis.id, i);
      analyses.push(read.analysis);
    });
    return { analyses, problems, writable: true, version: block.version, kept };
  } catch (error) {
    return {
      analyses: [],
      problems: [msg('saved.read-failed', 'psiscape could not read the analyses saved in this notebook (%1); it leaves them as they are', error instanceof Error ? error.message : String(error))],
      writable: false,
      version: null,
      kept: 0
    };
  }
}
