/**
 * `application/vnd.dataresource+json` (Table Schema + data records), which
 * pandas emits with `display.html.table_schema` enabled (`to_json(orient='table')`).
 */
import { columnFromJson } from './columns';
import type { JsonKindHint } from './columns';
import { collectRecords, isRecord, jsonType, jsonValue } from './json';
import { fixedDecimals, significantDigits } from './cells';
import { msg } from '../messages';
import { wholeNumber } from '../numeric/messageArgs';
import { checkRowAndColumnCounts, shortHeader } from './limits';
import { roundedNote } from './notes';
import type { IColumn, ITable, ITableNote } from './types';
import { TableParseError } from './types';

/** Table Schema field types mapped to column kinds. */
function hintFor(type: unknown): JsonKindHint {
  switch (type) {
    case 'integer':
    case 'number':
      return 'number';
    case 'boolean':
      return 'boolean';
    case 'datetime':
    case 'date':
      return 'datetime';
    case 'string':
    case 'duration':
    case 'time':
      return 'string';
    default:
      return 'infer';
  }
}

/** Parse a dataresource payload (text or parsed value). */
export function parseDataResource(payload: unknown): ITable {
  const value = jsonValue(payload, 'dataresource');
  if (!isRecord(value)) {
    throw new TableParseError(
      msg('table.dataresource.not-object', 'The dataresource output holds a value of type %1, not an object with “schema” and “data”.', jsonType(value))
    );
  }
  const { schema, data } = value;
  if (!Array.isArray(data)) {
    throw new TableParseError(msg('table.dataresource.data-not-list', 'The “data” of the dataresource is of type %1, not a list of rows.', jsonType(data)));
  }
  const fields = isRecord(schema) && Array.isArray(schema.fields) ? schema.fields : null;
  if (fields === null) {
    throw new TableParseError(msg('table.dataresource.no-fields', 'The dataresource has no “schema.fields” list naming its columns.'));
  }
  checkRowAndColumnCounts(data.length, fields.length, 'dataresource');
  const names: string[] = [];
  const hints: JsonKindHint[] = [];
  fields.forEach((f, c) => {
    if (!isRecord(f) || f.name === undefined || f.name === null) {
      throw new TableParseError(msg('table.dataresource.field-unnamed', 'Column %1 of the dataresource schema has no name.', wholeNumber(c + 1)));
    }
    names.push(typeof f.name === 'string' ? f.name : String(f.name));
    hints.push(hintFor(f.type));
  });
  const rawKey = isRecord(schema) ? schema.primaryKey : undefined;
  const primaryKey = new Set<string>(
    typeof rawKey === 'string' ? [rawKey] : Array.isArray(rawKey) ? rawKey.filter((k): k is string => typeof k === 'string') : []
  );
  const cells = collectRecords(data, 'dataresource', names);
  const known = new Set(names);
  const extra = [...cells.keys()].find(k => !known.has(k));
  if (extra !== undefined) {
    const row = data.findIndex(r => isRecord(r) && extra in r);
    throw new TableParseError(
      msg('table.dataresource.unlisted-column', 'Row %1 of the dataresource data has a column “%2” that the schema does not list.', wholeNumber(row + 1), shortHeader(extra))
    );
  }
  const notes: ITableNote[] = [];
  const columns: IColumn[] = names.map((name, c) =>
    columnFromJson(name, cells.get(name) ?? [], { isIndex: primaryKey.has(name), hint: hints[c], colIndex: c, notes })
  );
  const table: ITable = { columns, rowCount: data.length, format: 'dataresource', notes };
  if (isRecord(schema) && schema.pandas_version !== undefined) {
    columns.forEach(markJsonRounding);
    const note = roundedNote(columns, 'json');
    if (note) {
      table.notes.push(note);
    }
  }
  return table;
}

/** Decimal places pandas' to_json keeps by default (double_precision). */
export const PANDAS_JSON_PRECISION = 10;

/** Set shownDigits on a number column whose values show signs of to_json's 10-decimal rounding. */
function markJsonRounding(column: IColumn): void {
  if (!(column.values instanceof Float64Array)) {
    return;
  }
  let rounded = false;
  let digits = 0;
  for (const v of column.values) {
    if (!Number.isFinite(v)) {
      continue;
    }
    const text = String(v);
    if (fixedDecimals(text) >= PANDAS_JSON_PRECISION) {
      rounded = true;
    }
    digits = Math.max(digits, significantDigits(text));
  }
  if (rounded) {
    column.shownDigits = digits;
  }
}
