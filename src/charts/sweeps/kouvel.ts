/**
 * Kouvel–Fisher chart: X(T) = Ms/(dMs/dT) below Tc and Y(T) = χ0⁻¹/(dχ0⁻¹/dT)
 * above Tc, with the fitted straight lines (T − Tc)/β and (T − Tc)/γ (slopes
 * 1/β and 1/γ, zero at each side's Tc).
 */
import type { IKouvelFisherResult, IKouvelFisherSide } from '../../core/sweeps/index';
import type { ChartLayer, ColorDef, Field } from '../frame';
import { layeredChart } from '../frame';
import type { IChartTheme } from '../theme';
import type { ISweepChart, ISweepChartOptions } from './common';
import { finite, finiteRows, frameTitle, named } from './common';

const X_NAME = 'X = Ms/(dMs/dT)';
const Y_NAME = 'Y = χ0⁻¹/(dχ0⁻¹/dT)';

/** The fitted line of one side over its points' T range widened to its Tc: two rows, or none. */
function sideLine(s: IKouvelFisherSide, name: string): { T: number; value: number; quantity: string }[] {
  const Tc = s.Tc.value;
  const e = s.exponent.value;
  const pts = s.points.filter(p => finite(p.T) && finite(p.value));
  if (pts.length === 0 || !finite(e) || e === 0 || !finite(Tc)) {
    return [];
  }
  let lo = Tc;
  let hi = Tc;
  for (const p of pts) {
    lo = Math.min(lo, p.T);
    hi = Math.max(hi, p.T);
  }
  return finiteRows([lo, hi].map(T => ({ T, value: (T - Tc) / e, quantity: name })));
}

/** Builds the Kouvel–Fisher chart; a null result gives an empty chart saying there is none. */
export function buildKouvelFisherSpec(kf: IKouvelFisherResult | null, theme: IChartTheme, options: ISweepChartOptions = {}): ISweepChart {
  const points: { T: number; value: number; quantity: string }[] = [];
  const lines: { T: number; value: number; quantity: string }[] = [];
  if (kf !== null) {
    const sides: [IKouvelFisherSide, string][] = [
      [kf.below, X_NAME],
      [kf.above, Y_NAME]
    ];
    for (const [s, name] of sides) {
      for (const p of s.points) {
        if (finite(p.T) && finite(p.value)) {
          points.push({ T: p.T, value: p.value, quantity: name });
        }
      }
      lines.push(...sideLine(s, name));
    }
  }
  // One colour and one shape per quantity, from the theme's two accents.
  const color: ColorDef<Field> = { field: 'quantity', type: 'nominal', title: null, scale: { domain: [X_NAME, Y_NAME], range: [theme.accent, theme.accent2] } };
  const layer: ChartLayer[] = [
    {
      data: { values: points },
      mark: { type: 'point', filled: true, tooltip: true },
      encoding: {
        x: { field: 'T', type: 'quantitative', title: 'T (K)', scale: { zero: false } },
        y: { field: 'value', type: 'quantitative', title: 'X below Tc, Y above Tc (K)' },
        color,
        shape: { field: 'quantity', type: 'nominal', title: null, scale: { domain: [X_NAME, Y_NAME], range: ['circle', 'square'] } }
      }
    },
    {
      data: { values: lines },
      mark: { type: 'line', strokeDash: [4, 3] },
      encoding: {
        x: { field: 'T', type: 'quantitative' },
        y: { field: 'value', type: 'quantitative' },
        color,
        detail: { field: 'quantity', type: 'nominal' }
      }
    }
  ];
  const title = 'Kouvel–Fisher plot';
  const caption =
    kf === null
      ? 'No Kouvel–Fisher result'
      : `${named('β', kf.below.exponent)} (slope 1/β), ${named('γ', kf.above.exponent)} (slope 1/γ), ${named('Tc', kf.Tc, 'K', 6)}`;
  return {
    spec: layeredChart(layer, {
      description: `Kouvel-Fisher plot: X(T) with slope 1/β and Y(T) with slope 1/γ, both zero at Tc, fitted lines dashed. ${caption}`,
      theme,
      title: frameTitle(title, caption, options),
      height: options.height
    }),
    rows: points.length + lines.length,
    title,
    caption
  };
}
