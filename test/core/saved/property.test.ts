/**
 * Properties over arbitrary metadata values (any JSON, blocks of every
 * version, entries valid and broken, unknown kinds and fields): reading never
 * throws, inputs are never mutated, and saving a fresh analysis then removing
 * it gives back what was there (format 1 blocks: their format 2 migration;
 * an empty block: no block).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { messageText } from '../../../src/core/messages';
import { jsonEqual } from '../../../src/core/saved/json';
import { migrateV1Block } from '../../../src/core/saved/migrate';
import { readSavedWith } from '../../../src/core/saved/read';
import type { ISavedAnalysis, ISavedSettings } from '../../../src/core/saved/types';
import { removeSavedWith, upsertSavedWith } from '../../../src/core/saved/write';
import { kinds, v1Entry } from './helpers';

const RUNS = 10_000;

const KNOWN = new Set(['id', 'source', 'columns', 'snapshot', 'settings', 'fit', 'version', 'analyses', 'index', 'header', 'x', 'y', 'sigma', 'kind', 'options', 'window', 'min', 'max', 'headers', 'units', 'values', 'rows', 'hash', 'omitted', 'notebookPath', 'cellId', 'outputIndex', 'contentHash']);

/** Finite doubles without −0 (JSON writes −0 as 0). */
const finite = fc.double({ noNaN: true, noDefaultInfinity: true }).map(v => (v === 0 ? 0 : v));
const windowMin = fc.oneof(finite, fc.constant(-Infinity));
const windowMax = fc.oneof(finite, fc.constant(Infinity));
const window = fc.record({ min: windowMin, max: windowMax });
const extras = fc.dictionary(
  fc.string({ maxLength: 8 }).filter(k => !KNOWN.has(k)),
  fc.jsonValue({ maxDepth: 2 }),
  { maxKeys: 2 }
);

const settings: fc.Arbitrary<ISavedSettings | null> = fc.oneof(
  fc.constant(null),
  fc.record({ kind: fc.constant('weiss'), options: fc.record({ J: fc.constantFrom(0.5, 1, Infinity) }), window }),
  fc.record({
    kind: fc.constant('power-law'),
    options: fc.record({ proxyPower: fc.oneof(finite, fc.constant(-Infinity)), background: fc.boolean() }, { requiredKeys: ['background'] }),
    window
  }),
  fc.record({ kind: fc.constant('expression'), options: fc.record({ expression: fc.string(), starts: fc.string() }), window })
);

const ref = fc.record({ index: fc.nat(20), header: fc.string({ maxLength: 6 }) });

/** An analysis as the panel hands it over (id chosen by the caller). */
const analysis = (id: fc.Arbitrary<string>): fc.Arbitrary<ISavedAnalysis> =>
  fc.integer({ min: 2, max: 3 }).chain(ncol =>
    fc.integer({ min: 0, max: 4 }).chain(nrow =>
      fc.record({
        id,
        source: fc.record({ notebookPath: fc.string(), cellId: fc.string(), outputIndex: fc.nat(5), contentHash: fc.string({ maxLength: 16 }) }),
        columns: fc.record({ x: ref, y: ref, sigma: fc.option(ref, { nil: null }) }),
        snapshot: fc.record({
          headers: fc.array(fc.string({ maxLength: 6 }), { minLength: ncol, maxLength: ncol }),
          units: fc.array(fc.option(fc.string({ maxLength: 3 }), { nil: null }), { minLength: ncol, maxLength: ncol }),
          values: fc.array(fc.array(fc.option(finite, { nil: null }), { minLength: nrow, maxLength: nrow }), { minLength: ncol, maxLength: ncol })
        }),
        settings
      })
    )
  );

/** The JSON form psiscape writes for an analysis, with unknown fields added at the entry, settings and options level. */
const storedEntry = fc.tuple(analysis(fc.string({ maxLength: 4 })), extras, extras, extras).map(([a, top, inSettings, inOptions]) => {
  const r = upsertSavedWith(undefined, a, kinds);
  const json = (('value' in r ? r.value : { analyses: [r] }) as { analyses: Record<string, unknown>[] }).analyses[0];
  const s = json.settings as Record<string, unknown> | null;
  return {
    ...json,
    ...top,
    settings: s ? { ...s, ...inSettings, options: { ...inOptions, ...(s.options as object) } } : s
  };
});

