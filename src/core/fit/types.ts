/**
 * Public contract of the nonlinear least-squares engine.
 *
 * Models with several independent variables (for example M(H, T)) pass
 * `x` = point index (0, 1, 2, …) and close over their own data columns:
 * `evaluate` then reads `H[x[i]]`, `T[x[i]]` for each point `i`.
 */
import type { IDoubleDoubleArray } from '../numeric/dd/core';
import { CoreMessageError } from '../messages';
import type { ICoreMessage } from '../messages';

/** A model y = f(x; p) with named parameters. */
export interface IFitModel {
  /** Parameter names, in the order used by `p`. */
  readonly parameters: readonly string[];
  /** Writes the model value at every `x[i]` into `out[i]`. */
  evaluate(p: Float64Array, x: Float64Array, out: Float64Array): void;
  /**
   * Optional analytic Jacobian, row-major n×k: `out[i*k + j]` = ∂f(x_i)/∂p_j.
   * When absent, finite differences are used.
   */
  jacobian?(p: Float64Array, x: Float64Array, out: Float64Array): void;
  /**
   * Optional single pass writing what `evaluate` writes into `out` and what
   * `jacobian` writes into `jac` (row-major n×k), sharing the work of both
   * (e.g. one power per point for the value and its derivatives). When
   * present (with `jacobian`), the engine computes the Jacobian at every
   * trial point in the same pass as the values, so an accepted step needs
   * no separate Jacobian evaluation. Results must equal those of
   * `evaluate` and `jacobian`.
   */
  evaluateWithJacobian?(p: Float64Array, x: Float64Array, out: Float64Array, jac: Float64Array): void;
  /**
   * True when f(xᵢ) depends on xᵢ alone (not on other points or their
   * order), so that the model may be evaluated on any subset of the points.
   * Large problems then start from a fit to an evenly strided subsample
   * (see `warmStart.ts`).
   */
  readonly pointwise?: boolean;
  /**
   * Optional evaluation in double-double arithmetic (≈ 32 digits): writes
   * f(x_i; p) as `out.hi[i] + out.lo[i]` for double-double parameters `p`
   * (all parameters, same order as `evaluate`) and double-double `x`
   * (x + xLow of the data). Used only to refine a converged fit whose χ² is
   * dominated by binary64 rounding (see `IFitResult.residualArithmetic`);
   * NaN or a thrown error skips that refinement with a warning.
   */
  evaluatePrecise?(p: IDoubleDoubleArray, x: IDoubleDoubleArray, out: IDoubleDoubleArray): void;
}

/** Observations. `sigma` (optional) are per-point standard uncertainties of `y`. */
export interface IFitData {
  x: ArrayLike<number>;
  y: ArrayLike<number>;
  sigma?: ArrayLike<number>;
  /**
   * Optional low-order parts of `x`: the exact abscissae are x[i] + xLow[i]
   * (e.g. decimal data that binary64 cannot hold; see
   * `decimalToDoubleDouble`). Same length as x, finite, |xLow[i]| ≤ ulp(x[i]).
   * Used only by the double-double refinement (models with `evaluatePrecise`).
   */
  xLow?: ArrayLike<number>;
  /** Optional low-order parts of `y`, like `xLow`: the exact values are y[i] + yLow[i]. */
  yLow?: ArrayLike<number>;
}

/** Progress report sent during a fit. */
export interface IFitProgress {
  iteration: number;
  evaluations: number;
  /** χ² at the current point of the iteration (the best point so far). */
  cost: number;
  /** Parameter names, in the order of `values`. */
  parameters?: readonly string[];
  /**
   * All parameter values (fixed ones included) at the point whose χ² is
   * `cost`: what a fit stopped now would return. A fresh array.
   */
  values?: number[];
}

/**
 * Fit options. Defaults are defined once in `FIT_DEFAULTS` (see `defaults.ts`).
 */
export interface IFitOptions {
  /** Starting values, one per parameter. */
  start: ArrayLike<number>;
  /** Lower bounds (−∞ allowed). */
  lower?: ArrayLike<number>;
  /** Upper bounds (+∞ allowed). */
  upper?: ArrayLike<number>;
  /** `true` keeps that parameter at its start value. */
  fixed?: ArrayLike<boolean>;
  /** Maximum number of model evaluations (Jacobian columns by finite differences count). */
  maxEvaluations?: number;
  /** Relative reduction of the cost below which the fit stops. */
  ftol?: number;
  /** Relative step size below which the fit stops. */
  xtol?: number;
  /** Scaled gradient (cosine) below which the fit stops. */
  gtol?: number;
  /** Two-sided probability for Student-t intervals, default 0.6827 (1σ). */
  confidenceLevel?: number;
  /** Called after every accepted or rejected iteration. */
  onProgress?: (p: IFitProgress) => void;
  /** Cancellation: return true to stop; best-so-far is returned with converged=false, reason code 'fit.stop.cancelled'. */
  shouldStop?: () => boolean;
}

