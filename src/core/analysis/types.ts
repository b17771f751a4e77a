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
}

/** A number derived from the fit, with its standard error. */
export interface IDerivedValue {
  name: string;
  value: number;
  sigma: number;
  /** How it was obtained (formula, units). */
  note: ICoreMessage;
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
  /** Landau fits: the coefficients in convention L with a = 1 (for the free-energy explorer). */
  landau?: { a: number; T0: number; b: number; c: number; d: number };
}
