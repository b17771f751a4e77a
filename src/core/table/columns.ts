/**
 * Turning raw cells (displayed text or JSON values) into typed columns.
 */
import {
  canonicalDates,
  decimalsShown,
  groupedNumber,
  isDecimalComma,
  isMissingText,
  numberText,
  parseBoolean,
  parseDateParts,
  parseNumber,
  readNumber,
  significantDigits
} from './cells';
import type { IDateParts } from './cells';
import type { ColumnKind, IColumn, ITableNote } from './types';
import { msg } from '../messages';
import { wholeNumber } from '../numeric/messageArgs';
import { shortHeader } from './limits';
import { LISTED_ROWS, unreadableNote } from './notes';
import type { IUnreadableCells } from './notes';
import { TABLE_LIMITS, TableParseError } from './types';
import { splitHeader } from './units';

/**
 * Decimal places pandas shows by default (`display.precision` = 6). A displayed
 * float column with this many decimals (or a 6-decimal mantissa in scientific
 * notation) was most likely rounded for display.
 */
export const PANDAS_DISPLAY_PRECISION = 6;

/** How a text column was written. */
export interface ITextColumnOptions {
  /** Column came from the frame's index. */
  isIndex: boolean;
  /** The text is a rounded display (pandas HTML / text repr), not full precision. */
  displayed: boolean;
  /** The table's notes: a number column with unreadable cells adds its 'unreadable' note here. */
  notes: ITableNote[];
}

/**
 * The rule that makes a column a number column, the same for every format
 * (see {@link NumberReader}). A column is numbers when every filled cell (not
 * empty, not a missing-value marker) reads as a number; or, when some do not,
 * when at least {@link MIN_NUMBERS_BESIDE_UNREADABLE} cells read as numbers and
 * the unreadable ones are at most max(1, ⌊{@link MAX_UNREADABLE_SHARE} × filled
 * cells⌋). The unreadable cells become NaN (left out like missing values) and
 * the table gets an 'unreadable' note naming the column and the rows.
 *
 * Why 5 %: a measured column spoiled by a typo (`4..5`), a remark typed into a
 * cell or a pasted symbol has one or a few such cells among many numbers, while
 * a column of labels or remarks has far more text than that. One cell in twenty
 * (two in forty, fifty in a thousand) keeps a column with a few slips a number
 * column without taking a text column for numbers; one unreadable cell is
 * always allowed, so that a single slip in a short column (under twenty values)
 * does not turn it into text and silently change which columns are plotted.
 */
export const MAX_UNREADABLE_SHARE = 0.05;

/**
 * Why four: beside two or three numbers, a word is as likely part of a mixed
 * column of labels (pandas object columns such as `x, 1, 2.5`) as a slip in a
 * number column; with four numbers or more beside one unreadable cell, at
 * least 80 % of the column reads as numbers.
 */
export const MIN_NUMBERS_BESIDE_UNREADABLE = 4;

/** Most unreadable cells a number column with `filled` non-missing cells may hold: max(1, ⌊5 % of filled⌋). */
export function unreadableAllowed(filled: number): number {
  // The small epsilon keeps 5 % of 60 at 3 whatever the rounding of 0.05 × 60.
  return Math.max(1, Math.floor(MAX_UNREADABLE_SHARE * filled + 1e-9));
}

/** A column read as numbers, and the cells of it that could not be read (null when none). */
export interface INumbersRead {
  values: Float64Array;
  unreadable: IUnreadableCells | null;
}

/** Text of a JSON value that is not a number, for notes. */
function exampleOf(v: unknown): string {
  return typeof v === 'object' ? (JSON.stringify(v) ?? String(v)).slice(0, 80) : String(v);
}

