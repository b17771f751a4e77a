/**
 * Arrott plot (M² against H/M) and modified Arrott plot (M^(1/β) against
 * (H/M)^(1/γ)): the isotherm points coloured by temperature and each
 * isotherm's high-field straight line drawn from x = 0 to its last point.
 */
import type { IIsotherm, IIsothermLine } from '../../core/sweeps/index';
import type { ChartLayer, ColorDef, Field } from '../frame';
import { layeredChart } from '../frame';
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
}

function build(o: IArrottChartOptions, beta: number, gamma: number, modified: boolean): ISweepChart {
  const points: { T: number; x: number; y: number }[] = [];
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
        points.push({ T: iso.T, x, y });
        xMaxByT.set(iso.T, Math.max(xMaxByT.get(iso.T) ?? 0, x));
      }
    }
  }
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
  const color: ColorDef<Field> = { field: 'T', type: 'quantitative', title: 'T (K)', scale: { scheme: 'viridis' } };
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
  return { spec: layeredChart(layer, { description: `${what}: ${yTitle} against ${xTitle}, one colour per isotherm`, theme: o.theme }), rows: points.length + fits.length };
}

/** Arrott plot M² against H/M. */
export function buildArrottSpec(o: IArrottChartOptions): ISweepChart {
  return build(o, 0.5, 1, false);
}

/** Modified Arrott plot M^(1/β) against (H/M)^(1/γ). */
export function buildModifiedArrottSpec(o: IArrottChartOptions & { beta: number; gamma: number }): ISweepChart {
  if (!(o.beta > 0) || !(o.gamma > 0)) {
    throw new RangeError(`beta and gamma must be > 0, got ${o.beta}, ${o.gamma}`);
  }
  return build(o, o.beta, o.gamma, true);
}
