/**
 * Columns that keep their meaning: a number column with a few unreadable
 * cells stays a number column (those cells left out, with a note naming the
 * column and rows), number spellings beyond plain ASCII decimals are read,
 * padded CSV headers and cells are trimmed, and every format types its
 * columns by the same rule.
 */
import fc from 'fast-check';
import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { messageText } from '../../../src/core/messages';
import { groupedNumber, isDecimalComma, readNumber } from '../../../src/core/table/cells';
import { MAX_UNREADABLE_SHARE, MIN_NUMBERS_BESIDE_UNREADABLE, unreadableAllowed } from '../../../src/core/table/columns';
import { parseMime } from '../../../src/core/table/index';
import type { ITable, ITableNote } from '../../../src/core/table/index';
import { defaultPair, plottableColumns } from '../../../src/core/table/roles';
import { table, values } from './helpers';
import { expectGoodMessages } from '../numeric/messageRules';

function csv(rows: string[][]): string {
  return rows.map(r => r.join(',')).join('\n') + '\n';
}

function unreadable(t: ITable): ITableNote[] {
  return t.notes.filter(n => n.kind === 'unreadable');
}

function column(t: ITable, header: string): unknown[] {
  return values(t.columns.find(c => c.header === header));
}

/** T, M, sigma: eight rows, M with `bad` in data row 4. */
function measurement(bad: string): string {
  const rows = [['T (K)', 'M (emu/g)', 'sigma']];
  for (let i = 1; i <= 8; i++) {
    rows.push([String(200 + 10 * i), i === 4 ? bad : (10 - i / 2).toFixed(2), '0.05']);
  }
  return csv(rows);
}

describe('a number column with a few unreadable cells stays a number column', () => {
  it('one unreadable cell (4..5): NaN in its row, a note naming the column, the row and the text', () => {
    const t = table(parseMime('text/csv', measurement('4..5')));
    expect(t.columns.map(c => c.kind)).toEqual(['number', 'number', 'number']);
    expect(column(t, 'M (emu/g)')).toEqual([9.5, 9, 8.5, NaN, 7.5, 7, 6.5, 6]);
    const notes = unreadable(t);
    expect(notes).toHaveLength(1);
    expect(notes[0].message.code).toBe('table.unreadable.one');
    expect(messageText(notes[0].message)).toBe('Column “M (emu/g)” is read as numbers, but the value in data row 4 (“4..5”) could not be read as a number; it is left out.');
  });

  it('the default pair stays T and M, not σ against T', () => {
    const t = table(parseMime('text/csv', measurement('4..5')));
    const pair = defaultPair(plottableColumns(t));
    expect(pair && [t.columns[pair.x].name, t.columns[pair.y].name]).toEqual(['T', 'M']);
  });

  it('NA, N/A, None, null, -, — and blank cells are missing values, not unreadable: no note', () => {
    for (const marker of ['NA', 'N/A', 'None', 'null', 'nan', 'NaN', '-', '—', '–', '   ', '']) {
      const t = table(parseMime('text/csv', measurement(marker)));
      expect(t.columns[1].kind, JSON.stringify(marker)).toBe('number');
      expect(column(t, 'M (emu/g)')[3], JSON.stringify(marker)).toBeNaN();
      expect(t.notes, JSON.stringify(marker)).toEqual([]);
    }
  });

  it('a Unicode minus (U+2212) or another dash-minus reads as a minus, also in the exponent', () => {
    for (const [text, want] of [
      ['\u22124', -4],
      ['\u20134.25', -4.25],
      ['\uff0d4', -4],
      ['1e\u22123', 0.001],
      ['\u2212inf', -Infinity]
    ] as const) {
      const t = table(parseMime('text/csv', measurement(text)));
      expect(column(t, 'M (emu/g)')[3], text).toBe(want);
      expect(t.notes, text).toEqual([]);
    }
  });

  it('more than ten unreadable rows: ten listed, then how many more; within 5 % the column stays numeric', () => {
    const rows = [['x', 'y']];
    const bad = new Set([3, 17, 40, 41, 42, 90, 101, 150, 151, 152, 200, 260]);
    for (let i = 1; i <= 300; i++) {
      rows.push([String(i), bad.has(i) ? `?${i}` : String(i * 0.5)]);
    }
    const t = table(parseMime('text/csv', csv(rows)));
    expect(t.columns[1].kind).toBe('number');
    expect((t.columns[1].values as Float64Array).filter(v => Number.isNaN(v)).length).toBe(12);
    const [note] = unreadable(t);
    expect(note.message.code).toBe('table.unreadable.many');
    expect(messageText(note.message)).toBe(
      'Column “y” is read as numbers, but 12 of its 300 values could not be read as numbers (the first: “?3”); they are left out: data rows 3, 17, 40, 41, 42, 90, 101, 150, 151, 152 and 2 more.'
    );
  });

  it('the threshold: beyond max(1, 5 %) unreadable cells, or too few numbers beside them, the column is text', () => {
    expect(MAX_UNREADABLE_SHARE).toBe(0.05);
    expect(MIN_NUMBERS_BESIDE_UNREADABLE).toBe(4);
    const col = (cells: string[]) => table(parseMime('text/csv', `a\n${cells.join('\n')}\n`)).columns[0];
    // 40 values: 5 % is 2 cells.
    const forty = Array.from({ length: 40 }, (_, i) => String(i + 0.5));
    expect(col([...forty.slice(0, 38), 'x', 'y']).kind).toBe('number');
    expect(col([...forty.slice(0, 37), 'x', 'y', 'z']).kind).toBe('string');
    // Small columns: one unreadable cell is tolerated beside four numbers, not beside three.
    expect(col(['1', '2', '3', '4', 'x']).kind).toBe('number');
    expect(col(['1', '2', '3', 'x']).kind).toBe('string');
    expect(values(col(['1', '2', '3', 'x']))).toEqual(['1', '2', '3', 'x']);
  });
});