/**
 * Reads one column's cells, in row order, as numbers and decides by the rule
 * of {@link MAX_UNREADABLE_SHARE} whether the column is a number column. Every
 * parser types its columns through this class (CSV/TSV while streaming, HTML,
 * text reprs and JSON through {@link columnFromText} and {@link columnFromJson}),
 * so the rule and the note are the same for all formats.
 *
 * Cells are read by {@link readNumber} (whitespace, `+`, dash-like minus signs,
 * exponents, infinities, missing-value markers). Thousands separators are read
 * only where they cannot be a decimal comma: a cell with comma groups of three
 * digits (`1,003`) is read as 1003 when its column also has a number written
 * with a decimal point (`2.5`) or a group that can only be thousands
 * (`1,234,567`, `12,345.5`), and no cell of the column uses a decimal comma
 * (`2,5`); otherwise it is an unreadable cell. In comma-separated text such a
 * cell is quoted (`"1,003"`), which is the usual way it arrives.
 */
export class NumberReader {
  private data: Float64Array;
  private length = 0;
  private readable = 0;
  private bad = 0;
  private readonly badRows: number[] = [];
  private badExample: string | null = null;
  private readonly groupRows: number[] = [];
  private readonly groupValues: number[] = [];
  private groupExample: string | null = null;
  private pointSeen = false;
  private groupCertain = false;
  private decimalComma = false;
  private readonly limit: number;

  /**
   * @param capacity Expected number of cells (an upper bound saves copying).
   * @param forced The column is numbers whatever its cells (a dataresource field
   *   declared number or integer): unreadable cells are noted, never refused.
   */
  constructor(
    capacity: number,
    private readonly forced = false
  ) {
    this.data = new Float64Array(Math.max(0, capacity));
    this.limit = forced ? Infinity : unreadableAllowed(capacity);
  }

  /** True once more cells failed than the rule could allow for a column of `capacity` cells: reading on is of no use. */
  get givenUp(): boolean {
    return this.bad > this.limit;
  }

  /** Read the next cell as text (null: missing). */
  text(cell: string | null): void {
    if (cell === null) {
      this.push(NaN);
      return;
    }
    const v = readNumber(cell);
    if (v === undefined) {
      this.unreadableText(cell);
      return;
    }
    if (v === v) {
      this.readable++;
      if (!this.pointSeen && cell.indexOf('.') >= 0) {
        this.pointSeen = true;
      }
    }
    this.push(v);
  }

  /** Read the next cell, a plain decimal already read as `v` (see `readPlainNumber`); `point`: its text had a decimal point. */
  plain(v: number, point: boolean): void {
    if (v === v) {
      this.readable++;
      if (point) {
        this.pointSeen = true;
      }
    }
    this.push(v);
  }

  /** Read the next cell as a JSON value: numbers as they are, strings as text, null as missing, anything else unreadable. */
  value(v: unknown): void {
    if (typeof v === 'number') {
      if (v === v) {
        this.readable++;
        this.pointSeen ||= Number.isFinite(v) && !Number.isInteger(v);
      }
      this.push(v);
    } else if (typeof v === 'string') {
      this.text(v);
    } else if (v === null || v === undefined) {
      this.push(NaN);
    } else {
      this.fail(this.badExample === null ? exampleOf(v) : '');
    }
  }

  /** The column's numbers when the rule makes it a number column (always when forced), else null. */
  finish(): INumbersRead | null {
    const values = this.length === this.data.length ? this.data : this.data.subarray(0, this.length);
    let readable = this.readable;
    let bad = this.bad;
    let rows = this.badRows;
    let example = this.badExample;
    if (this.groupRows.length > 0) {
      if (!this.decimalComma && (this.pointSeen || this.groupCertain)) {
        this.groupRows.forEach((r, k) => {
          values[r] = this.groupValues[k];
        });
        readable += this.groupRows.length;
      } else {
        bad += this.groupRows.length;
        rows = [...rows, ...this.groupRows.slice(0, LISTED_ROWS)].sort((a, b) => a - b).slice(0, LISTED_ROWS);
        example = this.badRows.length > 0 && this.badRows[0] < this.groupRows[0] ? example : this.groupExample;
      }
    }
    const filled = readable + bad;
    if (!this.forced && bad > 0 && (readable < MIN_NUMBERS_BESIDE_UNREADABLE || bad > unreadableAllowed(filled))) {
      return null;
    }
    return { values, unreadable: bad > 0 ? { count: bad, filled, rows, example: example ?? '' } : null };
  }

