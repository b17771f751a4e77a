/**
 * Correlation matrix of fitted parameters as a small heat map: one cell per
 * pair, coloured on the theme's diverging ramp over the fixed domain
 * [−1, 1] (so the colours mean the same in every chart), each cell labelled
 * with its value to two decimals in whichever of the theme's text and
 * background colours reads better on it. Pairs without a finite value are
 * labelled "n/a" on an empty cell.
 */
import type { ChartLayer } from '../frame';
import { layeredChart } from '../frame';
import type { IChartTheme } from '../theme';
import { divergingColours } from '../theme';
import type { ISweepChart } from '../sweeps/common';
import { finite } from '../sweeps/common';
import type { ITemperatureChartOptions } from './common';
import { titleLines, uniqueLabels } from './common';

/** Input of {@link buildCorrelationSpec}. */
export interface ICorrelationInput {
  /** Parameter names, in the order of the matrix's rows and columns. */
  parameters: string[];
  /** correlation[i][j] between parameters i and j, in [−1, 1]. */
  correlation: number[][];
}

/** Height of one row of cells in px, when the options give no height. */
const CELL_PX = 34;

/** sRGB channels (0–255) of a #rgb or #rrggbb colour or an rgb()/rgba() string; null for anything else. */
function rgbOf(colour: string): [number, number, number] | null {
  const c = colour.trim();
  let m = /^#([0-9a-f]{6})$/i.exec(c);
  if (m) {
    const v = parseInt(m[1], 16);
    return [(v >> 16) & 255, (v >> 8) & 255, v & 255];
  }
  m = /^#([0-9a-f]{3})$/i.exec(c);
  if (m) {
    return [0, 1, 2].map(k => parseInt(m![1][k] + m![1][k], 16)) as [number, number, number];
  }
  m = /^rgba?\(\s*([\d.]+)[\s,]+([\d.]+)[\s,]+([\d.]+)/i.exec(c);
  return m ? [Number(m[1]), Number(m[2]), Number(m[3])] : null;
}

/** Relative luminance (WCAG) of sRGB channels. */
function luminance([r, g, b]: [number, number, number]): number {
  const lin = (v: number): number => {
    const s = v / 255;
    return s <= 0.04045 ? s / 12.92 : ((s + 0.055) / 1.055) ** 2.4;
  };
  return 0.2126 * lin(r) + 0.7152 * lin(g) + 0.0722 * lin(b);
}

/** WCAG contrast ratio of two luminances. */
function contrast(a: number, b: number): number {
  return (Math.max(a, b) + 0.05) / (Math.min(a, b) + 0.05);
}

/** The cell colour at r on the ramp (stops evenly spaced over [−1, 1], interpolated in RGB as the scale does). */
function rampAt(ramp: readonly [number, number, number][], r: number): [number, number, number] {
  const t = ((Math.max(-1, Math.min(1, r)) + 1) / 2) * (ramp.length - 1);
  const k = Math.min(ramp.length - 2, Math.floor(t));
  const f = t - k;
  return [0, 1, 2].map(c => ramp[k][c] + f * (ramp[k + 1][c] - ramp[k][c])) as [number, number, number];
}

/** Builds the correlation heat map; no parameters give an empty chart saying so. */
export function buildCorrelationSpec(input: ICorrelationInput, theme: IChartTheme, options: ITemperatureChartOptions = {}): ISweepChart {
  const names = uniqueLabels(input.parameters ?? [], 'parameter');
  const ramp = divergingColours(theme);
  const domain = ramp.map((_, k) => -1 + (2 * k) / (ramp.length - 1));
  const rampRgb = ramp.map(rgbOf);
  const canMix = rampRgb.every(c => c !== null);
  const ink = [rgbOf(theme.text), rgbOf(theme.background)];
  // Label colour of a cell: whichever of the text and background colours contrasts more with it.
  const inkOn = (r: number): 'text' | 'background' => {
    if (!canMix || ink[0] === null || ink[1] === null) {
      return 'text';
    }
    const cell = luminance(rampAt(rampRgb as [number, number, number][], r));
    return contrast(cell, luminance(ink[0])) >= contrast(cell, luminance(ink[1])) ? 'text' : 'background';
  };
  const cells: { a: string; b: string; r: number; label: string; ink: 'text' | 'background' }[] = [];
  const missing: { a: string; b: string; label: string }[] = [];
  let strongest: { a: string; b: string; r: number; label: string } | null = null;
  for (let i = 0; i < names.length; i++) {
    for (let j = 0; j < names.length; j++) {
      const raw = input.correlation?.[i]?.[j];
      if (typeof raw === 'number' && finite(raw)) {
        const r = Math.max(-1, Math.min(1, raw));
        // Two decimals with a true minus sign, and no "−0.00".
        const text = r.toFixed(2);
        const label = /^-0\.00$/.test(text) ? '0.00' : text.replace('-', '−');
        cells.push({ a: names[j], b: names[i], r, label, ink: inkOn(r) });
        if (i < j && (strongest === null || Math.abs(r) > Math.abs(strongest.r))) {
          strongest = { a: names[i], b: names[j], r, label };
        }
      } else {
        missing.push({ a: names[j], b: names[i], label: 'n/a' });
      }
    }
  }
  const x = { field: 'a', type: 'nominal' as const, title: null, sort: names, axis: { labelAngle: 0 } };
  const y = { field: 'b', type: 'nominal' as const, title: null, sort: names };
  const layer: ChartLayer[] = [
    {
      data: { values: cells },
      mark: { type: 'rect', tooltip: true },
      encoding: {
        x,
        y,
        color: {
          field: 'r',
          type: 'quantitative',
          title: 'correlation',
          scale: { type: 'linear', domain, range: ramp, interpolate: 'rgb' },
          legend: { values: [-1, -0.5, 0, 0.5, 1], format: '.1f' }
        },
        tooltip: [
          { field: 'b', type: 'nominal', title: 'parameter' },
          { field: 'a', type: 'nominal', title: 'with' },
          { field: 'label', type: 'nominal', title: 'correlation' }
        ]
      }
    },
    {
      data: { values: cells },
      mark: { type: 'text', fontSize: 11 },
      encoding: { x, y, text: { field: 'label', type: 'nominal' }, color: { condition: { test: "datum.ink === 'background'", value: theme.background }, value: theme.text } }
    }
  ];
  if (missing.length > 0) {
    layer.push({
      data: { values: missing },
      mark: { type: 'text', fontSize: 11, color: theme.text, opacity: 0.7 },
      encoding: { x, y, text: { field: 'label', type: 'nominal' } }
    });
  }
  const title = 'Parameter correlations';
  const caption =
    names.length === 0
      ? 'No parameters'
      : strongest === null
        ? names.length === 1
          ? `One parameter (${names[0]}): nothing to correlate`
          : 'No correlation between different parameters is known'
        : `Strongest correlation: ${strongest.a} with ${strongest.b}, ${strongest.label}`;
  return {
    spec: layeredChart(layer, {
      description: `${title}: a heat map of the correlation of each pair of fitted parameters, from −1 to 1, with the value in each cell. ${caption}`,
      theme,
      title: titleLines(title, caption, options),
      height: options.height ?? Math.max(2, names.length) * CELL_PX + 40
    }),
    rows: 2 * cells.length + missing.length,
    title,
    caption
  };
}
