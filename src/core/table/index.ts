/**
 * Table parsers for notebook cell outputs: pick the richest table-bearing MIME
 * type of an output bundle and turn it into typed columns.
 *
 * Pure and DOM-free; nothing from an output is executed or inserted into a page.
 */
import { parseDelimited } from './csv';
import { parseDataResource } from './dataresource';
import { parsePandasHtml } from './html';
import { parseJsonTable } from './json';
import { crossCheckDataResource } from './crosscheck';
import { parsePandasText } from './text';
import type { ITable, ParseResult } from './types';
import { TableParseError } from './types';

export type { ColumnKind, IColumn, ITable, ITableLimits, ITableNote, ITruncation, ParseResult } from './types';
export { TABLE_LIMITS, TableParseError } from './types';
export { splitHeader } from './units';
export { CSV_DISPLAY_SNIPPET } from './notes';
export type { ISplitHeader } from './units';

/** MIME types that can hold a table, richest first. */
export const TABLE_MIME_PREFERENCE: readonly string[] = [
  'application/vnd.dataresource+json',
  'text/csv',
  'text/tab-separated-values',
  'text/html',
  'application/json',
  'text/plain'
];

/** Join nbformat multi-line strings (lists of lines) into one text. */
function textOf(payload: unknown): unknown {
  if (Array.isArray(payload) && payload.every(p => typeof p === 'string')) {
    return payload.join('');
  }
  return payload;
}

function requireText(payload: unknown, mime: string): string {
  const text = textOf(payload);
  if (typeof text !== 'string') {
    throw new TableParseError(`The ${mime} payload is not text.`);
  }
  return text;
}

function parseMimeOrThrow(mime: string, payload: unknown): ITable {
  switch (mime) {
    case 'application/vnd.dataresource+json':
      return parseDataResource(payload);
    case 'text/csv':
      return parseDelimited(requireText(payload, mime), ',');
    case 'text/tab-separated-values':
      return parseDelimited(requireText(payload, mime), '\t');
    case 'text/html':
      return parsePandasHtml(requireText(payload, mime));
    case 'application/json':
      return parseJsonTable(payload);
    case 'text/plain':
      return parsePandasText(requireText(payload, mime));
    default:
      throw new TableParseError(`The MIME type ${mime} does not hold a table.`, 'no-table');
  }
}

type Attempt = ParseResult | { ok: false; message: string; noTable: true };

/** Run a parser, turning refusals and unexpected failures into `{ ok: false }`. */
function attempt(run: () => ITable): Attempt {
  try {
    return { ok: true, table: run() };
  } catch (e) {
    if (e instanceof TableParseError) {
      return e.reason === 'no-table' ? { ok: false, message: e.message, noTable: true } : { ok: false, message: e.message };
    }
    if (e instanceof RangeError) {
      return { ok: false, message: `The output is too large or too deeply nested to read as a table (${e.message}).` };
    }
    return { ok: false, message: `The output could not be read as a table: ${e instanceof Error ? e.message : String(e)}.` };
  }
}

/** Parse one MIME payload. */
export function parseMime(mime: string, payload: unknown): ParseResult {
  const result = attempt(() => parseMimeOrThrow(mime, payload));
  return result.ok ? result : { ok: false, message: result.message };
}

function isObject(v: unknown): v is Record<string, unknown> {
  return v !== null && typeof v === 'object' && !Array.isArray(v);
}

/** The MIME bundle of an output, or a message saying why the output has none. */
function bundleOf(output: Readonly<Record<string, unknown>>): Readonly<Record<string, unknown>> | string {
  if (output.output_type === 'error' || ('ename' in output && 'traceback' in output)) {
    const name = typeof output.ename === 'string' ? output.ename : 'an exception';
    return `This output is an error (${name}), not a table.`;
  }
  if (output.output_type === 'stream') {
    return 'This output is printed text (a stream), not a table.';
  }
  if (isObject(output.data) && (output.output_type !== undefined || 'metadata' in output)) {
    return output.data;
  }
  return output;
}

/** Pick the richest table-bearing MIME type in an output bundle and parse it. */
export function parseOutput(bundle: Readonly<Record<string, unknown>>): ParseResult {
  if (!isObject(bundle)) {
    return { ok: false, message: 'This output holds no table: it is not a MIME bundle.' };
  }
  const data = bundleOf(bundle);
  if (typeof data === 'string') {
    return { ok: false, message: data };
  }
  const present = TABLE_MIME_PREFERENCE.filter(m => data[m] !== undefined && data[m] !== null);
  const refusals: string[] = [];
  for (const mime of present) {
    const result = attempt(() => parseMimeOrThrow(mime, data[mime]));
    if (result.ok) {
      if (mime === 'application/vnd.dataresource+json') {
        try {
          crossCheckDataResource(result.table, data, (m, p) => attempt(() => parseMimeOrThrow(m, p)));
        } catch {
          result.table.notes.push({ kind: 'info', message: 'The displays beside the dataresource could not be compared with it.' });
        }
      }
      if (refusals.length > 0) {
        result.table.notes.push({ kind: 'info', message: `Read from ${mime}; richer types of this output could not be read. ${refusals.join(' ')}` });
      }
      return result;
    }
    if (!('noTable' in result)) {
      refusals.push(`${mime}: ${result.message}`);
    }
  }
  if (refusals.length > 0) {
    return { ok: false, message: `This output's table could not be read. ${refusals.join(' ')}` };
  }
  const mimes = Object.keys(data);
  return {
    ok: false,
    message:
      mimes.length === 0
        ? 'This output holds no table: it is empty.'
        : `This output holds no table: it has only ${mimes.slice(0, 4).join(', ')}.`
  };
}
