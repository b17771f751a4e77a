/**
 * Fits of the Weiss mean-field model to M(T) (Ms, Tc, optionally J) and to
 * M(B, T) isotherms (Ms, Tc, moment), built on the shared least-squares
 * engine. The M(T) model has an analytic Jacobian from implicit
 * differentiation of m = B_J((k m + h)/τ):
 *   ∂m/∂τ = −B′ x /(τ − k B′),   ∂m/∂h = B′/(τ − k B′),
 * and in u = 1/J when the spin is free (`inverseSpinSlope`).
 */
import { fitCurve } from '../fit/index';
import type { IFitModel, IFitOptions, IFitResult } from '../fit/index';
import { msg } from '../messages';
import type { ICoreMessage } from '../messages';
import { wholeNumber } from '../numeric/messageArgs';
import { PHYS } from '../units/constants';
import { brillouinCoupledInverseSpinDerivative, brillouinInverseSpinDerivative, brillouinTangentIntercept } from './brillouin';
import { lengthsDiffer, PhysicsInputError, pointNotFinite, requireSpin, temperatureNotPositive, tooFewPoints } from './errors';
import { solveWeiss } from './weiss';

/** Convention stored with every Weiss fit (code `physics.weiss.convention`). */
export const WEISS_CONVENTION: ICoreMessage = Object.freeze(
  msg(
    'physics.weiss.convention',
    'Weiss mean field: M = Ms·B_J(x) with x = (3J/(J + 1)·m + h)/τ, τ = T/Tc, h = μ·μB·B/(kB·Tc) and μ = g·J in Bohr magnetons.'
  )
);

/**
 * Stopping tolerances of the Weiss fits (override through `engine`): the
 * MINPACK / SciPy default values. The model has a kink at Tc
 * (m ∝ √(Tc − T)) and a large curvature just below it, so Gauss–Newton
 * converges only linearly at the end; on the 1e4-point benchmark data,
 * tightening to 1e-15 moves Tc by 2e-5 K against σ_Tc = 7e-3 K.
 */
export const WEISS_TOLERANCES = { ftol: 1e-8, xtol: 1e-8 } as const;

/** Result of a Weiss fit: the engine result plus the model description. */
export interface IWeissFitResult extends IFitResult {
  /** The model, for people (code `physics.weiss.convention`). */
  convention: ICoreMessage;
  /** Spin used (the fitted value when J was free). */
  J: number;
  jFitted: boolean;
}

/** Options of `fitWeissMT`. */
export interface IWeissMTOptions {
  /** Spin J (½, 1, …, Infinity); the start value when `fitJ` is true. */
  J: number;
  /** Fit J as a continuous effective parameter (bounded to [0.5, 50]). */
  fitJ?: boolean;
  /**
   * Fit J through u = 1/J in [0, 2] instead (parameter '1/J'): J ≥ ½, and
   * u = 0 is the classical (Langevin) limit J = ∞ itself, so that limit is
   * reachable. Overrides `fitJ`; `J` is the start (∞ starts at u = 0.1).
   */
  fitInverseJ?: boolean;
  /** Constant applied field μ0H in tesla (default 0). */
  fieldTesla?: number;
  /** Moment g·J in Bohr magnetons, needed when `fieldTesla` ≠ 0. */
  momentBohr?: number;
  /** Starting values [Ms, Tc] (estimated from the data when absent). */
  start?: [number, number];
  /**
   * Above this many points, first fit about `coarsePoints` block means of the
   * T-sorted data and start the full fit from that solution
   * (default 2000; `Infinity` disables the coarse stage).
   */
  coarseAbove?: number;
  /** Number of block means in the coarse stage (default 400). */
  coarsePoints?: number;
  /** Extra engine options (bounds, callbacks, confidence level …). */
  engine?: Partial<IFitOptions>;
}

function checkColumns(T: ArrayLike<number>, y: ArrayLike<number>, sigma?: ArrayLike<number>): void {
  if (T.length !== y.length || (sigma !== undefined && sigma.length !== T.length)) {
    throw new PhysicsInputError(lengthsDiffer(sigma !== undefined ? { T: T.length, M: y.length, sigma: sigma.length } : { T: T.length, M: y.length }));
  }
  if (T.length < 3) {
    throw new PhysicsInputError(tooFewPoints(3, T.length));
  }
  for (let i = 0; i < T.length; i++) {
    if (!(T[i] > 0) || !Number.isFinite(T[i])) {
      throw new PhysicsInputError(temperatureNotPositive(i, T[i]));
    }
    if (!Number.isFinite(y[i])) {
      throw new PhysicsInputError(pointNotFinite(i, 'M', y[i]));
    }
  }
}

