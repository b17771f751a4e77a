/**
 * The fit overlay spec builder: small series drawn point for point, large
 * series reduced for display with each fit-window group reduced on its own,
 * the counts a panel prints ("N of M points drawn"), non-finite pairs left
 * out, and a spec Vega-Lite compiles.
 */
import { describe, expect, it } from 'vitest';
import { compile } from 'vega-lite';
import { buildFitOverlayChart, buildFitOverlaySpec } from '../../src/charts/fit-overlay';
import type { IFitOverlayOptions } from '../../src/charts/fit-overlay';
import { DISPLAY_MAX_POINTS } from '../../src/charts/reduce';
import type { IChartTheme } from '../../src/charts/theme';
import { mulberry32 } from '../../src/core/numeric/random';

const theme: IChartTheme = { background: '#101010', text: '#eeeeee', grid: '#444444', accent: '#3080ff', accent2: '#ff8030', font: 'sans-serif' };

interface IPoint {
  x: number;
  y: number;
  row: number;
  used: string;
}

function pointsOf(spec: unknown): IPoint[] {
  return (spec as { layer: { data: { values: IPoint[] } }[] }).layer[0].data.values;
}

function options(x: ArrayLike<number>, y: ArrayLike<number>, window = { min: 100, max: 240 }): IFitOverlayOptions {
  return {
    x,
    y,
    xTitle: 'T (K)',
    yTitle: 'M (emu/g)',
    window,
    curve: { x: [100, 170, 240], y: [70, 50, 20] },
    curveLabel: 'fitted model',
    pointSize: 30,
    theme
  };
}

/** 200 000 rows of M(T), T from 2 K to 300 K, a little noise, a spike inside and one outside the window. */
function large(): { x: Float64Array; y: Float64Array } {
  const n = 200_000;
  const rand = mulberry32(3);
  const x = new Float64Array(n);
  const y = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    x[i] = 2 + (298 * i) / (n - 1);
    y[i] = 80 * Math.sqrt(Math.max(0, 1 - x[i] / 250)) + 0.4 * (rand() - 0.5);
  }
  y[90_000] = 150; // inside the window (T ≈ 136 K): the global maximum
  y[10_000] = -40; // outside (T ≈ 17 K): the global minimum
  return { x, y };
}

