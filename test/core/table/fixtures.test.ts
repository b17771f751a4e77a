/**
 * Every output of a real pandas frame (fixtures/generate.py, pandas 1.5 from
 * Debian) must parse back to the frame's own `to_csv()` ground truth: bit for
 * bit where pandas printed full precision, within the displayed rounding where
 * it did not — and then the result carries a 'rounded' note.
 * The ground truth is read here with papaparse directly, not with our CSV parser.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { messageText } from '../../../src/core/messages';
import { parseMime, parseOutput } from '../../../src/core/table/index';
import { CSV_DISPLAY_SNIPPET } from '../../../src/core/table/notes';
import type { IColumn, ITable } from '../../../src/core/table/index';

interface IFixture {
  case: string;
  shape: [number, number];
  index_levels: number;
  csv: string;
  'text/html': string;
  'text/plain': string;
  'application/vnd.dataresource+json': unknown;
}

const DIR = join(__dirname, 'fixtures');
const fixtures: IFixture[] = readdirSync(DIR)
  .filter(f => f.endsWith('.json') && f !== 'display_snippet.json')
  .map(f => JSON.parse(readFileSync(join(DIR, f), 'utf8')) as IFixture);

interface ITruth {
  headers: string[];
  columns: string[][];
}

function truthOf(fx: IFixture): ITruth {
  const rows = Papa.parse<string[]>(fx.csv, { skipEmptyLines: true }).data;
  const headers = rows[0].map((h, c) => {
    if (c >= fx.index_levels || h !== '') {
      return h;
    }
    return fx.index_levels === 1 ? 'index' : `level_${c}`;
  });
  return { headers, columns: headers.map((_, c) => rows.slice(1).map(r => r[c])) };
}

/** Float of a to_csv cell: '' is NaN, 'inf'/'-inf' infinite. */
function truthNumber(s: string): number {
  return s === '' ? NaN : s === 'inf' ? Infinity : s === '-inf' ? -Infinity : Number(s);
}

/** Which truth row each parsed row is (head + tail around an elided gap, or head only). */
function rowMap(table: ITable, total: number): number[] {
  const gap = table.truncation?.rowGapAt ?? null;
  return Array.from({ length: table.rowCount }, (_, i) => (gap === null || i < gap ? i : total - (table.rowCount - i)));
}

function expectColumn(col: IColumn, truth: string[], rows: number[], tolerance: number, allowNullInf: boolean): void {
  rows.forEach((t, i) => {
    const want = truth[t];
    const where = `${col.header} row ${i}`;
    if (col.kind === 'number') {
      const p = (col.values as Float64Array)[i];
      const w = truthNumber(want);
      if (allowNullInf && !Number.isFinite(w) && !Number.isNaN(w)) {
        expect(Number.isNaN(p) || p === w, where).toBe(true);
      } else if (col.shownDigits === undefined || !Number.isFinite(w)) {
        expect(Object.is(p, w) || (Number.isNaN(p) && Number.isNaN(w)), `${where}: ${p} vs ${want}`).toBe(true);
      } else {
        expect(Math.abs(p - w), `${where}: ${p} vs ${want}`).toBeLessThanOrEqual(tolerance * Math.max(1, Math.abs(w)) * (1 + 1e-9));
      }
    } else if (col.kind === 'boolean') {
      expect(col.values[i], where).toBe(want === '' ? null : want === 'True');
    } else if (col.kind === 'datetime') {
      expect(col.values[i], where).toBe(want === '' ? null : want.replace(' ', 'T'));
    } else {
      expect(col.values[i], where).toBe(want === '' ? null : want);
    }
  });
}