  private unreadableText(cell: string): void {
    const t = numberText(cell);
    const grouped = groupedNumber(t);
    if (grouped !== undefined) {
      this.groupRows.push(this.length);
      this.groupValues.push(grouped.value);
      this.groupExample ??= t;
      this.groupCertain ||= grouped.certain;
      this.push(NaN);
      return;
    }
    this.decimalComma ||= isDecimalComma(t);
    this.fail(t);
  }

  private fail(example: string): void {
    this.bad++;
    if (this.badRows.length < LISTED_ROWS) {
      this.badRows.push(this.length);
    }
    this.badExample ??= example;
    this.push(NaN);
  }

  private push(v: number): void {
    if (this.length === this.data.length) {
      const grown = new Float64Array(Math.max(16, this.data.length * 2));
      grown.set(this.data);
      this.data = grown;
    }
    this.data[this.length++] = v;
  }
}

/** The number column of cells read by a {@link NumberReader}, adding the 'unreadable' note to `notes` when some cells could not be read. */
export function numberColumnRead(header: string, read: INumbersRead, isIndex: boolean, notes: ITableNote[]): IColumn {
  if (read.unreadable !== null) {
    notes.push(unreadableNote(header, read.unreadable));
  }
  return numberColumn(header, read.values, isIndex);
}

/** The refusal of a cell longer than the limit, naming its row and column (0-based `row` and `colIndex`). */
export function cellTooLong(length: number, row: number, colIndex: number, header: string): TableParseError {
  return new TableParseError(
    msg(
      'table.cell-too-long',
      'The cell in row %1, column %2 (“%3”) holds %4 characters; at most %5 can be read.',
      wholeNumber(row + 1),
      wholeNumber(colIndex + 1),
      shortHeader(header),
      wholeNumber(length),
      wholeNumber(TABLE_LIMITS.maxCellChars)
    )
  );
}

/** Refuse a cell longer than the limit, naming its row and column. */
export function checkCellLength(text: string, row: number, colIndex: number, header: string): void {
  if (text.length > TABLE_LIMITS.maxCellChars) {
    throw cellTooLong(text.length, row, colIndex, header);
  }
}

function makeColumn(header: string, isIndex: boolean): Omit<IColumn, 'kind' | 'values'> {
  const split = splitHeader(header);
  return { name: split.name, unit: split.unit, header, isIndex };
}

/** A number column from values already converted (full precision). */
export function numberColumn(header: string, values: Float64Array, isIndex: boolean): IColumn {
  return { ...makeColumn(header, isIndex), kind: 'number', values };
}

/** The cells read as numbers by the rule of {@link NumberReader}, or null when they are not a number column. */
function numbersFromText(cells: readonly (string | null)[]): INumbersRead | null {
  const reader = new NumberReader(cells.length);
  for (let i = 0; i < cells.length && !reader.givenUp; i++) {
    reader.text(cells[i]);
  }
  return reader.givenUp ? null : reader.finish();
}

/**
 * Build a typed column from displayed texts (null = missing). A number column
 * when {@link NumberReader}'s rule says so (a few unreadable cells become NaN,
 * noted in `options.notes`); else the narrowest kind that fits every
 * non-missing cell: boolean, datetime, else string.
 */
export function columnFromText(header: string, cells: readonly (string | null)[], options: ITextColumnOptions): IColumn {
  const base = makeColumn(header, options.isIndex);
  const numbers = numbersFromText(cells);
  if (numbers) {
    const column = numberColumnRead(header, numbers, options.isIndex, options.notes);
    if (options.displayed) {
      const digits = displayedRounding(cells);
      if (digits !== undefined) {
        column.shownDigits = digits;
      }
    }
    return column;
  }
  const kind = inferTextKind(cells);
  if (kind === 'boolean') {
    return { ...base, kind, values: cells.map(c => (c === null ? null : (parseBoolean(c) ?? null))) };
  }
  if (kind === 'datetime') {
    const parts = cells.map(c => (c === null || isMissingText(c) ? null : (parseDateParts(c) ?? null)));
    return { ...base, kind, values: canonicalDates(parts) };
  }
  return { ...base, kind: 'string', values: cells.map(c => (c === null || isMissingText(c) ? null : c)) };
}

