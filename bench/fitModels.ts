/**
 * Models of the synthetic benchmark workloads (/work/shared/bench/README.md):
 * critical power law evaluated as A·sign(1−T/Tc)·|1−T/Tc|^β, and
 * Curie–Weiss χ = C/(T − θ) + χ0; each without and with an analytic Jacobian.
 */
import type { IFitModel } from '../src/core/fit/index';

export const powerLaw: IFitModel = {
  parameters: ['A', 'Tc', 'beta'],
  evaluate(p, T, out) {
    const A = p[0];
    const invTc = 1 / p[1];
    const beta = p[2];
    for (let i = 0; i < T.length; i++) {
      const t = 1 - T[i] * invTc;
      out[i] = t >= 0 ? A * Math.pow(t, beta) : -A * Math.pow(-t, beta);
    }
  }
};

export const powerLawAnalytic: IFitModel = {
  ...powerLaw,
  jacobian(p, T, out) {
    const A = p[0];
    const Tc = p[1];
    const beta = p[2];
    for (let i = 0; i < T.length; i++) {
      const t = 1 - T[i] / Tc;
      const a = Math.abs(t);
      const s = t >= 0 ? 1 : -1;
      const pw = a > 0 ? Math.pow(a, beta) : 0;
      const o = i * 3;
      out[o] = s * pw;
      // d/dTc of |t|^β·sign t = β|t|^(β−1)·T/Tc²
      out[o + 1] = a > 0 ? (A * beta * pw * T[i]) / (a * Tc * Tc) : 0;
      out[o + 2] = a > 0 ? A * s * pw * Math.log(a) : 0;
    }
  }
};

export const curieWeiss: IFitModel = {
  parameters: ['C', 'theta', 'chi0'],
  evaluate(p, T, out) {
    for (let i = 0; i < T.length; i++) {
      out[i] = p[0] / (T[i] - p[1]) + p[2];
    }
  }
};

export const curieWeissAnalytic: IFitModel = {
  ...curieWeiss,
  jacobian(p, T, out) {
    for (let i = 0; i < T.length; i++) {
      const inv = 1 / (T[i] - p[1]);
      const o = i * 3;
      out[o] = inv;
      out[o + 1] = p[0] * inv * inv;
      out[o + 2] = 1;
    }
  }
};
