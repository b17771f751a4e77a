import { describe, expect, it } from 'vitest';
import {
  landauThermalHysteresis,
  landauFieldLoop,
  landauBranches,
  followPath,
  landauDerived,
  linspace
} from '../../../src/core/physics/index';
import type { ILandauCoefficients, ILandauPath } from '../../../src/core/physics/index';

const FIRST: ILandauCoefficients = { a: 0.5, b: -2, c: 4, T0: 100 }; // REFERENCE.md C5
const SECOND: ILandauCoefficients = { a: 0.5, b: 2, c: 0, T0: 100 };

/** Largest |Δψ| between consecutive states, excluding recorded jumps. */
function maxStepAwayFromJumps(p: ILandauPath): number {
  const jumpIdx = new Set(p.jumps.map(j => j.index));
  let m = 0;
  for (let i = 1; i < p.points.length; i++) {
    if (!jumpIdx.has(i)) {
      m = Math.max(m, Math.abs(p.points[i].psi - p.points[i - 1].psi));
    }
  }
  return m;
}

describe('Landau paths and hysteresis', () => {
  it('heating follows the ordered branch to T**, cooling the disordered one to T0', () => {
    const d = landauDerived(FIRST);
    const hy = landauThermalHysteresis(FIRST, 99, 101.5, 2501);
    expect(hy.convention).toBe('L');
    expect(hy.heating.jumps.length).toBe(1);
    expect(hy.cooling.jumps.length).toBe(1);
    const up = hy.heating.jumps[0];
    const down = hy.cooling.jumps[0];
    // jumps happen at the first grid state beyond the spinodal (grid step 1e-3)
    expect(up.T).toBeGreaterThan(d.Tsuperheat - 1e-9);
    expect(up.T - d.Tsuperheat).toBeLessThan(1e-3 + 1e-9);
    expect(down.T).toBeLessThanOrEqual(d.T0);
    expect(d.T0 - down.T).toBeLessThan(1e-3 + 1e-9);
    // before the heating jump the ordered minimum is followed into its metastable range
    expect(up.psiBefore).toBeGreaterThan(0.49);
    expect(up.psiAfter).toBe(0);
    expect(down.psiAfter).toBeCloseTo(Math.sqrt(2 / 4), 6);
    // metastable states appear on both legs between T1 and the spinodals
    expect(hy.heating.points.some(p => p.kind === 'metastable' && p.T > d.Ttransition)).toBe(true);
    expect(hy.cooling.points.some(p => p.kind === 'metastable' && p.T < d.Ttransition)).toBe(true);
    // equilibrium jumps at T1
    const eq = hy.equilibrium;
    for (const p of eq) {
      if (p.T < d.Ttransition - 1e-9) {
        expect(p.psi).toBeGreaterThan(0.6);
      } else if (p.T > d.Ttransition + 1e-9) {
        expect(p.psi).toBe(0);
      }
      expect(p.kind).toBe('stable');
    }
    // the equilibrium (global) free energy is never above the occupied state of either sweep
    hy.heating.points.forEach((p, i) => {
      expect(hy.equilibrium[i].F).toBeLessThanOrEqual(p.F + 1e-15);
      const c = hy.cooling.points[hy.cooling.points.length - 1 - i];
      expect(c.T).toBeCloseTo(p.T, 12);
      expect(hy.equilibrium[i].F).toBeLessThanOrEqual(c.F + 1e-15);
    });
    // branches continuous away from the jumps
    expect(maxStepAwayFromJumps(hy.heating)).toBeLessThan(0.02);
    expect(maxStepAwayFromJumps(hy.cooling)).toBeLessThan(0.02);
  });

  it('a second-order transition has no hysteresis and no jumps', () => {
    const hy = landauThermalHysteresis(SECOND, 95, 105, 1001);
    expect(hy.heating.jumps.length).toBe(0);
    expect(hy.cooling.jumps.length).toBe(0);
    hy.heating.points.forEach((p, i) => {
      expect(p.psi).toBeCloseTo(hy.cooling.points[hy.cooling.points.length - 1 - i].psi, 12);
    });
  });

  it('field loop below T0 jumps at the intrinsic coercive field and is symmetric', () => {
    // [REFERENCE.md C5: first-order example at T = 99, E_c = 0.4211856711]
    const loop = landauFieldLoop(FIRST, 99, 1, 20001);
    expect(loop.jumps.length).toBe(2);
    const [j1, j2] = loop.jumps;
    expect(j1.h).toBeGreaterThan(0.4211856711);
    expect(j1.h - 0.4211856711).toBeLessThan(1e-4 + 1e-9);
    expect(j2.h).toBeCloseTo(-j1.h, 12);
    expect(j1.psiBefore).toBeLessThan(0);
    expect(j1.psiAfter).toBeGreaterThan(0);
    expect(maxStepAwayFromJumps(loop)).toBeLessThan(0.01);
  });

  it('double loops for T1 < T < T_cp: field-induced ordering jumps on each side', () => {
    const d = landauDerived(FIRST);
    const T = 0.5 * (d.Ttransition + d.criticalEndPoint.T);
    const loop = landauFieldLoop(FIRST, T, 0.3, 6001);
    // four jumps: up/down on the positive side and on the negative side
    expect(loop.jumps.length).toBe(4);
    const above = landauFieldLoop(FIRST, d.criticalEndPoint.T + 0.2, 0.3, 3001);
    expect(above.jumps.length).toBe(0);
  });

  it('branch listing gives every stationary point with its kind; states can be arbitrary (T, h) sequences', () => {
    const Ts = linspace(99, 101, 21);
    const br = landauBranches(FIRST, Ts, Ts.map(() => 0));
    expect(br.filter(p => p.kind === 'stable').length).toBe(21);
    const path = followPath(FIRST, [99, 99.5, 100.2, 100.4], [0, 0.01, 0.02, 0]);
    expect(path.points.length).toBe(4);
    expect(() => followPath(FIRST, [1, 2], [0])).toThrow();
    expect(() => linspace(0, 1, 1)).toThrow();
  });
});
