/**
 * Writing saved analyses without losing anything: the new metadata value is
 * built from the raw one; what this version cannot read, and fields it does
 * not know, stay in place; nothing is written when nothing changed; blocks it
 * must not touch are never written or removed.
 */
import { describe, expect, it } from 'vitest';
import { messageText } from '../../../src/core/messages';
import { readSavedWith } from '../../../src/core/saved/read';
import { hashSnapshotValues } from '../../../src/core/saved/snapshot';
import { SNAPSHOT_CELL_LIMIT } from '../../../src/core/saved/types';
import type { ISavedAnalysis, ISavedSnapshotValues } from '../../../src/core/saved/types';
import { removeSavedWith, upsertSavedWith } from '../../../src/core/saved/write';
import { entry, kinds, text, v1Entry } from './helpers';

const upsert = (raw: unknown, e: ISavedAnalysis) => upsertSavedWith(raw, e, kinds);
const remove = (raw: unknown, id: string) => removeSavedWith(raw, id, kinds);

/** The value of a write that must succeed, as stored (through JSON, as a notebook stores it). */
function written(result: ReturnType<typeof upsert>): Record<string, unknown> & { analyses: Record<string, unknown>[] } {
  if ('blocked' in result) {
    throw new Error(messageText(result.blocked));
  }
  return JSON.parse(JSON.stringify(result.value));
}

function block(...ids: string[]) {
  let value: unknown = undefined;
  for (const id of ids) {
    value = written(upsert(value, entry(id)));
  }
  return value as Record<string, unknown> & { analyses: Record<string, unknown>[] };
}

