/**
 * User expression models for the fit engine (mathjs parsing, whitelisted
 * compilation, symbolic Jacobians).
 */
export { parseExpressionModel } from './expressionModel';
export type { IExpressionModel, IExpressionModelOptions } from './expressionModel';
export { ExpressionError, normalizeExpressionText, splitEquation, FUNCTION_ALIASES } from './normalize';
export { SUPPORTED_FUNCTIONS } from './compile';
export { PRECISE_FUNCTIONS } from './precise';
