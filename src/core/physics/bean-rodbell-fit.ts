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
import { beanRodbellKappa, beanRodbellMagnetisation, beanRodbellTransition } from './bean-rodbell';
import { inverseBrillouin, weissCoupling } from './brillouin';
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

/**
 * Starting values (Ms, T0, η) for {@link fitBeanRodbell} from the ordered
 * branch written as T against M. The self-consistency condition of
 * [B11 in REFERENCES.md] at h = 0 solves for T in closed form:
 *   T = k·T0·(m + κ_J η m³)/B_J⁻¹(m),   m = M/Ms,  k = 3J/(J + 1),
 * smooth in (Ms, T0, η) on both sides of η = 1, whereas M(T) jumps at Tc
 * for η > 1 and the jump's position moves the residuals in steps. Only
 * ordered points (M above `orderedFraction` of the largest |M|) enter;
 * scatter in M is carried into T by effective variance,
 * σ_T = |dT/dM|·σ_M (σ_M from the data's σ, else `sigmaM`), refitted once
 * with the weights of the first fit.
 */
export function beanRodbellStart(
  data: { T: ArrayLike<number>; M: ArrayLike<number>; sigma?: ArrayLike<number> },
  options: { J: number; sigmaM: number; T0: number; orderedFraction?: number; engine?: Partial<IFitOptions> }
): [number, number, number] | null {
  requireSpin(options.J);
  const J = options.J;
  const k = weissCoupling(J);
  const kap = beanRodbellKappa(J);
  let peak = 0;
  for (let i = 0; i < data.M.length; i++) {
    peak = Math.abs(data.M[i]) > Math.abs(peak) ? data.M[i] : peak;
  }
  const sign = peak < 0 ? -1 : 1;
  const frac = options.orderedFraction ?? 0.05;
  const M: number[] = [];
  const T: number[] = [];
  const sM: number[] = [];
  for (let i = 0; i < data.M.length; i++) {
    const m = sign * data.M[i];
    if (m > frac * Math.abs(peak) && Number.isFinite(data.T[i]) && data.T[i] > 0) {
      M.push(m);
      T.push(data.T[i]);
      sM.push(data.sigma ? data.sigma[i] : options.sigmaM);
    }
  }
  if (M.length < 4) {
    return null;
  }
  const Mmax = Math.abs(peak);
  const Tof = (p: ArrayLike<number>, Mi: number): number => {
    const m = Mi / p[0];
    if (!(m > 0 && m < 1)) {
      return NaN;
    }
    return (k * p[1] * (m + kap * p[2] * m * m * m)) / inverseBrillouin(J, m);
  };
  const model: IFitModel = {
    parameters: ['Ms', 'T0', 'eta'],
    evaluate(p, x, out) {
      for (let i = 0; i < x.length; i++) {
        out[i] = Tof(p, M[x[i]]);
      }
    }
  };
  const idx = M.map((_, i) => i);
  let start = [Mmax * 1.05, options.T0, 0.5];
  let sigma: number[] | undefined;
  let best: IFitResult | null = null;
  for (let round = 0; round < 2; round++) {
    const r = fitCurve(model, { x: idx, y: T, sigma }, { lower: [Mmax * (1 + 1e-9), 1e-9, 0], upper: [Infinity, Infinity, 50], ...options.engine, start });
    if (!r.values.every(Number.isFinite)) {
      break;
    }
    best = r;
    start = r.values.slice();
    // effective variance: σ_T = |dT/dM| σ_M with a central difference of relative step 1e-6
    sigma = M.map((Mi, i) => {
      const h = 1e-6 * Mi;
      const d = (Tof(start, Mi + h) - Tof(start, Mi - h)) / (2 * h);
      const s = Math.abs(d) * sM[i];
      return Number.isFinite(s) && s > 0 ? s : Number.NaN;
    });
    if (sigma.some(s => !Number.isFinite(s))) {
      break;
    }
  }
  return best === null ? null : [sign * best.values[0], best.values[1], best.values[2]];
}
