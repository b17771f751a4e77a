import { describe, expect, it } from 'vitest';
import { compile } from 'vega-lite';
import type { TopLevelSpec } from 'vega-lite';
import { buildArrottSpec, buildCollapseSpec, buildEntropySpec, buildExponentWindowSpec, buildKouvelFisherSpec, buildModifiedArrottSpec } from '../../../src/charts/sweeps/index';
import type { IChartTheme } from '../../../src/charts/theme';
import { arrottAnalysis, isothermLines, isothermSetFromArrays, kouvelFisher, magneticEntropyChange, modifiedArrottIteration } from '../../../src/core/sweeps/index';
import type { IEntropyResult, IExponentWindowCell, IIsothermSet } from '../../../src/core/sweeps/index';

const theme: IChartTheme = { background: '#ffffff', text: '#111111', grid: '#dddddd', accent: '#1f77b4', accent2: '#d62728', font: 'sans-serif' };

/** Small mean-field family: h/m = (T − 10) + m² (Landau with b = 1, common practice, no source). */
function family(): IIsothermSet {
  const list = [];
  for (let T = 8; T <= 12; T += 0.5) {
    const H: number[] = [];
    const M: number[] = [];
    for (let m = 0.05; m <= 2.5; m += 0.05) {
      const h = m * (T - 10 + m * m);
      if (h > 0) {
        H.push(h);
        M.push(m);
      }
    }
    list.push({ T, H, M });
  }
  return isothermSetFromArrays(list);
}

interface ILayer {
  data: { values: Record<string, unknown>[] };
  encoding: Record<string, { field?: string }>;
}

function layers(spec: TopLevelSpec): ILayer[] {
  return (spec as unknown as { layer: ILayer[] }).layer;
}

function compiles(spec: TopLevelSpec): void {
  const out = compile(spec);
  expect(out.spec).toBeTruthy();
  expect(Array.isArray((out.spec as { data?: unknown[] }).data)).toBe(true);
}

