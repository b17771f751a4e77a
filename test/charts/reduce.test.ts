/**
 * Display reduction (src/charts/reduce.ts): at most the budget, the extremes
 * of the series kept exactly, a noisy band kept filled, row order, only the
 * rows it was given, and the same answer every time.
 */
import { describe, expect, it } from 'vitest';
import { DISPLAY_MAX_POINTS, finiteRows, pointBounds, reduceForDisplay, shareBudget } from '../../src/charts/reduce';
import { mulberry32 } from '../../src/core/numeric/random';

function argExtremes(v: ArrayLike<number>, rows: ArrayLike<number>): { min: number; max: number } {
  let min = rows[0];
  let max = rows[0];
  for (let k = 1; k < rows.length; k++) {
    const i = rows[k];
    if (v[i] < v[min]) {
      min = i;
    }
    if (v[i] > v[max]) {
      max = i;
    }
  }
  return { min, max };
}

/** A magnetisation-like curve with a little noise and a few spikes, x increasing. */
function curve(n: number, noise: number): { x: Float64Array; y: Float64Array } {
  const rand = mulberry32(7);
  const x = new Float64Array(n);
  const y = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    x[i] = 2 + (298 * i) / (n - 1);
    y[i] = 80 * Math.sqrt(Math.max(0, 1 - x[i] / 250)) + noise * (rand() - 0.5);
  }
  y[12_345 % n] += 40;
  y[98_765 % n] -= 30;
  return { x, y };
}

describe('reduceForDisplay', () => {
  it('should return every row when there are at most the budget', () => {
    const { x, y } = curve(DISPLAY_MAX_POINTS, 1);
    const rows = finiteRows(x, y);
    expect(Array.from(reduceForDisplay(x, y, rows))).toEqual(Array.from(rows));
  });

  it('should keep at most the budget of 200 000 points, with the first and last x and the global min and max of y', () => {
    const { x, y } = curve(200_000, 1);
    const rows = finiteRows(x, y);
    const kept = reduceForDisplay(x, y, rows);
    expect(kept.length).toBeLessThanOrEqual(DISPLAY_MAX_POINTS);
    expect(kept.length).toBeGreaterThan(100);
    const ky = argExtremes(y, rows);
    const set = new Set(kept);
    for (const row of [0, 199_999, ky.min, ky.max]) {
      expect(set.has(row)).toBe(true);
    }
    // Rows in order, no row twice.
    for (let k = 1; k < kept.length; k++) {
      expect(kept[k]).toBeGreaterThan(kept[k - 1]);
    }
  });

  it('should keep the top and bottom point of every grid column of a thin curve', () => {
    // A thin curve fits the first grid (budget / 8 columns), so each of those columns keeps its extremes exactly.
    const { x, y } = curve(200_000, 0.5);
    const rows = finiteRows(x, y);
    const kept = reduceForDisplay(x, y, rows);
    const columns = DISPLAY_MAX_POINTS / 8;
    const column = (xi: number) => Math.min(columns - 1, Math.floor(((xi / 2 - x[0] / 2) / (x[x.length - 1] / 2 - x[0] / 2)) * columns));
    const extremes = (list: ArrayLike<number>) => {
      const top = new Float64Array(columns).fill(-Infinity);
      const bottom = new Float64Array(columns).fill(Infinity);
      for (let k = 0; k < list.length; k++) {
        const c = column(x[list[k]]);
        top[c] = Math.max(top[c], y[list[k]]);
        bottom[c] = Math.min(bottom[c], y[list[k]]);
      }
      return { top: Array.from(top), bottom: Array.from(bottom) };
    };
    expect(extremes(kept)).toEqual(extremes(rows));
  });

  it('should draw a wide noisy band filled, not as its outline', () => {
    const n = 200_000;
    const rand = mulberry32(11);
    const x = Float64Array.from({ length: n }, (_, i) => i);
    const y = Float64Array.from({ length: n }, () => rand());
    const kept = reduceForDisplay(x, y, finiteRows(x, y));
    expect(kept.length).toBeLessThanOrEqual(DISPLAY_MAX_POINTS);
    const middle = Array.from(kept).filter(i => y[i] > 1 / 3 && y[i] < 2 / 3).length;
    // Extremes alone would put almost nothing in the middle third of the band.
    expect(middle / kept.length).toBeGreaterThan(0.2);
  });

  it('should return only rows it was given (non-finite rows stay out)', () => {
    const { x, y } = curve(50_000, 1);
    for (let i = 0; i < x.length; i += 97) {
      y[i] = Number.NaN;
    }
    x[3] = Number.POSITIVE_INFINITY;
    const rows = finiteRows(x, y);
    expect(rows.length).toBe(50_000 - Math.ceil(50_000 / 97) - 1);
    const kept = reduceForDisplay(x, y, rows, 1000);
    expect(kept.length).toBeLessThanOrEqual(1000);
    expect(Array.from(kept).every(i => Number.isFinite(x[i]) && Number.isFinite(y[i]))).toBe(true);
  });

  it('should give the same rows every time and draw identical points once', () => {
    const { x, y } = curve(30_000, 3);
    const rows = finiteRows(x, y);
    expect(Array.from(reduceForDisplay(x, y, rows, 500))).toEqual(Array.from(reduceForDisplay(x, y, rows, 500)));
    const same = new Float64Array(10_000).fill(4);
    expect(Array.from(reduceForDisplay(same, same, finiteRows(same, same), 100))).toEqual([0]);
  });

  it('should keep a series spanning the whole double range finite and within budget', () => {
    const x = Float64Array.from({ length: 20_000 }, (_, i) => (i % 2 === 0 ? -1 : 1) * 1.7e308 * (i / 20_000));
    const y = Float64Array.from({ length: 20_000 }, (_, i) => 1.7e308 * ((2 * i) / 20_000 - 1));
    const rows = finiteRows(x, y);
    expect(rows.length).toBe(20_000);
    expect(pointBounds(x, y, rows)).toEqual({ xMin: x[19_998], xMax: x[19_999], yMin: y[0], yMax: y[19_999] });
    const kept = reduceForDisplay(x, y, rows, 1000);
    expect(kept.length).toBeLessThanOrEqual(1000);
    expect(kept.length).toBeGreaterThan(100);
    const set = new Set(kept);
    for (const row of [0, 19_998, 19_999]) {
      expect(set.has(row)).toBe(true);
    }
  });

  it('should refuse a budget too small for the grid', () => {
    const { x, y } = curve(100, 1);
    expect(() => reduceForDisplay(x, y, finiteRows(x, y), 4)).toThrow('at least 8 points');
  });
});

describe('shareBudget', () => {
  it('should draw small groups whole and share the rest equally', () => {
    expect(shareBudget([300, 100_000], 4000)).toEqual([300, 3700]);
    expect(shareBudget([100_000, 10], 4000)).toEqual([3990, 10]);
    expect(shareBudget([50_000, 60_000], 4000)).toEqual([2000, 2000]);
    expect(shareBudget([1000, 2000], 4000)).toEqual([1000, 2000]);
    expect(shareBudget([5000, 100, 5000, 900], 4000)).toEqual([1500, 100, 1500, 900]);
  });

  it('should give every group at least the smallest budget reduceForDisplay accepts', () => {
    expect(shareBudget([0, 3, 1000], 4000)).toEqual([8, 8, 1000]);
    expect(shareBudget(Array.from({ length: 1000 }, () => 500), 4000).every(b => b === 8)).toBe(true);
  });
});
