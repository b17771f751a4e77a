/**
 * Shared pieces of the temperature-sweep chart builders: the options they
 * take and the rows of a point series to draw (finite pairs, reduced for
 * display when there are too many). What a builder returns and the number
 * labels are the sweep builders' (`../sweeps/common.ts`).
 */
import type { ISweepChartOptions } from '../sweeps/common';
import { DISPLAY_MAX_POINTS, reduceForDisplay } from '../reduce';

/** Options every temperature-sweep builder takes. */
export type ITemperatureChartOptions = Pick<ISweepChartOptions, 'maxPoints' | 'showTitle' | 'height'>;

/** Smallest display budget the reduction accepts. */
const MIN_BUDGET = 8;

/**
 * Rows (in row order) of the pairs of x and y that are finite and pass
 * `keep`, reduced for display to at most `maxPoints` (default
 * `DISPLAY_MAX_POINTS`), with how many there were before the reduction.
 */
export function drawnRows(
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  keep: (i: number) => boolean,
  maxPoints: number | undefined
): { rows: Int32Array; total: number } {
  const n = Math.min(x.length, y.length);
  const rows = new Int32Array(n);
  let m = 0;
  for (let i = 0; i < n; i++) {
    if (Number.isFinite(x[i]) && Number.isFinite(y[i]) && keep(i)) {
      rows[m++] = i;
    }
  }
  const all = rows.subarray(0, m);
  const budget = Math.max(MIN_BUDGET, Math.floor(maxPoints !== undefined && maxPoints > 0 ? maxPoints : DISPLAY_MAX_POINTS));
  return { rows: m > budget ? reduceForDisplay(x, y, all, budget) : all, total: m };
}

/** "n of m points drawn" when a series was reduced, else ''. */
export function reducedNote(shown: number, total: number): string {
  return shown < total ? `; ${shown} of ${total} points drawn` : '';
}

/** Labels made unique by numbering repeats ("a", "a (2)", …), empty ones named `fallback`. */
export function uniqueLabels(labels: readonly string[], fallback: string): string[] {
  const used = new Set<string>();
  return labels.map(raw => {
    const base = raw && raw.trim() ? raw : fallback;
    let label = base;
    for (let k = 2; used.has(label); k++) {
      label = `${base} (${k})`;
    }
    used.add(label);
    return label;
  });
}

/** Longest line of a subtitle, in characters: longer captions are wrapped at their "; " breaks. */
const SUBTITLE_LINE = 64;

/**
 * The frame's title when the options ask for one: the title and the caption
 * below it, wrapped into lines at "; " so a long caption does not widen the
 * chart (a fitted chart would shrink its plot to make room).
 */
export function titleLines(title: string, caption: string, options: ITemperatureChartOptions | undefined): { text: string; subtitle?: string[] } | undefined {
  if (!options?.showTitle) {
    return undefined;
  }
  if (!caption) {
    return { text: title };
  }
  const lines: string[] = [];
  for (const part of caption.split('; ')) {
    const last = lines.length - 1;
    if (last >= 0 && lines[last].length + 2 + part.length <= SUBTITLE_LINE) {
      lines[last] = `${lines[last]}; ${part}`;
    } else {
      lines.push(part);
    }
  }
  return { text: title, subtitle: lines };
}
