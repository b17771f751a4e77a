/**
 * Kouvel–Fisher chart: X(T) = Ms/(dMs/dT) below Tc and Y(T) = χ0⁻¹/(dχ0⁻¹/dT)
 * above Tc, with the fitted straight lines (T − Tc)/β and (T − Tc)/γ.
 */
import type { IKouvelFisherResult } from '../../core/sweeps/index';
import type { ChartLayer } from '../frame';
import { layeredChart } from '../frame';
import type { IChartTheme } from '../theme';
import type { ISweepChart } from './common';
import { finite } from './common';

/** Builds the Kouvel–Fisher chart. */
export function buildKouvelFisherSpec(kf: IKouvelFisherResult, theme: IChartTheme): ISweepChart {
  const points: { T: number; value: number; quantity: string }[] = [];
  const lines: { T: number; value: number; quantity: string }[] = [];
  const sides: [typeof kf.below, string][] = [
    [kf.below, 'X = Ms/(dMs/dT)'],
    [kf.above, 'Y = (1/chi0)/(d(1/chi0)/dT)']
  ];
  for (const [s, name] of sides) {
    for (const p of s.points) {
      if (finite(p.T) && finite(p.value)) {
        points.push({ T: p.T, value: p.value, quantity: name });
      }
    }
    if (s.points.length > 0 && finite(s.exponent.value) && finite(s.Tc.value)) {
      let lo = s.Tc.value;
      let hi = s.Tc.value;
      for (const p of s.points) {
        lo = p.T < lo ? p.T : lo;
        hi = p.T > hi ? p.T : hi;
      }
      for (const T of [lo, hi]) {
        lines.push({ T, value: (T - s.Tc.value) / s.exponent.value, quantity: name });
      }
    }
  }
  const layer: ChartLayer[] = [
    {
      data: { values: points },
      mark: { type: 'point', filled: true, tooltip: true },
      encoding: {
        x: { field: 'T', type: 'quantitative', title: 'T (K)', scale: { zero: false } },
        y: { field: 'value', type: 'quantitative', title: 'X, Y (K)' },
        color: { field: 'quantity', type: 'nominal', title: null, scale: { range: [theme.accent, theme.accent2] } }
      }
    },
    {
      data: { values: lines },
      mark: { type: 'line', strokeDash: [4, 3] },
      encoding: {
        x: { field: 'T', type: 'quantitative' },
        y: { field: 'value', type: 'quantitative' },
        color: { field: 'quantity', type: 'nominal', scale: { range: [theme.accent, theme.accent2] } }
      }
    }
  ];
  return { spec: layeredChart(layer, { description: 'Kouvel-Fisher plot: X(T) slope 1/beta and Y(T) slope 1/gamma, both zero at Tc', theme }), rows: points.length + lines.length };
}
