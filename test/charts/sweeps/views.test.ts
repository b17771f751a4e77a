/**
 * The builders of every view of the isotherm analysis, on real analyses of
 * Arrott–Noakes isotherms (3D Heisenberg exponents β = 0.3689, γ = 1.396,
 * Campostrini et al., Phys. Rev. B 65, 144520 (2002); Tc = 300 K, T1 = 5 K,
 * M1 = 1e5 A/m arbitrary; 0.1 % seeded noise) and Bean–Rodbell isotherms
 * (η = 2, first order), and on degenerate inputs (NaN values, NaN Tc, empty
 * lists). Each chart must compile without a Vega-Lite warning, hold only
 * finite numbers, never say "NaN", and draw with the theme's colours only.
 */
import { describe, expect, it } from 'vitest';
import {
  BANERJEE_NEGATIVE,
  buildArrottSpec,
  buildBanerjeeSpec,
  buildCollapseSpec,
  buildCriticalIsothermSpec,
  buildEntropyMapSpec,
  buildEntropySpec,
  buildExponentWindowSpec,
  buildKouvelFisherSpec,
  buildModifiedArrottSpec
} from '../../../src/charts/sweeps/index';
import { DEFAULT_CATEGORICAL, DEFAULT_SEQUENTIAL } from '../../../src/charts/theme';
import type { IChartTheme } from '../../../src/charts/theme';
import {
  arrottAnalysis,
  banerjeeEvidence,
  criticalIsotherm,
  exponentWindowScan,
  isothermSetFromArrays,
  kouvelFisher,
  magneticEntropyChange,
  modifiedArrottIteration,
  scalingCollapse
} from '../../../src/core/sweeps/index';
import type { IBanerjeeEvidence, ICollapseResult, ICriticalIsothermResult, IEntropyResult, IExponentWindowCell, IIsotherm, IModifiedArrottResult } from '../../../src/core/sweeps/index';
import { anSet, beanRodbellSet, linspace } from '../../core/sweeps/generators';
import { checkChart, compilesCleanly, distinctTheme as theme, layers, markOf } from './helpers';

const P = { Tc: 300, beta: 0.3689, gamma: 1.396, T1: 5, M1: 1e5 };
const set = anSet(P, linspace(285, 315, 13), linspace(1e3, 1e5, 60), 1e-3, 7);
const mapResult = modifiedArrottIteration(set, { start: { beta: 0.5, gamma: 1 } });
const nan = { value: NaN, sigma: NaN };

/** Isotherms with NaN and infinite entries, a NaN temperature and an empty one. */
function brokenIsotherms(): IIsotherm[] {
  const good = set.isotherms[6];
  const H = Float64Array.from(good.H);
  const M = Float64Array.from(good.M);
  H[3] = NaN;
  M[5] = NaN;
  M[7] = Infinity;
  H[9] = -Infinity;
  const iso = (T: number, h: Float64Array, m: Float64Array): IIsotherm => ({ T, TSpread: 0, branch: 'unspecified', H: h, M: m, rows: [] });
  return [iso(good.T, H, M), iso(NaN, Float64Array.from(good.H), Float64Array.from(good.M)), iso(310, new Float64Array(0), new Float64Array(0))];
}

