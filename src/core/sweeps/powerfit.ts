/**
 * Critical power laws with Tc free, fitted by the Levenberg–Marquardt engine
 * on the untransformed values (no log–log regression):
 *   below Tc: Ms = M0 (−t)^β        above Tc: 1/χ0 = G t^γ,   t = (T − Tc)/Tc.
 * Tc is bounded to lie above (below) every temperature used.
 */
import { messageOf, msg } from '../messages';
import type { ICoreMessage } from '../messages';
import { fitCurve } from '../fit/index';
import type { IFitModel, IFitResult } from '../fit/index';
import type { IValueSigma } from './types';

/** Result of one power-law fit. */
export interface IPowerFit {
  amplitude: IValueSigma;
  Tc: IValueSigma;
  exponent: IValueSigma;
  /** Correlation coefficient of Tc and the exponent. */
  correlationTcExponent: number;
  n: number;
  converged: boolean;
  /** Why the fit stopped (the engine's `fit.stop.*`), or why there is none. */
  reason: ICoreMessage;
  fit: IFitResult | null;
}

function model(side: 'below' | 'above'): IFitModel {
  const s = side === 'below' ? -1 : 1;
  return {
    parameters: ['A', 'Tc', 'e'],
    evaluate(p, x, out) {
      for (let i = 0; i < x.length; i++) {
        const u = (s * (x[i] - p[1])) / p[1];
        out[i] = u > 0 ? p[0] * Math.pow(u, p[2]) : 0;
      }
    },
    jacobian(p, x, out) {
      for (let i = 0; i < x.length; i++) {
        const u = (s * (x[i] - p[1])) / p[1];
        if (!(u > 0)) {
          out[3 * i] = 0;
          out[3 * i + 1] = 0;
          out[3 * i + 2] = 0;
          continue;
        }
        const pw = Math.pow(u, p[2]);
        out[3 * i] = pw;
        // du/dTc = −s·x/Tc²
        out[3 * i + 1] = p[0] * p[2] * Math.pow(u, p[2] - 1) * ((-s * x[i]) / (p[1] * p[1]));
        out[3 * i + 2] = p[0] * pw * Math.log(u);
      }
    }
  };
}

const failed = (n: number, reason: ICoreMessage): IPowerFit => ({
  amplitude: { value: NaN, sigma: NaN },
  Tc: { value: NaN, sigma: NaN },
  exponent: { value: NaN, sigma: NaN },
  correlationTcExponent: NaN,
  n,
  converged: false,
  reason,
  fit: null
});

/** Fits y = A |t|^e on one side of Tc; `start` gives Tc and e. */
export function fitCriticalPower(
  T: readonly number[],
  y: readonly number[],
  side: 'below' | 'above',
  start: { Tc: number; exponent: number },
  sigma?: readonly number[]
): IPowerFit {
  const n = T.length;
  if (n < 4) {
    return failed(n, msg('sweeps.power-fit.too-few', 'Too few points (%1) for a power law: at least 4 are needed for the amplitude, Tc and the exponent.', n));
  }
  let tMax = -Infinity;
  let tMin = Infinity;
  for (const t of T) {
    tMax = Math.max(tMax, t);
    tMin = Math.min(tMin, t);
  }
  const span = Math.max(tMax - tMin, 1e-9 * Math.abs(tMax));
  let Tc0 = start.Tc;
  if (side === 'below' && !(Tc0 > tMax)) {
    Tc0 = tMax + 0.05 * span;
  }
  if (side === 'above' && !(Tc0 < tMin)) {
    Tc0 = tMin - 0.05 * span;
  }
  // amplitude from the point farthest from Tc
  const far = side === 'below' ? T.indexOf(tMin) : T.indexOf(tMax);
  const u = Math.abs(T[far] - Tc0) / Tc0;
  const A0 = y[far] / Math.pow(u, start.exponent);
  // Tc may lie inside the data (points beyond it are modelled as 0) but not beyond the far end
  const lower = side === 'below' ? [-Infinity, tMin + 1e-6 * span, 0.01] : [-Infinity, 1e-12, 0.05];
  const upper = side === 'below' ? [Infinity, Infinity, 5] : [Infinity, tMax - 1e-6 * span, 10];
  const clamp = (v: number, j: number): number => {
    let r = v;
    if (Number.isFinite(lower[j])) {
      r = Math.max(r, lower[j] + 1e-9 * Math.abs(lower[j]));
    }
    if (Number.isFinite(upper[j])) {
      r = Math.min(r, upper[j] - 1e-9 * Math.abs(upper[j]));
    }
    return r;
  };
  const s0 = [Number.isFinite(A0) ? A0 : y[far], clamp(Tc0, 1), clamp(start.exponent, 2)];
  let fit: IFitResult;
  try {
    const useSigma = sigma !== undefined && sigma.length === n && sigma.every(v => v > 0 && Number.isFinite(v));
    fit = fitCurve(model(side), useSigma ? { x: T, y, sigma } : { x: T, y }, { start: s0, lower, upper });
  } catch (e) {
    return failed(n, messageOf(e));
  }
  // with per-point σ, errors are scaled up by √χ²_red when the scatter exceeds σ
  const scale = fit.errorScaling === 'from-sigma' ? Math.sqrt(Math.max(1, fit.reducedChi2)) : 1;
  const se = fit.standardErrors.map(v => v * scale);
  return {
    amplitude: { value: fit.values[0], sigma: se[0] },
    Tc: { value: fit.values[1], sigma: se[1] },
    exponent: { value: fit.values[2], sigma: se[2] },
    correlationTcExponent: fit.correlation[1]?.[2] ?? NaN,
    n,
    converged: fit.converged,
    reason: fit.reason,
    fit
  };
}
