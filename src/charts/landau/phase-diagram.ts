/**
 * Phase diagram in (T, h): first-order lines (solid), the h = 0 line ending
 * at a continuous transition (solid, its own colour), limits of metastability
 * (dashed), special points (critical end points, critical, tricritical and
 * triple points) and the current (T, h) as a cross-hair point.
 */
import type { ChartLayer, Field, PositionFieldDef } from '../frame';
import { layeredChart } from '../frame';
import type { IChartTheme } from '../theme';
import type { ILandauChart } from './common';
import { finite } from './common';

/** Kinds of line, as the core names them. */
export type PhaseDiagramLineKind = 'first-order' | 'second-order' | 'spinodal';
/** Kinds of point, as the core names them. */
export type PhaseDiagramPointKind = 'critical-end' | 'critical' | 'tricritical' | 'triple';

/** Texts of the chart (translated by the caller). */
export interface IPhaseDiagramLabels {
  title: string;
  T: string;
  h: string;
  line: string;
  lines: Record<PhaseDiagramLineKind, string>;
  points: Record<PhaseDiagramPointKind, string>;
  current: string;
}

/** Input of {@link buildPhaseDiagramSpec}. */
export interface IPhaseDiagramChartOptions {
  lines: readonly { kind: PhaseDiagramLineKind; id: string; T: ArrayLike<number>; h: ArrayLike<number> }[];
  points: readonly { kind: PhaseDiagramPointKind; T: number; h: number }[];
  /** The (T, h) of the other charts. */
  current?: { T: number; h: number };
  /** Fixed axis domains (the view); the data decide when absent. */
  xDomain?: [number, number];
  yDomain?: [number, number];
  theme: IChartTheme;
  labels?: Partial<IPhaseDiagramLabels>;
}

const LINE_ORDER: readonly PhaseDiagramLineKind[] = ['first-order', 'second-order', 'spinodal'];

/** Rows of every dataset, by name (for in-place updates of a drawn view). */
export function phaseDiagramRows(options: IPhaseDiagramChartOptions): Record<string, Record<string, unknown>[]> {
  const labels = phaseLabels(options.labels);
  const lines: Record<string, unknown>[] = [];
  for (const l of options.lines) {
    for (let i = 0; i < l.T.length; i++) {
      if (finite(l.T[i]) && finite(l.h[i])) {
        lines.push({ T: l.T[i], h: l.h[i], kind: labels.lines[l.kind], id: l.id, order: i });
      }
    }
  }
  const points = options.points.filter(p => finite(p.T) && finite(p.h)).map(p => ({ T: p.T, h: p.h, text: labels.points[p.kind] }));
  const c = options.current;
  const current = c && finite(c.T) && finite(c.h) ? [{ T: c.T, h: c.h, text: labels.current }] : [];
  return { phase_lines: lines, phase_points: points, phase_current: current };
}

function phaseLabels(given: Partial<IPhaseDiagramLabels> | undefined): IPhaseDiagramLabels {
  return {
    title: 'Phase diagram in (T, h)',
    T: 'T',
    h: 'h',
    line: 'line',
    current: 'T, h shown',
    ...given,
    lines: { 'first-order': 'first order', 'second-order': 'h = 0 up to Tc', spinodal: 'limit of metastability', ...given?.lines },
    points: { 'critical-end': 'critical end point', critical: 'critical point', tricritical: 'tricritical point', triple: 'three minima', ...given?.points }
  };
}

/** Layered spec; every dataset is named (and present, perhaps empty) so a view can be updated in place. */
export function buildPhaseDiagramSpec(options: IPhaseDiagramChartOptions): ILandauChart {
  const { theme } = options;
  const labels = phaseLabels(options.labels);
  const rows = phaseDiagramRows(options);
  const domain = (d: [number, number] | undefined) => (d && finite(d[0]) && finite(d[1]) && d[1] > d[0] ? { domain: d, zero: false, nice: false } : { zero: false, nice: false });
  const x: PositionFieldDef<Field> = { field: 'T', type: 'quantitative', title: labels.T, scale: domain(options.xDomain) };
  const y: PositionFieldDef<Field> = { field: 'h', type: 'quantitative', title: labels.h, scale: domain(options.yDomain) };
  const kinds = LINE_ORDER.map(k => labels.lines[k]);
  const layer: ChartLayer[] = [
    {
      name: 'phase_lines',
      data: { name: 'phase_lines', values: rows.phase_lines },
      mark: { type: 'line', strokeWidth: 2.2, clip: true },
      encoding: {
        x,
        y,
        detail: { field: 'id', type: 'nominal' },
        order: { field: 'order', type: 'quantitative' },
        color: { field: 'kind', type: 'nominal', title: labels.line, scale: { domain: kinds, range: [theme.accent, theme.accent2, theme.text] }, legend: { orient: 'bottom' } },
        strokeDash: { field: 'kind', type: 'nominal', title: labels.line, scale: { domain: kinds, range: [[1, 0], [1, 0], [5, 4]] } }
      }
    },
    {
      name: 'phase_points',
      data: { name: 'phase_points', values: rows.phase_points },
      mark: { type: 'point', filled: true, size: 90, color: theme.accent, stroke: theme.background, strokeWidth: 1, clip: true, tooltip: true },
      encoding: {
        x: { field: 'T', type: 'quantitative' },
        y: { field: 'h', type: 'quantitative' },
        tooltip: [
          { field: 'text', type: 'nominal', title: labels.line },
          { field: 'T', type: 'quantitative', title: labels.T, format: '.6~g' },
          { field: 'h', type: 'quantitative', title: labels.h, format: '.6~g' }
        ]
      }
    },
    {
      name: 'phase_point_text',
      data: { name: 'phase_point_text', values: rows.phase_points },
      mark: { type: 'text', align: 'left', dx: 7, dy: -7, color: theme.text, clip: true },
      encoding: { x: { field: 'T', type: 'quantitative' }, y: { field: 'h', type: 'quantitative' }, text: { field: 'text' } }
    },
    {
      name: 'phase_current',
      data: { name: 'phase_current', values: rows.phase_current },
      mark: { type: 'point', shape: 'cross', filled: true, size: 140, color: theme.accent2, clip: true, tooltip: true },
      encoding: { x: { field: 'T', type: 'quantitative' }, y: { field: 'h', type: 'quantitative' } }
    }
  ];
  const spec = layeredChart(layer, { description: `${labels.title}: ${labels.h} against ${labels.T}; ${kinds.join(', ')}`, title: labels.title, theme });
  return { spec, rows: rows.phase_lines.length + rows.phase_points.length + rows.phase_current.length };
}