describe('Arrott and modified Arrott views', () => {
  it('Arrott: points and mean-field lines, Tc caption, internal/applied field named, colours from the theme', () => {
    const a = arrottAnalysis(set);
    const chart = buildArrottSpec({ isotherms: set.isotherms, lines: a.lines, Tc: a.Tc }, theme, { fieldKind: 'applied' });
    checkChart(chart);
    const [pts, fit] = layers(chart.spec);
    expect(layers(chart.spec).map(markOf)).toEqual(['point', 'line']);
    expect(pts.encoding.color.scale?.range).toEqual([theme.accent, theme.accent2]);
    expect(JSON.stringify(chart.spec)).toContain('applied field');
    expect(chart.caption).toMatch(/^Tc = 3\d\d/);
    expect(fit.data.values.filter(v => v.x === 0).length).toBe(a.lines.filter(l => Number.isFinite(l.intercept.value)).length);
    const internal = buildArrottSpec({ isotherms: set.isotherms }, theme);
    expect(JSON.stringify(internal.spec)).toContain('internal field');
    expect(layers(internal.spec).length).toBe(1);
  });

  it('Arrott with NaN values, a NaN temperature, an empty isotherm and a NaN Tc: finite rows only, "Tc unknown"', () => {
    const isotherms = brokenIsotherms();
    const chart = buildArrottSpec({ isotherms, lines: [], Tc: nan }, theme);
    checkChart(chart);
    expect(chart.caption).toContain('Tc unknown');
    expect(layers(chart.spec)[0].data.values.length).toBe(isotherms[0].H.length - 4);
    checkChart(buildArrottSpec({ isotherms: [] }, theme));
  });

  it('modified Arrott from the iteration: drawn at the exponents its lines were fitted at, lines from x = 0', () => {
    const chart = buildModifiedArrottSpec({ isotherms: set.isotherms, result: mapResult }, theme);
    checkChart(chart);
    const last = mapResult.history[mapResult.history.length - 1];
    const [pts, fit] = layers(chart.spec);
    const iso = set.isotherms[0];
    const p = pts.data.values.find(v => v.T === iso.T) as { x: number; y: number };
    expect(p.x).toBeCloseTo((iso.H[0] / iso.M[0]) ** (1 / last.gamma), 9);
    expect(p.y).toBeCloseTo(iso.M[0] ** (1 / last.beta), 6);
    // Each line starts at its intercept on the y axis.
    for (const l of mapResult.lines.filter(l => Number.isFinite(l.intercept.value))) {
      const start = fit.data.values.find(v => v.T === l.T && v.x === 0) as { y: number };
      expect(start.y).toBeCloseTo(l.intercept.value, 6);
    }
    // Below Tc the high-field line passes close to the isotherm's own high-field points.
    const below = mapResult.lines.find(l => l.T < 295)!;
    const own = pts.data.values.filter(v => v.T === below.T) as { x: number; y: number }[];
    const top = own[own.length - 1];
    expect(Math.abs(below.intercept.value + below.slope.value * top.x - top.y) / top.y).toBeLessThan(0.02);
    expect(chart.caption).toMatch(/β = 0\.3\d+ ± /);
    // Explicit exponents without lines do not take the result's lines to other exponents.
    const other = buildModifiedArrottSpec({ isotherms: set.isotherms, result: null, beta: 0.4, gamma: 1.2 }, theme);
    checkChart(other);
    expect(layers(other.spec).length).toBe(1);
  });

  it('modified Arrott without usable exponents: empty, compiles, says so; display units convert values and lines alike', () => {
    const failed: IModifiedArrottResult = { ...mapResult, beta: nan, gamma: nan, Tc: nan, history: [], lines: [] };
    const chart = buildModifiedArrottSpec({ isotherms: brokenIsotherms(), result: failed }, theme);
    checkChart(chart);
    expect(chart.caption).toContain('unknown');
    expect(chart.rows).toBe(0);
    // Field in kA/m, magnetisation in kA/m: the line still ends on the same (scaled) geometry.
    const si = buildModifiedArrottSpec({ isotherms: set.isotherms, result: mapResult }, theme);
    const k = buildModifiedArrottSpec({ isotherms: set.isotherms, result: mapResult }, theme, { fieldUnit: { unit: 'kA/m', perSI: 1e-3 }, magnetisationUnit: { unit: 'kA/m', perSI: 1e-3 } });
    checkChart(k);
    const last = mapResult.history[mapResult.history.length - 1];
    const [ptsSI, fitSI] = layers(si.spec);
    const [ptsK, fitK] = layers(k.spec);
    expect(ptsK.data.values[0].y as number).toBeCloseTo((ptsSI.data.values[0].y as number) * 1e-3 ** (1 / last.beta), 6);
    expect(fitK.data.values[1].y as number).toBeCloseTo((fitSI.data.values[1].y as number) * 1e-3 ** (1 / last.beta), 6);
    expect(JSON.stringify(k.spec)).toContain('kA/m');
  });
});

