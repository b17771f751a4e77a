/**
 * Critical isotherm on log–log axes: M against H of the isotherm(s) nearest
 * Tc (those the fit used: the isotherm at Tc, or the ones Tc was interpolated
 * between), with the fitted line M = D H^(1/δ), straight on these axes with
 * slope 1/δ.
 *
 * More than `maxPoints` points are drawn reduced (`../reduce.ts`) in the
 * plot's (logarithmic) coordinates, each isotherm on its own.
 */
import type { ICriticalIsothermResult, IIsotherm } from '../../core/sweeps/index';
import type { ChartLayer, ColorDef, Field } from '../frame';
import { layeredChart } from '../frame';
import type { IDisplayReduction } from '../reduce';
import { DISPLAY_MAX_POINTS, pointBounds, reduceForDisplay, shareBudget } from '../reduce';
import type { IChartTheme } from '../theme';
import { categoricalColours } from '../theme';
import type { ISweepChart, ISweepChartOptions } from './common';
import { displayUnit, fieldWords, finite, finiteRows, fmt, frameTitle, named } from './common';

/** Data of the critical-isotherm chart. */
export interface ICriticalIsothermInput {
  isotherms: readonly IIsotherm[];
  /** The δ fit, or null when there is none (the isotherms nearest `Tc` are drawn without a line). */
  result: ICriticalIsothermResult | null;
  /** Tc used when `result` names no isotherms (e.g. the primary Tc), K. */
  Tc?: number;
}

/** A critical-isotherm chart with how many of its points are drawn. */
export interface ICriticalIsothermChart extends ISweepChart {
  /** Set when the points were reduced for display, else null. */
  reduced: IDisplayReduction | null;
}

/** The isotherms to draw: those the fit used, else the nearest one on each side of Tc (or the one at Tc). */
function chosen(input: ICriticalIsothermInput): IIsotherm[] {
  const isos = input.isotherms.filter(i => finite(i.T));
  const used = input.result?.temperatures.filter(finite) ?? [];
  if (used.length > 0) {
    const pick = isos.filter(i => used.includes(i.T));
    if (pick.length > 0) {
      return pick.sort((a, b) => a.T - b.T);
    }
  }
  const Tc = input.result && finite(input.result.Tc) ? input.result.Tc : (input.Tc ?? NaN);
  if (!finite(Tc) || isos.length === 0) {
    return [];
  }
  let below: IIsotherm | null = null;
  let above: IIsotherm | null = null;
  for (const iso of isos) {
    if (iso.T <= Tc && (below === null || iso.T > below.T)) {
      below = iso;
    }
    if (iso.T >= Tc && (above === null || iso.T < above.T)) {
      above = iso;
    }
  }
  const out = [below, above].filter((i): i is IIsotherm => i !== null);
  return out.length === 2 && out[0] === out[1] ? [out[0]] : out;
}

