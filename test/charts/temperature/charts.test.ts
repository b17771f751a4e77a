/**
 * The temperature-sweep chart builders: each spec compiles without a
 * Vega-Lite warning, holds finite numbers only, says no "NaN", takes its
 * colours from the theme, has the layers its view needs, and stays valid on
 * empty, non-finite and single-point input.
 */
import { describe, expect, it } from 'vitest';
import { compile } from 'vega-lite';
import { parse, View } from 'vega';
import {
  buildCorrelationSpec,
  buildInverseChiSpec,
  buildReducedSpec,
  buildResidualSpec,
  buildWindowScanSpec,
  REDUCED_CURVE_DASHES
} from '../../../src/charts/temperature/index';
import type { ICorrelationInput, IInverseChiInput, IReducedInput, IWindowScanInput } from '../../../src/charts/temperature/index';
import { DEFAULT_DIVERGING, type IChartTheme } from '../../../src/charts/theme';
import { DISPLAY_MAX_POINTS } from '../../../src/charts/reduce';
import { checkChart, distinctTheme, layers, markOf } from '../sweeps/helpers';

const N = Number.NaN;

/** Curie–Weiss χ = C/(T − θ) with C = 2, θ = 40 K. */
function curieWeiss(): { T: number[]; chi: number[] } {
  const T = Array.from({ length: 30 }, (_, i) => 60 + 8 * i);
  return { T, chi: T.map(t => 2 / (t - 40)) };
}

describe('buildResidualSpec', () => {
  const x = [1, 2, 3, 4, 5, 6];
  const residuals = [0.2, -0.5, 1.5, -0.1, 0.05, 0.9];

  it('should divide by σ, draw a zero rule and ±1σ, ±2σ bands, and say so on the axis', () => {
    const sigma = [0.1, 0.5, 0.5, 0.1, 0.1, 0.3];
    const chart = buildResidualSpec({ x, residuals, sigma, xTitle: 'T (K)' }, distinctTheme, { yUnit: 'emu/g' });
    checkChart(chart);
    const ls = layers(chart.spec);
    expect(ls.map(markOf)).toEqual(['rect', 'rect', 'rule', 'point']);
    expect(ls[0].data.values).toEqual([{ lo: -2, hi: 2 }]);
    expect(ls[1].data.values).toEqual([{ lo: -1, hi: 1 }]);
    expect(ls[2].data.values).toEqual([{ zero: 0 }]);
    const pts = ls[3].data.values as { x: number; r: number }[];
    expect(pts.map(p => p.r)).toEqual(residuals.map((r, i) => r / sigma[i]));
    expect((ls[3].encoding.y as { title?: string }).title).toBe('(y − model)/σ');
    // 0.2/0.1 = 2 is not beyond 2; 1.5/0.5 = 3 and 0.9/0.3 = 3 are.
    expect(chart.caption).toContain('2 beyond ±2σ');
    expect(chart.rows).toBe(6 + 3);
  });

  it('should draw raw residuals in the unit of y without σ, with the zero rule only', () => {
    const chart = buildResidualSpec({ x, residuals, xTitle: 'T (K)' }, distinctTheme, { yUnit: 'emu/g' });
    checkChart(chart);
    const ls = layers(chart.spec);
    expect(ls.map(markOf)).toEqual(['rule', 'point']);
    expect((ls[1].data.values as { r: number }[]).map(p => p.r)).toEqual(residuals);
    expect((ls[1].encoding.y as { title?: string }).title).toBe('y − model (emu/g)');
    expect(chart.title).toBe('Residuals');
  });

  it('should leave out the rows without a usable σ, and fall back to raw residuals when no σ is usable', () => {
    const chart = buildResidualSpec({ x, residuals, sigma: [0.1, N, 0, -0.5, Number.POSITIVE_INFINITY, 0.3], xTitle: 'T' }, distinctTheme);
    checkChart(chart);
    const pts = layers(chart.spec)[3].data.values as { row: number; r: number }[];
    expect(pts.map(p => p.row)).toEqual([0, 3, 5]);
    // A negative σ counts by its size.
    expect(pts.map(p => p.r)).toEqual([2, -0.1 / 0.5, 3]);
    expect(chart.caption).toContain('3 rows without a finite residual or σ left out');
    const raw = buildResidualSpec({ x, residuals, sigma: x.map(() => N), xTitle: 'T' }, distinctTheme);
    checkChart(raw);
    expect(layers(raw.spec).map(markOf)).toEqual(['rule', 'point']);
  });

  it('should give valid specs for empty, non-finite and single-point input', () => {
    for (const input of [
      { x: [], residuals: [] },
      { x: [N, 1, Number.NEGATIVE_INFINITY], residuals: [1, N, 2] },
      { x: [3], residuals: [0.4] },
      { x: [3], residuals: [0.4], sigma: [0.2] }
    ]) {
      const chart = buildResidualSpec({ ...input, xTitle: 'T (K)' }, distinctTheme, { showTitle: true });
      checkChart(chart);
    }
    expect(buildResidualSpec({ x: [], residuals: [], xTitle: 'T' }, distinctTheme).caption).toBe('No residuals to draw');
  });

  it('should reduce a large series for display and say how many points are drawn', () => {
    const n = 50_000;
    const big = Float64Array.from({ length: n }, (_, i) => i);
    const res = big.map(v => Math.sin(v / 100));
    const chart = buildResidualSpec({ x: big, residuals: res, sigma: new Float64Array(n).fill(0.5), xTitle: 'T' }, distinctTheme);
    checkChart(chart);
    const drawn = layers(chart.spec)[3].data.values.length;
    expect(drawn).toBeLessThanOrEqual(DISPLAY_MAX_POINTS);
    expect(chart.caption).toContain(`${drawn} of ${n} points drawn`);
  });
});