describe('Kouvel–Fisher view', () => {
  it('points of X and Y, two fitted lines with slopes 1/β and 1/γ, shapes and accents from the theme', () => {
    const kf = kouvelFisher(mapResult.spontaneous, mapResult.inverseChi, 5);
    const chart = buildKouvelFisherSpec(kf, theme);
    checkChart(chart);
    expect(layers(chart.spec).map(markOf)).toEqual(['point', 'line']);
    const [pts, lines] = layers(chart.spec);
    expect(pts.encoding.color.scale?.range).toEqual([theme.accent, theme.accent2]);
    expect(pts.encoding.shape.scale?.range).toEqual(['circle', 'square']);
    const x = lines.data.values.filter(v => String(v.quantity).startsWith('X')) as { T: number; value: number }[];
    expect(x.length).toBe(2);
    expect((x[1].value - x[0].value) / (x[1].T - x[0].T)).toBeCloseTo(1 / kf.below.exponent.value, 9);
    expect(chart.caption).toContain('β = ');
  });

  it('no result, empty sides and NaN points: finite rows only, exponents "unknown"', () => {
    checkChart(buildKouvelFisherSpec(null, theme));
    const empty = kouvelFisher([], []);
    const chart = buildKouvelFisherSpec(empty, theme);
    checkChart(chart);
    expect(chart.caption).toContain('β unknown');
    const withNaN = kouvelFisher(mapResult.spontaneous, mapResult.inverseChi, 5);
    withNaN.below.points.push({ T: NaN, value: 1 }, { T: 290, value: Infinity });
    withNaN.above.Tc = nan;
    const c2 = buildKouvelFisherSpec(withNaN, theme);
    checkChart(c2);
    expect(layers(c2.spec)[1].data.values.length).toBe(2);
  });
});

describe('critical isotherm view', () => {
  it('log–log M against H of the isotherms used, with the line M = D H^(1/δ)', () => {
    const r = criticalIsotherm(set.isotherms, mapResult.Tc.value);
    const chart = buildCriticalIsothermSpec({ isotherms: set.isotherms, result: r }, theme);
    checkChart(chart);
    expect(layers(chart.spec).map(markOf)).toEqual(['point', 'line']);
    const [pts, line] = layers(chart.spec);
    expect(pts.encoding.x.scale?.type).toBe('log');
    expect(pts.encoding.y.scale?.type).toBe('log');
    expect(pts.encoding.color.scale?.range).toEqual(theme.categorical);
    expect(new Set(pts.data.values.map(v => v.T))).toEqual(new Set(r.temperatures));
    const [a, b] = line.data.values as { H: number; M: number }[];
    expect(Math.log(b.M / a.M) / Math.log(b.H / a.H)).toBeCloseTo(1 / r.delta.value, 9);
    expect(a.M).toBeCloseTo(r.D.value * a.H ** (1 / r.delta.value), 6);
    expect(chart.caption).toMatch(/δ = \d\.\d+ ± /);
    expect(chart.caption).toContain(r.source === 'interpolated' ? 'interpolated to Tc = ' : 'isotherm at Tc = ');
    expect(JSON.stringify(chart.spec)).toContain('internal field');
  });

  it('without a fit: the isotherms nearest Tc, no line; NaN Tc reads "Tc unknown"', () => {
    const noFit = criticalIsotherm(set.isotherms, NaN);
    const chart = buildCriticalIsothermSpec({ isotherms: set.isotherms, result: noFit }, theme);
    checkChart(chart);
    expect(chart.caption).toContain('Tc unknown');
    expect(chart.rows).toBe(0);
    const nearest = buildCriticalIsothermSpec({ isotherms: set.isotherms, result: null, Tc: 301 }, theme);
    checkChart(nearest);
    expect(layers(nearest.spec).length).toBe(1);
    expect(new Set(layers(nearest.spec)[0].data.values.map(v => v.T))).toEqual(new Set([300, 302.5]));
    const broken: ICriticalIsothermResult = { delta: { value: 4.8, sigma: NaN }, D: nan, source: 'isotherm', temperatures: [NaN], Tc: NaN, n: 0, warnings: [] };
    checkChart(buildCriticalIsothermSpec({ isotherms: brokenIsotherms(), result: broken }, theme));
    checkChart(buildCriticalIsothermSpec({ isotherms: [], result: null }, theme));
  });

  it('a large isotherm is reduced for display, every drawn point one of its own', () => {
    const H = linspace(10, 1e5, 20000);
    const big = isothermSetFromArrays([{ T: 300, H, M: H.map(h => 50 * h ** (1 / 4.8)) }]);
    const r = criticalIsotherm(big.isotherms, 300);
    const chart = buildCriticalIsothermSpec({ isotherms: big.isotherms, result: r }, theme);
    checkChart(chart);
    expect(chart.reduced?.total).toBe(20000);
    expect(layers(chart.spec)[0].data.values.length).toBeLessThanOrEqual(4000);
  });
});

