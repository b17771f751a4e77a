/** parseOutput: MIME preference, non-table outputs, nbformat shapes; and the pandas text repr. */
import { describe, expect, it } from 'vitest';
import { messageText } from '../../../src/core/messages';
import { parseMime, parseOutput } from '../../../src/core/table/index';
import { plain, table, values } from './helpers';

const HTML = '<table class="dataframe"><thead><tr><th></th><th>a</th></tr></thead><tbody><tr><th>0</th><td>1.0</td></tr></tbody></table>';
const PLAIN = '     a\n0  1.0';
const CSV = ',a\n0,1.0\n';
const RESOURCE = { schema: { fields: [{ name: 'index', type: 'integer' }, { name: 'a', type: 'number' }], primaryKey: ['index'] }, data: [{ index: 0, a: 1 }] };

describe('parseOutput', () => {
  it('prefers dataresource > csv > html > json > plain', () => {
    expect(table(parseOutput({ 'text/plain': PLAIN, 'text/html': HTML, 'text/csv': CSV, 'application/vnd.dataresource+json': RESOURCE })).format).toBe('dataresource');
    expect(table(parseOutput({ 'text/plain': PLAIN, 'text/html': HTML, 'text/csv': CSV })).format).toBe('csv');
    expect(table(parseOutput({ 'text/plain': PLAIN, 'text/html': HTML, 'application/json': [{ a: 1 }] })).format).toBe('pandas-html');
    expect(table(parseOutput({ 'text/plain': PLAIN, 'application/json': [{ a: 1 }] })).format).toBe('json');
    expect(table(parseOutput({ 'text/plain': PLAIN })).format).toBe('pandas-text');
  });

  it('falls back when the richer type holds no table (HTML without a table)', () => {
    expect(table(parseOutput({ 'text/html': '<b>hi</b>', 'text/plain': PLAIN })).format).toBe('pandas-text');
  });

  it('says plainly when there is no table', () => {
    expect(plain(parseOutput({ 'image/png': 'iVBORw0KGgo=', 'text/plain': '<Figure size 640x480 with 1 Axes>' }))).toEqual({
      ok: false,
      message: 'This output holds no table: it has only image/png, text/plain.'
    });
    expect(plain(parseOutput({ 'text/plain': "'just a string'" }))).toEqual({ ok: false, message: 'This output holds no table: it has only text/plain.' });
    expect(plain(parseOutput({}))).toEqual({ ok: false, message: 'This output holds no table: it is empty.' });
    expect(plain(parseOutput({ output_type: 'error', ename: 'NameError', evalue: 'x', traceback: [] }))).toEqual({
      ok: false,
      message: 'This output is an error (NameError), not a table.'
    });
    expect(plain(parseOutput({ output_type: 'stream', name: 'stdout', text: 'a b\n1 2\n' }))).toEqual({
      ok: false,
      message: 'This output is printed text (a stream), not a table.'
    });
  });

  it('accepts a whole nbformat output with multi-line string payloads', () => {
    const t = table(parseOutput({ output_type: 'execute_result', execution_count: 1, metadata: {}, data: { 'text/csv': ['a,b\n', '1,2\n'] } }));
    expect(values(t.columns[1])).toEqual([2]);
  });

  it('notes when a richer type was refused and a poorer one read', () => {
    const t = table(parseOutput({ 'text/csv': 'a\n1,2\n', 'text/plain': PLAIN }));
    expect(t.format).toBe('pandas-text');
    expect(t.notes.map(n => messageText(n.message))).toEqual([
      'Read from text/plain: the richer types of this output (text/csv) could not be read.',
      'Row 1 of the CSV text has 2 cells but the header has 1 columns.'
    ]);
  });

  it('reports a refusal from a table that is over a limit or malformed', () => {
    const r = parseOutput({ 'text/csv': 'a\n1,2\n' });
    expect(plain(r)).toEqual({ ok: false, message: 'Row 1 of the CSV text has 2 cells but the header has 1 columns.' });
    const both = parseOutput({ 'text/csv': 'a\n1,2\n', 'application/json': '[1' });
    expect(plain(both)).toEqual({
      ok: false,
      message: 'This output’s table could not be read from any of its types (text/csv, application/json).',
      details: ['Row 1 of the CSV text has 2 cells but the header has 1 columns.', expect.stringMatching(/^The JSON output is not valid JSON \(/)]
    });
  });
});

describe('pandas text repr', () => {
  it('reads index names, datetimes with a space, strings with spaces, NaN/inf', () => {
    // repr(df) from pandas 1.5.3 (note the single space between the float and datetime columns).
    const text =
      '     T (K)                when      name\nrun                                     \n1      1.5 2024-01-01 12:00:00  New York\n' +
      '2      NaN 2024-01-02 13:30:00       a b\n3      inf                 NaT         x';
    const t = table(parseMime('text/plain', text));
    expect(t.columns.map(c => [c.header, c.kind, c.isIndex])).toEqual([
      ['run', 'number', true],
      ['T (K)', 'number', false],
      ['when', 'datetime', false],
      ['name', 'string', false]
    ]);
    expect(values(t.columns[1])).toEqual([1.5, NaN, Infinity]);
    expect(values(t.columns[2])).toEqual(['2024-01-01T12:00:00', '2024-01-02T13:30:00', null]);
    expect(values(t.columns[3])).toEqual(['New York', 'a b', 'x']);
  });

  it('rejects prose and ragged text as no table', () => {
    expect(parseMime('text/plain', 'hello world')).toMatchObject({ ok: false });
    expect(parseMime('text/plain', 'The fit converged\nafter 12 iterations.')).toMatchObject({ ok: false });
    expect(plain(parseMime('text/plain', 'Empty DataFrame\nColumns: [a]\nIndex: []'))).toEqual({ ok: false, message: 'The text shows an empty DataFrame (no rows).' });
  });

  it('reads wrapped blocks (wide frames printed in several blocks)', () => {
    const text = ['   a  \\', '0  1   ', '1  2   ', '', '     b', '0  3.5', '1  4.5'].join('\n');
    const t = table(parseMime('text/plain', text));
    expect(t.columns.map(c => c.header)).toEqual(['index', 'a', 'b']);
    expect(values(t.columns[2])).toEqual([3.5, 4.5]);
  });

  it('reads a Series repr (pandas 1.5.3 output): name with unit, NaN, inf, rounding', () => {
    const t = table(parseMime('text/plain', '0    0.333333\n1         NaN\n2         inf\nName: M (emu/g), dtype: float64'));
    expect(t.columns.map(c => [c.header, c.name, c.unit, c.isIndex])).toEqual([
      ['index', 'index', null, true],
      ['M (emu/g)', 'M', 'emu/g', false]
    ]);
    expect(values(t.columns[1])).toEqual([0.333333, NaN, Infinity]);
    expect(t.notes.map(n => n.kind)).toEqual(['rounded']);
  });

  it('reads a truncated Series repr and a datetime index with an index name', () => {
    const lines = ['0      0.000000', '1      0.142857', '        ...    ', '98    14.000000', '99    14.142857', 'Length: 100, dtype: float64'];
    const t = table(parseMime('text/plain', lines.join('\n')));
    expect(t.truncation).toEqual({ shownRows: 4, totalRows: 100, shownColumns: 1, totalColumns: 1, rowGapAt: 2 });
    expect(t.notes[0].kind).toBe('truncated');
    const d = table(parseMime('text/plain', '2024-01-01 12:00:00    1\n2024-01-02 00:00:00    2\ndtype: int64'));
    expect(values(d.columns[0])).toEqual(['2024-01-01T12:00:00', '2024-01-02T00:00:00']);
    const named = table(parseMime('text/plain', 'idx\nx    a b\ny      c\ndtype: object'));
    expect(named.columns.map(c => c.header)).toEqual(['idx', '0']);
    expect(values(named.columns[1])).toEqual(['a b', 'c']);
  });

  it('reads a 200 000-line text repr', () => {
    const lines = ['        x', ...Array.from({ length: 200_000 }, (_, i) => `${String(i).padEnd(6)}  ${String(i % 10).padStart(1)}`)];
    const t = table(parseMime('text/plain', lines.join('\n')));
    expect(t.rowCount).toBe(200_000);
  });
});
