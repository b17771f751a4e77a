/**
 * The plain-text first pass of the CSV reader (src/core/table/csvplain.ts,
 * plainnumbers.ts): numbers read from the text where they stand equal
 * `Number(text)` bit for bit, and a plain file reads exactly as the same file
 * with CRLF line ends, which goes through papaparse (common practice, no
 * source; the reference is JavaScript's own correctly rounded `Number`).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { messageText } from '../../../src/core/messages';
import { parseMime } from '../../../src/core/table/index';
import type { ParseResult } from '../../../src/core/table/index';
import { readPlainNumber } from '../../../src/core/table/plainnumbers';

function read(text: string): number | undefined {
  return readPlainNumber(text, 0, text.length, { value: 0, point: false })?.value;
}

describe('readPlainNumber', () => {
  it('equals Number(text) for the ways numbers are printed', () => {
    fc.assert(
      fc.property(fc.double({ noNaN: true, noDefaultInfinity: true }), fc.integer({ min: 1, max: 17 }), (v, digits) => {
        for (const text of [String(v), v.toPrecision(digits), v.toExponential(digits - 1), Math.abs(v) < 1e21 ? v.toFixed(Math.min(digits, 20)) : String(v)]) {
          if (/^-?\d/.test(text)) {
            expect(Object.is(read(text), Number(text))).toBe(true);
          }
        }
      }),
      { numRuns: 3000, seed: 12 }
    );
  });

  it.each(['0', '-0', '5.', '.5', '-.5', '0.000', '1e-300', '1E+5', '1e400', '-1e-400', '123456789012345678901234567890', '0.1', '2.000298', '4.9e-324', '1.7976931348623157e308'])(
    'reads %s as Number does',
    (text) => {
      expect(Object.is(read(text), Number(text))).toBe(true);
    }
  );

  it.each(['', '-', '.', '+1', ' 1', '1 ', '1e', '1e+', 'inf', 'NaN', '0x10', '1,5', '1_000', '--1', '1.2.3', 'e5'])('leaves %j to the ordinary reader', (text) => {
    expect(read(text)).toBeUndefined();
  });

  it('reads a stretch inside a longer text and says whether it had a point', () => {
    const out = { value: 0, point: false };
    expect(readPlainNumber('a,12.5,b', 2, 6, out)).toEqual({ value: 12.5, point: true });
    expect(readPlainNumber('a,125,b', 2, 5, out)).toEqual({ value: 125, point: false });
  });
});

function summary(r: ParseResult): unknown {
  if (!r.ok) {
    return messageText(r.message);
  }
  return {
    rows: r.table.rowCount,
    columns: r.table.columns.map((c) => ({ name: c.name, kind: c.kind, values: Array.from(c.values as ArrayLike<unknown>, (v) => (typeof v === 'number' && Number.isNaN(v) ? 'NaN' : v)) })),
    notes: r.table.notes.map((n) => messageText(n.message))
  };
}

describe('plain CSV first pass', () => {
  it.each([
    ['numbers with an index', ',T,M\n0,1.5,2\n1,2.5,-3e-4\n2,3.5,4.\n'],
    ['blank lines, a short row, missing values', 'T,M,S\n\n1,2,3\n4,,6\n7,8\n\n9,nan,NaN\n'],
    ['a text column and a mostly numeric one', 'T,name,M\n1,a,2\n2,b,x\n3,c,4\n4,d,5\n5,e,6\n6,f,7\n7,g,8\n8,h,9\n9,i,10\n10,j,11\n11,k,12\n'],
    ['spaces and signs read the ordinary way', 'T, M\n 1,+2\n2 , −3\n3,4\n'],
    ['no line break at the end', 'a,b\n1,2\n3,4'],
    ['a row wider than the header', 'a,b\n1,2\n3,4,5\n'],
    ['thousands separators in a TSV', 'T\tM\n1\t1,234.5\n2\t2.5\n3\t1,003\n']
  ])('%s: same table as through papaparse', (_name, text) => {
    const mime = text.includes('\t') ? 'text/tab-separated-values' : 'text/csv';
    const plainRead = parseMime(mime, text);
    const viaPapaparse = parseMime(mime, text.replace(/\n/g, '\r\n'));
    expect(summary(plainRead)).toEqual(summary(viaPapaparse));
  });
});
