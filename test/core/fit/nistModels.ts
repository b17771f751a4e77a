/**
 * Hand-written models for the 27 NIST StRD nonlinear regression problems,
 * transcribed from the model line printed in each file (NIST Statistical
 * Reference Datasets, Nonlinear Regression). Nelson has two predictors and
 * the response log(y): it uses x = point index and closes over x1, x2.
 */
import type { IFitModel } from '../../../src/core/fit/index';
import { parseExpressionModel } from '../../../src/core/expr/index';
import * as DD from '../../../src/core/numeric/dd/index';
import type { IDoubleDouble, IDoubleDoubleArray } from '../../../src/core/numeric/dd/index';
import type { INistProblem } from './nistData';

type Pointwise = (b: Float64Array, x: number) => number;
type PrecisePointwise = (b: IDoubleDouble[], x: IDoubleDouble) => IDoubleDouble;

const { exp, cos, sin, atan, PI } = Math;

const POINTWISE: Record<string, Pointwise> = {
  Bennett5: (b, x) => b[0] * (b[1] + x) ** (-1 / b[2]),
  BoxBOD: (b, x) => b[0] * (1 - exp(-b[1] * x)),
  Chwirut1: (b, x) => exp(-b[0] * x) / (b[1] + b[2] * x),
  Chwirut2: (b, x) => exp(-b[0] * x) / (b[1] + b[2] * x),
  DanWood: (b, x) => b[0] * x ** b[1],
  ENSO: (b, x) =>
    b[0] +
    b[1] * cos((2 * PI * x) / 12) +
    b[2] * sin((2 * PI * x) / 12) +
    b[4] * cos((2 * PI * x) / b[3]) +
    b[5] * sin((2 * PI * x) / b[3]) +
    b[7] * cos((2 * PI * x) / b[6]) +
    b[8] * sin((2 * PI * x) / b[6]),
  Eckerle4: (b, x) => (b[0] / b[1]) * exp(-0.5 * ((x - b[2]) / b[1]) ** 2),
  Gauss1: gauss,
  Gauss2: gauss,
  Gauss3: gauss,
  Hahn1: (b, x) =>
    (b[0] + b[1] * x + b[2] * x ** 2 + b[3] * x ** 3) / (1 + b[4] * x + b[5] * x ** 2 + b[6] * x ** 3),
  Kirby2: (b, x) => (b[0] + b[1] * x + b[2] * x ** 2) / (1 + b[3] * x + b[4] * x ** 2),
  Lanczos1: lanczos,
  Lanczos2: lanczos,
  Lanczos3: lanczos,
  MGH09: (b, x) => (b[0] * (x ** 2 + x * b[1])) / (x ** 2 + x * b[2] + b[3]),
  MGH10: (b, x) => b[0] * exp(b[1] / (x + b[2])),
  MGH17: (b, x) => b[0] + b[1] * exp(-x * b[3]) + b[2] * exp(-x * b[4]),
  Misra1a: (b, x) => b[0] * (1 - exp(-b[1] * x)),
  Misra1b: (b, x) => b[0] * (1 - (1 + (b[1] * x) / 2) ** -2),
  Misra1c: (b, x) => b[0] * (1 - (1 + 2 * b[1] * x) ** -0.5),
  Misra1d: (b, x) => (b[0] * b[1] * x) / (1 + b[1] * x),
  Rat42: (b, x) => b[0] / (1 + exp(b[1] - b[2] * x)),
  Rat43: (b, x) => b[0] / (1 + exp(b[1] - b[2] * x)) ** (1 / b[3]),
  Roszman1: (b, x) => b[0] - b[1] * x - atan(b[2] / (x - b[3])) / PI,
  Thurber: (b, x) =>
    (b[0] + b[1] * x + b[2] * x ** 2 + b[3] * x ** 3) / (1 + b[4] * x + b[5] * x ** 2 + b[6] * x ** 3)
};

function gauss(b: Float64Array, x: number): number {
  return (
    b[0] * exp(-b[1] * x) +
    b[2] * exp(-((x - b[3]) ** 2) / b[4] ** 2) +
    b[5] * exp(-((x - b[6]) ** 2) / b[7] ** 2)
  );
}

function lanczos(b: Float64Array, x: number): number {
  return b[0] * exp(-b[1] * x) + b[2] * exp(-b[3] * x) + b[4] * exp(-b[5] * x);
}

/** Lanczos1–3 in double-double: b1·e^(−b2·x) + b3·e^(−b4·x) + b5·e^(−b6·x). */
function lanczosPrecise(b: IDoubleDouble[], x: IDoubleDouble): IDoubleDouble {
  let sum = DD.DD_ZERO;
  for (let j = 0; j < 6; j += 2) {
    sum = DD.add(sum, DD.mul(b[j], DD.exp(DD.neg(DD.mul(b[j + 1], x)))));
  }
  return sum;
}

