/** CSV / TSV parsing through parseMime. */
import fc from 'fast-check';
import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { messageText } from '../../../src/core/messages';
import { refuseUnclosedQuote } from '../../../src/core/table/csv';
import { parseMime, TABLE_LIMITS } from '../../../src/core/table/index';
import { plain, table, values } from './helpers';

describe('CSV', () => {
  it('reads a to_csv() frame: unnamed index, units, NaN, ±inf, bools, dates, strings', () => {
    const t = table(
      parseMime(
        'text/csv',
        ',T (K),M [emu/g],ok,when,label\n0,1.5,inf,True,2024-01-01,a\n1,,-inf,False,2024-01-02,"b, c"\n2,3.25,2,True,,\n'
      )
    );
    expect(t.format).toBe('csv');
    expect(t.rowCount).toBe(3);
    expect(t.columns.map(c => [c.header, c.name, c.unit, c.kind, c.isIndex])).toEqual([
      ['index', 'index', null, 'number', true],
      ['T (K)', 'T', 'K', 'number', false],
      ['M [emu/g]', 'M', 'emu/g', 'number', false],
      ['ok', 'ok', null, 'boolean', false],
      ['when', 'when', null, 'datetime', false],
      ['label', 'label', null, 'string', false]
    ]);
    expect(t.columns[1].values).toBeInstanceOf(Float64Array);
    expect(values(t.columns[1])).toEqual([1.5, NaN, 3.25]);
    expect(values(t.columns[2])).toEqual([Infinity, -Infinity, 2]);
    expect(values(t.columns[3])).toEqual([true, false, true]);
    expect(values(t.columns[4])).toEqual(['2024-01-01', '2024-01-02', null]);
    expect(values(t.columns[5])).toEqual(['a', 'b, c', null]);
    expect(t.notes).toEqual([]);
    expect(t.columns.every(c => c.shownDigits === undefined)).toBe(true);
  });

  it('keeps full precision bit for bit', () => {
    const xs = [0.1 + 0.2, 1 / 3, 5e-324, 1.7976931348623157e308, -2.220446049250313e-16];
    const t = table(parseMime('text/csv', `x\n${xs.map(String).join('\n')}\n`));
    expect(Array.from(t.columns[0].values as Float64Array)).toEqual(xs);
  });

  it('a column that is numeric until its last row becomes a string column with exact text', () => {
    const t = table(parseMime('text/csv', 'a,b\n1.50,1\n2,2\nthree,3\n'));
    expect(t.columns[0].kind).toBe('string');
    expect(values(t.columns[0])).toEqual(['1.50', '2', 'three']);
    expect(t.columns[1].kind).toBe('number');
  });

  it('does not read hex or padded numbers as numbers', () => {
    const t = table(parseMime('text/csv', 'a\n0x10\n12\n'));
    expect(t.columns[0].kind).toBe('string');
  });

  it('reads TSV, CRLF line ends and quoted newlines', () => {
    const t = table(parseMime('text/tab-separated-values', 'T\tnote\r\n1\t"two\r\nlines"\r\n2\tx\r\n'));
    expect(t.format).toBe('tsv');
    expect(values(t.columns[0])).toEqual([1, 2]);
    expect(values(t.columns[1])).toEqual(['two\r\nlines', 'x']);
  });

  it('pads short rows with missing values and says so', () => {
    const t = table(parseMime('text/csv', 'a,b\n1,2\n3\n'));
    expect(values(t.columns[1])).toEqual([2, NaN]);
    expect(t.notes[0].kind).toBe('info');
  });

  it('refuses rows wider than the header, naming the row', () => {
    const r = parseMime('text/csv', 'a,b\n1,2\n3,4,5\n');
    expect(plain(r)).toEqual({ ok: false, message: 'Row 2 of the CSV text has 3 cells but the header has 2 columns.' });
  });

  it('refuses an unclosed quote, naming the row', () => {
    const r = parseMime('text/csv', 'a,b\n1,2\n3,"4\n');
    expect(r.ok).toBe(false);
    expect(!r.ok && messageText(r.message)).toMatch(/unclosed quote in row \d+/);
  });

  it('refuses empty text and a huge cell, naming row and column', () => {
    expect(plain(parseMime('text/csv', ''))).toEqual({ ok: false, message: 'The CSV text is empty: it has no header row.' });
    const r = parseMime('text/csv', `a,b\n1,${'x'.repeat(TABLE_LIMITS.maxCellChars + 1)}\n`);
    expect(!r.ok && messageText(r.message)).toBe(
      `The cell in row 1, column 2 (“b”) holds ${TABLE_LIMITS.maxCellChars + 1} characters; at most ${TABLE_LIMITS.maxCellChars} can be read.`
    );
  });

  it('refuses too many columns, naming the first column past the limit', () => {
    const header = Array.from({ length: TABLE_LIMITS.maxColumns + 1 }, (_, i) => `c${i}`).join(',');
    const r = parseMime('text/csv', `${header}\n`);
    expect(!r.ok && r.message.code).toBe('table.too-many-columns');
    expect(!r.ok && messageText(r.message)).toContain(`(column ${TABLE_LIMITS.maxColumns + 1} is the first past the limit)`);
  });

  it('header only gives an empty table; a named first column is not an index', () => {
    const t = table(parseMime('text/csv', 'T,M\n'));
    expect(t.rowCount).toBe(0);
    expect(t.columns.map(c => c.isIndex)).toEqual([false, false]);
  });

  it('leading empty header cells are unnamed MultiIndex levels', () => {
    const t = table(parseMime('text/csv', ',,M\na,1,0.5\na,2,0.25\n'));
    expect(t.columns.map(c => [c.header, c.isIndex, c.kind])).toEqual([
      ['level_0', true, 'string'],
      ['level_1', true, 'number'],
      ['M', false, 'number']
    ]);
  });

  it('accepts nbformat multi-line strings', () => {
    const t = table(parseMime('text/csv', ['a,b\n', '1,2\n']));
    expect(values(t.columns[1])).toEqual([2]);
  });
});

