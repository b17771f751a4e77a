/**
 * Data with a fitted model: points inside the fit window drawn in the accent
 * colour, points outside it greyed, the model curve over the window, and
 * ±σ error bars when the points have uncertainties.
 *
 * The fit window is an interval selection on x named {@link FIT_WINDOW_PARAM}
 * (a brush drawn as a shaded band), started at the window the chart is built
 * with. Dragging it greys the points outside the brushed interval at once;
 * the panel reads the interval from the Vega view ({@link readFitWindow}, or
 * a signal listener on {@link FIT_WINDOW_PARAM} with {@link fitWindowFromSignal})
 * and moves it ({@link setFitWindow}) without rebuilding the spec.
 *
 * A series of more than `maxPoints` finite points (default
 * {@link DISPLAY_MAX_POINTS}) is drawn reduced (`./reduce.ts`): the points
 * inside and outside the window are reduced separately on one shared grid, so
 * each group keeps its own shape and extremes. The fit itself always uses
 * every row; {@link IFitOverlayChart.reduced} says how many points are drawn
 * of how many.
 */
import type { TopLevelSpec } from 'vega-lite';
import type { ChartLayer, ColorDef, Field, PositionFieldDef } from './frame';
import { layeredChart } from './frame';
import type { IDisplayReduction } from './reduce';
import { DISPLAY_MAX_POINTS, pointBounds, reduceForDisplay, shareBudget } from './reduce';
import type { IChartTheme } from './theme';

/**
 * Name of the fit-window brush: the Vega-Lite interval selection parameter
 * and the top-level Vega signal holding its value, `{ x: [lo, hi] }` in data
 * units while a window is brushed and `{}` when the brush is cleared.
 */
export const FIT_WINDOW_PARAM = 'fitWindow';

/**
 * The Vega signal with the brush's extent in pixels along x (the data field
 * and the channel are both named x, so Vega-Lite suffixes it). Setting it
 * and running the view moves the brush; {@link setFitWindow} does that.
 */
export const FIT_WINDOW_PIXEL_SIGNAL = `${FIT_WINDOW_PARAM}_x_1`;

/**
 * Name of the model curve's dataset: its rows are {@link fitCurveRows}, so a
 * drawn view can show another curve with `view.data(FIT_CURVE_DATA, rows)`
 * and `runAsync()`, without a new spec.
 */
export const FIT_CURVE_DATA = 'curve';

/** Rows of the curve dataset: the finite (x, y) pairs of a curve, with its legend text. */
export function fitCurveRows(curve: { x: ArrayLike<number>; y: ArrayLike<number> }, label: string): { x: number; y: number; series: string }[] {
  const rows: { x: number; y: number; series: string }[] = [];
  const n = Math.min(curve.x.length, curve.y.length);
  for (let i = 0; i < n; i++) {
    if (Number.isFinite(curve.x[i]) && Number.isFinite(curve.y[i])) {
      rows.push({ x: curve.x[i], y: curve.y[i], series: label });
    }
  }
  return rows;
}

/** Opacity of the points (and error bars) inside and outside the fit window. */
const OPACITY_INSIDE = 0.9;
const OPACITY_OUTSIDE = 0.3;

/** Input of {@link buildFitOverlaySpec}. */
export interface IFitOverlayOptions {
  x: ArrayLike<number>;
  y: ArrayLike<number>;
  xTitle: string;
  yTitle: string;
  /** Fit window in x; points outside it are faded. */
  window: { min: number; max: number };
  /** The model curve, or null before a fit. */
  curve: { x: ArrayLike<number>; y: ArrayLike<number> } | null;
  /** Legend text of the curve, e.g. "power law fit". */
  curveLabel: string;
  pointSize: number;
  theme: IChartTheme;
  /** Most points drawn (default {@link DISPLAY_MAX_POINTS}); larger series are reduced for display. */
  maxPoints?: number;
  /**
   * Standard uncertainty of each y (same length as y): drawn as y ± σ error
   * bars where it is finite and positive; no bars when omitted or null.
   */
  sigma?: ArrayLike<number> | null;
  /**
   * Draw the window as a brush the user can drag (default true). False draws
   * it as a fixed shaded band and colours the points by the window given
   * (for pictures that are not interactive).
   */
  brush?: boolean;
  /**
   * Start the brush empty even though `window` is set (e.g. the window is the
   * whole range): a drag then draws a new interval, where inside a brush it
   * would move it. Points are still classed by `window`.
   */
  emptyBrush?: boolean;
}