describe('upsertSaved / removeSaved', () => {
  // Case: unreadable or newer blocks survive remove and upsert byte for byte.
  // Fails on the format 1 code: removeAnalysis wrote the readable analyses it found (none) and so deleted the block.
  it.each([
    ['written by hand'],
    [[{ id: 'a' }]],
    [{ version: 3, analyses: [{ id: 'a', anything: true }], future: { x: 1 } }],
    [{ version: '1', analyses: [] }],
    [{ version: 2, analyses: 'not a list' }],
    [{ analyses: [] }]
  ])('should never write to or remove %j', raw => {
    const before = text(raw);
    const up = upsert(raw, entry('a'));
    const rm = remove(raw, 'a');
    expect('blocked' in up && 'blocked' in rm).toBe(true);
    expect('blocked' in up && up.blocked.code).toBe(readSavedWith(raw, kinds).problems[0].code);
    expect(text(raw)).toBe(before);
  });

  // Case: an entry of an unknown kind survives a save of its neighbour, verbatim and in place.
  // Fails on the format 1 code, which dropped entries it could not read once a neighbour was saved.
  it('should keep an entry of an unknown kind verbatim and in place when its neighbour is saved', () => {
    const raw = block('a', 'b', 'c');
    raw.analyses[1] = { ...raw.analyses[1], settings: { kind: 'future-kind', options: { depth: 3 }, window: { min: null, max: null }, extra: [1] } };
    raw.analyses.splice(2, 0, { id: 'broken', whatever: true });
    const before = text(raw.analyses[1]);
    const changed = written(upsert(raw, entry('c', { settings: { kind: 'weiss', options: { J: 1 }, window: { min: 10, max: 20 } } })));
    expect(changed.analyses.map(a => a.id)).toEqual(['a', 'b', 'broken', 'c']);
    expect(text(changed.analyses[1])).toBe(before);
    expect(changed.analyses[2]).toEqual({ id: 'broken', whatever: true });
    // Removing a neighbour keeps them too.
    const removed = written(remove(changed, 'a'));
    expect(removed.analyses.map(a => a.id)).toEqual(['b', 'broken', 'c']);
    expect(text(removed.analyses[0])).toBe(before);
  });

  // Case: unknown fields (comment, future options, extra top-level keys, nested extras) survive an update, in their order.
  // Fails on the format 1 code, which rebuilt the block from its own types.
  it('should keep fields it does not know, in their order, when it updates an entry', () => {
    const raw = block('a', 'b');
    const withExtras = {
      comment: 'checked by hand',
      ...raw.analyses[0],
      source: { ...(raw.analyses[0].source as object), extra: 1 },
      columns: { x: { note: 'first', index: 0, header: 'T (K)' }, y: { index: 1, header: 'M (emu/g)' }, sigma: null, groups: ['a'] },
      snapshot: { ...(raw.analyses[0].snapshot as object), provenance: 'instrument 2' },
      settings: { kind: 'weiss', options: { futureOption: 'inf', J: 'inf' }, window: { min: null, max: 300, scale: 'log' }, future: { deep: [1, 2] } }
    };
    const stored = { before: true, version: 2, analyses: [withExtras, raw.analyses[1]], after: { by: 'a newer psiscape' } };
    const next = written(upsert(stored, entry('a', { settings: { kind: 'weiss', options: { J: 1 }, window: { min: 5, max: Infinity } } })));
    expect(Object.keys(next)).toEqual(['before', 'version', 'analyses', 'after']);
    expect(next.after).toEqual({ by: 'a newer psiscape' });
    const a = next.analyses[0] as Record<string, Record<string, unknown>>;
    expect(Object.keys(a)).toEqual(Object.keys(withExtras));
    expect(a.comment).toBe('checked by hand');
    expect(a.source.extra).toBe(1);
    expect(a.columns).toEqual({ x: { note: 'first', index: 0, header: 'T (K)' }, y: { index: 1, header: 'M (emu/g)' }, sigma: null, groups: ['a'] });
    expect(a.snapshot.provenance).toBe('instrument 2');
    expect(a.settings).toEqual({ kind: 'weiss', options: { futureOption: 'inf', J: 1 }, window: { min: 5, max: null, scale: 'log' }, future: { deep: [1, 2] } });
    expect(Object.keys(a.settings.options as object)).toEqual(['futureOption', 'J']);
    expect(next.analyses[1]).toEqual(raw.analyses[1]);
  });

  // Case: options of the kind that the new settings leave out are dropped; a change of kind replaces the options.
  it('should drop known options the new settings leave out, and replace options when the kind changes', () => {
    const raw = block('a');
    (raw.analyses[0].settings as Record<string, unknown>) = { kind: 'power-law', options: { proxyPower: 2, background: true, futureOption: 1 }, window: { min: null, max: null } };
    const same = written(upsert(raw, entry('a', { settings: { kind: 'power-law', options: { proxyPower: 1 }, window: { min: -Infinity, max: Infinity } } })));
    expect((same.analyses[0].settings as { options: unknown }).options).toEqual({ proxyPower: 1, futureOption: 1 });
    const other = written(upsert(raw, entry('a', { settings: { kind: 'expression', options: { expression: 'a*x', starts: 'a = 1' }, window: { min: 1, max: 2 } } })));
    expect((other.analyses[0].settings as { options: unknown }).options).toEqual({ expression: 'a*x', starts: 'a = 1' });
  });

  // Case: nothing changed (key order aside) — changed false and the raw value itself, so nothing is written.
  it('should report no change when the entry is already saved, whatever the key order', () => {
    const raw = block('a', 'b');
    const reordered = { analyses: raw.analyses.map(e => Object.fromEntries(Object.entries(e).reverse())), version: 2 };
    const result = upsert(reordered, entry('b'));
    expect(result).toEqual({ value: reordered, changed: false });
    expect('value' in result && result.value).toBe(reordered);
    expect(remove(reordered, 'missing')).toEqual({ value: reordered, changed: false });
    expect(upsert(reordered, entry('b', { settings: null }))).toMatchObject({ changed: true });
  });

  // Case: format 1 blocks become format 2 only when a change is written.
  it('should leave a format 1 block as it is until something changes, then write format 2', () => {
    const raw = { version: 1, analyses: [v1Entry('a1'), { id: 'junk' }], note: 'kept' };
    const migrated = readSavedWith(raw, kinds).analyses[0];
    expect(upsert(raw, migrated)).toEqual({ value: raw, changed: false });
    expect(remove(raw, 'nope')).toEqual({ value: raw, changed: false });
    const next = written(upsert(raw, { ...migrated, settings: { ...migrated.settings!, window: { min: 10, max: 300 } } }));
    expect(next.version).toBe(2);
    expect(next.note).toBe('kept');
    expect(next.analyses[1]).toEqual({ id: 'junk' });
    expect(next.analyses[0].columns).toEqual({ x: { index: -1, header: 'T (K)' }, y: { index: -1, header: 'M (emu/g)' }, sigma: null });
    expect(readSavedWith(next, kinds).analyses[0].settings!.window).toEqual({ min: 10, max: 300 });
  });

  // Case: duplicate headers T, M, M, S — columns saved by position and header keep both positions.
  // Fails on the format 1 code, which saved headers only (both "M" columns became the first).
  it.each([
    [{ index: 2, header: 'M' }, { index: 1, header: 'M' }, { index: 3, header: 'S' }],
    [{ index: 2, header: 'M' }, { index: 3, header: 'M' }, null]
  ])('should round-trip columns x %j and y %j by position', (x, y, sigma) => {
    const e = entry('dup', {
      columns: { x, y, sigma },
      snapshot: { headers: ['M', 'M', ...(sigma ? ['S'] : [])], units: [null, null, ...(sigma ? [null] : [])], values: [[1, 2], [3, 4], ...(sigma ? [[0.1, 0.1]] : [])] }
    });
    const back = readSavedWith(written(upsert(undefined, e)), kinds).analyses[0];
    expect(back.columns).toEqual({ x, y, sigma });
  });

  // Case: JSON has no ±∞: windows store them as null, options as "inf" / "-inf"; NaN is refused, not written.
  it('should store ±∞ as JSON can hold them and refuse NaN', () => {
    const next = written(upsert(undefined, entry('a', { settings: { kind: 'power-law', options: { proxyPower: -Infinity, background: false }, window: { min: -Infinity, max: Infinity } } })));
    expect(next.analyses[0].settings).toEqual({ kind: 'power-law', options: { proxyPower: '-inf', background: false }, window: { min: null, max: null } });
    // null is the open end, so NaN and the other infinity (an empty window) cannot be written.
    for (const window of [{ min: Number.NaN, max: 1 }, { min: 0, max: -Infinity }, { min: Infinity, max: 2 }]) {
      const refused = upsert(undefined, entry('a', { settings: { kind: 'weiss', options: { J: 1 }, window } }));
      expect('blocked' in refused && refused.blocked.code).toBe('saved.write-invalid');
    }
    const nanOption = upsert(undefined, entry('a', { settings: { kind: 'power-law', options: { proxyPower: Number.NaN }, window: { min: 1, max: 2 } } }));
    expect('blocked' in nanOption && messageText(nanOption.blocked)).toContain('its option "proxyPower" is not a number');
  });

  // Case: psiscape never writes what it could not read back (unknown kind, bad option, bad columns).
  it.each([
    [{ settings: { kind: 'nope', options: {}, window: { min: 1, max: 2 } } }],
    [{ settings: { kind: 'weiss', options: { J: 7 }, window: { min: 1, max: 2 } } }],
    [{ columns: { x: { index: 0.5, header: 'T' }, y: { index: 1, header: 'M' }, sigma: null } }]
  ])('should refuse to write an entry it could not read back (%#)', over => {
    const raw = block('a');
    const result = upsert(raw, entry('a', over as Partial<ISavedAnalysis>));
    expect('blocked' in result && result.blocked.code).toBe('saved.write-invalid');
  });

  // Case: an entry with this id that cannot be read is not written over.
  it('should not save over an unreadable entry with the same id', () => {
    const raw = block('a');
    raw.analyses[0].snapshot = 'lost';
    const result = upsert(raw, entry('a'));
    expect('blocked' in result && messageText(result.blocked)).toBe(
      'saved analysis 1 (id "a") has the id of this analysis but cannot be read; psiscape keeps it unchanged and did not save this analysis over it'
    );
    expect(remove(raw, 'a')).toEqual({ value: raw, changed: false });
  });

  // Case: removing the last readable analysis keeps unknown entries and top-level keys; with nothing else left the key goes.
  it('should remove only the readable entry, and delete the key only when nothing else is in it', () => {
    const raw = block('a');
    expect(remove(raw, 'a')).toEqual({ value: undefined, changed: true });
    const withUnknown = { ...raw, analyses: [...raw.analyses, { id: 'x', settings: { kind: 'future' } }] };
    expect(written(remove(withUnknown, 'a'))).toEqual({ version: 2, analyses: [{ id: 'x', settings: { kind: 'future' } }] });
    const withKey = { ...raw, owner: 'lab' };
    expect(written(remove(withKey, 'a'))).toEqual({ version: 2, analyses: [], owner: 'lab' });
  });
});

