/**
 * Shared pieces of the saved-format tests: a small catalogue of kinds (the
 * saved format only needs names, option names and a settings check), entries
 * in memory, and format 1 blocks exactly as the format 1 writer stored them.
 */
import { msg } from '../../../src/core/messages';
import type { ISavedAnalysis, ISavedKinds } from '../../../src/core/saved/types';

const OPTIONS: Record<string, readonly string[]> = {
  'power-law': ['proxyPower', 'background'],
  weiss: ['J'],
  'curie-weiss': ['units'],
  landau: [],
  expression: ['expression', 'starts']
};

/** Kinds as the catalogue describes them; the spin J of "weiss" must be ½, 1, 3/2, 2 or ∞ ("inf"). */
export const kinds: ISavedKinds = {
  isKnownKind: kind => Object.prototype.hasOwnProperty.call(OPTIONS, kind),
  validateKindSettings: settings => {
    const J = settings.options.J;
    if (settings.kind === 'weiss' && J !== undefined && ![0.5, 1, 1.5, 2, 'inf'].includes(J as number | string)) {
      return msg('test.bad-spin', 'its option "J" is %1, which is not a spin', String(J));
    }
    return null;
  },
  optionNames: kind => OPTIONS[kind] ?? []
};

export const deps = { kinds };

/** An analysis as the panel hands it over (±∞ as numbers). */
export function entry(id: string, over: Partial<ISavedAnalysis> = {}): ISavedAnalysis {
  return {
    id,
    source: { notebookPath: 'n.ipynb', cellId: 'c-1', outputIndex: 0, contentHash: '0123456789abcdef' },
    columns: { x: { index: 0, header: 'T (K)' }, y: { index: 1, header: 'M (emu/g)' }, sigma: null },
    snapshot: { headers: ['T (K)', 'M (emu/g)'], units: ['K', 'emu/g'], values: [[1, 2, 3], [9, null, 7]] },
    settings: { kind: 'weiss', options: { J: Infinity }, window: { min: -Infinity, max: 300 } },
    ...over
  };
}

/** The JSON text of a value (byte-for-byte comparisons). */
export function text(v: unknown): string {
  return JSON.stringify(v) ?? 'undefined';
}

/**
 * A format 1 entry as the format 1 writer stored it: headers for columns,
 * every model option for every model, ±∞ and NaN as null (this is the entry
 * of the format 1 tests, after its JSON round trip).
 */
export function v1Entry(id = 'a1', fit: unknown = undefined): Record<string, unknown> {
  return {
    id,
    source: { notebookPath: 'n.ipynb', cellId: 'c-1', outputIndex: 0, contentHash: '0123456789abcdef' },
    columns: { x: 'T (K)', y: 'M (emu/g)', sigma: null },
    snapshot: { headers: ['T (K)', 'M (emu/g)'], units: ['K', 'emu/g'], values: [[1, 2, 3], [9, null, 7]] },
    fit:
      fit === undefined
        ? { model: 'weiss', options: { J: null, proxyPower: 1, background: false, units: 'cgs-emu', expression: '' }, window: { min: null, max: 300 }, starts: 'A = 1, T0 = 100' }
        : fit
  };
}

/** A format 1 block. */
export function v1Block(...analyses: unknown[]): { version: 1; analyses: unknown[] } {
  return { version: 1, analyses };
}
