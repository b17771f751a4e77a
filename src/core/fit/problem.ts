/**
 * Validation of fit inputs at the engine boundary and the normalised
 * problem the solver works on.
 */
import { msg } from '../messages';
import type { ICoreMessage } from '../messages';
import { wholeNumber } from '../numeric/messageArgs';
import { ulp } from '../numeric/ulp';
import { FIT_DEFAULTS } from './defaults';
import { FitInputError } from './types';
import type { IFitData, IFitModel, IFitOptions } from './types';
import { Workspace } from './workspace';

/**
 * Largest |y|/σ (|y| without σ) the engine accepts. χ² sums the squares of
 * the weighted residuals in binary64 (range ≈ 1e±308): beyond 1e150 a single
 * square overflows to ∞ (and a sum over many points soon after), so the
 * optimiser would steer by infinities. No measured quantity in a sensible
 * unit comes near it.
 */
export const LARGEST_WEIGHTED_Y = 1e150;

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
  /** Where the fit's work arrays come from (released when the fit ends). */
  workspace: Workspace;
}

/** The messages about one input list: data (x, y, σ), their low-order parts, or per-parameter values. */
interface IListMessages {
  notList(): ICoreMessage;
  length(got: number, expected: number): ICoreMessage;
  /** `i` is 0-based. */
  notNumber(i: number): ICoreMessage;
}

/** The messages about an input list whose values must all be finite. */
interface IFiniteListMessages extends IListMessages {
  /** `i` is 0-based. */
  notFinite(i: number, value: number): ICoreMessage;
}

/** Messages about the data of `symbol` ('x', 'y', 'σ'). */
function dataList(symbol: string): IFiniteListMessages {
  return {
    notList: () => msg('fit.data-not-list', 'The %1 data are not a list of numbers.', symbol),
    length: (got, expected) => msg('fit.data-length', 'There are %1 values of %2 for %3 points: give one per point.', wholeNumber(got), symbol, wholeNumber(expected)),
    notNumber: i => msg('fit.data-not-number', 'Value %1 of %2 is not a number.', wholeNumber(i + 1), symbol),
    notFinite: (i, v) => msg('fit.data-not-finite', 'Value %1 of %2 is %3: every value must be a finite number.', wholeNumber(i + 1), symbol, v)
  };
}

/** The messages about x, y and σ, made once (a fit builds none on its way). */
const DATA_X = dataList('x');
const DATA_Y = dataList('y');
const DATA_SIGMA = dataList('σ');

/** Messages about the low-order parts of the data of `symbol` ('x', 'y'). */
function lowList(symbol: string): IFiniteListMessages {
  return {
    notList: () => msg('fit.low-part-not-list', 'The low-order parts of %1 are not a list of numbers.', symbol),
    length: (got, expected) => msg('fit.low-part-length', 'There are %1 low-order parts of %2 for %3 points: give one per point.', wholeNumber(got), symbol, wholeNumber(expected)),
    notNumber: i => msg('fit.low-part-not-number', 'Low-order part %1 of %2 is not a number.', wholeNumber(i + 1), symbol),
    notFinite: (i, v) => msg('fit.low-part-not-finite', 'Low-order part %1 of %2 is %3: every low-order part must be a finite number.', wholeNumber(i + 1), symbol, v)
  };
}

/** Messages about the start values of the parameters `names`. */
function startList(names: readonly string[]): IFiniteListMessages {
  const all = names.join(', ');
  return {
    notList: () => msg('fit.start-not-list', 'The start values are not a list of numbers, one per parameter (%1).', all),
    length: (got, expected) => msg('fit.start-length', 'There are %1 start values for %2 parameters (%3): give one per parameter.', got, expected, all),
    notNumber: i => msg('fit.start-not-number', 'The start value of parameter %1 (%2) is not a number.', i + 1, names[i]),
    notFinite: (i, v) => msg('fit.start-not-finite', 'The start value of parameter %1 (%2) is %3: give a finite number.', i + 1, names[i], v)
  };
}

