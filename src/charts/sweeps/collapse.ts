/**
 * Scaling plot [B9 in REFERENCES.md]: m = M|t|^−β against h = H|t|^−(β+γ) on log
 * axes, one colour per branch (t < 0, t > 0), for given (Tc, β, γ).
 */
import type { IIsotherm } from '../../core/sweeps/index';
import type { ChartLayer } from '../frame';
import { layeredChart } from '../frame';
import type { IChartTheme } from '../theme';
import type { ISweepChart } from './common';
import { finite } from './common';

/** Builds the scaling plot; isotherms with |t| < tMin are left out (default 1e-3). */
export function buildCollapseSpec(isotherms: readonly IIsotherm[], scaling: { Tc: number; beta: number; gamma: number }, theme: IChartTheme, tMin = 1e-3): ISweepChart {
  const { Tc, beta, gamma } = scaling;
  if (!(Tc > 0) || !(beta > 0) || !(gamma > 0)) {
    throw new RangeError(`Tc, beta and gamma must be > 0, got ${Tc}, ${beta}, ${gamma}`);
  }
  const rows: { T: number; h: number; m: number; branch: string }[] = [];
  for (const iso of isotherms) {
    const t = (iso.T - Tc) / Tc;
    if (!(Math.abs(t) >= tMin)) {
      continue;
    }
    const a = Math.abs(t);
    for (let i = 0; i < iso.H.length; i++) {
      if (iso.H[i] > 0 && iso.M[i] > 0) {
        const h = iso.H[i] * Math.pow(a, -(beta + gamma));
        const m = iso.M[i] * Math.pow(a, -beta);
        if (finite(h) && finite(m)) {
          rows.push({ T: iso.T, h, m, branch: t < 0 ? 't < 0' : 't > 0' });
        }
      }
    }
  }
  const layer: ChartLayer[] = [
    {
      data: { values: rows },
      mark: { type: 'point', filled: true, size: 10, tooltip: true },
      encoding: {
        x: { field: 'h', type: 'quantitative', title: `h = H |t|^-(beta+gamma), t = (T - Tc)/Tc, Tc = ${Tc.toPrecision(6)}`, scale: { type: 'log' } },
        y: { field: 'm', type: 'quantitative', title: `m = M |t|^-beta (beta = ${beta.toPrecision(4)}, gamma = ${gamma.toPrecision(4)})`, scale: { type: 'log' } },
        color: { field: 'branch', type: 'nominal', title: 'branch', scale: { range: [theme.accent, theme.accent2] } },
        detail: { field: 'T', type: 'quantitative' }
      }
    }
  ];
  return { spec: layeredChart(layer, { description: 'Scaling plot: renormalised m against h on log axes, two branches', theme }), rows: rows.length };
}
