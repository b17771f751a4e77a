/**
 * Critical power law for the order parameter below Tc (t = (T − Tc)/Tc):
 *   y = A (−t)^(p β) [1 + aW (−t)^Δ] + y0
 * with Tc free, optional constant background y0 and optional Wegner
 * correction (Δ fixed, or fitted as a parameter `Delta`). `proxyPower` p is
 * the power of ψ that the measured quantity follows (intensity ∝ ψ² → p = 2);
 * β itself is reported.
 */
import { fitCurve } from '../../fit/index';
import type { IFitModel, IFitOptions, IFitResult } from '../../fit/index';
import { msg } from '../../messages';
import type { ICoreMessage } from '../../messages';
import { lengthsDiffer, PhysicsInputError, pointNotFinite } from '../errors';
import { PowerLawScratch, powerLawKernel } from './power-law-kernel';
import type { IPowerLawLayout } from './power-law-kernel';

/** Options of a critical power-law fit. */
export interface IPowerLawOptions {
  /** Starting values (estimated when absent). */
  start?: { A?: number; Tc?: number; beta?: number; y0?: number; aW?: number; Delta?: number };
  /** Fit a constant background y0 (default false: y0 = 0). */
  background?: boolean;
  /** Include the Wegner term with this Δ (e.g. 0.52 for 3D Ising); omitted = no correction. */
  wegnerDelta?: number;
  /**
   * Fit Δ as a parameter `Delta` (last), starting from `start.Delta`, else
   * `wegnerDelta`, else 0.5; bounded to [{@link FREE_DELTA_BOUNDS}]. Implies the Wegner term.
   */
  freeDelta?: boolean;
  /** Measured quantity ∝ ψ^proxyPower (default 1). */
  proxyPower?: number;
  /** Value above Tc: 'zero' (physical) or 'signed' (odd continuation, smoother for the optimiser). Default 'zero'. */
  aboveTc?: 'zero' | 'signed';
  /**
   * Allow Tc below the highest temperature in the data (points above Tc then
   * sit on the background). Default false: the data are taken as ordered-phase
   * points and Tc is bounded below by the highest T, which removes the spurious
   * minima with Tc inside the data range.
   */
  allowTcInsideData?: boolean;
  engine?: Partial<IFitOptions>;
}

/** Result of a power-law fit with the convention used. */
export interface IPowerLawResult extends IFitResult {
  /** The model and the reduced temperature, for people (code `physics.power-law.convention`). */
  convention: ICoreMessage;
  proxyPower: number;
}

/**
 * Range allowed to a fitted Δ: Δ = ων is about 0.5 in the 3D classes
 * [B17 in REFERENCES.md]; below 0.05 the term mimics a change of amplitude and above 3 an analytic background.
 */
export const FREE_DELTA_BOUNDS = { lower: 0.05, upper: 3 } as const;

/**
 * The power law with Δ a parameter (last, after aW): the fixed-Δ kernel for
 * the values and the other columns, and ∂y/∂Δ = A·s|u|^(pβ)·aW·|u|^Δ·ln|u|.
 */
function freeDeltaModel(options: IPowerLawOptions): IFitModel {
  const pw = options.proxyPower ?? 1;
  const bg = options.background === true;
  const signed = options.aboveTc === 'signed';
  const params = ['A', 'Tc', 'beta'];
  if (bg) {
    params.push('y0');
  }
  params.push('aW', 'Delta');
  const k = params.length;
  const iW = k - 2;
  const iD = k - 1;
  const scratch = new PowerLawScratch();
  const layoutAt = (p: Float64Array): IPowerLawLayout => ({ proxyPower: pw, signed, wegnerDelta: p[iD], iBg: bg ? 3 : -1, iW, k });
  const deltaColumn = (p: Float64Array, x: Float64Array, jac: Float64Array): void => {
    const [A, Tc, beta] = p;
    for (let i = 0; i < x.length; i++) {
      const u = (Tc - x[i]) / Tc;
      const au = Math.abs(u);
      if (!(u > 0 || (signed && u < 0))) {
        jac[i * k + iD] = 0;
        continue;
      }
      const sp = (u > 0 ? 1 : -1) * Math.pow(au, pw * beta);
      jac[i * k + iD] = A * sp * p[iW] * Math.pow(au, p[iD]) * Math.log(au);
    }
  };
  return {
    parameters: params,
    pointwise: true,
    evaluate(p, x, out) {
      powerLawKernel(layoutAt(p), scratch, p, x, out, null);
    },
    jacobian(p, x, out) {
      powerLawKernel(layoutAt(p), scratch, p, x, new Float64Array(x.length), out);
      deltaColumn(p, x, out);
    },
    evaluateWithJacobian(p, x, out, jac) {
      powerLawKernel(layoutAt(p), scratch, p, x, out, jac);
      deltaColumn(p, x, jac);
    }
  };
}

