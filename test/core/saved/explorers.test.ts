/**
 * The optional `explorers` list of the saved format: Landau explorers read
 * entry by entry, written without losing unknown fields or entries, removed
 * back to what was there; analyses written beside it leave it untouched; what
 * psiscape writes validates against the published schema.
 */
import fs from 'node:fs';
import path from 'node:path';
import Ajv from 'ajv';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { readSavedExplorers, removeExplorerWith, upsertExplorerWith } from '../../../src/core/saved/explorers';
import type { ISavedExplorer } from '../../../src/core/saved/explorers';
import { jsonEqual } from '../../../src/core/saved/json';
import { readSavedWith } from '../../../src/core/saved/read';
import { removeSavedWith, upsertSavedWith } from '../../../src/core/saved/write';
import { entry, kinds } from './helpers';

const SCHEMA_FILE = path.resolve(__dirname, '..', '..', '..', 'schema', 'saved-analyses.v2.json');

const explorer = (id: string, more: Partial<ISavedExplorer> = {}): ISavedExplorer => ({
  id,
  coefficients: { a: 0.5, T0: 100, b: -2, c: 4, d: 0 },
  convention: 'no-fractions',
  T: 100.25,
  h: 0.01,
  ...more
});

const valueOf = (r: ReturnType<typeof upsertExplorerWith>): unknown => {
  if ('blocked' in r) {
    throw new Error(r.blocked.text);
  }
  return r.value;
};

