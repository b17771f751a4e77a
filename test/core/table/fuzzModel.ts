/**
 * Fuzz helpers: a random table model (fast-check arbitraries), renderers that
 * write it the way pandas does (HTML display, to_csv, dataresource JSON), the
 * values a parse must give back, and hostile markup fragments.
 */
import fc from 'fast-check';
import Papa from 'papaparse';
import { groupedNumber, isMissingText, numberText, parseBoolean, parseDateParts, readNumber } from '../../../src/core/table/cells';

export type Kind = 'number' | 'string' | 'boolean' | 'datetime';
export type Cell = number | string | boolean | null;

export interface IModelColumn {
  header: string;
  kind: Kind;
  /** Datetime columns: whether values carry a time of day. */
  withTime: boolean;
  values: Cell[];
}

export interface IModel {
  /** null: no index; '' : unnamed RangeIndex; else a named integer index. */
  indexName: string | null;
  rows: number;
  columns: IModelColumn[];
}

/** Set by any hostile payload that ever ran. */
export const PWNED_FLAG = '__tableFuzzPwned';

/** Fragments that would run code if markup were ever executed or inserted. */
export const HOSTILE: readonly string[] = [
  `<script>globalThis.${PWNED_FLAG}=true</script>`,
  `<img src=x onerror="globalThis.${PWNED_FLAG}=true">`,
  `<a href="javascript:globalThis.${PWNED_FLAG}=true">`,
  `<svg onload="globalThis.${PWNED_FLAG}=true"><script>globalThis.${PWNED_FLAG}=true</script></svg>`,
  `<iframe srcdoc="<script>parent.${PWNED_FLAG}=true</script>"></iframe>`,
  `<body onload="globalThis.${PWNED_FLAG}=true">`,
  `<style>@import 'javascript:globalThis.${PWNED_FLAG}=true';</style>`,
  `<object data="javascript:globalThis.${PWNED_FLAG}=true"></object>`,
  `<template><script>globalThis.${PWNED_FLAG}=true</script></template>`,
  `<noscript><img src=x onerror="globalThis.${PWNED_FLAG}=true"></noscript>`
];

const CHARS = [
  ...'abcdefghijklmnopqrstuvwxyzABCDEFGHIJKLMNOPQRSTUVWXYZ0123456789',
  ...'!#$%&()*+,-./:;<=>?@[]^_`{|}~\'"\\',
  'é', 'µ', '°', 'Ω', '中', '😀', 'ß'
];
const LETTERS = [...'abcdefghijklmnopqrstuvwxyzABCDEFGHIJKLMNOPQRSTUVWXYZ'];

/** True when a text would be read as something other than a plain string (a number, also leniently, or a missing number). */
function typedLooking(s: string): boolean {
  return (
    readNumber(s) !== undefined ||
    groupedNumber(numberText(s)) !== undefined ||
    parseBoolean(s) !== undefined ||
    parseDateParts(s) !== undefined ||
    isMissingText(s) ||
    /^[.…⋮⋯]+$/.test(s)
  );
}

/** Strings of non-blank tokens joined by single spaces (HTML keeps them as is). */
const word = fc.string({ unit: fc.constantFrom(...CHARS), minLength: 1, maxLength: 6 });
export const plainString = fc
  .array(fc.oneof({ weight: 8, arbitrary: word }, { weight: 1, arbitrary: fc.constantFrom('<script>x</script>', '"onload=', 'javascript:', '&amp;', '<b>') }), {
    minLength: 1,
    maxLength: 3
  })
  .map(ws => ws.join(' '))
  .filter(s => !typedLooking(s));

const headerArb = fc
  .tuple(fc.constantFrom(...LETTERS), fc.string({ unit: fc.constantFrom(...LETTERS, ...'0123456789_'), maxLength: 6 }), fc.constantFrom('', ' (K)', ' [emu/g]', '_Oe', ' (T)'))
  .map(([a, b, u]) => `${a}${b}${u}`);

const finite = fc.double({ noNaN: true, noDefaultInfinity: true });
const numberCell = fc.oneof(
  { weight: 6, arbitrary: finite },
  { weight: 3, arbitrary: fc.integer({ min: -1e6, max: 1e6 }) },
  { weight: 1, arbitrary: fc.constantFrom(NaN, Infinity, -Infinity, -0, 0.1 + 0.2, 5e-324) }
);

const dateArb = fc.record({
  y: fc.integer({ min: 1900, max: 2100 }),
  m: fc.integer({ min: 1, max: 12 }),
  d: fc.integer({ min: 1, max: 28 }),
  h: fc.integer({ min: 0, max: 23 }),
  mi: fc.integer({ min: 0, max: 59 }),
  s: fc.integer({ min: 0, max: 59 })
});

function pad(n: number, w = 2): string {
  return String(n).padStart(w, '0');
}

function columnArb(rows: number, strings: fc.Arbitrary<string>): fc.Arbitrary<Omit<IModelColumn, 'header'>> {
  const kind = fc.constantFrom<Kind>('number', 'number', 'string', 'boolean', 'datetime');
  return fc.tuple(kind, fc.boolean()).chain(([k, withTime]) => {
    const first: fc.Arbitrary<Cell> =
      k === 'number' ? numberCell : k === 'string' ? strings : k === 'boolean' ? fc.boolean() : dateArb.map(d => dateText(d, withTime));
    const rest = k === 'number' ? numberCell : fc.option(first, { freq: 6, nil: null });
    return fc
      .tuple(first, fc.array(rest, { minLength: rows - 1, maxLength: rows - 1 }))
      .map(([a, more]) => ({ kind: k, withTime: k === 'datetime' && withTime, values: [a as Cell, ...(more as Cell[])] }));
  });
}

