/**
 * Effective exponent against the fit window of a temperature sweep: β_eff
 * ± σ of each window against its t_max on a log axis, the universality
 * classes' values as labelled horizontal rules (classes within 1 % of each
 * other share a label), and the suggested t_max as a vertical rule. Windows
 * whose fit verdict is not 'fits' are marked by shape as well as colour, so
 * the marking survives colour-vision deficiencies and greyscale.
 */
import type { ChartLayer, ColorDef, Field } from '../frame';
import { layeredChart } from '../frame';
import type { IChartTheme } from '../theme';
import { categoricalColours } from '../theme';
import type { ISweepChart } from '../sweeps/common';
import { finite, finiteRows, fmt } from '../sweeps/common';
import type { ITemperatureChartOptions } from './common';
import { titleLines } from './common';

/** Input of {@link buildWindowScanSpec}. */
export interface IWindowScanInput {
  /** One window each: its largest |T − Tc|/Tc, the exponent fitted in it, and the fit's verdict state. */
  cells: { tMax: number; beta: { value: number; sigma: number }; verdict: string }[];
  /** Universality classes drawn as rules: id, label and their exponent. */
  classes: { id: string; label: string; beta: number }[];
  /** Suggested t_max, or null when none is suggested. */
  suggested: number | null;
  /** Name of the exponent on the axis, e.g. "β_eff" ('' gives "β_eff"). */
  exponentLabel: string;
}

/** Legend words of the verdict states the fits give; other states are shown as they are. */
export const WINDOW_VERDICT_WORDS: Readonly<Record<string, string>> = Object.freeze({
  fits: 'describes the data',
  'does-not-describe': 'does not describe',
  'does-not-fit': 'does not describe',
  'not-converged': 'did not converge'
});

/** Marker of the windows whose fit describes the data; the others take the shapes after it. */
const SHAPES = ['circle', 'triangle-down', 'square', 'diamond', 'cross', 'triangle-up', 'triangle-right', 'triangle-left'];

function verdictWords(state: string): string {
  return WINDOW_VERDICT_WORDS[state] ?? (state ? state : 'no verdict');
}

/** One label per group of classes within 1 % of each other, lowest first. */
function classLabels(rules: readonly { value: number; label: string }[], symbol: string): { value: number; label: string }[] {
  const sorted = rules.slice().sort((a, b) => a.value - b.value);
  const out: { value: number; label: string }[] = [];
  let group: { value: number; label: string }[] = [];
  const flush = (): void => {
    if (group.length > 0) {
      const value = group[0].value;
      const eq = group.some(g => g.value !== value) ? '≈' : '=';
      out.push({ value, label: `${group.map(g => g.label).join(', ')}: ${symbol} ${eq} ${fmt(value)}` });
    }
    group = [];
  };
  for (const r of sorted) {
    if (group.length > 0 && Math.abs(r.value - group[0].value) > 0.01 * Math.abs(group[0].value)) {
      flush();
    }
    group.push(r);
  }
  flush();
  return out;
}

