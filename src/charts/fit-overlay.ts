/**
 * Data with a fitted model: points inside the fit window drawn solid, points
 * outside it faded, and the model curve over the window.
 */
import type { TopLevelSpec } from 'vega-lite';
import type { ChartLayer, Field, PositionFieldDef } from './frame';
import { layeredChart } from './frame';
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
}

/**
 * Layered scatter + model curve. Non-finite pairs are left out of both.
 *
 * @throws RangeError when x and y (or the curve's x and y) differ in length.
 */
export function buildFitOverlaySpec(options: IFitOverlayOptions): TopLevelSpec {
  const { x, y, window, curve, theme } = options;
  if (x.length !== y.length) {
    throw new RangeError(`x has ${x.length} values but y has ${y.length}`);
  }
  const points: { x: number; y: number; row: number; used: string }[] = [];
  for (let i = 0; i < x.length; i++) {
    if (Number.isFinite(x[i]) && Number.isFinite(y[i])) {
      points.push({ x: x[i], y: y[i], row: i, used: x[i] >= window.min && x[i] <= window.max ? 'fitted' : 'outside window' });
    }
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
  return layeredChart(
    layers,
    { description: `${options.yTitle} against ${options.xTitle}${line.length ? ` with ${options.curveLabel}` : ''}`, theme },
    { scale: { opacity: 'independent', strokeDash: 'independent' } }
  );
}
