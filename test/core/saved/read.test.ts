/**
 * Reading saved analyses: untrusted metadata, checked as a block and then
 * entry by entry; every problem is a message naming what was found, and
 * nothing is thrown. (The public `readSaved` is `readSavedWith` with the real
 * catalogue; catalogue.test.ts covers that pairing.)
 */
import { describe, expect, it } from 'vitest';
import { messageText } from '../../../src/core/messages';
import { readSavedWith } from '../../../src/core/saved/read';
import { upsertSavedWith } from '../../../src/core/saved/write';
import { entry, kinds } from './helpers';

const read = (v: unknown) => readSavedWith(v, kinds);
const texts = (v: unknown) => read(v).problems.map(messageText);

/** A stored (JSON) block holding the given entries, written by psiscape itself. */
function stored(...ids: string[]): { version: number; analyses: Record<string, unknown>[] } {
  let value: unknown = undefined;
  for (const id of ids) {
    const r = upsertSavedWith(value, entry(id), kinds);
    if ('blocked' in r) {
      throw new Error(messageText(r.blocked));
    }
    value = r.value;
  }
  return JSON.parse(JSON.stringify(value));
}

describe('readSaved: the block as a whole', () => {
  // Case: nothing saved yet — empty and writable.
  it.each([undefined, null])('should read %s as nothing saved, writable', value => {
    expect(read(value)).toEqual({ analyses: [], problems: [], writable: true, version: null, kept: 0 });
  });

  // Case: version written as text. Fails on the format 1 reader, which called "1" newer than it reads.
  it('should say that a version written as text is text, not newer', () => {
    const result = read({ version: '1', analyses: [] });
    expect(result.writable).toBe(false);
    expect(result.problems.map(p => p.code)).toEqual(['saved.block-version-text']);
    expect(messageText(result.problems[0])).toBe('the psiscape metadata has a version written as text ("1") instead of a number; psiscape leaves it as it is and saves nothing to it');
    expect(messageText(result.problems[0])).not.toMatch(/newer/);
  });

  // Case: newer version — nothing opened, not writable, and the message names the version.
  it('should leave a newer block alone and say which version it has', () => {
    const result = read({ version: 3, analyses: [stored('a').analyses[0]], futureKey: true });
    expect(result).toMatchObject({ analyses: [], writable: false, version: null });
    expect(texts({ version: 3, analyses: [] })).toEqual([
      'the psiscape metadata has version 3, newer than this psiscape reads (up to 2); psiscape leaves it as it is and saves nothing to it until psiscape is updated'
    ]);
    // A newer block may change the shape of "analyses" too: still reported as newer.
    expect(read({ version: 7, analyses: 'elsewhere' }).problems[0].code).toBe('saved.block-newer');
  });

  // Case: unreadable shapes — each named by what was found, none writable.
  it.each([
    ['written by hand', 'saved.block-not-record', 'the psiscape metadata of this notebook is "written by hand", not a record with a version and a list of analyses'],
    [[1, 2], 'saved.block-not-record', 'is [1,2], not a record'],
    [42, 'saved.block-not-record', 'is 42, not a record'],
    [{ analyses: [] }, 'saved.block-no-version', 'has no version'],
    [{ version: 0, analyses: [] }, 'saved.block-version-unknown', 'has version 0, which no psiscape writes'],
    [{ version: 1.5, analyses: [] }, 'saved.block-version-unknown', 'has version 1.5, which no psiscape writes'],
    [{ version: true, analyses: [] }, 'saved.block-version-unknown', 'has version true, which no psiscape writes'],
    [{ version: 2, analyses: { a: 1 } }, 'saved.block-no-list', 'the analyses in the psiscape metadata are {"a":1}, not a list'],
    [{ version: 2 }, 'saved.block-no-list', 'are nothing, not a list']
  ])('should not read %j', (value, code, words) => {
    const result = read(value);
    expect(result.writable).toBe(false);
    expect(result.analyses).toEqual([]);
    expect(result.problems.map(p => p.code)).toEqual([code]);
    expect(messageText(result.problems[0])).toContain(words);
  });
});

