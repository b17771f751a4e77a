/**
 * Arrott plot (M² against H/M) and modified Arrott plot (M^(1/β) against
 * (H/M)^(1/γ)): the isotherm points coloured by temperature and each
 * isotherm's high-field straight line drawn from x = 0 to its last point.
 *
 * More than `maxPoints` points (default {@link DISPLAY_MAX_POINTS}) are drawn
 * reduced (`../reduce.ts`), each isotherm on its own over one shared grid, in
 * the plot's coordinates; the lines still end at each isotherm's last point.
 *
 * Both builders take `(input, theme, options)`; the older single-object form
 * (`{ isotherms, lines, theme, … }`) is still accepted.
 */
import type { IIsotherm, IIsothermLine, IModifiedArrottResult, IValueSigma } from '../../core/sweeps/index';
import type { ChartLayer, ColorDef, Field } from '../frame';
import { layeredChart } from '../frame';
import type { IDisplayReduction } from '../reduce';
import { DISPLAY_MAX_POINTS, pointBounds, reduceForDisplay, shareBudget } from '../reduce';
import type { IChartTheme } from '../theme';
import type { ISweepChart, ISweepChartOptions } from './common';
import { displayUnit, fieldWords, finite, fmt, frameTitle, named } from './common';

/** Data of the Arrott chart. */
export interface IArrottInput {
  isotherms: readonly IIsotherm[];
  /** Fitted lines (fitted at the plot's exponents); omitted = points only. */
  lines?: readonly IIsothermLine[];
  /** Tc where the intercepts cross zero, for the caption. */
  Tc?: IValueSigma;
}

/**
 * Data of the modified Arrott chart: the iteration's result (its lines are
 * drawn at the exponents of its last step, the ones they were fitted at), or
 * explicit exponents with lines fitted at them.
 */
export interface IModifiedArrottInput {
  isotherms: readonly IIsotherm[];
  result?: IModifiedArrottResult | null;
  /**
   * Exponents of the plot when there are explicit `lines` (fitted at them)
   * or no usable `result` (points only); a usable result without explicit
   * lines is drawn at its own exponents with its own lines.
   */
  beta?: number;
  gamma?: number;
  /** Lines fitted at `beta`, `gamma`. */
  lines?: readonly IIsothermLine[];
}

/** The older single-object input of both builders (theme inside, units as names). */
export interface IArrottChartOptions {
  isotherms: readonly IIsotherm[];
  /** Fitted lines (same exponents as the plot); omitted = points only. */
  lines?: readonly IIsothermLine[];
  theme: IChartTheme;
  /** Units shown in axis titles (SI by default). */
  fieldUnit?: string;
  magnetisationUnit?: string;
  /** 'internal' or 'applied', written into the axis title. */
  fieldKind?: 'internal' | 'applied';
  /** Most points drawn (default {@link DISPLAY_MAX_POINTS}, at least 8 per isotherm); more are reduced for display. */
  maxPoints?: number;
}

/** An Arrott chart with how many of its points are drawn. */
export interface IArrottChart extends ISweepChart {
  /** Set when the points were reduced for display: `shown` of `total` drawn. Null when every point is drawn. */
  reduced: IDisplayReduction | null;
}

interface IBuild {
  isotherms: readonly IIsotherm[];
  lines: readonly IIsothermLine[];
  beta: number;
  gamma: number;
  modified: boolean;
  title: string;
  caption: string;
}

