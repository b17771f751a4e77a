/**
 * Validation of fit inputs at the engine boundary and the normalised
 * problem the solver works on.
 */
import { ulp } from '../numeric/ulp';
import { FIT_DEFAULTS } from './defaults';
import { FitInputError } from './types';
import type { IFitData, IFitModel, IFitOptions } from './types';

/** Validated, normalised fit problem. */
export interface IFitProblem {
  model: IFitModel;
  names: string[];
  n: number;
  /** All parameters. */
  kAll: number;
  x: Float64Array;
  y: Float64Array;
  /** Low-order parts of x (exact abscissae x + xLow), or null. */
  xLow: Float64Array | null;
  /** Low-order parts of y (exact values y + yLow), or null. */
  yLow: Float64Array | null;
  /** Weights 1/σᵢ, or null when σ were not given. */
  weights: Float64Array | null;
  start: Float64Array;
  lower: Float64Array;
  upper: Float64Array;
  fixed: boolean[];
  /** Indices of free parameters. */
  free: number[];
  maxEvaluations: number;
  ftol: number;
  xtol: number;
  gtol: number;
  confidenceLevel: number;
}

function toFloat64(name: string, values: ArrayLike<number>, length?: number): Float64Array {
  if (values === null || typeof values !== 'object' || typeof values.length !== 'number') {
    throw new FitInputError(`${name} must be an array of numbers`);
  }
  if (length !== undefined && values.length !== length) {
    throw new FitInputError(`${name} has length ${values.length}, expected ${length}`);
  }
  if (values instanceof Float64Array) {
    return values.slice();
  }
  const out = new Float64Array(values.length);
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    if (typeof v !== 'number') {
      throw new FitInputError(`${name}[${i}] is not a number`);
    }
    out[i] = v;
  }
  return out;
}

function requireFinite(name: string, values: Float64Array): void {
  for (let i = 0; i < values.length; i++) {
    if (!Number.isFinite(values[i])) {
      throw new FitInputError(`${name}[${i}] is ${values[i]}; all values must be finite`);
    }
  }
}

/** Optional low-order parts of `high`: same length, finite, |low| ≤ ulp(high). */
function lowParts(name: string, values: ArrayLike<number> | undefined | null, high: Float64Array): Float64Array | null {
  if (values === undefined || values === null) {
    return null;
  }
  const low = toFloat64(name, values, high.length);
  requireFinite(name, low);
  for (let i = 0; i < low.length; i++) {
    if (Math.abs(low[i]) > ulp(high[i])) {
      throw new FitInputError(
        `${name}[${i}] = ${low[i]} exceeds one unit in the last place of the high part ${high[i]}`
      );
    }
  }
  return low;
}

function positiveTolerance(name: string, value: number | undefined, fallback: number): number {
  if (value === undefined) {
    return fallback;
  }
  if (typeof value !== 'number' || !(value >= 0) || !Number.isFinite(value)) {
    throw new FitInputError(`options.${name} must be a finite number ≥ 0, got ${String(value)}`);
  }
  return value;
}

