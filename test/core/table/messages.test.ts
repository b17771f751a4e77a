/**
 * Messages of the table parsers: refusals of malformed or oversized
 * payloads, notes on truncated and rounded displays, output-level answers.
 */
import { describe, expect, it } from 'vitest';
import { messageText } from '../../../src/core/messages';
import type { ICoreMessage } from '../../../src/core/messages';
import { MAX_HTML_TABLES } from '../../../src/core/table/htmldepth';
import { parseMime, parseOutput, TABLE_LIMITS } from '../../../src/core/table/index';
import type { ParseResult } from '../../../src/core/table/index';
import { expectGoodMessages } from '../numeric/messageRules';

function messages(r: ParseResult): ICoreMessage[] {
  return r.ok ? r.table.notes.map(n => n.message) : [r.message, ...(r.details ?? [])];
}

const deep = (n: number): string => `${'['.repeat(n)}${']'.repeat(n)}`;
const htmlRows = (cells: string): string => `<table class="dataframe"><thead><tr><th></th><th>a</th><th>b</th></tr></thead><tbody>${cells}</tbody></table>`;

const refusals: [string, ParseResult][] = [
  ['csv wide row', parseMime('text/csv', 'a,b\n1,2\n3,4,5\n')],
  ['csv quote', parseMime('text/csv', 'a,b\n1,2\n3,"4\n')],
  ['csv quote in header', parseMime('text/csv', 'a,"b\n1,2\n')],
  ['csv empty', parseMime('text/csv', '')],
  ['csv long cell', parseMime('text/csv', `a,b\n1,${'x'.repeat(TABLE_LIMITS.maxCellChars + 1)}\n`)],
  ['csv columns', parseMime('text/csv', `${Array.from({ length: TABLE_LIMITS.maxColumns + 1 }, (_, i) => `c${i}`).join(',')}\n`)],
  ['tsv not text', parseMime('text/tab-separated-values', 42)],
  ['json records', parseMime('application/json', [{ a: 1 }, 5])],
  ['json lengths', parseMime('application/json', { a: [1, 2], b: [1] })],
  ['json mixed', parseMime('application/json', { a: [1], b: 3 })],
  ['json deep', parseMime('application/json', [{ a: 1 }, { a: JSON.parse(deep(TABLE_LIMITS.maxDepth + 5)) as unknown }])],
  ['json invalid', parseMime('application/json', '{"a": [1,')],
  ['json scalar', parseMime('application/json', 42)],
  ['json empty', parseMime('application/json', [])],
  ['json empty object', parseMime('application/json', {})],
  ['json split row', parseMime('application/json', { columns: ['a'], data: [5] })],
  ['json split wide', parseMime('application/json', { columns: ['a'], data: [[1, 2]] })],
  ['json split index', parseMime('application/json', { columns: ['a'], data: [[1]], index: [1, 2] })],
  ['dataresource unnamed', parseMime('application/vnd.dataresource+json', { schema: { fields: [{ type: 'number' }] }, data: [] })],
  ['dataresource column', parseMime('application/vnd.dataresource+json', { schema: { fields: [{ name: 'a' }] }, data: [{ a: 1 }, { b: 2 }] })],
  ['dataresource fields', parseMime('application/vnd.dataresource+json', { data: [] })],
  ['dataresource data', parseMime('application/vnd.dataresource+json', { schema: { fields: [] }, data: 3 })],
  ['dataresource scalar', parseMime('application/vnd.dataresource+json', 'null')],
  ['html none', parseMime('text/html', '<div>no table</div>')],
  ['html empty', parseMime('text/html', '<table></table>')],
  ['html wide', parseMime('text/html', `<table><tr><th colspan="${TABLE_LIMITS.maxColumns}">a</th><th>b</th></tr></table>`)],
  ['html long cell', parseMime('text/html', `<table><tr><th>a</th></tr><tr><td>${'x'.repeat(TABLE_LIMITS.maxCellChars * 2 + 1)}</td></tr></table>`)],
  ['html deep', parseMime('text/html', `<table><tr><td>x</td><td>${'<div>'.repeat(TABLE_LIMITS.maxDepth + 2)}</td></tr></table>`)],
  ['html deep before rows', parseMime('text/html', `${'<div>'.repeat(TABLE_LIMITS.maxDepth + 2)}<table></table>`)],
  ['html attributes', parseMime('text/html', `<table><tr><td ${Array.from({ length: 2000 }, (_, i) => `a${i}=1`).join(' ')}>x</td></tr></table>`)],
  ['html spans', parseMime('text/html', `<table><tr><td rowspan="1" colspan="${TABLE_LIMITS.maxColumns}">x</td></tr>${'<tr><td colspan="2000">y</td></tr>'.repeat(6000)}</table>`)],
  ['text empty frame', parseMime('text/plain', 'Empty DataFrame\nColumns: [a]\nIndex: []')],
  ['text not a table', parseMime('text/plain', 'hello')],
  ['text empty series', parseMime('text/plain', 'Series([], dtype: float64)\nName: x, dtype: float64')],
  ['mime', parseMime('image/png', 'x')],
  ['output error', parseOutput({ output_type: 'error', ename: 'NameError', evalue: 'x', traceback: [] })],
  ['output exception', parseOutput({ ename: 3, traceback: [] })],
  ['output stream', parseOutput({ output_type: 'stream', name: 'stdout', text: 'x' })],
  ['output empty', parseOutput({})],
  ['output other', parseOutput({ 'image/png': 'x' })],
  ['output not bundle', parseOutput(null as unknown as Record<string, unknown>)],
  ['output two refusals', parseOutput({ 'text/csv': 'a\n1,2\n', 'application/json': '[1' })]
];