/** An overlay spec with the counts a panel shows beside it. */
export interface IFitOverlayChart {
  spec: TopLevelSpec;
  /** Finite (x, y) pairs: every one of them is fitted. */
  plotted: number;
  /** Pairs left out because a value was NaN or infinite. */
  skipped: number;
  /** Set when the series was reduced for display: `shown` of `total` (= plotted) points drawn. Null when every point is drawn. */
  reduced: IDisplayReduction | null;
}

/**
 * Layered scatter + model curve: the spec alone ({@link buildFitOverlayChart}
 * also returns the counts).
 *
 * @throws RangeError when x and y (or the curve's x and y) differ in length.
 */
export function buildFitOverlaySpec(options: IFitOverlayOptions): TopLevelSpec {
  return buildFitOverlayChart(options).spec;
}

/**
 * Layered scatter + model curve, with how many points are plotted, skipped
 * and drawn. Non-finite pairs are left out of both layers.
 *
 * @throws RangeError when x and y (or the curve's x and y) differ in length.
 */
export function buildFitOverlayChart(options: IFitOverlayOptions): IFitOverlayChart {
  const { x, y, window, curve, theme } = options;
  if (x.length !== y.length) {
    throw new RangeError(`x has ${x.length} values but y has ${y.length}`);
  }
  const sigma = options.sigma ?? null;
  if (sigma && sigma.length !== y.length) {
    throw new RangeError(`sigma has ${sigma.length} values but y has ${y.length}`);
  }
  const n = x.length;
  const inside = new Int32Array(n);
  const outside = new Int32Array(n);
  let nIn = 0;
  let nOut = 0;
  for (let i = 0; i < n; i++) {
    const xi = x[i];
    if (Number.isFinite(xi) && Number.isFinite(y[i])) {
      if (xi >= window.min && xi <= window.max) {
        inside[nIn++] = i;
      } else {
        outside[nOut++] = i;
      }
    }
  }
  const plotted = nIn + nOut;
  const maxPoints = options.maxPoints ?? DISPLAY_MAX_POINTS;
  let drawnIn: Int32Array = inside.subarray(0, nIn);
  let drawnOut: Int32Array = outside.subarray(0, nOut);
  let reduced: IDisplayReduction | null = null;
  if (plotted > maxPoints) {
    // One grid over both groups: a grid column is the same strip of the plot for each.
    const inBounds = pointBounds(x, y, drawnIn);
    const outBounds = pointBounds(x, y, drawnOut);
    const bounds =
      inBounds && outBounds
        ? {
            xMin: Math.min(inBounds.xMin, outBounds.xMin),
            xMax: Math.max(inBounds.xMax, outBounds.xMax),
            yMin: Math.min(inBounds.yMin, outBounds.yMin),
            yMax: Math.max(inBounds.yMax, outBounds.yMax)
          }
        : (inBounds ?? outBounds);
    const [budgetIn, budgetOut] = shareBudget([nIn, nOut], maxPoints);
    drawnIn = reduceForDisplay(x, y, drawnIn, budgetIn, bounds);
    drawnOut = reduceForDisplay(x, y, drawnOut, budgetOut, bounds);
    reduced = { shown: drawnIn.length + drawnOut.length, total: plotted };
  }
  // Row order, as the table has them (both groups are in row order).
  const points: { x: number; y: number; row: number; used: string; sigma?: number }[] = new Array(drawnIn.length + drawnOut.length);
  for (let a = 0, b = 0, k = 0; k < points.length; k++) {
    const takeIn = b >= drawnOut.length || (a < drawnIn.length && drawnIn[a] < drawnOut[b]);
    const i = takeIn ? drawnIn[a++] : drawnOut[b++];
    points[k] = { x: x[i], y: y[i], row: i, used: takeIn ? 'fitted' : 'outside window' };
  }
  const line: { x: number; y: number }[] = [];
  if (curve) {
    if (curve.x.length !== curve.y.length) {
      throw new RangeError(`curve x has ${curve.x.length} values but curve y has ${curve.y.length}`);
    }
    for (let i = 0; i < curve.x.length; i++) {
      if (Number.isFinite(curve.x[i]) && Number.isFinite(curve.y[i])) {
        line.push({ x: curve.x[i], y: curve.y[i] });
      }
    }
  }
  const brush = options.brush ?? true;
  const initial = options.emptyBrush ? null : windowInData(window, points, line);
  const xEnc: PositionFieldDef<Field> = { field: 'x', type: 'quantitative', title: options.xTitle, scale: { zero: false } };
  const yEnc: PositionFieldDef<Field> = { field: 'y', type: 'quantitative', title: options.yTitle, scale: { zero: false } };
  // Inside the window: accent; outside: the text colour, faded, so it reads grey on light and dark themes.
  // With the brush the colour follows the brushed interval as it is dragged (a cleared brush greys nothing).
  const inWindow = { param: FIT_WINDOW_PARAM, empty: true } as const;
  const color: ColorDef<Field> = brush
    ? { condition: { ...inWindow, value: theme.accent }, value: theme.text }
    : { field: 'used', type: 'nominal', scale: { domain: ['fitted', 'outside window'], range: [theme.accent, theme.text] }, legend: { title: null, orient: 'bottom' } };
  const opacity = brush
    ? { condition: { ...inWindow, value: OPACITY_INSIDE }, value: OPACITY_OUTSIDE }
    : { condition: { test: "datum.used === 'fitted'", value: OPACITY_INSIDE }, value: OPACITY_OUTSIDE };
  const layers: ChartLayer[] = [
    {
      data: { values: points },
      mark: { type: 'point', filled: true, size: options.pointSize, tooltip: true },
      ...(brush
        ? {
            params: [
              {
                name: FIT_WINDOW_PARAM,
                select: {
                  type: 'interval' as const,
                  encodings: ['x' as const],
                  mark: { fill: theme.accent, fillOpacity: 0.1, stroke: theme.accent, strokeOpacity: 0.6, strokeWidth: 1 }
                },
                ...(initial ? { value: { x: initial } } : {})
              }
            ]
          }
        : {}),
      encoding: {
        x: xEnc,
        y: yEnc,
        color,
        opacity,
        tooltip: [
          { field: 'row', type: 'quantitative', title: 'row' },
          { field: 'x', type: 'quantitative', title: options.xTitle, format: '.6~g' },
          { field: 'y', type: 'quantitative', title: options.yTitle, format: '.6~g' },
          ...(sigma ? [{ field: 'sigma', type: 'quantitative' as const, title: 'σ', format: '.3~g' }] : []),
          { field: 'used', type: 'nominal', title: 'point' }
        ]
      }
    }
  ];
  if (!brush && initial) {
    // The fixed window: a shaded band behind everything.
    layers.unshift({
      data: { values: [{ lo: initial[0], hi: initial[1] }] },
      mark: { type: 'rect', color: theme.accent, opacity: 0.1 },
      encoding: { x: { field: 'lo', type: 'quantitative' }, x2: { field: 'hi' } }
    });
  }
  const bars: { x: number; lo: number; hi: number; row: number }[] = [];
  if (sigma) {
    for (const p of points) {
      const s = Math.abs(sigma[p.row]);
      if (Number.isFinite(s) && s > 0 && Number.isFinite(p.y - s) && Number.isFinite(p.y + s)) {
        bars.push({ x: p.x, lo: p.y - s, hi: p.y + s, row: p.row });
        p.sigma = s;
      }
    }
  }
  if (bars.length) {
    layers.push({
      data: { values: bars },
      mark: { type: 'rule', strokeWidth: 1 },
      encoding: {
        x: { field: 'x', type: 'quantitative' },
        y: { field: 'lo', type: 'quantitative' },
        y2: { field: 'hi' },
        color: brush ? color : { value: theme.accent },
        opacity: brush ? opacity : { value: OPACITY_INSIDE }
      }
    });
  }
  if (line.length) {
    layers.push({
      data: { name: FIT_CURVE_DATA, values: line.map(p => ({ ...p, series: options.curveLabel })) },
      mark: { type: 'line', color: theme.accent2, strokeWidth: 2, clip: true },
      encoding: {
        x: xEnc,
        y: yEnc,
        strokeDash: { field: 'series', type: 'nominal', legend: { title: null, orient: 'bottom' } }
      }
    });
  }
  const spec = layeredChart(
    layers,
    {
      description: `${options.yTitle} against ${options.xTitle}${bars.length ? ' with ±σ error bars' : ''}${line.length ? ` and ${options.curveLabel}` : ''}; the fit window is shaded${brush ? ' and can be dragged' : ''}`,
      theme
    },
    { scale: { strokeDash: 'independent' } }
  );
  return { spec, plotted, skipped: n - plotted, reduced };
}