describe('buildCorrelationSpec', () => {
  const input: ICorrelationInput = {
    parameters: ['Tc', 'beta', 'M0'],
    correlation: [
      [1, -0.934, 0.2],
      [-0.934, 1, 0.0004],
      [0.2, 0.0004, 1]
    ]
  };

  it('should draw one cell per pair on the theme’s diverging ramp over the fixed domain [−1, 1], labelled to two decimals', () => {
    const chart = buildCorrelationSpec(input, distinctTheme);
    checkChart(chart);
    const ls = layers(chart.spec);
    expect(ls.map(markOf)).toEqual(['rect', 'text']);
    const scale = (ls[0].encoding.color as { scale: { domain: number[]; range: string[] } }).scale;
    expect(scale.range).toEqual(distinctTheme.diverging);
    expect(scale.domain[0]).toBe(-1);
    expect(scale.domain[scale.domain.length - 1]).toBe(1);
    expect(scale.domain.length).toBe(scale.range.length);
    const cells = ls[0].data.values as { a: string; b: string; r: number; label: string }[];
    expect(cells.length).toBe(9);
    expect(cells.find(c => c.a === 'beta' && c.b === 'Tc')!.label).toBe('−0.93');
    expect(cells.find(c => c.a === 'M0' && c.b === 'beta')!.label).toBe('0.00');
    expect(cells.find(c => c.a === 'Tc' && c.b === 'Tc')!.label).toBe('1.00');
    expect(chart.caption).toBe('Strongest correlation: Tc with beta, −0.93');
  });

  it('should keep the domain [−1, 1] whatever the values, clip values beyond it, and colour with the default ramp when the theme has none', () => {
    const theme: IChartTheme = { ...distinctTheme, diverging: undefined };
    const chart = buildCorrelationSpec({ parameters: ['a', 'b'], correlation: [[1, 0.1], [0.1, 1.0000000002]] }, theme);
    checkChart(chart, { ...theme, diverging: DEFAULT_DIVERGING });
    const scale = (layers(chart.spec)[0].encoding.color as { scale: { domain: number[]; range: string[] } }).scale;
    expect(scale.range).toEqual(DEFAULT_DIVERGING.slice());
    expect([scale.domain[0], scale.domain[scale.domain.length - 1]]).toEqual([-1, 1]);
    expect((layers(chart.spec)[0].data.values as { r: number }[]).every(c => c.r >= -1 && c.r <= 1)).toBe(true);
  });

  it('should label each cell in whichever of text and background colour reads better on it', () => {
    const light: IChartTheme = { ...distinctTheme, text: '#000000', background: '#ffffff' };
    const chart = buildCorrelationSpec({ parameters: ['a', 'b'], correlation: [[1, 0], [0, -1]] }, light);
    const text = layers(chart.spec)[1];
    const cells = text.data.values as { r: number; ink: string }[];
    // Both ends of the test ramp are dark, its middle pale.
    expect(cells.filter(c => Math.abs(c.r) === 1).every(c => c.ink === 'background')).toBe(true);
    expect(cells.filter(c => c.r === 0).every(c => c.ink === 'text')).toBe(true);
    expect(text.encoding.color).toEqual({ condition: { test: "datum.ink === 'background'", value: '#ffffff' }, value: '#000000' });
  });

  it('should mark pairs without a finite value "n/a", and stay valid for no, one and missing parameters', () => {
    const chart = buildCorrelationSpec({ parameters: ['a', 'b'], correlation: [[1, N], [N]] }, distinctTheme);
    checkChart(chart);
    const ls = layers(chart.spec);
    expect(ls.map(markOf)).toEqual(['rect', 'text', 'text']);
    expect(ls[2].data.values.length).toBe(3);
    expect(chart.caption).toBe('No correlation between different parameters is known');
    for (const c of [
      { parameters: [], correlation: [] },
      { parameters: ['Tc'], correlation: [[1]] },
      { parameters: ['Tc', 'Tc'], correlation: [] }
    ]) {
      checkChart(buildCorrelationSpec(c, distinctTheme, { showTitle: true }));
    }
    expect(buildCorrelationSpec({ parameters: [], correlation: [] }, distinctTheme).caption).toBe('No parameters');
  });

  it('should colour the cells as computed in a Vega view (the ramp’s middle at zero)', async () => {
    const chart = buildCorrelationSpec(input, distinctTheme);
    const view = new View(parse(compile(chart.spec).spec), { renderer: 'none' });
    await view.runAsync();
    const scale = view.scale('color') as (v: number) => string;
    expect(scale(0)).toBe('rgb(238, 238, 240)');
    expect(scale(-1)).toBe('rgb(26, 43, 140)');
    expect(scale(1)).toBe('rgb(140, 43, 26)');
    view.finalize();
  });
});

