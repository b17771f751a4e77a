/**
 * Critical power law for the order parameter below Tc (t = (T − Tc)/Tc):
 *   y = A (−t)^(p β) [1 + aW (−t)^Δ] + y0
 * with Tc free, optional constant background y0 and optional Wegner
 * correction (Δ fixed). `proxyPower` p is the power of ψ that the measured
 * quantity follows (intensity ∝ ψ² → p = 2); β itself is reported.
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
  start?: { A?: number; Tc?: number; beta?: number; y0?: number; aW?: number };
  /** Fit a constant background y0 (default false: y0 = 0). */
  background?: boolean;
  /** Include the Wegner term with this Δ (e.g. 0.52 for 3D Ising); omitted = no correction. */
  wegnerDelta?: number;
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

/** Builds the engine model; parameters A, Tc, beta [, y0] [, aW]. */
export function powerLawModel(options: IPowerLawOptions = {}): IFitModel {
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
  if (options.wegnerDelta !== undefined && !(options.wegnerDelta > 0)) {
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
  if (options.wegnerDelta !== undefined) {
    start.push(s.aW ?? 0);
    lower.push(-Infinity);
    upper.push(Infinity);
  }
  const res = fitCurve(model, { x: Float64Array.from(data.T), y: data.y, sigma: data.sigma }, { lower, upper, ...options.engine, start });
  return {
    ...res,
    proxyPower: pw,
    convention: msg('physics.power-law.convention', 'y = A(−t)^(%1·β)·[1 + aW(−t)^Δ] + y0 with t = (T − Tc)/Tc; β is the exponent of the order parameter.', pw)
  };
}