/** Rough start values: Ms from the largest |M|, Tc where M falls below 10 % of it. */
export function estimateWeissStart(T: ArrayLike<number>, M: ArrayLike<number>): [number, number] {
  let Mmax = 0;
  for (let i = 0; i < M.length; i++) {
    Mmax = Math.max(Mmax, Math.abs(M[i]));
  }
  let Tc = 0;
  for (let i = 0; i < T.length; i++) {
    if (Math.abs(M[i]) > 0.1 * Mmax) {
      Tc = Math.max(Tc, T[i]);
    }
  }
  return [Mmax * 1.05, Tc * 1.02];
}

/** Means of consecutive blocks of T-sorted points (σ of a mean: √Σσ²/k). */
function coarseBlocks(
  T: ArrayLike<number>,
  M: ArrayLike<number>,
  sigma: ArrayLike<number> | undefined,
  blocks: number
): { T: Float64Array; M: Float64Array; sigma?: Float64Array } {
  const n = T.length;
  const order = Array.from({ length: n }, (_, i) => i).sort((a, b) => T[a] - T[b]);
  const size = Math.max(1, Math.floor(n / Math.max(1, blocks)));
  const count = Math.ceil(n / size);
  const bT = new Float64Array(count);
  const bM = new Float64Array(count);
  const bS = sigma ? new Float64Array(count) : undefined;
  for (let b = 0; b < count; b++) {
    const lo = b * size;
    const hi = Math.min(n, lo + size);
    let st = 0;
    let sm = 0;
    let ss = 0;
    for (let j = lo; j < hi; j++) {
      const i = order[j];
      st += T[i];
      sm += M[i];
      if (sigma) {
        ss += sigma[i] * sigma[i];
      }
    }
    const k = hi - lo;
    bT[b] = st / k;
    bM[b] = sm / k;
    if (bS) {
      bS[b] = Math.sqrt(ss) / k;
    }
  }
  return { T: bT, M: bM, sigma: bS };
}

/** Spin from the fitted u = 1/J (u = 0: the classical limit J = ∞). */
export function spinFromInverse(u: number): number {
  return u > 0 ? 1 / u : Infinity;
}

/**
 * ∂m/∂u (u = 1/J) of the Weiss solution m = B(x; u), x = (k m + h)/τ,
 * k = 3/(1 + u), at fixed τ and h. Implicit function theorem on
 * F(m, u) = m − B(x; u): ∂m/∂u = −F_u/F_m = (τ ∂B/∂u + B′ k′ m)/(τ − k B′),
 * k′ = −3/(1 + u)². With τ = (k m + h)/x and m = B this becomes
 *   ∂m/∂u = (k m N + h ∂B/∂u)/(k Q + h),  N = ∂B/∂u − x B′/(1 + u),  Q = B − x B′,
 * (m N/Q at h = 0): near Tc both terms of the numerator and of the
 * denominator above cancel to O(m³), while N and Q (brillouin.ts) come
 * from their Taylor series there. m = 0 at h = 0 (τ ≥ 1, also τ = 1 where
 * F_m = 0) gives 0, as ∂m/∂τ does; a denominator ≤ 0 gives NaN.
 */
function inverseSpinSlope(u: number, k: number, m: number, tau: number, h: number): number {
  if (m === 0 && h === 0) {
    return 0;
  }
  const s = h < 0 ? -1 : 1;
  const ma = s * m;
  const ha = s * h;
  const x = (k * ma + ha) / tau;
  const N = brillouinCoupledInverseSpinDerivative(u, x);
  const den = k * brillouinTangentIntercept(u, x) + ha;
  const num = ha === 0 ? k * ma * N : k * ma * N + ha * brillouinInverseSpinDerivative(u, x);
  return den > 0 ? (s * num) / den : NaN;
}

/**
 * The M(T) model as an engine model: parameters Ms, Tc, and J when `fitJ` is
 * true, or u = 1/J (named '1/J') when `fitJ` is 'inverse'.
 */