describe('buildFitOverlaySpec on a large series', () => {
  it('should draw at most DISPLAY_MAX_POINTS of 200 000 points, keeping the first and last x and the min and max of y', () => {
    const { x, y } = large();
    const points = pointsOf(buildFitOverlaySpec(options(x, y)));
    expect(points.length).toBeLessThanOrEqual(DISPLAY_MAX_POINTS);
    const rows = new Set(points.map(p => p.row));
    for (const row of [0, 199_999, 90_000, 10_000]) {
      expect(rows.has(row)).toBe(true);
    }
    expect(Math.min(...points.map(p => p.x))).toBe(x[0]);
    expect(Math.max(...points.map(p => p.x))).toBe(x[199_999]);
    expect(Math.min(...points.map(p => p.y))).toBe(-40);
    expect(Math.max(...points.map(p => p.y))).toBe(150);
  });

  it('should reduce the points inside and outside the window separately, each keeping its own extremes', () => {
    const { x, y } = large();
    const chart = buildFitOverlayChart(options(x, y));
    const points = pointsOf(chart.spec);
    for (const p of points) {
      expect(p.used).toBe(p.x >= 100 && p.x <= 240 ? 'fitted' : 'outside window');
      expect([p.x, p.y]).toEqual([x[p.row], y[p.row]]);
    }
    const inside = points.filter(p => p.used === 'fitted');
    const outside = points.filter(p => p.used !== 'fitted');
    // Each group has many points, and its own y extremes (not only the global ones).
    expect(inside.length).toBeGreaterThan(300);
    expect(outside.length).toBeGreaterThan(300);
    let inMin = Infinity;
    let outMax = -Infinity;
    for (let i = 0; i < x.length; i++) {
      if (x[i] >= 100 && x[i] <= 240) {
        inMin = Math.min(inMin, y[i]);
      } else {
        outMax = Math.max(outMax, y[i]);
      }
    }
    expect(Math.min(...inside.map(p => p.y))).toBe(inMin);
    expect(Math.max(...outside.map(p => p.y))).toBe(outMax);
    // The window's edges are drawn: the first and last row inside it.
    const firstIn = x.findIndex(v => v >= 100);
    const lastIn = x.findIndex(v => v > 240) - 1;
    expect(inside.some(p => p.row === firstIn) && inside.some(p => p.row === lastIn)).toBe(true);
    // Rows in table order.
    expect(points.every((p, k) => k === 0 || p.row > points[k - 1].row)).toBe(true);
  });

  it('should say how many points are drawn of how many, and count the non-finite pairs left out', () => {
    const { x, y } = large();
    for (let i = 5; i < x.length; i += 1000) {
      y[i] = Number.NaN;
    }
    x[7] = Number.NEGATIVE_INFINITY;
    const chart = buildFitOverlayChart(options(x, y));
    const points = pointsOf(chart.spec);
    expect(chart.skipped).toBe(201);
    expect(chart.plotted).toBe(200_000 - 201);
    expect(chart.reduced).toEqual({ shown: points.length, total: 200_000 - 201 });
    expect(points.every(p => Number.isFinite(p.x) && Number.isFinite(p.y))).toBe(true);
  });

  it('should draw a small group whole when the other is reduced', () => {
    const { x, y } = large();
    // Window over the last 150 rows only.
    const chart = buildFitOverlayChart(options(x, y, { min: x[199_850], max: 400 }));
    const inside = pointsOf(chart.spec).filter(p => p.used === 'fitted');
    expect(inside.map(p => p.row)).toEqual(Array.from({ length: 150 }, (_, k) => 199_850 + k));
    expect(chart.reduced!.shown).toBeLessThanOrEqual(DISPLAY_MAX_POINTS);
  });

  it('should compile to Vega with the reduced points and the whole curve', () => {
    const { x, y } = large();
    const chart = buildFitOverlayChart(options(x, y));
    const sizes = (compile(chart.spec).spec.data ?? []).map(d => ('values' in d && Array.isArray(d.values) ? d.values.length : 0)).filter(n => n > 0);
    expect(sizes.sort((a, b) => a - b)).toEqual([3, chart.reduced!.shown]);
  });
});

describe('buildFitOverlayChart on a small series', () => {
  it('should draw every finite point and report no reduction', () => {
    const x = [1, 2, Number.NaN, 4, 5];
    const y = [10, 20, 30, 40, Number.POSITIVE_INFINITY];
    const chart = buildFitOverlayChart(options(x, y, { min: 2, max: 4 }));
    expect(chart.reduced).toBeNull();
    expect([chart.plotted, chart.skipped]).toEqual([3, 2]);
    expect(pointsOf(chart.spec)).toEqual([
      { x: 1, y: 10, row: 0, used: 'outside window' },
      { x: 2, y: 20, row: 1, used: 'fitted' },
      { x: 4, y: 40, row: 3, used: 'fitted' }
    ]);
  });

  it('should draw DISPLAY_MAX_POINTS points whole and one more reduced', () => {
    const n = DISPLAY_MAX_POINTS;
    const x = Float64Array.from({ length: n + 1 }, (_, i) => i);
    const y = x.map(v => Math.sin(v / 40));
    expect(buildFitOverlayChart(options(x.subarray(0, n), y.subarray(0, n))).reduced).toBeNull();
    const over = buildFitOverlayChart(options(x, y));
    expect(over.reduced!.total).toBe(n + 1);
    expect(over.reduced!.shown).toBeLessThanOrEqual(n);
  });

  it('should refuse columns of different lengths', () => {
    expect(() => buildFitOverlayChart(options([1, 2], [1]))).toThrow('x has 2 values but y has 1');
  });
});
