/**
 * Order parameter against temperature at one field h: every stationary
 * branch (stable solid, metastable dashed, unstable dotted), the heating and
 * cooling paths as wide bands with their jumps, vertical rules at the
 * characteristic temperatures (T0, T1, T**) and at the chosen T.
 */
import type { ChartLayer, Field, PositionFieldDef } from '../frame';
import { layeredChart } from '../frame';
import type { IChartTheme } from '../theme';
import type { IKindLabels, ILandauChart, LandauPointKind } from './common';
import { DEFAULT_KIND_LABELS, KIND_ORDER, finite, kindColours, kindEncoding } from './common';
import type { IBranchPoint } from './trace';
import { traceBranches } from './trace';

/** A quasi-static path: occupied states and the jumps between them. */
export interface IBranchesPath {
  points: readonly { T: number; psi: number }[];
  /** `index` is the first state after the jump. */
  jumps: readonly { index: number; T: number; psiBefore: number; psiAfter: number }[];
}

/** A labelled vertical rule. */
export interface ITemperatureMarker {
  T: number;
  label: string;
}

/** Texts of the branches chart (translated by the caller). */
export interface IBranchesLabels {
  title: string;
  T: string;
  psi: string;
  /** Legend title of the branch kinds. */
  kind: string;
  kinds: IKindLabels;
  heating: string;
  cooling: string;
  data: string;
  fitted: string;
}

/** Input of {@link buildBranchesSpec}. */
export interface IBranchesChartOptions {
  /** Stationary points over a T grid (any order; several per T). */
  branches: readonly IBranchPoint[];
  heating?: IBranchesPath;
  cooling?: IBranchesPath;
  /** Characteristic temperatures, e.g. T0, T1, T**. */
  markers?: readonly ITemperatureMarker[];
  /** The temperature of the landscape chart. */
  current?: ITemperatureMarker;
  h: number;
  theme: IChartTheme;
  labels?: Partial<IBranchesLabels>;
  /** Measured points drawn over the branches (e.g. the data of a fit). */
  data?: readonly { T: number; psi: number }[];
  /** Area of a measured point in px² (the point-size setting; default 30). */
  pointSize?: number;
  /** A fitted curve drawn over the branches. */
  fitted?: readonly { T: number; psi: number }[];
  /** Fixed axis domains (the view); the data decide when absent. */
  xDomain?: [number, number];
  yDomain?: [number, number];
  /**
   * Keep every layer (even with no rows) and name every dataset, so a drawn
   * view can take new rows in place ({@link branchesRows}); default false.
   */
  patchable?: boolean;
}

const DASH: Record<LandauPointKind, number[]> = { stable: [1, 0], metastable: [7, 4], unstable: [2, 3], inflection: [1, 3] };


function fmt(v: number): string {
  return finite(v) ? String(Number(v.toPrecision(6))) : String(v);
}

interface IPathRow {
  T: number;
  psi: number;
  part: string;
  order: number;
}

/** Rows of a path cut at its jumps, plus the jump rows. */
function pathRows(path: IBranchesPath | undefined, name: string, label: string): { line: IPathRow[]; jumps: Record<string, unknown>[] } {
  const line: IPathRow[] = [];
  const jumps: Record<string, unknown>[] = [];
  if (!path) {
    return { line, jumps };
  }
  const cuts = new Set(path.jumps.map(j => j.index));
  let part = 0;
  path.points.forEach((p, i) => {
    if (cuts.has(i)) {
      part++;
    }
    if (finite(p.T) && finite(p.psi)) {
      line.push({ T: p.T, psi: p.psi, part: `${name}${part}`, order: i });
    }
  });
  for (const j of path.jumps) {
    if (finite(j.T) && finite(j.psiBefore) && finite(j.psiAfter)) {
      const up = j.psiAfter > j.psiBefore;
      jumps.push({ T: j.T, psi: j.psiBefore, psi2: j.psiAfter, mid: 0.5 * (j.psiBefore + j.psiAfter), shape: up ? 'triangle-up' : 'triangle-down', text: label });
    }
  }
  return { line, jumps };
}

/**
 * Layered ψ(T) spec. Non-finite points, jumps and markers are left out;
 * inputs are not changed.
 */
