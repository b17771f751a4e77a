/**
 * The fit overlay spec builder: small series drawn point for point, large
 * series reduced for display with each fit-window group reduced on its own,
 * the counts a panel prints ("N of M points drawn"), non-finite pairs left
 * out, and a spec Vega-Lite compiles; the fit-window brush (started at the
 * window, read and moved through a Vega view) and the ±σ error bars.
 */
import { describe, expect, it } from 'vitest';
import { compile } from 'vega-lite';
import type { TopLevelSpec } from 'vega-lite';
import { parse, View as VegaView } from 'vega';
import type { View } from 'vega';
import { buildFitOverlayChart, buildFitOverlaySpec, FIT_WINDOW_PARAM, fitWindowFromSignal, readFitWindow, setFitWindow } from '../../src/charts/fit-overlay';
import type { IFitOverlayOptions } from '../../src/charts/fit-overlay';
import { DISPLAY_MAX_POINTS } from '../../src/charts/reduce';
import type { IChartTheme } from '../../src/charts/theme';
import { mulberry32 } from '../../src/core/numeric/random';
import { coloursIn, compilesCleanly, distinctTheme, nonFinitePaths, strings, themeColours } from './sweeps/helpers';

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
    const sizes = (compile(chart.spec).spec.data ?? [])
      .filter(d => d.name !== `${FIT_WINDOW_PARAM}_store`)
      .map(d => ('values' in d && Array.isArray(d.values) ? d.values.length : 0))
      .filter(n => n > 0);
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

interface IOverlayLayer {
  data: { values: Record<string, number | string>[] };
  mark: { type: string };
  params?: { name: string; select: { type: string; encodings: string[] }; value?: { x: number[] } }[];
  encoding: Record<string, unknown>;
}

function overlayLayers(spec: unknown): IOverlayLayer[] {
  return (spec as { layer: IOverlayLayer[] }).layer;
}

/** The common checks on an overlay spec: no warning, finite numbers, no "NaN" text, theme colours only. */
function checkOverlay(spec: TopLevelSpec, t: IChartTheme = theme): void {
  compilesCleanly(spec);
  expect(nonFinitePaths(spec)).toEqual([]);
  for (const s of strings(spec)) {
    expect(s).not.toMatch(/NaN|Infinity|∞|undefined/);
  }
  const allowed = themeColours(t);
  for (const c of coloursIn(spec)) {
    expect(allowed.has(c), `colour ${c} is not the theme's`).toBe(true);
  }
  expect(JSON.stringify(spec)).not.toContain('"scheme"');
}

const small = { x: [100, 120, 150, 200, 260, 280], y: [80, 75, 60, 40, 10, 5] };

describe('buildFitOverlayChart: the fit-window brush', () => {
  it('should put an interval selection on x on the points, started at the fit window', () => {
    const chart = buildFitOverlayChart({ ...options(small.x, small.y, { min: 120, max: 250 }), theme: distinctTheme });
    checkOverlay(chart.spec, distinctTheme);
    const [points] = overlayLayers(chart.spec);
    expect(points.params).toHaveLength(1);
    const param = points.params![0];
    expect(param.name).toBe(FIT_WINDOW_PARAM);
    expect(param.select.type).toBe('interval');
    expect(param.select.encodings).toEqual(['x']);
    expect(param.value).toEqual({ x: [120, 250] });
    // Inside the brush: accent; outside: the theme's text colour, faded.
    expect(points.encoding.color).toEqual({ condition: { param: FIT_WINDOW_PARAM, empty: true, value: distinctTheme.accent }, value: distinctTheme.text });
    const opacity = points.encoding.opacity as { condition: { value: number }; value: number };
    expect(opacity.condition.value).toBeGreaterThan(opacity.value);
    // Points and curve only.
    expect(overlayLayers(chart.spec).map(l => l.mark.type)).toEqual(['point', 'line']);
  });

  it('should start an open-ended window at the ends of the data, and draw no brush value for an empty window', () => {
    const open = buildFitOverlayChart(options(small.x, small.y, { min: -Infinity, max: Infinity }));
    checkOverlay(open.spec);
    expect(overlayLayers(open.spec)[0].params![0].value).toEqual({ x: [100, 280] });
    const half = buildFitOverlayChart({ ...options(small.x, small.y, { min: 150, max: Infinity }), curve: null });
    expect(overlayLayers(half.spec)[0].params![0].value).toEqual({ x: [150, 280] });
    for (const w of [
      { min: 200, max: 150 },
      { min: Number.NaN, max: 200 },
      { min: 150, max: 150 }
    ]) {
      const chart = buildFitOverlayChart({ ...options(small.x, small.y, w), curve: null });
      checkOverlay(chart.spec);
      expect(overlayLayers(chart.spec)[0].params![0].value).toBeUndefined();
    }
  });

  it('should give a valid spec for no points, only non-finite points and a single point', () => {
    for (const [x, y] of [
      [[], []],
      [[Number.NaN, 1], [2, Number.POSITIVE_INFINITY]],
      [[150], [3]]
    ] as number[][][]) {
      for (const window of [
        { min: 100, max: 240 },
        { min: -Infinity, max: Infinity }
      ]) {
        const chart = buildFitOverlayChart({ ...options(x, y, window), curve: null, sigma: x.map(() => 0.5) });
        checkOverlay(chart.spec);
      }
    }
  });

  it('should colour by the given window without the brush: a fixed shaded band, accent inside, grey outside', () => {
    const chart = buildFitOverlayChart({ ...options(small.x, small.y, { min: 120, max: 250 }), brush: false });
    checkOverlay(chart.spec);
    const ls = overlayLayers(chart.spec);
    expect(ls.map(l => l.mark.type)).toEqual(['rect', 'point', 'line']);
    expect(ls.every(l => l.params === undefined)).toBe(true);
    expect(ls[0].data.values).toEqual([{ lo: 120, hi: 250 }]);
    expect((ls[1].encoding.color as { scale: unknown }).scale).toEqual({ domain: ['fitted', 'outside window'], range: [theme.accent, theme.text] });
  });
});