describe('scaling collapse view', () => {
  it('two branches on log axes at the minimised (Tc, β, γ), cost in the caption', () => {
    const start = { Tc: mapResult.Tc.value, beta: mapResult.beta.value, gamma: mapResult.gamma.value };
    const c = scalingCollapse(set.isotherms, start);
    const chart = buildCollapseSpec({ isotherms: set.isotherms, result: c }, theme);
    checkChart(chart);
    const [pts] = layers(chart.spec);
    expect(layers(chart.spec).length).toBe(1);
    expect(pts.encoding.x.scale?.type).toBe('log');
    expect(new Set(pts.data.values.map(v => v.branch))).toEqual(new Set(['T < Tc', 'T > Tc']));
    expect(pts.encoding.color.scale?.range).toEqual([theme.accent, theme.accent2]);
    expect(pts.encoding.shape.scale?.range).toEqual(['circle', 'square']);
    expect(chart.caption).toContain('collapse cost');
    expect(chart.caption).toMatch(/cost \d/);
    const iso = set.isotherms[0];
    const t = Math.abs((iso.T - c.Tc.value) / c.Tc.value);
    const p = pts.data.values.find(v => v.T === iso.T) as { h: number; m: number };
    expect(p.m).toBeCloseTo(iso.M[0] * t ** -c.beta.value, 6);
    // The title and caption go into the spec only when asked.
    expect((chart.spec as { title?: unknown }).title).toBeUndefined();
    const titled = buildCollapseSpec({ isotherms: set.isotherms, result: c }, theme, { showTitle: true });
    checkChart(titled);
    expect((titled.spec as { title?: { subtitle?: string } }).title?.subtitle).toBe(chart.caption);
  });

  it('NaN collapse falls back to the given exponents; nothing usable gives an empty chart saying so', () => {
    const bad: ICollapseResult = { Tc: nan, beta: nan, gamma: nan, cost: NaN, startCost: NaN, count: 0, evaluations: 0, converged: false, reason: { code: 'x', text: 'x', args: [] }, warnings: [] };
    const fallback = buildCollapseSpec({ isotherms: set.isotherms, result: bad, Tc: 300, beta: 0.37, gamma: 1.4 }, theme);
    checkChart(fallback);
    expect(fallback.rows).toBeGreaterThan(0);
    expect(fallback.caption).toContain('cost unknown');
    const none = buildCollapseSpec({ isotherms: brokenIsotherms(), result: bad, Tc: NaN }, theme);
    checkChart(none);
    expect(none.rows).toBe(0);
    expect(none.caption).toContain('unknown');
    checkChart(buildCollapseSpec({ isotherms: [], result: null }, theme));
  });
});

describe('Banerjee view', () => {
  it('first-order isotherms: negative slopes marked by colour and shape, ±σ bars, a zero rule', () => {
    const br = beanRodbellSet(2, linspace(1.0057, 1.1057, 11), linspace(0.002, 0.1, 50));
    const ev = banerjeeEvidence(br.isotherms);
    expect(ev.negativeCount).toBeGreaterThan(0);
    const chart = buildBanerjeeSpec(ev, theme);
    checkChart(chart);
    expect(layers(chart.spec).map(markOf)).toEqual(['rule', 'rule', 'point']);
    const [zero, bars, pts] = layers(chart.spec);
    expect(zero.data.values).toEqual([{ zero: 0 }]);
    expect(bars.encoding.y2.field).toBe('hi');
    expect(pts.encoding.color.field).toBe('kind');
    expect(pts.encoding.shape.field).toBe('kind');
    expect(pts.encoding.color.scale?.range).toEqual([theme.accent2, theme.accent]);
    expect(pts.encoding.shape.scale?.range).toEqual(['triangle-down', 'circle']);
    expect(pts.data.values.filter(v => v.kind === BANERJEE_NEGATIVE).length).toBe(ev.negativeCount);
    expect(chart.caption).toContain(`${ev.negativeCount} of 11`);
  });

  it('second-order isotherms, NaN slopes and no evidence: finite rows, plain captions', () => {
    const ev = banerjeeEvidence(set.isotherms);
    const chart = buildBanerjeeSpec(ev, theme);
    checkChart(chart);
    const withNaN: IBanerjeeEvidence = { ...ev, isotherms: [...ev.isotherms, { T: 301, minLocalSlope: nan, atMSquared: NaN, negative: false }, { T: NaN, minLocalSlope: { value: -1, sigma: 0.1 }, atMSquared: 1, negative: true }] };
    const c2 = buildBanerjeeSpec(withNaN, theme);
    checkChart(c2);
    expect(layers(c2.spec)[2].data.values.length).toBe(ev.isotherms.filter(i => Number.isFinite(i.minLocalSlope.value)).length);
    checkChart(buildBanerjeeSpec(null, theme));
    checkChart(buildBanerjeeSpec({ ...ev, isotherms: [], negativeCount: 0 }, theme));
  });
});

