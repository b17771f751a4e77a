/**
 * Turning raw cells (displayed text or JSON values) into typed columns.
 */
import {
  canonicalDates,
  decimalsShown,
  fastNumber,
  isMissingText,
  parseBoolean,
  parseDateParts,
  parseNumber,
  significantDigits
} from './cells';
import type { IDateParts } from './cells';
import type { ColumnKind, IColumn } from './types';
import { msg } from '../messages';
import { wholeNumber } from '../numeric/messageArgs';
import { shortHeader } from './limits';
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

function numberColumnFromText(cells: readonly (string | null)[]): Float64Array | undefined {
  const out = new Float64Array(cells.length);
  for (let i = 0; i < cells.length; i++) {
    const text = cells[i];
    if (text === null) {
      out[i] = NaN;
      continue;
    }
    const v = fastNumber(text) ?? parseNumber(text);
    if (v !== undefined) {
      out[i] = v;
    } else if (isMissingText(text)) {
      out[i] = NaN;
    } else {
      return undefined;
    }
  }
  return out;
}

/**
 * Build a typed column from displayed texts (null = missing). Kind is the
 * narrowest that fits every non-missing cell: number, boolean, datetime, else string.
 */
export function columnFromText(header: string, cells: readonly (string | null)[], options: ITextColumnOptions): IColumn {
  const base = makeColumn(header, options.isIndex);
  const numbers = numberColumnFromText(cells);
  if (numbers) {
    const column: IColumn = { ...base, kind: 'number', values: numbers };
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
  for (const c of cells) {
    const v = c === null ? undefined : parseNumber(c);
    if (c === null || v === undefined || !Number.isFinite(v)) {
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

/** Build a typed column from JSON cell values (null/undefined = missing). */
export function columnFromJson(
  header: string,
  values: readonly unknown[],
  options: { isIndex: boolean; hint: JsonKindHint; colIndex: number }
): IColumn {
  const base = makeColumn(header, options.isIndex);
  const kind = options.hint === 'infer' ? inferJsonKind(values) : options.hint;
  if (kind === 'number') {
    const out = new Float64Array(values.length);
    for (let i = 0; i < values.length; i++) {
      const v = values[i];
      out[i] = typeof v === 'number' ? v : typeof v === 'string' ? (parseNumber(v.trim()) ?? NaN) : NaN;
    }
    return { ...base, kind, values: out };
  }
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

function inferJsonKind(values: readonly unknown[]): ColumnKind {
  let num = true;
  let bool = true;
  let date = true;
  for (const v of values) {
    if (v === null || v === undefined) {
      continue;
    }
    const special = typeof v === 'string' ? parseNumber(v) : undefined;
    num &&= typeof v === 'number' || (special !== undefined && !Number.isFinite(special));
    bool &&= typeof v === 'boolean';
    date &&= typeof v === 'string' && parseDateParts(v) !== undefined;
  }
  return num ? 'number' : bool ? 'boolean' : date ? 'datetime' : 'string';
}
