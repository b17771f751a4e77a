/**
 * Arrott plot (M² against H/M) and modified Arrott plot (M^(1/β) against
 * (H/M)^(1/γ)): the isotherm points coloured by temperature and each
 * isotherm's high-field straight line drawn from x = 0 to its last point.
 *
 * More than `maxPoints` points (default {@link DISPLAY_MAX_POINTS}) are drawn
 * reduced (`../reduce.ts`), each isotherm on its own over one shared grid, in
 * the plot's coordinates; the lines still end at each isotherm's last point.
 */
import type { IIsotherm, IIsothermLine } from '../../core/sweeps/index';
import type { ChartLayer, ColorDef, Field } from '../frame';
import { layeredChart } from '../frame';
import type { IDisplayReduction } from '../reduce';
import { DISPLAY_MAX_POINTS, pointBounds, reduceForDisplay, shareBudget } from '../reduce';
import type { IChartTheme } from '../theme';
import type { ISweepChart } from './common';
import { finite } from './common';

/** Input of the (modified) Arrott chart builders. */
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

function build(o: IArrottChartOptions, beta: number, gamma: number, modified: boolean): IArrottChart {
  const capacity = o.isotherms.reduce((n, iso) => n + iso.H.length, 0);
  const xs = new Float64Array(capacity);
  const ys = new Float64Array(capacity);
  // Points of isotherm g are xs/ys[starts[g] .. starts[g + 1]).
  const starts: number[] = [0];
  let total = 0;
  const xMaxByT = new Map<number, number>();
  for (const iso of o.isotherms) {
    for (let i = 0; i < iso.H.length; i++) {
      const H = iso.H[i];
      const M = iso.M[i];
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
  const groups = o.isotherms.map((_, g) => {
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
    const T = o.isotherms[g].T;
    for (const k of rows) {
      points.push({ T, x: xs[k], y: ys[k] });
    }
  });
  const fits: { T: number; x: number; y: number }[] = [];
  for (const l of o.lines ?? []) {
    const xm = xMaxByT.get(l.T);
    if (xm === undefined || !finite(l.intercept.value) || !finite(l.slope.value)) {
      continue;
    }
    fits.push({ T: l.T, x: 0, y: l.intercept.value }, { T: l.T, x: xm, y: l.intercept.value + l.slope.value * xm });
  }
  const hU = o.fieldUnit ?? 'A/m';
  const mU = o.magnetisationUnit ?? 'A/m';
  const kind = o.fieldKind === 'applied' ? 'applied H' : 'H = H_int';
  const xTitle = modified ? `(H/M)^(1/γ), γ = ${gamma.toPrecision(4)} (${kind}; ${hU}, ${mU})` : `H/M (${kind}; ${hU} per ${mU})`;
  const yTitle = modified ? `M^(1/β), β = ${beta.toPrecision(4)} (${mU})` : `M² ((${mU})²)`;
  // Isotherms run from our accent colour (cold) to our second accent (warm), never a chart library's default ramp.
  const color: ColorDef<Field> = { field: 'T', type: 'quantitative', title: 'T (K)', scale: { range: [o.theme.accent, o.theme.accent2] } };
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
      mark: { type: 'line', strokeWidth: 1, strokeDash: [4, 3], color: o.theme.accent2 },
      encoding: {
        x: { field: 'x', type: 'quantitative' },
        y: { field: 'y', type: 'quantitative' },
        detail: { field: 'T', type: 'nominal' }
      }
    });
  }
  const what = modified ? 'Modified Arrott plot' : 'Arrott plot';
  return {
    spec: layeredChart(layer, { description: `${what}: ${yTitle} against ${xTitle}, one colour per isotherm`, theme: o.theme }),
    rows: points.length + fits.length,
    reduced
  };
}

/** Arrott plot M² against H/M. */
export function buildArrottSpec(o: IArrottChartOptions): IArrottChart {
  return build(o, 0.5, 1, false);
}

/** Modified Arrott plot M^(1/β) against (H/M)^(1/γ). */
export function buildModifiedArrottSpec(o: IArrottChartOptions & { beta: number; gamma: number }): IArrottChart {
  if (!(o.beta > 0) || !(o.gamma > 0)) {
    throw new RangeError(`beta and gamma must be > 0, got ${o.beta}, ${o.gamma}`);
  }
  return build(o, o.beta, o.gamma, true);
}