/** Compare a parsed table with the ground truth; tolerance applies to columns flagged as rounded. */
function expectMatchesTruth(table: ITable, fx: IFixture, tolerance: number, allowNullInf = false): void {
  const truth = truthOf(fx);
  const total = fx.shape[0];
  const rows = rowMap(table, total);
  if (table.truncation === undefined) {
    expect(table.rowCount).toBe(total);
    expect(table.columns.length).toBe(truth.headers.length);
  }
  table.columns.forEach((col, c) => {
    const t = col.isIndex ? c : truth.headers.findIndex((h, k) => k >= fx.index_levels && h === col.header);
    expect(t, `column ${col.header}`).toBeGreaterThanOrEqual(0);
    expect(col.header).toBe(truth.headers[t]);
    expect(col.isIndex).toBe(t < fx.index_levels);
    expectColumn(col, truth.columns[t], rows, tolerance, allowNullInf);
  });
  const rounded = table.columns.some(c => c.shownDigits !== undefined);
  expect(table.notes.some(n => n.kind === 'rounded')).toBe(rounded);
}

// pandas display.precision = 6 decimals (fixed) or a 6-decimal mantissa (scientific):
// half a unit in the last shown place, relative to max(1, |value|). Common practice, no source.
const DISPLAY_TOL = 5e-7;
// pandas to_json double_precision = 10 decimal places. Common practice, no source.
const JSON_TOL = 5e-11;

describe('pandas fixtures parse to their to_csv() ground truth', () => {
  it('has the generated fixtures', () => {
    expect(fixtures.length).toBeGreaterThanOrEqual(9);
  });

  for (const fx of fixtures) {
    describe(fx.case, () => {
      it('text/csv ground truth parses bit for bit', () => {
        const r = parseMime('text/csv', fx.csv);
        expect(r.ok).toBe(true);
        if (r.ok) {
          expect(r.table.format).toBe('csv');
          expectMatchesTruth(r.table, { ...fx, index_levels: fx.index_levels === 1 && fx.csv.startsWith(',') ? 1 : 0 }, 0);
        }
      });

      it('text/html parses to the truth (rounded columns flagged)', () => {
        const r = parseMime('text/html', fx['text/html']);
        expect(r.ok, r.ok ? '' : messageText(r.message)).toBe(true);
        if (r.ok) {
          expect(r.table.format).toBe('pandas-html');
          expectMatchesTruth(r.table, fx, DISPLAY_TOL);
        }
      });

      it('text/plain parses to the truth (rounded columns flagged)', () => {
        const r = parseMime('text/plain', fx['text/plain']);
        expect(r.ok, r.ok ? '' : messageText(r.message)).toBe(true);
        if (r.ok) {
          expect(r.table.format).toBe('pandas-text');
          expectMatchesTruth(r.table, fx, DISPLAY_TOL);
        }
      });

      if (fx['application/vnd.dataresource+json'] !== null) {
        it('dataresource parses to the truth (±inf is null in pandas JSON)', () => {
          const r = parseMime('application/vnd.dataresource+json', fx['application/vnd.dataresource+json']);
          expect(r.ok, r.ok ? '' : messageText(r.message)).toBe(true);
          if (r.ok) {
            expect(r.table.format).toBe('dataresource');
            // pandas sends df.head(display.max_rows); alone, the payload cannot tell (see the cross-check test below).
            const head = fx.case === 'truncated_rows' ? 20 : fx.shape[0];
            expect(r.table.rowCount).toBe(head);
            expectMatchesTruth(r.table, { ...fx, shape: [head, fx.shape[1]] }, JSON_TOL, true);
          }
        });
      }

      it('the whole output bundle parses from its richest MIME type', () => {
        const bundle: Record<string, unknown> = { 'text/html': fx['text/html'], 'text/plain': fx['text/plain'] };
        if (fx['application/vnd.dataresource+json'] !== null) {
          bundle['application/vnd.dataresource+json'] = fx['application/vnd.dataresource+json'];
        }
        const r = parseOutput(bundle);
        expect(r.ok).toBe(true);
        if (r.ok) {
          expect(r.table.format).toBe(fx['application/vnd.dataresource+json'] !== null ? 'dataresource' : 'pandas-html');
          expectMatchesTruth(r.table, fx, r.table.format === 'dataresource' ? JSON_TOL : DISPLAY_TOL);
          const truncated = fx.case.startsWith('truncated') && r.table.format !== 'dataresource';
          const rowsCut = fx.case === 'truncated_rows';
          expect(r.table.notes.some(n => n.kind === 'truncated')).toBe(truncated || rowsCut);
        }
      });
    });
  }
});