export function weissMTModel(J: number, fitJ: boolean | 'inverse', fieldTesla = 0, momentBohr = 0): IFitModel {
  const inverse = fitJ === 'inverse';
  const spinOf = (p: Float64Array): number => (inverse ? spinFromInverse(p[2]) : fitJ ? p[2] : J);
  const hNumerator = (momentBohr * PHYS.muB * fieldTesla) / PHYS.kB; // h = hNumerator / Tc
  let tau = new Float64Array(0);
  // The engine asks for the Jacobian at the point it has just evaluated:
  // keep the last solution (with its implicit derivatives) and reuse it.
  let cacheP: Float64Array | null = null;
  let cacheX: Float64Array | null = null;
  let cacheS: ReturnType<typeof solveWeiss> | null = null;
  const reduced = (p: Float64Array, x: Float64Array): ReturnType<typeof solveWeiss> => {
    if (cacheS !== null && cacheX === x && cacheP !== null && cacheP.every((v, j) => v === p[j])) {
      return cacheS;
    }
    const Tc = p[1];
    const n = x.length;
    if (tau.length !== n) {
      tau = new Float64Array(n);
    }
    for (let i = 0; i < n; i++) {
      tau[i] = x[i] / Tc;
    }
    const s = solveWeiss(spinOf(p), tau, hNumerator / Tc);
    cacheP = Float64Array.from(p);
    cacheX = x;
    cacheS = s;
    return s;
  };
  const params = inverse ? ['Ms', 'Tc', '1/J'] : fitJ ? ['Ms', 'Tc', 'J'] : ['Ms', 'Tc'];
  return {
    parameters: params,
    // each point is solved on its own; the cache is keyed by the x array
    pointwise: true,
    evaluate(p, x, out) {
      const s = reduced(p, x);
      for (let i = 0; i < x.length; i++) {
        out[i] = p[0] * s.m[i];
      }
    },
    jacobian(p, x, out) {
      jacobianInto(p, x, out);
    },
    evaluateWithJacobian(p, x, out, jac) {
      const s = reduced(p, x);
      for (let i = 0; i < x.length; i++) {
        out[i] = p[0] * s.m[i];
      }
      jacobianInto(p, x, jac);
    }
  };
  /**
   * ∂M/∂Ms = m, ∂M/∂Tc from the implicit derivatives; ∂M/∂u = Ms ∂m/∂u
   * analytic (`inverseSpinSlope`); ∂M/∂J = −∂M/∂u / J² from it.
   */
  function jacobianInto(p: Float64Array, x: Float64Array, out: Float64Array): void {
    const Ms = p[0];
    const Tc = p[1];
    const k = params.length;
    const s = reduced(p, x);
    const h = hNumerator / Tc;
    for (let i = 0; i < x.length; i++) {
      const tau = x[i] / Tc;
      out[i * k] = s.m[i];
      out[i * k + 1] = Ms * (s.dmdtau[i] * (-tau / Tc) + s.dmdh[i] * (-h / Tc));
    }
    if (fitJ !== false) {
      // u = 1/J itself, or J through ∂m/∂J = −u²·∂m/∂u (chain rule)
      const u = inverse ? p[2] : 1 / p[2];
      const scale = inverse ? Ms : -u * u * Ms;
      const kc = 3 / (1 + u);
      for (let i = 0; i < x.length; i++) {
        // below u = 0 the model stays at J = ∞ (spinFromInverse); at u = 0 this is the one-sided slope
        out[i * k + 2] = inverse && u < 0 ? 0 : !inverse && !(p[2] > 0) ? Number.NaN : scale * inverseSpinSlope(u, kc, s.m[i], x[i] / Tc, h);
      }
    }
  }
}

/**
 * Fits M(T) = Ms·m(T/Tc, h) with J fixed or fitted. Per-point σ (optional)
 * give errors 'from-sigma'; otherwise errors are scaled by √χ²_red.
 */