/** Checks every input and returns the normalised problem; throws `FitInputError`. */
export function buildProblem(model: IFitModel, data: IFitData, options: IFitOptions): IFitProblem {
  if (!model || typeof model.evaluate !== 'function' || !Array.isArray(model.parameters)) {
    throw new FitInputError('model must provide parameters (array of names) and evaluate()');
  }
  const names = model.parameters.map(String);
  const kAll = names.length;
  if (kAll === 0) {
    throw new FitInputError('model has no parameters');
  }
  if (new Set(names).size !== kAll) {
    throw new FitInputError(`model parameter names must be unique: ${names.join(', ')}`);
  }
  if (!data) {
    throw new FitInputError('data is required');
  }
  const x = toFloat64('data.x', data.x);
  const n = x.length;
  const y = toFloat64('data.y', data.y, n);
  if (n === 0) {
    throw new FitInputError('data is empty');
  }
  requireFinite('data.x', x);
  requireFinite('data.y', y);
  const xLow = lowParts('data.xLow', data.xLow, x);
  const yLow = lowParts('data.yLow', data.yLow, y);
  let weights: Float64Array | null = null;
  if (data.sigma !== undefined && data.sigma !== null) {
    const sigma = toFloat64('data.sigma', data.sigma, n);
    weights = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      if (!(sigma[i] > 0) || !Number.isFinite(sigma[i])) {
        throw new FitInputError(`data.sigma[${i}] is ${sigma[i]}; σ must be finite and > 0`);
      }
      weights[i] = 1 / sigma[i];
    }
  }
  if (!options) {
    throw new FitInputError('options with start values are required');
  }
  const start = toFloat64('options.start', options.start, kAll);
  requireFinite('options.start', start);
  const lower = options.lower
    ? toFloat64('options.lower', options.lower, kAll)
    : new Float64Array(kAll).fill(-Infinity);
  const upper = options.upper
    ? toFloat64('options.upper', options.upper, kAll)
    : new Float64Array(kAll).fill(Infinity);
  const fixed: boolean[] = [];
  if (options.fixed && options.fixed.length !== kAll) {
    throw new FitInputError(`options.fixed has length ${options.fixed.length}, expected ${kAll}`);
  }
  for (let j = 0; j < kAll; j++) {
    const isFixed = options.fixed ? Boolean(options.fixed[j]) : false;
    fixed.push(isFixed);
    if (Number.isNaN(lower[j]) || Number.isNaN(upper[j]) || lower[j] === Infinity || upper[j] === -Infinity) {
      throw new FitInputError(`bounds of ${names[j]} are invalid: [${lower[j]}, ${upper[j]}]`);
    }
    if (lower[j] > upper[j]) {
      throw new FitInputError(`lower bound of ${names[j]} (${lower[j]}) exceeds its upper bound (${upper[j]})`);
    }
    if (start[j] < lower[j] || start[j] > upper[j]) {
      throw new FitInputError(
        `start value of ${names[j]} (${start[j]}) lies outside its bounds [${lower[j]}, ${upper[j]}]`
      );
    }
    if (!isFixed && lower[j] === upper[j]) {
      throw new FitInputError(`${names[j]} has equal bounds; mark it fixed instead`);
    }
  }
  const free = fixed.flatMap((f, j) => (f ? [] : [j]));
  if (free.length === 0) {
    throw new FitInputError('all parameters are fixed; nothing to fit');
  }
  if (n < free.length) {
    throw new FitInputError(`${n} data points cannot determine ${free.length} free parameters`);
  }
  let maxEvaluations = FIT_DEFAULTS.maxEvaluationsPerParameter * (free.length + 1);
  if (options.maxEvaluations !== undefined) {
    if (!Number.isInteger(options.maxEvaluations) || options.maxEvaluations < 1) {
      throw new FitInputError(`options.maxEvaluations must be a positive integer, got ${options.maxEvaluations}`);
    }
    maxEvaluations = options.maxEvaluations;
  }
  const confidenceLevel = options.confidenceLevel ?? FIT_DEFAULTS.confidenceLevel;
  if (!(confidenceLevel > 0 && confidenceLevel < 1)) {
    throw new FitInputError(`options.confidenceLevel must lie in (0, 1), got ${confidenceLevel}`);
  }
  return {
    model,
    names,
    n,
    kAll,
    x,
    y,
    xLow,
    yLow,
    weights,
    start,
    lower,
    upper,
    fixed,
    free,
    maxEvaluations,
    ftol: positiveTolerance('ftol', options.ftol, FIT_DEFAULTS.ftol),
    xtol: positiveTolerance('xtol', options.xtol, FIT_DEFAULTS.xtol),
    gtol: positiveTolerance('gtol', options.gtol, FIT_DEFAULTS.gtol),
    confidenceLevel
  };
}
