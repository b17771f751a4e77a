/**
 * Magnetic entropy change as a map: −ΔS_M over (T, μ0ΔH) as a heat map, one
 * cell per (mid temperature, field change), coloured along the theme's own
 * sequential ramp (never a chart library's default scheme). Cells reach
 * halfway to their neighbours in T (per field change) and in μ0ΔH, so an
 * uneven grid is drawn without gaps or overlaps.
 */
import type { IEntropyResult } from '../../core/sweeps/index';
import type { ChartLayer } from '../frame';
import { layeredChart } from '../frame';
import type { IChartTheme } from '../theme';
import { sequentialColours } from '../theme';
import type { ISweepChart, ISweepChartOptions } from './common';
import { finite, finiteRows, frameTitle } from './common';
import { entropyCaption } from './entropy';

/** Edges of cells centred on sorted, distinct values: halfway between neighbours, the outer ones mirrored. */
function edges(v: readonly number[], single: number): { lo: number; hi: number }[] {
  if (v.length === 1) {
    return [{ lo: v[0] - single, hi: v[0] + single }];
  }
  return v.map((x, i) => {
    const lo = i > 0 ? 0.5 * (v[i - 1] + x) : x - 0.5 * (v[1] - x);
    const hi = i + 1 < v.length ? 0.5 * (x + v[i + 1]) : x + 0.5 * (x - v[i - 1]);
    return { lo, hi };
  });
}

/** Sorted distinct finite values. */
function distinct(v: Iterable<number>): number[] {
  return [...new Set([...v].filter(finite))].sort((a, b) => a - b);
}

/** Builds the −ΔS_M(T, μ0ΔH) heat map; null or no points gives an empty chart. */
export function buildEntropyMapSpec(result: IEntropyResult | null, theme: IChartTheme, options: ISweepChartOptions = {}): ISweepChart {
  const curves = (result?.curves ?? []).filter(c => finite(c.mu0DeltaH) && c.mu0DeltaH > 0);
  const fields = distinct(curves.map(c => c.mu0DeltaH));
  // One field change alone: a band from half to one and a half times it.
  const fEdges = edges(fields, fields.length === 1 ? 0.5 * fields[0] : 0);
  const raw: { T: number; T0: number; T1: number; field: number; f0: number; f1: number; minusDS: number }[] = [];
  for (const c of curves) {
    const fe = fEdges[fields.indexOf(c.mu0DeltaH)];
    const pts = c.points.filter(p => finite(p.T) && finite(p.dS));
    const Ts = distinct(pts.map(p => p.T));
    const te = edges(Ts, 0.5);
    for (const p of pts) {
      const e = te[Ts.indexOf(p.T)];
      // The lower field edge never goes below zero.
      raw.push({ T: p.T, T0: e.lo, T1: e.hi, field: c.mu0DeltaH, f0: Math.max(0, fe.lo), f1: fe.hi, minusDS: -p.dS });
    }
  }
  const rows = finiteRows(raw);
  const unit = result?.unit ?? 'J/(kg K)';
  const ramp = sequentialColours(theme);
  const layer: ChartLayer[] = [
    {
      data: { values: rows },
      mark: { type: 'rect', tooltip: true },
      encoding: {
        x: { field: 'T0', type: 'quantitative', title: 'T (K)', scale: { zero: false, nice: false } },
        x2: { field: 'T1' },
        y: { field: 'f0', type: 'quantitative', title: 'field change μ0ΔH (T)', scale: { zero: true, nice: false } },
        y2: { field: 'f1' },
        color: { field: 'minusDS', type: 'quantitative', title: `−ΔS_M (${unit})`, scale: { type: 'linear', zero: false, range: ramp } }
      }
    }
  ];
  const title = 'Magnetic entropy change map';
  const caption = entropyCaption(result);
  return {
    spec: layeredChart(layer, {
      description: `Heat map of −ΔS_M (${unit}) over temperature and field change μ0ΔH, darker for larger values. ${caption}`,
      theme,
      title: frameTitle(title, caption, options),
      height: options.height
    }),
    rows: rows.length,
    title,
    caption
  };
}
