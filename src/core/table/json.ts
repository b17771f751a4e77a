/**
 * JSON tables: records (`[{...}, ...]`), column objects (`{"col": [...]}`),
 * pandas `to_json(orient='columns')` dict-of-dicts, and pandas `orient='split'`.
 */
import { columnFromJson, columnFromText } from './columns';
import type { JsonKindHint } from './columns';
import { msg } from '../messages';
import { wholeNumber } from '../numeric/messageArgs';
import { checkCellDepth, checkRowAndColumnCounts, checkTextSize, shortHeader } from './limits';
import type { IColumn, ITable, ITableNote } from './types';
import { TableParseError } from './types';

/** Plain object guard (not an array, not null). */
export function isRecord(v: unknown): v is Record<string, unknown> {
  return v !== null && typeof v === 'object' && !Array.isArray(v);
}

/** The JSON type of a value, named as JSON names it (for messages: 'null', 'array', 'object', 'string', 'number', 'boolean'). */
export function jsonType(v: unknown): string {
  return v === null ? 'null' : Array.isArray(v) ? 'array' : typeof v;
}

/** Parse JSON text, or pass an already-parsed value through. */
export function jsonValue(payload: unknown, source: 'JSON' | 'dataresource'): unknown {
  if (typeof payload !== 'string') {
    return payload;
  }
  checkTextSize(payload.length, source);
  try {
    return JSON.parse(payload) as unknown;
  } catch (e) {
    throw new TableParseError(msg('table.json.invalid', 'The %1 output is not valid JSON (%2).', source, e instanceof Error ? e.message : String(e)));
  }
}

/**
 * Column-wise cells gathered from records, with keys in order of first appearance.
 * Refuses non-object rows and over-deep cells, naming the row (and column).
 */
export function collectRecords(rows: readonly unknown[], what: 'JSON' | 'dataresource', keys: string[] = []): Map<string, unknown[]> {
  checkRowAndColumnCounts(rows.length, keys.length, what);
  const columns = new Map<string, unknown[]>();
  for (const k of keys) {
    columns.set(k, new Array<unknown>(rows.length).fill(null));
  }
  for (let r = 0; r < rows.length; r++) {
    const row = rows[r];
    if (!isRecord(row)) {
      throw new TableParseError(
        msg('table.json.record-not-object', 'Row %1 of the %2 records is of type %3, not an object of column values.', wholeNumber(r + 1), what, jsonType(row))
      );
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

/** The table of JSON columns typed by the common rule; `notes` holds those of the index column, if any. */
function tableFromColumns(columns: Iterable<[string, unknown[]]>, rowCount: number, index: IColumn | null, notes: ITableNote[] = []): ITable {
  const out: IColumn[] = index ? [index] : [];
  let c = out.length;
  for (const [name, values] of columns) {
    out.push(columnFromJson(name, values, { isIndex: false, hint: 'infer' satisfies JsonKindHint, colIndex: c++, notes }));
  }
  return { columns: out, rowCount, format: 'json', notes };
}

/** Parse a JSON table payload (text or parsed value). */
export function parseJsonTable(payload: unknown): ITable {
  const value = jsonValue(payload, 'JSON');
  if (Array.isArray(value)) {
    if (value.length === 0) {
      throw new TableParseError(msg('table.json.empty-records', 'The JSON records list is empty: it has no rows or columns.'), 'no-table');
    }
    const columns = collectRecords(value, 'JSON');
    return tableFromColumns(columns, value.length, null);
  }
  if (!isRecord(value)) {
    throw new TableParseError(msg('table.json.not-table', 'The JSON output holds a value of type %1, not a table (records or column arrays).', jsonType(value)), 'no-table');
  }
  if (Array.isArray(value.columns) && Array.isArray(value.data)) {
    return parseSplit(value.columns, value.data, value.index);
  }
  return parseColumnObject(value);
}

function parseColumnObject(value: Record<string, unknown>): ITable {
  const entries = Object.entries(value);
  if (entries.length === 0) {
    throw new TableParseError(msg('table.json.empty-object', 'The JSON object is empty: it has no columns.'), 'no-table');
  }
  const allArrays = entries.every(([, v]) => Array.isArray(v));
  const allObjects = entries.every(([, v]) => isRecord(v));
  if (!allArrays && !allObjects) {
    const bad = entries.find(([, v]) => !Array.isArray(v) && !isRecord(v)) ?? entries.find(([, v]) => !Array.isArray(v));
    const [k, v] = bad ?? entries[0];
    throw new TableParseError(
      msg(
        'table.json.mixed-columns',
        'Column “%1” of the JSON object holds a value of type %2; every column must be an array, or every column an object keyed by row.',
        shortHeader(k),
        jsonType(v)
      )
    );
  }
  if (allArrays) {
    const rowCount = (entries[0][1] as unknown[]).length;
    checkRowAndColumnCounts(rowCount, entries.length, 'JSON');
    const columns = new Map<string, unknown[]>();
    for (const [k, v] of entries) {
      const arr = v as unknown[];
      if (arr.length !== rowCount) {
        throw new TableParseError(
          msg(
            'table.json.column-lengths',
            'Column “%1” of the JSON object has %2 values but column “%3” has %4.',
            shortHeader(k),
            wholeNumber(arr.length),
            shortHeader(entries[0][0]),
            wholeNumber(rowCount)
          )
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
  checkRowAndColumnCounts(rowKeys.size, entries.length + 1, 'JSON');
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
  const notes: ITableNote[] = [];
  const index = columnFromText('index', [...rowKeys.keys()], { isIndex: true, displayed: false, notes });
  return tableFromColumns(columns, rowKeys.size, index, notes);
}

function parseSplit(names: unknown[], data: unknown[], index: unknown): ITable {
  const keys = names.map(n => (typeof n === 'string' ? n : JSON.stringify(n) ?? String(n)));
  checkRowAndColumnCounts(data.length, keys.length + 1, 'JSON');
  const columns: [string, unknown[]][] = keys.map(k => [k, new Array<unknown>(data.length).fill(null)]);
  const cols = columns.map(([, v]) => v);
  data.forEach((row, r) => {
    if (!Array.isArray(row)) {
      throw new TableParseError(msg('table.json.split-row-not-list', 'Row %1 of the JSON “data” is of type %2, not a list of cells.', wholeNumber(r + 1), jsonType(row)));
    }
    if (row.length > keys.length) {
      throw new TableParseError(
        msg('table.json.split-row-too-wide', 'Row %1 of the JSON “data” has %2 cells but there are %3 columns.', wholeNumber(r + 1), wholeNumber(row.length), wholeNumber(keys.length))
      );
    }
    row.forEach((cell, c) => {
      checkCellDepth(cell, r, keys[c]);
      cols[c][r] = cell;
    });
  });
  let indexColumn: IColumn | null = null;
  const notes: ITableNote[] = [];
  if (Array.isArray(index)) {
    if (index.length !== data.length) {
      throw new TableParseError(
        msg('table.json.split-index-length', 'The JSON “index” has %1 entries but “data” has %2 rows.', wholeNumber(index.length), wholeNumber(data.length))
      );
    }
    index.forEach((cell, r) => checkCellDepth(cell, r, 'index'));
    indexColumn = columnFromJson('index', index, { isIndex: true, hint: 'infer', colIndex: 0, notes });
  }
  return tableFromColumns(columns, data.length, indexColumn, notes);
}