/**
 * The window as a finite interval in data units, or null when there is none
 * to draw: infinite ends are replaced by the extreme x of the points and the
 * curve, and an interval that is empty or inverted gives null.
 */
function windowInData(window: { min: number; max: number }, points: readonly { x: number }[], line: readonly { x: number }[]): [number, number] | null {
  let lo = Infinity;
  let hi = -Infinity;
  for (const list of [points, line]) {
    for (const p of list) {
      lo = Math.min(lo, p.x);
      hi = Math.max(hi, p.x);
    }
  }
  const min = Number.isFinite(window.min) ? window.min : window.min === -Infinity ? lo : NaN;
  const max = Number.isFinite(window.max) ? window.max : window.max === Infinity ? hi : NaN;
  return Number.isFinite(min) && Number.isFinite(max) && min < max ? [min, max] : null;
}

/** The least of a Vega view the fit-window helpers use (a `vega` View has it). */
export interface IFitWindowView {
  signal(name: string, value?: unknown): unknown;
  scale(name: string): unknown;
  runAsync(): Promise<unknown>;
}

/**
 * The window in the value of the {@link FIT_WINDOW_PARAM} signal (as a
 * signal listener receives it): `{ min, max }` with min < max, or null when
 * the brush is cleared or the value is not a finite interval.
 */
