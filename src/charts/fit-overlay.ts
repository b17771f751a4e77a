/**
 * Data with a fitted model: points inside the fit window drawn solid, points
 * outside it faded, and the model curve over the window.
 *
 * A series of more than `maxPoints` finite points (default
 * {@link DISPLAY_MAX_POINTS}) is drawn reduced (`./reduce.ts`): the points
 * inside and outside the window are reduced separately on one shared grid, so
 * each group keeps its own shape and extremes. The fit itself always uses
 * every row; {@link IFitOverlayChart.reduced} says how many points are drawn
 * of how many.
 */
import type { TopLevelSpec } from 'vega-lite';
import type { ChartLayer, Field, PositionFieldDef } from './frame';
import { layeredChart } from './frame';
import type { IDisplayReduction } from './reduce';
import { DISPLAY_MAX_POINTS, pointBounds, reduceForDisplay, shareBudget } from './reduce';
import type { IChartTheme } from './theme';

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
  const points: { x: number; y: number; row: number; used: string }[] = new Array(drawnIn.length + drawnOut.length);
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
  const xEnc: PositionFieldDef<Field> = { field: 'x', type: 'quantitative', title: options.xTitle, scale: { zero: false } };
  const yEnc: PositionFieldDef<Field> = { field: 'y', type: 'quantitative', title: options.yTitle, scale: { zero: false } };
  const layers: ChartLayer[] = [
    {
      data: { values: points },
      mark: { type: 'point', filled: true, size: options.pointSize, color: theme.accent, tooltip: true },
      encoding: {
        x: xEnc,
        y: yEnc,
        opacity: {
          field: 'used',
          type: 'nominal',
          scale: { domain: ['fitted', 'outside window'], range: [0.9, 0.25] },
          legend: { title: null, orient: 'bottom' }
        },
        tooltip: [
          { field: 'row', type: 'quantitative', title: 'row' },
          { field: 'x', type: 'quantitative', title: options.xTitle, format: '.6~g' },
          { field: 'y', type: 'quantitative', title: options.yTitle, format: '.6~g' },
          { field: 'used', type: 'nominal', title: 'point' }
        ]
      }
    }
  ];
  if (line.length) {
    layers.push({
      data: { values: line.map(p => ({ ...p, series: options.curveLabel })) },
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
    { description: `${options.yTitle} against ${options.xTitle}${line.length ? ` with ${options.curveLabel}` : ''}`, theme },
    { scale: { opacity: 'independent', strokeDash: 'independent' } }
  );
  return { spec, plotted, skipped: n - plotted, reduced };
}