describe('buildWindowScanSpec', () => {
  const input: IWindowScanInput = {
    cells: [
      { tMax: 0.02, beta: { value: 0.33, sigma: 0.02 }, verdict: 'fits' },
      { tMax: 0.05, beta: { value: 0.35, sigma: 0.01 }, verdict: 'fits' },
      { tMax: 0.1, beta: { value: 0.38, sigma: 0.01 }, verdict: 'does-not-describe' },
      { tMax: 0.2, beta: { value: 0.42, sigma: N }, verdict: 'not-converged' },
      { tMax: 0.4, beta: { value: N, sigma: 0.1 }, verdict: 'not-converged' },
      { tMax: 0, beta: { value: 0.3, sigma: 0.1 }, verdict: 'fits' }
    ],
    classes: [
      { id: '3d-ising', label: '3D Ising', beta: 0.3265 },
      { id: '3d-xy', label: '3D XY', beta: 0.3485 },
      { id: '3d-heisenberg', label: '3D Heisenberg', beta: 0.3689 },
      { id: 'mean-field', label: 'mean field', beta: 0.5 },
      { id: 'bad', label: 'bad', beta: N }
    ],
    suggested: 0.05,
    exponentLabel: 'β_eff'
  };

  it('should draw β_eff ± σ on a log t_max axis, the classes as labelled rules and the suggested t_max as a vertical rule', () => {
    const chart = buildWindowScanSpec(input, distinctTheme);
    checkChart(chart);
    const ls = layers(chart.spec);
    expect(ls.map(markOf)).toEqual(['rule', 'text', 'text', 'rule', 'text', 'line', 'rule', 'point']);
    expect(ls[0].data.values.map(v => v.value)).toEqual([0.3265, 0.3485, 0.3689, 0.5]);
    // Four labels, alternating between the left and right edges.
    expect(ls[1].data.values.map(v => v.value)).toEqual([0.3265, 0.3689]);
    expect(ls[2].data.values.map(v => v.value)).toEqual([0.3485, 0.5]);
    expect(ls[3].data.values).toEqual([{ tMax: 0.05, label: 'suggested t_max = 0.05' }]);
    expect(ls[3].encoding.x.field).toBe('tMax');
    const pts = ls[7];
    expect(pts.encoding.x.scale?.type).toBe('log');
    expect(pts.data.values.map(v => v.tMax)).toEqual([0.02, 0.05, 0.1, 0.2]);
    // Bars only where σ is finite.
    expect(ls[6].data.values.map(v => v.tMax)).toEqual([0.02, 0.05, 0.1]);
    expect(ls[6].data.values[0].lo).toBeCloseTo(0.31, 12);
    expect(chart.rows).toBe(2 * 4 + 3 + 4 + 4 + 2);
    expect(chart.caption).toContain('4 of 6 windows gave a value');
    expect(chart.caption).toContain('2 of them not described by the fit');
  });

  it('should mark the windows that do not fit by shape as well as colour', () => {
    const pts = layers(buildWindowScanSpec(input, distinctTheme).spec)[7];
    const color = pts.encoding.color.scale as { domain: string[]; range: string[] };
    const shape = pts.encoding.shape.scale as { domain: string[]; range: string[] };
    expect(color.domain).toEqual(['describes the data', 'does not describe', 'did not converge']);
    expect(shape.domain).toEqual(color.domain);
    expect(new Set(color.range).size).toBe(3);
    expect(new Set(shape.range).size).toBe(3);
    expect(color.range[0]).toBe(distinctTheme.accent);
    expect(shape.range[0]).toBe('circle');
    expect(pts.encoding.color.field).toBe('verdict');
    expect(pts.encoding.shape.field).toBe('verdict');
  });

  it('should share one label between classes within 1 %, and leave out the suggested rule when there is none', () => {
    const chart = buildWindowScanSpec(
      {
        ...input,
        classes: [
          { id: 'a', label: 'A', beta: 0.3265 },
          { id: 'b', label: 'B', beta: 0.3275 }
        ],
        suggested: null
      },
      distinctTheme
    );
    checkChart(chart);
    const ls = layers(chart.spec);
    expect(ls.map(markOf)).toEqual(['rule', 'text', 'line', 'rule', 'point']);
    expect(ls[1].data.values).toEqual([{ value: 0.3265, label: 'A, B: β ≈ 0.3265' }]);
    expect(chart.caption).toContain('no t_max suggested');
  });

  it('should give valid specs for no cells, only non-finite cells and a single cell', () => {
    for (const cells of [
      [],
      [{ tMax: N, beta: { value: 0.3, sigma: 0.1 }, verdict: 'fits' }],
      [{ tMax: 0.1, beta: { value: 0.3, sigma: 0.1 }, verdict: 'weird' }]
    ]) {
      for (const suggested of [null, N, 0.1]) {
        const chart = buildWindowScanSpec({ cells, classes: [], suggested, exponentLabel: '' }, distinctTheme, { showTitle: true });
        checkChart(chart);
        expect(chart.title).toBe('β_eff against the fit window');
      }
    }
  });
});

