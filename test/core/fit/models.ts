/**
 * Small synthetic models for tests (common practice, no source).
 */
import { expect } from 'vitest';
import type { IFitModel } from '../../../src/core/fit/index';

/** Critical power law M = A·sign(1 − T/Tc)·|1 − T/Tc|^β (odd continuation above Tc keeps LM moving). */
export const powerLaw: IFitModel = {
  parameters: ['A', 'Tc', 'beta'],
  evaluate(p, T, out) {
    const [A, Tc, beta] = p;
    for (let i = 0; i < T.length; i++) {
      const t = 1 - T[i] / Tc;
      out[i] = A * Math.sign(t) * Math.pow(Math.abs(t), beta);
    }
  }
};

/** Exponential decay y = a·exp(−b·x) + c with an analytic Jacobian. */
export const decay: IFitModel = {
  parameters: ['a', 'b', 'c'],
  evaluate(p, x, out) {
    for (let i = 0; i < x.length; i++) {
      out[i] = p[0] * Math.exp(-p[1] * x[i]) + p[2];
    }
  },
  jacobian(p, x, out) {
    for (let i = 0; i < x.length; i++) {
      const e = Math.exp(-p[1] * x[i]);
      out[i * 3] = e;
      out[i * 3 + 1] = -p[0] * x[i] * e;
      out[i * 3 + 2] = 1;
    }
  }
};

/** Straight line y = m·x + q. */
export const line: IFitModel = {
  parameters: ['m', 'q'],
  evaluate(p, x, out) {
    for (let i = 0; i < x.length; i++) {
      out[i] = p[0] * x[i] + p[1];
    }
  }
};

/** Evenly spaced values from a to b (n ≥ 2). */
export function linspace(a: number, b: number, n: number): number[] {
  return Array.from({ length: n }, (_, i) => a + ((b - a) * i) / (n - 1));
}

/**
 * Stationarity at a least-squares solution: every column of the Jacobian
 * (row-major n×k) is orthogonal to the residuals, |J_jᵀr| ≤ tol·‖J_j‖‖r‖.
 */
export function expectStationary(jac: ArrayLike<number>, residuals: ArrayLike<number>, n: number, k: number, tol: number): void {
  let r2 = 0;
  for (let i = 0; i < n; i++) {
    r2 += residuals[i] * residuals[i];
  }
  for (let j = 0; j < k; j++) {
    let g = 0;
    let cn = 0;
    for (let i = 0; i < n; i++) {
      g += jac[i * k + j] * residuals[i];
      cn += jac[i * k + j] ** 2;
    }
    expect(Math.abs(g) / (Math.sqrt(cn) * Math.sqrt(r2))).toBeLessThan(tol);
  }
}
