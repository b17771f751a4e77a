/**
 * Table parsers for notebook cell outputs: pick the richest table-bearing MIME
 * type of an output bundle and turn it into typed columns.
 *
 * Pure and DOM-free; nothing from an output is executed or inserted into a page.
 */
import { msg } from '../messages';
import type { ICoreMessage } from '../messages';
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
    throw new TableParseError(msg('table.not-text', 'The %1 part of this output is not text.', mime));
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
      throw new TableParseError(msg('table.mime-no-table', 'The MIME type %1 does not hold a table.', mime), 'no-table');
  }
}

type Attempt = { ok: true; table: ITable } | { ok: false; message: ICoreMessage; noTable?: true };

/** Run a parser, turning refusals and unexpected failures into `{ ok: false }`. */
function attempt(run: () => ITable): Attempt {
  try {
    return { ok: true, table: run() };
  } catch (e) {
    if (e instanceof TableParseError) {
      return e.reason === 'no-table' ? { ok: false, message: e.detail, noTable: true } : { ok: false, message: e.detail };
    }
    if (e instanceof RangeError) {
      return { ok: false, message: msg('table.too-large', 'The output is too large or too deeply nested to read as a table.') };
    }
    return { ok: false, message: msg('table.failed', 'The output could not be read as a table (%1).', e instanceof Error ? e.message : String(e)) };
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
function bundleOf(output: Readonly<Record<string, unknown>>): { data: Readonly<Record<string, unknown>> } | { message: ICoreMessage } {
  if (output.output_type === 'error' || ('ename' in output && 'traceback' in output)) {
    return {
      message:
        typeof output.ename === 'string'
          ? msg('table.output-is-error', 'This output is an error (%1), not a table.', output.ename)
          : msg('table.output-is-exception', 'This output is an error, not a table.')
    };
  }
  if (output.output_type === 'stream') {
    return { message: msg('table.output-is-stream', 'This output is printed text (a stream), not a table.') };
  }
  if (isObject(output.data) && (output.output_type !== undefined || 'metadata' in output)) {
    return { data: output.data };
  }
  return { data: output };
}

/** Pick the richest table-bearing MIME type in an output bundle and parse it. */
export function parseOutput(bundle: Readonly<Record<string, unknown>>): ParseResult {
  if (!isObject(bundle)) {
    return { ok: false, message: msg('table.not-bundle', 'This output holds no table: it is not a MIME bundle.') };
  }
  const found = bundleOf(bundle);
  if ('message' in found) {
    return { ok: false, message: found.message };
  }
  const data = found.data;
  const present = TABLE_MIME_PREFERENCE.filter(m => data[m] !== undefined && data[m] !== null);
  const refused: string[] = [];
  const refusals: ICoreMessage[] = [];
  for (const mime of present) {
    const result = attempt(() => parseMimeOrThrow(mime, data[mime]));
    if (result.ok) {
      if (mime === 'application/vnd.dataresource+json') {
        try {
          crossCheckDataResource(result.table, data, (m, p) => attempt(() => parseMimeOrThrow(m, p)));
        } catch {
          result.table.notes.push({
            kind: 'info',
            message: msg('table.crosscheck-failed', 'The displays beside the dataresource could not be compared with it.')
          });
        }
      }
      if (refusals.length > 0) {
        // The refusal of each richer type follows as a note of its own.
        result.table.notes.push(
          { kind: 'info', message: msg('table.read-from-poorer', 'Read from %1: the richer types of this output (%2) could not be read.', mime, refused.join(', ')) },
          ...refusals.map(message => ({ kind: 'info' as const, message }))
        );
      }
      return { ok: true, table: result.table };
    }
    if (result.noTable !== true) {
      refused.push(mime);
      refusals.push(result.message);
    }
  }
  if (refusals.length === 1) {
    return { ok: false, message: refusals[0] };
  }
  if (refusals.length > 1) {
    return {
      ok: false,
      message: msg('table.unreadable', 'This output’s table could not be read from any of its types (%1).', refused.join(', ')),
      details: refusals
    };
  }
  const mimes = Object.keys(data);
  return {
    ok: false,
    message:
      mimes.length === 0
        ? msg('table.output-empty', 'This output holds no table: it is empty.')
        : msg('table.output-no-table-types', 'This output holds no table: it has only %1.', mimes.slice(0, 4).join(', '))
  };
}
