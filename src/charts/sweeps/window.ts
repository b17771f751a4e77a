/**
 * Effective exponent against the fit window: the exponent of each
 * (t_max, H_min) cell with ±σ error bars, one colour per H_min.
 */
import type { IExponentWindowCell } from '../../core/sweeps/index';
import type { ChartLayer, ColorDef, Field } from '../frame';
import { layeredChart } from '../frame';
import type { IChartTheme } from '../theme';
import type { ISweepChart } from './common';
import { finite } from './common';

/** Which exponent to draw. */
export type WindowExponent = 'beta' | 'gamma' | 'delta' | 'Tc' | 'deltaCriticalIsotherm' | 'kouvelFisherBeta' | 'kouvelFisherGamma';

/** Builds the exponent-against-window chart. */
export function buildExponentWindowSpec(cells: readonly IExponentWindowCell[], exponent: WindowExponent, theme: IChartTheme, fieldUnit = 'A/m'): ISweepChart {
  const rows: { tMax: number; value: number; lo: number; hi: number; hMin: string; method: string }[] = [];
  for (const c of cells) {
    const v = c[exponent];
    if (finite(v.value) && finite(c.tMax)) {
      const s = finite(v.sigma) ? v.sigma : 0;
      rows.push({ tMax: c.tMax, value: v.value, lo: v.value - s, hi: v.value + s, hMin: `${c.hMin} ${fieldUnit}`, method: c.method });
    }
  }
  const names: Record<WindowExponent, string> = {
    beta: 'beta_eff',
    gamma: 'gamma_eff',
    delta: 'delta_eff = 1 + gamma/beta',
    Tc: 'Tc (K)',
    deltaCriticalIsotherm: 'delta_eff (critical isotherm)',
    kouvelFisherBeta: 'beta_eff (Kouvel-Fisher)',
    kouvelFisherGamma: 'gamma_eff (Kouvel-Fisher)'
  };
  const name = names[exponent];
  const color: ColorDef<Field> = { field: 'hMin', type: 'nominal', title: 'H_min' };
  const layer: ChartLayer[] = [
    {
      data: { values: rows },
      mark: { type: 'rule', color: theme.grid },
      encoding: {
        x: { field: 'tMax', type: 'quantitative', title: 't_max = largest |T - Tc|/Tc', scale: { type: 'log' } },
        y: { field: 'lo', type: 'quantitative', title: name, scale: { zero: false } },
        y2: { field: 'hi' },
        color
      }
    },
    {
      data: { values: rows },
      mark: { type: 'line', point: true, tooltip: true },
      encoding: {
        x: { field: 'tMax', type: 'quantitative' },
        y: { field: 'value', type: 'quantitative' },
        color,
        strokeDash: { field: 'method', type: 'nominal', title: 'method' }
      }
    }
  ];
  return { spec: layeredChart(layer, { description: `${name} against the fit window t_max, one series per H_min, error bars ±1 sigma`, theme }), rows: 2 * rows.length };
}
