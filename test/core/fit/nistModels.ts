/**
 * Hand-written models for the 27 NIST StRD nonlinear regression problems,
 * transcribed from the model line printed in each file (NIST Statistical
 * Reference Datasets, Nonlinear Regression). Nelson has two predictors and
 * the response log(y): it uses x = point index and closes over x1, x2.
 */
import type { IFitModel } from '../../../src/core/fit/index';
import type { INistProblem } from './nistData';

type Pointwise = (b: Float64Array, x: number) => number;

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

/** Model, x and y for fitting problem `p` with a hand-written model. */
export function handModel(p: INistProblem): { model: IFitModel; x: number[]; y: number[] } {
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
    return { model, x: x1.map((_, i) => i), y: p.data.y.map(Math.log) };
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
  return { model, x: p.data.x, y: p.data.y };
}
