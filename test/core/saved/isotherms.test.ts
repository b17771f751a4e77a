/**
 * The isotherm analysis saved with an entry: written and read back as typed
 * (text controls, null when blank), validated by the published schema,
 * fields a newer writer added inside it kept, a malformed one refused with
 * the entry kept unchanged; the session saves it once per change.
 */
import fs from 'node:fs';
import path from 'node:path';
import Ajv from 'ajv';
import { describe, expect, it } from 'vitest';
import { readSavedWith } from '../../../src/core/saved/read';
import { upsertSavedWith } from '../../../src/core/saved/write';
import type { ISavedIsotherms } from '../../../src/core/saved/types';
import { AnalysisSession } from '../../../src/core/analysis/session';
import { parseMime } from '../../../src/core/table';
import { entry, kinds } from './helpers';

const SCHEMA_FILE = path.resolve(__dirname, '..', '..', '..', 'schema', 'saved-analyses.v2.json');

const isotherms: ISavedIsotherms = {
  columns: { temperature: { index: 1, header: 'T (K)' }, field: { index: 2, header: 'H (Oe)' }, magnetisation: { index: 3, header: 'M (emu/g)' } },
  units: { temperature: null, field: 'kOe', magnetisation: null },
  demagnetisingFactorSI: '0.2',
  temperatureToleranceK: null,
  sampleMassMg: '12.5',
  densityGPerCm3: 'seven'
};

const valueOf = (r: ReturnType<typeof upsertSavedWith>): Record<string, unknown> => {
  if ('blocked' in r) {
    throw new Error(r.blocked.text);
  }
  return r.value as Record<string, unknown>;
};

describe('saved isotherm analysis', () => {
  it('should write the controls as typed (a refused value included) and read them back', () => {
    const value = valueOf(upsertSavedWith(undefined, entry('a', { isotherms }), kinds));
    const read = readSavedWith(value, kinds);
    expect(read.problems).toEqual([]);
    expect(read.analyses[0].isotherms).toEqual(isotherms);
    const validate = new Ajv({ allowUnionTypes: true }).compile(JSON.parse(fs.readFileSync(SCHEMA_FILE, 'utf8')));
    expect(validate(value)).toBe(true);
  });

  it('should write and read back the later controls (N_d convention and shape, field range, window, bootstrap, view)', () => {
    const later: ISavedIsotherms = {
      ...isotherms,
      demagnetisingFactorSI: null,
      demagnetisingConvention: 'cgs',
      demagnetisingFactorCgs: '2.51',
      sampleShape: 'custom',
      fieldMin: '500',
      fieldMax: null,
      tMax: '0.05',
      bootstrapSamples: '',
      view: 'critical'
    };
    const value = valueOf(upsertSavedWith(undefined, entry('a', { isotherms: later }), kinds));
    const validate = new Ajv({ allowUnionTypes: true }).compile(JSON.parse(fs.readFileSync(SCHEMA_FILE, 'utf8')));
    expect(validate(value)).toBe(true);
    expect(readSavedWith(value, kinds).analyses[0].isotherms).toEqual(later);
    // An older file (without the later fields) still reads, with none of them invented.
    expect(readSavedWith(valueOf(upsertSavedWith(undefined, entry('b', { isotherms }), kinds)), kinds).analyses[0].isotherms).toEqual(isotherms);
    // A convention that is neither SI nor cgs is refused by the schema, and the entry is reported.
    ((value.analyses as Record<string, unknown>[])[0].isotherms as Record<string, unknown>).demagnetisingConvention = 'Gaussian';
    expect(readSavedWith(value, kinds).problems).toHaveLength(1);
  });

  it('should keep fields a newer writer put inside the isotherm analysis', () => {
    const value = valueOf(upsertSavedWith(undefined, entry('a', { isotherms }), kinds));
    const stored = (value.analyses as Record<string, unknown>[])[0];
    (stored.isotherms as Record<string, unknown>).fieldRange = { min: 100, max: 50000 };
    const again = valueOf(upsertSavedWith(value, { ...entry('a', { isotherms: { ...isotherms, demagnetisingFactorSI: '0.3' } }) }, kinds));
    const iso = (again.analyses as Record<string, unknown>[])[0].isotherms as Record<string, unknown>;
    expect(iso.fieldRange).toEqual({ min: 100, max: 50000 });
    expect(iso.demagnetisingFactorSI).toBe('0.3');
  });

  it('should refuse an entry whose isotherm analysis has the wrong types, and keep it unchanged', () => {
    const value = valueOf(upsertSavedWith(undefined, entry('a', { isotherms }), kinds));
    const stored = (value.analyses as Record<string, unknown>[])[0];
    stored.isotherms = { columns: 'T, H, M', units: [], demagnetisingFactorSI: 0.2 };
    const read = readSavedWith(value, kinds);
    expect(read.analyses).toEqual([]);
    expect(read.problems).toHaveLength(1);
    const after = valueOf(upsertSavedWith(value, entry('b'), kinds));
    expect((after.analyses as Record<string, unknown>[])[0]).toEqual(stored);
  });

  it('should be saved by the session once per change, and restored with the entry', async () => {
    const session = new AnalysisSession({ id: 's1', source: { notebookPath: 'n.ipynb', cellId: 'c', outputIndex: 0, contentHash: 'h' } });
    session.setParse(parseMime('text/csv', 'T (K),H (Oe),M (emu/g)\n280,100,1\n280,200,2\n290,100,0.5\n290,200,1.1'));
    const saves: unknown[] = [];
    session.saveRequested.connect((_, e) => saves.push(e));
    session.setIsotherms(isotherms);
    session.setIsotherms(structuredClone(isotherms));
    session.flush();
    expect(saves).toHaveLength(1);
    expect((saves[0] as { isotherms: unknown }).isotherms).toEqual(isotherms);
    const restored = new AnalysisSession({ id: 's1', source: null });
    restored.restore(session.toSaved()!, null, { code: 'n', text: 'n', args: [] });
    expect(restored.isotherms).toEqual(isotherms);
    session.dispose();
    restored.dispose();
  });
});
