/**
 * Data with a fitted model: points inside the fit window drawn solid, points
 * outside it faded, and the model curve over the window.
 */
import type { TopLevelSpec } from 'vega-lite';
import type { IChartTheme } from './theme';
import { themeConfig } from './theme';

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
  const xEnc = { field: 'x', type: 'quantitative' as const, title: options.xTitle, scale: { zero: false } };
  const yEnc = { field: 'y', type: 'quantitative' as const, title: options.yTitle, scale: { zero: false } };
  const layers: TopLevelSpec[] = [];
  const pointLayer = {
    data: { values: points },
    mark: { type: 'point' as const, filled: true, size: options.pointSize, color: theme.accent, tooltip: true },
    encoding: {
      x: xEnc,
      y: yEnc,
      opacity: {
        field: 'used',
        type: 'nominal' as const,
        scale: { domain: ['fitted', 'outside window'], range: [0.9, 0.25] },
        legend: { title: null, orient: 'bottom' as const }
      },
      tooltip: [
        { field: 'row', type: 'quantitative' as const, title: 'row' },
        { field: 'x', type: 'quantitative' as const, title: options.xTitle, format: '.6~g' },
        { field: 'y', type: 'quantitative' as const, title: options.yTitle, format: '.6~g' },
        { field: 'used', type: 'nominal' as const, title: 'point' }
      ]
    }
  };
  layers.push(pointLayer as unknown as TopLevelSpec);
  if (line.length) {
    layers.push({
      data: { values: line.map(p => ({ ...p, series: options.curveLabel })) },
      mark: { type: 'line', color: theme.accent2, strokeWidth: 2, clip: true },
      encoding: {
        x: xEnc,
        y: yEnc,
        strokeDash: { field: 'series', type: 'nominal', legend: { title: null, orient: 'bottom' } }
      }
    } as unknown as TopLevelSpec);
  }
  return {
    $schema: 'https://vega.github.io/schema/vega-lite/v6.json',
    description: `${options.yTitle} against ${options.xTitle}${line.length ? ` with ${options.curveLabel}` : ''}`,
    width: 'container',
    height: 300,
    autosize: { type: 'fit', contains: 'padding' },
    layer: layers,
    resolve: { scale: { opacity: 'independent', strokeDash: 'independent' } },
    config: themeConfig(theme)
  } as unknown as TopLevelSpec;
}
