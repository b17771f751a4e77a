/**
 * The schema file other tools read: the same object psiscape validates with,
 * a valid draft-07 schema, and what psiscape writes matches it.
 */
import fs from 'node:fs';
import path from 'node:path';
import Ajv from 'ajv';
import { describe, expect, it } from 'vitest';
import { SAVED_SCHEMA } from '../../../src/core/saved/schema';
import { SNAPSHOT_CELL_LIMIT } from '../../../src/core/saved/types';
import { upsertSavedWith } from '../../../src/core/saved/write';
import { entry, kinds } from './helpers';

/** Where the schema is published (README "Saved format"). */
const SCHEMA_FILE = path.resolve(__dirname, '..', '..', '..', 'schema', 'saved-analyses.v2.json');

describe('saved-analyses.v2.json', () => {
  const file = JSON.parse(fs.readFileSync(SCHEMA_FILE, 'utf8'));

  // Case: the published file is the schema psiscape validates with.
  it('should equal the schema in src/core/saved/schema.ts', () => {
    expect(file).toEqual(JSON.parse(JSON.stringify(SAVED_SCHEMA)));
  });

  // Case: the documented size cap is the one the writer uses.
  it('should state the snapshot cell limit the writer uses', () => {
    expect(file.definitions.analysis.properties.snapshot.description).toContain(`above ${SNAPSHOT_CELL_LIMIT} cells`);
  });

  // Case: a whole block psiscape writes (small and omitted snapshots, ±∞, no settings) validates against the file with a plain draft-07 validator.
  it('should accept what psiscape writes and refuse a block of another version', () => {
    const validate = new Ajv({ allowUnionTypes: true }).compile(file);
    let value: unknown = undefined;
    const big = Array.from({ length: SNAPSHOT_CELL_LIMIT }, (_, i) => i);
    for (const e of [
      entry('a'),
      entry('b', { settings: null }),
      entry('c', { snapshot: { headers: ['T', 'M'], units: [null, null], values: [big, big] } })
    ]) {
      const r = upsertSavedWith(value, e, kinds);
      value = 'value' in r ? r.value : r;
    }
    expect(validate(JSON.parse(JSON.stringify(value))), JSON.stringify(validate.errors)).toBe(true);
    expect(validate({ ...(value as object), version: 3 })).toBe(false);
    expect(validate({ version: 2, analyses: [{ ...(value as { analyses: object[] }).analyses[0], comment: 'extra fields are allowed' }] })).toBe(true);
  });
});
