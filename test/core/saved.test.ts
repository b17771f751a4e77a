/**
 * Saved analyses read from notebook metadata: untrusted input, validated entry
 * by entry; infinities survive the JSON round trip.
 */
import { describe, expect, it } from 'vitest';
import { readSavedAnalyses, SAVED_VERSION, toJsonSafe } from '../../src/core/saved';
import type { ISavedAnalysis } from '../../src/core/saved';

const good: ISavedAnalysis = {
  id: 'a1',
  source: { notebookPath: 'n.ipynb', cellId: 'c-1', outputIndex: 0, contentHash: '0123456789abcdef' },
  columns: { x: 'T (K)', y: 'M (emu/g)', sigma: null },
  snapshot: { headers: ['T (K)', 'M (emu/g)'], units: ['K', 'emu/g'], values: [[1, 2, 3], [9, Number.NaN, 7]] },
  fit: { model: 'weiss', options: { J: Infinity }, window: { min: -Infinity, max: 300 }, starts: '' }
};

describe('readSavedAnalyses', () => {
  it('should round-trip through JSON, keeping infinities and turning NaN into missing values', () => {
    const stored = JSON.parse(JSON.stringify(toJsonSafe({ version: SAVED_VERSION, analyses: [good] })));
    const { analyses, problems } = readSavedAnalyses(stored);
    expect(problems).toEqual([]);
    expect(analyses[0].fit).toEqual({ model: 'weiss', options: { J: Infinity, proxyPower: undefined, background: undefined, units: undefined, expression: undefined }, window: { min: -Infinity, max: 300 }, starts: '' });
    expect(analyses[0].snapshot.values).toEqual([[1, 2, 3], [9, null, 7]]);
  });

  it('should skip a bad entry, say which, and keep the others', () => {
    const stored = toJsonSafe({ version: 1, analyses: [good] }) as { analyses: unknown[] };
    stored.analyses.push({ id: 'b', source: { notebookPath: 'n.ipynb' } }, 'junk');
    const { analyses, problems } = readSavedAnalyses(stored);
    expect(analyses.map(a => a.id)).toEqual(['a1']);
    expect(problems).toEqual([
      'saved analysis 2 has an unreadable source (notebook path, cell id, output index, content hash)',
      'saved analysis 3 is not an object'
    ]);
  });

  it.each([
    [{ ...good, snapshot: { ...good.snapshot, values: [[1, 2], [3]] } }, 'saved analysis 1: snapshot column "M (emu/g)" is not a list of 2 numbers'],
    [{ ...good, snapshot: { ...good.snapshot, values: [[1, 2, 3], [1, 'x', 3]] } }, 'saved analysis 1: snapshot column "M (emu/g)" is not a list of 3 numbers'],
    [{ ...good, fit: { ...good.fit, model: 'magic' } }, 'saved analysis 1 has unreadable fit settings'],
    [{ ...good, fit: { ...good.fit!, window: { min: 'a', max: 1 } } }, 'saved analysis 1 has an unreadable fit window'],
    [{ ...good, columns: { x: 'T' } }, 'saved analysis 1 does not name its x and y columns'],
    [{ ...good, id: '' }, 'saved analysis 1 has no id']
  ])('should refuse entry %#', (entry, message) => {
    expect(readSavedAnalyses(toJsonSafe({ version: 1, analyses: [entry as ISavedAnalysis] })).problems).toEqual([message]);
  });

  it('should leave unreadable or newer metadata alone', () => {
    expect(readSavedAnalyses(undefined)).toEqual({ analyses: [], problems: [] });
    expect(readSavedAnalyses('text').problems[0]).toMatch(/not readable/);
    expect(readSavedAnalyses({ version: 99, analyses: [] }).problems[0]).toMatch(/version 99, newer than this psiscape reads/);
  });
});
