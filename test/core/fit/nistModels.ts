/**
 * Hand-written array models for the 27 NIST StRD nonlinear regression problems,
 * transcribed from the model line printed in each file (NIST Statistical
 * Reference Datasets, Nonlinear Regression). Nelson has two predictors and
 * the response log(y): it uses x = point index and closes over x1, x2.
 */
import type { IFitModel } from '../../../src/core/fit/index';
import { parseExpressionModel } from '../../../src/core/expr/index';
import * as DD from '../../../src/core/numeric/dd/index';
import type { IDoubleDouble, IDoubleDoubleArray } from '../../../src/core/numeric/dd/index';
import type { INistProblem } from './nistData';

/** Model values for parameters b at every x, into out. */
type ArrayModel = (b: Float64Array, x: Float64Array, out: Float64Array) => void;
type PrecisePointwise = (b: IDoubleDouble[], x: IDoubleDouble) => IDoubleDouble;

const { exp, cos, sin, atan, pow, sqrt, PI } = Math;

/**
 * Each model is its own loop over the points (one call per pass, not one
 * per point), with what depends on the parameters only taken out of the
 * loop and integer powers written as products: the way a model for this
 * engine is written by hand. Nothing depending on x alone is kept between
 * passes.
 */
const KERNELS: Record<string, ArrayModel> = {
  Bennett5(b, x, out) {
    const e = -1 / b[2];
    for (let i = 0; i < x.length; i++) {
      out[i] = b[0] * pow(b[1] + x[i], e);
    }
  },
  BoxBOD: saturation,
  Chwirut1: chwirut,
  Chwirut2: chwirut,
  DanWood(b, x, out) {
    for (let i = 0; i < x.length; i++) {
      out[i] = b[0] * pow(x[i], b[1]);
    }
  },
  ENSO(b, x, out) {
    const w1 = (2 * PI) / 12;
    const w2 = (2 * PI) / b[3];
    const w3 = (2 * PI) / b[6];
    for (let i = 0; i < x.length; i++) {
      const xi = x[i];
      out[i] =
        b[0] + b[1] * cos(w1 * xi) + b[2] * sin(w1 * xi) + b[4] * cos(w2 * xi) + b[5] * sin(w2 * xi) + b[7] * cos(w3 * xi) + b[8] * sin(w3 * xi);
    }
  },
  Eckerle4(b, x, out) {
    const a = b[0] / b[1];
    const inv = 1 / b[1];
    for (let i = 0; i < x.length; i++) {
      const d = (x[i] - b[2]) * inv;
      out[i] = a * exp(-0.5 * d * d);
    }
  },
  Gauss1: gauss,
  Gauss2: gauss,
  Gauss3: gauss,
  Hahn1: rationalCubic,
  Kirby2(b, x, out) {
    for (let i = 0; i < x.length; i++) {
      const xi = x[i];
      out[i] = (b[0] + xi * (b[1] + xi * b[2])) / (1 + xi * (b[3] + xi * b[4]));
    }
  },
  Lanczos1: lanczos,
  Lanczos2: lanczos,
  Lanczos3: lanczos,
  MGH09(b, x, out) {
    for (let i = 0; i < x.length; i++) {
      const xi = x[i];
      out[i] = (b[0] * xi * (xi + b[1])) / (xi * (xi + b[2]) + b[3]);
    }
  },
  MGH10(b, x, out) {
    for (let i = 0; i < x.length; i++) {
      out[i] = b[0] * exp(b[1] / (x[i] + b[2]));
    }
  },
  MGH17(b, x, out) {
    for (let i = 0; i < x.length; i++) {
      const xi = x[i];
      out[i] = b[0] + b[1] * exp(-xi * b[3]) + b[2] * exp(-xi * b[4]);
    }
  },
  Misra1a: saturation,
  Misra1b(b, x, out) {
    for (let i = 0; i < x.length; i++) {
      const t = 1 + (b[1] * x[i]) / 2;
      out[i] = b[0] * (1 - 1 / (t * t));
    }
  },
  Misra1c(b, x, out) {
    for (let i = 0; i < x.length; i++) {
      out[i] = b[0] * (1 - 1 / sqrt(1 + 2 * b[1] * x[i]));
    }
  },
  Misra1d(b, x, out) {
    for (let i = 0; i < x.length; i++) {
      const t = b[1] * x[i];
      out[i] = (b[0] * t) / (1 + t);
    }
  },
  Rat42(b, x, out) {
    for (let i = 0; i < x.length; i++) {
      out[i] = b[0] / (1 + exp(b[1] - b[2] * x[i]));
    }
  },
  Rat43(b, x, out) {
    const e = 1 / b[3];
    for (let i = 0; i < x.length; i++) {
      out[i] = b[0] / pow(1 + exp(b[1] - b[2] * x[i]), e);
    }
  },
  Roszman1(b, x, out) {
    for (let i = 0; i < x.length; i++) {
      const xi = x[i];
      out[i] = b[0] - b[1] * xi - atan(b[2] / (xi - b[3])) / PI;
    }
  },
  Thurber: rationalCubic
};

/** b1·(1 − e^(−b2·x)) (BoxBOD, Misra1a). */
function saturation(b: Float64Array, x: Float64Array, out: Float64Array): void {
  for (let i = 0; i < x.length; i++) {
    out[i] = b[0] * (1 - exp(-b[1] * x[i]));
  }
}

/** e^(−b1·x) / (b2 + b3·x) (Chwirut1, Chwirut2). */
function chwirut(b: Float64Array, x: Float64Array, out: Float64Array): void {
  for (let i = 0; i < x.length; i++) {
    const xi = x[i];
    out[i] = exp(-b[0] * xi) / (b[1] + b[2] * xi);
  }
}

/** (b1 + b2·x + b3·x² + b4·x³) / (1 + b5·x + b6·x² + b7·x³) (Hahn1, Thurber), by Horner's rule. */
function rationalCubic(b: Float64Array, x: Float64Array, out: Float64Array): void {
  for (let i = 0; i < x.length; i++) {
    const xi = x[i];
    out[i] = (b[0] + xi * (b[1] + xi * (b[2] + xi * b[3]))) / (1 + xi * (b[4] + xi * (b[5] + xi * b[6])));
  }
}

/** b1·e^(−b2·x) + b3·e^(−(x−b4)²/b5²) + b6·e^(−(x−b7)²/b8²) (Gauss1–3). */
function gauss(b: Float64Array, x: Float64Array, out: Float64Array): void {
  const s1 = 1 / (b[4] * b[4]);
  const s2 = 1 / (b[7] * b[7]);
  for (let i = 0; i < x.length; i++) {
    const xi = x[i];
    const d1 = xi - b[3];
    const d2 = xi - b[6];
    out[i] = b[0] * exp(-b[1] * xi) + b[2] * exp(-d1 * d1 * s1) + b[5] * exp(-d2 * d2 * s2);
  }
}

/** b1·e^(−b2·x) + b3·e^(−b4·x) + b5·e^(−b6·x) (Lanczos1–3). */
function lanczos(b: Float64Array, x: Float64Array, out: Float64Array): void {
  for (let i = 0; i < x.length; i++) {
    const xi = x[i];
    out[i] = b[0] * exp(-b[1] * xi) + b[2] * exp(-b[3] * xi) + b[4] * exp(-b[5] * xi);
  }
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
  const kernel = KERNELS[p.name];
  if (!kernel) {
    throw new Error(`no hand-written model for ${p.name}`);
  }
  const model: IFitModel = { parameters: p.parameters, evaluate: kernel };
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
