/**
 * The scatter spec builder: valid Vega-Lite, the right fields, non-finite pairs
 * left out and counted, theme colours placed in the config.
 */
import { describe, expect, it } from 'vitest';
import { compile } from 'vega-lite';
import { DISPLAY_MAX_POINTS } from '../../src/charts/reduce';
import { buildScatterSpec } from '../../src/charts/scatter';
import type { IChartTheme } from '../../src/charts/theme';

const theme: IChartTheme = { background: '#101010', text: '#eeeeee', grid: '#444444', accent: '#3080ff', accent2: '#ff8030', font: 'sans-serif' };

describe('buildScatterSpec', () => {
  it('should compile to Vega with one datum per finite pair', () => {
    const x = new Float64Array([1, 2, Number.NaN, 4, Number.POSITIVE_INFINITY]);
    const y = new Float64Array([10, 20, 30, Number.NEGATIVE_INFINITY, 50]);
    const { spec, plotted, skipped } = buildScatterSpec({ x, y, xTitle: 'T (K)', yTitle: 'M (emu/g)', pointSize: 30, theme });
    expect(plotted).toBe(1 + 1);
    expect(skipped).toBe(3);
    const values = (spec as { data: { values: { x: number; y: number; row: number }[] } }).data.values;
    expect(values).toEqual([
      { x: 1, y: 10, row: 0 },
      { x: 2, y: 20, row: 1 }
    ]);
    const vega = compile(spec).spec;
    expect(vega.marks?.length).toBeGreaterThan(0);
    expect(vega.background).toBe('#101010');
  });

  it('should title the axes with the column labels and use the theme accent for marks', () => {
    const { spec } = buildScatterSpec({ x: [1, 2], y: [3, 4], xTitle: 'H (Oe)', yTitle: 'M (A/m)', pointSize: 12, theme });
    const s = spec as unknown as { encoding: { x: { title: string }; y: { title: string } }; mark: { color: string; size: number } };
    expect(s.encoding.x.title).toBe('H (Oe)');
    expect(s.encoding.y.title).toBe('M (A/m)');
    expect(s.mark.color).toBe('#3080ff');
    expect(s.mark.size).toBe(12);
  });

  it('should accept empty columns and plot nothing', () => {
    const { plotted, skipped, spec, reduced } = buildScatterSpec({ x: [], y: [], xTitle: 'x', yTitle: 'y', pointSize: 10, theme });
    expect([plotted, skipped, reduced]).toEqual([0, 0, null]);
    expect(() => compile(spec)).not.toThrow();
  });

  it('should refuse columns of different lengths', () => {
    expect(() => buildScatterSpec({ x: [1, 2], y: [1], xTitle: 'x', yTitle: 'y', pointSize: 10, theme })).toThrow(
      'x has 2 values but y has 1'
    );
  });

  it('should draw a 200 000-point scatter reduced, with its extremes, and say so', () => {
    const n = 200_000;
    const x = Float64Array.from({ length: n }, (_, i) => -5000 + (10_000 * i) / n);
    const y = x.map(h => 60 * Math.tanh(h / 800) + 0.5 * Math.sin(h * 13));
    y[4321] = Number.NaN;
    const { spec, plotted, skipped, reduced } = buildScatterSpec({ x, y, xTitle: 'H (Oe)', yTitle: 'M', pointSize: 10, theme });
    const values = (spec as { data: { values: { x: number; y: number; row: number }[] } }).data.values;
    expect([plotted, skipped]).toEqual([n - 1, 1]);
    expect(reduced).toEqual({ shown: values.length, total: n - 1 });
    expect(values.length).toBeLessThanOrEqual(DISPLAY_MAX_POINTS);
    const ys = values.map(v => v.y);
    const finite = y.filter(Number.isFinite);
    expect([Math.min(...ys), Math.max(...ys)]).toEqual([finite.reduce((a, b) => Math.min(a, b)), finite.reduce((a, b) => Math.max(a, b))]);
    expect([values[0].row, values.at(-1)!.row]).toEqual([0, n - 1]);
    expect(values.some(v => v.row === 4321)).toBe(false);
  });

  it('should not mutate its inputs', () => {
    const x = new Float64Array([3, 1, 2]);
    const y = new Float64Array([9, 8, 7]);
    buildScatterSpec({ x, y, xTitle: 'x', yTitle: 'y', pointSize: 10, theme });
    expect(Array.from(x)).toEqual([3, 1, 2]);
    expect(Array.from(y)).toEqual([9, 8, 7]);
  });
});
