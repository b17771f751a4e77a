/**
 * JSON tables: records (`[{...}, ...]`), column objects (`{"col": [...]}`),
 * pandas `to_json(orient='columns')` dict-of-dicts, and pandas `orient='split'`.
 */
import { columnFromJson, columnFromText } from './columns';
import type { JsonKindHint } from './columns';
import { checkCellDepth, checkRowAndColumnCounts, checkTextSize } from './limits';
import type { IColumn, ITable } from './types';
import { TableParseError } from './types';

/** Plain object guard (not an array, not null). */
export function isRecord(v: unknown): v is Record<string, unknown> {
  return v !== null && typeof v === 'object' && !Array.isArray(v);
}

/** Describe a JSON value's type for messages. */
export function jsonType(v: unknown): string {
  return v === null ? 'null' : Array.isArray(v) ? 'an array' : typeof v === 'object' ? 'an object' : `a ${typeof v}`;
}

/** Parse JSON text, or pass an already-parsed value through. */
export function jsonValue(payload: unknown, what: string): unknown {
  if (typeof payload !== 'string') {
    return payload;
  }
  checkTextSize(payload.length, what);
  try {
    return JSON.parse(payload) as unknown;
  } catch (e) {
    throw new TableParseError(`${what} is not valid JSON: ${e instanceof Error ? e.message : String(e)}.`);
  }
}

/**
 * Column-wise cells gathered from records, with keys in order of first appearance.
 * Refuses non-object rows and over-deep cells, naming the row (and column).
 */
export function collectRecords(rows: readonly unknown[], what: string, keys: string[] = []): Map<string, unknown[]> {
  checkRowAndColumnCounts(rows.length, keys.length, what);
  const columns = new Map<string, unknown[]>();
  for (const k of keys) {
    columns.set(k, new Array<unknown>(rows.length).fill(null));
  }
  for (let r = 0; r < rows.length; r++) {
    const row = rows[r];
    if (!isRecord(row)) {
      throw new TableParseError(`Row ${r + 1} of the ${what} is ${jsonType(row)}, not an object of column values.`);
    }
    for (const [k, v] of Object.entries(row)) {
      let col = columns.get(k);
      if (!col) {
        checkRowAndColumnCounts(rows.length, columns.size + 1, what);
        col = new Array<unknown>(rows.length).fill(null);
        columns.set(k, col);
      }
      checkCellDepth(v, r, k);
      col[r] = v;
    }
  }
  return columns;
}

function tableFromColumns(columns: Iterable<[string, unknown[]]>, rowCount: number, index: IColumn | null): ITable {
  const out: IColumn[] = index ? [index] : [];
  let c = out.length;
  for (const [name, values] of columns) {
    out.push(columnFromJson(name, values, { isIndex: false, hint: 'infer' satisfies JsonKindHint, colIndex: c++ }));
  }
  return { columns: out, rowCount, format: 'json', notes: [] };
}

/** Parse a JSON table payload (text or parsed value). */
export function parseJsonTable(payload: unknown): ITable {
  const value = jsonValue(payload, 'The JSON text');
  if (Array.isArray(value)) {
    if (value.length === 0) {
      throw new TableParseError('The JSON records list is empty: it has no rows or columns.', 'no-table');
    }
    const columns = collectRecords(value, 'JSON records');
    return tableFromColumns(columns, value.length, null);
  }
  if (!isRecord(value)) {
    throw new TableParseError(`The JSON payload is ${jsonType(value)}, not a table (records or column arrays).`, 'no-table');
  }
  if (Array.isArray(value.columns) && Array.isArray(value.data)) {
    return parseSplit(value.columns, value.data, value.index);
  }
  return parseColumnObject(value);
}

function parseColumnObject(value: Record<string, unknown>): ITable {
  const entries = Object.entries(value);
  if (entries.length === 0) {
    throw new TableParseError('The JSON object is empty: it has no columns.', 'no-table');
  }
  const allArrays = entries.every(([, v]) => Array.isArray(v));
  const allObjects = entries.every(([, v]) => isRecord(v));
  if (!allArrays && !allObjects) {
    const bad = entries.find(([, v]) => !Array.isArray(v) && !isRecord(v)) ?? entries.find(([, v]) => !Array.isArray(v));
    const [k, v] = bad ?? entries[0];
    throw new TableParseError(
      `Column '${k.slice(0, 40)}' of the JSON object holds ${jsonType(v)}; every column must be an array, or every column an object keyed by row.`
    );
  }
  if (allArrays) {
    const rowCount = (entries[0][1] as unknown[]).length;
    checkRowAndColumnCounts(rowCount, entries.length, 'JSON column');
    const columns = new Map<string, unknown[]>();
    for (const [k, v] of entries) {
      const arr = v as unknown[];
      if (arr.length !== rowCount) {
        throw new TableParseError(
          `Column '${k.slice(0, 40)}' of the JSON object has ${arr.length} values but column '${entries[0][0].slice(0, 40)}' has ${rowCount}.`
        );
      }
      arr.forEach((cell, r) => checkCellDepth(cell, r, k));
      columns.set(k, arr);
    }
    return tableFromColumns(columns, rowCount, null);
  }
  const rowKeys = new Map<string, number>();
  for (const [, v] of entries) {
    for (const key of Object.keys(v as Record<string, unknown>)) {
      if (!rowKeys.has(key)) {
        rowKeys.set(key, rowKeys.size);
      }
    }
  }
  checkRowAndColumnCounts(rowKeys.size, entries.length + 1, 'JSON column');
  const columns = new Map<string, unknown[]>();
  for (const [k, v] of entries) {
    const col = new Array<unknown>(rowKeys.size).fill(null);
    for (const [rk, cell] of Object.entries(v as Record<string, unknown>)) {
      const r = rowKeys.get(rk) as number;
      checkCellDepth(cell, r, k);
      col[r] = cell;
    }
    columns.set(k, col);
  }
  const index = columnFromText('index', [...rowKeys.keys()], { isIndex: true, displayed: false });
  return tableFromColumns(columns, rowKeys.size, index);
}

function parseSplit(names: unknown[], data: unknown[], index: unknown): ITable {
  const keys = names.map(n => (typeof n === 'string' ? n : JSON.stringify(n) ?? String(n)));
  checkRowAndColumnCounts(data.length, keys.length + 1, 'JSON split');
  const columns: [string, unknown[]][] = keys.map(k => [k, new Array<unknown>(data.length).fill(null)]);
  const cols = columns.map(([, v]) => v);
  data.forEach((row, r) => {
    if (!Array.isArray(row)) {
      throw new TableParseError(`Row ${r + 1} of the JSON 'data' is ${jsonType(row)}, not an array of cells.`);
    }
    if (row.length > keys.length) {
      throw new TableParseError(`Row ${r + 1} of the JSON 'data' has ${row.length} cells but there are ${keys.length} columns.`);
    }
    row.forEach((cell, c) => {
      checkCellDepth(cell, r, keys[c]);
      cols[c][r] = cell;
    });
  });
  let indexColumn: IColumn | null = null;
  if (Array.isArray(index)) {
    if (index.length !== data.length) {
      throw new TableParseError(`The JSON 'index' has ${index.length} entries but 'data' has ${data.length} rows.`);
    }
    index.forEach((cell, r) => checkCellDepth(cell, r, 'index'));
    indexColumn = columnFromJson('index', index, { isIndex: true, hint: 'infer', colIndex: 0 });
  }
  return tableFromColumns(columns, data.length, indexColumn);
}
