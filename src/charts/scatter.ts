/**
 * Vega-Lite scatter of two columns of a table: the first chart a user sees
 * after picking x and y.
 */
import type { TopLevelSpec } from 'vega-lite';
import { singleViewChart } from './frame';
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
}

/** A scatter spec and how many points it plots. */
export interface IScatterSpec {
  spec: TopLevelSpec;
  /** Points plotted (finite pairs). */
  plotted: number;
  /** Pairs left out because a value was NaN or infinite. */
  skipped: number;
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
  const values: { x: number; y: number; row: number }[] = [];
  for (let i = 0; i < x.length; i++) {
    const xi = x[i];
    const yi = y[i];
    if (Number.isFinite(xi) && Number.isFinite(yi)) {
      values.push({ x: xi, y: yi, row: i });
    }
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
  return { spec, plotted: values.length, skipped: x.length - values.length };
}