/** Messages about the lower or upper bounds of the parameters `names` (bounds may be infinite). */
function boundList(side: 'lower' | 'upper', names: readonly string[]): IListMessages {
  const all = names.join(', ');
  return side === 'lower'
    ? {
        notList: () => msg('fit.lower-not-list', 'The lower bounds are not a list of numbers, one per parameter (%1).', all),
        length: (got, expected) => msg('fit.lower-length', 'There are %1 lower bounds for %2 parameters (%3): give one per parameter.', got, expected, all),
        notNumber: i => msg('fit.lower-not-number', 'The lower bound of parameter %1 (%2) is not a number.', i + 1, names[i])
      }
    : {
        notList: () => msg('fit.upper-not-list', 'The upper bounds are not a list of numbers, one per parameter (%1).', all),
        length: (got, expected) => msg('fit.upper-length', 'There are %1 upper bounds for %2 parameters (%3): give one per parameter.', got, expected, all),
        notNumber: i => msg('fit.upper-not-number', 'The upper bound of parameter %1 (%2) is not a number.', i + 1, names[i])
      };
}

function toFloat64(values: ArrayLike<number>, say: IListMessages, length?: number, workspace?: Workspace): Float64Array {
  if (values === null || typeof values !== 'object' || typeof values.length !== 'number') {
    throw new FitInputError(say.notList());
  }
  if (length !== undefined && values.length !== length) {
    throw new FitInputError(say.length(values.length, length));
  }
  if (values instanceof Float64Array) {
    return workspace ? workspace.copy(values) : values.slice();
  }
  const out = workspace ? workspace.take(values.length) : new Float64Array(values.length);
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    if (typeof v !== 'number') {
      throw new FitInputError(say.notNumber(i));
    }
    out[i] = v;
  }
  return out;
}

function requireFinite(values: Float64Array, say: IFiniteListMessages): void {
  for (let i = 0; i < values.length; i++) {
    if (!Number.isFinite(values[i])) {
      throw new FitInputError(say.notFinite(i, values[i]));
    }
  }
}

/** Optional low-order parts of `high`: same length, finite, |low| ≤ ulp(high). */
function lowParts(symbol: string, values: ArrayLike<number> | undefined | null, high: Float64Array): Float64Array | null {
  if (values === undefined || values === null) {
    return null;
  }
  const say = lowList(symbol);
  const low = toFloat64(values, say, high.length);
  requireFinite(low, say);
  for (let i = 0; i < low.length; i++) {
    if (Math.abs(low[i]) > ulp(high[i])) {
      throw new FitInputError(
        msg(
          'fit.low-part-too-large',
          'Low-order part %1 of %2 (%3) is larger than one unit in the last place of its value (%4): it must only hold the digits the value cannot.',
          wholeNumber(i + 1),
          symbol,
          low[i],
          { value: high[i], digits: 17 }
        )
      );
    }
  }
  return low;
}

/** Which stopping tolerance: of the relative change of χ², of the relative step, or of the gradient. */
type ToleranceKind = 'chi2' | 'step' | 'gradient';

function positiveTolerance(kind: ToleranceKind, value: number | undefined, fallback: number): number {
  if (value === undefined) {
    return fallback;
  }
  if (typeof value !== 'number' || !(value >= 0) || !Number.isFinite(value)) {
    const shown = typeof value === 'number' ? value : String(value);
    throw new FitInputError(
      kind === 'chi2'
        ? msg('fit.tolerance-invalid.chi2', 'The stopping tolerance on the relative change of χ² is %1: it must be a finite number of at least 0.', shown)
        : kind === 'step'
          ? msg('fit.tolerance-invalid.step', 'The stopping tolerance on the relative step of the parameters is %1: it must be a finite number of at least 0.', shown)
          : msg('fit.tolerance-invalid.gradient', 'The stopping tolerance on the gradient is %1: it must be a finite number of at least 0.', shown)
    );
  }
  return value;
}