export function fitWeissMT(
  data: { T: ArrayLike<number>; M: ArrayLike<number>; sigma?: ArrayLike<number> },
  options: IWeissMTOptions
): IWeissFitResult {
  if (options.fitJ === true || options.fitInverseJ === true) {
    // J is only the start of a fitted, continuous J: any value above 0 (or ∞)
    if (!(options.J > 0)) {
      requireSpin(options.J);
    }
  } else {
    requireSpin(options.J);
  }
  checkColumns(data.T, data.M, data.sigma);
  const field = options.fieldTesla ?? 0;
  if (field !== 0 && !(options.momentBohr !== undefined && options.momentBohr > 0)) {
    throw new PhysicsInputError(
      msg('physics.weiss.moment-needed', 'A field of %1 T is applied, so the moment g·J (in Bohr magnetons, above 0) is needed as well.', field)
    );
  }
  const mode: boolean | 'inverse' = options.fitInverseJ === true ? 'inverse' : options.fitJ === true;
  const fitJ = mode !== false;
  const model = weissMTModel(options.J, mode, field, options.momentBohr ?? 0);
  let start: number[] = options.start ?? estimateWeissStart(data.T, data.M);
  const J0 = mode === 'inverse' ? (options.J === Infinity ? 0.1 : 1 / options.J) : options.J === Infinity ? 50 : options.J;
  if (fitJ) {
    start = [start[0], start[1], J0];
  }
  const lower = fitJ ? [-Infinity, 1e-9, mode === 'inverse' ? 0 : 0.5] : [-Infinity, 1e-9];
  const upper = fitJ ? [Infinity, Infinity, mode === 'inverse' ? 2 : 50] : [Infinity, Infinity];
  const n = data.T.length;
  const coarseAbove = options.coarseAbove ?? 2000;
  let coarseNote: ICoreMessage | null = null;
  if (n > coarseAbove) {
    // coarse stage: the same model fitted to block means of T-sorted data (about
    // `coarsePoints` blocks). Block means keep nearly all the information, so the
    // full fit starts close to its optimum and needs only a few expensive iterations.
    const blocks = coarseBlocks(data.T, data.M, data.sigma, options.coarsePoints ?? 400);
    const coarse = fitCurve(
      weissMTModel(options.J, mode, field, options.momentBohr ?? 0),
      { x: blocks.T, y: blocks.M, sigma: blocks.sigma },
      { ...WEISS_TOLERANCES, lower, upper, ...options.engine, onProgress: undefined, start }
    );
    if (coarse.values.every(Number.isFinite) && Number.isFinite(coarse.chi2)) {
      start = coarse.values.slice();
      coarseNote = msg(
        'physics.weiss.coarse-start',
        'The fit started from a first fit to %1 block means of the data sorted by temperature (%2 iterations).',
        wholeNumber(blocks.T.length),
        coarse.iterations
      );
    }
  }
  const fitData = { x: Float64Array.from(data.T), y: data.M, sigma: data.sigma };
  let res = fitCurve(model, fitData, { ...WEISS_TOLERANCES, lower, upper, ...options.engine, start });
  if (mode === 'inverse' && Number.isFinite(res.chi2) && res.values[2] >= 0 && !(res.values[2] > 3 * res.standardErrors[2])) {
    // 1/J near 0: at 1/J = 0 the curve depends on Ms and 1/J only through Ms·(1 + 1/(2J)) to
    // first order (∂m/∂(1/J) = m/2), so the two move together, χ² is nearly flat along 1/J and
    // the standard errors (a local, Gaussian approximation) do not describe it. The profile of χ²
    // decides instead: when holding 1/J at 0 raises χ² by at most one unit of the fit's variance
    // (χ²/dof, or 1 with σ given), J = ∞ lies within the one-standard-error interval and Ms
    // and Tc are given with 1/J held at 0.
    const free = { value: res.values[2], sigma: res.standardErrors[2] };
    const held = fitCurve(model, fitData, {
      ...WEISS_TOLERANCES,
      lower,
      upper,
      ...options.engine,
      start: [res.values[0], res.values[1], 0],
      fixed: [false, false, true]
    });
    const unit = data.sigma !== undefined ? 1 : res.reducedChi2;
    if (held.converged && held.chi2 - res.chi2 <= unit) {
      res = {
        ...held,
        notes: [
          ...held.notes,
          msg(
            'physics.weiss.classical-held',
            'With the spin free, 1/J went to %1 (standard error %2), and holding it at 0, the classical limit J = ∞, raises χ² by less than one unit of its variance: the data do not tell J from ∞, where Ms and 1/J cannot be told apart, so Ms and Tc are given with 1/J held at 0.',
            { value: free.value, digits: 2 },
            { value: free.sigma, digits: 2 }
          )
        ]
      };
    }
  }
  if (coarseNote !== null) {
    res.notes = [...res.notes, coarseNote];
  }
  const J = mode === 'inverse' ? spinFromInverse(res.values[2]) : fitJ ? res.values[2] : options.J;
  return { ...res, convention: WEISS_CONVENTION, J, jFitted: fitJ };
}

/** Options of `fitWeissIsotherms`. */
export interface IWeissIsothermOptions {
  J: number;
  /** Starting values [Ms, Tc, moment in μB]. */
  start: [number, number, number];
  /** Keep the moment fixed (e.g. to g·J of the free ion). */
  fixMoment?: boolean;
  engine?: Partial<IFitOptions>;
}

