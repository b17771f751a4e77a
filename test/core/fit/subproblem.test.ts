/**
 * The spectral model of the trust-region step (src/core/fit/subproblem.ts)
 * computed with work arrays kept across calls (eigen-decompositions started
 * from the previous eigenvectors, the Cholesky test before the SVD) against
 * the same model from fresh work arrays (cold starts), on seeded random
 * Jacobians (common practice, no source).
 */
import { describe, expect, it } from 'vitest';
import { choleskyPivotRatio } from '../../../src/core/fit/dense';
import { FIT_DEFAULTS } from '../../../src/core/fit/defaults';
import { normalMatrix, SpectralWork, spectralModel, stepForMu } from '../../../src/core/fit/subproblem';
import type { ISpectralModel } from '../../../src/core/fit/subproblem';
import { mulberry32 } from './prng';

const rand = mulberry32(4242);
const tolerance = FIT_DEFAULTS.singularTolerance;

interface IProblem {
  jac: Float64Array;
  r: Float64Array;
  grad: Float64Array;
  diag: Float64Array;
}

/** Row-major n×k Jacobian with seeded random entries and column scales 10^c. */
function randomJacobian(n: number, k: number): Float64Array {
  return Float64Array.from({ length: n * k }, (_, i) => (rand() - 0.5) * 10 ** (i % k));
}

/** Residuals, gradient Jᵀr and column norms for `jac`. */
function problem(jac: Float64Array, n: number, k: number, r: Float64Array): IProblem {
  const grad = new Float64Array(k);
  const diag = new Float64Array(k);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < k; j++) {
      grad[j] += jac[i * k + j] * r[i];
      diag[j] += jac[i * k + j] ** 2;
    }
  }
  diag.forEach((v, j) => (diag[j] = Math.sqrt(v)));
  return { jac, r, grad, diag };
}

/** Copy of the model's arrays (they are reused by the next call). */
function snapshot(model: ISpectralModel): { v: number[]; s2: number[]; c: number[]; steps: number[][] } {
  const m = model.cols.length;
  const steps = [0, 1e-3, 0.1].map((f) => {
    const z = new Float64Array(m);
    stepForMu(model, f * model.s2[0], z);
    return Array.from(z);
  });
  return { v: Array.from(model.v), s2: Array.from(model.s2), c: Array.from(model.c), steps };
}

/** Largest relative difference of the squared singular values and of the steps z(μ). */
function mismatch(x: ReturnType<typeof snapshot>, y: ReturnType<typeof snapshot>): number {
  let worst = 0;
  x.s2.forEach((v, a) => (worst = Math.max(worst, Math.abs(v - y.s2[a]) / x.s2[0])));
  x.steps.forEach((z, i) => {
    const norm = Math.hypot(...z);
    z.forEach((v, a) => (worst = Math.max(worst, Math.abs(v - y.steps[i][a]) / norm)));
  });
  return worst;
}

describe('spectralModel with work kept across calls', () => {
  // A fit's sequence: Jacobians changing slowly from call to call, the
  // columns fixed, then some held at a bound and released again (another
  // column set of the same size must not start from the old basis, and a
  // wrong start would still converge). Well-conditioned, so the
  // eigen-decomposition is used and determines the model to ≈ 1e-15: every
  // call must match a cold start to 1e-13.
  it.each([false, true])('matches fresh work arrays call by call (useSvd %s)', (useSvd) => {
    const n = 30;
    const k = 6;
    const base = randomJacobian(n, k);
    const drift = randomJacobian(n, k);
    const r = Float64Array.from({ length: n }, () => rand() - 0.5);
    const sets = [[0, 1, 2, 3, 4, 5], [0, 1, 3, 4, 5], [0, 1, 2, 3, 4, 5], [1, 2, 3, 4, 5], [0, 2, 3, 4, 5]];
    const work = new SpectralWork(n, k);
    for (let call = 0; call < 40; call++) {
      const jac = base.map((v, i) => v + 1e-3 * Math.sin(call) * drift[i]);
      const p = problem(jac, n, k, r);
      const cols = sets[Math.floor(call / 8)];
      const kept = snapshot(spectralModel(jac, n, k, cols, p.diag, r, p.grad, useSvd, tolerance, null, work));
      const fresh = snapshot(spectralModel(jac, n, k, cols, p.diag, r, p.grad, useSvd, tolerance, null, new SpectralWork(n, k)));
      expect(mismatch(kept, fresh)).toBeLessThan(1e-13);
    }
  });

  // Ill-conditioned (two columns equal to 1e-8): the SVD model. Fresh work
  // decides it by the Cholesky test alone; work whose previous model was
  // well conditioned skips that test and decides by the eigenvalues. Both
  // must give the same SVD model, bit for bit.
  it('takes the same SVD model with or without the Cholesky test', () => {
    const n = 25;
    const k = 4;
    const well = randomJacobian(n, k);
    const ill = well.slice();
    for (let i = 0; i < n; i++) {
      ill[i * k + 3] = ill[i * k + 2] * (1 + 1e-8 * (rand() - 0.5));
    }
    const r = Float64Array.from({ length: n }, () => rand() - 0.5);
    const cols = [0, 1, 2, 3];
    const pIll = problem(ill, n, k, r);
    const scaled = new Float64Array(k * k);
    normalMatrix(ill, n, k, cols, pIll.diag, scaled);
    expect(choleskyPivotRatio(scaled, k, FIT_DEFAULTS.normalEquationsMinRatio, new Float64Array(k * k))).toBeLessThan(
      FIT_DEFAULTS.normalEquationsMinRatio
    );
    const warmed = new SpectralWork(n, k);
    const pWell = problem(well, n, k, r);
    spectralModel(well, n, k, cols, pWell.diag, r, pWell.grad, true, tolerance, null, warmed);
    const viaEigen = snapshot(spectralModel(ill, n, k, cols, pIll.diag, r, pIll.grad, true, tolerance, null, warmed));
    const fresh = new SpectralWork(n, k);
    const viaCholesky = snapshot(spectralModel(ill, n, k, cols, pIll.diag, r, pIll.grad, true, tolerance, null, fresh));
    expect(viaCholesky).toEqual(viaEigen);
    // the smallest squared singular value is ≈ 1e-17 of the largest: far
    // below the eigen-decomposition's resolution, resolved by the SVD
    expect(viaEigen.s2[3] / viaEigen.s2[0]).toBeGreaterThan(1e-19);
    expect(viaEigen.s2[3] / viaEigen.s2[0]).toBeLessThan(1e-15);
    // The next, well-conditioned model starts from the right singular
    // vectors (after the Cholesky test) or from the eigenvectors of the
    // ill-conditioned matrix: both match a cold start.
    const cold = snapshot(spectralModel(well, n, k, cols, pWell.diag, r, pWell.grad, true, tolerance, null, new SpectralWork(n, k)));
    for (const work of [fresh, warmed]) {
      const next = snapshot(spectralModel(well, n, k, cols, pWell.diag, r, pWell.grad, true, tolerance, null, work));
      expect(mismatch(next, cold)).toBeLessThan(1e-13);
    }
  });
});