function branchesLabels(options: IBranchesChartOptions): IBranchesLabels {
  const kinds = { ...DEFAULT_KIND_LABELS, ...options.labels?.kinds };
  return {
    title: `ψ(T) at h = ${fmt(options.h)}`,
    T: 'T',
    psi: 'ψ',
    kind: 'branch',
    heating: 'heating',
    cooling: 'cooling',
    data: 'data',
    fitted: 'fit',
    ...options.labels,
    kinds
  };
}

/** Rows of every dataset of the branches chart, by dataset name (for in-place updates). */
export function branchesRows(options: IBranchesChartOptions): Record<string, Record<string, unknown>[]> {
  const labels = branchesLabels(options);
  const kinds = labels.kinds;
  // An inflection point exists only at isolated temperatures (where a minimum
  // and a maximum merge); it is not a branch of its own.
  const segments = traceBranches(options.branches.filter(p => p.kind !== 'inflection')).map(p => ({ T: p.T, psi: p.psi, kind: kinds[p.kind], segment: p.segment, order: p.order }));
  const heating = pathRows(options.heating, 'h', labels.heating);
  const cooling = pathRows(options.cooling, 'c', labels.cooling);
  const markers = (options.markers ?? []).filter(m => finite(m.T));
  const current = options.current && finite(options.current.T) ? [options.current] : [];
  const jumps = [...heating.jumps, ...cooling.jumps];
  const xy = (rows: readonly { T: number; psi: number }[] | undefined) => (rows ?? []).filter(r => finite(r.T) && finite(r.psi)).map(r => ({ T: r.T, psi: r.psi }));
  return {
    paths: [...heating.line, ...cooling.line] as unknown as Record<string, unknown>[],
    jumps,
    jump_arrows: jumps,
    jump_text: jumps,
    branches: segments,
    markers: markers.map(m => ({ T: m.T, label: m.label })),
    marker_text: markers.map((m, i) => ({ T: m.T, label: m.label, py: 2 + 13 * i })),
    current: current.map(c => ({ T: c.T, label: c.label })),
    ...(options.data !== undefined ? { data: xy(options.data) } : {}),
    ...(options.fitted !== undefined ? { fit: xy(options.fitted).map((r, i) => ({ ...r, order: i })) } : {})
  };
}