describe('buildReducedSpec', () => {
  const mf = Array.from({ length: 51 }, (_, i) => i / 50);
  const input: IReducedInput = {
    points: [
      { x: 0.2, y: 0.98 },
      { x: 0.5, y: 0.9 },
      { x: 0.9, y: 0.5 },
      { x: N, y: 0.3 }
    ],
    curves: [
      { id: 'mf', label: 'mean field', x: mf, y: mf.map(t => Math.sqrt(Math.max(0, 1 - t))) },
      { id: 'ising2d', label: '2D Ising', x: mf, y: mf.map(t => Math.max(0, 1 - t) ** 0.125) },
      { id: 'unused', label: 'unused', x: [0, 1], y: [1, 0] }
    ],
    shown: ['ising2d', 'mf', 'missing']
  };

  it('should draw the data and the curves asked for, a legend by label with distinct colours and dashes', () => {
    const chart = buildReducedSpec(input, distinctTheme);
    checkChart(chart);
    const ls = layers(chart.spec);
    expect(ls.map(markOf)).toEqual(['line', 'point']);
    expect(ls[1].data.values.length).toBe(3);
    const line = ls[0];
    expect([...new Set(line.data.values.map(v => v.curve))]).toEqual(['2D Ising', 'mean field']);
    const color = line.encoding.color.scale as { domain: string[]; range: string[] };
    const dash = line.encoding.strokeDash.scale as { domain: string[]; range: number[][] };
    expect(color.domain).toEqual(['2D Ising', 'mean field']);
    expect(dash.domain).toEqual(color.domain);
    expect(color.range).toEqual(distinctTheme.categorical!.slice(0, 2));
    expect(dash.range).toEqual(REDUCED_CURVE_DASHES.slice(0, 2));
    expect(new Set(dash.range.map(d => d.join(','))).size).toBe(2);
    expect(chart.caption).toContain('reference curves: 2D Ising, mean field');
    expect(chart.caption).toContain('1 requested curves unknown');
  });

  it('should draw no line layer when no curve is shown, and stay valid for empty, non-finite and single-point input', () => {
    const none = buildReducedSpec({ ...input, shown: [] }, distinctTheme);
    checkChart(none);
    expect(layers(none.spec).map(markOf)).toEqual(['point']);
    for (const c of [
      { points: [], curves: [], shown: [] },
      { points: [{ x: N, y: N }], curves: [{ id: 'a', label: '', x: [N, 1], y: [1, N] }], shown: ['a'] },
      { points: [{ x: 0.5, y: 0.5 }], curves: [{ id: 'a', label: 'a', x: [0.5], y: [0.9] }], shown: ['a'] }
    ]) {
      checkChart(buildReducedSpec(c, distinctTheme, { showTitle: true }));
    }
  });

  it('should keep curve labels apart when two are the same', () => {
    const chart = buildReducedSpec(
      {
        points: [],
        curves: [
          { id: 'a', label: 'model', x: [0, 1], y: [1, 0] },
          { id: 'b', label: 'model', x: [0, 1], y: [1, 0.2] }
        ],
        shown: ['a', 'b']
      },
      distinctTheme
    );
    checkChart(chart);
    expect((layers(chart.spec)[0].encoding.color.scale as { domain: string[] }).domain).toEqual(['model', 'model (2)']);
  });
});

