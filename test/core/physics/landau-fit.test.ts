import { describe, expect, it } from 'vitest';
import { fitLandau, fromConventionL, landauEquilibriumPsi, landauEquilibrium, PhysicsInputError } from '../../../src/core/physics/index';
import type { ILandauCoefficients } from '../../../src/core/physics/index';
import { normal } from './prng';

function grid(lo: number, hi: number, n: number): number[] {
  return Array.from({ length: n }, (_, i) => lo + ((hi - lo) * i) / (n - 1));
}

describe('Landau coefficient fits (convention L)', () => {
  it('closed-form equilibrium psi agrees with the root-finding global minimum', () => {
    const ks: ILandauCoefficients[] = [
      { a: 0.5, b: -2, c: 4, T0: 100 },
      { a: 0.5, b: 2, c: 0, T0: 100 },
      { a: 0.5, b: 0, c: 4, T0: 100 },
      { a: 1.3, b: 0.7, c: 2.1, T0: 40 }
    ];
    for (const k of ks) {
      for (const T of grid(k.T0 - 5, k.T0 + 2, 71)) {
        const ref = Math.abs(landauEquilibrium(k, T).psi);
        expect(Math.abs(landauEquilibriumPsi(k, T) - ref)).toBeLessThan(1e-10 * (1 + ref));
      }
    }
  });

  it('psi(T) alone: recovers T0, b/a, c/a with a held fixed and says so', () => {
    const truth = { a: 0.5, b: -2, c: 4, T0: 100 };
    const T = grid(80, 102, 120);
    const g = normal(17);
    const y = T.map(t => landauEquilibriumPsi(truth, t) + 0.003 * g());
    const r = fitLandau({ psi: { T, y } }, { start: { a: 0.5, b: -1, c: 3, T0: 99 } });
    expect(r.convention).toBe('L');
    expect(r.scaleFixed).toBe(true);
    expect(r.warnings.some(w => w.code === 'physics.landau.scale-fixed')).toBe(true);
    expect(Math.abs(r.values[1] - 100)).toBeLessThan(4 * r.standardErrors[1]);
    expect(Math.abs(r.values[2] + 2)).toBeLessThan(4 * r.standardErrors[2]);
    expect(Math.abs(r.values[3] - 4)).toBeLessThan(4 * r.standardErrors[3]);
  });

  it('joint psi(T) + 1/chi(T) + specific-heat jump fixes the scale (second order, 2-4 model)', () => {
    const truth = { a: 0.5, b: 2, c: 0, T0: 100 };
    const T = grid(85, 99.5, 60);
    const g = normal(23);
    const y = T.map(t => landauEquilibriumPsi(truth, t) + 0.002 * g());
    const Tchi = grid(101, 115, 30);
    const chiInv = Tchi.map(t => truth.a * (t - truth.T0) + 0.01 * g());
    const r = fitLandau(
      {
        psi: { T, y, sigma: T.map(() => 0.002) },
        inverseChi: { T: Tchi, y: chiInv, sigma: Tchi.map(() => 0.01) },
        specificHeatJump: { value: 6.25, sigma: 0.1 } // REFERENCE.md C5: dC = T0 a²/(2b) = 6.25
      },
      { start: { a: 0.3, b: 1, c: 0, T0: 98 }, sextic: false }
    );
    expect(r.scaleFixed).toBe(false);
    expect(r.converged).toBe(true);
    expect(r.values[3]).toBe(0);
    expect(Math.abs(r.values[0] - 0.5)).toBeLessThan(3 * r.standardErrors[0]);
    expect(Math.abs(r.values[1] - 100)).toBeLessThan(3 * r.standardErrors[1]);
    expect(Math.abs(r.values[2] - 2)).toBeLessThan(3 * r.standardErrors[2]);
    expect(r.errorScaling).toBe('from-sigma');
  });

  it('refuses joint fits without sigma and tiny data sets', () => {
    expect(() =>
      fitLandau(
        { psi: { T: [1, 2, 3, 4], y: [1, 1, 1, 0] }, inverseChi: { T: [5, 6], y: [1, 2], sigma: [0.1, 0.1] } },
        { start: { a: 1, b: 1, c: 0, T0: 4 } }
      )
    ).toThrow(PhysicsInputError);
    expect(() => fitLandau({ psi: { T: [1, 2], y: [1, 0] } }, { start: { a: 1, b: 1, c: 0, T0: 4 } })).toThrow(PhysicsInputError);
    expect(() => fitLandau({ psi: { T: [1, 2, 3, NaN], y: [1, 0, 0, 0] } }, { start: { a: 1, b: 1, c: 0, T0: 4 } })).toThrow(
      PhysicsInputError
    );
  });
});

describe('Landau fit reporting in another convention', () => {
  it('re-expresses the fitted coefficients in the "no fractions" form', () => {
    const truth = { a: 0.5, b: 2, c: 0, T0: 100 };
    const T = grid(85, 99.5, 40);
    const g = normal(29);
    const y = T.map(t => landauEquilibriumPsi(truth, t) + 0.002 * g());
    const r = fitLandau({ psi: { T, y } }, { start: { a: 0.5, b: 1.5, c: 0, T0: 99 }, sextic: false, reportIn: 'no-fractions' });
    expect(r.converted?.convention).toBe('no-fractions');
    if (r.converted?.convention === 'no-fractions') {
      expect(r.converted.coefficients.B).toBeCloseTo(r.values[2] / 4, 15);
      expect(r.converted.coefficients.A).toBeCloseTo(r.values[0] / 2, 15);
    }
    // a sextic term cannot be written in the Ginzburg–Landau form: flagged, not silently dropped
    const y6 = T.map(t => landauEquilibriumPsi({ a: 0.5, b: 0.5, c: 2, T0: 100 }, t) + 0.002 * g());
    const gl = fitLandau({ psi: { T, y: y6 } }, { start: { a: 0.5, b: 0.4, c: 1.5, T0: 99.5 }, reportIn: 'ginzburg-landau' });
    expect(gl.values[3]).toBeGreaterThan(0.5);
    expect(gl.converted).toBeNull();
    expect(gl.warnings.map(w => w.code)).toEqual(expect.arrayContaining(['physics.landau.cannot-convert', 'physics.landau.ginzburg-landau-terms']));
    expect(() => fromConventionL({ a: 1, b: 1, c: 1, T0: 0 }, 'ginzburg-landau')).toThrow(PhysicsInputError);
  });
});
