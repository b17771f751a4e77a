/**
 * Scaling plot [B9 in REFERENCES.md]: m = M|t|^−β against h = H|t|^−(β+γ) on
 * log axes, one colour and shape per branch (T < Tc, T > Tc), at the
 * minimised collapse's (Tc, β, γ), with its cost in the caption.
 *
 * More than `maxPoints` points are drawn reduced (`../reduce.ts`) in the
 * plot's (logarithmic) coordinates, each isotherm on its own.
 */
import type { ICollapseResult, IIsotherm } from '../../core/sweeps/index';
import type { ChartLayer, ColorDef, Field } from '../frame';
import { layeredChart } from '../frame';
import type { IDisplayReduction } from '../reduce';
import { DISPLAY_MAX_POINTS, pointBounds, reduceForDisplay, shareBudget } from '../reduce';
import type { IChartTheme } from '../theme';
import type { ISweepChart, ISweepChartOptions } from './common';
import { displayUnit, fieldWords, finite, fmt, frameTitle, named } from './common';

/** Data of the scaling plot. */
export interface ICollapseInput {
  isotherms: readonly IIsotherm[];
  /** The minimised collapse (its Tc, β, γ and cost), or null. */
  result: ICollapseResult | null;
  /** Tc (K), β and γ to draw at when `result` is null or has no finite values (e.g. the primary result's). */
  Tc?: number;
  beta?: number;
  gamma?: number;
}

/** Options of the scaling plot. */
export interface ICollapseChartOptions extends ISweepChartOptions {
  /** Isotherms with |t| below this are left out (default 1e-3): at Tc the scaled values diverge. */
  tMin?: number;
  /** Isotherms with |t| above this are left out (default: none), e.g. the analysis window. */
  tMax?: number;
}

/** A scaling plot with how many of its points are drawn. */
export interface ICollapseChart extends ISweepChart {
  reduced: IDisplayReduction | null;
}

const BELOW = 'T < Tc';
const ABOVE = 'T > Tc';

function scalingOf(input: ICollapseInput): { Tc: number; beta: number; gamma: number } | null {
  const c = input.result;
  const ok = (s: { Tc: number; beta: number; gamma: number }): boolean => s.Tc > 0 && s.beta > 0 && s.gamma > 0 && finite(s.Tc) && finite(s.beta) && finite(s.gamma);
  if (c !== null) {
    const s = { Tc: c.Tc.value, beta: c.beta.value, gamma: c.gamma.value };
    if (ok(s)) {
      return s;
    }
  }
  const fallback = { Tc: input.Tc ?? NaN, beta: input.beta ?? NaN, gamma: input.gamma ?? NaN };
  return ok(fallback) ? fallback : null;
}

