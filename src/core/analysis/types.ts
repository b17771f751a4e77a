/**
 * Jobs the analysis panel runs on two columns of a table: which model, which
 * points (the fit window) and the model's options; and what comes back.
 * Plain data only, so jobs and outcomes can cross a worker boundary.
 */
import type { IFitResult } from '../fit/types';

/** The models the panel offers. */
export type AnalysisModel = 'power-law' | 'weiss' | 'curie-weiss' | 'landau' | 'expression';

/** Model options; each model reads only its own. */
export interface IAnalysisModelOptions {
  /** Power law: measured quantity ∝ ψ^proxyPower (2 for intensities); default 1. */
  proxyPower?: number;
  /** Power law: fit a constant background. */
  background?: boolean;
  /** Weiss: spin J (½, 1, …, Infinity for the Langevin limit). */
  J?: number;
  /** Curie–Weiss: molar units of χ, for the effective moment. */
  units?: 'cgs-emu' | 'SI';
  /** Expression: the model, e.g. `A*exp(-x/T0) + c`, with x the x column. */
  expression?: string;
}

/** A fit of y against x over a window of x. */
export interface IAnalysisJob {
  model: AnalysisModel;
  x: number[];
  y: number[];
  /** Per-point standard deviations of y (optional; must be > 0). */
  sigma?: number[];
  /** Only points with min ≤ x ≤ max are fitted. */
  window: { min: number; max: number };
  options: IAnalysisModelOptions;
}

/** A number derived from the fit, with its standard error. */
export interface IDerivedValue {
  name: string;
  value: number;
  sigma: number;
  /** How it was obtained (formula, units). */
  note: string;
}

/** What a job returns. */
export interface IAnalysisOutcome {
  model: AnalysisModel;
  /** The fitted equation, in plain text. */
  equation: string;
  /** Conventions used (t definition, units, factor conventions). */
  convention: string;
  /** The engine's result: values, standard errors, covariance, converged and reason, warnings. */
  fit: IFitResult;
  /** The fit window used. */
  window: { min: number; max: number };
  /** Points inside the window that were fitted, and those left out for non-finite values. */
  used: number;
  skipped: number;
  /** The model evaluated over the window, for drawing. */
  curve: { x: number[]; y: number[] };
  derived: IDerivedValue[];
  /** Cautions a careful reader needs next to these numbers. */
  cautions: string[];
  /** Landau fits: the coefficients in convention L with a = 1 (for the free-energy explorer). */
  landau?: { a: number; T0: number; b: number; c: number; d: number };
}

/** Why a job could not run: a message naming the input at fault. */
export class AnalysisInputError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'AnalysisInputError';
  }
}
