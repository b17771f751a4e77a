/**
 * Free-energy landscape F(ψ) at one (T, h): the curve, its stationary points
 * marked by kind (shape and colour), and the global minimum ringed and named.
 */
import type { ILandscapePoint } from '../../core/physics/landau/index';
import type { ChartLayer, Field, PositionFieldDef } from '../frame';
import { layeredChart } from '../frame';
import type { IChartTheme } from '../theme';
import type { IKindLabels, ILandauChart, LandauPointKind } from './common';
import { DEFAULT_KIND_LABELS, KIND_ORDER, finite, kindColours, kindEncoding } from './common';

export type { ILandscapePoint };

/** Texts of the landscape chart (translated by the caller). */
export interface ILandscapeLabels {
  /** Chart title, e.g. "F(ψ) at T = 100.4, h = 0". */
  title: string;
  psi: string;
  F: string;
  /** Legend title of the kinds. */
  kind: string;
  kinds: IKindLabels;
  /** Text beside the global minimum. */
  globalMinimum: string;
}

/** Input of {@link buildLandscapeSpec}. */
export interface ILandscapeChartOptions {
  /** ψ grid of the curve. */
  psi: ArrayLike<number>;
  /** F(ψ) on the grid (same length). */
  F: ArrayLike<number>;
  /** Stationary points at (T, h). */
  points: readonly ILandscapePoint[];
  /** Index into `points` of the global minimum, or −1 for none. */
  global: number;
  T: number;
  h: number;
  theme: IChartTheme;
  labels?: Partial<ILandscapeLabels>;
  /**
   * Zoom the F axis onto the stationary points when there are two or more
   * with different F (default true); the curve is clipped outside.
   */
  focus?: boolean;
  /** Fixed axis domains (the view); `yDomain` replaces the focus. */
  xDomain?: [number, number];
  yDomain?: [number, number];
  /** Keep every layer and every kind in the legend so a drawn view can take new rows in place ({@link landscapeRows}). */
  patchable?: boolean;
}

const SHAPES: Record<LandauPointKind, string> = { stable: 'circle', metastable: 'square', unstable: 'triangle-up', inflection: 'diamond' };

function fmt(v: number): string {
  return finite(v) ? String(Number(v.toPrecision(6))) : String(v);
}

/** The F range the axis shows when focusing on the stationary points, or null. */
export function landscapeFocus(points: readonly ILandscapePoint[]): [number, number] | null {
  const F = points.filter(p => finite(p.psi) && finite(p.F)).map(p => p.F);
  if (F.length < 2) {
    return null;
  }
  let lo = Infinity;
  let hi = -Infinity;
  for (const f of F) {
    lo = f < lo ? f : lo;
    hi = f > hi ? f : hi;
  }
  const span = hi - lo;
  if (!(span > 1e-12 * Math.max(1, Math.abs(lo), Math.abs(hi)))) {
    return null;
  }
  return [lo - 0.3 * span, hi + 0.8 * span];
}

/**
 * Layered spec: line for F(ψ), one symbol per stationary point (legend by
 * kind), a ring and text on the global minimum. Non-finite curve samples and
 * points are left out; inputs are not changed.
 *
 * @throws RangeError when `psi` and `F` differ in length.
 */
