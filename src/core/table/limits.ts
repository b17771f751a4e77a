/**
 * Checks of payload size, table shape and nesting depth against TABLE_LIMITS.
 * Each refusal says what was too big and where.
 */
import { msg } from '../messages';
import { wholeNumber } from '../numeric/messageArgs';
import { TABLE_LIMITS, TableParseError } from './types';

/** The format of a payload as named in messages (names of formats, not translated). */
export type TableSource = 'CSV' | 'TSV' | 'HTML' | 'JSON' | 'dataresource' | 'text';

/** A header shortened for messages. */
export function shortHeader(header: string): string {
  return header.length > 40 ? `${header.slice(0, 40)}…` : header;
}

/** Refuse text longer than maxBytes. */
export function checkTextSize(length: number, source: TableSource): void {
  if (length > TABLE_LIMITS.maxBytes) {
    throw new TableParseError(
      msg('table.too-long', 'The %1 output is %2 characters long; at most %3 can be read.', source, wholeNumber(length), wholeNumber(TABLE_LIMITS.maxBytes))
    );
  }
}

/** Refuse tables with more rows or columns than allowed, naming the first row/column past the limit. */
export function checkRowAndColumnCounts(rows: number, columns: number, source: TableSource): void {
  if (rows > TABLE_LIMITS.maxRows) {
    throw new TableParseError(
      msg(
        'table.too-many-rows',
        'The %1 table has %2 rows; at most %3 can be read (row %4 is the first past the limit).',
        source,
        wholeNumber(rows),
        wholeNumber(TABLE_LIMITS.maxRows),
        wholeNumber(TABLE_LIMITS.maxRows + 1)
      )
    );
  }
  if (columns > TABLE_LIMITS.maxColumns) {
    throw new TableParseError(
      msg(
        'table.too-many-columns',
        'The %1 table has %2 columns; at most %3 can be read (column %4 is the first past the limit).',
        source,
        wholeNumber(columns),
        wholeNumber(TABLE_LIMITS.maxColumns),
        wholeNumber(TABLE_LIMITS.maxColumns + 1)
      )
    );
  }
}

/**
 * Depth of nested arrays/objects in a JSON value, measured without recursion;
 * stops counting and returns as soon as `limit` is exceeded.
 */
export function jsonDepth(value: unknown, limit: number): number {
  let max = 0;
  const stack: [unknown, number][] = [[value, 1]];
  let visited = 0;
  while (stack.length > 0) {
    const [v, d] = stack.pop() as [unknown, number];
    if (v === null || typeof v !== 'object') {
      continue;
    }
    if (d > max) {
      max = d;
      if (max > limit) {
        return max;
      }
    }
    visited++;
    if (visited > 4 * TABLE_LIMITS.maxRows) {
      break;
    }
    const children = Array.isArray(v) ? v : Object.values(v);
    for (const child of children) {
      if (child !== null && typeof child === 'object') {
        stack.push([child, d + 1]);
      }
    }
  }
  return max;
}

/** Refuse a JSON cell nested deeper than maxDepth, naming its row and column. */
export function checkCellDepth(value: unknown, row: number, column: string): void {
  if (value !== null && typeof value === 'object' && jsonDepth(value, TABLE_LIMITS.maxDepth) > TABLE_LIMITS.maxDepth) {
    throw new TableParseError(
      msg('table.cell-too-deep', 'The cell in row %1, column “%2” is nested more than %3 levels deep.', wholeNumber(row + 1), shortHeader(column), TABLE_LIMITS.maxDepth)
    );
  }
}