function dateText(d: { y: number; m: number; d: number; h: number; mi: number; s: number }, withTime: boolean): string {
  const date = `${pad(d.y, 4)}-${pad(d.m)}-${pad(d.d)}`;
  return withTime ? `${date} ${pad(d.h)}:${pad(d.mi)}:${pad(d.s)}` : date;
}

/** A random table; `strings` controls string cells (HTML needs whitespace-stable ones). */
export function modelArb(strings: fc.Arbitrary<string> = plainString): fc.Arbitrary<IModel> {
  return fc
    .record({
      rows: fc.integer({ min: 1, max: 25 }),
      headers: fc.uniqueArray(headerArb, { minLength: 1, maxLength: 5 }),
      indexName: fc.constantFrom<string | null>(null, '', 'run')
    })
    .chain(({ rows, headers, indexName }) =>
      fc.tuple(...headers.map(() => columnArb(rows, strings))).map(cols => ({
        indexName: indexName !== null && headers.includes(indexName) ? null : indexName,
        rows,
        columns: cols.map((c, i) => ({ ...c, header: headers[i] }))
      }))
    );
}

/** Python-style float text as pandas writes it in CSV (NaN empty). */
export function pyFloat(v: number, nan = ''): string {
  if (Number.isNaN(v)) {
    return nan;
  }
  if (v === Infinity) {
    return 'inf';
  }
  if (v === -Infinity) {
    return '-inf';
  }
  return Object.is(v, -0) ? '-0.0' : String(v);
}

function cellText(c: IModelColumn, v: Cell, missing: string): string {
  if (v === null) {
    return missing;
  }
  if (typeof v === 'number') {
    return pyFloat(v, missing === '' ? '' : 'NaN');
  }
  if (typeof v === 'boolean') {
    return v ? 'True' : 'False';
  }
  return v;
}

/** The frame as `df.to_csv()` writes it. */
export function renderCsv(m: IModel, delimiter = ','): string {
  const header = [...(m.indexName === null ? [] : [m.indexName]), ...m.columns.map(c => c.header)];
  const rows = Array.from({ length: m.rows }, (_, r) => [
    ...(m.indexName === null ? [] : [String(r)]),
    ...m.columns.map(c => cellText(c, c.values[r], ''))
  ]);
  // Python's csv module writes a row holding one empty field as "" (not a blank line).
  return [header, ...rows].map(r => (r.length === 1 && r[0] === '' ? '""' : Papa.unparse([r], { delimiter, newline: '\n' }))).join('\n') + '\n';
}

function esc(s: string): string {
  return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');
}

/** The frame as pandas' `_repr_html_()` lays it out; `wrap` may add hostile markup around cell text. */
export function renderHtml(m: IModel, wrap: (text: string, i: number) => string = t => t): string {
  const idx = m.indexName !== null;
  let k = 0;
  const head =
    `<tr style="text-align: right;">${idx ? '<th></th>' : ''}` +
    m.columns.map(c => `<th>${wrap(esc(c.header), k++)}</th>`).join('') +
    '</tr>' +
    (m.indexName === 'run' ? `<tr><th>run</th>${m.columns.map(() => '<th></th>').join('')}</tr>` : '');
  const body = Array.from({ length: m.rows }, (_, r) => {
    const cells = m.columns.map(c => `<td>${wrap(esc(cellText(c, c.values[r], c.kind === 'datetime' ? 'NaT' : c.kind === 'number' ? 'NaN' : 'None')), k++)}</td>`);
    return `<tr>${idx ? `<th>${r}</th>` : ''}${cells.join('')}</tr>`;
  }).join('\n');
  return `<div><style scoped>.dataframe tbody tr th { vertical-align: top; }</style><table border="1" class="dataframe"><thead>${head}</thead><tbody>${body}</tbody></table></div>`;
}

/** The frame as pandas' `_repr_data_resource_()` writes it (NaN and ±inf become null). */
export function renderDataResource(m: IModel): unknown {
  const type = (k: Kind) => (k === 'number' ? 'number' : k === 'datetime' ? 'datetime' : k);
  const fields = [...(m.indexName === null ? [] : [{ name: m.indexName || 'index', type: 'integer' }]), ...m.columns.map(c => ({ name: c.header, type: type(c.kind) }))];
  const data = Array.from({ length: m.rows }, (_, r) => {
    const rec: Record<string, unknown> = {};
    if (m.indexName !== null) {
      rec[m.indexName || 'index'] = r;
    }
    for (const c of m.columns) {
      const v = c.values[r];
      rec[c.header] =
        typeof v === 'number' ? (Number.isFinite(v) ? v : null) : c.kind === 'datetime' && typeof v === 'string' ? `${v.replace(' ', 'T')}${c.withTime ? '' : 'T00:00:00'}.000` : v;
    }
    return rec;
  });
  return { schema: { fields, primaryKey: m.indexName === null ? undefined : [m.indexName || 'index'], pandas_version: '1.4.0' }, data };
}

/** What a parse must give back for a model column. */
export function expectedValues(c: IModelColumn, nonFiniteAsNaN = false): unknown[] {
  if (c.kind === 'number') {
    return c.values.map(v => (nonFiniteAsNaN && !Number.isFinite(v as number) ? NaN : v));
  }
  if (c.kind === 'datetime') {
    const allMidnight = c.values.every(v => v === null || !/ /.test(v as string) || / 00:00:00$/.test(v as string));
    return c.values.map(v => (v === null ? null : allMidnight ? (v as string).slice(0, 10) : (v as string).replace(' ', 'T')));
  }
  return c.values;
}