describe('readSaved: entries', () => {
  // Case: what was written reads back, ±∞ included (window null → ±∞, options as stored).
  it('should read back what psiscape wrote', () => {
    const result = read(stored('a', 'b'));
    expect(result.problems).toEqual([]);
    expect(result.version).toBe(2);
    expect(result.analyses.map(a => a.id)).toEqual(['a', 'b']);
    expect(result.analyses[0]).toEqual({ ...entry('a'), settings: { kind: 'weiss', options: { J: 'inf' }, window: { min: -Infinity, max: 300 } } });
  });

  // Case: bad entries are skipped, each named by position and id with its first failing field in plain words.
  // (The format 1 reader's cases, in format 2, plus the new fields.)
  it.each([
    [{ snapshot: { headers: ['T (K)', 'M (emu/g)'], units: ['K', 'emu/g'], values: [[1, 2], [3]] } }, 'saved analysis 2 (id "e"): the columns of its saved data do not all have the same length'],
    [{ snapshot: { headers: ['T (K)', 'M (emu/g)'], units: ['K', 'emu/g'], values: [[1, 2, 3], [1, 'x', 3]] } }, 'saved analysis 2 (id "e"): column 2 of its saved data is not a list of numbers (null for a missing value)'],
    [{ snapshot: { headers: ['T (K)'], units: ['K', 'emu/g'], values: [[1], [2]] } }, 'saved analysis 2 (id "e"): its saved data has 1 headers, 2 units and 2 columns, which do not match'],
    [{ settings: { kind: 'weiss', options: {}, window: { min: 'a', max: 1 } } }, 'saved analysis 2 (id "e"): its fit window is not a pair of numbers (null for an open end)'],
    [{ settings: { kind: 'weiss', options: {}, window: { min: 1 } } }, 'saved analysis 2 (id "e"): its fit window is not a pair of numbers (null for an open end)'],
    [{ settings: { kind: 'weiss', options: { J: [1] }, window: { min: 1, max: 2 } } }, 'saved analysis 2 (id "e"): its option "J" is not text, a number or true/false'],
    [{ settings: { kind: '', options: {}, window: { min: 1, max: 2 } } }, 'saved analysis 2 (id "e"): its analysis kind is not a name (text that is not empty)'],
    [{ settings: 'weiss' }, 'saved analysis 2 (id "e"): its analysis settings are neither null nor a kind with options and a fit window'],
    [{ columns: { x: 'T (K)', y: 'M (emu/g)', sigma: null } }, 'saved analysis 2 (id "e"): its x column is not a position (a whole number) with a header'],
    [{ columns: { x: { index: 0, header: 'T' }, y: { index: 1.5, header: 'M' }, sigma: null } }, 'saved analysis 2 (id "e"): its y column is not a position (a whole number) with a header'],
    [{ columns: { x: { index: 0, header: 'T' }, y: { index: 1, header: 'M' } } }, 'saved analysis 2 (id "e"): its σ column is neither null nor a position (a whole number) with a header'],
    [{ columns: [] }, 'saved analysis 2 (id "e"): its columns do not name an x column, a y column and a σ column (or null)'],
    [{ source: { notebookPath: 'n.ipynb' } }, 'saved analysis 2 (id "e"): its source does not name the notebook, cell id, output number and content hash of its table'],
    [{ source: { notebookPath: 'n.ipynb', cellId: 'c', outputIndex: -1, contentHash: 'h' } }, 'saved analysis 2 (id "e"): the output number of its source is not a whole number from 0'],
    [{ snapshot: { headers: ['T'], units: [null], rows: 3, hash: 'xyz', omitted: true } }, 'saved analysis 2 (id "e"): the hash of its saved data is not 16 hexadecimal digits'],
    [{ id: '' }, 'saved analysis 2 has no id (it must be text that is not empty)']
  ])('should skip bad entry %#, say why, and keep the others', (change, words) => {
    const block = stored('a', 'e', 'c');
    Object.assign(block.analyses[1], change);
    const result = read(block);
    expect(result.analyses.map(a => a.id)).toEqual(['a', 'c']);
    expect(result.problems.map(messageText)).toEqual([words]);
    expect(result.kept).toBe(1);
    expect(result.writable).toBe(true);
  });

  // Case: an entry that is not a record at all.
  it('should name an entry that is not a record by its position', () => {
    expect(texts({ version: 2, analyses: [stored('a').analyses[0], 'junk'] })).toEqual(['saved analysis 2 is not a record of named fields']);
  });

  // Case: unknown kind — kept, not opened, with a message naming the kind.
  it('should keep an entry of an unknown kind unopened and say so', () => {
    const block = stored('a', 'b');
    (block.analyses[1].settings as Record<string, unknown>).kind = 'foo';
    const result = read(block);
    expect(result.analyses.map(a => a.id)).toEqual(['a']);
    expect(result.problems.map(messageText)).toEqual(['saved analysis 2 (id "b") uses the analysis kind "foo", which this psiscape does not know; it is kept in the notebook unchanged']);
    expect(result.kept).toBe(1);
  });

  // Case: settings the kind refuses — kept, not opened; the kind's own message follows.
  it('should keep an entry whose settings its kind refuses, with the kind\'s reason', () => {
    const block = stored('a');
    (block.analyses[0].settings as { options: Record<string, unknown> }).options.J = 7;
    const result = read(block);
    expect(result.analyses).toEqual([]);
    expect(result.problems.map(p => p.code)).toEqual(['saved.entry-settings-unusable', 'test.bad-spin']);
    expect(messageText(result.problems[0])).toContain('saved analysis 1 (id "a") is kept in the notebook unchanged and not opened');
  });

  // Case: two readable entries with one id — the first opens, the second is kept.
  it('should open the first of two entries with one id and keep the second', () => {
    const block = stored('a', 'b');
    block.analyses.push({ ...block.analyses[0] });
    const result = read(block);
    expect(result.analyses.map(a => a.id)).toEqual(['a', 'b']);
    expect(result.problems.map(messageText)).toEqual(['saved analysis 3 (id "a") has the same id as saved analysis 1; it is kept in the notebook unchanged and not opened']);
  });

  // Case: the omitted snapshot of a large table is a readable entry (the restore needs the live source).
  it('should read an entry whose snapshot keeps only rows and hash', () => {
    const block = stored('a');
    block.analyses[0].snapshot = { headers: ['T (K)', 'M (emu/g)'], units: ['K', null], rows: 200000, hash: '0123456789abcdef', omitted: true, extra: 1 };
    const result = read(block);
    expect(result.problems).toEqual([]);
    expect(result.analyses[0].snapshot).toEqual({ headers: ['T (K)', 'M (emu/g)'], units: ['K', null], rows: 200000, hash: '0123456789abcdef', omitted: true });
    // …but not without its rows.
    delete (block.analyses[0].snapshot as Record<string, unknown>).rows;
    expect(texts(block)).toEqual(['saved analysis 1 (id "a"): the row count of its saved data is not a whole number from 0']);
  });

  // Case: unknown fields anywhere do not make an entry unreadable.
  it('should read entries with fields it does not know', () => {
    const block = stored('a') as Record<string, unknown> & { analyses: Record<string, unknown>[] };
    block.note = 'top level';
    const a = block.analyses[0] as Record<string, Record<string, unknown>>;
    a.comment = { text: 'by hand' } as never;
    a.source.extra = 1;
    (a.columns.x as Record<string, unknown>).note = 'x';
    a.settings.future = { deep: [1] };
    (a.settings.options as Record<string, unknown>).futureOption = 'inf';
    expect(read(block).problems).toEqual([]);
    expect(read(block).analyses).toHaveLength(1);
  });

  // Case: never throws — even when the catalogue throws, a message comes back.
  it('should report instead of throwing when something fails inside', () => {
    const throwing = { ...kinds, isKnownKind: () => { throw new Error('catalogue broken'); } };
    const result = readSavedWith(stored('a'), throwing);
    expect(result.writable).toBe(false);
    expect(result.problems.map(p => p.code)).toEqual(['saved.read-failed']);
    expect(messageText(result.problems[0])).toContain('catalogue broken');
  });
});
