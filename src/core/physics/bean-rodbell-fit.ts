/**
 * Fit of the Bean–Rodbell model to M(T) at zero field: M = Ms σ(T/T0; η, J)
 * with σ the equilibrium (global minimum of G) of [B11 in REFERENCES.md]. Parameters
 * Ms, T0, eta (J fixed). For η > 1 the transition is first order and the
 * reported Tc = T0 · τc(η) is derived from the fitted values.
 */
import { fitCurve } from '../fit/index';
import type { IFitModel, IFitOptions, IFitResult } from '../fit/index';
import { msg } from '../messages';
import type { ICoreMessage } from '../messages';
import { beanRodbellMagnetisation, beanRodbellTransition } from './bean-rodbell';
import { lengthsDiffer, PhysicsInputError, pointNotFinite, requireSpin, temperatureNotPositive, tooFewPoints } from './errors';

/** Result of a Bean–Rodbell fit. */
export interface IBeanRodbellFitResult extends IFitResult {
  /** The model and its variables, for people (code `physics.bean-rodbell.convention`). */
  convention: ICoreMessage;
  J: number;
  /** Transition temperature implied by the fitted (T0, η): T0 for η ≤ 1, T0 τc(η) above. */
  Tc: number;
  firstOrder: boolean;
}

/**
 * Fits (Ms, T0, eta) to zero-field M(T). `fixEta` holds η at its start value
 * (η = 0 reproduces the Weiss model).
 */
export function fitBeanRodbell(
  data: { T: ArrayLike<number>; M: ArrayLike<number>; sigma?: ArrayLike<number> },
  options: { J: number; start: [number, number, number]; fixEta?: boolean; engine?: Partial<IFitOptions> }
): IBeanRodbellFitResult {
  requireSpin(options.J);
  const n = data.T.length;
  if (n !== data.M.length || (data.sigma !== undefined && data.sigma.length !== n)) {
    throw new PhysicsInputError(lengthsDiffer(data.sigma !== undefined ? { T: n, M: data.M.length, sigma: data.sigma.length } : { T: n, M: data.M.length }));
  }
  if (n < 4) {
    throw new PhysicsInputError(tooFewPoints(4, n));
  }
  for (let i = 0; i < n; i++) {
    if (!(data.T[i] > 0) || !Number.isFinite(data.T[i])) {
      throw new PhysicsInputError(temperatureNotPositive(i, data.T[i]));
    }
    if (!Number.isFinite(data.M[i])) {
      throw new PhysicsInputError(pointNotFinite(i, 'M', data.M[i]));
    }
  }
  const J = options.J;
  const model: IFitModel = {
    parameters: ['Ms', 'T0', 'eta'],
    evaluate(p, x, out) {
      const tau = Float64Array.from(x, t => t / p[1]);
      if (!(p[1] > 0) || !(p[2] >= 0)) {
        out.fill(NaN);
        return;
      }
      const s = beanRodbellMagnetisation(J, p[2], tau);
      for (let i = 0; i < x.length; i++) {
        out[i] = p[0] * s[i];
      }
    }
  };
  const res = fitCurve(
    model,
    { x: Float64Array.from(data.T), y: data.M, sigma: data.sigma },
    {
      lower: [-Infinity, 1e-9, 0],
      upper: [Infinity, Infinity, 50],
      fixed: [false, false, options.fixEta === true],
      ftol: 1e-10,
      xtol: 1e-10,
      ...options.engine,
      start: options.start
    }
  );
  const tr = beanRodbellTransition(J, res.values[2]);
  return {
    ...res,
    convention: msg('physics.bean-rodbell.convention', 'Bean–Rodbell model: M = Ms·σ(T/T0) with σ = B_J((3J/(J + 1))(T0/T)(σ + κ_J·η·σ³)).'),
    J,
    Tc: res.values[1] * tr.tauC,
    firstOrder: tr.firstOrder
  };
}