describe('buildInverseChiSpec', () => {
  const { T, chi } = curieWeiss();
  const model = { x: T, y: T.map(t => 2 / (t - 40)) };

  it('should draw 1/χ, 1/χ of the model carried on to θ, and θ marked on the zero rule', () => {
    const input: IInverseChiInput = { T, chi, curve: model, theta: 40, yUnit: 'emu/(mol Oe)' };
    const chart = buildInverseChiSpec(input, distinctTheme);
    checkChart(chart);
    const ls = layers(chart.spec);
    expect(ls.map(markOf)).toEqual(['rule', 'point', 'line', 'line', 'point', 'text']);
    const pts = ls[1].data.values as { T: number; inv: number }[];
    expect(pts[0].inv).toBeCloseTo((60 - 40) / 2, 12);
    const reach = ls[3].data.values as { T: number; inv: number }[];
    expect(reach[1]).toEqual({ T: 40, inv: 0, i: 1 });
    expect(reach[0].T).toBe(60);
    expect(ls[4].data.values).toEqual([{ T: 40, inv: 0, label: 'θ = 40 K' }]);
    expect((ls[1].encoding.y as { title?: string }).title).toBe('1/χ ((emu/(mol Oe))⁻¹)');
    expect(chart.caption).toContain('θ = 40 K');
  });

  it('should draw σ/χ² error bars only with σ', () => {
    const sigma = chi.map(c => 0.01 * c);
    const chart = buildInverseChiSpec({ T, chi, sigma, curve: model, theta: 40, yUnit: 'emu' }, distinctTheme);
    checkChart(chart);
    const ls = layers(chart.spec);
    expect(ls.map(markOf)).toEqual(['rule', 'rule', 'point', 'line', 'line', 'point', 'text']);
    const bar = ls[1].data.values[0] as { lo: number; hi: number };
    expect(bar.hi - bar.lo).toBeCloseTo((2 * 0.01) / chi[0], 10);
    const without = buildInverseChiSpec({ T, chi, yUnit: 'emu' }, distinctTheme);
    checkChart(without);
    expect(layers(without.spec).map(markOf)).toEqual(['rule', 'point']);
    expect(without.caption).toContain('θ unknown');
  });

  it('should not carry the line on when θ lies within the curve, and skip χ = 0', () => {
    const chart = buildInverseChiSpec({ T: [10, 20, 30], chi: [0, 1, 2], curve: { x: [10, 50], y: [-1, 1] }, theta: 30, yUnit: '' }, distinctTheme);
    checkChart(chart);
    const ls = layers(chart.spec);
    expect(ls.map(markOf)).toEqual(['rule', 'point', 'line', 'point', 'text']);
    expect(ls[1].data.values.length).toBe(2);
    expect((ls[1].encoding.y as { title?: string }).title).toBe('1/χ');
  });

  it('should give valid specs for empty, non-finite and single-point input', () => {
    for (const input of [
      { T: [], chi: [], yUnit: 'emu' },
      { T: [N, 1, 2], chi: [1, N, 0], sigma: [N, N, N], curve: { x: [N], y: [0] }, theta: N, yUnit: 'emu' },
      { T: [300], chi: [0.01], sigma: [0.001], curve: { x: [300], y: [0.01] }, theta: -10, yUnit: 'emu' }
    ]) {
      checkChart(buildInverseChiSpec(input, distinctTheme, { showTitle: true }));
    }
  });
});
