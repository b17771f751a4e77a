/**
 * Chart builders of the landscape workbench: the (T, h) phase diagram, the
 * two-order-parameter heat map, the field loop and the data overlay with
 * fixed axes on the branches chart. Each compiles without a Vega-Lite
 * warning, holds no non-finite number, takes its colours from the theme and
 * names every dataset a view updates in place.
 */
import { describe, expect, it } from 'vitest';
import type { TopLevelSpec } from 'vega-lite';
import {
  branchesRows,
  buildBranchesSpec,
  buildLandscape2dSpec,
  buildLoopSpec,
  buildPhaseDiagramSpec,
  landscape2dRows,
  phaseDiagramRows
} from '../../../src/charts/landau/index';
import { branchesData, coupledLandscape, landauFieldLoop, landauPhaseDiagram } from '../../../src/core/physics/landau/index';
import { compilesCleanly, distinctTheme, nonFinitePaths } from '../sweeps/helpers';

/** First-order example of [C5 in REFERENCES.md]: a = 0.5, b = −2, c = 4, T0 = 100. */
const K = { a: 0.5, b: -2, c: 4, T0: 100, d: 0 };

function datasetNames(spec: TopLevelSpec): string[] {
  const out: string[] = [];
  const walk = (v: unknown): void => {
    if (Array.isArray(v)) {
      v.forEach(walk);
    } else if (v && typeof v === 'object') {
      const o = v as Record<string, unknown>;
      const data = o.data as { name?: string } | undefined;
      if (data && typeof data.name === 'string') {
        out.push(data.name);
      }
      Object.values(o).forEach(walk);
    }
  };
  walk(spec);
  return out;
}

describe('phase diagram chart', () => {
  it('should compile cleanly with lines, points and the current state, no NaN anywhere', () => {
    const pd = landauPhaseDiagram(K, { Tmin: 98, Tmax: 102 });
    const options = { lines: pd.lines, points: pd.points, current: { T: 100.4, h: 0.01 }, xDomain: [98, 102] as [number, number], yDomain: [-0.2, 0.2] as [number, number], theme: distinctTheme };
    const { spec, rows } = buildPhaseDiagramSpec(options);
    compilesCleanly(spec);
    expect(nonFinitePaths(spec)).toEqual([]);
    expect(rows).toBeGreaterThan(100);
    expect(JSON.stringify(spec)).not.toMatch(/NaN|Infinity/);
    // every dataset named and present, so a drawn view can take new rows in place
    const names = Object.keys(phaseDiagramRows(options));
    expect(datasetNames(spec)).toEqual(expect.arrayContaining(names));
  });

  it('should leave out non-finite points and compile with nothing to draw', () => {
    const { spec } = buildPhaseDiagramSpec({ lines: [{ kind: 'spinodal', id: 's', T: [1, Number.NaN], h: [0, 1] }], points: [{ kind: 'critical', T: Number.NaN, h: 0 }], theme: distinctTheme });
    compilesCleanly(spec);
    expect(nonFinitePaths(spec)).toEqual([]);
  });
});

describe('two-order-parameter heat map', () => {
  it('should draw at most maxCells² cells on the sequential ramp and ring the global minima', () => {
    const L = coupledLandscape({ a1: 1, T1: 100, b1: 1, a2: 1, T2: 90, b2: 1, lambda: 0.5 }, 95);
    const options = { ...L, minima: L.minima, theme: distinctTheme, maxCells: 50 };
    const { spec } = buildLandscape2dSpec(options);
    compilesCleanly(spec);
    expect(nonFinitePaths(spec)).toEqual([]);
    const rows = landscape2dRows(options);
    expect(rows.landscape2d_cells.length).toBeLessThanOrEqual(50 * 50);
    expect(rows.landscape2d_minima).toHaveLength(2);
    const text = JSON.stringify(spec);
    expect(text).toContain(distinctTheme.sequential![0]);
    expect(text).toContain(distinctTheme.sequential![2]);
  });
});

describe('field loop chart', () => {
  it('should compile the P–E loop of the first-order example below T0', () => {
    const path = landauFieldLoop(K, 99, 1, 101);
    const { spec, rows } = buildLoopSpec({ points: path.points, turn: 101, theme: distinctTheme });
    compilesCleanly(spec);
    expect(rows).toBe(201);
    expect(nonFinitePaths(spec)).toEqual([]);
  });
});

describe('branches with data overlay and fixed axes', () => {
  it('should draw the data and the fitted curve over the branches on the axes given', () => {
    const b = branchesData(K, 98, 102, 0, 81);
    const data = [
      { T: 98.5, psi: 0.8 },
      { T: 99.5, psi: 0.74 },
      { T: 101, psi: Number.NaN }
    ];
    const fitted = [
      { T: 98, psi: 0.82 },
      { T: 100, psi: 0.7 }
    ];
    const options = { branches: b.branches, heating: b.heating, cooling: b.cooling, h: 0, theme: distinctTheme, data, fitted, xDomain: [97, 103] as [number, number], yDomain: [-1, 1] as [number, number], patchable: true };
    const { spec } = buildBranchesSpec(options);
    compilesCleanly(spec);
    expect(nonFinitePaths(spec)).toEqual([]);
    const text = JSON.stringify(spec);
    expect(text).toContain('"domain":[97,103]');
    expect(text).toContain('"domain":[-1,1]');
    const rows = branchesRows(options);
    expect(rows.data).toEqual([
      { T: 98.5, psi: 0.8 },
      { T: 99.5, psi: 0.74 }
    ]);
    expect(datasetNames(spec)).toEqual(expect.arrayContaining(Object.keys(rows)));
    // patchable with nothing to draw still compiles, every layer present
    const empty = buildBranchesSpec({ branches: [], h: 0, theme: distinctTheme, patchable: true, data: [], fitted: [] });
    compilesCleanly(empty.spec);
  });
});