export function fitWindowFromSignal(value: unknown): { min: number; max: number } | null {
  const range = value !== null && typeof value === 'object' ? (value as { x?: unknown }).x : undefined;
  if (!Array.isArray(range) || range.length !== 2) {
    return null;
  }
  const a = Number(range[0]);
  const b = Number(range[1]);
  if (!Number.isFinite(a) || !Number.isFinite(b) || a === b) {
    return null;
  }
  return { min: Math.min(a, b), max: Math.max(a, b) };
}

/** The brushed window of a drawn fit overlay, or null when the brush is cleared. */
export function readFitWindow(view: IFitWindowView): { min: number; max: number } | null {
  return fitWindowFromSignal(view.signal(FIT_WINDOW_PARAM));
}

/**
 * Move the brush of a drawn fit overlay to `window` (clipped to the plot),
 * or clear it with null, and run the view. The {@link FIT_WINDOW_PARAM}
 * signal and its listeners follow. Infinite ends go to the plot's edges.
 *
 * @throws Error when the view has no x scale (not a fit overlay).
 */
export async function setFitWindow(view: IFitWindowView, window: { min: number; max: number } | null): Promise<void> {
  const scale = view.scale('x') as ((v: number) => number) & { range(): number[] };
  if (typeof scale !== 'function') {
    throw new Error('the view has no x scale');
  }
  const [r0, r1] = scale.range();
  const left = Math.min(r0, r1);
  const right = Math.max(r0, r1);
  let extent: [number, number] = [0, 0];
  if (window && window.min < window.max) {
    const at = (v: number, edge: number): number => {
      const px = Number.isFinite(v) ? scale(v) : edge;
      return Math.min(right, Math.max(left, Number.isFinite(px) ? px : edge));
    };
    const a = at(window.min, left);
    const b = at(window.max, right);
    extent = [Math.min(a, b), Math.max(a, b)];
  }
  view.signal(FIT_WINDOW_PIXEL_SIGNAL, extent);
  await view.runAsync();
}
