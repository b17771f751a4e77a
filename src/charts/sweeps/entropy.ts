/**
 * Magnetic entropy change −ΔS_M(T) for each field change, as curves with ±σ
 * bars, one colour per field change (the theme's series colours, in field
 * order).
 */
import type { IEntropyResult } from '../../core/sweeps/index';
import type { ChartLayer, ColorDef, Field } from '../frame';
import { layeredChart } from '../frame';
import type { IChartTheme } from '../theme';
import { categoricalColours } from '../theme';
import type { ISweepChart, ISweepChartOptions } from './common';
import { finite, finiteRows, fmt, frameTitle } from './common';

/** Legend text of a field change μ0ΔH in tesla. */
export function fieldChangeLabel(mu0DeltaH: number): string {
  return `μ0ΔH = ${fmt(mu0DeltaH, 3)} T`;
}

/** Peak −ΔS_M of the largest field change, as caption text. */
export function entropyCaption(result: IEntropyResult | null): string {
  const curves = (result?.curves ?? []).filter(c => finite(c.mu0DeltaH)).sort((a, b) => b.mu0DeltaH - a.mu0DeltaH);
  const top = curves.find(c => c.peak !== null && finite(c.peak.dS) && finite(c.peak.T));
  if (result === null || top === undefined || top.peak === null) {
    return 'No magnetic entropy change';
  }
  return `peak −ΔS_M = ${fmt(-top.peak.dS)} ${result.unit} at ${fmt(top.peak.T, 6)} K for ${fieldChangeLabel(top.mu0DeltaH)}`;
}

/** Builds the ΔS_M(T) chart (plotted as −ΔS_M, positive for a ferromagnet near Tc); null gives an empty chart. */
export function buildEntropySpec(result: IEntropyResult | null, theme: IChartTheme, options: ISweepChartOptions = {}): ISweepChart {
  const raw: { T: number; minusDS: number; lo: number; hi: number; field: string; f: number }[] = [];
  for (const c of result?.curves ?? []) {
    if (!finite(c.mu0DeltaH)) {
      continue;
    }
    const label = fieldChangeLabel(c.mu0DeltaH);
    for (const p of c.points) {
      if (finite(p.T) && finite(p.dS)) {
        const s = finite(p.sigma) ? Math.abs(p.sigma) : 0;
        raw.push({ T: p.T, minusDS: -p.dS, lo: -p.dS - s, hi: -p.dS + s, field: label, f: c.mu0DeltaH });
      }
    }
  }
  const domain = [...new Map(raw.slice().sort((a, b) => a.f - b.f).map(r => [r.field, r.field])).keys()];
  const rows = finiteRows(raw.map(({ f: _f, ...r }) => r));
  const color: ColorDef<Field> = { field: 'field', type: 'nominal', title: 'field change', scale: { domain, range: categoricalColours(theme) } };
  const unit = result?.unit ?? 'J/(kg K)';
  const yTitle = `−ΔS_M (${unit})`;
  const layer: ChartLayer[] = [
    {
      data: { values: rows },
      mark: { type: 'rule' },
      encoding: {
        x: { field: 'T', type: 'quantitative', title: 'T (K)', scale: { zero: false } },
        y: { field: 'lo', type: 'quantitative', title: yTitle },
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
  const title = 'Magnetic entropy change';
  const caption = entropyCaption(result);
  return {
    spec: layeredChart(layer, {
      description: `Magnetic entropy change ${yTitle} against T from the Maxwell relation, one curve per field change, error bars ±1σ. ${caption}`,
      theme,
      title: frameTitle(title, caption, options),
      height: options.height
    }),
    rows: 2 * rows.length,
    title,
    caption
  };
}