describe('large tables', () => {
  const rows = 200_000;
  const big = (id: string) => {
    const T = new Float64Array(rows).map((_, i) => 2 + i * 1e-3);
    const M = T.map(t => (t < 150 ? Math.sqrt(1 - t / 150) : 0));
    M[7] = Number.NaN;
    return entry(id, {
      columns: { x: { index: 0, header: 'T' }, y: { index: 1, header: 'M' }, sigma: null },
      snapshot: { headers: ['T', 'M'], units: ['K', null], values: [Array.from(T), Array.from(M, v => (Number.isFinite(v) ? v : null))] }
    });
  };

  // Case: above the cap the snapshot keeps a reference and a hash, not the values; the reader accepts it.
  it(`should store rows and a hash instead of values above ${SNAPSHOT_CELL_LIMIT} cells`, () => {
    const e = big('big');
    const next = written(upsert(undefined, e));
    expect(next.analyses[0].snapshot).toEqual({ headers: ['T', 'M'], units: ['K', null], rows, hash: hashSnapshotValues((e.snapshot as ISavedSnapshotValues).values), omitted: true });
    expect(text(next).length).toBeLessThan(1000);
    const back = readSavedWith(next, kinds);
    expect(back.problems).toEqual([]);
    expect(back.analyses[0].snapshot).toMatchObject({ rows, omitted: true });
    // Saving it again with other settings: unchanged neighbours are the same objects (not copied), the snapshot stays small.
    const two = written(upsert(next, entry('small')));
    const result = upsert(two, { ...e, settings: { kind: 'weiss', options: { J: 1 }, window: { min: 1, max: 2 } } });
    expect('value' in result && (result.value as typeof two).analyses[1]).toBe(two.analyses[1]);
    expect(upsert(two, e)).toEqual({ value: two, changed: false });
  });

  // Case: a large snapshot stored with its values (format 1, or shown from its copy) keeps them while the data is the same.
  it('should keep stored values of a large snapshot while the data is the same', () => {
    const e = big('big');
    const values = (e.snapshot as { values: (number | null)[][] }).values;
    const stored = { version: 2, analyses: [{ ...written(upsert(undefined, e)).analyses[0], snapshot: { headers: ['T', 'M'], units: ['K', null], values } }] };
    expect(upsert(stored, e)).toEqual({ value: stored, changed: false });
    const moved = upsert(stored, { ...e, settings: null });
    expect('value' in moved && ((moved.value as typeof stored).analyses[0].snapshot as { values: unknown }).values).toBe(values);
  });

  // Case: the hash is the documented one (FNV-1a over the little-endian bytes, missing = 0x7ff8000000000000), so other tools can compute it.
  it('should hash as the schema documents, live typed arrays like saved lists', () => {
    const reference = (columns: (number | null)[][]) => {
      let h1 = 2166136261;
      let h2 = 84696351;
      const buf = Buffer.alloc(8);
      for (const c of columns) {
        for (const v of c) {
          if (v === null || !Number.isFinite(v)) {
            buf.writeBigUInt64LE(0x7ff8000000000000n);
          } else {
            buf.writeDoubleLE(v);
          }
          for (const b of buf) {
            h1 = Number((BigInt((h1 ^ b) >>> 0) * 16777619n) % 4294967296n);
            h2 = Number((BigInt((h2 ^ b) >>> 0) * 16777619n) % 4294967296n);
          }
        }
      }
      return h1.toString(16).padStart(8, '0') + h2.toString(16).padStart(8, '0');
    };
    const columns = [[1, -0.5, null, 1e300], [Number.NaN, 3, Infinity, 0]];
    expect(hashSnapshotValues(columns)).toBe(reference(columns));
    expect(hashSnapshotValues([Float64Array.from([1, -0.5, Number.NaN, 1e300]), Float64Array.from([Number.NaN, 3, Infinity, 0])])).toBe(reference(columns));
    expect(hashSnapshotValues([[1, 2]])).not.toBe(hashSnapshotValues([[2, 1]]));
  });
});
