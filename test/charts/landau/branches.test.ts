/**
 * The ψ(T) branches builder and the branch tracing behind it: valid Vega-Lite,
 * continuous segments of one kind, the heating and cooling paths cut at their
 * jumps, labelled temperature rules, non-finite input left out, inputs untouched.
 */
import { describe, expect, it } from 'vitest';
import { compile } from 'vega-lite';
import type { TopLevelSpec } from 'vega-lite';
import { alignSorted, buildBranchesSpec, traceBranches } from '../../../src/charts/landau/index';
import type { IBranchPoint } from '../../../src/charts/landau/index';
import type { IChartTheme } from '../../../src/charts/theme';
import { landauBranches, landauThermalHysteresis, linspace } from '../../../src/core/physics/landau/index';

const theme: IChartTheme = { background: '#000000', text: '#eeeeee', grid: '#444444', accent: '#66aaff', accent2: '#ffaa33', font: 'sans-serif' };
/** First-order example of REFERENCE.md C5 [computed here]: a = 0.5, b = −2, c = 4, T0 = 100; T1 = 100.375, T** = 100.5. */
const K = { a: 0.5, b: -2, c: 4, T0: 100 };

interface ILayer {
  name: string;
  data: { values: Record<string, unknown>[] };
  mark: Record<string, unknown>;
  encoding: Record<string, { field?: string; value?: unknown; scale?: { domain?: unknown[]; range?: unknown[] } }>;
}

function layer(spec: TopLevelSpec, name: string): ILayer | undefined {
  return (spec as unknown as { layer: ILayer[] }).layer.find(l => l.name === name);
}

/** The nested layer holding the current-T rule and its label. */
function currentGroup(spec: TopLevelSpec): { data: unknown; layer: ILayer[] } | undefined {
  return (spec as unknown as { layer: { data: { name?: string }; layer?: ILayer[] }[] }).layer.find(l => l.data?.name === 'current') as { data: unknown; layer: ILayer[] } | undefined;
}

function example(n = 101) {
  const T = linspace(99, 101.5, n);
  const branches = landauBranches(
    K,
    T,
    T.map(() => 0)
  );
  const hyst = landauThermalHysteresis(K, 99, 101.5, n, 0);
  return { branches, hyst };
}

describe('alignSorted', () => {
  it('should pair equal-length lists index by index', () => {
    expect(alignSorted([-1, 0, 1], [-1.1, 0, 0.9])).toEqual([
      [0, 0],
      [1, 1],
      [2, 2]
    ]);
  });

  it('should skip the entries of the longer list that fit worst, in either direction', () => {
    // a pair (min and max) is born near 0.5
    expect(alignSorted([0], [0.01, 0.5, 0.52])).toEqual([[0, 0]]);
    expect(alignSorted([-0.7, 0, 0.7], [0.01])).toEqual([[1, 0]]);
    expect(alignSorted([], [1, 2])).toEqual([]);
  });
});

describe('traceBranches', () => {
  it('should join a pitchfork into three continuous branches and cut where the kind changes', () => {
    // ψ = 0 stable above 0 and unstable below; ±√(−T) stable below (common practice, no source: the 2-4 pitchfork)
    const pts: IBranchPoint[] = [];
    for (const T of [-2, -1, -0.5]) {
      pts.push({ T, psi: -Math.sqrt(-T), kind: 'stable' }, { T, psi: 0, kind: 'unstable' }, { T, psi: Math.sqrt(-T), kind: 'stable' });
    }
    for (const T of [0.5, 1]) {
      pts.push({ T, psi: 0, kind: 'stable' });
    }
    const seg = traceBranches(pts);
    const bySegment = new Map<number, { T: number; kind: string }[]>();
    for (const p of seg) {
      bySegment.set(p.segment, [...(bySegment.get(p.segment) ?? []), { T: p.T, kind: p.kind }]);
    }
    const lines = [...bySegment.values()].map(s => `${s[0].kind}:${s.map(q => q.T).join(',')}`);
    expect(lines.sort()).toEqual(['stable:-0.5,0.5,1', 'stable:-2,-1,-0.5', 'stable:-2,-1,-0.5', 'unstable:-2,-1,-0.5'].sort());
  });

  it('should leave out non-finite points', () => {
    const seg = traceBranches([
      { T: 1, psi: 0, kind: 'stable' },
      { T: Number.NaN, psi: 0, kind: 'stable' },
      { T: 2, psi: Number.POSITIVE_INFINITY, kind: 'stable' },
      { T: 3, psi: 0, kind: 'stable' }
    ]);
    expect(seg.map(p => p.T)).toEqual([1, 3]);
  });
});

