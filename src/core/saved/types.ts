/**
 * The saved format of analyses in a notebook's metadata (key `psiscape`),
 * version 2. The JSON Schema in `schema/saved-analyses.v2.json` is the
 * authority for other tools; these types mirror it.
 *
 * Entries and fields this version does not know are kept exactly as they were
 * (`raw`), so saving never loses what a newer psiscape (or a person) wrote.
 */
import type { ICoreMessage } from '../messages';
import type { ITableSource } from '../source';

/** Metadata key. */
export const SAVED_KEY = 'psiscape';
/** Format version written. */
export const SAVED_VERSION = 2;

/**
 * Largest snapshot, in cells (rows × columns), saved with its values. Above
 * it the snapshot keeps headers, units, the row count and a hash of the
 * values, and the analysis needs its live source to show data again.
 */
export const SNAPSHOT_CELL_LIMIT = 20_000;

/**
 * A column identified by its position and header together. `index` is the
 * column's position in the source table (0-based). Only entries migrated from
 * format 1, which saved headers alone, carry `index: -1`: "the first column
 * with this header".
 */
export interface ISavedColumnRef {
  index: number;
  header: string;
}

/**
 * An option value of an analysis kind. Read back as stored: ±∞ appears as
 * the strings "inf" / "-inf" (decode with the catalogue's `optionsFromJson`);
 * when writing, ±∞ may be given as numbers and is stored as those strings.
 */
export type SavedOptionValue = string | number | boolean;

/** The analysis settings of a saved entry: which kind, its options and the fit window. */
export interface ISavedSettings {
  /** An analysis kind id from the catalogue (src/core/analysis/kinds). */
  kind: string;
  options: Record<string, SavedOptionValue>;
  /** Fit window; JSON null stands for an open end (−∞ / +∞). */
  window: { min: number; max: number };
  /** How points were weighted, when not the default (σ column when there is one, else equal). */
  weights?: { mode: 'sigma' | 'relative' | 'equal'; fraction: number | null };
}

/** The plotted columns as last seen, with their values (missing values as null). */
export interface ISavedSnapshotValues {
  headers: string[];
  units: (string | null)[];
  /** One array per column, all of the same length. */
  values: (number | null)[][];
}

/**
 * The plotted columns of a table too large to copy ({@link SNAPSHOT_CELL_LIMIT}):
 * the analysis keeps a reference (its source) and a hash of the values
 * ({@link hashSnapshotValues}), so a restore needs the live source.
 */
export interface ISavedSnapshotOmitted {
  headers: string[];
  units: (string | null)[];
  rows: number;
  /** 16 hex digits, see `hashSnapshotValues`. */
  hash: string;
  omitted: true;
}

/** The plotted columns as last seen: with values, or (large tables) a row count and hash. */
export type SavedSnapshot = ISavedSnapshotValues | ISavedSnapshotOmitted;

/** One saved analysis. */
export interface ISavedAnalysis {
  id: string;
  source: ITableSource;
  columns: { x: ISavedColumnRef; y: ISavedColumnRef; sigma: ISavedColumnRef | null };
  /** The plotted columns (x, y, then σ when picked) as last seen, used when the source output is gone. */
  snapshot: SavedSnapshot;
  /** Settings of the last analysis run, or null when none was run. */
  settings: ISavedSettings | null;
  /** The isotherm (field-sweep) analysis of the same table, when one was run. */
  isotherms?: ISavedIsotherms;
}

/**
 * The isotherm analysis of a table: its three columns and its controls as
 * the user typed them (text, null when left blank), so a value the analysis
 * refused is kept as it was.
 */
export interface ISavedIsotherms {
  columns: { temperature: ISavedColumnRef; field: ISavedColumnRef; magnetisation: ISavedColumnRef };
  /** Units typed over the headers' own, per column. */
  units: { temperature: string | null; field: string | null; magnetisation: string | null };
  /** Demagnetising factor N_d in the SI convention (0–1). */
  demagnetisingFactorSI: string | null;
  /** Readings within this many kelvin form one isotherm. */
  temperatureToleranceK: string | null;
  sampleMassMg: string | null;
  densityGPerCm3: string | null;
  /** Which convention N_d was typed in (absent: SI, as older files wrote it). */
  demagnetisingConvention?: 'SI' | 'cgs';
  /** N_d as typed in the cgs convention (0–4π), when that convention was chosen. */
  demagnetisingFactorCgs?: string | null;
  /** The sample-shape preset chosen for N_d ('custom' when typed). */
  sampleShape?: string | null;
  /** Field range used, in the field column's unit. */
  fieldMin?: string | null;
  fieldMax?: string | null;
  /** Largest |t| of the exponent fits. */
  tMax?: string | null;
  /** Bootstrap resamples over isotherms. */
  bootstrapSamples?: string | null;
  /** The view shown (a tab of the isotherm analysis). */
  view?: string | null;
}

/** Whether a snapshot kept no values (a large table: reference and hash only). */
export function isSnapshotOmitted(snapshot: SavedSnapshot): snapshot is ISavedSnapshotOmitted {
  return (snapshot as Partial<ISavedSnapshotOmitted>).omitted === true;
}

/**
 * What the saved format needs of the analysis-kind catalogue. The default is
 * the catalogue itself (src/core/analysis/kinds); tests pass their own.
 */
export interface ISavedKinds {
  isKnownKind(kind: string): boolean;
  /** Why these settings are not usable by their kind, or null. */
  validateKindSettings(settings: ISavedSettings): ICoreMessage | null;
  /**
   * The option names a known kind has. When saving over an entry of the same
   * kind, stored options not in this list (written by a newer psiscape) are
   * kept; listed ones are what the new entry says.
   */
  optionNames(kind: string): readonly string[];
}

/** Dependencies of reading and writing (all optional). */
export interface ISavedDeps {
  kinds?: ISavedKinds;
}

/** What {@link readSaved} found in a notebook. */
export interface ISavedRead {
  /** The analyses to open: readable, of a known kind, with usable settings. */
  analyses: ISavedAnalysis[];
  /** What could not be read, for people (never thrown). */
  problems: ICoreMessage[];
  /**
   * False when the block as a whole is unreadable or newer than this
   * psiscape: then nothing may write to it or remove it.
   */
  writable: boolean;
  /** The format version found (1 or 2), or null when there is no readable block. */
  version: 1 | 2 | null;
  /** Entries kept in the notebook without being opened (unreadable, unknown kind, duplicate id). */
  kept: number;
}

/**
 * Result of a write: the new metadata value (undefined: delete the key) and
 * whether it differs from what the notebook holds; or why nothing may be
 * written.
 */
export type SavedWriteResult = { value: unknown; changed: boolean } | { blocked: ICoreMessage };
