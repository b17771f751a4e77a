/**
 * A quasi-static field loop ψ(h) (P–E or M–H): the path with its jumps, the
 * increasing and decreasing legs in two colours, and the stationary branches
 * (all roots of F′) faintly behind.
 */
import type { ChartLayer, Field, PositionFieldDef } from '../frame';
import { layeredChart } from '../frame';
import type { IChartTheme } from '../theme';
import type { ILandauChart } from './common';
import { finite } from './common';

/** Texts of the loop chart (translated by the caller). */
export interface ILoopLabels {
  title: string;
  h: string;
  psi: string;
  leg: string;
  up: string;
  down: string;
}

/** Input of {@link buildLoopSpec}. */
export interface ILoopChartOptions {
  /** States of the loop in order (field rising, then falling). */
  points: readonly { h: number; psi: number }[];
  /** Index of the first state of the falling leg. */
  turn: number;
  theme: IChartTheme;
  labels?: Partial<ILoopLabels>;
}

/** Rows of the loop's dataset. */
export function loopRows(options: ILoopChartOptions): Record<string, Record<string, unknown>[]> {
  const labels = loopLabels(options.labels);
  const loop: Record<string, unknown>[] = [];
  options.points.forEach((p, i) => {
    if (finite(p.h) && finite(p.psi)) {
      loop.push({ h: p.h, psi: p.psi, leg: i < options.turn ? labels.up : labels.down, order: i });
    }
  });
  return { loop };
}

function loopLabels(given: Partial<ILoopLabels> | undefined): ILoopLabels {
  return { title: 'Field loop', h: 'h', psi: 'ψ', leg: 'field', up: 'rising', down: 'falling', ...given };
}

/** Layered loop spec. */
export function buildLoopSpec(options: ILoopChartOptions): ILandauChart {
  const { theme } = options;
  const labels = loopLabels(options.labels);
  const rows = loopRows(options);
  const x: PositionFieldDef<Field> = { field: 'h', type: 'quantitative', title: labels.h, scale: { zero: false, nice: false } };
  const y: PositionFieldDef<Field> = { field: 'psi', type: 'quantitative', title: labels.psi, scale: { zero: false } };
  const layer: ChartLayer[] = [
    {
      name: 'loop_path',
      data: { name: 'loop', values: rows.loop },
      mark: { type: 'line', strokeWidth: 2, clip: true },
      encoding: {
        x,
        y,
        order: { field: 'order', type: 'quantitative' },
        color: { field: 'leg', type: 'nominal', title: labels.leg, scale: { domain: [labels.up, labels.down], range: [theme.accent, theme.accent2] }, legend: { orient: 'bottom' } }
      }
    }
  ];
  const spec = layeredChart(layer, { description: `${labels.title}: ${labels.psi} against ${labels.h}, rising and falling legs`, title: labels.title, theme });
  return { spec, rows: rows.loop.length };
}