function build(b: IBuild, theme: IChartTheme, o: ISweepChartOptions): IArrottChart {
  const hu = displayUnit(o.fieldUnit, 'A/m');
  const mu = displayUnit(o.magnetisationUnit, 'A/m');
  const { beta, gamma, modified } = b;
  const ok = beta > 0 && gamma > 0 && finite(beta) && finite(gamma);
  const isotherms = ok ? b.isotherms.filter(iso => finite(iso.T)) : [];
  const capacity = isotherms.reduce((n, iso) => n + iso.H.length, 0);
  const xs = new Float64Array(capacity);
  const ys = new Float64Array(capacity);
  // Points of isotherm g are xs/ys[starts[g] .. starts[g + 1]).
  const starts: number[] = [0];
  let total = 0;
  const xMaxByT = new Map<number, number>();
  for (const iso of isotherms) {
    for (let i = 0; i < iso.H.length; i++) {
      const H = iso.H[i] * hu.perSI;
      const M = iso.M[i] * mu.perSI;
      if (!(H > 0 && M > 0)) {
        continue;
      }
      const x = Math.pow(H / M, 1 / gamma);
      const y = Math.pow(M, 1 / beta);
      if (finite(x) && finite(y)) {
        xs[total] = x;
        ys[total] = y;
        total++;
        xMaxByT.set(iso.T, Math.max(xMaxByT.get(iso.T) ?? 0, x));
      }
    }
    starts.push(total);
  }
  const groups = isotherms.map((_, g) => {
    const rows = new Int32Array(starts[g + 1] - starts[g]);
    for (let k = 0; k < rows.length; k++) {
      rows[k] = starts[g] + k;
    }
    return rows;
  });
  const maxPoints = o.maxPoints ?? DISPLAY_MAX_POINTS;
  let drawn: Int32Array[] = groups;
  let reduced: IDisplayReduction | null = null;
  if (total > maxPoints) {
    const all = new Int32Array(total);
    for (let k = 0; k < total; k++) {
      all[k] = k;
    }
    const bounds = pointBounds(xs, ys, all);
    const budgets = shareBudget(groups.map(g => g.length), maxPoints);
    drawn = groups.map((rows, g) => reduceForDisplay(xs, ys, rows, budgets[g], bounds));
    reduced = { shown: drawn.reduce((n, rows) => n + rows.length, 0), total };
  }
  const points: { T: number; x: number; y: number }[] = [];
  drawn.forEach((rows, g) => {
    const T = isotherms[g].T;
    for (const k of rows) {
      points.push({ T, x: xs[k], y: ys[k] });
    }
  });
  // Lines were fitted in SI: y' = ky·y and x' = kx·x in the display units.
  const ky = Math.pow(mu.perSI, 1 / beta);
  const kx = Math.pow(hu.perSI / mu.perSI, 1 / gamma);
  const fits: { T: number; x: number; y: number }[] = [];
  for (const l of ok ? b.lines : []) {
    const xm = xMaxByT.get(l.T);
    if (xm === undefined || !finite(l.intercept.value) || !finite(l.slope.value)) {
      continue;
    }
    const c0 = l.intercept.value * ky;
    const c1 = (l.slope.value * ky) / kx;
    if (finite(c0) && finite(c0 + c1 * xm)) {
      fits.push({ T: l.T, x: 0, y: c0 }, { T: l.T, x: xm, y: c0 + c1 * xm });
    }
  }
  const hU = hu.unit;
  const mU = mu.unit;
  const kind = fieldWords(o.fieldKind);
  const xTitle = modified
    ? `(H/M)^(1/γ), γ = ${fmt(gamma)} (${kind.name} H = ${kind.symbol}; ${hU}, ${mU})`
    : `H/M (${kind.name} H = ${kind.symbol}; ${hU} per ${mU})`;
  const yTitle = modified ? `M^(1/β), β = ${fmt(beta)} (${mU})` : `M² ((${mU})²)`;
  // Isotherms run from our accent colour (cold) to our second accent (warm), never a chart library's default ramp.
  const color: ColorDef<Field> = { field: 'T', type: 'quantitative', title: 'T (K)', scale: { range: [theme.accent, theme.accent2] } };
  const layer: ChartLayer[] = [
    {
      data: { values: points },
      mark: { type: 'point', filled: true, size: 12, tooltip: true },
      encoding: {
        x: { field: 'x', type: 'quantitative', title: xTitle },
        y: { field: 'y', type: 'quantitative', title: yTitle },
        color
      }
    }
  ];
  if (fits.length > 0) {
    layer.push({
      data: { values: fits },
      mark: { type: 'line', strokeWidth: 1, strokeDash: [4, 3], color: theme.accent2 },
      encoding: {
        x: { field: 'x', type: 'quantitative' },
        y: { field: 'y', type: 'quantitative' },
        detail: { field: 'T', type: 'nominal' }
      }
    });
  }
  const what = modified ? 'Modified Arrott plot' : 'Arrott plot';
  const description = `${what}: ${yTitle} against ${xTitle}, one colour per isotherm, high-field lines dashed. ${b.caption}`;
  return {
    spec: layeredChart(layer, { description, theme, title: frameTitle(b.title, b.caption, o), height: o.height }),
    rows: points.length + fits.length,
    title: b.title,
    caption: b.caption,
    reduced
  };
}

function legacyOptions(o: IArrottChartOptions): ISweepChartOptions {
  return { fieldUnit: o.fieldUnit, magnetisationUnit: o.magnetisationUnit, fieldKind: o.fieldKind, maxPoints: o.maxPoints };
}

