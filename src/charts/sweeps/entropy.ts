/**
 * Magnetic entropy change −ΔS_M(T) for each field change, with ±σ bars.
 */
import type { IEntropyResult } from '../../core/sweeps/index';
import type { ChartLayer, ColorDef, Field } from '../frame';
import { layeredChart } from '../frame';
import type { IChartTheme } from '../theme';
import type { ISweepChart } from './common';
import { finite } from './common';

/** Builds the ΔS_M(T) chart (plotted as −ΔS_M, positive for a ferromagnet near Tc). */
export function buildEntropySpec(result: IEntropyResult, theme: IChartTheme): ISweepChart {
  const rows: { T: number; minusDS: number; lo: number; hi: number; field: string }[] = [];
  for (const c of result.curves) {
    const label = `mu0 dH = ${c.mu0DeltaH.toPrecision(3)} T`;
    for (const p of c.points) {
      if (finite(p.T) && finite(p.dS)) {
        const s = finite(p.sigma) ? p.sigma : 0;
        rows.push({ T: p.T, minusDS: -p.dS, lo: -p.dS - s, hi: -p.dS + s, field: label });
      }
    }
  }
  const color: ColorDef<Field> = { field: 'field', type: 'nominal', title: 'field change' };
  const title = `-ΔS_M (${result.unit})`;
  const layer: ChartLayer[] = [
    {
      data: { values: rows },
      mark: { type: 'rule', color: theme.grid },
      encoding: {
        x: { field: 'T', type: 'quantitative', title: 'T (K)', scale: { zero: false } },
        y: { field: 'lo', type: 'quantitative', title },
        y2: { field: 'hi' },
        color
      }
    },
    {
      data: { values: rows },
      mark: { type: 'line', point: true, tooltip: true },
      encoding: {
        x: { field: 'T', type: 'quantitative' },
        y: { field: 'minusDS', type: 'quantitative' },
        color
      }
    }
  ];
  return { spec: layeredChart(layer, { description: `Magnetic entropy change ${title} against T from the Maxwell relation`, theme }), rows: 2 * rows.length };
}
