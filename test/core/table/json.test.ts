/** JSON tables and dataresource payloads through parseMime. */
import { describe, expect, it } from 'vitest';
import { messageText } from '../../../src/core/messages';
import { parseMime, TABLE_LIMITS } from '../../../src/core/table/index';
import { plain, table, values } from './helpers';

function nested(depth: number): unknown {
  let v: unknown = 1;
  for (let i = 0; i < depth; i++) {
    v = [v];
  }
  return v;
}

describe('JSON records and columns', () => {
  it('records: keys in order of first appearance, missing keys are missing values', () => {
    const t = table(parseMime('application/json', [{ T: 1, M: 0.5 }, { T: 2, flag: true }, { T: 3, M: null }]));
    expect(t.format).toBe('json');
    expect(t.columns.map(c => [c.header, c.kind])).toEqual([
      ['T', 'number'],
      ['M', 'number'],
      ['flag', 'boolean']
    ]);
    expect(values(t.columns[1])).toEqual([0.5, NaN, NaN]);
    expect(values(t.columns[2])).toEqual([null, true, null]);
  });

  it('records given as JSON text; mixed columns become strings; ISO strings become datetimes', () => {
    const t = table(parseMime('application/json', '[{"a": 1, "d": "2024-01-01T00:00:00.000"}, {"a": "x", "d": "2024-01-02T00:00:00.000"}]'));
    expect(t.columns[0].kind).toBe('string');
    expect(values(t.columns[0])).toEqual(['1', 'x']);
    expect(t.columns[1].kind).toBe('datetime');
    expect(values(t.columns[1])).toEqual(['2024-01-01', '2024-01-02']);
  });

  it('column arrays', () => {
    const t = table(parseMime('application/json', { 'T (K)': [1, 2], 'M [emu/g]': [3, 4] }));
    expect(t.columns.map(c => [c.name, c.unit])).toEqual([
      ['T', 'K'],
      ['M', 'emu/g']
    ]);
  });

  it("pandas orient='columns' dict-of-dicts gives an index column", () => {
    const t = table(parseMime('application/json', '{"T":{"10":1.5,"20":2.5},"M":{"10":0.1,"20":0.2}}'));
    expect(t.columns[0]).toMatchObject({ header: 'index', isIndex: true, kind: 'number' });
    expect(values(t.columns[0])).toEqual([10, 20]);
    expect(values(t.columns[1])).toEqual([1.5, 2.5]);
  });

  it("pandas orient='split'", () => {
    const t = table(parseMime('application/json', { columns: ['a', 'b'], index: [5, 6], data: [[1, 'x'], [2, 'y']] }));
    expect(t.columns.map(c => c.header)).toEqual(['index', 'a', 'b']);
    expect(values(t.columns[2])).toEqual(['x', 'y']);
  });

  it('refusals name the row or column', () => {
    expect(plain(parseMime('application/json', [{ a: 1 }, 5]))).toEqual({
      ok: false,
      message: 'Row 2 of the JSON records is of type number, not an object of column values.'
    });
    expect(plain(parseMime('application/json', { a: [1, 2], b: [1] }))).toEqual({
      ok: false,
      message: 'Column “b” of the JSON object has 1 values but column “a” has 2.'
    });
    expect(plain(parseMime('application/json', { a: [1], b: 3 }))).toEqual({
      ok: false,
      message: 'Column “b” of the JSON object holds a value of type number; every column must be an array, or every column an object keyed by row.'
    });
    const deep = parseMime('application/json', [{ a: 1 }, { a: nested(TABLE_LIMITS.maxDepth + 5) }]);
    expect(plain(deep)).toEqual({ ok: false, message: `The cell in row 2, column “a” is nested more than ${TABLE_LIMITS.maxDepth} levels deep.` });
    expect(parseMime('application/json', '{"a": [1,')).toMatchObject({ ok: false });
    expect(plain(parseMime('application/json', 42))).toEqual({ ok: false, message: 'The JSON output holds a value of type number, not a table (records or column arrays).' });
  });

  it('a shallow nested cell is kept as its JSON text', () => {
    const t = table(parseMime('application/json', [{ a: [1, 2] }]));
    expect(values(t.columns[0])).toEqual(['[1,2]']);
  });

  it('survives a 200 000-deep array without a stack overflow', () => {
    const n = 200_000;
    const r = parseMime('application/json', `[{"a":${'['.repeat(n)}${']'.repeat(n)}}]`);
    expect(r.ok).toBe(false);
    expect(!r.ok && messageText(r.message)).toContain('row 1, column “a”');
  });
});

describe('dataresource', () => {
  const payload = {
    schema: {
      fields: [
        { name: 'run', type: 'integer' },
        { name: 'T (K)', type: 'number' },
        { name: 'ok', type: 'boolean' },
        { name: 'when', type: 'datetime' },
        { name: 's', type: 'string' }
      ],
      primaryKey: ['run'],
      pandas_version: '1.4.0'
    },
    data: [
      { run: 1, 'T (K)': 1.25, ok: true, when: '2024-01-01T12:00:00.000', s: 'a' },
      { run: 2, 'T (K)': null, ok: false, when: null, s: null }
    ]
  };
  it('types from the schema, primaryKey as index', () => {
    const t = table(parseMime('application/vnd.dataresource+json', payload));
    expect(t.format).toBe('dataresource');
    expect(t.columns.map(c => [c.header, c.kind, c.isIndex])).toEqual([
      ['run', 'number', true],
      ['T (K)', 'number', false],
      ['ok', 'boolean', false],
      ['when', 'datetime', false],
      ['s', 'string', false]
    ]);
    expect(values(t.columns[1])).toEqual([1.25, NaN]);
    expect(values(t.columns[3])).toEqual(['2024-01-01T12:00:00', null]);
    expect(t.notes).toEqual([]);
  });
  it("flags pandas to_json's 10-decimal rounding", () => {
    const t = table(
      parseMime('application/vnd.dataresource+json', {
        schema: { fields: [{ name: 'x', type: 'number' }], pandas_version: '1.4.0' },
        data: [{ x: 0.3333333333 }, { x: 0.5 }]
      })
    );
    expect(t.columns[0].shownDigits).toBe(10);
    expect(t.notes.map(n => n.kind)).toEqual(['rounded']);
  });
  it('refusals name the field or row', () => {
    expect(plain(parseMime('application/vnd.dataresource+json', { schema: { fields: [{ type: 'number' }] }, data: [] }))).toEqual({
      ok: false,
      message: 'Column 1 of the dataresource schema has no name.'
    });
    expect(plain(parseMime('application/vnd.dataresource+json', { schema: { fields: [{ name: 'a' }] }, data: [{ a: 1 }, { b: 2 }] }))).toEqual({
      ok: false,
      message: 'Row 2 of the dataresource data has a column “b” that the schema does not list.'
    });
    expect(parseMime('application/vnd.dataresource+json', { data: [] })).toMatchObject({ ok: false });
  });
});