/** Builds the window-scan chart; no cells give an empty chart saying so. */
export function buildWindowScanSpec(input: IWindowScanInput, theme: IChartTheme, options: ITemperatureChartOptions = {}): ISweepChart {
  const name = input.exponentLabel && input.exponentLabel.trim() ? input.exponentLabel : 'β_eff';
  // The class symbol: the exponent's name without its "_eff" (β for β_eff).
  const symbol = name.replace(/_eff\b.*$/, '') || name;
  const all = input.cells ?? [];
  const points = finiteRows(
    all
      .filter(c => finite(c.tMax) && c.tMax > 0 && c.beta && finite(c.beta.value))
      .sort((a, b) => a.tMax - b.tMax)
      .map(c => ({ tMax: c.tMax, value: c.beta.value, sigma: finite(c.beta.sigma) ? Math.abs(c.beta.sigma) : 0, verdict: verdictWords(c.verdict), fits: c.verdict === 'fits' }))
  );
  const bars = finiteRows(points.filter(p => p.sigma > 0).map(p => ({ tMax: p.tMax, lo: p.value - p.sigma, hi: p.value + p.sigma, verdict: p.verdict })));
  // Verdicts in a fixed order (fits first), colours and shapes paired with them.
  const order = [...new Set([WINDOW_VERDICT_WORDS.fits, WINDOW_VERDICT_WORDS['does-not-describe'], WINDOW_VERDICT_WORDS['not-converged'], ...points.map(p => p.verdict)])];
  const present = order.filter(v => points.some(p => p.verdict === v));
  const palette = [theme.accent, theme.accent2, theme.text, ...categoricalColours(theme)];
  const colourOf = new Map(order.map((v, k) => [v, palette[k % palette.length]]));
  const shapeOf = new Map(order.map((v, k) => [v, SHAPES[k % SHAPES.length]]));
  const color: ColorDef<Field> = {
    field: 'verdict',
    type: 'nominal',
    title: 'fit in the window',
    scale: { domain: present, range: present.map(v => colourOf.get(v)!) }
  };
  const rules = (input.classes ?? []).filter(c => finite(c.beta)).map(c => ({ value: c.beta, label: c.label || c.id }));
  const labels = classLabels(rules, symbol);
  const suggested = input.suggested !== null && finite(input.suggested) && input.suggested > 0 ? input.suggested : null;
  const xTitle = 't_max = largest |T − Tc|/Tc of the window';
  const layer: ChartLayer[] = [];
  if (rules.length > 0) {
    layer.push(
      {
        data: { values: rules },
        mark: { type: 'rule', color: theme.text, opacity: 0.45, strokeDash: [2, 3] },
        encoding: { y: { field: 'value', type: 'quantitative' } }
      },
      // Labels alternate between the left and the right edge, so neighbouring classes do not overprint.
      {
        data: { values: labels.filter((_, k) => k % 2 === 0) },
        mark: { type: 'text', color: theme.text, opacity: 0.8, align: 'left', baseline: 'bottom', dx: 4, dy: -2, fontSize: 10 },
        encoding: { x: { value: 0 }, y: { field: 'value', type: 'quantitative' }, text: { field: 'label', type: 'nominal' } }
      }
    );
    if (labels.length > 1) {
      layer.push({
        data: { values: labels.filter((_, k) => k % 2 === 1) },
        mark: { type: 'text', color: theme.text, opacity: 0.8, align: 'right', baseline: 'bottom', dx: -4, dy: -2, fontSize: 10 },
        encoding: { x: { value: 'width' }, y: { field: 'value', type: 'quantitative' }, text: { field: 'label', type: 'nominal' } }
      });
    }
  }
  if (suggested !== null) {
    const values = [{ tMax: suggested, label: `suggested t_max = ${fmt(suggested, 3)}` }];
    layer.push(
      {
        data: { values },
        mark: { type: 'rule', color: theme.accent2, strokeWidth: 1.5, strokeDash: [6, 3] },
        encoding: { x: { field: 'tMax', type: 'quantitative' } }
      },
      {
        data: { values },
        mark: { type: 'text', color: theme.accent2, align: 'left', baseline: 'top', dx: 4, dy: 4, fontSize: 10 },
        encoding: { x: { field: 'tMax', type: 'quantitative' }, y: { value: 0 }, text: { field: 'label', type: 'nominal' } }
      }
    );
  }
  const x = { field: 'tMax', type: 'quantitative' as const, title: xTitle, scale: { type: 'log' as const } };
  if (points.length > 1) {
    layer.push({
      data: { values: points },
      mark: { type: 'line', color: theme.accent, opacity: 0.4, strokeWidth: 1 },
      encoding: { x, y: { field: 'value', type: 'quantitative' } }
    });
  }
  if (bars.length > 0) {
    layer.push({
      data: { values: bars },
      mark: { type: 'rule', strokeWidth: 1 },
      encoding: { x, y: { field: 'lo', type: 'quantitative' }, y2: { field: 'hi' }, color }
    });
  }
  layer.push({
    data: { values: points },
    mark: { type: 'point', filled: true, size: 60, opacity: 0.95, tooltip: true },
    encoding: {
      x,
      y: { field: 'value', type: 'quantitative', title: name, scale: { zero: false } },
      color,
      shape: { field: 'verdict', type: 'nominal', title: 'fit in the window', scale: { domain: present, range: present.map(v => shapeOf.get(v)!) } },
      tooltip: [
        { field: 'tMax', type: 'quantitative', title: 't_max', format: '.3~g' },
        { field: 'value', type: 'quantitative', title: name, format: '.4~g' },
        { field: 'sigma', type: 'quantitative', title: 'σ', format: '.2~g' },
        { field: 'verdict', type: 'nominal', title: 'fit' }
      ]
    }
  });
  const title = `${name} against the fit window`;
  const notFits = points.filter(p => !p.fits).length;
  const caption =
    all.length === 0
      ? 'No window scan'
      : [
          `${points.length} of ${all.length} windows gave a value`,
          notFits > 0 ? `${notFits} of them not described by the fit (marked by shape)` : '',
          suggested !== null ? `suggested t_max = ${fmt(suggested, 3)}` : 'no t_max suggested',
          bars.length > 0 ? 'error bars ±1σ' : '',
          rules.length > 0 ? 'dotted rules: universality classes' : ''
        ]
          .filter(s => s)
          .join('; ');
  return {
    spec: layeredChart(layer, {
      description: `${name} of each fit window against its t_max on a log axis, error bars ±1σ, universality classes as labelled rules, the suggested t_max as a vertical rule. ${caption}`,
      theme,
      title: titleLines(title, caption, options),
      height: options.height
    }),
    rows: points.length * (points.length > 1 ? 2 : 1) + bars.length + rules.length + labels.length + (suggested !== null ? 2 : 0),
    title,
    caption
  };
}
