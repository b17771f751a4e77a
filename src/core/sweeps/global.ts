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
import type { IFitOptions, IFitResult } from '../fit/index';
import { equationOfStateModel } from './eos-model';
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

/** Window of the global fit. */
export interface IGlobalWindow {
  tMax: number;
  /** Lowest field used, A/m (default 0: all H > 0). */
  hMin?: number;
}

/** Engine options passed through to the fit (cancel, progress, budget). */
export type IGlobalFitHooks = Pick<IFitOptions, 'shouldStop' | 'onProgress' | 'maxEvaluations'>;

/** The points of the global fit: ln H, T and ln M of every point in the window, with the isotherm each came from. */
export interface IEquationOfStatePoints {
  lnH: Float64Array;
  T: Float64Array;
  lnM: Float64Array;
  /** Index into the isotherms passed of each point's isotherm. */
  isotherm: Int32Array;
}

/** Points with H > 0, M > 0 and H ≥ H_min of the isotherms with |T − Tc|/Tc ≤ t_max, in isotherm order. */
export function equationOfStatePoints(isotherms: readonly IIsotherm[], Tc: number, window: IGlobalWindow): IEquationOfStatePoints {
  const lnH: number[] = [];
  const T: number[] = [];
  const y: number[] = [];
  const which: number[] = [];
  isotherms.forEach((iso, k) => {
    if (!(Math.abs(iso.T - Tc) / Tc <= window.tMax)) {
      return;
    }
    for (let i = 0; i < iso.H.length; i++) {
      if (iso.H[i] > 0 && iso.M[i] > 0 && iso.H[i] >= (window.hMin ?? 0)) {
        lnH.push(Math.log(iso.H[i]));
        T.push(iso.T);
        y.push(Math.log(iso.M[i]));
        which.push(k);
      }
    }
  });
  return { lnH: Float64Array.from(lnH), T: Float64Array.from(T), lnM: Float64Array.from(y), isotherm: Int32Array.from(which) };
}

/** Fits the equation of state to the points of `isotherms` inside the window around start.Tc. */
export function fitEquationOfState(isotherms: readonly IIsotherm[], start: IEquationOfStateStart, window: IGlobalWindow, hooks: IGlobalFitHooks = {}): IGlobalFit {
  const pts = equationOfStatePoints(isotherms, start.Tc, window);
  const y = pts.lnM;
  const n = y.length;
  const nan: IValueSigma = { value: NaN, sigma: NaN };
  const fail = (reason: ICoreMessage): IGlobalFit => ({ Tc: nan, beta: nan, gamma: nan, T1: nan, M1: nan, delta: nan, correlationTcBeta: NaN, n, converged: false, reason, fit: null });
  if (n < 10) {
    return fail(msg('sweeps.global.too-few', 'Too few points in the window (%1) for the global fit: at least 10 are needed.', wholeNumber(n)));
  }
  const x = Float64Array.from({ length: n }, (_v, i) => i);
  const model = equationOfStateModel(pts.lnH, pts.T, y);
  let fit: IFitResult;
  try {
    fit = fitCurve(model, { x, y }, {
      start: [start.Tc, start.beta, start.gamma, start.T1, start.M1],
      lower: [0, 0.02, 0.1, 1e-12, 1e-300],
      upper: [Infinity, 3, 6, Infinity, Infinity],
      ...hooks
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
