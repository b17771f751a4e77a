/**
 * Effective exponent against the fit window: the exponent of each
 * (t_max, H_min) cell with ±σ error bars, one colour per H_min and one dash
 * per method, and the universality classes' values [C2 in REFERENCES.md] as
 * labelled horizontal rules (classes within 1 % of each other share a label).
 */
import type { IExponentWindowCell, IExponentWindowScan } from '../../core/sweeps/index';
import type { IUniversalityClass } from '../../core/physics/universality';
import { UNIVERSALITY_CLASSES } from '../../core/physics/universality';
import type { ChartLayer, ColorDef, Field } from '../frame';
import { layeredChart } from '../frame';
import type { IChartTheme } from '../theme';
import { categoricalColours } from '../theme';
import type { ISweepChart, ISweepChartOptions } from './common';
import { displayUnit, finite, finiteRows, fmt, frameTitle } from './common';

/** Which exponent to draw. */
export type WindowExponent = 'beta' | 'gamma' | 'delta' | 'Tc' | 'deltaCriticalIsotherm' | 'kouvelFisherBeta' | 'kouvelFisherGamma';

/** Universality classes drawn as rules unless told otherwise (ids of `UNIVERSALITY_CLASSES`). */
export const DEFAULT_WINDOW_CLASSES: readonly string[] = Object.freeze(['3d-ising', '3d-xy', '3d-heisenberg', 'mean-field', 'tricritical']);

/** Options of the exponent-against-window chart. */
export interface IWindowChartOptions extends ISweepChartOptions {
  /** Exponent drawn (default 'beta'). */
  exponent?: WindowExponent;
  /** Universality classes drawn as rules, by id (default {@link DEFAULT_WINDOW_CLASSES}; [] for none). */
  classes?: readonly string[];
}

const NAMES: Record<WindowExponent, string> = {
  beta: 'β_eff',
  gamma: 'γ_eff',
  delta: 'δ_eff = 1 + γ/β',
  Tc: 'Tc (K)',
  deltaCriticalIsotherm: 'δ_eff (critical isotherm)',
  kouvelFisherBeta: 'β_eff (Kouvel–Fisher)',
  kouvelFisherGamma: 'γ_eff (Kouvel–Fisher)'
};

const CLASS_KEY: Record<WindowExponent, 'beta' | 'gamma' | 'delta' | null> = {
  beta: 'beta',
  gamma: 'gamma',
  delta: 'delta',
  Tc: null,
  deltaCriticalIsotherm: 'delta',
  kouvelFisherBeta: 'beta',
  kouvelFisherGamma: 'gamma'
};

const SYMBOL = { beta: 'β', gamma: 'γ', delta: 'δ' };

/** Rules (one per class) and labels (one per group of classes within 1 %) of an exponent. */
function classRules(exponent: WindowExponent, ids: readonly string[]): { rules: { value: number; name: string }[]; labels: { value: number; label: string }[] } {
  const key = CLASS_KEY[exponent];
  if (key === null) {
    return { rules: [], labels: [] };
  }
  const classes = ids.map(id => UNIVERSALITY_CLASSES.find(c => c.id === id)).filter((c): c is IUniversalityClass => c !== undefined && finite(c[key].value));
  const rules = classes.map(c => ({ value: c[key].value, name: c.name })).sort((a, b) => a.value - b.value);
  const labels: { value: number; label: string }[] = [];
  let group: { value: number; name: string }[] = [];
  const flush = (): void => {
    if (group.length > 0) {
      const value = group[0].value;
      const eq = group.length > 1 && group.some(g => g.value !== value) ? '≈' : '=';
      labels.push({ value, label: `${group.map(g => g.name).join(', ')}: ${SYMBOL[key]} ${eq} ${fmt(value)}` });
    }
    group = [];
  };
  for (const r of rules) {
    if (group.length > 0 && Math.abs(r.value - group[0].value) > 0.01 * Math.abs(group[0].value)) {
      flush();
    }
    group.push(r);
  }
  flush();
  return { rules, labels };
}

