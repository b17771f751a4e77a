/**
 * Jobs the analysis panel runs on two columns of a table: which analysis kind
 * (see the catalogue in `kinds/`), which points (the fit window) and the kind's
 * options; and what comes back. Plain data only, so jobs and outcomes can
 * cross a worker boundary.
 */
import type { IFitResult } from '../fit/types';
import type { ICoreMessage } from '../messages';
import type { IVerdict } from './verdict';

/** An option value of an analysis kind. */
export type AnalysisOptionValue = string | number | boolean;

/** A fit of y against x over a window of x. */
export interface IAnalysisJob {
  /** An analysis kind id from the catalogue. */
  kind: string;
  x: ArrayLike<number>;
  y: ArrayLike<number>;
  /** Per-point standard deviations of y (optional; must be > 0). */
  sigma?: ArrayLike<number>;
  /** Only points with min ≤ x ≤ max are fitted. */
  window: { min: number; max: number };
  /** The kind's options (missing ones take the catalogue's defaults). */
  options: Readonly<Record<string, AnalysisOptionValue>>;
  /** Names by which a user's expression may call the x column (besides `x`). */
  xNames?: string[];
  /**
   * How points are weighted: 'sigma' by the σ column (the default when σ is
   * given), 'relative' σ_i = f·|y_i| (f given, or estimated when null), 'equal'
   * (the default without σ).
   */
  weights?: { mode: 'sigma' | 'relative' | 'equal'; fraction?: number | null };
  /** Values of the kind's column options (e.g. 1/χ for a joint Landau fit), by option key, row-aligned with x. */
  columns?: Record<string, ArrayLike<number>>;
  /**
   * Where the fit starts, by parameter name (the fit's `parameters`), in place
   * of the kind's own start for those parameters. Names the kind does not fit
   * and values that are not finite are ignored.
   */
  start?: Record<string, number>;
}

/** A number derived from the fit, with its standard error. */
export interface IDerivedValue {
  name: string;
  value: number;
  sigma: number;
  /** How it was obtained (formula, units). */
  note: ICoreMessage;
  /** Why `sigma` is not a number, whenever it is not (e.g. no finite covariance). */
  sigmaReason?: ICoreMessage;
}

/** What a job returns. */
export interface IAnalysisOutcome {
  kind: string;
  /** The fitted equation, in plain mathematical text. */
  equation: string;
  /** Conventions used (t definition, units, factor conventions). */
  convention: ICoreMessage;
  /** The engine's result: values, standard errors, covariance, converged and reason, warnings. */
  fit: IFitResult;
  /** Whether the result describes the data: computed in core from the fit and the fitted points. */
  verdict: IVerdict;
  /** The fit window used. */
  window: { min: number; max: number };
  /** Points inside the window that were fitted, and those left out for non-finite values. */
  used: number;
  skipped: number;
  /** The model evaluated over the window, for drawing. */
  curve: { x: number[]; y: number[] };
  derived: IDerivedValue[];
  /** Cautions a careful reader needs next to these numbers. */
  cautions: ICoreMessage[];
  /**
   * Order of the transition where the fit decides it (Landau: sign of b;
   * Bean–Rodbell: η against 1), with how sure: z = (b or η − 1)/σ and the
   * probability of first order under a normal approximation.
   */
  transitionOrder?: { order: 'first' | 'second' | 'undecided'; z: number; probabilityFirst: number; statement: ICoreMessage };
  /** Landau fits: the coefficients in convention L with a = 1 (for the free-energy explorer). */
  landau?: { a: number; T0: number; b: number; c: number; d: number };
  /** How the points were weighted, and whether the residuals ask for other weights (see weights.ts). */
  weighting?: IWeighting;
}

/** How the points of a fit were weighted (see weights.ts). */
export interface IWeighting {
  mode: 'sigma' | 'relative' | 'equal';
  /** f of σ_i = f·|y_i| in 'relative' mode (given or estimated), else null. */
  fraction: number | null;
  /** Whether f was estimated from the residuals (relative mode without f). */
  fractionEstimated: boolean;
  /** How the points were weighted and what the standard errors rest on (code `weights.*`). */
  note: ICoreMessage;
  /** The residual check of an equal or σ fit; null when it was not made (relative mode, or not asked for). */
  check: IResidualCheck | null;
}

/** Does the scatter grow with |y|? Made on the residuals of an equal-weight or σ fit. */
export interface IResidualCheck {
  /**
   * −2 ln L of the weights used minus −2 ln L of σ_i ∝ |y_i|, each with its
   * scale profiled, on this fit's residuals (> 0 favours σ ∝ |y|); NaN when not tested.
   */
  gain: number;
  /** Spearman rank correlation of |residual| with |y| (NaN when not tested). */
  spearman: number;
  /** Whether σ ∝ |y| describes the scatter better (gain above the threshold in weights.ts). */
  relativeBetter: boolean;
  /** f = rms of residual/|y| of this fit, for σ_i = f·|y_i| (NaN when not tested). */
  fraction: number;
  /** When relative weights fit better: σ with relative weights / σ of this fit, by derived value. */
  errorFactors: { name: string; factor: number }[];
  /** What was found, in one sentence. */
  message: ICoreMessage;
  /** The advice to refit with relative weights and how the errors change; null when none. */
  suggestion: ICoreMessage | null;
}