describe('sweep chart builders', () => {
  it('Arrott plot: valid Vega-Lite, x = H/M and y = M² of every point, lines from x = 0', () => {
    const set = family();
    const a = arrottAnalysis(set, { region: { topFraction: 1 } });
    const before = JSON.stringify(set.isotherms.map(i => [Array.from(i.H), Array.from(i.M)]));
    const { spec, rows } = buildArrottSpec({ isotherms: set.isotherms, lines: a.lines, theme });
    compiles(spec);
    const [pts, fit] = layers(spec);
    expect(pts.encoding.x.field).toBe('x');
    expect(pts.encoding.y.field).toBe('y');
    expect(pts.encoding.color.field).toBe('T');
    // Our own ramp, between the theme's two accents (no chart-library scheme).
    expect((pts.encoding.color as { scale?: unknown }).scale).toEqual({ range: [theme.accent, theme.accent2] });
    const iso = set.isotherms[0];
    const first = pts.data.values.find(v => v.T === iso.T) as { x: number; y: number };
    expect(first.x).toBeCloseTo(iso.H[0] / iso.M[0], 12);
    expect(first.y).toBeCloseTo(iso.M[0] ** 2, 12);
    const starts = fit.data.values.filter(v => v.x === 0);
    expect(starts.length).toBe(set.isotherms.length);
    // for this family M² = (10 − T) + H/M exactly, so each line starts at y = 10 − T
    for (const s of starts) {
      expect(s.y as number).toBeCloseTo(10 - (s.T as number), 6);
    }
    expect(rows).toBe(pts.data.values.length + fit.data.values.length);
    expect(JSON.stringify(set.isotherms.map(i => [Array.from(i.H), Array.from(i.M)]))).toBe(before);
  });

  it('modified Arrott plot uses the given exponents; bad exponents throw', () => {
    const set = family();
    const lines = isothermLines(set.isotherms, 0.4, 1.3, {});
    const { spec } = buildModifiedArrottSpec({ isotherms: set.isotherms, lines, beta: 0.4, gamma: 1.3, theme, fieldKind: 'applied' });
    compiles(spec);
    const [pts] = layers(spec);
    const iso = set.isotherms[3];
    const p = pts.data.values.find(v => v.T === iso.T) as { x: number; y: number };
    expect(p.x).toBeCloseTo((iso.H[0] / iso.M[0]) ** (1 / 1.3), 12);
    expect(p.y).toBeCloseTo(iso.M[0] ** (1 / 0.4), 12);
    expect(JSON.stringify(spec)).toContain('applied field');
    expect(() => buildModifiedArrottSpec({ isotherms: set.isotherms, beta: 0, gamma: 1, theme })).toThrow(RangeError);
  });

  it('Kouvel–Fisher chart plots X and Y against T with both fitted lines', () => {
    const set = family();
    const r = modifiedArrottIteration(set, { start: { beta: 0.5, gamma: 1 }, region: { topFraction: 1 }, tMax: 0.25 });
    const kf = kouvelFisher(r.spontaneous, r.inverseChi, 3);
    const { spec } = buildKouvelFisherSpec(kf, theme);
    compiles(spec);
    const [pts, lines] = layers(spec);
    expect(pts.encoding.x.field).toBe('T');
    expect(pts.encoding.y.field).toBe('value');
    expect(new Set(pts.data.values.map(v => v.quantity)).size).toBe(2);
    expect(lines.data.values.length).toBe(4);
    expect(pts.data.values.length).toBe(kf.below.points.length + kf.above.points.length);
  });

  it('exponent against window: one row per finite cell, error bars from sigma, NaN cells left out', () => {
    const cells: IExponentWindowCell[] = [
      { tMax: 0.01, hMin: 0, method: 'iteration', beta: { value: 0.36, sigma: 0.01 }, gamma: { value: 1.3, sigma: 0.02 }, Tc: { value: 300, sigma: 0.1 }, delta: { value: 4.6, sigma: 0.1 }, deltaCriticalIsotherm: { value: 4.7, sigma: 0.1 }, kouvelFisherBeta: { value: 0.37, sigma: 0.01 }, kouvelFisherGamma: { value: 1.3, sigma: 0.1 }, n: 10, converged: true, reason: { code: 'test.none', text: '', args: [] } },
      { tMax: 0.05, hMin: 0, method: 'iteration', beta: { value: 0.38, sigma: 0.005 }, gamma: { value: 1.35, sigma: 0.02 }, Tc: { value: 300.1, sigma: 0.1 }, delta: { value: 4.5, sigma: 0.1 }, deltaCriticalIsotherm: { value: 4.7, sigma: 0.1 }, kouvelFisherBeta: { value: 0.37, sigma: 0.01 }, kouvelFisherGamma: { value: 1.3, sigma: 0.1 }, n: 20, converged: true, reason: { code: 'test.none', text: '', args: [] } },
      { tMax: 0.1, hMin: 1e4, method: 'global', beta: { value: NaN, sigma: NaN }, gamma: { value: NaN, sigma: NaN }, Tc: { value: NaN, sigma: NaN }, delta: { value: NaN, sigma: NaN }, deltaCriticalIsotherm: { value: NaN, sigma: NaN }, kouvelFisherBeta: { value: NaN, sigma: NaN }, kouvelFisherGamma: { value: NaN, sigma: NaN }, n: 0, converged: false, reason: { code: 'test.x', text: 'x', args: [] } }
    ];
    const copy = JSON.stringify(cells);
    const { spec } = buildExponentWindowSpec(cells, 'beta', theme);
    compiles(spec);
    // After the universality classes' rules and labels: the error bars, then the line.
    const [, , bars, line] = layers(spec);
    expect(line.encoding.x.field).toBe('tMax');
    expect(line.encoding.y.field).toBe('value');
    expect(bars.encoding.y.field).toBe('lo');
    expect(bars.encoding.y2.field).toBe('hi');
    expect(line.data.values.length).toBe(2);
    expect(line.data.values[0].lo).toBeCloseTo(0.35, 12);
    expect(JSON.stringify(cells)).toBe(copy);
  });

  it('entropy chart plots −ΔS_M against T per field change', () => {
    const set = family();
    const r: IEntropyResult = magneticEntropyChange(set, [0.5, 1]);
    const copy = JSON.stringify(r);
    const { spec } = buildEntropySpec(r, theme);
    compiles(spec);
    const [, line] = layers(spec);
    expect(line.encoding.x.field).toBe('T');
    expect(line.encoding.y.field).toBe('minusDS');
    expect(line.data.values.length).toBe(r.curves.reduce((s, c) => s + c.points.length, 0));
    expect(line.data.values[0].minusDS).toBeCloseTo(-r.curves[0].points[0].dS, 12);
    expect(JSON.stringify(r)).toBe(copy);
  });

  it('scaling plot: m = M|t|^-beta against h = H|t|^-(beta+gamma), two branches, isotherm at Tc left out', () => {
    const set = family();
    const copy = JSON.stringify(set.isotherms.map(i => Array.from(i.M)));
    const { spec, rows } = buildCollapseSpec(set.isotherms, { Tc: 10, beta: 0.5, gamma: 1 }, theme);
    compiles(spec);
    const [pts] = layers(spec);
    expect(pts.encoding.x.field).toBe('h');
    expect(pts.encoding.y.field).toBe('m');
    expect(new Set(pts.data.values.map(v => v.branch))).toEqual(new Set(['T < Tc', 'T > Tc']));
    expect(pts.data.values.some(v => v.T === 10)).toBe(false);
    const iso = set.isotherms[set.isotherms.length - 1];
    const t = (iso.T - 10) / 10;
    const p = pts.data.values.find(v => v.T === iso.T) as { h: number; m: number };
    expect(p.h).toBeCloseTo(iso.H[0] * Math.pow(t, -1.5), 10);
    expect(p.m).toBeCloseTo(iso.M[0] * Math.pow(t, -0.5), 10);
    expect(rows).toBe(pts.data.values.length);
    expect(JSON.stringify(set.isotherms.map(i => Array.from(i.M)))).toBe(copy);
    expect(() => buildCollapseSpec(set.isotherms, { Tc: 10, beta: 0, gamma: 1 }, theme)).toThrow(RangeError);
  });

  it('Arrott plot of 200 000 points: reduced per isotherm, each keeping its ends, its lines to its last point', () => {
    // 40 isotherms × 5000 points of the same mean-field family, finely sampled.
    const list = [];
    for (let k = 0; k < 40; k++) {
      const T = 8 + 0.1 * k;
      const H: number[] = [];
      const M: number[] = [];
      for (let i = 1; i <= 5000; i++) {
        const m = 0.5 * i * 5e-4 * 5;
        H.push(m * (T - 10 + m * m) + 20);
        M.push(m);
      }
      list.push({ T, H, M });
    }
    const set = isothermSetFromArrays(list);
    const a = arrottAnalysis(set, { region: { topFraction: 0.5 } });
    const chart = buildArrottSpec({ isotherms: set.isotherms, lines: a.lines, theme });
    const [pts, fit] = layers(chart.spec);
    expect(pts.data.values.length).toBeLessThanOrEqual(4000);
    expect(chart.reduced).toEqual({ shown: pts.data.values.length, total: 200_000 });
    expect(chart.rows).toBe(pts.data.values.length + fit.data.values.length);
    for (const iso of set.isotherms) {
      const own = pts.data.values.filter(v => v.T === iso.T) as { x: number; y: number }[];
      expect(own.length).toBeGreaterThan(10);
      const last = iso.H.length - 1;
      // The first and last point of every isotherm are drawn (its smallest and largest M²).
      expect(own.some(p => p.y === iso.M[0] ** 2)).toBe(true);
      expect(own.some(p => p.y === iso.M[last] ** 2 && p.x === iso.H[last] / iso.M[last])).toBe(true);
    }
    // Lines still end at each isotherm's last point, drawn or not.
    const ends = fit.data.values.filter(v => v.x !== 0) as { T: number; x: number }[];
    expect(ends.length).toBe(40);
    for (const end of ends) {
      const iso = set.isotherms.find(i => i.T === end.T)!;
      expect(end.x).toBe(Math.max(...Array.from(iso.H, (h, i) => h / iso.M[i])));
    }
    compiles(chart.spec);
  });

  it('empty inputs still give valid specs', () => {
    const empty = isothermSetFromArrays([]);
    compiles(buildArrottSpec({ isotherms: empty.isotherms, theme }).spec);
    compiles(buildExponentWindowSpec([], 'gamma', theme).spec);
    compiles(buildKouvelFisherSpec(kouvelFisher([], []), theme).spec);
  });
});