function draw(input: ICollapseInput, theme: IChartTheme, options: ICollapseChartOptions): ICollapseChart {
  const hu = displayUnit(options.fieldUnit, 'A/m');
  const mu = displayUnit(options.magnetisationUnit, 'A/m');
  const tMin = options.tMin ?? 1e-3;
  const tMax = options.tMax ?? Infinity;
  const sc = scalingOf(input);
  const isos: { iso: IIsotherm; t: number }[] = [];
  if (sc !== null) {
    for (const iso of input.isotherms) {
      const t = (iso.T - sc.Tc) / sc.Tc;
      if (finite(t) && Math.abs(t) >= tMin && Math.abs(t) <= tMax) {
        isos.push({ iso, t });
      }
    }
  }
  const capacity = isos.reduce((n, q) => n + q.iso.H.length, 0);
  const hs = new Float64Array(capacity);
  const ms = new Float64Array(capacity);
  const lx = new Float64Array(capacity);
  const ly = new Float64Array(capacity);
  const starts: number[] = [0];
  let total = 0;
  for (const { iso, t } of isos) {
    const a = Math.abs(t);
    for (let i = 0; i < iso.H.length; i++) {
      const H = iso.H[i] * hu.perSI;
      const M = iso.M[i] * mu.perSI;
      if (sc !== null && H > 0 && M > 0) {
        const h = H * Math.pow(a, -(sc.beta + sc.gamma));
        const m = M * Math.pow(a, -sc.beta);
        if (finite(h) && finite(m) && h > 0 && m > 0) {
          hs[total] = h;
          ms[total] = m;
          lx[total] = Math.log10(h);
          ly[total] = Math.log10(m);
          total++;
        }
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
  const rows: { T: number; h: number; m: number; branch: string }[] = [];
  drawn.forEach((ks, g) => {
    const { iso, t } = isos[g];
    for (const k of ks) {
      rows.push({ T: iso.T, h: hs[k], m: ms[k], branch: t < 0 ? BELOW : ABOVE });
    }
  });
  const kind = fieldWords(options.fieldKind);
  const domain = [BELOW, ABOVE];
  const color: ColorDef<Field> = { field: 'branch', type: 'nominal', title: 'branch', scale: { domain, range: [theme.accent, theme.accent2] } };
  const layer: ChartLayer[] = [
    {
      data: { values: rows },
      mark: { type: 'point', filled: true, size: 10, tooltip: true },
      encoding: {
        x: { field: 'h', type: 'quantitative', title: `h = H |t|^−(β+γ) (${kind.name} ${kind.symbol} in ${hu.unit}), log scale`, scale: { type: 'log' } },
        y: { field: 'm', type: 'quantitative', title: `m = M |t|^−β (M in ${mu.unit}), log scale`, scale: { type: 'log' } },
        color,
        shape: { field: 'branch', type: 'nominal', title: 'branch', scale: { domain, range: ['circle', 'square'] } },
        detail: { field: 'T', type: 'quantitative' }
      }
    }
  ];
  const title = 'Scaling collapse';
  const c = input.result;
  const at = sc === null ? 'Tc, β or γ unknown: nothing to scale' : `t = (T − Tc)/Tc at Tc = ${fmt(sc.Tc, 6)} K, β = ${fmt(sc.beta)}, γ = ${fmt(sc.gamma)}`;
  let costText: string;
  if (c === null) {
    costText = 'no collapse cost (not minimised)';
  } else if (finite(c.cost)) {
    const start = finite(c.startCost) ? `, ${fmt(c.startCost, 3)} at the start` : '';
    costText = `collapse cost ${fmt(c.cost, 3)} (mean squared ln m difference over ${fmt(c.count, 6, '0')} overlaps${start})`;
  } else {
    costText = 'collapse cost unknown: the isotherms do not overlap';
  }
  const exps = c !== null && finite(c.beta.value) ? `; ${named('Tc', c.Tc, 'K', 6)}, ${named('β', c.beta)}, ${named('γ', c.gamma)}` : '';
  const caption = `${costText}; ${at}${exps}`;
  return {
    spec: layeredChart(layer, {
      description: `Scaling plot: m against h on log axes, two branches (below and above Tc). ${caption}`,
      theme,
      title: frameTitle(title, caption, options),
      height: options.height
    }),
    rows: rows.length,
    title,
    caption,
    reduced
  };
}

/** Scaling plot at the collapse's (Tc, β, γ), with its cost in the caption; never throws on missing values. */
export function buildCollapseSpec(input: ICollapseInput, theme: IChartTheme, options?: ICollapseChartOptions): ICollapseChart;
/**
 * Scaling plot at given (Tc, β, γ) (older form); isotherms with |t| < tMin are left out (default 1e-3).
 * @throws RangeError when Tc, β or γ is not above 0.
 */
export function buildCollapseSpec(isotherms: readonly IIsotherm[], scaling: { Tc: number; beta: number; gamma: number }, theme: IChartTheme, tMin?: number): ICollapseChart;
export function buildCollapseSpec(
  a: ICollapseInput | readonly IIsotherm[],
  b: IChartTheme | { Tc: number; beta: number; gamma: number },
  c?: ICollapseChartOptions | IChartTheme,
  tMin = 1e-3
): ICollapseChart {
  if (Array.isArray(a)) {
    const { Tc, beta, gamma } = b as { Tc: number; beta: number; gamma: number };
    if (!(Tc > 0) || !(beta > 0) || !(gamma > 0)) {
      throw new RangeError(`Tc, beta and gamma must be > 0, got ${Tc}, ${beta}, ${gamma}`);
    }
    return draw({ isotherms: a as readonly IIsotherm[], result: null, Tc, beta, gamma }, c as IChartTheme, { tMin });
  }
  return draw(a as ICollapseInput, b as IChartTheme, (c as ICollapseChartOptions | undefined) ?? {});
}