describe('buildBranchesSpec', () => {
  it('should compile and plot ψ against T with branches dashed by kind', () => {
    const { branches, hyst } = example();
    const { spec } = buildBranchesSpec({ branches, heating: hyst.heating, cooling: hyst.cooling, h: 0, theme });
    const vega = compile(spec).spec;
    expect(vega.marks?.length).toBeGreaterThan(0);
    const lines = layer(spec, 'branches_lines')!;
    expect(lines.encoding.x.field).toBe('T');
    expect(lines.encoding.y.field).toBe('psi');
    expect(lines.encoding.detail.field).toBe('segment');
    expect(lines.encoding.color.scale).toEqual({ domain: ['stable', 'metastable', 'unstable'], range: ['#66aaff', '#ffaa33', '#eeeeee'] });
    expect(lines.encoding.strokeDash.scale!.range).toEqual([
      [1, 0],
      [7, 4],
      [2, 3]
    ]);
    // every stationary point except the isolated inflections is on a line
    const kept = branches.filter(b => b.kind !== 'inflection').length;
    const rows = lines.data.values;
    expect(rows.length).toBeGreaterThanOrEqual(kept);
    const kinds = new Set(rows.map(r => r.kind));
    expect([...kinds].sort()).toEqual(['metastable', 'stable', 'unstable']);
  });

  it('should cut the heating and cooling paths at their jumps (T** heating, T0 cooling; REFERENCE.md C5)', () => {
    const { branches, hyst } = example();
    const { spec } = buildBranchesSpec({ branches, heating: hyst.heating, cooling: hyst.cooling, h: 0, theme, labels: { heating: 'warm', cooling: 'cold' } });
    const paths = layer(spec, 'branches_paths')!.data.values;
    expect(new Set(paths.map(p => p.part))).toEqual(new Set(['h0', 'h1', 'c0', 'c1']));
    const jumps = layer(spec, 'branches_jumps')!.data.values;
    expect(jumps).toHaveLength(2);
    const heat = jumps.find(j => j.text === 'warm')!;
    const cool = jumps.find(j => j.text === 'cold')!;
    // on a 0.025 K grid the heating jump falls at T** = 100.5 and the cooling one at T0 = 100 (C5)
    expect(heat.T).toBeCloseTo(100.5, 9);
    expect(heat.shape).toBe('triangle-down');
    expect(cool.T).toBeCloseTo(100, 9);
    expect(cool.shape).toBe('triangle-up');
    expect(cool.psi2).toBeCloseTo(Math.SQRT1_2, 9); // ordered branch at T0: √(|b|/c) (C5)
  });

  it('should draw labelled rules at the characteristic temperatures and the current T, leaving out non-finite ones', () => {
    const { branches } = example(41);
    const markers = [
      { T: 100, label: 'T0' },
      { T: 100.375, label: 'T1' },
      { T: Number.NaN, label: 'T**' }
    ];
    const { spec } = buildBranchesSpec({ branches, markers, current: { T: 100.2, label: 'T = 100.2' }, h: 0, theme });
    expect(layer(spec, 'branches_markers')!.data.values).toEqual([
      { T: 100, label: 'T0' },
      { T: 100.375, label: 'T1' }
    ]);
    // one text layer, one pixel line per marker so close labels do not overlap
    expect(layer(spec, 'branches_marker_text')!.data.values.map(r => r.label)).toEqual(['T0', 'T1']);
    const cur = currentGroup(spec)!;
    expect(cur.data).toEqual({ name: 'current', values: [{ T: 100.2, label: 'T = 100.2' }] });
    expect(cur.layer.map(l => l.name)).toEqual(['branches_current', 'branches_current_text']);
    expect(cur.layer[0].mark.color).toBe('#66aaff');
    const vega = compile(spec).spec;
    expect(vega.data?.find(d => d.name === 'current')).toBeTruthy();
    expect(() => compile(spec)).not.toThrow();
    const none = buildBranchesSpec({ branches, current: { T: Number.POSITIVE_INFINITY, label: 'T' }, h: 0, theme });
    expect(currentGroup(none.spec)).toBeUndefined();
  });

  it('should not change its inputs', () => {
    const { branches, hyst } = example(41);
    const before = JSON.stringify([branches, hyst]);
    const markers = [{ T: 100, label: 'T0' }];
    buildBranchesSpec({ branches, heating: hyst.heating, cooling: hyst.cooling, markers, h: 0, theme });
    expect(JSON.stringify([branches, hyst])).toBe(before);
    expect(markers).toEqual([{ T: 100, label: 'T0' }]);
  });

  it('should compile with no data at all', () => {
    const { spec, rows } = buildBranchesSpec({ branches: [], h: 0.1, theme });
    expect(rows).toBe(0);
    expect(() => compile(spec)).not.toThrow();
  });
});
