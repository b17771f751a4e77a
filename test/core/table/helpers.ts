/** Shared helpers of the table-parser tests. */
import type { IColumn, ITable, ParseResult } from '../../../src/core/table/index';
import { messageText } from '../../../src/core/messages';

/** The table of a successful parse (throws with the parser's message otherwise). */
export function table(r: ParseResult): ITable {
  if (!r.ok) {
    throw new Error(`expected a table, got: ${messageText(r.message)}`);
  }
  return r.table;
}

/** A parse result with its messages as English text (for comparing refusals). */
export function plain(r: ParseResult): { ok: true; table: ITable } | { ok: false; message: string; details?: string[] } {
  if (r.ok) {
    return r;
  }
  return r.details ? { ok: false, message: messageText(r.message), details: r.details.map(messageText) } : { ok: false, message: messageText(r.message) };
}

/** A column's values as a plain array ([] for a missing column). */
export function values(c: IColumn | undefined): unknown[] {
  return c === undefined ? [] : Array.from(c.values as ArrayLike<unknown>);
}