export function buildBranchesSpec(options: IBranchesChartOptions): ILandauChart {
  const { theme } = options;
  const labels = branchesLabels(options);
  const kinds = labels.kinds;
  const rows = branchesRows(options);
  const all = options.patchable === true;
  const paths = rows.paths;
  const jumps = rows.jumps;
  const segments = rows.branches;
  const markers = rows.markers;
  const current = rows.current;

  const shown = KIND_ORDER.filter(k => k !== 'inflection');
  const colours = kindColours(theme);
  const domain = (d: [number, number] | undefined) => (d && finite(d[0]) && finite(d[1]) && d[1] > d[0] ? { domain: d } : {});
  const x: PositionFieldDef<Field> = { field: 'T', type: 'quantitative', title: labels.T, scale: { zero: false, nice: false, ...domain(options.xDomain) } };
  const y: PositionFieldDef<Field> = { field: 'psi', type: 'quantitative', title: labels.psi, scale: { zero: false, ...domain(options.yDomain) } };
  const layer: ChartLayer[] = [];
  if (all || paths.length) {
    layer.push({
      name: 'branches_paths',
      data: { name: 'paths', values: paths },
      mark: { type: 'line', color: theme.text, opacity: 0.16, strokeWidth: 9, strokeCap: 'round', clip: true },
      encoding: { x, y, detail: { field: 'part', type: 'nominal' }, order: { field: 'order', type: 'quantitative' } }
    });
  }
  if (all || jumps.length) {
    layer.push(
      {
        name: 'branches_jumps',
        data: { name: 'jumps', values: jumps },
        mark: { type: 'rule', color: theme.text, opacity: 0.5, strokeWidth: 1.5, strokeDash: [3, 2], clip: true },
        encoding: { x: { field: 'T', type: 'quantitative' }, y: { field: 'psi', type: 'quantitative' }, y2: { field: 'psi2' } }
      },
      {
        name: 'branches_jump_arrows',
        data: { name: 'jump_arrows', values: rows.jump_arrows },
        mark: { type: 'point', filled: true, size: 70, color: theme.text, opacity: 0.8, clip: true },
        encoding: {
          x: { field: 'T', type: 'quantitative' },
          y: { field: 'mid', type: 'quantitative' },
          shape: { field: 'shape', type: 'nominal', scale: null },
          tooltip: [
            { field: 'text', type: 'nominal' },
            { field: 'T', type: 'quantitative', title: labels.T, format: '.6~g' }
          ]
        }
      },
      {
        name: 'branches_jump_text',
        data: { name: 'jump_text', values: rows.jump_text },
        mark: { type: 'text', align: 'left', dx: 8, color: theme.text, opacity: 0.8, clip: true },
        encoding: { x: { field: 'T', type: 'quantitative' }, y: { field: 'mid', type: 'quantitative' }, text: { field: 'text' } }
      }
    );
  }
  layer.push({
    name: 'branches_lines',
    data: { name: 'branches', values: segments },
    mark: { type: 'line', strokeWidth: 2, clip: true },
    encoding: {
      x,
      y,
      detail: { field: 'segment', type: 'nominal' },
      order: { field: 'order', type: 'quantitative' },
      color: kindEncoding(labels.kind, shown, kinds, k => colours[k], true),
      strokeDash: kindEncoding(labels.kind, shown, kinds, k => DASH[k], false)
    }
  });
  if (options.fitted !== undefined) {
    layer.push({
      name: 'branches_fit',
      data: { name: 'fit', values: rows.fit },
      mark: { type: 'line', color: theme.accent2, strokeWidth: 2.5, opacity: 0.9, clip: true },
      encoding: { x: { field: 'T', type: 'quantitative' }, y: { field: 'psi', type: 'quantitative' }, order: { field: 'order', type: 'quantitative' } }
    });
  }
  if (options.data !== undefined) {
    layer.push({
      name: 'branches_data',
      data: { name: 'data', values: rows.data },
      mark: { type: 'point', filled: false, size: options.pointSize !== undefined && options.pointSize > 0 ? options.pointSize : 30, color: theme.text, opacity: 0.75, clip: true, tooltip: true },
      encoding: {
        x: { field: 'T', type: 'quantitative' },
        y: { field: 'psi', type: 'quantitative' },
        tooltip: [
          { field: 'T', type: 'quantitative', title: labels.T, format: '.6~g' },
          { field: 'psi', type: 'quantitative', title: `${labels.psi} (${labels.data})`, format: '.6~g' }
        ]
      }
    });
  }
  if (all || markers.length) {
    layer.push(
      {
        name: 'branches_markers',
        data: { name: 'markers', values: markers },
        mark: { type: 'rule', color: theme.text, opacity: 0.45, strokeDash: [4, 4], clip: true },
        encoding: { x: { field: 'T', type: 'quantitative' } }
      },
      {
        name: 'branches_marker_text',
        data: { name: 'marker_text', values: rows.marker_text },
        mark: { type: 'text', baseline: 'top', align: 'left', dx: 3, color: theme.text, clip: true },
        // y in pixels (scale null): one line per marker so close labels do not overlap
        encoding: { x: { field: 'T', type: 'quantitative' }, y: { field: 'py', type: 'quantitative', scale: null }, text: { field: 'label' } }
      }
    );
  }
  if (all || current.length) {
    // one named dataset for the rule and its label, so a view can move both by replacing 'current'
    layer.push({
      data: { name: 'current', values: current },
      layer: [
        {
          name: 'branches_current',
          mark: { type: 'rule', color: theme.accent, strokeWidth: 1.5, clip: true },
          encoding: { x: { field: 'T', type: 'quantitative' } }
        },
        {
          name: 'branches_current_text',
          mark: { type: 'text', baseline: 'bottom', align: 'left', dx: 3, dy: -3, color: theme.accent, clip: true },
          encoding: { x: { field: 'T', type: 'quantitative' }, y: { value: { expr: 'height' } }, text: { field: 'label' } }
        }
      ]
    });
  }
  const spec = layeredChart(layer, { description: `${labels.title}: ${labels.psi} against ${labels.T}, stationary branches by kind, heating and cooling paths`, title: labels.title, theme, liveTitle: all });
  return { spec, rows: segments.length + paths.length + jumps.length + markers.length + current.length + (rows.data?.length ?? 0) + (rows.fit?.length ?? 0) };
}
