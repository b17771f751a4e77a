/**
 * The fit's pooled work arrays (src/core/fit/workspace.ts): arrays from
 * `take` are always zero-filled, whatever an earlier fit left in the pool;
 * `scratch` arrays have the requested length (contents unspecified).
 * Checks of the contract only (common practice, no source).
 */
import { describe, expect, it } from 'vitest';
import { Workspace } from '../../../src/core/fit/workspace';

describe('Workspace', () => {
  it('gives zero-filled arrays from take, also after junk was released into the pool', () => {
    for (const length of [10, 5000, 40000]) {
      const first = new Workspace();
      const junk = first.scratch(length);
      junk.fill(Number.NaN);
      const junk2 = first.take(length);
      junk2.fill(7);
      first.release();
      const second = new Workspace();
      const a = second.take(length);
      expect(a.length).toBe(length);
      expect(a.every((v) => v === 0)).toBe(true);
      const b = second.take(length);
      expect(b.every((v) => v === 0)).toBe(true);
      second.release();
    }
  });

  it('gives scratch arrays of the requested length that do not overlap each other', () => {
    const ws = new Workspace();
    const a = ws.scratch(100);
    const b = ws.scratch(100);
    const big = ws.scratch(70000);
    expect([a.length, b.length, big.length]).toEqual([100, 100, 70000]);
    a.fill(1);
    b.fill(2);
    big.fill(3);
    expect(a.every((v) => v === 1)).toBe(true);
    expect(b.every((v) => v === 2)).toBe(true);
    ws.release();
  });

  it('copies a source exactly', () => {
    const ws = new Workspace();
    const src = Float64Array.from({ length: 3000 }, (_, i) => Math.sin(i));
    expect(Array.from(ws.copy(src))).toEqual(Array.from(src));
    ws.release();
  });
});