describe('thousands separators only where they cannot be a decimal comma', () => {
  it('a quoted "1,003" in a CSV column that writes decimals with a point', () => {
    const t = table(parseMime('text/csv', 'T,n\n1,998.5\n2,"1,003"\n3,999.25\n4,"12,345.5"\n'));
    expect(t.columns[1].kind).toBe('number');
    expect(column(t, 'n')).toEqual([998.5, 1003, 999.25, 12345.5]);
    expect(t.notes).toEqual([]);
  });

  it('self-evident groups (two commas, or a comma group then a decimal point) need no other evidence', () => {
    const t = table(parseMime('text/tab-separated-values', 'n\n1,234,567\n2\n3\n4\n5\n'));
    expect(column(t, 'n')).toEqual([1234567, 2, 3, 4, 5]);
  });

  it('"1,003" in a column without decimal points could be 1.003: left out and noted, never read as 1003', () => {
    const t = table(parseMime('text/tab-separated-values', 'n\n998\n1,003\n999\n1000\n1001\n'));
    expect(t.columns[0].kind).toBe('number');
    expect(column(t, 'n')).toEqual([998, NaN, 999, 1000, 1001]);
    expect(unreadable(t).map(n => n.message.code)).toEqual(['table.unreadable.one']);
  });

  it('a column that also holds a decimal comma (2,5) never reads commas as groups', () => {
    const t = table(parseMime('text/tab-separated-values', 'n\n1.5\n1,003\n2,5\n3.5\n4.5\n5.5\n6.5\n7.5\n8.5\n9.5\n10.5\n11.5\n12.5\n13.5\n14.5\n15.5\n16.5\n17.5\n18.5\n19.5\n20.5\n21.5\n22.5\n23.5\n24.5\n25.5\n26.5\n27.5\n28.5\n29.5\n30.5\n31.5\n32.5\n33.5\n34.5\n35.5\n36.5\n37.5\n38.5\n39.5\n'));
    expect(t.columns[0].kind).toBe('number');
    expect(column(t, 'n').slice(0, 4)).toEqual([1.5, NaN, NaN, 3.5]);
    expect(messageText(unreadable(t)[0].message)).toContain('data rows 2, 3.');
  });
});

