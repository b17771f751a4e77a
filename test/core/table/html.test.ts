/** Hand-written HTML tables: pandas shapes, Styler-like markup, spans, hostile markup, limits. */
import { describe, expect, it } from 'vitest';
import { messageText } from '../../../src/core/messages';
import { checkHtmlDepth, MAX_HTML_TABLES } from '../../../src/core/table/htmldepth';
import { parseMime, TABLE_LIMITS } from '../../../src/core/table/index';
import { plain, table, values } from './helpers';

const g = globalThis as { __pwned?: boolean };

describe('pandas-like HTML', () => {
  it('reads a table without thead whose first row is all th', () => {
    const t = table(parseMime('text/html', '<table><tr><th>a</th><th>b</th></tr><tr><td>1</td><td>x</td></tr></table>'));
    expect(t.columns.map(c => [c.header, c.kind, c.isIndex])).toEqual([
      ['a', 'number', false],
      ['b', 'string', false]
    ]);
  });

  it('reads Styler-like markup with &nbsp; blanks and classes', () => {
    const html =
      '<style>#T_x th {color: red}</style><table id="T_x"><thead><tr><th class="blank level0">&nbsp;</th>' +
      '<th class="col_heading level0 col0">T (K)</th></tr></thead><tbody><tr><th id="r0" class="row_heading level0 row0">0</th>' +
      '<td class="data row0 col0">1.500000</td></tr></tbody></table>';
    const t = table(parseMime('text/html', html));
    expect(t.columns.map(c => [c.header, c.unit, c.isIndex])).toEqual([
      ['index', null, true],
      ['T (K)', 'K', false]
    ]);
    expect(t.columns[1].shownDigits).toBe(7);
    expect(t.notes.map(n => n.kind)).toEqual(['rounded']);
    expect(messageText(t.notes[0].message)).toContain("display({'text/csv': df.to_csv()}, raw=True)");
  });

  it('expands rowspan in body and colspan in header', () => {
    const html =
      '<table><thead><tr><th></th><th></th><th colspan="2">M</th></tr><tr><th></th><th></th><th>x</th><th>y</th></tr></thead>' +
      '<tbody><tr><th rowspan="2">a</th><th>1</th><td>1</td><td>2</td></tr><tr><th>2</th><td>3</td><td>4</td></tr></tbody></table>';
    const t = table(parseMime('text/html', html));
    expect(t.columns.map(c => c.header)).toEqual(['level_0', 'level_1', 'M / x', 'M / y']);
    expect(values(t.columns[0])).toEqual(['a', 'a']);
    expect(values(t.columns[3])).toEqual([2, 4]);
  });

  it('gives a plain no-table message for HTML without a table', () => {
    expect(plain(parseMime('text/html', '<div><img src="x.png"></div>'))).toEqual({ ok: false, message: 'The HTML holds no table.' });
  });

  it('takes the pandas table among several and says so', () => {
    const t = table(parseMime('text/html', '<table><tr><td>layout</td></tr></table><table class="dataframe"><thead><tr><th>a</th></tr></thead><tbody><tr><td>1</td></tr></tbody></table>'));
    expect(t.columns[0].header).toBe('a');
    expect(t.notes.some(n => n.kind === 'info' && messageText(n.message).includes('2 tables'))).toBe(true);
  });
});