function draw(cells: readonly IExponentWindowCell[], theme: IChartTheme, options: IWindowChartOptions): ISweepChart {
  const exponent = options.exponent ?? 'beta';
  const hu = displayUnit(options.fieldUnit, 'A/m');
  const hLabel = (h: number): string => (finite(h) ? `H_min = ${fmt(h * hu.perSI)} ${hu.unit}` : 'H_min open');
  const raw: { tMax: number; value: number; lo: number; hi: number; hMin: string; h: number; method: string }[] = [];
  for (const c of cells) {
    const v = c[exponent];
    if (v && finite(v.value) && finite(c.tMax) && c.tMax > 0) {
      const s = finite(v.sigma) ? Math.abs(v.sigma) : 0;
      raw.push({ tMax: c.tMax, value: v.value, lo: v.value - s, hi: v.value + s, hMin: hLabel(c.hMin), h: finite(c.hMin) ? c.hMin : -Infinity, method: c.method });
    }
  }
  // Legend in field order, not in the order of the label text.
  const order = [...new Map(raw.slice().sort((a, b) => a.h - b.h).map(r => [r.hMin, r.hMin])).keys()];
  const rows = finiteRows(raw.map(({ h: _h, ...r }) => r));
  const name = NAMES[exponent];
  const color: ColorDef<Field> = { field: 'hMin', type: 'nominal', title: 'H_min', scale: { domain: order, range: categoricalColours(theme) } };
  const { rules, labels } = classRules(exponent, options.classes ?? DEFAULT_WINDOW_CLASSES);
  const layer: ChartLayer[] = [];
  if (rules.length > 0) {
    layer.push(
      {
        data: { values: rules },
        mark: { type: 'rule', color: theme.text, opacity: 0.45, strokeDash: [2, 3] },
        encoding: { y: { field: 'value', type: 'quantitative' } }
      },
      {
        data: { values: labels },
        mark: { type: 'text', color: theme.text, opacity: 0.8, align: 'left', baseline: 'bottom', dx: 4, dy: -2, fontSize: 10 },
        encoding: { x: { value: 0 }, y: { field: 'value', type: 'quantitative' }, text: { field: 'label', type: 'nominal' } }
      }
    );
  }
  layer.push(
    {
      data: { values: rows },
      mark: { type: 'rule' },
      encoding: {
        x: { field: 'tMax', type: 'quantitative', title: 't_max = largest |T − Tc|/Tc of the window', scale: { type: 'log' } },
        y: { field: 'lo', type: 'quantitative', title: name, scale: { zero: false } },
        y2: { field: 'hi' },
        color
      }
    },
    {
      data: { values: rows },
      mark: { type: 'line', point: true, tooltip: true },
      encoding: {
        x: { field: 'tMax', type: 'quantitative' },
        y: { field: 'value', type: 'quantitative' },
        color,
        strokeDash: { field: 'method', type: 'nominal', title: 'method', scale: { domain: ['iteration', 'global'], range: [[1, 0], [4, 3]] } }
      }
    }
  );
  const title = `${name} against the fit window`;
  const caption =
    cells.length === 0
      ? 'No window scan'
      : `${rows.length} of ${cells.length} windows gave a value; error bars ±1σ${rules.length > 0 ? '; dotted rules: universality classes' : ''}`;
  return {
    spec: layeredChart(layer, {
      description: `${name} against the fit window t_max, one series per H_min, error bars ±1σ, universality classes as labelled rules. ${caption}`,
      theme,
      title: frameTitle(title, caption, options),
      height: options.height
    }),
    rows: 2 * rows.length + rules.length + labels.length,
    title,
    caption
  };
}

/** Exponent against the fit window, from the scan (or its cells); null gives an empty chart. */
export function buildExponentWindowSpec(input: IExponentWindowScan | readonly IExponentWindowCell[] | null, theme: IChartTheme, options?: IWindowChartOptions): ISweepChart;
/** The same with the exponent as its own argument; `options` may be just the name of the field unit (values in A/m). */
export function buildExponentWindowSpec(
  input: IExponentWindowScan | readonly IExponentWindowCell[] | null,
  exponent: WindowExponent,
  theme: IChartTheme,
  options?: string | IWindowChartOptions
): ISweepChart;
export function buildExponentWindowSpec(
  input: IExponentWindowScan | readonly IExponentWindowCell[] | null,
  b: IChartTheme | WindowExponent,
  c?: IWindowChartOptions | IChartTheme,
  d?: string | IWindowChartOptions
): ISweepChart {
  const cells = input === null ? [] : Array.isArray(input) ? (input as readonly IExponentWindowCell[]) : (input as IExponentWindowScan).cells;
  if (typeof b === 'string') {
    const o: IWindowChartOptions = typeof d === 'string' ? { fieldUnit: d } : (d ?? {});
    return draw(cells, c as IChartTheme, { ...o, exponent: b });
  }
  return draw(cells, b, (c as IWindowChartOptions | undefined) ?? {});
}