const entryLike = fc.oneof(
  { arbitrary: storedEntry, weight: 4 },
  { arbitrary: storedEntry.map(e => ({ ...e, settings: { kind: 'future-kind', options: { a: 1 }, window: { min: null, max: null } } })), weight: 1 },
  { arbitrary: fc.string({ maxLength: 4 }).map(id => v1Entry(id)), weight: 1 },
  { arbitrary: fc.jsonValue({ maxDepth: 3 }), weight: 1 }
);

const block = fc.oneof(
  { arbitrary: fc.jsonValue({ maxDepth: 4 }), weight: 2 },
  { arbitrary: fc.constantFrom(undefined, null), weight: 1 },
  {
    arbitrary: fc.tuple(fc.constantFrom<unknown>(2, 2, 2, 1, 3, 17, '1', '2', 0, 1.5, null), fc.array(entryLike, { maxLength: 4 }), extras).map(([version, analyses, more]) => ({ ...more, version, analyses })),
    weight: 6
  }
);

const FRESH_ID = 'fresh analysis ☂';
const fresh = analysis(fc.constant(FRESH_ID));

/** What reading a fresh analysis back gives: ±∞ options as "inf" / "-inf". */
function readBack(a: ISavedAnalysis): ISavedAnalysis {
  if (!a.settings) {
    return a;
  }
  const options = Object.fromEntries(Object.entries(a.settings.options).map(([k, v]) => [k, v === Infinity ? 'inf' : v === -Infinity ? '-inf' : v]));
  return { ...a, settings: { ...a.settings, options } };
}

/** What removing the fresh analysis must give back. */
function original(raw: unknown): unknown {
  const r = raw as { version: unknown; analyses: unknown[] } | null | undefined;
  if (r === undefined || r === null || (r.analyses.length === 0 && Object.keys(r).every(k => k === 'version' || k === 'analyses'))) {
    return undefined;
  }
  return r.version === 1 ? migrateV1Block(r as unknown as Record<string, unknown>, kinds) : raw;
}

function ids(raw: unknown): unknown[] {
  const list = (raw as { analyses?: unknown } | null)?.analyses;
  return Array.isArray(list) ? list.map(e => (e as { id?: unknown } | null)?.id) : [];
}

describe('saved format properties', () => {
  // Case: lossless round trip and no throws, over arbitrary metadata (at least 10 000 values a run).
  it(`should read anything without throwing, and give back the original after saving and removing a fresh analysis (${RUNS} cases)`, () => {
    let written = 0;
    fc.assert(
      fc.property(block, fresh, (raw, a) => {
        fc.pre(!ids(raw).includes(FRESH_ID));
        const before = JSON.stringify(raw);
        const read = readSavedWith(raw, kinds);
        expect(read.problems.map(p => p.code)).not.toContain('saved.read-failed');

        const up = upsertSavedWith(raw, a, kinds);
        if ('blocked' in up) {
          expect(read.writable, messageText(up.blocked)).toBe(false);
          expect('blocked' in removeSavedWith(raw, FRESH_ID, kinds)).toBe(true);
        } else {
          written++;
          expect(read.writable).toBe(true);
          expect(up.changed).toBe(true);
          const stored = JSON.parse(JSON.stringify(up.value));
          const back = readSavedWith(stored, kinds).analyses.filter(e => e.id === FRESH_ID);
          expect(back).toHaveLength(1);
          expect(jsonEqual(back[0], readBack(a)) && back[0].settings?.window.min === a.settings?.window.min).toBe(true);
          expect(upsertSavedWith(stored, a, kinds)).toEqual({ value: stored, changed: false });

          const rm = removeSavedWith(stored, FRESH_ID, kinds);
          expect('blocked' in rm).toBe(false);
          expect(jsonEqual((rm as { value: unknown }).value, original(raw))).toBe(true);
          expect(removeSavedWith(raw, FRESH_ID, kinds)).toEqual({ value: raw, changed: false });
        }
        expect(JSON.stringify(raw)).toBe(before);
      }),
      { numRuns: RUNS }
    );
    // The generators must reach writable blocks often enough for the round trip to mean something.
    expect(written).toBeGreaterThan(RUNS / 3);
  }, 60_000);
});