describe('hostile HTML is read as inert text', () => {
  it('script tags, event handlers and javascript: URLs execute nothing and are not cell text', () => {
    delete g.__pwned;
    const html =
      '<table><thead><tr><th onclick="globalThis.__pwned=true">a<script>globalThis.__pwned=true</script></th>' +
      '<th><a href="javascript:globalThis.__pwned=true">b</a></th></tr></thead>' +
      '<tbody><tr><td><img src=x onerror="globalThis.__pwned=true">1</td><td><iframe srcdoc="<script>globalThis.__pwned=true</script>"></iframe>2</td></tr></tbody></table>';
    const t = table(parseMime('text/html', html));
    expect(t.columns.map(c => c.header)).toEqual(['a', 'b']);
    expect(values(t.columns[0])).toEqual([1]);
    expect(values(t.columns[1])).toEqual([2]);
    expect(g.__pwned).toBeUndefined();
  });

  it('refuses a cell nested too deep, naming its row and column', () => {
    const deep = `${'<span>'.repeat(TABLE_LIMITS.maxDepth + 10)}x${'</span>'.repeat(TABLE_LIMITS.maxDepth + 10)}`;
    const r = parseMime('text/html', `<table><thead><tr><th>a</th><th>b</th></tr></thead><tbody><tr><td>1</td><td>${deep}</td></tr></tbody></table>`);
    expect(r.ok).toBe(false);
    expect(!r.ok && messageText(r.message)).toMatch(new RegExp(`^The HTML is nested more than ${TABLE_LIMITS.maxDepth} elements deep \\(at character \\d+, in table row 2, column 2\\)`));
  });

  it('markup nested 100 000 deep is refused before tree building, quickly', () => {
    const n = 100_000;
    const t0 = performance.now();
    const r = parseMime('text/html', `${'<div>'.repeat(n)}<table><tr><th>a</th></tr><tr><td>1</td></tr></table>`);
    expect(performance.now() - t0).toBeLessThan(2000);
    expect(!r.ok && messageText(r.message)).toContain('before the first table row');
  });

  it('a table inside 50 nested divs, and SVG self-closing tags, are fine', () => {
    const svg = `<svg>${'<path d="M0 0"/>'.repeat(500)}</svg>`;
    const t = table(parseMime('text/html', `${svg}${'<div>'.repeat(50)}<table><tr><th>a</th></tr><tr><td>1</td></tr></table>${'</div>'.repeat(50)}`));
    expect(values(t.columns[0])).toEqual([1]);
  });

  it('rows with omitted end tags do not count as nesting', () => {
    const rows = Array.from({ length: 500 }, (_, i) => `<tr><td>${i}<td>x`).join('');
    const t = table(parseMime('text/html', `<table><thead><tr><th>n<th>s</thead><tbody>${rows}</table>`));
    expect(t.rowCount).toBe(500);
  });

  it('refuses a colspan past the column limit, naming the row', () => {
    const r = parseMime('text/html', `<table><tr><th colspan="${TABLE_LIMITS.maxColumns}">a</th><th>b</th></tr></table>`);
    expect(!r.ok && messageText(r.message)).toBe(`Row 1 of the HTML table reaches column ${TABLE_LIMITS.maxColumns + 1}; at most ${TABLE_LIMITS.maxColumns} columns can be read.`);
  });

  it('refuses a huge cell, naming its row and column', () => {
    const r = parseMime('text/html', `<table><thead><tr><th>a</th></tr></thead><tr><td>${'y'.repeat(TABLE_LIMITS.maxCellChars * 2 + 5)}</td></tr></table>`);
    expect(!r.ok && messageText(r.message)).toMatch(/^The cell in body row 1, column 1 holds more than \d+ characters/);
  });

  it('a rowspan larger than the section is clamped', () => {
    const t = table(parseMime('text/html', '<table><thead><tr><th>i</th><th>a</th></tr></thead><tbody><tr><th rowspan="65534">k</th><td>1</td></tr><tr><td>2</td></tr></tbody></table>'));
    expect(t.rowCount).toBe(2);
    expect(values(t.columns[0])).toEqual(['k', 'k']);
  });

  it('refuses spans that would expand past the grid budget, naming row and column, quickly', () => {
    const rows = Array.from({ length: 6000 }, () => '<tr><td>1</td></tr>').join('');
    const t0 = performance.now();
    const r = parseMime('text/html', `<table><tbody><tr><td rowspan="6000" colspan="${TABLE_LIMITS.maxColumns - 1}">x</td><td>1</td></tr>${rows}</tbody></table>`);
    expect(performance.now() - t0).toBeLessThan(2000);
    expect(!r.ok && messageText(r.message)).toMatch(/^The cell in body row 1, column 1 spans \d+ rows × \d+ columns; the table would exceed \d+ cells\.$/);
  });

  it('reads a 200 000-row table (no argument-spread limits on row lists)', () => {
    const rows = Array.from({ length: 200_000 }, (_, i) => `<tr><th>${i}</th><td>${i / 4}</td></tr>`).join('');
    const t = table(parseMime('text/html', `<table><thead><tr><th></th><th>x</th></tr></thead><tbody>${rows}</tbody></table>`));
    expect(t.rowCount).toBe(200_000);
    expect((t.columns[1].values as Float64Array)[199_999]).toBe(199_999 / 4);
  });
});

describe('HTML with many tables or many top-level nodes', () => {
  const frame = (i: number) =>
    `<table border="1" class="dataframe"><thead><tr style="text-align: right;"><th></th><th>T (K)</th><th>M</th></tr></thead>` +
    `<tbody><tr><th>0</th><td>${i}.5</td><td>2.5</td></tr></tbody></table>\n`;

  it('reads the first of 100 000 small tables and says that only the first MAX_HTML_TABLES were examined', () => {
    const html = Array.from({ length: 100_000 }, (_, i) => frame(i)).join('');
    const t = table(parseMime('text/html', html));
    expect(values(t.columns[1])).toEqual([0.5]);
    expect(t.notes.map(n => messageText(n.message))).toEqual([
      `The HTML holds more than ${MAX_HTML_TABLES} tables; only the first ${MAX_HTML_TABLES} were examined, and the first pandas table among them was read.`
    ]);
    expect(t.notes[0].message.code).toBe('table.html.too-many-tables');
  });

  it('counts tables up to the limit exactly, and tables nested in a cell not at all', () => {
    const nested = '<table><tr><td><table><tr><td>in</td></tr></table></td></tr></table>';
    const atLimit = nested + Array.from({ length: MAX_HTML_TABLES - 1 }, (_, i) => frame(i)).join('');
    expect(checkHtmlDepth(atLimit).tablesEndAt).toBeNull();
    expect(table(parseMime('text/html', atLimit)).notes.map(n => messageText(n.message))).toEqual([`The HTML holds ${MAX_HTML_TABLES} tables; the first pandas table was read.`]);
    const over = atLimit + '<div><table class="dataframe"><tr><th>late</th></tr></table></div>';
    expect(checkHtmlDepth(over).tablesEndAt).toBe(atLimit.length + '<div>'.length);
    // The pandas table past the limit is not examined: the first pandas table before it is read.
    expect(values(table(parseMime('text/html', over)).columns[1])).toEqual([0.5]);
  });

  it('reads a table after 100 000 top-level paragraphs and line breaks', () => {
    const html = `${'<p>note</p>'.repeat(50_000)}${'line<br>\n'.repeat(50_000)}${frame(7)}<p>1 rows × 2 columns</p>`;
    const t = table(parseMime('text/html', html));
    expect(t.columns.map(c => c.header)).toEqual(['index', 'T (K)', 'M']);
    expect(values(t.columns[1])).toEqual([7.5]);
    expect(t.notes).toEqual([]);
  });
});