describe('saved Landau explorers', () => {
  // Case: a fresh block holds the explorer beside an empty analyses list, and reads back.
  it('should write an explorer into an empty notebook and read it back', () => {
    const value = valueOf(upsertExplorerWith(undefined, explorer('e1'), kinds));
    expect(value).toEqual({ version: 2, analyses: [], explorers: [{ id: 'e1', coefficients: { a: 0.5, T0: 100, b: -2, c: 4, d: 0 }, convention: 'no-fractions', T: 100.25, h: 0.01 }] });
    expect(readSavedExplorers(value)).toEqual({ explorers: [explorer('e1')], problems: [] });
    expect(readSavedWith(value, kinds).analyses).toEqual([]);
    expect(valueOf(removeExplorerWith(value, 'e1', kinds))).toBeUndefined();
  });

  // Case: updating keeps unknown fields in place and reports no change when nothing changed.
  it('should keep unknown fields and entries, and change nothing when the scenario is the same', () => {
    const raw = {
      version: 2,
      analyses: [],
      note: 'kept',
      explorers: [{ future: [1, 2], id: 'e1', coefficients: { a: 1, T0: 2, b: 3, c: 4, extra: true }, convention: 'L', T: 1, h: 0 }, 'junk', { id: 'e2' }]
    };
    const same = upsertExplorerWith(raw, explorer('e1', { coefficients: { a: 1, T0: 2, b: 3, c: 4, d: 0 }, convention: 'L', T: 1, h: 0 }), kinds);
    // d: 0 is new to the stored coefficients: written once, then nothing changes.
    const once = valueOf(same);
    expect(upsertExplorerWith(once, explorer('e1', { coefficients: { a: 1, T0: 2, b: 3, c: 4, d: 0 }, convention: 'L', T: 1, h: 0 }), kinds)).toEqual({ value: once, changed: false });
    const moved = valueOf(upsertExplorerWith(raw, explorer('e1', { T: 7 }), kinds)) as typeof raw;
    expect(Object.keys(moved)).toEqual(['version', 'analyses', 'note', 'explorers']);
    expect(moved.explorers[0]).toEqual({ future: [1, 2], id: 'e1', coefficients: { a: 0.5, T0: 100, b: -2, c: 4, extra: true, d: 0 }, convention: 'no-fractions', T: 7, h: 0.01 });
    expect(moved.explorers.slice(1)).toEqual(['junk', { id: 'e2' }]);
    const read = readSavedExplorers(raw);
    expect(read.explorers.map(e => e.id)).toEqual(['e1']);
    expect(read.problems).toHaveLength(2);
  });

  // Case: an unknown convention reads as L; a blocked or newer block is never written.
  it('should read an unknown convention as L and leave unreadable blocks alone', () => {
    const raw = { version: 2, analyses: [], explorers: [{ id: 'x', coefficients: { a: 1, T0: 2, b: 3, c: 4 }, convention: 'future', T: 1, h: 0 }] };
    expect(readSavedExplorers(raw).explorers[0].convention).toBe('L');
    expect('blocked' in upsertExplorerWith({ version: 3, analyses: [] }, explorer('e'), kinds)).toBe(true);
    expect('blocked' in upsertExplorerWith({ version: 2, analyses: [], explorers: 'no' }, explorer('e'), kinds)).toBe(true);
    expect('blocked' in upsertExplorerWith(undefined, explorer('e', { T: Number.NaN }), kinds)).toBe(true);
    expect(readSavedExplorers({ version: 2, analyses: [], explorers: 'no' }).problems).toHaveLength(1);
  });

  // Case: analyses saved and removed beside explorers leave the explorers as they were.
  it('should keep the explorers when analyses are saved and removed', () => {
    const withExplorer = valueOf(upsertExplorerWith(undefined, explorer('e1'), kinds));
    const withBoth = valueOf(upsertSavedWith(withExplorer, entry('a1'), kinds));
    expect((withBoth as { explorers: unknown }).explorers).toEqual((withExplorer as { explorers: unknown }).explorers);
    expect(valueOf(removeSavedWith(withBoth, 'a1', kinds))).toEqual(withExplorer);
  });

  // Case: what psiscape writes, analyses and explorers together, validates against the published schema.
  it('should write blocks that validate against the schema file', () => {
    const validate = new Ajv({ allowUnionTypes: true }).compile(JSON.parse(fs.readFileSync(SCHEMA_FILE, 'utf8')));
    const value = valueOf(upsertSavedWith(valueOf(upsertExplorerWith(undefined, explorer('e1'), kinds)), entry('a1'), kinds));
    expect(validate(value), JSON.stringify(validate.errors)).toBe(true);
    expect(validate({ version: 2, analyses: [], explorers: [{ id: 'e', coefficients: { a: 1 }, convention: 'L', T: 1, h: 0 }] })).toBe(false);
  });

  // Case: over arbitrary stored explorers lists, saving a fresh explorer then removing it gives back the original.
  it('should give back the original after saving and removing a fresh explorer (2000 cases)', () => {
    const finite = fc.double({ noNaN: true, noDefaultInfinity: true }).map(v => (v === 0 ? 0 : v));
    const extras = fc.dictionary(fc.constantFrom('future', 'note', 'z', '__proto__'), fc.jsonValue({ maxDepth: 2 }), { maxKeys: 2 });
    const stored = fc.tuple(fc.string({ maxLength: 4 }), finite, finite, extras).map(([id, T, h, more]) => ({ ...more, id, coefficients: { a: 1, T0: 2, b: 3, c: 4 }, convention: 'L', T, h }));
    const listEntry = fc.oneof({ arbitrary: stored, weight: 3 }, { arbitrary: fc.jsonValue({ maxDepth: 2 }), weight: 1 });
    const block = fc
      .tuple(fc.array(listEntry, { minLength: 1, maxLength: 4 }), fc.array(fc.jsonValue({ maxDepth: 2 }), { maxLength: 2 }), fc.dictionary(fc.constantFrom('note', 'other'), fc.jsonValue({ maxDepth: 2 }), { maxKeys: 1 }))
      .map(([explorers, analyses, more]) => ({ ...more, version: 2, analyses, explorers }));
    const fresh = fc.tuple(finite, finite, finite).map(([a, T, h]) => explorer('fresh ☂', { coefficients: { a, T0: 1, b: 1, c: 1, d: 0 }, T, h }));
    fc.assert(
      fc.property(fc.oneof(block, fc.constant(undefined)), fresh, (raw, e) => {
        fc.pre(!JSON.stringify(raw ?? null).includes('fresh ☂'));
        const before = JSON.stringify(raw);
        const up = valueOf(upsertExplorerWith(raw, e, kinds));
        const back = readSavedExplorers(JSON.parse(JSON.stringify(up))).explorers.filter(x => x.id === e.id);
        expect(back).toEqual([e]);
        const removed = valueOf(removeExplorerWith(up, e.id, kinds));
        expect(jsonEqual(removed, raw)).toBe(true);
        expect(JSON.stringify(raw)).toBe(before);
      }),
      { numRuns: 2000 }
    );
  });
});
