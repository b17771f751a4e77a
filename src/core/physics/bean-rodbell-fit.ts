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
import { brillouinDerivative, inverseBrillouin, weissCoupling } from './brillouin';
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
  const model = beanRodbellFitModel(J);
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
 * The model M(T) = Ms·σ(T/T0; η, J) of {@link fitBeanRodbell} as an engine
 * model: parameters (Ms, T0, eta), x the temperatures; NaN values where
 * T0 ≤ 0 or η < 0. σ is the equilibrium root of
 *   F(σ, τ, η) = σ − B_J(y) = 0,   y = (k/τ)(σ + κ_J η σ³),   τ = T/T0,
 * and its derivatives on that root follow from the implicit function
 * theorem, dσ/dθ = −F_θ/F_σ, with
 *   F_σ = 1 − B_J′(y)(k/τ)(1 + 3κ_J η σ²),
 *   F_τ = B_J′(y)(k/τ²)(σ + κ_J η σ³) = B_J′(y)·y/τ,
 *   F_η = −B_J′(y)(k/τ)κ_J σ³,
 * so ∂M/∂Ms = σ, ∂M/∂T0 = Ms·(dσ/dτ)·(−τ/T0), ∂M/∂η = Ms·dσ/dη.
 * F_σ ≥ 0 on a minimum of G (F_σ is G″ times B_J′/τ), and it vanishes only
 * at a spinodal: there the T0 and η entries are NaN, and the engine
 * differences the model instead. Disordered points (σ = 0) have zero
 * derivatives. At a first-order jump the derivative is that of the branch
 * the equilibrium picks (one-sided). σ is solved once per point for values
 * and Jacobian together, and the last solution is kept for a `jacobian`
 * call at the same (T0, η, x).
 */
export function beanRodbellFitModel(J: number): IFitModel {
  requireSpin(J);
  const k = weissCoupling(J);
  const kap = beanRodbellKappa(J);
  let tau = new Float64Array(0);
  let sigma: Float64Array = new Float64Array(0);
  // (T0, η, x) of the σ held in `sigma`
  let keyT0 = Number.NaN;
  let keyEta = Number.NaN;
  let keyX = new Float64Array(0);
  const sameKey = (p: Float64Array, x: Float64Array): boolean => {
    if (p[1] !== keyT0 || p[2] !== keyEta || x.length !== keyX.length) {
      return false;
    }
    for (let i = 0; i < x.length; i++) {
      if (x[i] !== keyX[i]) {
        return false;
      }
    }
    return true;
  };
  /** σ at every x, or null where the parameters are outside the model (T0 ≤ 0 or η < 0). */
  const solve = (p: Float64Array, x: Float64Array): Float64Array | null => {
    if (!(p[1] > 0) || !(p[2] >= 0)) {
      return null;
    }
    if (sameKey(p, x)) {
      return sigma;
    }
    const n = x.length;
    if (tau.length !== n) {
      tau = new Float64Array(n);
    }
    for (let i = 0; i < n; i++) {
      tau[i] = x[i] / p[1];
    }
    sigma = beanRodbellMagnetisation(J, p[2], tau);
    keyT0 = p[1];
    keyEta = p[2];
    keyX = Float64Array.from(x);
    return sigma;
  };
  const jacobianInto = (p: Float64Array, x: Float64Array, s: Float64Array, jac: Float64Array): void => {
    const Ms = p[0];
    const T0 = p[1];
    const eta = p[2];
    for (let i = 0; i < x.length; i++) {
      const o = 3 * i;
      const si = s[i];
      if (si === 0) {
        jac[o] = 0;
        jac[o + 1] = 0;
        jac[o + 2] = 0;
        continue;
      }
      const t = x[i] / T0;
      const s2 = si * si;
      const y = (k * (si + kap * eta * s2 * si)) / t;
      const bp = brillouinDerivative(J, y);
      const Fs = 1 - (bp * k * (1 + 3 * kap * eta * s2)) / t;
      jac[o] = si;
      if (Fs !== 0 && Number.isFinite(Fs)) {
        const dsdtau = -(bp * y) / t / Fs;
        const dsdeta = (bp * k * kap * s2 * si) / t / Fs;
        jac[o + 1] = Ms * dsdtau * (-t / T0);
        jac[o + 2] = Ms * dsdeta;
      } else {
        jac[o + 1] = Number.NaN;
        jac[o + 2] = Number.NaN;
      }
    }
  };
  return {
    parameters: ['Ms', 'T0', 'eta'],
    evaluate(p, x, out) {
      const s = solve(p, x);
      if (s === null) {
        out.fill(NaN);
        return;
      }
      for (let i = 0; i < x.length; i++) {
        out[i] = p[0] * s[i];
      }
    },
    jacobian(p, x, out) {
      const s = solve(p, x);
      if (s === null) {
        out.fill(NaN, 0, 3 * x.length);
        return;
      }
      jacobianInto(p, x, s, out);
    },
    evaluateWithJacobian(p, x, out, jac) {
      const s = solve(p, x);
      if (s === null) {
        out.fill(NaN);
        jac.fill(NaN, 0, 3 * x.length);
        return;
      }
      for (let i = 0; i < x.length; i++) {
        out[i] = p[0] * s[i];
      }
      jacobianInto(p, x, s, jac);
    }
  };
}