describe('padded CSV headers and cells', () => {
  it('"T, M, S" gives three number columns named T, M and S', () => {
    const t = table(parseMime('text/csv', 'T, M, S\n10, 1.5, 0.1\n20, 1.25, 0.1\n 30 ,1.0 , 0.1\n'));
    expect(t.columns.map(c => [c.header, c.name, c.kind])).toEqual([
      ['T', 'T', 'number'],
      ['M', 'M', 'number'],
      ['S', 'S', 'number']
    ]);
    expect(column(t, 'T')).toEqual([10, 20, 30]);
    expect(column(t, 'M')).toEqual([1.5, 1.25, 1]);
    expect(defaultPair(plottableColumns(t))).toEqual({ x: 0, y: 1 });
    expect(t.notes).toEqual([]);
  });

  it('text cells are trimmed too; padded TSV reads the same', () => {
    const t = table(parseMime('text/csv', 'T, label\n1, a b \n2,  c\n'));
    expect(column(t, 'label')).toEqual(['a b', 'c']);
    const tsv = table(parseMime('text/tab-separated-values', 'T\t M \n 1\t+2 \n2\t 1E+05\n'));
    expect(tsv.columns.map(c => [c.header, c.kind])).toEqual([
      ['T', 'number'],
      ['M', 'number']
    ]);
    expect(column(tsv, 'M')).toEqual([2, 1e5]);
  });
});

describe('dataresource: fields declared number or integer', () => {
  const payload = {
    schema: {
      fields: [
        { name: 'index', type: 'integer' },
        { name: 'T', type: 'number' },
        { name: 'M', type: 'number' }
      ],
      primaryKey: ['index']
    },
    data: [
      { index: 0, T: 10, M: '1.5' },
      { index: 1, T: 20, M: 'abc' },
      { index: 2, T: 30, M: ' \u22122.5 ' },
      { index: 3, T: 40, M: true },
      { index: 4, T: 50, M: 'NA' }
    ]
  };
  it('readable strings are read; unreadable values become NaN with the same note, naming column and rows', () => {
    const t = table(parseMime('application/vnd.dataresource+json', payload));
    expect(t.columns[2].kind).toBe('number');
    expect(column(t, 'M')).toEqual([1.5, NaN, -2.5, NaN, NaN]);
    const notes = unreadable(t);
    expect(notes.map(n => n.message.code)).toEqual(['table.unreadable.some']);
    expect(messageText(notes[0].message)).toBe(
      'Column “M” is read as numbers, but 2 of its 4 values could not be read as numbers (the first: “abc”); they are left out: data rows 2, 4.'
    );
  });
});

describe('every format types its columns by the same rule and gives the same note', () => {
  const cells = ['1.5', '2.5', '−3.5', '4..5', '5.5', 'NA'];
  const want = [1.5, 2.5, -3.5, NaN, 5.5, NaN];
  const html =
    '<table class="dataframe"><thead><tr><th></th><th>T</th><th>M</th></tr></thead><tbody>' +
    cells.map((c, i) => `<tr><th>${i}</th><td>${i + 1}</td><td>${c}</td></tr>`).join('') +
    '</tbody></table>';
  const text = ['   T     M', ...cells.map((c, i) => `${i}  ${i + 1}  ${c.padStart(4)}`)].join('\n');
  const outputs: [string, unknown][] = [
    ['text/csv', `T,M\n${cells.map((c, i) => `${i + 1},${c}`).join('\n')}\n`],
    ['text/tab-separated-values', `T\tM\n${cells.map((c, i) => `${i + 1}\t${c}`).join('\n')}\n`],
    ['text/html', html],
    ['text/plain', text],
    ['application/json', cells.map((c, i) => ({ T: i + 1, M: c }))],
    ['application/json', { T: cells.map((_, i) => i + 1), M: cells }],
    ['application/vnd.dataresource+json', { schema: { fields: [{ name: 'T', type: 'integer' }, { name: 'M', type: 'number' }] }, data: cells.map((c, i) => ({ T: i + 1, M: c })) }]
  ];
  for (const [mime, payload] of outputs) {
    it(`${mime}${Array.isArray(payload) ? ' records' : ''}`, () => {
      const t = table(parseMime(mime, payload));
      const m = t.columns.find(c => c.header === 'M');
      expect(m?.kind).toBe('number');
      expect(values(m)).toEqual(want);
      expect(unreadable(t).map(n => messageText(n.message))).toEqual([
        'Column “M” is read as numbers, but the value in data row 4 (“4..5”) could not be read as a number; it is left out.'
      ]);
    });
  }
});