describe('table messages', () => {
  it('refusals are good messages with table codes', () => {
    const all: ICoreMessage[] = [];
    for (const [what, r] of refusals) {
      expect(r.ok, what).toBe(false);
      const m = messages(r);
      expect(m[0].code, what).toMatch(/^table\./);
      all.push(...m);
    }
    expectGoodMessages(all);
    expect(new Set(all.map(m => m.code)).size).toBeGreaterThan(30);
  });

  it('notes of truncated, rounded and partly read tables are good', () => {
    const rows = Array.from({ length: 5 }, (_, i) => `<tr><th>${i}</th><td>${(i / 7).toFixed(6)}</td><td>x</td></tr>`).join('');
    const gap = '<tr><th>...</th><td>...</td><td>...</td></tr>';
    const html = `${htmlRows(rows + gap + rows)}<p>100 rows × 5 columns</p>`;
    const results = [
      parseMime('text/html', html),
      parseMime('text/html', htmlRows(rows + gap + rows)),
      parseMime('text/html', `${htmlRows(rows)}<table><tr><td>1</td></tr></table>`),
      parseMime('text/html', htmlRows(rows).repeat(MAX_HTML_TABLES + 1)),
      parseMime('text/html', htmlRows('<tr><th>0</th><td>1</td></tr>')),
      parseMime('text/csv', 'a,b\n1,2\n3\n'),
      parseMime('text/plain', '     a    b\n0  1.0  2.0\n1  3.0  4.0\n..  ...  ...\n9  5.0  6.0\n\n[10 rows x 2 columns]'),
      parseMime('text/plain', '0    0.142857\n1    0.285714\n..        ...\n9    1.285714\nName: x, Length: 10, dtype: float64'),
      parseMime('application/vnd.dataresource+json', { schema: { fields: [{ name: 'x', type: 'number' }], pandas_version: '1.4.0' }, data: [{ x: 0.1428571429 }] }),
      parseOutput({ 'text/csv': 'a\n1,2\n', 'text/plain': '   a\n0  1\n1  2' }),
      parseOutput({
        'application/vnd.dataresource+json': { schema: { fields: [{ name: 'index', type: 'integer' }, { name: 'x', type: 'number' }], primaryKey: ['index'] }, data: [{ index: 0, x: null }] },
        'text/plain': '     x\n0  inf\n\n[20 rows x 1 columns]'
      })
    ];
    const notes = results.flatMap(messages);
    expectGoodMessages(notes);
    const codes = new Set(notes.map(n => n.code));
    for (const c of ['table.truncated.html', 'table.truncated.rows-gap', 'table.rounded.display', 'table.csv.short-rows', 'table.read-from-poorer', 'table.html.several-tables', 'table.html.too-many-tables']) {
      expect(codes, c).toContain(c);
    }
    const truncated = results[0].ok ? results[0].table.notes.filter(n => n.kind === 'truncated').map(n => messageText(n.message)) : [];
    expect(truncated[1]).toBe('Only 10 of 100 rows are shown; the rows elided after row 5 are marked “...” in the display.');
  });
});
