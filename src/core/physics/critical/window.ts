/**
 * Effective exponent against the fit window: repeats the power-law fit on
 * every window t_min ≤ |t| ≤ t_max of a grid (|t| from a reference Tc, with
 * Tc free inside each fit), and the closed-form Wegner effective exponent
 * β_eff(t) = β + aM Δ|t|^Δ/(1 + aM|t|^Δ) [B17 in REFERENCES.md].
 */
import { msg } from '../../messages';
import type { ICoreMessage } from '../../messages';
import { lengthsDiffer, PhysicsInputError } from '../errors';
import type { IPowerLawOptions, IPowerLawResult } from './power-law';
import { fitPowerLaw } from './power-law';

/** β_eff(|t|) of Ms = M0(−t)^β [1 + aM(−t)^Δ]. */
export function wegnerEffectiveBeta(beta: number, delta: number, aM: number, absT: number): number {
  const q = aM * Math.pow(absT, delta);
  return beta + (delta * q) / (1 + q);
}

/** One cell of the window grid. */
export interface IWindowCell {
  tMin: number;
  tMax: number;
  /** Number of points in the window. */
  n: number;
  beta: number;
  betaError: number;
  Tc: number;
  TcError: number;
  converged: boolean;
  /** Why this window's fit stopped (codes `fit.stop.*`), or why there is none (`physics.window.too-few-points`). */
  reason: ICoreMessage;
}

/** β_eff against window, with the reference Tc that defined |t|. */
export interface IWindowScan {
  referenceTc: number;
  cells: IWindowCell[];
  /** How |t| was defined, for people (code `physics.window.convention`). */
  convention: ICoreMessage;
}

/**
 * Fits every window of the (tMins × tMaxs) grid with tMin < tMax. Windows
 * with fewer than `minPoints` points are reported with NaN and reason code
 * 'physics.window.too-few-points'. `referenceTc` defaults to Tc of a fit over all points.
 */
export function effectiveExponentScan(
  data: { T: ArrayLike<number>; y: ArrayLike<number>; sigma?: ArrayLike<number> },
  tMins: readonly number[],
  tMaxs: readonly number[],
  options: IPowerLawOptions & { referenceTc?: number; minPoints?: number } = {}
): IWindowScan {
  if (data.T.length !== data.y.length) {
    throw new PhysicsInputError(lengthsDiffer({ T: data.T.length, y: data.y.length }));
  }
  const minPoints = options.minPoints ?? 6;
  let Tc0 = options.referenceTc;
  let global: IPowerLawResult | null = null;
  if (Tc0 === undefined) {
    global = fitPowerLaw(data, options);
    Tc0 = global.values[1];
  }
  const cells: IWindowCell[] = [];
  for (const tMin of tMins) {
    for (const tMax of tMaxs) {
      if (!(tMax > tMin)) {
        continue;
      }
      const T: number[] = [];
      const y: number[] = [];
      const s: number[] = [];
      for (let i = 0; i < data.T.length; i++) {
        const at = (Tc0 - data.T[i]) / Tc0;
        if (at >= tMin && at <= tMax) {
          T.push(data.T[i]);
          y.push(data.y[i]);
          if (data.sigma) {
            s.push(data.sigma[i]);
          }
        }
      }
      if (T.length < minPoints) {
        cells.push({ tMin, tMax, n: T.length, beta: NaN, betaError: NaN, Tc: NaN, TcError: NaN, converged: false, reason: msg('physics.window.too-few-points', 'This window holds %1 points, fewer than the %2 a fit needs here.', T.length, minPoints) });
        continue;
      }
      const start = { ...(options.start ?? {}), Tc: Tc0, beta: global?.values[2] ?? options.start?.beta, A: global?.values[0] ?? options.start?.A };
      const r = fitPowerLaw({ T, y, sigma: data.sigma ? s : undefined }, { ...options, start });
      cells.push({
        tMin,
        tMax,
        n: T.length,
        beta: r.values[2],
        betaError: r.standardErrors[2],
        Tc: r.values[1],
        TcError: r.standardErrors[1],
        converged: r.converged,
        reason: r.reason
      });
    }
  }
  return {
    referenceTc: Tc0,
    cells,
    convention: msg('physics.window.convention', 't = (T − Tc)/Tc with Tc from the fit over all points; Tc is free in the fit of each window.')
  };
}