describe('readNumber: one cell where a number is expected', () => {
  it('reads signs, dashes, whitespace, exponents and infinities', () => {
    const cases: [string, number][] = [
      ['  12.5\t', 12.5],
      ['\u00a0-3\u00a0', -3],
      ['+7', 7],
      ['\u22124', -4],
      ['\u20122', -2],
      ['\u20101', -1],
      ['1e-3', 0.001],
      ['1E+05', 1e5],
      ['2.5e\u22122', 0.025],
      ['inf', Infinity],
      ['-inf', -Infinity],
      ['+Infinity', Infinity],
      ['INF', Infinity],
      ['\u2212infinity', -Infinity],
      ['∞', Infinity],
      ['−∞', -Infinity]
    ];
    for (const [text, want] of cases) {
      expect(readNumber(text), JSON.stringify(text)).toBe(want);
    }
  });
  it('missing-value markers are NaN; what is not a number is undefined', () => {
    for (const text of ['', '  ', 'NA', 'N/A', 'n/a', 'NaN', 'nan', '-nan', 'None', 'null', 'NULL', '<NA>', '-', '--', '—', '–', '−']) {
      expect(readNumber(text), JSON.stringify(text)).toBeNaN();
    }
    for (const text of ['4..5', '1,003', '2,5', '0x10', '1_000', 'e5', '1e', '5-3', '— 5', 'n.d.', 'abc', '1 000', '+-1']) {
      expect(readNumber(text), JSON.stringify(text)).toBeUndefined();
    }
  });
  it('comma groups: certain when they cannot be a decimal comma; decimal commas are told apart', () => {
    expect(groupedNumber('1,003')).toEqual({ value: 1003, certain: false });
    expect(groupedNumber('-12,345.5')).toEqual({ value: -12345.5, certain: true });
    expect(groupedNumber('1,234,567')).toEqual({ value: 1234567, certain: true });
    for (const text of ['0,003', '1,00', '1,0035', '12,34', ',5', '1,234,56', '1.003', '1003']) {
      expect(groupedNumber(text), text).toBeUndefined();
    }
    expect(['2,5', '0,003', '-12,75', ',5', '1,0035'].every(isDecimalComma)).toBe(true);
    expect(['1,003', '1,234,567', '1.5', 'a,5'].some(isDecimalComma)).toBe(false);
  });
  it('unreadableAllowed is max(1, ⌊5 %⌋) of the filled cells', () => {
    expect([1, 19, 20, 39, 40, 60, 100, 1000].map(unreadableAllowed)).toEqual([1, 1, 1, 1, 2, 3, 5, 50]);
  });
});

