/**
 * Checks of payload size, table shape and nesting depth against TABLE_LIMITS.
 * Each refusal says what was too big and where.
 */
import { TABLE_LIMITS, TableParseError } from './types';

/** Refuse text longer than maxBytes. */
export function checkTextSize(length: number, what: string): void {
  if (length > TABLE_LIMITS.maxBytes) {
    throw new TableParseError(`${what} is ${length} characters long; the limit is ${TABLE_LIMITS.maxBytes}.`);
  }
}

/** Refuse tables with more rows or columns than allowed, naming the first row/column past the limit. */
export function checkRowAndColumnCounts(rows: number, columns: number, what: string): void {
  if (rows > TABLE_LIMITS.maxRows) {
    throw new TableParseError(
      `The ${what} table has ${rows} rows; the limit is ${TABLE_LIMITS.maxRows} (row ${TABLE_LIMITS.maxRows + 1} is the first past it).`
    );
  }
  if (columns > TABLE_LIMITS.maxColumns) {
    throw new TableParseError(
      `The ${what} table has ${columns} columns; the limit is ${TABLE_LIMITS.maxColumns} (column ${TABLE_LIMITS.maxColumns + 1} is the first past it).`
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
      `The cell in row ${row + 1}, column '${column.slice(0, 40)}' is nested more than ${TABLE_LIMITS.maxDepth} levels deep.`
    );
  }
}
