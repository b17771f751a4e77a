/**
 * Inspection of an expression before a fit, for the panel: the text as it
 * will be fitted, its free parameters, notes about names that look
 * mistaken, or what is wrong and where (with a caret under the place).
 */
import { msg } from '../messages';
import type { ICoreMessage } from '../messages';
import { parseExpressionModel } from './expressionModel';
import { ExpressionError, normalizeExpressionText } from './normalize';
import { caretLines } from './syntax';

/** What `inspectExpression` finds. */
export interface IExpressionInspection {
  ok: boolean;
  /** the expression as it will be fitted (normalised notation) */
  normalized: string;
  /** free parameters found, in order of appearance */
  parameters: string[];
  /**
   * notes about names: a name that looks like a column header (case /
   * whitespace / unit-stripped match to one of columnNames) or like the x
   * variable in another case, a function name without parentheses or
   * misspelt, two parameters one character apart (`Tc`, `TC`), `E` as
   * Euler's number
   */
  flags: ICoreMessage[];
  /** when !ok: what is wrong, in our words, and where */
  error: ICoreMessage | null;
  /** index into the ORIGINAL text of the problem, or null */
  position: number | null;
  /**
   * two lines: the original text (shortened around the position if longer
   * than 80 characters) and a caret line `    ^` under the problem
   */
  caret: string | null;
}

/** Options of `inspectExpression`. */
export interface IInspectOptions {
  /** Names of the x variable: `x` and the names of the x column (e.g. `['x', 'T']` for "T (K)"). */
  xNames: string[];
  /** Headers of all the table's columns. */
  columnNames?: string[];
}

/**
 * Checks `text` as `parseExpressionModel` would (same messages), without
 * building kernels or derivatives, and reports for the panel.
 */
export function inspectExpression(text: string, options: IInspectOptions): IExpressionInspection {
  const xNames = options.xNames.length > 0 ? options.xNames : ['x'];
  let normalized = '';
  try {
    normalized = normalizeExpressionText(text);
  } catch {
    normalized = typeof text === 'string' ? text.trim() : '';
  }
  try {
    // Everything the fit will meet except the derivatives (the same checks and messages).
    const model = parseExpressionModel(text, {
      variables: [xNames[0]],
      aliases: xNames.slice(1),
      columnNames: options.columnNames ?? [],
      symbolicJacobian: false
    });
    return { ok: true, normalized, parameters: model.parameters.slice(), flags: model.flags.slice(), error: null, position: null, caret: null };
  } catch (err) {
    const position = err instanceof ExpressionError ? err.position : null;
    const error =
      err instanceof ExpressionError ? err.detail : msg('expression.unexpected', 'The expression cannot be checked: psiscape met an internal problem.');
    return {
      ok: false,
      normalized,
      parameters: [],
      flags: [],
      error,
      position,
      caret: position === null || typeof text !== 'string' ? null : caretLines(text, position)
    };
  }
}