describe('truncated displays are explained, never taken as the whole table', () => {
  const fx = fixtures.find(f => f.case === 'truncated_rows') as IFixture;
  it('HTML: 5 + 5 rows shown of 100 (display.min_rows), gap after row 5, note with both remedies', () => {
    const r = parseMime('text/html', fx['text/html']);
    expect(r.ok).toBe(true);
    if (r.ok) {
      expect(r.table.truncation).toEqual({ shownRows: 10, totalRows: 100, shownColumns: 3, totalColumns: 3, rowGapAt: 5 });
      const note = r.table.notes
        .filter(n => n.kind === 'truncated')
        .map(n => messageText(n.message))
        .join(' ');
      expect(note).toContain('Only 10 of 100 rows');
      expect(note).toContain('CSV file');
      expect(note).toContain("display({'text/csv': df.to_csv()}, raw=True)");
    }
  });
  it('text repr: "[100 rows x 3 columns]" footer read', () => {
    const r = parseMime('text/plain', fx['text/plain']);
    expect(r.ok && r.table.truncation?.totalRows).toBe(100);
  });
  it('dataresource alone cannot know; with the text display beside it, the note appears', () => {
    const alone = parseMime('application/vnd.dataresource+json', fx['application/vnd.dataresource+json']);
    expect(alone.ok && alone.table.rowCount).toBe(20);
    const both = parseOutput({ 'application/vnd.dataresource+json': fx['application/vnd.dataresource+json'], 'text/plain': fx['text/plain'] });
    expect(both.ok && both.table.truncation?.totalRows).toBe(100);
  });
  it('elided columns are reported', () => {
    const cols = fixtures.find(f => f.case === 'truncated_columns') as IFixture;
    const r = parseMime('text/html', cols['text/html']);
    expect(r.ok && r.table.truncation?.totalColumns).toBe(10);
    expect(r.ok && r.table.columns.filter(c => !c.isIndex).map(c => c.header)).toEqual(['c0', 'c1', 'c8', 'c9']);
  });
});

describe('infinities lost by pandas dataresource JSON are restored from the display', () => {
  it('specials: ±inf come back via parseOutput', () => {
    const fx = fixtures.find(f => f.case === 'specials') as IFixture;
    const r = parseOutput({ 'application/vnd.dataresource+json': fx['application/vnd.dataresource+json'], 'text/html': fx['text/html'] });
    expect(r.ok).toBe(true);
    if (r.ok) {
      const x = r.table.columns.find(c => c.header === 'x')?.values as Float64Array;
      expect(Array.from(x)).toEqual([1.5, NaN, Infinity, -Infinity, 0.25]);
      expect(r.table.notes.some(n => n.kind === 'info' && messageText(n.message).includes('restored'))).toBe(true);
    }
  });
});

describe('the remedy snippet in the notes is the one IPython was seen to publish as text/csv', () => {
  const check = JSON.parse(readFileSync(join(DIR, 'display_snippet.json'), 'utf8')) as {
    snippet: string;
    ipython_version: string;
    published: Record<string, unknown>[];
    csv: string;
  };
  it('same two lines as generate.py executed under IPython', () => {
    expect(CSV_DISPLAY_SNIPPET).toBe(check.snippet);
    expect(check.published).toHaveLength(1);
    expect(Object.keys(check.published[0])).toEqual(['text/csv']);
  });
  it('what it published parses at full precision', () => {
    const r = parseOutput(check.published[0]);
    expect(r.ok).toBe(true);
    if (r.ok) {
      expect(r.table.format).toBe('csv');
      expect(r.table.notes).toEqual([]);
      const third = r.table.columns.find(c => c.header === 'third')?.values as Float64Array;
      expect(Array.from(third)).toEqual([1 / 3, 2 / 3, 1 / 7]);
    }
  });
});
