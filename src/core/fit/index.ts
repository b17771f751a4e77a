/**
 * Nonlinear least-squares engine (Levenberg–Marquardt with bounds).
 *
 * Entry point: `fitCurve(model, data, options)`.
 * Models with several independent variables pass x = point index and
 * close over their own columns (see `IFitModel`).
 */
export type {
  IFitModel,
  IFitData,
  IFitOptions,
  IFitResult,
  IFitProgress,
  ErrorScaling
} from './types';
export { FitInputError } from './types';
export type { IDoubleDouble, IDoubleDoubleArray } from '../numeric/dd/core';
export { fitCurve } from './fitCurve';
export { FIT_DEFAULTS } from './defaults';
export { startFit } from './fitCurve';
export type { IFitRun } from './fitCurve';
