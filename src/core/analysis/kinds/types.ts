/**
 * What an analysis kind is: one entry of the catalogue in `index.ts`. An entry
 * says everything the panel, the worker and the saved format need to know
 * about one analysis the user can run on two columns of a table: its label,
 * its typed options with defaults, how many points it needs, the job it runs
 * and which result views it offers. Adding a kind means adding one entry.
 */
import type { ICoreMessage } from '../../messages';
import type { IFitModel } from '../../fit/types';
import type { IAnalysisHooks } from '../hooks';
import type { IAnalysisJob, IAnalysisOutcome } from '../types';
import type { IWindowedPoints } from '../window';

/** A value of a kind's option. */
export type OptionValue = string | number | boolean;

/** One choice of a choice option. */
export interface IOptionChoice<V extends string | number = string | number> {
  readonly value: V;
  readonly label: ICoreMessage;
}

/** A pick-one option (drop-down). */
export interface IChoiceOption<V extends string | number = string | number> {
  readonly type: 'choice';
  readonly label: ICoreMessage;
  readonly choices: readonly IOptionChoice<V>[];
  readonly default: V;
}

/** An on/off option (check box). */
export interface IBooleanOption {
  readonly type: 'boolean';
  readonly label: ICoreMessage;
  readonly default: boolean;
}

/** A free-text option (one line). */
export interface ITextOption {
  readonly type: 'text';
  readonly label: ICoreMessage;
  readonly default: string;
  /** Example shown while empty (not translated: a formula or a name = value list). */
  readonly placeholder: string;
}

/**
 * A column of the table chosen by the user (e.g. 1/χ for a joint fit). The
 * value is the chosen column's header, '' for none; the session passes that
 * column's values in `job.columns[key]`, row-aligned with x.
 */
export interface IColumnOption {
  readonly type: 'column';
  readonly label: ICoreMessage;
  readonly default: '';
}

/** Any option of a kind. */
export type OptionSpec = IChoiceOption | IBooleanOption | ITextOption | IColumnOption;

/** Result views a kind can offer under its result. */
export type ResultView = 'data-and-curve' | 'landau-explorer';

/** The points a fit used, in the order fitted (for the verdict's checks). */
export interface IFittedPoints {
  x: ArrayLike<number>;
  y: ArrayLike<number>;
  sigma?: ArrayLike<number>;
  /**
   * y of the model curve drawn over the window (the outcome's `curve.y`): the
   * verdict refuses 'fits' when it is not finite everywhere it is drawn.
   */
  curve?: ArrayLike<number>;
}

/** What a kind's job returns: the outcome, and the points the engine fitted. */
export interface IKindResult {
  outcome: Omit<IAnalysisOutcome, 'verdict' | 'kind' | 'window' | 'skipped'>;
  fitted: IFittedPoints;
  /** Bounds the fit used (same order as the fit's parameters), when any. */
  bounds?: { lower: ArrayLike<number>; upper: ArrayLike<number> };
}

/** One analysis kind. */
export interface IAnalysisKind<Id extends string = string> {
  readonly id: Id;
  readonly label: ICoreMessage;
  /** One line shown under the picker: what the kind is for. */
  readonly description: ICoreMessage;
  /** Options by key, in the order the panel shows them. */
  readonly options: Readonly<Record<string, OptionSpec>>;
  /** Fewest points in the window the job can run with, for these options. */
  minPoints(options: Readonly<Record<string, OptionValue>>): number;
  /** Run the job on the windowed points (throws CoreMessageError for bad input). */
  run(job: IAnalysisJob, points: IWindowedPoints, hooks: IAnalysisHooks): IKindResult;
  /** Views offered under the result. */
  readonly views: readonly ResultView[];
  /**
   * The model of an outcome of this kind, to evaluate it at other parameter
   * values (see `model-curve.ts`). `points` are the job's windowed points with
   * the σ the fit was weighted by.
   */
  model?(job: IAnalysisJob, points: IWindowedPoints, outcome: IAnalysisOutcome): IKindModel;
}

/**
 * The model of a fitted outcome: its drawn curve and the points its χ² sums
 * over, both as engine models over the fit's parameters (same order).
 */
export interface IKindModel {
  /** y of the drawn curve at x (the outcome's `curve.x`). */
  curve: IFitModel;
  /**
   * The points the fit's χ² sums over, the model of them and their σ (none:
   * unweighted); omitted when they are `points` themselves under `curve`.
   */
  fitted?: { model: IFitModel; x: ArrayLike<number>; y: ArrayLike<number>; sigma?: ArrayLike<number> };
}

/** The engine model of a fitted outcome, to redraw a curve (e.g. with other parameter values). */
export type CurveModel = IFitModel;
