/**
 * Residuals of a fit against x: (y − model)/σ when the points have σ, with
 * a zero rule and shaded bands at ±1σ and ±2σ (about 68 % and 95 % of the
 * points of a good fit with Gaussian errors fall inside them), else the raw
 * residuals y − model in the unit of y with the zero rule only.
 */
import type { ChartLayer } from '../frame';
import { layeredChart } from '../frame';
import type { IChartTheme } from '../theme';
import type { ISweepChart } from '../sweeps/common';
import { finite, fmt } from '../sweeps/common';
import type { ITemperatureChartOptions } from './common';
import { drawnRows, reducedNote, titleLines } from './common';

/** Input of {@link buildResidualSpec}. */
export interface IResidualInput {
  x: ArrayLike<number>;
  /** y − model at each x. */
  residuals: ArrayLike<number>;
  /** Standard uncertainty of each y; residuals are divided by it where it is finite and positive. */
  sigma?: ArrayLike<number>;
  xTitle: string;
}

/** Options of {@link buildResidualSpec}. */
export interface IResidualChartOptions extends ITemperatureChartOptions {
  /** Unit of y, shown on the axis of raw residuals ('' or omitted: none). */
  yUnit?: string;
}

/** Name of the residual points' dataset, with rows {@link residualRows}: a drawn view takes new residuals in place. */
export const RESIDUAL_DATA = 'residuals';

/** The rows of the residual points: (x, residual or residual/σ, row), reduced like the chart's. */
export function residualRows(input: Omit<IResidualInput, 'xTitle'>, options: { maxPoints?: number } = {}): { x: number; r: number; row: number }[] {
  return residualValues(input, options).points;
}

function residualValues(input: Omit<IResidualInput, 'xTitle'>, options: { maxPoints?: number }) {
  const { x, residuals } = input;
  const n = Math.min(x.length, residuals.length);
  const sigma = input.sigma;
  const usable = (i: number): boolean => sigma !== undefined && i < sigma.length && finite(sigma[i]) && sigma[i] !== 0;
  let normalised = false;
  for (let i = 0; i < n && !normalised; i++) {
    normalised = usable(i) && finite(x[i]) && finite(residuals[i] / Math.abs(sigma![i]));
  }
  const value = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    value[i] = normalised ? (usable(i) ? residuals[i] / Math.abs(sigma![i]) : Number.NaN) : residuals[i];
  }
  const { rows, total } = drawnRows(x, value, () => true, options.maxPoints);
  const points = Array.from(rows, i => ({ x: x[i], r: value[i], row: i }));
  return { n, normalised, value, rows, total, points };
}

/** Builds the residual chart; empty or non-finite input gives an empty chart saying so. */
export function buildResidualSpec(input: IResidualInput, theme: IChartTheme, options: IResidualChartOptions = {}): ISweepChart {
  const { x } = input;
  const { n, normalised, value, rows, total, points } = residualValues(input, options);
  let beyond = 0;
  if (normalised) {
    for (let i = 0; i < n; i++) {
      if (finite(x[i]) && Math.abs(value[i]) > 2) {
        beyond++;
      }
    }
  }
  const unit = (options.yUnit ?? '').trim();
  const yTitle = normalised ? '(y − model)/σ' : unit ? `y − model (${unit})` : 'y − model';
  const layer: ChartLayer[] = [];
  if (normalised) {
    layer.push(
      {
        data: { values: [{ lo: -2, hi: 2 }] },
        mark: { type: 'rect', color: theme.accent, opacity: 0.08 },
        encoding: { y: { field: 'lo', type: 'quantitative' }, y2: { field: 'hi' } }
      },
      {
        data: { values: [{ lo: -1, hi: 1 }] },
        mark: { type: 'rect', color: theme.accent, opacity: 0.12 },
        encoding: { y: { field: 'lo', type: 'quantitative' }, y2: { field: 'hi' } }
      }
    );
  }
  layer.push(
    {
      data: { values: [{ zero: 0 }] },
      mark: { type: 'rule', color: theme.text, strokeWidth: 1, opacity: 0.7 },
      encoding: { y: { field: 'zero', type: 'quantitative' } }
    },
    {
      data: { name: RESIDUAL_DATA, values: points },
      mark: { type: 'point', filled: true, size: 30, color: theme.accent, opacity: 0.9, tooltip: true },
      encoding: {
        x: { field: 'x', type: 'quantitative', title: input.xTitle, scale: { zero: false } },
        y: { field: 'r', type: 'quantitative', title: yTitle },
        tooltip: [
          { field: 'row', type: 'quantitative', title: 'row' },
          { field: 'x', type: 'quantitative', title: input.xTitle, format: '.6~g' },
          { field: 'r', type: 'quantitative', title: yTitle, format: '.4~g' }
        ]
      }
    }
  );
  const title = normalised ? 'Normalised residuals' : 'Residuals';
  let caption: string;
  if (total === 0) {
    caption = 'No residuals to draw';
  } else if (normalised) {
    const share = fmt((100 * beyond) / total, 2);
    const left = n - total;
    caption =
      `${total} residuals divided by σ; ${beyond} beyond ±2σ (${share} %, about 5 % for a good fit with Gaussian errors)` +
      (left > 0 ? `; ${left} rows without a finite residual or σ left out` : '') +
      reducedNote(rows.length, total);
  } else {
    caption = `${total} residuals y − model${unit ? ` in ${unit}` : ''}; no σ, so not normalised` + reducedNote(rows.length, total);
  }
  return {
    spec: layeredChart(layer, {
      description: `${title} against ${input.xTitle}${normalised ? ' with bands at ±1σ and ±2σ' : ''} and a rule at zero. ${caption}`,
      theme,
      title: titleLines(title, caption, options),
      height: options.height
    }),
    rows: points.length + layer.length - 1,
    title,
    caption
  };
}
