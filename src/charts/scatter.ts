/**
 * Vega-Lite scatter of two columns of a table: the first chart a user sees
 * after picking x and y. More than `maxPoints` finite pairs (default
 * {@link DISPLAY_MAX_POINTS}) are drawn reduced (`./reduce.ts`).
 */
import type { TopLevelSpec } from 'vega-lite';
import { singleViewChart } from './frame';
import type { IDisplayReduction } from './reduce';
import { DISPLAY_MAX_POINTS, finiteRows, reduceForDisplay } from './reduce';
import type { IChartTheme } from './theme';

/** Input of {@link buildScatterSpec}. */
export interface IScatterOptions {
  /** x values; pairs where either value is not finite are left out. */
  x: ArrayLike<number>;
  /** y values, same length as x. */
  y: ArrayLike<number>;
  /** Axis titles, units included (e.g. "T (K)"). */
  xTitle: string;
  yTitle: string;
  /** Point area in px². */
  pointSize: number;
  theme: IChartTheme;
  /** Accessible description of the chart. */
  description?: string;
  /** Most points drawn (default {@link DISPLAY_MAX_POINTS}); larger series are reduced for display. */
  maxPoints?: number;
}

/** A scatter spec and how many points it plots. */
export interface IScatterSpec {
  spec: TopLevelSpec;
  /** Points plotted (finite pairs). */
  plotted: number;
  /** Pairs left out because a value was NaN or infinite. */
  skipped: number;
  /** Set when the series was reduced for display: `shown` of `total` (= plotted) points drawn. Null when every point is drawn. */
  reduced: IDisplayReduction | null;
}

/**
 * Build a scatter spec from two numeric columns.
 *
 * @throws RangeError when x and y differ in length.
 */
export function buildScatterSpec(options: IScatterOptions): IScatterSpec {
  const { x, y } = options;
  if (x.length !== y.length) {
    throw new RangeError(`x has ${x.length} values but y has ${y.length}`);
  }
  const rows = finiteRows(x, y);
  const maxPoints = options.maxPoints ?? DISPLAY_MAX_POINTS;
  const drawn = rows.length > maxPoints ? reduceForDisplay(x, y, rows, maxPoints) : rows;
  const values: { x: number; y: number; row: number }[] = new Array(drawn.length);
  for (let k = 0; k < drawn.length; k++) {
    const i = drawn[k];
    values[k] = { x: x[i], y: y[i], row: i };
  }
  const spec = singleViewChart(
    {
      data: { values },
      mark: { type: 'point', filled: true, size: options.pointSize, color: options.theme.accent, tooltip: true },
      encoding: {
        x: { field: 'x', type: 'quantitative', title: options.xTitle, scale: { zero: false } },
        y: { field: 'y', type: 'quantitative', title: options.yTitle, scale: { zero: false } },
        tooltip: [
          { field: 'row', type: 'quantitative', title: 'row' },
          { field: 'x', type: 'quantitative', title: options.xTitle, format: '.6~g' },
          { field: 'y', type: 'quantitative', title: options.yTitle, format: '.6~g' }
        ]
      }
    },
    { description: options.description ?? `${options.yTitle} against ${options.xTitle}`, theme: options.theme, height: 280 }
  );
  const reduced = drawn.length < rows.length ? { shown: drawn.length, total: rows.length } : null;
  return { spec, plotted: rows.length, skipped: x.length - rows.length, reduced };
}
