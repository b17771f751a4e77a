/**
 * Public types of the table parsers: typed columns read from notebook cell
 * outputs (pandas HTML, dataresource JSON, CSV/TSV, JSON, pandas text repr).
 *
 * The parsers are pure: nothing from an output is executed or inserted into
 * a page. HTML is parsed into an inert tree by parse5 and only its text is read.
 */
import { CoreMessageError } from '../messages';
import type { ICoreMessage } from '../messages';

/** The value kind of a parsed column. */
export type ColumnKind = 'number' | 'string' | 'boolean' | 'datetime';

/** One typed column of a parsed table. */
export interface IColumn {
  /** Header without unit, e.g. 'T' from 'T (K)'. */
  name: string;
  /** Unit split off the header, e.g. 'K' from 'T (K)', 'emu/g' from 'M [emu/g]', 'Oe' from 'H_Oe'; null when none. */
  unit: string | null;
  /** Header exactly as displayed (MultiIndex levels joined with ' / '). Unnamed index levels are called 'index' or 'level_0', 'level_1', … as pandas' reset_index does. */
  header: string;
  /** Value kind of the column. */
  kind: ColumnKind;
  /** True when the column came from the DataFrame index. */
  isIndex: boolean;
  /**
   * The values: a Float64Array iff kind === 'number' (NaN for missing and for cells
   * that could not be read as numbers, see the 'unreadable' note; ±Infinity kept);
   * otherwise strings, booleans or null for missing. Datetimes are ISO 8601 strings.
   */
  values: Float64Array | (string | boolean | null)[];
  /** When the display was rounded: the largest number of significant digits shown in this column; else undefined. */
  shownDigits?: number;
}

/**
 * A note attached to a parse result: truncation, rounding, cells left out, or
 * other information. A truncated display gives several 'truncated' notes: what
 * was cut (rows, columns) and the remedy. A number column with cells that could
 * not be read as numbers gives one 'unreadable' note naming it and the rows.
 */
export interface ITableNote {
  kind: 'truncated' | 'rounded' | 'unreadable' | 'info';
  /** Codes `table.truncated.*`, `table.rounded.*`, `table.unreadable.*` and others of `table.*`. */
  message: ICoreMessage;
}

/** What a truncated display showed and hid. */
export interface ITruncation {
  /** Rows present in the parsed table. */
  shownRows: number;
  /** Rows the full frame has, when the output says so (pandas' "N rows × M columns"); else null. */
  totalRows: number | null;
  /** Data columns present in the parsed table (index columns not counted). */
  shownColumns: number;
  /** Data columns the full frame has, when the output says so; else null. */
  totalColumns: number | null;
  /** 0-based row in the parsed table before which rows were elided ('...' row); null when not visible. */
  rowGapAt: number | null;
}

/** A parsed table. */
export interface ITable {
  columns: IColumn[];
  rowCount: number;
  format: 'pandas-html' | 'dataresource' | 'csv' | 'tsv' | 'json' | 'pandas-text';
  notes: ITableNote[];
  /** Present when the output showed only part of the frame. A 'truncated' note explains it. */
  truncation?: ITruncation;
}

/**
 * Result of a parse: a table, or a message saying why there is none. When
 * several types of an output were refused, `message` says so and `details`
 * holds each refusal (richest type first).
 */
export type ParseResult = { ok: true; table: ITable } | { ok: false; message: ICoreMessage; details?: ICoreMessage[] };

/** Size and nesting limits applied to every payload before and while parsing. */
export interface ITableLimits {
  /** Largest payload in bytes (UTF-16 code units for text). */
  maxBytes: number;
  /** Most data rows. */
  maxRows: number;
  /** Most columns, index columns included. */
  maxColumns: number;
  /** Longest cell text in characters. */
  maxCellChars: number;
  /** Deepest nesting of HTML elements or JSON arrays/objects. */
  maxDepth: number;
}

/** The limits in force. */
export const TABLE_LIMITS: ITableLimits = Object.freeze({
  maxBytes: 128 * 1024 * 1024,
  maxRows: 2_000_000,
  maxColumns: 2_000,
  maxCellChars: 100_000,
  maxDepth: 64
});

/**
 * A refusal raised inside a parser and turned into `{ ok: false, message }`
 * at the public boundary. Its `detail` (codes `table.*`) names the row and/or
 * column concerned.
 */
export class TableParseError extends CoreMessageError {
  /** 'no-table': the payload holds no table at all; 'refused': a table that is malformed or over a limit. */
  readonly reason: 'refused' | 'no-table';
  constructor(detail: ICoreMessage, reason: 'refused' | 'no-table' = 'refused') {
    super(detail);
    this.name = 'TableParseError';
    this.reason = reason;
  }
}
