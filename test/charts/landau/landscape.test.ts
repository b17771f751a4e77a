/**
 * The landscape spec builder: valid Vega-Lite, F against ψ, stationary points
 * by kind with theme colours and shapes, the global minimum ringed, non-finite
 * samples left out and inputs untouched.
 */
import { describe, expect, it } from 'vitest';
import { compile } from 'vega-lite';
import type { TopLevelSpec } from 'vega-lite';
import { buildLandscapeSpec, landscapeFocus } from '../../../src/charts/landau/index';
import type { ILandscapePoint } from '../../../src/charts/landau/index';
import type { IChartTheme } from '../../../src/charts/theme';
import { landauF, landauStationary, linspace } from '../../../src/core/physics/landau/index';

const theme: IChartTheme = { background: '#fafafa', text: '#111111', grid: '#dddddd', accent: '#1f77b4', accent2: '#d62728', font: 'serif' };
/** First-order example of REFERENCE.md C5 [computed here]: a = 0.5, b = −2, c = 4, T0 = 100. */
const K = { a: 0.5, b: -2, c: 4, T0: 100 };

interface ILayer {
  name: string;
  data: { values: Record<string, unknown>[] };
  mark: Record<string, unknown>;
  encoding: Record<string, { field?: string; scale?: { domain?: unknown[]; range?: unknown[] } }>;
}

function layer(spec: TopLevelSpec, name: string): ILayer | undefined {
  return (spec as unknown as { layer: ILayer[] }).layer.find(l => l.name === name);
}

function landscapeAt(T: number, h = 0) {
  const r = landauStationary(K, T, h);
  const psi = linspace(-1.1, 1.1, 221);
  const F = psi.map(p => landauF(K, T, h, p));
  return { r, psi, F };
}