function arrottCaption(Tc: IValueSigma | undefined): string {
  if (Tc === undefined) {
    return '';
  }
  return finite(Tc.value) ? `${named('Tc', Tc, 'K', 6)} where the intercepts cross zero` : 'Tc unknown: the intercepts do not cross zero';
}

/** Arrott plot M² against H/M with the mean-field lines. */
export function buildArrottSpec(input: IArrottInput, theme: IChartTheme, options?: ISweepChartOptions): IArrottChart;
/** Arrott plot from the older single-object input. */
export function buildArrottSpec(o: IArrottChartOptions): IArrottChart;
export function buildArrottSpec(input: IArrottInput | IArrottChartOptions, theme?: IChartTheme, options: ISweepChartOptions = {}): IArrottChart {
  const th = theme ?? (input as IArrottChartOptions).theme;
  const o = theme ? options : legacyOptions(input as IArrottChartOptions);
  const Tc = theme ? (input as IArrottInput).Tc : undefined;
  return build({ isotherms: input.isotherms, lines: input.lines ?? [], beta: 0.5, gamma: 1, modified: false, title: 'Arrott plot', caption: arrottCaption(Tc) }, th, o);
}

/**
 * Exponents and lines of a modified Arrott input. Lines are only ever drawn
 * at the exponents they were fitted at: with explicit `lines`, at the
 * explicit exponents (else the result's); without, at the exponents of the
 * result's last step with its lines; without a usable result, at the
 * explicit exponents with points only.
 */
function modifiedParts(input: IModifiedArrottInput): { beta: number; gamma: number; lines: readonly IIsothermLine[] } {
  const r = input.result ?? null;
  const last = r && r.history.length > 0 ? r.history[r.history.length - 1] : null;
  const usable = last !== null && last.beta > 0 && last.gamma > 0 && finite(last.beta) && finite(last.gamma);
  if (input.lines !== undefined) {
    return { beta: input.beta ?? last?.beta ?? NaN, gamma: input.gamma ?? last?.gamma ?? NaN, lines: input.lines };
  }
  if (usable && r !== null) {
    return { beta: last.beta, gamma: last.gamma, lines: r.lines };
  }
  return { beta: input.beta ?? NaN, gamma: input.gamma ?? NaN, lines: [] };
}

function modifiedCaption(input: IModifiedArrottInput, beta: number, gamma: number): string {
  const r = input.result ?? null;
  if (!(beta > 0 && gamma > 0 && finite(beta) && finite(gamma))) {
    return 'Exponents unknown: no modified Arrott plot';
  }
  if (r === null) {
    return `β = ${fmt(beta)}, γ = ${fmt(gamma)}`;
  }
  return `${named('β', r.beta)}, ${named('γ', r.gamma)}, ${named('Tc', r.Tc, 'K', 6)} (lines at β = ${fmt(beta)}, γ = ${fmt(gamma)})`;
}

/**
 * Modified Arrott plot M^(1/β) against (H/M)^(1/γ) with the high-field lines.
 * Without usable exponents the chart is empty and the caption says so.
 */
export function buildModifiedArrottSpec(input: IModifiedArrottInput, theme: IChartTheme, options?: ISweepChartOptions): IArrottChart;
/**
 * Modified Arrott plot from the older single-object input.
 * @throws RangeError when beta or gamma is not above 0.
 */
export function buildModifiedArrottSpec(o: IArrottChartOptions & { beta: number; gamma: number }): IArrottChart;
export function buildModifiedArrottSpec(input: IModifiedArrottInput | (IArrottChartOptions & { beta: number; gamma: number }), theme?: IChartTheme, options: ISweepChartOptions = {}): IArrottChart {
  if (theme === undefined) {
    const o = input as IArrottChartOptions & { beta: number; gamma: number };
    if (!(o.beta > 0) || !(o.gamma > 0)) {
      throw new RangeError(`beta and gamma must be > 0, got ${o.beta}, ${o.gamma}`);
    }
    const caption = `β = ${fmt(o.beta)}, γ = ${fmt(o.gamma)}`;
    return build({ isotherms: o.isotherms, lines: o.lines ?? [], beta: o.beta, gamma: o.gamma, modified: true, title: 'Modified Arrott plot', caption }, o.theme, legacyOptions(o));
  }
  const m = input as IModifiedArrottInput;
  const { beta, gamma, lines } = modifiedParts(m);
  const caption = modifiedCaption(m, beta, gamma);
  return build({ isotherms: m.isotherms, lines, beta, gamma, modified: true, title: 'Modified Arrott plot', caption }, theme, options);
}
