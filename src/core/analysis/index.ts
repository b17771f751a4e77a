/**
 * Analyses the panel runs on two table columns: critical power law, Weiss
 * mean field, Curie–Weiss and user expressions, each over a fit window.
 */
export type { AnalysisModel, IAnalysisJob, IAnalysisModelOptions, IAnalysisOutcome, IDerivedValue } from './types';
export { AnalysisInputError } from './types';
export { CURVE_POINTS, parseStarts, runAnalysisJob } from './run';
export type { IAnalysisHooks } from './run';
export { grid, windowedPoints } from './window';
export { formatPlain, formatWithError } from './format';
export type { IWindowedPoints } from './window';
export { handleAnalysisMessage } from './protocol';
export type { AnalysisRequest, AnalysisResponse } from './protocol';
