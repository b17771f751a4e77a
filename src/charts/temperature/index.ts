/**
 * Vega-Lite spec builders for the temperature-sweep fit views: residuals,
 * parameter correlations, the exponent against the fit window, reduced
 * magnetisation with reference curves, and inverse susceptibility. Each takes
 * `(input, theme, options)` and returns an `ISweepChart`: the spec, its row
 * count, a title and a caption.
 */
export type { ISweepChart } from '../sweeps/common';
export type { ITemperatureChartOptions } from './common';
export { buildResidualSpec } from './residuals';
export type { IResidualChartOptions, IResidualInput } from './residuals';
export { buildCorrelationSpec } from './correlation';
export type { ICorrelationInput } from './correlation';
export { buildWindowScanSpec, WINDOW_VERDICT_WORDS } from './window-scan';
export type { IWindowScanInput } from './window-scan';
export { buildReducedSpec, REDUCED_CURVE_DASHES } from './reduced';
export type { IReducedChartOptions, IReducedInput } from './reduced';
export { buildInverseChiSpec } from './inverse-chi';
export type { IInverseChiChartOptions, IInverseChiInput } from './inverse-chi';