/**
 * Fits M(B, T) isotherms (B = μ0 H_int in tesla) with parameters Ms, Tc and
 * the moment μ = g·J (μB). Uses x = point index and closes over T and B.
 */
export function fitWeissIsotherms(
  data: { T: ArrayLike<number>; B: ArrayLike<number>; M: ArrayLike<number>; sigma?: ArrayLike<number> },
  options: IWeissIsothermOptions
): IWeissFitResult {
  requireSpin(options.J);
  checkColumns(data.T, data.M, data.sigma);
  if (data.B.length !== data.T.length) {
    throw new PhysicsInputError(lengthsDiffer({ T: data.T.length, B: data.B.length }));
  }
  const T = Float64Array.from(data.T);
  const B = Float64Array.from(data.B);
  const J = options.J;
  const model = weissIsothermModel(J, T, B);
  const res = fitCurve(
    model,
    { x: Float64Array.from(T, (_, i) => i), y: data.M, sigma: data.sigma },
    {
      lower: [-Infinity, 1e-9, 1e-6],
      upper: [Infinity, Infinity, Infinity],
      fixed: [false, false, options.fixMoment === true],
      ...options.engine,
      start: options.start
    }
  );
  return { ...res, convention: WEISS_CONVENTION, J, jFitted: false };
}

/**
 * The M(B, T) isotherm model (parameters Ms, Tc, moment μ in μB; x = point
 * index into `T` and `B`), with the analytic Jacobian from the implicit
 * derivatives of m(τ, h), τ = T/Tc, h = μ·μB·B/(kB·Tc):
 *   ∂M/∂Ms = m,  ∂M/∂Tc = −Ms(τ ∂m/∂τ + h ∂m/∂h)/Tc,  ∂M/∂μ = Ms (h/μ) ∂m/∂h.
 */
export function weissIsothermModel(J: number, T: Float64Array, B: Float64Array): IFitModel {
  const solve = (p: Float64Array, x: Float64Array): { s: ReturnType<typeof solveWeiss>; tau: Float64Array; h: Float64Array } => {
    const n = x.length;
    const tau = new Float64Array(n);
    const h = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      const j = x[i];
      tau[i] = T[j] / p[1];
      h[i] = (p[2] * PHYS.muB * B[j]) / (PHYS.kB * p[1]);
    }
    return { s: solveWeiss(J, tau, h), tau, h };
  };
  const jacobianInto = (p: Float64Array, sol: ReturnType<typeof solve>, out: Float64Array): void => {
    const { s, tau, h } = sol;
    const [Ms, Tc, mu] = p;
    for (let i = 0; i < tau.length; i++) {
      out[i * 3] = s.m[i];
      out[i * 3 + 1] = (-Ms * (tau[i] * s.dmdtau[i] + h[i] * s.dmdh[i])) / Tc;
      // h/μ·∂m/∂h (h = 0 where B = 0: ∂m/∂h may be infinite there at Tc, but the product is 0)
      out[i * 3 + 2] = h[i] === 0 ? 0 : Ms * (h[i] / mu) * s.dmdh[i];
    }
  };
  return {
    parameters: ['Ms', 'Tc', 'moment'],
    evaluate(p, x, out) {
      const { s } = solve(p, x);
      for (let i = 0; i < x.length; i++) {
        out[i] = p[0] * s.m[i];
      }
    },
    jacobian(p, x, out) {
      jacobianInto(p, solve(p, x), out);
    },
    evaluateWithJacobian(p, x, out, jac) {
      const sol = solve(p, x);
      for (let i = 0; i < x.length; i++) {
        out[i] = p[0] * sol.s.m[i];
      }
      jacobianInto(p, sol, jac);
    }
  };
}

/**
 * Curie constant of the mean-field susceptibility above Tc,
 * C = μ0 N g² μB² J(J+1)/(3 kB) (SI, volume; K), for N moments per m³.
 */
export function weissCurieConstantSI(N: number, g: number, J: number): number {
  requireSpin(J);
  if (J === Infinity) {
    throw new PhysicsInputError(
      msg('physics.weiss.classical-curie', 'For J = ∞ (classical moments) the Curie constant needs the moment itself: use the classical form.')
    );
  }
  return (PHYS.mu0 * N * g * g * PHYS.muB * PHYS.muB * J * (J + 1)) / (3 * PHYS.kB);
}
