/** Shared helpers of the table-parser tests. */
import type { IColumn, ITable, ParseResult } from '../../../src/core/table/index';

/** The table of a successful parse (throws with the parser's message otherwise). */
export function table(r: ParseResult): ITable {
  if (!r.ok) {
    throw new Error(`expected a table, got: ${r.message}`);
  }
  return r.table;
}

/** A column's values as a plain array ([] for a missing column). */
export function values(c: IColumn | undefined): unknown[] {
  return c === undefined ? [] : Array.from(c.values as ArrayLike<unknown>);
}