describe('exponent against window view', () => {
  const scan = exponentWindowScan(set, { tMaxs: [0.03, 0.05], hMins: [0, 2e4] });

  it('β per H_min with ±σ against t_max, universality classes as labelled rules', () => {
    const chart = buildExponentWindowSpec(scan, theme, { exponent: 'beta' });
    checkChart(chart);
    expect(layers(chart.spec).map(markOf)).toEqual(['rule', 'text', 'rule', 'line']);
    const [rules, labels, bars, line] = layers(chart.spec);
    expect(rules.data.values.map(v => v.value)).toContain(0.3689);
    expect(labels.data.values.some(v => String(v.label).includes('3D Heisenberg'))).toBe(true);
    expect(bars.encoding.y2.field).toBe('hi');
    expect(line.encoding.x.field).toBe('tMax');
    expect(line.encoding.color.scale?.range).toEqual(theme.categorical);
    expect(line.encoding.color.scale?.domain).toEqual(['H_min = 0 A/m', 'H_min = 20000 A/m']);
  });

  it('δ: classes within 1 % share one label; Tc has no rules; NaN cells and NaN H_min left out or labelled plainly', () => {
    const delta = buildExponentWindowSpec(scan.cells, 'delta', theme, { fieldUnit: { unit: 'kA/m', perSI: 1e-3 } });
    checkChart(delta);
    const [, labels, , line] = layers(delta.spec);
    const shared = labels.data.values.map(v => String(v.label)).filter(l => l.includes('δ ≈'));
    expect(shared.length).toBe(1);
    for (const name of ['3D Ising', '3D XY', '3D Heisenberg']) {
      expect(shared[0]).toContain(name);
    }
    expect(line.encoding.color.scale?.domain).toEqual(['H_min = 0 kA/m', 'H_min = 20 kA/m']);
    const tc = buildExponentWindowSpec(scan, theme, { exponent: 'Tc' });
    checkChart(tc);
    expect(layers(tc.spec).length).toBe(2);
    const cell = scan.cells.find(c => Number.isFinite(c.beta.value))!;
    const broken: IExponentWindowCell[] = [
      { ...cell, hMin: NaN },
      { ...cell, tMax: NaN },
      { ...cell, beta: nan },
      { ...cell, tMax: 0 }
    ];
    const c = buildExponentWindowSpec(broken, theme);
    checkChart(c);
    expect(layers(c.spec)[3].data.values.map(v => v.hMin)).toEqual(['H_min open']);
    checkChart(buildExponentWindowSpec(null, theme));
    checkChart(buildExponentWindowSpec([], 'gamma', theme, 'A/m'));
  });
});

