/**
 * Analyses the panel runs on two table columns over a fit window: the
 * catalogue of kinds, the job runner, the verdict, the session that owns one
 * analysis's state, and number formatting with errors.
 */
export type { AnalysisOptionValue, IAnalysisJob, IAnalysisOutcome, IDerivedValue } from './types';
export { AnalysisInputError } from './errors';
export type { IAnalysisHooks } from './hooks';
export { runAnalysisJob } from './run';
export { ANALYSIS_KINDS, DEFAULT_KIND, defaultOptions, isKnownKind, kindById, optionsFromJson, optionToJson, validateKindSettings } from './kinds';
export type { AnalysisKindId, IAnalysisKind, OptionSpec, OptionValue, ResultView } from './kinds';
export { CURVE_POINTS } from './kinds/common';
export { parseStarts } from './kinds/expression';
export { grid, windowedPoints } from './window';
export type { IWindowedPoints } from './window';
export { formatPlain, formatWithError } from './format';
