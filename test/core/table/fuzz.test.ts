/**
 * Property-based fuzzing of the table parsers (fast-check): over 10 000 generated
 * HTML / CSV / JSON tables per run, hostile markup included. Properties:
 *  - round trip: a generated table rendered as pandas HTML, CSV (to_csv), TSV,
 *    dataresource JSON or JSON records parses back to the same values;
 *  - never an uncaught throw, nothing executed (a global flag stays unset),
 *    no single parse over 2 s;
 *  - every refusal of table-shaped input names the row or column concerned;
 *  - parsed tables are well formed (one value per row, Float64Array iff number).
 */
import fc from 'fast-check';
import { afterAll, describe, expect, it } from 'vitest';
import { messageText } from '../../../src/core/messages';
import { parseMime, parseOutput, TABLE_LIMITS } from '../../../src/core/table/index';
import type { IColumn, ITable, ParseResult } from '../../../src/core/table/index';
import { expectedValues, HOSTILE, modelArb, PWNED_FLAG, renderCsv, renderDataResource, renderHtml } from './fuzzModel';
import type { IModel } from './fuzzModel';

const MAX_MS = 2000;
let generated = 0;
let slowest = 0;

function timed(run: () => ParseResult): ParseResult {
  const t0 = performance.now();
  const r = run();
  const ms = performance.now() - t0;
  slowest = Math.max(slowest, ms);
  generated++;
  if (ms > MAX_MS) {
    throw new Error(`a parse took ${ms.toFixed(0)} ms`);
  }
  if ((globalThis as Record<string, unknown>)[PWNED_FLAG] !== undefined) {
    throw new Error('a hostile payload ran');
  }
  return r;
}

function wellFormed(t: ITable): void {
  for (const c of t.columns) {
    expect(c.values.length).toBe(t.rowCount);
    expect(c.values instanceof Float64Array).toBe(c.kind === 'number');
  }
}

function same(a: unknown, b: unknown): boolean {
  return Object.is(a, b) || (typeof a === 'number' && typeof b === 'number' && Number.isNaN(a) && Number.isNaN(b));
}

function valuesOf(c: IColumn): unknown[] {
  return Array.from(c.values as ArrayLike<unknown>);
}

/** Parsed data columns must carry the model's headers, kinds and values. */
function expectRoundTrip(r: ParseResult, m: IModel, opts: { nonFiniteAsNaN?: boolean; indexAsColumn?: boolean } = {}): void {
  if (!r.ok) {
    throw new Error(`refused: ${messageText(r.message)}`);
  }
  const t = r.table;
  wellFormed(t);
  expect(t.rowCount).toBe(m.rows);
  const lead = m.indexName === null ? 0 : 1;
  expect(t.columns.length).toBe(m.columns.length + lead);
  if (lead === 1) {
    const idx = t.columns[0];
    const named = m.indexName === 'run';
    expect(idx.header).toBe(named ? 'run' : 'index');
    expect(idx.isIndex).toBe(!(opts.indexAsColumn === true && named));
    expect(valuesOf(idx)).toEqual(Array.from({ length: m.rows }, (_, i) => i));
  }
  m.columns.forEach((mc, i) => {
    const c = t.columns[i + lead];
    expect(c.header).toBe(mc.header);
    expect(c.isIndex).toBe(false);
    expect(c.kind).toBe(mc.kind);
    const want = expectedValues(mc, opts.nonFiniteAsNaN === true);
    const got = valuesOf(c);
    want.forEach((w, k) => {
      if (!same(got[k], w)) {
        throw new Error(`column '${mc.header}' row ${k}: got ${String(got[k])}, want ${String(w)}`);
      }
    });
  });
}

/** A refusal of table-shaped input must say where: a row or a column. */
function expectLocatedRefusal(r: ParseResult): void {
  if (!r.ok) {
    expect(messageText(r.message), messageText(r.message)).toMatch(/\b(row|column)s?\b/i);
  }
}