export function buildLandscapeSpec(options: ILandscapeChartOptions): ILandauChart {
  const { psi, F, points, theme } = options;
  if (psi.length !== F.length) {
    throw new RangeError(`psi has ${psi.length} values but F has ${F.length}`);
  }
  const kinds = { ...DEFAULT_KIND_LABELS, ...options.labels?.kinds };
  const labels: ILandscapeLabels = {
    title: `F(ψ) at T = ${fmt(options.T)}, h = ${fmt(options.h)}`,
    psi: 'ψ',
    F: 'F − F0',
    kind: 'stationary point',
    globalMinimum: 'global minimum',
    ...options.labels,
    kinds
  };
  const rows = landscapeRows(options);
  const curve = rows.curve;
  const marks = rows.stationary;
  const globalRow = rows.global;

  const present = new Set(points.map(p => p.kind));
  const shown = KIND_ORDER.filter(k => options.patchable === true || k !== 'inflection' || present.has(k));
  const colours = kindColours(theme);
  const valid = (d: [number, number] | undefined): d is [number, number] => d !== undefined && finite(d[0]) && finite(d[1]) && d[1] > d[0];
  const focus = valid(options.yDomain) ? options.yDomain : options.focus === false ? null : landscapeFocus(points);
  const x: PositionFieldDef<Field> = { field: 'psi', type: 'quantitative', title: labels.psi, scale: valid(options.xDomain) ? { domain: options.xDomain, zero: false, nice: false } : { zero: false, nice: false } };
  const y: PositionFieldDef<Field> = { field: 'F', type: 'quantitative', title: labels.F, scale: focus ? { domain: focus, zero: false, nice: false } : { zero: false, padding: 14 } };
  const layer: ChartLayer[] = [
    {
      name: 'landscape_curve',
      data: { name: 'curve', values: curve },
      mark: { type: 'line', color: theme.text, opacity: 0.65, strokeWidth: 2, clip: true },
      encoding: { x, y }
    },
    {
      name: 'landscape_points',
      data: { name: 'stationary', values: marks },
      mark: { type: 'point', filled: true, size: 110, stroke: theme.background, strokeWidth: 1, opacity: 1, clip: true, tooltip: true },
      encoding: {
        x: { field: 'psi', type: 'quantitative' },
        y: { field: 'F', type: 'quantitative' },
        color: kindEncoding(labels.kind, shown, kinds, k => colours[k], true),
        shape: kindEncoding(labels.kind, shown, kinds, k => SHAPES[k], false),
        tooltip: [
          { field: 'kind', type: 'nominal', title: labels.kind },
          { field: 'psi', type: 'quantitative', title: labels.psi, format: '.6~g' },
          { field: 'F', type: 'quantitative', title: labels.F, format: '.6~g' }
        ]
      }
    }
  ];
  if (options.patchable === true || globalRow.length) {
    layer.push(
      {
        name: 'landscape_global',
        data: { name: 'global', values: globalRow },
        mark: { type: 'point', filled: false, size: 420, stroke: theme.accent, strokeWidth: 2.5, clip: true },
        encoding: { x: { field: 'psi', type: 'quantitative' }, y: { field: 'F', type: 'quantitative' } }
      },
      {
        name: 'landscape_global_text',
        data: { name: 'global_text', values: globalRow },
        // anchored towards the middle of the plot, so a label near an edge stays inside it
        mark: { type: 'text', dy: -18, color: theme.accent, fontWeight: 'bold', clip: true, align: { expr: GLOBAL_TEXT_ALIGN } },
        encoding: { x: { field: 'psi', type: 'quantitative' }, y: { field: 'F', type: 'quantitative' }, text: { field: 'text' } }
      }
    );
  }
  const spec = layeredChart(layer, { description: `${labels.title}: ${labels.F} against ${labels.psi} with ${marks.length} stationary points`, title: labels.title, theme, liveTitle: options.patchable === true });
  return { spec, rows: curve.length + marks.length + globalRow.length };
}

/** Text anchor of the global-minimum label: towards the middle from the outer thirds of the plot. */
const GLOBAL_TEXT_ALIGN = "scale('x', datum.psi) > 0.66 * width ? 'right' : scale('x', datum.psi) < 0.34 * width ? 'left' : 'center'";

/** Rows of every dataset of the landscape chart, by dataset name (for in-place updates). */
export function landscapeRows(options: ILandscapeChartOptions): { curve: { psi: number; F: number }[]; stationary: { psi: number; F: number; kind: string }[]; global: { psi: number; F: number; text: string }[]; global_text: { psi: number; F: number; text: string }[] } {
  const { psi, F, points } = options;
  const kinds = { ...DEFAULT_KIND_LABELS, ...options.labels?.kinds };
  const globalText = options.labels?.globalMinimum ?? 'global minimum';
  const curve: { psi: number; F: number }[] = [];
  for (let i = 0; i < psi.length; i++) {
    if (finite(psi[i]) && finite(F[i])) {
      curve.push({ psi: psi[i], F: F[i] });
    }
  }
  const stationary: { psi: number; F: number; kind: string }[] = [];
  for (const p of points) {
    if (finite(p.psi) && finite(p.F)) {
      stationary.push({ psi: p.psi, F: p.F, kind: kinds[p.kind] });
    }
  }
  const g = options.global >= 0 && options.global < points.length ? points[options.global] : null;
  const global = g && finite(g.psi) && finite(g.F) ? [{ psi: g.psi, F: g.F, text: globalText }] : [];
  return { curve, stationary, global, global_text: global };
}
