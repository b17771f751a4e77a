/**
 * Views of a temperature sweep's fit: the model comparison, the exponent
 * against the fit window, the bootstrap, the reduced plot with reference
 * curves and 1/χ against T.
 */
export { BootstrapView } from './bootstrap';
export { ComparisonView } from './comparison';
export { InverseChiView } from './inverse-chi';
export { ReducedPlotView, reductionOf } from './reduced';
export type { IReduction } from './reduced';
export { WindowScanView, WINDOW_SCAN_KINDS, windowOfCell } from './window-scan';
export type { ITemperatureViewOptions } from './common';