describe('CSV with an unclosed quote', () => {
  const refusal = (text: string, mime = 'text/csv') => {
    const r = parseMime(mime, text);
    return r.ok ? null : { code: r.message.code, text: messageText(r.message) };
  };

  it('refuses 34 MB with a quote that never closes (the earlier parser ran out of memory above 32 MB)', () => {
    const head = 'T (K),M (emu/g)\n1,"never closed\n';
    const text = head + '300.125,0.0625\n'.repeat(Math.ceil((34_000_000 - head.length) / 15));
    expect(text.length).toBeGreaterThan(34_000_000);
    expect(refusal(text)).toEqual({ code: 'table.csv.unclosed-quote', text: 'The CSV text has an unclosed quote in row 1.' });
  });

  it('refuses 5 MB whose quote opens in row 40 001 and never closes, naming that row', () => {
    const rows = ['T (K),M (emu/g),note'];
    for (let i = 0; i < 40_000; i++) {
      rows.push(`${(2 + i * 0.007).toFixed(3)},${(50 * Math.cos(i)).toFixed(9)},"ok, ""fine"""`);
    }
    rows.push('282.000,0.5,"this note never ends');
    const tail = '300.125,0.0625,plain\n'.repeat(Math.ceil((5_000_000 - rows.join('\n').length) / 21));
    const text = `${rows.join('\n')}\n${tail}`;
    expect(text.length).toBeGreaterThan(5_000_000);
    expect(refusal(text)).toEqual({ code: 'table.csv.unclosed-quote', text: 'The CSV text has an unclosed quote in row 40001.' });
  });

  it('names the header row when the quote opens there', () => {
    expect(refusal('"T (K),M\n1,2\n3,4\n')).toEqual({ code: 'table.csv.unclosed-quote-header', text: 'The CSV text has an unclosed quote in its header row.' });
  });

  it('numbers rows as the table does: quoted line breaks inside a row, blank lines skipped unless there is one column', () => {
    expect(refusal('a,b\n1,"two\nlines"\n\n\n3,4\n5,"6\n7,8\n')?.text).toBe('The CSV text has an unclosed quote in row 3.');
    expect(refusal('T\n1\n\n2\n"3\n4\n')?.text).toBe('The CSV text has an unclosed quote in row 4.');
    expect(refusal('T\tM\r\n1\t2\r\n3\t"4\r\n5\t6\r\n', 'text/tab-separated-values')?.text).toBe('The TSV text has an unclosed quote in row 2.');
  });

  it('reads quotes that do not open a field, escaped quotes and white space after a closing quote', () => {
    const t = table(parseMime('text/csv', 'a,b\n5"6,"say ""hi"""  \n7,"x"\n'));
    expect(values(t.columns[0])).toEqual(['5"6', '7']);
    expect(values(t.columns[1])).toEqual(['say "hi"', 'x']);
  });

  it('agrees with papaparse on which texts hold a quoted field that never closes', () => {
    const piece = fc.constantFrom('a', '1', ',', '\t', '"', '""', '\n', '\r\n', '\r', ' ', '\n\n');
    fc.assert(
      fc.property(fc.array(piece, { maxLength: 18 }), fc.constantFrom(',' as const, '\t' as const), (parts, delimiter) => {
        const text = parts.join('');
        const papa = Papa.parse<string[]>(text, { delimiter, header: false, skipEmptyLines: false });
        const missing = papa.errors.some(e => e.code === 'MissingQuotes');
        let refused = false;
        try {
          refuseUnclosedQuote(text, delimiter, 'CSV');
        } catch {
          refused = true;
        }
        expect(refused).toBe(missing);
      }),
      { numRuns: 20_000, seed: 20240611 }
    );
  });
});