describe('property: a number column spoiled in at most max(1, 5 %) cells stays numbers in every format', () => {
  const BAD = ['4..5', 'n.d.', '1,2,3', 'x', '?', '1e', '--5', 'see log', '1.2.3', '0x1F'];
  const MISSING = ['', 'NA', 'N/A', '-', '—', 'nan', 'None', 'null'];
  const spoiled = fc
    .integer({ min: 6, max: 300 })
    .chain(n => fc.tuple(fc.constant(n), fc.integer({ min: 0, max: Math.floor((n - 5) / 4) })))
    .chain(([n, m]) =>
      fc.tuple(
        fc.constant(n),
        fc.constant(m),
        fc.integer({ min: 1, max: unreadableAllowed(n - m) }),
        fc.array(fc.double({ noNaN: true, noDefaultInfinity: true, min: -1e12, max: 1e12 }), { minLength: n, maxLength: n }),
        fc.array(fc.nat(), { minLength: n, maxLength: n })
      )
    )
    .chain(([n, m, k, xs, style]) =>
      fc.uniqueArray(fc.integer({ min: 0, max: n - 1 }), { minLength: m + k, maxLength: m + k }).map(places => {
        const missing = new Set(places.slice(0, m));
        const bad = places.slice(m).sort((a, b) => a - b);
        const texts = xs.map((x, r) => {
          if (missing.has(r)) {
            return MISSING[style[r] % MISSING.length];
          }
          if (bad.includes(r)) {
            return BAD[style[r] % BAD.length];
          }
          let t = String(x === 0 ? 0 : x);
          if (style[r] % 3 === 1) {
            t = t.replace(/-/g, '\u2212');
          } else if (style[r] % 3 === 2 && x > 0) {
            t = `+${t}`;
          }
          return style[r] % 4 === 3 ? ` ${t}  ` : t;
        });
        const want = xs.map((x, r) => (missing.has(r) || bad.includes(r) ? NaN : x === 0 ? 0 : x));
        return { n, texts, want, bad };
      })
    );

  function render(mime: string, texts: string[]): unknown {
    switch (mime) {
      case 'text/csv':
      case 'text/tab-separated-values':
        return Papa.unparse([['T', 'M'], ...texts.map((t, r) => [String(r), t])], { delimiter: mime === 'text/csv' ? ',' : '\t', newline: '\n' }) + '\n';
      case 'text/html':
        return (
          '<table class="dataframe"><thead><tr><th></th><th>T</th><th>M</th></tr></thead><tbody>' +
          texts.map((t, r) => `<tr><th>${r}</th><td>${r}</td><td>${t.replace(/&/g, '&amp;').replace(/</g, '&lt;')}</td></tr>`).join('') +
          '</tbody></table>'
        );
      case 'application/json':
        return texts.map((t, r) => ({ T: r, M: t }));
      default:
        return { schema: { fields: [{ name: 'T', type: 'integer' }, { name: 'M', type: 'number' }] }, data: texts.map((t, r) => ({ T: r, M: t })) };
    }
  }

  it('CSV, TSV, HTML, JSON records and dataresource: NaN exactly in the spoiled rows, one note listing them', () => {
    const mimes = ['text/csv', 'text/tab-separated-values', 'text/html', 'application/json', 'application/vnd.dataresource+json'];
    fc.assert(
      fc.property(spoiled, fc.constantFrom(...mimes), ({ texts, want, bad }, mime) => {
        const t = table(parseMime(mime, render(mime, texts)));
        const m = t.columns.find(c => c.header === 'M');
        expect(m?.kind).toBe('number');
        const got = values(m);
        want.forEach((w, r) => {
          if (!Object.is(got[r], w) && !(Number.isNaN(w) && Number.isNaN(got[r] as number))) {
            throw new Error(`${mime} row ${r}: read ${String(got[r])} from ${JSON.stringify(texts[r])}, want ${w}`);
          }
        });
        const notes = unreadable(t);
        expect(notes).toHaveLength(1);
        expectGoodMessages(notes.map(n => n.message));
        const listed = bad.slice(0, 10).map(r => r + 1).join(', ');
        const text = messageText(notes[0].message);
        expect(text).toContain('Column “M”');
        expect(text).toContain(bad.length === 1 ? `data row ${bad[0] + 1} ` : `data rows ${listed}`);
        expect(notes[0].message.code).toBe(bad.length === 1 ? 'table.unreadable.one' : bad.length <= 10 ? 'table.unreadable.some' : 'table.unreadable.many');
      }),
      { numRuns: 300 }
    );
  });
});