describe('round trips: generated table → pandas-style text → parse → same values', () => {
  it('CSV (to_csv) and TSV, full precision bit for bit', () => {
    fc.assert(
      fc.property(modelArb(), m => {
        expectRoundTrip(timed(() => parseMime('text/csv', renderCsv(m))), m, { indexAsColumn: true });
        expectRoundTrip(timed(() => parseMime('text/tab-separated-values', renderCsv(m, '\t'))), m, { indexAsColumn: true });
      }),
      { numRuns: 1500 }
    );
  });

  it('pandas HTML, with hostile markup wrapped around cell text', () => {
    fc.assert(
      fc.property(modelArb(), fc.array(fc.constantFrom(...HOSTILE), { maxLength: 4 }), fc.integer({ min: 0, max: 1000 }), (m, hostile, seed) => {
        const wrap = (text: string, i: number) => {
          const h = hostile.length > 0 && (i + seed) % 3 === 0 ? hostile[(i + seed) % hostile.length] : '';
          return i % 2 === 0 ? `${h}<span onclick="globalThis.${PWNED_FLAG}=1">${text}</span>` : `<a href="javascript:void(globalThis.${PWNED_FLAG}=1)">${text}</a>${h}`;
        };
        expectRoundTrip(timed(() => parseMime('text/html', renderHtml(m, hostile.length > 0 ? wrap : undefined))), m);
      }),
      { numRuns: 2500 }
    );
  });

  it('dataresource JSON (±inf and NaN written as null, as pandas does)', () => {
    fc.assert(
      fc.property(modelArb(fc.string({ minLength: 1 })), m => {
        const r = timed(() => parseMime('application/vnd.dataresource+json', renderDataResource(m)));
        if (m.columns.some(c => c.kind === 'string' && c.values.some(v => typeof v === 'string' && /^\d{4}-\d\d-\d\d/.test(v)))) {
          return;
        }
        expectRoundTrip(r, m, { nonFiniteAsNaN: true });
      }),
      { numRuns: 1500 }
    );
  });

  it('pandas-style HTML rounded to 6 decimals is flagged and equals the rounded values', () => {
    const value = fc.double({ min: -1e5, max: 1e5, noNaN: true });
    fc.assert(
      fc.property(fc.array(value, { minLength: 1, maxLength: 20 }), xs => {
        const hasFraction = xs.some(x => !Number.isInteger(x));
        const shown = xs.map(x => (hasFraction ? x.toFixed(6) : String(x)));
        const html = `<table class="dataframe"><thead><tr><th></th><th>x</th></tr></thead><tbody>${shown.map((s, i) => `<tr><th>${i}</th><td>${s}</td></tr>`).join('')}</tbody></table>`;
        const r = timed(() => parseMime('text/html', html));
        if (!r.ok) {
          throw new Error(messageText(r.message));
        }
        const col = r.table.columns[1];
        expect(valuesOf(col)).toEqual(shown.map(Number));
        expect(col.shownDigits !== undefined).toBe(hasFraction);
        expect(r.table.notes.some(n => n.kind === 'rounded')).toBe(hasFraction);
      }),
      { numRuns: 500 }
    );
  });
});