/**
 * The fewest significant digits (at least 4) that show `a` and `b` as different
 * numbers, so that a message comparing them does not print the same text twice.
 */
export function distinguishingDigits(a: number, b: number): number {
  for (let digits = 4; digits < 17; digits++) {
    if (Number(a.toPrecision(digits)) !== Number(b.toPrecision(digits))) {
      return digits;
    }
  }
  return 17;
}

/** Checks every input and returns the normalised problem; throws `FitInputError`. */
export function buildProblem(model: IFitModel, data: IFitData, options: IFitOptions): IFitProblem {
  if (!model || typeof model.evaluate !== 'function' || !Array.isArray(model.parameters)) {
    throw new FitInputError(msg('fit.model-invalid', 'The model cannot be fitted: it must name its parameters and compute its values.'));
  }
  const names = model.parameters.map(String);
  const kAll = names.length;
  if (kAll === 0) {
    throw new FitInputError(msg('fit.no-parameters', 'The model has no parameters to fit.'));
  }
  if (new Set(names).size !== kAll) {
    throw new FitInputError(msg('fit.duplicate-parameters', 'The model names a parameter twice (%1): give every parameter its own name.', names.join(', ')));
  }
  if (!data) {
    throw new FitInputError(msg('fit.no-data', 'There are no data to fit.'));
  }
  const workspace = new Workspace();
  const x = toFloat64(data.x, DATA_X, undefined, workspace);
  const n = x.length;
  const y = toFloat64(data.y, DATA_Y, n, workspace);
  if (n === 0) {
    throw new FitInputError(msg('fit.empty-data', 'There are no data points to fit.'));
  }
  requireFinite(x, DATA_X);
  requireFinite(y, DATA_Y);
  const xLow = lowParts('x', data.xLow, x);
  const yLow = lowParts('y', data.yLow, y);
  let weights: Float64Array | null = null;
  if (data.sigma !== undefined && data.sigma !== null) {
    const sigma = toFloat64(data.sigma, DATA_SIGMA, n);
    weights = workspace.take(n);
    for (let i = 0; i < n; i++) {
      if (!(sigma[i] > 0) || !Number.isFinite(sigma[i])) {
        throw new FitInputError(
          msg('fit.sigma-not-positive', 'The uncertainty σ of point %1 is %2: every σ must be a finite number above 0.', wholeNumber(i + 1), sigma[i])
        );
      }
      weights[i] = 1 / sigma[i];
    }
  }
  for (let i = 0; i < n; i++) {
    const scaled = weights ? Math.abs(y[i]) * weights[i] : Math.abs(y[i]);
    if (!(scaled <= LARGEST_WEIGHTED_Y)) {
      throw new FitInputError(
        weights
          ? msg('fit.y-too-large-for-sigma', 'Point %1 has y = %2 with σ = %3: beyond |y|/σ = %4 the squares χ² sums overflow. Rescale y and σ (e.g. change their unit) or check σ.', wholeNumber(i + 1), y[i], 1 / weights[i], LARGEST_WEIGHTED_Y)
          : msg('fit.y-too-large', 'Point %1 has y = %2: beyond ±%3 the squares χ² sums overflow. Rescale y (e.g. change its unit) before fitting.', wholeNumber(i + 1), y[i], LARGEST_WEIGHTED_Y)
      );
    }
  }
  if (!options) {
    throw new FitInputError(msg('fit.no-start-values', 'Start values are needed, one per parameter (%1).', names.join(', ')));
  }
  const startMessages = startList(names);
  const start = toFloat64(options.start, startMessages, kAll);
  requireFinite(start, startMessages);
  const lower = options.lower
    ? toFloat64(options.lower, boundList('lower', names), kAll)
    : new Float64Array(kAll).fill(-Infinity);
  const upper = options.upper
    ? toFloat64(options.upper, boundList('upper', names), kAll)
    : new Float64Array(kAll).fill(Infinity);
  const fixed: boolean[] = [];
  if (options.fixed && options.fixed.length !== kAll) {
    throw new FitInputError(
      msg('fit.fixed-length', 'The choice of fixed parameters has %1 entries for %2 parameters (%3): give one per parameter.', options.fixed.length, kAll, names.join(', '))
    );
  }
  for (let j = 0; j < kAll; j++) {
    const isFixed = options.fixed ? Boolean(options.fixed[j]) : false;
    fixed.push(isFixed);
    if (Number.isNaN(lower[j]) || Number.isNaN(upper[j]) || lower[j] === Infinity || upper[j] === -Infinity) {
      throw new FitInputError(
        msg('fit.bounds-invalid', 'The range of %1 (%2 to %3) holds no value: the lower bound must be a number below +∞ and the upper bound a number above −∞.', names[j], lower[j], upper[j])
      );
    }
    if (lower[j] > upper[j]) {
      const digits = distinguishingDigits(lower[j], upper[j]);
      throw new FitInputError(
        msg('fit.bounds-reversed', 'The lower bound of %1 (%2) is above its upper bound (%3): swap them.', names[j], { value: lower[j], digits }, { value: upper[j], digits })
      );
    }
    if (start[j] < lower[j] || start[j] > upper[j]) {
      const digits = distinguishingDigits(start[j], start[j] < lower[j] ? lower[j] : upper[j]);
      throw new FitInputError(
        msg(
          'fit.start-outside-bounds',
          'The start value of %1 (%2) is outside the range it may take (%3 to %4): give a start value inside it.',
          names[j],
          { value: start[j], digits },
          { value: lower[j], digits },
          { value: upper[j], digits }
        )
      );
    }
    if (!isFixed && lower[j] === upper[j]) {
      throw new FitInputError(msg('fit.bounds-equal', 'The lower and upper bounds of %1 are both %2: mark %1 fixed instead.', names[j], { value: lower[j], digits: 17 }));
    }
  }
  const free = fixed.flatMap((f, j) => (f ? [] : [j]));
  if (free.length === 0) {
    throw new FitInputError(msg('fit.all-fixed', 'Every parameter is fixed, so there is nothing to fit: free at least one.'));
  }
  if (n < free.length) {
    throw new FitInputError(
      msg('fit.too-few-points', '%1 data points cannot determine %2 free parameters: add points or fix parameters.', wholeNumber(n), free.length)
    );
  }
  let maxEvaluations = FIT_DEFAULTS.maxEvaluationsPerParameter * (free.length + 1);
  if (options.maxEvaluations !== undefined) {
    if (!Number.isInteger(options.maxEvaluations) || options.maxEvaluations < 1) {
      throw new FitInputError(
        msg('fit.budget-invalid', 'The evaluation budget is %1: it must be a whole number of at least 1.', typeof options.maxEvaluations === 'number' ? wholeNumber(options.maxEvaluations) : String(options.maxEvaluations))
      );
    }
    maxEvaluations = options.maxEvaluations;
  }
  const confidenceLevel = options.confidenceLevel ?? FIT_DEFAULTS.confidenceLevel;
  if (!(confidenceLevel > 0 && confidenceLevel < 1)) {
    throw new FitInputError(
      msg('fit.confidence-level-invalid', 'The confidence level is %1: it must lie between 0 and 1 (0.6827 for ±1σ).', typeof confidenceLevel === 'number' ? confidenceLevel : String(confidenceLevel))
    );
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
    ftol: positiveTolerance('chi2', options.ftol, FIT_DEFAULTS.ftol),
    xtol: positiveTolerance('step', options.xtol, FIT_DEFAULTS.xtol),
    gtol: positiveTolerance('gradient', options.gtol, FIT_DEFAULTS.gtol),
    confidenceLevel,
    workspace
  };
}