/** Builds the critical-isotherm chart (log–log). */
export function buildCriticalIsothermSpec(input: ICriticalIsothermInput, theme: IChartTheme, options: ISweepChartOptions = {}): ICriticalIsothermChart {
  const hu = displayUnit(options.fieldUnit, 'A/m');
  const mu = displayUnit(options.magnetisationUnit, 'A/m');
  const isos = chosen(input);
  // Reduction works in the plot's coordinates: log10 of the shown values.
  const capacity = isos.reduce((n, iso) => n + iso.H.length, 0);
  const lx = new Float64Array(capacity);
  const ly = new Float64Array(capacity);
  const hv = new Float64Array(capacity);
  const mv = new Float64Array(capacity);
  const starts: number[] = [0];
  let total = 0;
  for (const iso of isos) {
    for (let i = 0; i < iso.H.length; i++) {
      const H = iso.H[i] * hu.perSI;
      const M = iso.M[i] * mu.perSI;
      if (H > 0 && M > 0 && finite(H) && finite(M)) {
        hv[total] = H;
        mv[total] = M;
        lx[total] = Math.log10(H);
        ly[total] = Math.log10(M);
        total++;
      }
    }
    starts.push(total);
  }
  const groups = isos.map((_, g) => Int32Array.from({ length: starts[g + 1] - starts[g] }, (_v, k) => starts[g] + k));
  const maxPoints = options.maxPoints ?? DISPLAY_MAX_POINTS;
  let drawn: Int32Array[] = groups;
  let reduced: IDisplayReduction | null = null;
  if (total > maxPoints) {
    const bounds = pointBounds(lx, ly, Int32Array.from({ length: total }, (_v, k) => k));
    const budgets = shareBudget(groups.map(g => g.length), maxPoints);
    drawn = groups.map((rows, g) => reduceForDisplay(lx, ly, rows, budgets[g], bounds));
    reduced = { shown: drawn.reduce((n, rows) => n + rows.length, 0), total };
  }
  const label = (T: number): string => `T = ${fmt(T, 6)} K`;
  const points: { T: number; H: number; M: number; isotherm: string }[] = [];
  let hLo = Infinity;
  let hHi = -Infinity;
  drawn.forEach((rows, g) => {
    for (const k of rows) {
      points.push({ T: isos[g].T, H: hv[k], M: mv[k], isotherm: label(isos[g].T) });
    }
  });
  for (let k = 0; k < total; k++) {
    hLo = Math.min(hLo, hv[k]);
    hHi = Math.max(hHi, hv[k]);
  }
  const r = input.result;
  const line: { H: number; M: number }[] = [];
  if (r && finite(r.delta.value) && r.delta.value !== 0 && finite(r.D.value) && r.D.value > 0 && hLo <= hHi) {
    for (const H of [hLo, hHi]) {
      // M = D H^(1/δ) in SI, shown in the display units.
      line.push({ H, M: mu.perSI * r.D.value * Math.pow(H / hu.perSI, 1 / r.delta.value) });
    }
  }
  const fits = finiteRows(line);
  const kind = fieldWords(options.fieldKind);
  const domain = isos.map(i => label(i.T));
  const color: ColorDef<Field> = { field: 'isotherm', type: 'nominal', title: 'isotherm', scale: { domain, range: categoricalColours(theme) } };
  const layer: ChartLayer[] = [
    {
      data: { values: points },
      mark: { type: 'point', filled: true, size: 16, tooltip: true },
      encoding: {
        x: { field: 'H', type: 'quantitative', title: `${kind.name} ${kind.symbol} (${hu.unit}), log scale`, scale: { type: 'log' } },
        y: { field: 'M', type: 'quantitative', title: `M (${mu.unit}), log scale`, scale: { type: 'log' } },
        color
      }
    }
  ];
  if (fits.length > 0) {
    layer.push({
      data: { values: fits },
      mark: { type: 'line', strokeWidth: 1.5, strokeDash: [6, 3], color: theme.text },
      encoding: {
        x: { field: 'H', type: 'quantitative' },
        y: { field: 'M', type: 'quantitative' }
      }
    });
  }
  const title = 'Critical isotherm';
  let caption: string;
  const tcValue = r && finite(r.Tc) ? r.Tc : (input.Tc ?? NaN);
  const tcText = finite(tcValue) ? `Tc = ${fmt(tcValue, 6)} K` : 'Tc unknown';
  if (r && finite(r.delta.value)) {
    const where = r.source === 'interpolated' ? `interpolated to ${tcText} between ${isos.map(i => fmt(i.T, 6)).join(', ')} K` : `isotherm at ${tcText}`;
    caption = `M = D H^(1/δ): ${named('δ', r.delta)}, ${named('D', r.D, '', 3)} (SI), ${where}`;
  } else {
    caption = `δ unknown: no fit of the critical isotherm (${tcText})`;
  }
  return {
    spec: layeredChart(layer, {
      description: `Critical isotherm: M against H on log axes for the isotherms nearest Tc, with the fitted line M = D H^(1/δ) dashed. ${caption}`,
      theme,
      title: frameTitle(title, caption, options),
      height: options.height
    }),
    rows: points.length + fits.length,
    title,
    caption,
    reduced
  };
}