/** Double-double versions of hand-written models (used by the fit's refinement). */
const PRECISE: Record<string, PrecisePointwise> = {
  Lanczos1: lanczosPrecise,
  Lanczos2: lanczosPrecise,
  Lanczos3: lanczosPrecise
};

function preciseEvaluator(
  fn: PrecisePointwise
): (p: IDoubleDoubleArray, x: IDoubleDoubleArray, out: IDoubleDoubleArray) => void {
  return (p, x, out) => {
    const b = Array.from(p.hi, (hi, j) => ({ hi, lo: p.lo[j] }));
    for (let i = 0; i < x.hi.length; i++) {
      const v = fn(b, { hi: x.hi[i], lo: x.lo[i] });
      out.hi[i] = v.hi;
      out.lo[i] = v.lo;
    }
  };
}

/** Model and data (with the double-double low parts of the printed decimals) for a hand-written model. */
export interface IHandProblem {
  model: IFitModel;
  x: number[];
  y: number[];
  /** x + xLow is the printed x exactly (to double-double precision); absent when x is a point index. */
  xLow?: number[];
  /** y + yLow is the (transformed) response to double-double precision. */
  yLow: number[];
}

/** Model, x and y for fitting problem `p` with a hand-written model. */
export function handModel(p: INistProblem): IHandProblem {
  if (p.name === 'Nelson') {
    const x1 = p.data.x1;
    const x2 = p.data.x2;
    const model: IFitModel = {
      parameters: p.parameters,
      evaluate(b, idx, out) {
        for (let i = 0; i < idx.length; i++) {
          const j = idx[i];
          out[i] = b[0] - b[1] * x1[j] * exp(-b[2] * x2[j]);
        }
      }
    };
    return { model, x: x1.map((_, i) => i), ...logResponse(p) };
  }
  const fn = POINTWISE[p.name];
  if (!fn) {
    throw new Error(`no hand-written model for ${p.name}`);
  }
  const model: IFitModel = {
    parameters: p.parameters,
    evaluate(b, x, out) {
      for (let i = 0; i < x.length; i++) {
        out[i] = fn(b, x[i]);
      }
    }
  };
  const precise = PRECISE[p.name];
  if (precise) {
    model.evaluatePrecise = preciseEvaluator(precise);
  }
  return { model, x: p.data.x, y: p.data.y, xLow: p.dataLow.x, yLow: p.dataLow.y };
}

/**
 * Nelson's response log(y) as double-double of the exact decimal y: y is
 * the rounded double-double logarithm and yLow its remainder (log of the
 * binary64 y can be off by several ulps of the logarithm, beyond what a low
 * part may hold).
 */
export function logResponse(p: INistProblem): { y: number[]; yLow: number[] } {
  const logs = p.data.y.map((v, i) => DD.log({ hi: v, lo: p.dataLow.y[i] }));
  return { y: logs.map((v) => v.hi), yLow: logs.map((v) => v.lo) };
}

/**
 * Fit data for problem `p` with the double-double low parts of the printed
 * decimals, for a model's `x` and (possibly transformed) `y`: x is a point
 * index for several predictors (no low parts); a response printed as
 * log[y] (Nelson) takes y and its low parts from the double-double log.
 */
export function nistFitData(
  p: INistProblem,
  x: number[],
  y: number[]
): { x: number[]; y: number[]; xLow?: number[]; yLow: number[] } {
  const indexed = p.data.x === undefined;
  const data = /^\s*log\s*\[\s*y\s*\]/.test(p.modelText) ? { x, ...logResponse(p) } : { x, y, yLow: p.dataLow.y };
  return indexed ? data : { ...data, xLow: p.dataLow.x };
}

/**
 * The model text printed in a NIST file, parsed (symbolic Jacobian); with
 * several predictors x is the point index and the model reads the columns.
 */
export function expressionNistModel(p: INistProblem): { model: IFitModel; x: number[]; y: number[] } {
  const vars = p.columns.filter((c) => c !== 'y');
  const multi = vars.length > 1;
  const model = parseExpressionModel(p.modelText, {
    variables: vars,
    constants: p.constants,
    parameters: p.parameters,
    columns: multi ? Object.fromEntries(vars.map((v) => [v, p.data[v]])) : undefined
  });
  const x = multi ? p.data.y.map((_, i) => i) : p.data[vars[0]];
  return { model, x, y: model.transformResponse(p.data.y) };
}