function inferTextKind(cells: readonly (string | null)[]): ColumnKind {
  let bool = true;
  let date = true;
  for (const c of cells) {
    if (c === null || isMissingText(c)) {
      continue;
    }
    if (bool && parseBoolean(c) === undefined) {
      bool = false;
    }
    if (date && parseDateParts(c) === undefined) {
      date = false;
    }
    if (!bool && !date) {
      return 'string';
    }
  }
  return bool ? 'boolean' : date ? 'datetime' : 'string';
}

/**
 * For a displayed numeric column: the largest significant-digit count shown when the
 * column looks rounded (some value shows `display.precision` decimals), else undefined.
 */
export function displayedRounding(cells: readonly (string | null)[]): number | undefined {
  let rounded = false;
  let maxDigits = 0;
  for (const cell of cells) {
    if (cell === null) {
      continue;
    }
    let c = numberText(cell);
    if (groupedNumber(c) !== undefined) {
      c = c.replace(/,/g, '');
    }
    const v = parseNumber(c);
    if (v === undefined || !Number.isFinite(v)) {
      continue;
    }
    if (decimalsShown(c) >= PANDAS_DISPLAY_PRECISION) {
      rounded = true;
    }
    maxDigits = Math.max(maxDigits, significantDigits(c));
  }
  return rounded ? maxDigits : undefined;
}

/** Kind hint for a JSON column (from a dataresource schema), or 'infer'. */
export type JsonKindHint = ColumnKind | 'infer';

/**
 * Build a typed column from JSON cell values (null/undefined = missing). With
 * the hint 'number' (a dataresource field declared number or integer) the
 * column is numbers whatever its values, those that cannot be read noted in
 * `options.notes`; with 'infer' it is numbers by {@link NumberReader}'s rule
 * (JSON numbers and number strings alike), else the narrowest kind that fits.
 */
export function columnFromJson(
  header: string,
  values: readonly unknown[],
  options: { isIndex: boolean; hint: JsonKindHint; colIndex: number; notes: ITableNote[] }
): IColumn {
  const base = makeColumn(header, options.isIndex);
  if (options.hint === 'number' || options.hint === 'infer') {
    const reader = new NumberReader(values.length, options.hint === 'number');
    for (let i = 0; i < values.length && !reader.givenUp; i++) {
      reader.value(values[i]);
    }
    const numbers = reader.givenUp ? null : reader.finish();
    if (numbers) {
      return numberColumnRead(header, numbers, options.isIndex, options.notes);
    }
  }
  const kind = options.hint === 'infer' ? inferJsonKind(values) : options.hint;
  if (kind === 'boolean') {
    return {
      ...base,
      kind,
      values: values.map(v => (typeof v === 'boolean' ? v : typeof v === 'string' ? (parseBoolean(v) ?? null) : null))
    };
  }
  if (kind === 'datetime') {
    const parts: (IDateParts | null)[] = values.map(v => (typeof v === 'string' ? (parseDateParts(v) ?? null) : null));
    const iso = canonicalDates(parts);
    return { ...base, kind, values: iso.map((s, i) => s ?? jsonText(values[i], i, options.colIndex, header)) };
  }
  return { ...base, kind: 'string', values: values.map((v, i) => jsonText(v, i, options.colIndex, header)) };
}

function jsonText(v: unknown, row: number, colIndex: number, header: string): string | null {
  if (v === null || v === undefined) {
    return null;
  }
  const text = typeof v === 'string' ? v : typeof v === 'object' ? JSON.stringify(v) : String(v);
  checkCellLength(text, row, colIndex, header);
  return text;
}

/** The kind of a JSON column that is not a number column: boolean, datetime, else string. */
function inferJsonKind(values: readonly unknown[]): Exclude<ColumnKind, 'number'> {
  let bool = true;
  let date = true;
  for (const v of values) {
    if (v === null || v === undefined) {
      continue;
    }
    bool &&= typeof v === 'boolean';
    date &&= typeof v === 'string' && parseDateParts(v) !== undefined;
  }
  return bool ? 'boolean' : date ? 'datetime' : 'string';
}
