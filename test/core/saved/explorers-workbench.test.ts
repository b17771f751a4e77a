/**
 * The workbench fields of a saved explorer (all optional): the preset and
 * its parameters, a typed free energy with its coefficients, the coupled
 * landscape's coefficients and the chart tab. Older entries without them
 * still read; malformed ones are left out on reading and kept in the
 * notebook; what is written validates against the published schema.
 */
import fs from 'node:fs';
import path from 'node:path';
import Ajv from 'ajv';
import { describe, expect, it } from 'vitest';
import { OVERLAY_LIMITS, overlayColumns, overlayRows, readSavedExplorers, upsertExplorerWith } from '../../../src/core/saved/explorers';
import type { ISavedExplorer } from '../../../src/core/saved/explorers';
import { kinds } from './helpers';

const SCHEMA_FILE = path.resolve(__dirname, '..', '..', '..', 'schema', 'saved-analyses.v2.json');

const base: ISavedExplorer = { id: 'w1', coefficients: { a: 0.5, T0: 100, b: -2, c: 4, d: 0 }, convention: 'L', T: 100.25, h: 0.01 };
const full: ISavedExplorer = {
  ...base,
  preset: 'bean-rodbell',
  presetValues: { eta: 2, T0: 300 },
  typed: { text: 'a/2*(T - T0)*ψ^2 + b/4*ψ^4 - h*ψ', values: { a: 1, T0: 100, b: 1 } },
  coupled: { a1: 1, T1: 100, b1: 1, a2: 1, T2: 90, b2: 1, lambda: 0.5 },
  view: 'phase-diagram',
  overlay: { data: { T: [95, 97, 99], psi: [1.1, 0.9, 0.6] }, fitted: { T: [94, 100], psi: [1.15, 0.5] } }
};

function valueOf(r: ReturnType<typeof upsertExplorerWith>): unknown {
  if ('blocked' in r) {
    throw new Error(r.blocked.text);
  }
  return r.value;
}

describe('saved workbench scenarios', () => {
  it('should write the preset, the typed free energy, the coupled coefficients and the view, and read them back', () => {
    const value = valueOf(upsertExplorerWith(undefined, full, kinds));
    expect(readSavedExplorers(value)).toEqual({ explorers: [full], problems: [] });
    const validate = new Ajv({ allowUnionTypes: true }).compile(JSON.parse(fs.readFileSync(SCHEMA_FILE, 'utf8')));
    expect(validate(value), JSON.stringify(validate.errors)).toBe(true);
    // a typed free energy without its values is not valid
    expect(validate({ version: 2, analyses: [], explorers: [{ ...base, typed: { text: 'ψ^2' } }] })).toBe(false);
  });

  it('should still read an entry written before these fields existed', () => {
    const older = { version: 2, analyses: [], explorers: [{ id: 'old', coefficients: { a: 1, T0: 10, b: 1, c: 0 }, convention: 'L', T: 9, h: 0 }] };
    expect(readSavedExplorers(older).explorers).toEqual([{ id: 'old', coefficients: { a: 1, T0: 10, b: 1, c: 0, d: 0 }, convention: 'L', T: 9, h: 0 }]);
  });

  it('should leave out malformed optional fields on reading and keep them in the notebook until replaced', () => {
    const raw = {
      version: 2,
      analyses: [],
      explorers: [{ ...base, preset: 'unknown-model', view: 'nowhere', typed: { text: 'ψ^2', values: { a: 'x' } }, coupled: { a1: 1 }, overlay: { data: { T: [1, 2], psi: [1] }, fitted: { T: [], psi: [] } } }]
    };
    const read = readSavedExplorers(raw).explorers[0];
    expect(read).toEqual(base);
    // writing the same scenario back drops the known-but-malformed fields (they are replaced), keeps everything else
    const written = valueOf(upsertExplorerWith(raw, { ...base, view: 'loop' }, kinds)) as { explorers: Record<string, unknown>[] };
    expect(written.explorers[0].view).toBe('loop');
    expect(written.explorers[0].preset).toBeUndefined();
  });

  it('should drop the typed free energy when the scenario no longer has one, and refuse non-finite values', () => {
    const value = valueOf(upsertExplorerWith(undefined, full, kinds));
    const next = valueOf(upsertExplorerWith(value, { ...full, typed: undefined }, kinds)) as { explorers: Record<string, unknown>[] };
    expect(next.explorers[0].typed).toBeUndefined();
    expect(next.explorers[0].preset).toBe('bean-rodbell');
    const bad = upsertExplorerWith(undefined, { ...full, typed: { text: 'ψ^2', values: { a: Number.NaN } } }, kinds);
    expect('blocked' in bad).toBe(true);
  });

  it('should keep the data and fitted curve of the fit as columns, thinned to their limits, and refuse unequal or non-finite columns', () => {
    // a long series keeps its first and last points and at most the limit
    const rows = Array.from({ length: 5001 }, (_, i) => ({ T: 90 + i * 0.002, psi: Math.sqrt(Math.max(0, 100 - (90 + i * 0.002))) }));
    const thin = overlayColumns([...rows, { T: Number.NaN, psi: 1 }], OVERLAY_LIMITS.data);
    expect(thin.T.length).toBeLessThanOrEqual(OVERLAY_LIMITS.data);
    expect(thin.T.length).toBeGreaterThan(OVERLAY_LIMITS.data / 2);
    expect(thin.T[0]).toBe(90);
    expect(thin.T[thin.T.length - 1]).toBe(rows[rows.length - 1].T);
    expect(thin.psi.every(Number.isFinite)).toBe(true);
    // a short one is kept whole
    expect(overlayRows(overlayColumns(rows.slice(0, 10), OVERLAY_LIMITS.fitted))).toEqual(rows.slice(0, 10));
    const validate = new Ajv({ allowUnionTypes: true }).compile(JSON.parse(fs.readFileSync(SCHEMA_FILE, 'utf8')));
    expect(validate({ version: 2, analyses: [], explorers: [{ ...base, overlay: { data: thin, fitted: { T: [1], psi: [2] } } }] })).toBe(true);
    expect(validate({ version: 2, analyses: [], explorers: [{ ...base, overlay: { data: { T: [1] } } }] })).toBe(false);
    const bad = upsertExplorerWith(undefined, { ...base, overlay: { data: { T: [1], psi: [Number.POSITIVE_INFINITY] }, fitted: { T: [], psi: [] } } }, kinds);
    expect('blocked' in bad).toBe(true);
  });
});
