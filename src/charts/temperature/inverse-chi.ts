/**
 * Inverse susceptibility 1/χ against T: the data (with σ(1/χ) = σ/χ² error
 * bars when χ has σ), the fitted Curie–Weiss model drawn as 1/χ_model, a
 * rule at 1/χ = 0, and θ marked where the model's 1/χ reaches zero. When θ
 * lies outside the curve's range the line is carried on to (θ, 0) dashed:
 * 1/χ_model vanishes at T = θ, where χ_model diverges.
 */
import type { ChartLayer } from '../frame';
import { layeredChart } from '../frame';
import type { IChartTheme } from '../theme';
import type { ISweepChart } from '../sweeps/common';
import { finite, finiteRows, fmt } from '../sweeps/common';
import type { ITemperatureChartOptions } from './common';
import { drawnRows, reducedNote, titleLines } from './common';

/** Input of {@link buildInverseChiSpec}. */
export interface IInverseChiInput {
  T: ArrayLike<number>;
  /** Susceptibility at each T. */
  chi: ArrayLike<number>;
  /** Standard uncertainty of each χ. */
  sigma?: ArrayLike<number>;
  /** The fitted model χ(T) (x = T, y = χ), drawn as 1/χ. */
  curve?: { x: number[]; y: number[] };
  /** Weiss temperature θ of the fit (K). */
  theta?: number;
  /** Unit of χ ('' when dimensionless). */
  yUnit: string;
}

/** Options of {@link buildInverseChiSpec}. */
export interface IInverseChiChartOptions extends ITemperatureChartOptions {
  /** Axis title of T (default "T (K)"). */
  xTitle?: string;
}

/** The unit of 1/χ written from the unit of χ. */
function inverseUnit(unit: string): string {
  const u = unit.trim();
  if (!u) {
    return '';
  }
  return /^[A-Za-z]+$/.test(u) ? `${u}⁻¹` : `(${u})⁻¹`;
}

/** Builds the 1/χ chart; empty or non-finite input gives an empty chart saying so. */
export function buildInverseChiSpec(input: IInverseChiInput, theme: IChartTheme, options: IInverseChiChartOptions = {}): ISweepChart {
  const { T, chi, sigma } = input;
  const n = Math.min(T.length, chi.length);
  const inv = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    inv[i] = chi[i] !== 0 ? 1 / chi[i] : Number.NaN;
  }
  const { rows, total } = drawnRows(T, inv, () => true, options.maxPoints);
  const points = Array.from(rows, i => ({ T: T[i], inv: inv[i], row: i }));
  const bars = finiteRows(
    sigma
      ? Array.from(rows)
          .filter(i => i < sigma.length && finite(sigma[i]) && sigma[i] !== 0)
          .map(i => {
            const s = Math.abs(sigma[i]) / (chi[i] * chi[i]);
            return { T: T[i], lo: inv[i] - s, hi: inv[i] + s };
          })
      : []
  );
  const line: { T: number; inv: number }[] = [];
  if (input.curve) {
    const { x, y } = input.curve;
    for (let i = 0; i < Math.min(x?.length ?? 0, y?.length ?? 0); i++) {
      const v = 1 / y[i];
      if (finite(x[i]) && finite(y[i]) && y[i] !== 0 && finite(v)) {
        line.push({ T: x[i], inv: v });
      }
    }
    line.sort((a, b) => a.T - b.T);
  }
  const theta = input.theta !== undefined && finite(input.theta) ? input.theta : null;
  // Carry the model on to (θ, 0) when θ is beyond the curve's ends.
  const reach: { T: number; inv: number; i: number }[] = [];
  if (theta !== null && line.length > 0) {
    const first = line[0];
    const last = line[line.length - 1];
    const from = theta < first.T ? first : theta > last.T ? last : null;
    if (from) {
      reach.push({ T: from.T, inv: from.inv, i: 0 }, { T: theta, inv: 0, i: 1 });
    }
  }
  const xTitle = options.xTitle ?? 'T (K)';
  const iu = inverseUnit(input.yUnit ?? '');
  const yTitle = iu ? `1/χ (${iu})` : '1/χ';
  const x = { field: 'T', type: 'quantitative' as const, title: xTitle, scale: { zero: false } };
  const y = { field: 'inv', type: 'quantitative' as const, title: yTitle };
  const layer: ChartLayer[] = [
    {
      data: { values: [{ zero: 0 }] },
      mark: { type: 'rule', color: theme.text, strokeWidth: 1, opacity: 0.6 },
      encoding: { y: { field: 'zero', type: 'quantitative' } }
    }
  ];
  if (bars.length > 0) {
    layer.push({
      data: { values: bars },
      mark: { type: 'rule', color: theme.accent, strokeWidth: 1, opacity: 0.8 },
      encoding: { x, y: { field: 'lo', type: 'quantitative' }, y2: { field: 'hi' } }
    });
  }
  layer.push({
    data: { values: points },
    mark: { type: 'point', filled: true, size: 30, color: theme.accent, opacity: 0.9, tooltip: true },
    encoding: {
      x,
      y,
      tooltip: [
        { field: 'row', type: 'quantitative', title: 'row' },
        { field: 'T', type: 'quantitative', title: xTitle, format: '.6~g' },
        { field: 'inv', type: 'quantitative', title: yTitle, format: '.4~g' }
      ]
    }
  });
  if (line.length > 0) {
    layer.push({
      data: { values: line },
      mark: { type: 'line', color: theme.accent2, strokeWidth: 2, clip: true },
      encoding: { x, y }
    });
  }
  if (reach.length > 0) {
    layer.push({
      data: { values: reach },
      mark: { type: 'line', color: theme.accent2, strokeWidth: 1.5, strokeDash: [5, 4], opacity: 0.8 },
      encoding: { x, y, order: { field: 'i', type: 'quantitative' } }
    });
  }
  const thetaText = theta !== null ? `θ = ${fmt(theta)} K` : '';
  if (theta !== null) {
    const mark = [{ T: theta, inv: 0, label: thetaText }];
    layer.push(
      {
        data: { values: mark },
        mark: { type: 'point', shape: 'diamond', filled: true, size: 90, color: theme.accent2 },
        encoding: { x, y }
      },
      {
        data: { values: mark },
        mark: { type: 'text', color: theme.text, align: 'left', baseline: 'bottom', dx: 6, dy: -6, fontSize: 11 },
        encoding: { x, y, text: { field: 'label', type: 'nominal' } }
      }
    );
  }
  const title = 'Inverse susceptibility';
  const caption =
    total === 0 && line.length === 0
      ? 'No susceptibility to draw'
      : [
          `${total} points`,
          line.length > 0 ? 'line: 1/χ of the Curie–Weiss fit' : 'no fit drawn',
          theta !== null ? `${thetaText} where it reaches zero` : 'θ unknown',
          bars.length > 0 ? 'error bars ±σ(1/χ) = σ/χ²' : ''
        ]
          .filter(s => s)
          .join('; ') + reducedNote(points.length, total);
  return {
    spec: layeredChart(layer, {
      description: `1/χ against T: the data, 1/χ of the Curie–Weiss fit, and θ where it reaches zero. ${caption}`,
      theme,
      title: titleLines(title, caption, options),
      height: options.height
    }),
    rows: 1 + points.length + bars.length + line.length + reach.length + (theta !== null ? 2 : 0),
    title,
    caption
  };
}