describe('magnetic entropy views', () => {
  const entropy = magneticEntropyChange(set, [2e4, 5e4, 1e5]);

  it('curves: one colour per field change from the theme, in field order, ±σ bars; peak in the caption', () => {
    const chart = buildEntropySpec(entropy, theme);
    checkChart(chart);
    expect(layers(chart.spec).map(markOf)).toEqual(['rule', 'line']);
    const [, line] = layers(chart.spec);
    expect(line.encoding.color.scale?.range).toEqual(theme.categorical);
    expect((line.encoding.color.scale?.domain as string[]).length).toBe(3);
    expect(line.data.values.length).toBe(entropy.curves.reduce((n, c) => n + c.points.length, 0));
    expect(chart.caption).toMatch(/^peak −ΔS_M = /);
  });

  it('map: one rect per point, edges halfway between neighbours, our own sequential ramp', () => {
    const chart = buildEntropyMapSpec(entropy, theme);
    checkChart(chart);
    expect(layers(chart.spec).map(markOf)).toEqual(['rect']);
    const [cells] = layers(chart.spec);
    expect(cells.encoding.color.scale?.range).toEqual(theme.sequential);
    expect(cells.encoding.color.field).toBe('minusDS');
    expect(cells.data.values.length).toBe(entropy.curves.reduce((n, c) => n + c.points.length, 0));
    // Cells of one field change tile T without gaps; field bands tile μ0ΔH.
    const first = cells.data.values.filter(v => v.field === entropy.curves[0].mu0DeltaH).sort((a, b) => (a.T as number) - (b.T as number));
    for (let i = 0; i + 1 < first.length; i++) {
      expect(first[i].T1).toBeCloseTo(first[i + 1].T0 as number, 12);
    }
    const bands = [...new Map(cells.data.values.map(v => [v.field, [v.f0, v.f1]])).values()] as number[][];
    bands.sort((a, b) => a[0] - b[0]);
    for (let i = 0; i + 1 < bands.length; i++) {
      expect(bands[i][1]).toBeCloseTo(bands[i + 1][0], 12);
    }
    expect(bands[0][0]).toBeGreaterThanOrEqual(0);
    expect(JSON.stringify(chart.spec)).toContain('μ0ΔH (T)');
  });

  it('NaN points, NaN fields, a single field change, and no result', () => {
    const broken: IEntropyResult = {
      ...entropy,
      curves: [
        { ...entropy.curves[0], points: [...entropy.curves[0].points, { T: NaN, dS: 1, sigma: 0 }, { T: 300, dS: NaN, sigma: 0 }, { T: 301, dS: -1, sigma: NaN }], peak: { T: NaN, dS: NaN, sigma: NaN } },
        { ...entropy.curves[1], mu0DeltaH: NaN }
      ]
    };
    for (const build of [buildEntropySpec, buildEntropyMapSpec]) {
      checkChart(build(broken, theme));
      checkChart(build(null, theme));
      checkChart(build({ ...entropy, curves: [] }, theme));
      checkChart(build({ ...entropy, curves: [entropy.curves[2]] }, theme));
    }
    const single = buildEntropyMapSpec({ ...entropy, curves: [{ ...entropy.curves[0], points: entropy.curves[0].points.slice(0, 1) }] }, theme);
    checkChart(single);
    expect(layers(single.spec)[0].data.values.length).toBe(1);
    expect(buildEntropyMapSpec(null, theme).caption).toBe('No magnetic entropy change');
  });
});

describe('theme colours', () => {
  it('without categorical or sequential colours the defaults of theme.ts apply, still no library scheme', () => {
    const plain: IChartTheme = { background: '#ffffff', text: '#111111', grid: '#dddddd', accent: '#2050b0', accent2: '#c05020', font: 'sans-serif' };
    const entropy = magneticEntropyChange(set, [5e4]);
    const curves = buildEntropySpec(entropy, plain);
    const map = buildEntropyMapSpec(entropy, plain);
    const withDefaults = { ...plain, categorical: DEFAULT_CATEGORICAL, sequential: DEFAULT_SEQUENTIAL };
    checkChart(curves, withDefaults);
    checkChart(map, withDefaults);
    expect(layers(curves.spec)[1].encoding.color.scale?.range).toEqual([...DEFAULT_CATEGORICAL]);
    expect(layers(map.spec)[0].encoding.color.scale?.range).toEqual([...DEFAULT_SEQUENTIAL]);
  });
});

describe('the checks themselves', () => {
  it('a spec Vega-Lite warns about fails the compile check', () => {
    const warned = {
      $schema: 'https://vega.github.io/schema/vega-lite/v6.json',
      data: { values: [{ a: 'x', b: 1 }] },
      mark: 'point',
      encoding: { x: { field: 'a', type: 'nominal', scale: { type: 'log' } }, y: { field: 'b', type: 'quantitative' } }
    };
    expect(() => compilesCleanly(warned as never)).toThrow();
  });
});