describe('hostile and malformed input: no throw, nothing run, bounded time, located refusals', () => {
  const fragment = fc.oneof(
    { weight: 4, arbitrary: fc.constantFrom(...HOSTILE) },
    { weight: 6, arbitrary: fc.constantFrom('<table>', '</table>', '<thead>', '<tbody>', '<tr>', '</tr>', '<th>', '<td>', '</td>', '<td colspan="7">', '<th rowspan="70000">', '<td colspan="99999">', '<p>12 rows × 3 columns</p>', '...', '<td>...</td>', '1.000000', 'inf', 'NaN', '&nbsp;') },
    { weight: 2, arbitrary: fc.string({ maxLength: 20 }) },
    { weight: 1, arbitrary: fc.integer({ min: 1, max: 3000 }).map(n => `${'<div>'.repeat(n)}x`) },
    { weight: 1, arbitrary: fc.integer({ min: 60, max: 400 }).map(n => `<td>${'<b><i>'.repeat(n)}y`) },
    {
      weight: 1,
      arbitrary: fc
        .tuple(fc.constantFrom('<a', '<a ', '<!-', '</', '<', ' y', '="', '<div title="<">', '<td x=1 ', '<table>'), fc.integer({ min: 1000, max: 30_000 }))
        .map(([f, n]) => f.repeat(n))
    }
  );

  it('random HTML soup', () => {
    fc.assert(
      fc.property(fc.array(fragment, { maxLength: 60 }), parts => {
        const r = timed(() => parseMime('text/html', parts.join('')));
        if (r.ok) {
          wellFormed(r.table);
        } else if (!/^The HTML (holds no table|table is empty)/.test(messageText(r.message))) {
          expectLocatedRefusal(r);
        }
      }),
      { numRuns: 1200 }
    );
  });

  it('random text for the pandas text repr reader', () => {
    const line = fc.oneof(
      fc.string({ maxLength: 30 }),
      fc.constantFrom('     a    b', '0  1.0  x', '1  NaN  y', '..  ...  ..', '[12 rows x 2 columns]', '', '   \\', `<script>globalThis.${PWNED_FLAG}=1</script>`)
    );
    fc.assert(
      fc.property(fc.array(line, { maxLength: 12 }), lines => {
        const r = timed(() => parseMime('text/plain', lines.join('\n')));
        if (r.ok) {
          wellFormed(r.table);
        }
      }),
      { numRuns: 800 }
    );
  });

  it('pathological tag soup (unterminated tags, attribute floods, span bombs) stays fast', () => {
    const n = 200_000;
    const cases = [
      `<table>${'<a'.repeat(n)}`,
      `<table>${'<a '.repeat(n)}`,
      `<table>${'<!-'.repeat(n)}`,
      `<table>${'</'.repeat(n)}`,
      `<table><tr><td x${' y'.repeat(n)}>1</td></tr></table>`,
      `<table><div x="${'y'.repeat(n)}`,
      `<table>${'<div title="<">'.repeat(n)}`,
      `<table>${'<tr><td rowspan="65534" colspan="2000">x'.repeat(20)}`
    ];
    for (const html of cases) {
      const r = timed(() => parseMime('text/html', html));
      if (!r.ok && !/^The HTML (holds no table|table is empty)/.test(messageText(r.message))) {
        expectLocatedRefusal(r);
      }
    }
    // Long runs that trip backtracking regular expressions: digits after a table, spaces in text.
    timed(() => parseMime('text/html', `<table><tr><th>a</th></tr><tr><td>1</td></tr></table>${'9'.repeat(n)}`));
    timed(() => parseMime('text/plain', `     a\n${' '.repeat(n)}x\n0  1`));
    timed(() => parseMime('text/plain', `0    1\nName: ${'a, '.repeat(n)}dtype: int64`));
    timed(() => parseOutput({ 'application/vnd.dataresource+json': { schema: { fields: [{ name: 'a' }] }, data: [{ a: null }] }, 'text/html': `<table></table>${'1'.repeat(n)}` }));
  });

  it('table-shaped HTML with huge cells and deep nesting is refused by row and column', () => {
    const bad = fc.oneof(
      fc.constant('z'.repeat(TABLE_LIMITS.maxCellChars * 2 + 1)),
      fc.integer({ min: TABLE_LIMITS.maxDepth + 1, max: 5000 }).map(n => `${'<span>'.repeat(n)}1${'</span>'.repeat(n)}`),
      fc.integer({ min: TABLE_LIMITS.maxDepth + 1, max: 2000 }).map(n => `${'<table><tr><td>'.repeat(n)}1`)
    );
    fc.assert(
      fc.property(modelArb(), bad, fc.nat(), (m, cell, where) => {
        const html = renderHtml(m, (t, i) => (i === where % (m.columns.length * (m.rows + 1)) ? cell : t));
        const r = timed(() => parseMime('text/html', html));
        expect(r.ok).toBe(false);
        expectLocatedRefusal(r);
      }),
      { numRuns: 150 }
    );
  });

  it('random and broken CSV', () => {
    const piece = fc.oneof(fc.string({ maxLength: 12 }), fc.constantFrom(',', '"', '\n', '\r\n', '""', 'inf', 'NaN', 'True', `<script>globalThis.${PWNED_FLAG}=1</script>`));
    fc.assert(
      fc.property(fc.array(piece, { maxLength: 50 }), parts => {
        const r = timed(() => parseMime('text/csv', parts.join('')));
        if (r.ok) {
          wellFormed(r.table);
        } else if (!/empty/.test(messageText(r.message))) {
          expectLocatedRefusal(r);
        }
      }),
      { numRuns: 1200 }
    );
  });

  it('random JSON values, records with deep cells and ragged columns', () => {
    const deep = fc.integer({ min: TABLE_LIMITS.maxDepth - 2, max: 3000 }).map(n => JSON.parse(`${'['.repeat(n)}1${']'.repeat(n)}`) as unknown);
    const payload = fc.oneof(
      fc.jsonValue({ maxDepth: 4 }),
      fc.array(fc.dictionary(fc.string({ maxLength: 4 }), fc.oneof(fc.jsonValue({ maxDepth: 2 }), deep), { maxKeys: 4 }), { maxLength: 10 }),
      fc.dictionary(fc.string({ maxLength: 4 }), fc.array(fc.oneof(fc.double(), fc.string(), fc.constant(null)), { maxLength: 6 }), { minKeys: 1, maxKeys: 4 }),
      fc.string().map(s => `[{"a": ${s}`)
    );
    fc.assert(
      fc.property(payload, p => {
        const r = timed(() => parseMime('application/json', p));
        if (r.ok) {
          wellFormed(r.table);
        } else {
          expect(messageText(r.message).length).toBeGreaterThan(0);
          if (Array.isArray(p) || (typeof p === 'object' && p !== null && Object.keys(p).length > 0)) {
            expectLocatedRefusal(r);
          }
        }
      }),
      { numRuns: 1200 }
    );
  });

  it('whole output bundles mixing all of the above', () => {
    fc.assert(
      fc.property(modelArb(), fc.constantFrom(...HOSTILE), (m, h) => {
        const r = timed(() =>
          parseOutput({ 'text/html': `${h}${renderHtml(m)}`, 'text/plain': `${h}\n0 1`, 'image/png': 'iVBORw0KGgo=' })
        );
        expectRoundTrip(r, m);
      }),
      { numRuns: 300 }
    );
  });

  afterAll(() => {
    expect(generated).toBeGreaterThanOrEqual(10_000);
    expect(slowest).toBeLessThan(MAX_MS);
    console.log(`table fuzz: ${generated} parses, slowest ${slowest.toFixed(0)} ms`);
  });
});
