/**
 * Fits on long measurements: nothing spreads a data array into function
 * arguments (Math.min(...T) overflowed the call stack from about 150 000
 * points), so a fit of 200 000 points runs like one of 200.
 */
import { describe, expect, it } from 'vitest';
import { fitCurieWeiss } from '../../../src/core/physics/curie-weiss';
import { fitLandau, landauEquilibriumPsi } from '../../../src/core/physics/landau/fit';

const N = 200_000;

describe('fits of 200 000 points', () => {
  it('Curie–Weiss', () => {
    const T = new Float64Array(N);
    const chi = new Float64Array(N);
    for (let i = 0; i < N; i++) {
      T[i] = 100 + (250 * i) / N;
      chi[i] = (0.01 + 3 / (T[i] - 50)) * (1 + 1e-3 * Math.sin(i));
    }
    const r = fitCurieWeiss({ T, chi }, { units: 'SI' });
    expect(r.residuals).toHaveLength(N);
    expect(r.values[1]).toBeCloseTo(50, 0);
    expect(r.values[0]).toBeCloseTo(3, 1);
  });

  it('Landau', () => {
    const k = { a: 1, T0: 300, b: 2, c: 0.5, d: 0 };
    const T = new Float64Array(N);
    const psi = new Float64Array(N);
    for (let i = 0; i < N; i++) {
      T[i] = 100 + (199 * i) / N;
      psi[i] = landauEquilibriumPsi(k, T[i]) * (1 + 1e-4 * Math.sin(i));
    }
    const r = fitLandau({ psi: { T, y: psi } }, { start: { a: 1, T0: 295, b: 1.5, c: 0.4 } });
    expect(r.residuals).toHaveLength(N);
    expect(r.coefficients.T0).toBeCloseTo(300, 0);
  });
});