/** Builds the engine model; parameters A, Tc, beta [, y0] [, aW] [, Delta]. */
export function powerLawModel(options: IPowerLawOptions = {}): IFitModel {
  if (options.freeDelta === true) {
    return freeDeltaModel(options);
  }
  const pw = options.proxyPower ?? 1;
  const bg = options.background === true;
  const wd = options.wegnerDelta;
  const signed = options.aboveTc === 'signed';
  const params = ['A', 'Tc', 'beta'];
  if (bg) {
    params.push('y0');
  }
  if (wd !== undefined) {
    params.push('aW');
  }
  const layout: IPowerLawLayout = {
    proxyPower: pw,
    signed,
    wegnerDelta: wd,
    iBg: bg ? 3 : -1,
    iW: wd !== undefined ? params.length - 1 : -1,
    k: params.length
  };
  const scratch = new PowerLawScratch();
  return {
    parameters: params,
    pointwise: true,
    evaluate(p, x, out) {
      powerLawKernel(layout, scratch, p, x, out, null);
    },
    jacobian(p, x, out) {
      powerLawKernel(layout, scratch, p, x, new Float64Array(x.length), out);
    },
    evaluateWithJacobian(p, x, out, jac) {
      powerLawKernel(layout, scratch, p, x, out, jac);
    }
  };
}

/** Fits the critical power law to (T, y) with Tc free. */
export function fitPowerLaw(
  data: { T: ArrayLike<number>; y: ArrayLike<number>; sigma?: ArrayLike<number> },
  options: IPowerLawOptions = {}
): IPowerLawResult {
  const n = data.T.length;
  if (n !== data.y.length) {
    throw new PhysicsInputError(lengthsDiffer({ T: n, y: data.y.length }));
  }
  const pw = options.proxyPower ?? 1;
  if (!(pw > 0)) {
    throw new PhysicsInputError(
      msg('physics.power-law.proxy-power', 'The power of the order parameter in the measured quantity must be above 0 (1 for ψ itself, 2 for an intensity), but it is %1.', pw)
    );
  }
  if (options.wegnerDelta !== undefined && !(options.wegnerDelta > 0) && options.freeDelta !== true) {
    throw new PhysicsInputError(msg('physics.power-law.wegner-delta', 'The correction exponent Δ must be above 0, but it is %1.', options.wegnerDelta));
  }
  let Tmax = -Infinity;
  let ymax = 0;
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(data.T[i]) || !Number.isFinite(data.y[i])) {
      throw new PhysicsInputError(Number.isFinite(data.T[i]) ? pointNotFinite(i, 'y', data.y[i]) : pointNotFinite(i, 'T', data.T[i]));
    }
    Tmax = Math.max(Tmax, data.T[i]);
    ymax = Math.max(ymax, Math.abs(data.y[i]));
  }
  if (options.freeDelta === true && options.start?.aW === undefined) {
    // With aW = 0 the column of Δ vanishes and the iteration can wander off:
    // fit with Δ held at its start first, then release Δ from there.
    const d0 = options.start?.Delta ?? (options.wegnerDelta !== undefined && options.wegnerDelta > 0 ? options.wegnerDelta : 0.5);
    const held = fitPowerLaw(data, { ...options, freeDelta: false, wegnerDelta: d0 });
    const v = held.values;
    const bg = options.background === true;
    const start = { A: v[0], Tc: v[1], beta: v[2], y0: bg ? v[3] : undefined, aW: v[bg ? 4 : 3], Delta: d0 };
    return fitPowerLaw(data, { ...options, start });
  }
  const model = powerLawModel(options);
  const s = options.start ?? {};
  const start = [s.A ?? ymax, Math.max(s.Tc ?? Tmax * 1.01, options.allowTcInsideData === true ? -Infinity : Tmax * (1 + 1e-9)), s.beta ?? 0.35];
  const TcMin = options.allowTcInsideData === true ? 0 : Tmax * (1 + 1e-12) + 1e-300;
  const lower = [-Infinity, TcMin, 1e-3];
  const upper = [Infinity, Infinity, 5];
  if (options.background === true) {
    start.push(s.y0 ?? 0);
    lower.push(-Infinity);
    upper.push(Infinity);
  }
  if (options.wegnerDelta !== undefined || options.freeDelta === true) {
    start.push(s.aW ?? 0);
    lower.push(-Infinity);
    upper.push(Infinity);
  }
  if (options.freeDelta === true) {
    const d0 = s.Delta ?? (options.wegnerDelta !== undefined && options.wegnerDelta > 0 ? options.wegnerDelta : 0.5);
    start.push(Math.min(FREE_DELTA_BOUNDS.upper, Math.max(FREE_DELTA_BOUNDS.lower, d0)));
    lower.push(FREE_DELTA_BOUNDS.lower);
    upper.push(FREE_DELTA_BOUNDS.upper);
  }
  const res = fitCurve(model, { x: Float64Array.from(data.T), y: data.y, sigma: data.sigma }, { lower, upper, ...options.engine, start });
  return {
    ...res,
    proxyPower: pw,
    convention: msg('physics.power-law.convention', 'y = A(−t)^(%1·β)·[1 + aW(−t)^Δ] + y0 with t = (T − Tc)/Tc; β is the exponent of the order parameter.', pw)
  };
}
