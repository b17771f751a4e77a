/**
 * One global nonlinear fit of every M(H, T) point in a window
 * (|t| ≤ t_max, H ≥ H_min) to the Arrott–Noakes equation of state
 * [B6 in REFERENCES.md]:  (H/M)^(1/γ) = (T − Tc)/T1 + (M/M1)^(1/β),
 * with (Tc, β, γ, T1, M1) free. The model predicts ln M at each (H, T) by
 * solving the equation (unique root: the residual is strictly decreasing in
 * ln M); the Jacobian follows from the implicit-function theorem.
 */
import { messageOf, msg } from '../messages';
import type { ICoreMessage } from '../messages';
import { wholeNumber } from '../numeric/messageArgs';
import { fitCurve } from '../fit/index';
import type { IFitModel, IFitResult } from '../fit/index';
import type { IIsotherm, IValueSigma } from './types';

/** Starting values of the global fit. */
export interface IEquationOfStateStart {
  Tc: number;
  beta: number;
  gamma: number;
  T1: number;
  M1: number;
}

/** Result of the global equation-of-state fit. */
export interface IGlobalFit {
  Tc: IValueSigma;
  beta: IValueSigma;
  gamma: IValueSigma;
  T1: IValueSigma;
  M1: IValueSigma;
  /** δ = 1 + γ/β with σ from the covariance of β and γ. */
  delta: IValueSigma;
  correlationTcBeta: number;
  n: number;
  converged: boolean;
  /** Why the fit stopped (the engine's `fit.stop.*`), or why there is none. */
  reason: ICoreMessage;
  fit: IFitResult | null;
}

/** ln M solving F(u) = A e^{−u/γ} − c − e^{(u − ln M1)/β} = 0, A = H^{1/γ}, c = (T − Tc)/T1. */
export function solveEquationOfState(lnH: number, c: number, lnM1: number, beta: number, gamma: number, guess: number): number {
  const F = (u: number): number => Math.exp((lnH - u) / gamma) - c - Math.exp((u - lnM1) / beta);
  let lo = guess - 1;
  let hi = guess + 1;
  let flo = F(lo);
  let fhi = F(hi);
  for (let k = 0; k < 60 && !(flo > 0); k++) {
    hi = lo;
    fhi = flo;
    lo -= 2 ** (k + 1);
    flo = F(lo);
  }
  for (let k = 0; k < 60 && !(fhi < 0); k++) {
    lo = hi;
    flo = fhi;
    hi += 2 ** (k + 1);
    fhi = F(hi);
  }
  if (!(flo > 0 && fhi < 0)) {
    return NaN;
  }
  let u = Math.min(Math.max(guess, lo), hi);
  for (let it = 0; it < 100; it++) {
    const a = Math.exp((lnH - u) / gamma);
    const b = Math.exp((u - lnM1) / beta);
    const f = a - c - b;
    if (f > 0) {
      lo = u;
    } else if (f < 0) {
      hi = u;
    } else {
      return u;
    }
    const df = -a / gamma - b / beta;
    let next = u - f / df;
    if (!(next > lo && next < hi)) {
      next = 0.5 * (lo + hi);
    }
    if (Math.abs(next - u) <= 1e-14 * Math.max(1, Math.abs(u))) {
      return next;
    }
    u = next;
  }
  return u;
}

function eosModel(lnH: Float64Array, T: Float64Array, guess: Float64Array): IFitModel {
  const solve = (p: Float64Array, i: number): number =>
    solveEquationOfState(lnH[i], (T[i] - p[0]) / p[3], Math.log(p[4]), p[1], p[2], guess[i]);
  return {
    parameters: ['Tc', 'beta', 'gamma', 'T1', 'M1'],
    evaluate(p, x, out) {
      for (let k = 0; k < x.length; k++) {
        out[k] = solve(p, x[k]);
      }
    },
    jacobian(p, x, out) {
      const [Tc, beta, gamma, T1, M1] = p;
      const lnM1 = Math.log(M1);
      for (let k = 0; k < x.length; k++) {
        const i = x[k];
        const u = solve(p, i);
        const a = Math.exp((lnH[i] - u) / gamma);
        const b = Math.exp((u - lnM1) / beta);
        const Fu = -a / gamma - b / beta;
        const Fp = [
          1 / T1,
          (b * (u - lnM1)) / (beta * beta),
          (-a * (lnH[i] - u)) / (gamma * gamma),
          (T[i] - Tc) / (T1 * T1),
          b / (beta * M1)
        ];
        for (let j = 0; j < 5; j++) {
          out[5 * k + j] = -Fp[j] / Fu;
        }
      }
    }
  };
}

/** Window of the global fit. */
export interface IGlobalWindow {
  tMax: number;
  /** Lowest field used, A/m (default 0: all H > 0). */
  hMin?: number;
}

/** Fits the equation of state to the points of `isotherms` inside the window around start.Tc. */
export function fitEquationOfState(isotherms: readonly IIsotherm[], start: IEquationOfStateStart, window: IGlobalWindow): IGlobalFit {
  const lnH: number[] = [];
  const T: number[] = [];
  const y: number[] = [];
  for (const iso of isotherms) {
    if (Math.abs(iso.T - start.Tc) / start.Tc > window.tMax) {
      continue;
    }
    for (let i = 0; i < iso.H.length; i++) {
      if (iso.H[i] > 0 && iso.M[i] > 0 && iso.H[i] >= (window.hMin ?? 0)) {
        lnH.push(Math.log(iso.H[i]));
        T.push(iso.T);
        y.push(Math.log(iso.M[i]));
      }
    }
  }
  const n = y.length;
  const nan: IValueSigma = { value: NaN, sigma: NaN };
  const fail = (reason: ICoreMessage): IGlobalFit => ({ Tc: nan, beta: nan, gamma: nan, T1: nan, M1: nan, delta: nan, correlationTcBeta: NaN, n, converged: false, reason, fit: null });
  if (n < 10) {
    return fail(msg('sweeps.global.too-few', 'Too few points in the window (%1) for the global fit: at least 10 are needed.', wholeNumber(n)));
  }
  const x = Float64Array.from({ length: n }, (_v, i) => i);
  const model = eosModel(Float64Array.from(lnH), Float64Array.from(T), Float64Array.from(y));
  let fit: IFitResult;
  try {
    fit = fitCurve(model, { x, y }, {
      start: [start.Tc, start.beta, start.gamma, start.T1, start.M1],
      lower: [0, 0.02, 0.1, 1e-12, 1e-300],
      upper: [Infinity, 3, 6, Infinity, Infinity]
    });
  } catch (e) {
    return fail(messageOf(e));
  }
  const v = fit.values;
  const se = fit.standardErrors;
  const c = fit.covariance;
  const dB = -v[2] / (v[1] * v[1]);
  const dG = 1 / v[1];
  const varDelta = dB * dB * c[1][1] + dG * dG * c[2][2] + 2 * dB * dG * c[1][2];
  return {
    Tc: { value: v[0], sigma: se[0] },
    beta: { value: v[1], sigma: se[1] },
    gamma: { value: v[2], sigma: se[2] },
    T1: { value: v[3], sigma: se[3] },
    M1: { value: v[4], sigma: se[4] },
    delta: { value: 1 + v[2] / v[1], sigma: Math.sqrt(Math.max(0, varDelta)) },
    correlationTcBeta: fit.correlation[0][1],
    n,
    converged: fit.converged,
    reason: fit.reason,
    fit
  };
}