/** Which convention produced the standard errors. */
export type ErrorScaling = 'scaled-by-reduced-chi2' | 'from-sigma';

/** Outcome of a fit. Arrays follow the order of `parameters`. */
export interface IFitResult {
  parameters: string[];
  values: number[];
  standardErrors: number[];
  covariance: number[][];
  correlation: number[][];
  confidenceIntervals: [number, number][];
  confidenceLevel: number;
  /** 'from-sigma' when per-point σ were given, otherwise errors scaled by √χ²_red. */
  errorScaling: ErrorScaling;
  /**
   * Multiplier of the standard errors in `confidenceIntervals`: the Student-t
   * quantile with `dof` degrees of freedom when errors are scaled by √χ²_red,
   * the normal quantile when σ were given.
   */
  intervalQuantile: number;
  /** χ² = Σ((yᵢ − fᵢ)/σᵢ)², or the residual sum of squares when σ were not given. */
  chi2: number;
  reducedChi2: number;
  dof: number;
  aic: number;
  aicc: number;
  bic: number;
  /**
   * 'known-sigma': AIC = χ² + 2k, BIC = χ² + k ln n; 'profiled-variance' (no σ):
   * AIC = n ln(χ²/n) + 2k, BIC = n ln(χ²/n) + k ln n; AICc = AIC + 2k(k+1)/(n−k−1);
   * k = number of free parameters.
   */
  criteriaConvention: 'known-sigma' | 'profiled-variance';
  /**
   * Arithmetic of χ², the residuals and hence the scaled standard errors:
   * 'binary64' normally; 'double-double' when the fit converged with a χ²
   * dominated by binary64 rounding noise (noise > 1e-9·χ²), the model has
   * `evaluatePrecise` and n ≤ `FIT_DEFAULTS.largeRows`: the parameters were
   * then polished by Gauss–Newton steps with double-double residuals of the
   * exact data (x + xLow, y + yLow), and χ² = Σr² was summed in
   * double-double (values are the refined parameters rounded to binary64).
   * `notes` say so too.
   */
  residualArithmetic: 'binary64' | 'double-double';
  /**
   * Unweighted residuals yᵢ − f(xᵢ) (observed minus model). A typed array:
   * a `number[]` of 10⁶ elements costs ≈ 25 ms to build (fresh large-object
   * memory), a Float64Array a few; convert with `Array.from` to serialise.
   */
  residuals: Float64Array;
  /** Model evaluations during the fit (each finite-difference column counts as one). */
  evaluations: number;
  /** Calls of the model's analytic `jacobian` during the fit. */
  jacobianEvaluations: number;
  iterations: number;
  /** True only when a convergence test was met at a non-degenerate point. */
  converged: boolean;
  /** Why the fit stopped, as a sentence (codes `fit.stop.*`). */
  reason: ICoreMessage;
  /** What limits the result (singular or ill-conditioned covariance, strong correlations, values at a bound …). */
  warnings: ICoreMessage[];
  /** How the result was obtained, when that is worth saying (double-double refinement, a coarse first stage …); not warnings. */
  notes: ICoreMessage[];
  /** Whether each parameter was fixed (fixed ones have zero standard error and covariance). */
  fixed: boolean[];
  /** The range each parameter was allowed (±∞ where unbounded), in the order of `parameters`. */
  bounds?: { lower: number[]; upper: number[] };
  /**
   * Large problems with a pointwise model: the subsample stage that gave the
   * starting point of the full-data iteration (absent otherwise). Its model
   * calls, on the subsample, are not in `evaluations`.
   */
  warmStart?: {
    stride: number;
    points: number;
    evaluations: number;
    converged: boolean;
    used: boolean;
  };
}

/** Precise error thrown for invalid inputs at the boundary of the engine (`detail` holds the message, codes `fit.*`). */
export class FitInputError extends CoreMessageError {
  constructor(detail: ICoreMessage) {
    super(detail);
    this.name = 'FitInputError';
  }
}
