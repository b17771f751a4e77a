/**
 * Every chart builder draws with the theme's own colours only: each exported
 * builder is built with a theme of colours no library uses (plain, scaled up
 * for the presenter view, and dark), its Vega-Lite spec and the Vega spec it
 * compiles to are searched for colour schemes and for colours not from the
 * theme (defaults a compiler fills in included), and a builder exported later
 * without a case here fails the test.
 */
import { describe, expect, it } from 'vitest';
import { compile } from 'vega-lite';
import type { TopLevelSpec } from 'vega-lite';
import * as fitOverlay from '../../src/charts/fit-overlay';
import * as landau from '../../src/charts/landau/index';
import * as scatter from '../../src/charts/scatter';
import * as sweeps from '../../src/charts/sweeps/index';
import * as temperature from '../../src/charts/temperature/index';
import type { IChartTheme } from '../../src/charts/theme';
import { landauBranches, landauF, landauStationary, landauThermalHysteresis, linspace } from '../../src/core/physics/landau/index';
import {
  arrottAnalysis,
  banerjeeEvidence,
  criticalIsotherm,
  exponentWindowScan,
  kouvelFisher,
  magneticEntropyChange,
  modifiedArrottIteration,
  scalingCollapse
} from '../../src/core/sweeps/index';
import { anSet, beanRodbellSet, linspace as span } from '../core/sweeps/generators';
import { coloursIn, distinctTheme, strings, themeColours } from './sweeps/helpers';

const darkTheme: IChartTheme = {
  background: '#0e0f10',
  text: '#f1f2f3',
  grid: '#3a3b3c',
  accent: '#5fa0e0',
  accent2: '#e0a05f',
  font: 'sans-serif',
  categorical: ['#e1a1a1', '#a2e2a2', '#a3a3e3', '#e4e4a4', '#a5e5e5'],
  sequential: ['#201030', '#8a4070', '#f0d0a0'],
  diverging: ['#a0c0f0', '#5070b0', '#202224', '#b07050', '#f0c0a0']
};

const THEMES: [string, IChartTheme][] = [
  ['plain', distinctTheme],
  ['presenter', { ...distinctTheme, scale: 1.6 }],
  ['dark presenter', { ...darkTheme, scale: 2 }]
];

/** Keys of Vega and Vega-Lite whose string value is a colour. */
const COLOUR_KEY = /^(fill|stroke|color|background)$|Color$/;

/** Every colour named by a colour-valued property of `node` (plain strings and `{ value }` objects, conditions included). */
function colourValues(node: unknown, out: string[] = []): string[] {
  if (Array.isArray(node)) {
    node.forEach(n => colourValues(n, out));
  } else if (node !== null && typeof node === 'object') {
    for (const [k, v] of Object.entries(node)) {
      if (COLOUR_KEY.test(k)) {
        const values = (Array.isArray(v) ? v : [v]).map(x => (x !== null && typeof x === 'object' ? (x as { value?: unknown }).value : x));
        for (const c of values) {
          if (typeof c === 'string') {
            out.push(c.toLowerCase());
          }
        }
      }
      colourValues(v, out);
    }
  }
  return out;
}

