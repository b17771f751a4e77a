/**
 * Reduced magnetisation M/M0 against reduced temperature T/Tc: the data
 * points with the reference curves asked for (mean field, 2D Ising, …) as
 * lines, one legend entry per curve, each curve with its own colour and its
 * own dash pattern so the curves are told apart without colour too.
 */
import type { ChartLayer } from '../frame';
import { layeredChart } from '../frame';
import type { IChartTheme } from '../theme';
import { categoricalColours } from '../theme';
import type { ISweepChart } from '../sweeps/common';
import { finite } from '../sweeps/common';
import type { ITemperatureChartOptions } from './common';
import { drawnRows, reducedNote, titleLines, uniqueLabels } from './common';

/** Input of {@link buildReducedSpec}. */
export interface IReducedInput {
  /** The data in reduced units. */
  points: { x: number; y: number }[];
  /** Reference curves that may be drawn, by id. */
  curves: { id: string; label: string; x: number[]; y: number[] }[];
  /** Ids of the curves to draw, in legend order. */
  shown: string[];
}

/** Options of {@link buildReducedSpec}. */
export interface IReducedChartOptions extends ITemperatureChartOptions {
  /** Axis titles (default "T/Tc" and "M/M0"). */
  xTitle?: string;
  yTitle?: string;
}

/** Dash patterns of the curves, in order: solid, dashed, dotted, dash-dot, … */
export const REDUCED_CURVE_DASHES: readonly number[][] = Object.freeze([[1, 0], [6, 3], [2, 2], [8, 3, 2, 3], [12, 4], [4, 2, 1, 2, 1, 2], [3, 5]]);

/** Most points of one reference curve drawn (longer curves are thinned evenly, keeping both ends). */
const MAX_CURVE_POINTS = 1000;

/** Builds the reduced-magnetisation chart; no points and no curves give an empty chart saying so. */
export function buildReducedSpec(input: IReducedInput, theme: IChartTheme, options: IReducedChartOptions = {}): ISweepChart {
  const xTitle = options.xTitle ?? 'T/Tc';
  const yTitle = options.yTitle ?? 'M/M0';
  const given = input.points ?? [];
  const px = given.map(p => p?.x);
  const py = given.map(p => p?.y);
  const { rows, total } = drawnRows(px, py, () => true, options.maxPoints);
  const points = Array.from(rows, i => ({ x: px[i], y: py[i] }));
  // Curves in the order they are asked for, each once, only those that exist.
  const byId = new Map((input.curves ?? []).map(c => [c.id, c]));
  const picked = [...new Set(input.shown ?? [])].map(id => byId.get(id)).filter((c): c is IReducedInput['curves'][number] => c !== undefined);
  const names = uniqueLabels(
    picked.map(c => c.label),
    'reference curve'
  );
  const line: { x: number; y: number; curve: string; i: number }[] = [];
  const drawn: string[] = [];
  picked.forEach((c, k) => {
    const n = Math.min(c.x?.length ?? 0, c.y?.length ?? 0);
    const keep: number[] = [];
    for (let i = 0; i < n; i++) {
      if (finite(c.x[i]) && finite(c.y[i])) {
        keep.push(i);
      }
    }
    const step = keep.length > MAX_CURVE_POINTS ? (keep.length - 1) / (MAX_CURVE_POINTS - 1) : 1;
    const m = Math.min(keep.length, MAX_CURVE_POINTS);
    for (let j = 0; j < m; j++) {
      const i = keep[Math.round(j * step)];
      line.push({ x: c.x[i], y: c.y[i], curve: names[k], i: j });
    }
    if (m > 0) {
      drawn.push(names[k]);
    }
  });
  const colours = categoricalColours(theme);
  const layer: ChartLayer[] = [];
  if (line.length > 0) {
    layer.push({
      data: { values: line },
      mark: { type: 'line', strokeWidth: 2, clip: true },
      encoding: {
        x: { field: 'x', type: 'quantitative', title: xTitle },
        y: { field: 'y', type: 'quantitative', title: yTitle },
        order: { field: 'i', type: 'quantitative' },
        color: { field: 'curve', type: 'nominal', title: 'reference', scale: { domain: drawn, range: drawn.map((_, k) => colours[k % colours.length]) } },
        strokeDash: {
          field: 'curve',
          type: 'nominal',
          title: 'reference',
          scale: { domain: drawn, range: drawn.map((_, k) => REDUCED_CURVE_DASHES[k % REDUCED_CURVE_DASHES.length]) }
        }
      }
    });
  }
  layer.push({
    data: { values: points },
    mark: { type: 'point', filled: true, size: 30, color: theme.accent, opacity: 0.85, tooltip: true },
    encoding: {
      x: { field: 'x', type: 'quantitative', title: xTitle },
      y: { field: 'y', type: 'quantitative', title: yTitle },
      tooltip: [
        { field: 'x', type: 'quantitative', title: xTitle, format: '.4~g' },
        { field: 'y', type: 'quantitative', title: yTitle, format: '.4~g' }
      ]
    }
  });
  const title = `${yTitle} against ${xTitle}`;
  const missing = (input.shown ?? []).filter(id => !byId.has(id)).length;
  const caption =
    total === 0 && drawn.length === 0
      ? 'No reduced data'
      : [
          total > 0 ? `${total} points (data)` : 'no data points',
          drawn.length > 0 ? `reference curves: ${drawn.join(', ')}` : 'no reference curves',
          missing > 0 ? `${missing} requested curves unknown` : ''
        ]
          .filter(s => s)
          .join('; ') + reducedNote(points.length, total);
  return {
    spec: layeredChart(layer, {
      description: `${title}: the data as points, reference curves as lines told apart by colour and dash. ${caption}`,
      theme,
      title: titleLines(title, caption, options),
      height: options.height
    }),
    rows: points.length + line.length,
    title,
    caption
  };
}
