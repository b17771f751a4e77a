/**
 * User expression models for the fit engine (normalised notation, mathjs
 * parsing with our own messages, whitelisted compilation, symbolic
 * Jacobians), their inspection before a fit and automatic start values.
 */
export { parseExpressionModel, prepareExpression } from './expressionModel';
export type { IExpressionModel, IExpressionModelOptions, IPreparedExpression } from './expressionModel';
export {
  ExpressionError,
  normalizeExpressionText,
  normalizeWithMap,
  splitEquation,
  FUNCTION_ALIASES
} from './normalize';
export type { INormalizedText, IEquationText } from './normalize';
export { SUPPORTED_FUNCTIONS } from './compile';
export { PRECISE_FUNCTIONS } from './precise';
export { inspectExpression } from './inspect';
export type { IExpressionInspection, IInspectOptions } from './inspect';
export { guessStarts, GUESS_EVALUATIONS, GUESS_POINTS } from './guess';
export type { IStartGuess } from './guess';
export { variableNamesFromHeader, columnKey } from './names';
export { DERIVATIVE_NODE_BUDGET } from './derivative';
export { compileFreeEnergy, typedErrorText, ORDER_PARAMETER_NAMES } from './free-energy';
export type { ICompiledFreeEnergy } from './free-energy';
