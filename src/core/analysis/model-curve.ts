/**
 * A fitted model evaluated at other parameter values: the drawn curve over
 * the outcome's x grid, the residuals at the points the fit used and χ²
 * with the weights the fit used (the σ column, relative σ = f·|y| or equal
 * weights), for moving the parameters by hand and seeing at once how far
 * the curve and χ² move.
 *
 * Built once per outcome ({@link modelCurve}); each evaluation then writes
 * into buffers owned by the returned object and allocates nothing else of
 * its own (the physics models it calls may keep scratch arrays).
 */
import type { IFitModel } from '../fit/types';
import { kindById, optionsFromJson } from './kinds';
import type { IAnalysisJob, IAnalysisOutcome } from './types';
import { relativeSigma } from './weights';
import { windowedPoints } from './window';
import type { IWindowedPoints } from './window';

/** One evaluation of a {@link IModelCurve}; its arrays are the curve's own buffers, overwritten by the next evaluation. */
export interface IModelEvaluation {
  /** y of the model at each x of the outcome's curve. */
  readonly curveY: Float64Array;
  /** y − model at each fitted point (the order of `fit.residuals`). */
  readonly residuals: Float64Array;
  /** Σ((y − model)/σ)², or Σ(y − model)² when the fit had no σ: the quantity the fit minimised. */
  readonly chi2: number;
  /** χ²/(degrees of freedom of the fit); NaN without degrees of freedom. */
  readonly reducedChi2: number;
}

/** An outcome's model, ready to be evaluated at any parameter values. */
export interface IModelCurve {
  /** The fit's parameters, in order. */
  readonly parameters: readonly string[];
  /** The fitted values (same order). */
  readonly fitted: readonly number[];
  /** x of the drawn curve (the outcome's `curve.x`). */
  readonly curveX: Float64Array;
  /** x of the fitted points (the abscissa the fit used: T, or ψ for a Landau fit of T against ψ). */
  readonly pointsX: Float64Array;
  /** σ of each fitted point as the fit weighted it, or null for an unweighted fit. */
  readonly sigma: Float64Array | null;
  /** Degrees of freedom of the fit. */
  readonly dof: number;
  /** Evaluate at `values` (one per parameter, in order); the result's arrays are reused by the next call. */
  evaluate(values: ArrayLike<number>): IModelEvaluation;
}

/**
 * The model of `outcome`, or null when it cannot be rebuilt: the kind has no
 * model, the job's points are not those of the outcome (other data or
 * window), or the parameters differ.
 */
export function modelCurve(job: IAnalysisJob, outcome: IAnalysisOutcome): IModelCurve | null {
  const kind = kindById(outcome.kind);
  if (!kind || !kind.model) {
    return null;
  }
  const options = optionsFromJson(kind.id, job.options as Record<string, unknown>);
  const kindJob: IAnalysisJob = { ...job, options, window: { ...outcome.window } };
  let pts: IWindowedPoints;
  try {
    pts = weightedPoints(kindJob, outcome);
  } catch {
    return null;
  }
  let built;
  try {
    built = kind.model(kindJob, pts, outcome);
  } catch {
    return null;
  }
  const fitted = built.fitted ?? { model: built.curve, x: pts.x, y: pts.y, sigma: pts.sigma };
  const k = outcome.fit.parameters.length;
  if (!sameNames(built.curve.parameters, outcome.fit.parameters) || !sameNames(fitted.model.parameters, outcome.fit.parameters)) {
    return null;
  }
  if (fitted.x.length !== outcome.fit.residuals.length || fitted.y.length !== fitted.x.length || (fitted.sigma !== undefined && fitted.sigma.length !== fitted.x.length)) {
    return null;
  }
  return new ModelCurve(built.curve, fitted.model, {
    parameters: outcome.fit.parameters.slice(),
    fitted: outcome.fit.values.slice(0, k),
    curveX: Float64Array.from(outcome.curve.x),
    pointsX: Float64Array.from(fitted.x),
    y: Float64Array.from(fitted.y),
    sigma: fitted.sigma ? Float64Array.from(fitted.sigma) : null,
    dof: outcome.fit.dof
  });
}

/** The job's windowed points with the σ the outcome's fit was weighted by (see run.ts). */
function weightedPoints(job: IAnalysisJob, outcome: IAnalysisOutcome): IWindowedPoints {
  const pts = windowedPoints(job);
  const w = outcome.weighting;
  if (w?.mode === 'relative') {
    return { ...pts, sigma: w.fraction !== null ? relativeSigma(pts.y, w.fraction) : undefined };
  }
  if (w?.mode === 'equal') {
    return { ...pts, sigma: undefined };
  }
  return pts;
}

function sameNames(a: readonly string[], b: readonly string[]): boolean {
  return a.length === b.length && a.every((name, i) => name === b[i]);
}

/** The evaluator: buffers made once, reused by every evaluation. */
class ModelCurve implements IModelCurve {
  constructor(
    curve: IFitModel,
    points: IFitModel,
    data: { parameters: string[]; fitted: number[]; curveX: Float64Array; pointsX: Float64Array; y: Float64Array; sigma: Float64Array | null; dof: number }
  ) {
    this._curve = curve;
    this._points = points;
    this.parameters = data.parameters;
    this.fitted = data.fitted;
    this.curveX = data.curveX;
    this.pointsX = data.pointsX;
    this.sigma = data.sigma;
    this.dof = data.dof;
    this._y = data.y;
    this._p = new Float64Array(data.parameters.length);
    this._model = new Float64Array(data.y.length);
    this._result = { curveY: new Float64Array(data.curveX.length), residuals: new Float64Array(data.y.length), chi2: Number.NaN, reducedChi2: Number.NaN };
  }

  readonly parameters: readonly string[];
  readonly fitted: readonly number[];
  readonly curveX: Float64Array;
  readonly pointsX: Float64Array;
  readonly sigma: Float64Array | null;
  readonly dof: number;

  evaluate(values: ArrayLike<number>): IModelEvaluation {
    const p = this._p;
    if (values.length !== p.length) {
      throw new RangeError(`expected ${p.length} parameter values, got ${values.length}`);
    }
    for (let j = 0; j < p.length; j++) {
      p[j] = values[j];
    }
    const r = this._result;
    this._curve.evaluate(p, this.curveX, r.curveY);
    const model = this._model;
    this._points.evaluate(p, this.pointsX, model);
    const y = this._y;
    const sigma = this.sigma;
    let chi2 = 0;
    for (let i = 0; i < y.length; i++) {
      const d = y[i] - model[i];
      r.residuals[i] = d;
      const z = sigma ? d / sigma[i] : d;
      chi2 += z * z;
    }
    r.chi2 = chi2;
    r.reducedChi2 = this.dof > 0 ? chi2 / this.dof : Number.NaN;
    return r;
  }

  private readonly _curve: IFitModel;
  private readonly _points: IFitModel;
  private readonly _y: Float64Array;
  private readonly _p: Float64Array;
  private readonly _model: Float64Array;
  private readonly _result: { curveY: Float64Array; residuals: Float64Array; chi2: number; reducedChi2: number };
}
