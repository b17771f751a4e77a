/**
 * Format 1 → format 2, on the entries the format 1 writer produced (the
 * fixtures of the format 1 tests): headers become `{ index: -1, header }`,
 * `fit` becomes `settings` in its place, the expression model's start values
 * move into its options, fields format 1 did not know stay.
 */
import { describe, expect, it } from 'vitest';
import { messageText } from '../../../src/core/messages';
import { migrateV1Block, migrateV1Entry } from '../../../src/core/saved/migrate';
import { readSavedWith } from '../../../src/core/saved/read';
import { kinds, v1Block, v1Entry } from './helpers';

describe('format 1 migration', () => {
  // Case: the format 1 test fixture (a Weiss fit with J = ∞ and an open lower window end).
  it('should migrate the format 1 fixture and open it', () => {
    const result = readSavedWith(v1Block(v1Entry('a1')), kinds);
    expect(result.problems).toEqual([]);
    expect(result.version).toBe(1);
    expect(result.writable).toBe(true);
    expect(result.analyses).toEqual([
      {
        id: 'a1',
        source: { notebookPath: 'n.ipynb', cellId: 'c-1', outputIndex: 0, contentHash: '0123456789abcdef' },
        columns: { x: { index: -1, header: 'T (K)' }, y: { index: -1, header: 'M (emu/g)' }, sigma: null },
        snapshot: { headers: ['T (K)', 'M (emu/g)'], units: ['K', 'emu/g'], values: [[1, 2, 3], [9, null, 7]] },
        // Format 1 wrote every model's options for every model; a Weiss fit keeps its J.
        settings: { kind: 'weiss', options: { J: 'inf' }, window: { min: -Infinity, max: 300 } }
      }
    ]);
  });

  // Case: the analyses the format 1 panel saved (test/plugins/saved.test.ts): a power law, and an analysis never fitted.
  it('should migrate a power-law fit and an analysis without a fit', () => {
    const powerLaw = v1Entry('p', { model: 'power-law', options: { J: 0.5, proxyPower: null, background: true, units: 'cgs-emu', expression: '' }, window: { min: 120, max: null }, starts: '' });
    const unfitted = { ...v1Entry('u'), fit: null };
    const { analyses, problems } = readSavedWith(v1Block(powerLaw, unfitted), kinds);
    expect(problems).toEqual([]);
    expect(analyses[0].settings).toEqual({ kind: 'power-law', options: { background: true }, window: { min: 120, max: Infinity } });
    expect(analyses[1].settings).toBeNull();
  });

  // Case: the expression model's start values move into options.starts.
  it('should move the start values of an expression fit into its options', () => {
    const expression = v1Entry('e', { model: 'expression', options: { J: 0.5, proxyPower: 1, background: false, units: 'SI', expression: 'A*exp(-x/T0)' }, window: { min: null, max: null }, starts: 'A = 1, T0 = 100' });
    const [migrated] = readSavedWith(v1Block(expression), kinds).analyses;
    expect(migrated.settings!.options).toEqual({ expression: 'A*exp(-x/T0)', starts: 'A = 1, T0 = 100' });
  });

  // Case: fields format 1 did not know stay, in place; `settings` takes the place of `fit`.
  it('should keep unknown fields in their order and put settings where fit was', () => {
    const raw: Record<string, unknown> = { comment: 'hand', ...v1Entry('a1'), after: 1 };
    (raw.fit as Record<string, unknown>).note = 'fit note';
    (raw.columns as Record<string, unknown>).extra = true;
    const migrated = migrateV1Entry(raw, kinds) as Record<string, Record<string, unknown>>;
    expect(Object.keys(migrated)).toEqual(['comment', 'id', 'source', 'columns', 'snapshot', 'settings', 'after']);
    expect(Object.keys(migrated.settings)).toEqual(['kind', 'options', 'window', 'note']);
    expect(migrated.columns.extra).toBe(true);
    // An entry without a fit field gets settings: null at its end.
    const noFit: Record<string, unknown> = v1Entry('n');
    delete noFit.fit;
    expect((migrateV1Entry(noFit, kinds) as Record<string, unknown>).settings).toBeNull();
  });

  // Case: an unknown model becomes an unknown kind (kept, with all its options); a shape migration cannot handle is kept verbatim.
  it('should keep format 1 entries it cannot open, saying why', () => {
    const magic = v1Entry('m', { model: 'magic', options: { depth: 2 }, window: { min: null, max: null }, starts: '' });
    const broken = { ...v1Entry('b'), columns: { x: 3, y: 'M', sigma: null } };
    const raw = v1Block(v1Entry('a1'), magic, broken);
    const result = readSavedWith(raw, kinds);
    expect(result.analyses.map(a => a.id)).toEqual(['a1']);
    expect(result.problems.map(messageText)).toEqual([
      'saved analysis 2 (id "m") uses the analysis kind "magic", which this psiscape does not know; it is kept in the notebook unchanged',
      'saved analysis 3 (id "b") (format 1) does not name its x and y columns by header, and its σ column by header or null'
    ]);
    expect(readSavedWith(v1Block({ ...v1Entry('f'), fit: 'weiss' }), kinds).problems.map(p => p.code)).toEqual(['saved.v1-fit']);
    const block = migrateV1Block(raw as unknown as Record<string, unknown>, kinds) as { version: number; analyses: Record<string, unknown>[] };
    expect(block.version).toBe(2);
    expect(block.analyses[1].settings).toEqual({ kind: 'magic', options: { depth: 2 }, window: { min: null, max: null } });
    expect(block.analyses[2]).toBe(broken);
  });
});