/**
 * T on the ordered branch at M for parameters p = (Ms, T0, η):
 * k·T0·(m + κ_J η m³)/B_J⁻¹(m), m = M/Ms; NaN unless 0 < m < 1.
 */
function orderedT(J: number, k: number, kap: number, p: ArrayLike<number>, Mi: number): number {
  const m = Mi / p[0];
  if (!(m > 0 && m < 1)) {
    return NaN;
  }
  return (k * p[1] * (m + kap * p[2] * m * m * m)) / inverseBrillouin(J, m);
}

/**
 * The model T(M) of {@link beanRodbellStart} as an engine model: parameters
 * (Ms, T0, eta), x the indices of the points in `M`. With m = M/Ms,
 * N = m + κ_J η m³ and D = B_J⁻¹(m) (so dD/dm = 1/B_J′(D)), T = k·T0·N/D
 * differentiates in closed form:
 *   ∂T/∂T0 = k·N/D,   ∂T/∂η = k·T0·κ_J m³/D,
 *   ∂T/∂m = k·T0·((1 + 3κ_J η m²)/D − N/(D²·B_J′(D))),   ∂T/∂Ms = ∂T/∂m·(−m/Ms).
 * Points with m outside (0, 1) have NaN values and derivatives.
 */
export function beanRodbellStartModel(J: number, M: ArrayLike<number>): IFitModel {
  requireSpin(J);
  const k = weissCoupling(J);
  const kap = beanRodbellKappa(J);
  const pass = (p: Float64Array, x: Float64Array, out: Float64Array | null, jac: Float64Array | null): void => {
    const Ms = p[0];
    const T0 = p[1];
    const eta = p[2];
    for (let i = 0; i < x.length; i++) {
      const m = M[x[i]] / Ms;
      const o = 3 * i;
      if (!(m > 0 && m < 1)) {
        if (out !== null) {
          out[i] = NaN;
        }
        if (jac !== null) {
          jac[o] = NaN;
          jac[o + 1] = NaN;
          jac[o + 2] = NaN;
        }
        continue;
      }
      // the value as `orderedT` writes it, sharing D = B_J⁻¹(m) with the derivatives
      const D = inverseBrillouin(J, m);
      const N = m + kap * eta * m * m * m;
      if (out !== null) {
        out[i] = (k * T0 * N) / D;
      }
      if (jac !== null) {
        const m2 = m * m;
        const dTdm = k * T0 * ((1 + 3 * kap * eta * m2) / D - N / (D * D * brillouinDerivative(J, D)));
        jac[o] = dTdm * (-m / Ms);
        jac[o + 1] = (k * N) / D;
        jac[o + 2] = (k * T0 * kap * m2 * m) / D;
      }
    }
  };
  return {
    parameters: ['Ms', 'T0', 'eta'],
    evaluate(p, x, out) {
      pass(p, x, out, null);
    },
    jacobian(p, x, out) {
      pass(p, x, null, out);
    },
    evaluateWithJacobian(p, x, out, jac) {
      pass(p, x, out, jac);
    }
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
  const Tof = (p: ArrayLike<number>, Mi: number): number => orderedT(J, k, kap, p, Mi);
  const model = beanRodbellStartModel(J, M);
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