describe('buildLandscapeSpec', () => {
  it('should compile and plot F against ψ with one symbol per stationary point', () => {
    const { r, psi, F } = landscapeAt(100.2);
    const { spec, rows } = buildLandscapeSpec({ psi, F, points: r.points, global: r.global, T: 100.2, h: 0, theme });
    const vega = compile(spec).spec;
    const names = (vega.marks ?? []).map(m => m.name);
    expect(names).toEqual(['landscape_curve_marks', 'landscape_points_marks', 'landscape_global_marks', 'landscape_global_text_marks']);
    const curve = layer(spec, 'landscape_curve')!;
    expect(curve.encoding.x.field).toBe('psi');
    expect(curve.encoding.y.field).toBe('F');
    expect(curve.data.values).toHaveLength(221);
    expect(curve.data.values[10]).toEqual({ psi: psi[10], F: F[10] });
    const points = layer(spec, 'landscape_points')!;
    // between T0 and T1 at h = 0 (B3 ii): ordered minima ±ψ (the core takes +ψ as global), ψ = 0 a local minimum, two maxima
    expect(points.data.values.map(v => v.kind)).toEqual(['metastable', 'unstable', 'metastable', 'unstable', 'stable']);
    expect(rows).toBe(221 + 5 + 1);
    expect(vega.background).toBe('#fafafa');
  });

  it('should take colours and shapes of the kinds from the theme and translated labels', () => {
    const { r, psi, F } = landscapeAt(99);
    const labels = { kinds: { stable: 'stabil', metastable: 'metastabil', unstable: 'instabil', inflection: 'Wendepunkt' }, globalMinimum: 'globales Minimum' };
    const { spec } = buildLandscapeSpec({ psi, F, points: r.points, global: r.global, T: 99, h: 0, theme, labels });
    const points = layer(spec, 'landscape_points')!;
    expect(points.encoding.color.scale).toEqual({ domain: ['stabil', 'metastabil', 'instabil'], range: ['#1f77b4', '#d62728', '#111111'] });
    expect(points.encoding.shape.scale).toEqual({ domain: ['stabil', 'metastabil', 'instabil'], range: ['circle', 'square', 'triangle-up'] });
    expect(layer(spec, 'landscape_global_text')!.data.values[0].text).toBe('globales Minimum');
  });

  it('should ring the global minimum', () => {
    const { r, psi, F } = landscapeAt(99, 0.05);
    const { spec } = buildLandscapeSpec({ psi, F, points: r.points, global: r.global, T: 99, h: 0.05, theme });
    const g = layer(spec, 'landscape_global')!;
    expect(g.data.values).toEqual([{ psi: r.points[r.global].psi, F: r.points[r.global].F, text: 'global minimum' }]);
    expect(r.points[r.global].psi).toBeGreaterThan(0); // h > 0 favours ψ > 0
    expect(g.mark.stroke).toBe('#1f77b4');
    expect(g.mark.filled).toBe(false);
  });

  it('should add an inflection entry only when such a point is present', () => {
    const pts: ILandscapePoint[] = [
      { psi: 0, F: 0, kind: 'inflection' },
      { psi: 1, F: -1, kind: 'stable' }
    ];
    const { spec } = buildLandscapeSpec({ psi: [0, 1], F: [0, -1], points: pts, global: 1, T: 1, h: 0, theme });
    expect(layer(spec, 'landscape_points')!.encoding.color.scale!.domain).toEqual(['stable', 'metastable', 'unstable', 'inflection']);
    expect(() => compile(spec)).not.toThrow();
  });

  it('should leave out non-finite curve samples and points, and draw no ring without a global minimum', () => {
    const psi = new Float64Array([-1, Number.NaN, 0, 0.5, 1]);
    const F = new Float64Array([1, 2, Number.POSITIVE_INFINITY, -0.5, 1]);
    const pts: ILandscapePoint[] = [
      { psi: Number.NaN, F: 0, kind: 'unstable' },
      { psi: 0.5, F: Number.NEGATIVE_INFINITY, kind: 'metastable' },
      { psi: 0.5, F: -0.5, kind: 'stable' }
    ];
    const { spec, rows } = buildLandscapeSpec({ psi, F, points: pts, global: -1, T: 1, h: 0, theme });
    expect(layer(spec, 'landscape_curve')!.data.values).toEqual([
      { psi: -1, F: 1 },
      { psi: 0.5, F: -0.5 },
      { psi: 1, F: 1 }
    ]);
    expect(layer(spec, 'landscape_points')!.data.values).toEqual([{ psi: 0.5, F: -0.5, kind: 'stable' }]);
    expect(layer(spec, 'landscape_global')).toBeUndefined();
    expect(rows).toBe(4);
    expect(() => compile(spec)).not.toThrow();
  });

  it('should not change its inputs', () => {
    const { r, psi, F } = landscapeAt(100.375);
    const psiA = Float64Array.from(psi);
    const FA = Float64Array.from(F);
    const before = JSON.stringify(r.points);
    buildLandscapeSpec({ psi: psiA, F: FA, points: r.points, global: r.global, T: 100.375, h: 0, theme });
    expect(Array.from(psiA)).toEqual(psi);
    expect(Array.from(FA)).toEqual(F);
    expect(JSON.stringify(r.points)).toBe(before);
  });

  it('should focus the F axis on the stationary points when they differ in F, and not otherwise', () => {
    const { r, psi, F } = landscapeAt(100.2);
    const Fs = r.points.map(p => p.F);
    const lo = Math.min(...Fs);
    const hi = Math.max(...Fs);
    const { spec } = buildLandscapeSpec({ psi, F, points: r.points, global: r.global, T: 100.2, h: 0, theme });
    const y = layer(spec, 'landscape_curve')!.encoding.y.scale as { domain: number[] };
    expect(y.domain[0]).toBeCloseTo(lo - 0.3 * (hi - lo), 12);
    expect(y.domain[1]).toBeCloseTo(hi + 0.8 * (hi - lo), 12);
    expect(landscapeFocus([{ psi: 0, F: 0, kind: 'stable' }])).toBeNull();
    const off = buildLandscapeSpec({ psi, F, points: r.points, global: r.global, T: 100.2, h: 0, theme, focus: false });
    expect((layer(off.spec, 'landscape_curve')!.encoding.y.scale as { domain?: unknown }).domain).toBeUndefined();
  });

  it('should refuse a curve whose ψ and F differ in length', () => {
    expect(() => buildLandscapeSpec({ psi: [1, 2], F: [1], points: [], global: -1, T: 1, h: 0, theme })).toThrow('psi has 2 values but F has 1');
  });
});