describe('buildFitOverlayChart: error bars', () => {
  it('should draw y ± σ for the points with a finite positive σ, and no bars without σ', () => {
    const sigma = [1, Number.NaN, -2, 0, 3, Number.POSITIVE_INFINITY];
    const chart = buildFitOverlayChart({ ...options(small.x, small.y), sigma, theme: distinctTheme });
    checkOverlay(chart.spec, distinctTheme);
    const ls = overlayLayers(chart.spec);
    expect(ls.map(l => l.mark.type)).toEqual(['point', 'rule', 'line']);
    expect(ls[1].data.values).toEqual([
      { x: 100, lo: 79, hi: 81, row: 0 },
      { x: 150, lo: 58, hi: 62, row: 2 },
      { x: 260, lo: 7, hi: 13, row: 4 }
    ]);
    // The bars follow the brush like the points.
    expect(ls[1].encoding.color).toEqual(ls[0].encoding.color);
    expect(ls[0].data.values.filter(p => 'sigma' in p).map(p => p.sigma)).toEqual([1, 2, 3]);

    const without = buildFitOverlayChart(options(small.x, small.y));
    expect(overlayLayers(without.spec).some(l => l.mark.type === 'rule')).toBe(false);
    const noneUsable = buildFitOverlayChart({ ...options(small.x, small.y), sigma: small.x.map(() => Number.NaN) });
    expect(overlayLayers(noneUsable.spec).some(l => l.mark.type === 'rule')).toBe(false);
  });

  it('should draw bars for the reduced points only, and refuse σ of another length', () => {
    const { x, y } = large();
    const sigma = new Float64Array(x.length).fill(0.2);
    const chart = buildFitOverlayChart({ ...options(x, y), sigma });
    const ls = overlayLayers(chart.spec);
    expect(ls[1].data.values.length).toBe(chart.reduced!.shown);
    expect(() => buildFitOverlayChart({ ...options([1, 2], [1, 2]), sigma: [1] })).toThrow('sigma has 1 values but y has 2');
  });
});

describe('the fit-window brush in a Vega view', () => {
  async function viewOf(spec: TopLevelSpec): Promise<View> {
    const view = new VegaView(parse(compile(spec).spec), { renderer: 'none' });
    await view.runAsync();
    return view;
  }

  it('should hold the initial window in the signal, follow setFitWindow and tell a listener', async () => {
    const view = await viewOf(buildFitOverlaySpec(options(small.x, small.y, { min: 120, max: 250 })));
    const w = readFitWindow(view)!;
    expect(w.min).toBeCloseTo(120, 9);
    expect(w.max).toBeCloseTo(250, 9);
    const heard: ({ min: number; max: number } | null)[] = [];
    view.addSignalListener(FIT_WINDOW_PARAM, (_name, value) => heard.push(fitWindowFromSignal(value)));
    await setFitWindow(view, { min: 140, max: 210 });
    const moved = readFitWindow(view)!;
    expect(moved.min).toBeCloseTo(140, 9);
    expect(moved.max).toBeCloseTo(210, 9);
    expect(heard.length).toBeGreaterThan(0);
    expect(heard[heard.length - 1]!.min).toBeCloseTo(140, 9);
    // Open ends go to the plot's edges; null clears the brush.
    await setFitWindow(view, { min: -Infinity, max: 200 });
    const edge = readFitWindow(view)!;
    expect(edge.max).toBeCloseTo(200, 9);
    expect(edge.min).toBeLessThanOrEqual(100);
    await setFitWindow(view, null);
    expect(readFitWindow(view)).toBeNull();
    view.finalize();
  });

  it('should read no window from values that are not a finite interval', () => {
    expect(fitWindowFromSignal({})).toBeNull();
    expect(fitWindowFromSignal(null)).toBeNull();
    expect(fitWindowFromSignal({ x: [1] })).toBeNull();
    expect(fitWindowFromSignal({ x: [1, Number.NaN] })).toBeNull();
    expect(fitWindowFromSignal({ x: [3, 3] })).toBeNull();
    expect(fitWindowFromSignal({ x: [5, 2] })).toEqual({ min: 2, max: 5 });
  });
});

describe('fit overlay with an empty brush', () => {
  it('starts the brush empty but still classes the points by the window', () => {
    const chart = buildFitOverlayChart({
      x: [1, 2, 3, 4],
      y: [4, 3, 2, 1],
      xTitle: 'T',
      yTitle: 'M',
      window: { min: 1, max: 4 },
      curve: null,
      curveLabel: 'model',
      pointSize: 30,
      theme: { background: '#fff', text: '#111', grid: '#ccc', accent: '#c00', accent2: '#00c', font: 'sans-serif' },
      emptyBrush: true
    });
    const json = JSON.stringify(chart.spec);
    expect(json).toContain('"name":"fitWindow"');
    expect(json).not.toContain('"value":{"x":');
    expect(json.match(/"used":"fitted"/g)?.length).toBe(4);
  });
});