/** Fails when a spec or the Vega spec it compiles to holds a scheme or a colour not from the theme. */
function expectOwnColours(name: string, spec: TopLevelSpec, theme: IChartTheme): void {
  const allowed = themeColours(theme);
  const vega = compile(spec).spec;
  // Every colour scale of the Vega spec takes its range from the spec or from the theme's named ranges.
  const config = (vega as { config?: { range?: Record<string, unknown> } }).config;
  const scales: { name: string; range?: unknown }[] = [];
  const collect = (n: unknown): void => {
    if (n && typeof n === 'object') {
      const node = n as { scales?: typeof scales; marks?: unknown[] };
      scales.push(...(node.scales ?? []));
      (node.marks ?? []).forEach(collect);
    }
  };
  collect(vega);
  // A legend's fill or stroke may name the scale it shows.
  const scaleNames = new Set(scales.map(sc => sc.name.toLowerCase()));
  for (const [which, s] of [
    ['Vega-Lite', spec],
    ['Vega', vega]
  ] as const) {
    const json = JSON.stringify(s);
    expect(json, `${name}: ${which} spec names a colour scheme`).not.toMatch(/"scheme"/);
    for (const c of coloursIn(s as TopLevelSpec)) {
      expect(allowed.has(c), `${name}: ${which} colour ${c} is not the theme's`).toBe(true);
    }
    for (const c of colourValues(s)) {
      expect(allowed.has(c) || c === 'transparent' || c === 'none' || scaleNames.has(c), `${name}: ${which} colour "${c}" is not the theme's`).toBe(true);
    }
    for (const text of strings(s)) {
      expect(text, `${name}: ${which} rgb() colour`).not.toMatch(/^rgba?\(/);
    }
  }
  for (const s of scales) {
    if (typeof s.range === 'string' && !['width', 'height'].includes(s.range)) {
      expect(Array.isArray(config?.range?.[s.range]), `${name}: scale ${s.name} takes the named range "${s.range}", which the theme does not give`).toBe(true);
    }
  }
}

/** Isotherm analyses shared by the sweep builders (3D Heisenberg exponents, Tc = 300 K). */
const set = anSet({ Tc: 300, beta: 0.3689, gamma: 1.396, T1: 5, M1: 1e5 }, span(285, 315, 9), span(1e3, 1e5, 30), 1e-3, 7);
const mar = modifiedArrottIteration(set, { start: { beta: 0.5, gamma: 1 } });
const arrott = arrottAnalysis(set);
const entropy = magneticEntropyChange(set, [2e4, 5e4, 1e5]);
const K = { a: 0.5, b: -2, c: 4, T0: 100 };

/** One or more specs from each exported builder, by the builder's name. */
const CASES: Record<string, (theme: IChartTheme) => TopLevelSpec[]> = {
  buildScatterSpec: theme => [scatter.buildScatterSpec({ x: [1, 2, 3], y: [3, 1, 2], xTitle: 'T (K)', yTitle: 'M', pointSize: 30, theme }).spec],
  buildFitOverlaySpec: theme => [
    fitOverlay.buildFitOverlaySpec({ x: [1, 2, 3, 4, 5], y: [5, 4, 3, 2, 1], sigma: [0.1, 0.2, 0.1, 0.2, 0.1], xTitle: 'T (K)', yTitle: 'M', window: { min: 2, max: 4 }, curve: { x: [2, 4], y: [4, 2] }, curveLabel: 'fit', pointSize: 30, theme })
  ],
  buildFitOverlayChart: theme => [
    fitOverlay.buildFitOverlayChart({ x: [1, 2, 3, 4], y: [4, 3, 2, 1], xTitle: 'T', yTitle: 'M', window: { min: 1, max: 3 }, curve: null, curveLabel: 'fit', pointSize: 30, theme, brush: false }).spec
  ],
  buildLandscapeSpec: theme => {
    const r = landauStationary(K, 100.2, 0);
    const psi = linspace(-1.1, 1.1, 61);
    return [landau.buildLandscapeSpec({ psi, F: psi.map(p => landauF(K, 100.2, 0, p)), points: r.points, global: r.global, T: 100.2, h: 0, theme }).spec];
  },
  buildBranchesSpec: theme => {
    const T = linspace(99, 101.5, 41);
    const branches = landauBranches(K, T, T.map(() => 0));
    const hyst = landauThermalHysteresis(K, 99, 101.5, 41, 0);
    return [
      landau.buildBranchesSpec({ branches, heating: hyst.heating, cooling: hyst.cooling, markers: [{ T: 100, label: 'T0' }], current: { T: 100.2, label: 'T' }, h: 0, theme }).spec
    ];
  },
  buildLandscape2dSpec: theme => {
    const n = 9;
    const axis = linspace(-1, 1, n);
    const F = Array.from({ length: n * n }, (_, k) => axis[k % n] ** 2 + axis[Math.floor(k / n)] ** 2 - 0.5);
    return [landau.buildLandscape2dSpec({ n, psi: axis, phi: axis, F, minima: [{ psi: 0, phi: 0, F: -0.5, global: true }], theme }).spec];
  },
  buildLoopSpec: theme => {
    const h = [...linspace(-1, 1, 11), ...linspace(1, -1, 11)];
    return [landau.buildLoopSpec({ points: h.map((v, i) => ({ h: v, psi: Math.tanh(3 * v) + (i < 11 ? -0.2 : 0.2) })), turn: 11, theme }).spec];
  },
  buildPhaseDiagramSpec: theme => [
    landau.buildPhaseDiagramSpec({
      lines: [
        { kind: 'first-order', id: 'a', T: [90, 95, 100], h: [0, 0, 0] },
        { kind: 'second-order', id: 'b', T: [100, 105], h: [0, 0] },
        { kind: 'spinodal', id: 'c', T: [90, 100], h: [0.1, 0.2] }
      ],
      points: [{ kind: 'critical', T: 100, h: 0 }],
      current: { T: 97, h: 0.05 },
      theme
    }).spec
  ],
  buildArrottSpec: theme => [sweeps.buildArrottSpec({ isotherms: set.isotherms, lines: arrott.lines, Tc: arrott.Tc }, theme).spec],
  buildModifiedArrottSpec: theme => [sweeps.buildModifiedArrottSpec({ isotherms: set.isotherms, result: mar }, theme).spec],
  buildKouvelFisherSpec: theme => [sweeps.buildKouvelFisherSpec(kouvelFisher(mar.spontaneous, mar.inverseChi, 5), theme).spec],
  buildCriticalIsothermSpec: theme => [sweeps.buildCriticalIsothermSpec({ isotherms: set.isotherms, result: criticalIsotherm(set.isotherms, mar.Tc.value) }, theme).spec],
  buildCollapseSpec: theme => [
    sweeps.buildCollapseSpec({ isotherms: set.isotherms, result: scalingCollapse(set.isotherms, { Tc: mar.Tc.value, beta: mar.beta.value, gamma: mar.gamma.value }) }, theme).spec
  ],
  buildBanerjeeSpec: theme => [sweeps.buildBanerjeeSpec(banerjeeEvidence(beanRodbellSet(2, span(1.0057, 1.1057, 6), span(0.002, 0.1, 30)).isotherms), theme).spec],
  buildExponentWindowSpec: theme => [sweeps.buildExponentWindowSpec(exponentWindowScan(set, { tMaxs: [0.03, 0.05], hMins: [0, 2e4] }), theme, { exponent: 'beta' }).spec],
  buildEntropySpec: theme => [sweeps.buildEntropySpec(entropy, theme).spec],
  buildEntropyMapSpec: theme => [sweeps.buildEntropyMapSpec(entropy, theme).spec],
  buildResidualSpec: theme => [
    temperature.buildResidualSpec({ x: [1, 2, 3, 4], residuals: [0.2, -0.5, 1.5, -0.1], sigma: [0.1, 0.5, 0.5, 0.1], xTitle: 'T (K)' }, theme).spec,
    temperature.buildResidualSpec({ x: [1, 2, 3], residuals: [0.2, -0.5, 1.5], xTitle: 'T (K)' }, theme).spec
  ],
  buildCorrelationSpec: theme => [
    temperature.buildCorrelationSpec({ parameters: ['Tc', 'beta', 'M0'], correlation: [[1, -0.9, 0.2], [-0.9, 1, Number.NaN], [0.2, 0.01, 1]] }, theme).spec
  ],
  buildWindowScanSpec: theme => [
    temperature.buildWindowScanSpec(
      {
        cells: [
          { tMax: 0.02, beta: { value: 0.33, sigma: 0.02 }, verdict: 'fits' },
          { tMax: 0.1, beta: { value: 0.38, sigma: 0.01 }, verdict: 'does-not-describe' },
          { tMax: 0.2, beta: { value: 0.42, sigma: 0.03 }, verdict: 'not-converged' }
        ],
        classes: [{ id: '3d-ising', label: '3D Ising', beta: 0.3265 }],
        suggested: 0.05,
        exponentLabel: 'β_eff'
      },
      theme
    ).spec
  ],
  buildReducedSpec: theme => {
    const t = linspace(0, 1, 21);
    return [
      temperature.buildReducedSpec(
        {
          points: [{ x: 0.2, y: 0.98 }, { x: 0.5, y: 0.9 }],
          curves: [
            { id: 'mf', label: 'mean field', x: t, y: t.map(v => Math.sqrt(1 - v)) },
            { id: 'ising2d', label: '2D Ising', x: t, y: t.map(v => (1 - v) ** 0.125) }
          ],
          shown: ['mf', 'ising2d']
        },
        theme
      ).spec
    ];
  },
  buildInverseChiSpec: theme => {
    const T = linspace(60, 200, 15);
    return [temperature.buildInverseChiSpec({ T, chi: T.map(t => 2 / (t - 40)), curve: { x: T, y: T.map(t => 2 / (t - 40)) }, theta: 40, yUnit: 'emu' }, theme).spec];
  }
};

/** Names of the chart builders the chart modules export. */
function exportedBuilders(): string[] {
  const names = new Set<string>();
  for (const module of [fitOverlay, landau, scatter, sweeps, temperature]) {
    for (const [name, value] of Object.entries(module)) {
      if (typeof value === 'function' && /^build\w*(Spec|Chart)$/.test(name)) {
        names.add(name);
      }
    }
  }
  return [...names].sort();
}

describe("every chart builder draws with the theme's own colours", () => {
  it('should have a case here for every exported builder', () => {
    expect(exportedBuilders()).toEqual(Object.keys(CASES).sort());
  });

  for (const [themeName, theme] of THEMES) {
    for (const [builder, build] of Object.entries(CASES)) {
      it(`${builder} (${themeName} theme)`, () => {
        const specs = build(theme);
        expect(specs.length).toBeGreaterThan(0);
        specs.forEach((spec, k) => expectOwnColours(`${builder}[${k}]`, spec, theme));
      });
    }
  }

  it('the check itself: a library scheme, a default mark colour and a foreign colour all fail', () => {
    const base = CASES.buildScatterSpec(distinctTheme)[0] as unknown as { layer?: unknown[]; mark?: unknown; encoding?: Record<string, unknown> };
    const withScheme = JSON.parse(JSON.stringify(base));
    (withScheme.layer?.[0] ?? withScheme).encoding.color = { field: 'x', type: 'quantitative', scale: { scheme: 'viridis' } };
    expect(() => expectOwnColours('scheme', withScheme, distinctTheme)).toThrow(/scheme/);
    const foreign = JSON.parse(JSON.stringify(base).replace(distinctTheme.accent, '#4c78a8'));
    expect(() => expectOwnColours('foreign', foreign, distinctTheme)).toThrow(/#4c78a8/);
    const named = JSON.parse(JSON.stringify(base).replace(`"${distinctTheme.accent}"`, '"steelblue"'));
    expect(() => expectOwnColours('named', named, distinctTheme)).toThrow(/steelblue/);
  });
});
