/**
 * The public API with its default catalogue of analysis kinds
 * (src/core/analysis/kinds): format 1 analyses open as their kinds, option
 * values are checked by the kinds themselves, and unknown kinds are kept.
 */
import { describe, expect, it } from 'vitest';
import { messageText } from '../../../src/core/messages';
import { readSaved, removeSaved, upsertSaved } from '../../../src/core/saved';
import { entry, v1Block, v1Entry } from './helpers';

describe('saved analyses with the kind catalogue', () => {
  // Case: the format 1 fixtures open with the real kinds (weiss with J = ∞, power law, expression).
  it('should open format 1 analyses of every format 1 model as catalogue kinds', () => {
    const models = ['power-law', 'weiss', 'curie-weiss', 'landau', 'expression'];
    const raw = v1Block(
      ...models.map(model =>
        v1Entry(model, { model, options: { J: null, proxyPower: 1, background: false, units: 'SI', expression: 'a*x + b' }, window: { min: null, max: 300 }, starts: 'a = 1, b = 0' })
      )
    );
    const result = readSaved(raw);
    expect(result.problems.map(messageText)).toEqual([]);
    expect(result.analyses.map(a => a.settings?.kind)).toEqual(models);
    expect(result.analyses[1].settings!.options).toEqual({ J: 'inf' });
    expect(result.analyses[4].settings!.options).toEqual({ expression: 'a*x + b', starts: 'a = 1, b = 0' });
  });

  // Case: a value a kind does not offer is refused by the kind, an unknown kind is kept; both unopened.
  it('should keep entries whose kind is unknown or whose option the kind refuses', () => {
    let value: unknown = undefined;
    for (const e of [entry('a', { settings: { kind: 'weiss', options: { J: 0.5 }, window: { min: 1, max: 2 } } }), entry('b', { settings: null })]) {
      const r = upsertSaved(value, e);
      value = 'value' in r ? r.value : r;
    }
    const stored = JSON.parse(JSON.stringify(value));
    stored.analyses[0].settings.options.J = 0.7;
    stored.analyses[1].settings = { kind: 'not-a-kind', options: {}, window: { min: null, max: null } };
    const result = readSaved(stored);
    expect(result.analyses).toEqual([]);
    expect(result.kept).toBe(2);
    expect(result.problems.map(p => p.code)).toEqual(['saved.entry-settings-unusable', 'saved.bad-choice', 'saved.entry-unknown-kind']);
    // Removing or saving a neighbour keeps both as they are.
    const next = upsertSaved(stored, entry('c', { settings: null }));
    expect('value' in next && JSON.stringify((next.value as typeof stored).analyses.slice(0, 2))).toBe(JSON.stringify(stored.analyses));
    expect(removeSaved(stored, 'a')).toEqual({ value: stored, changed: false });
  });
});
