/**
 * Text normalisation of model expressions typed by users or printed in
 * reference files: `[ ]` → `( )`, `**` → `^`, function aliases
 * (`arctan` → `atan`, `ln` → `log`, …) and an optional `lhs = rhs` form.
 */

/** Function-name aliases accepted in expressions, mapped to the canonical name. */
export const FUNCTION_ALIASES: Readonly<Record<string, string>> = Object.freeze({
  arctan: 'atan',
  arcsin: 'asin',
  arccos: 'acos',
  arctanh: 'atanh',
  arcsinh: 'asinh',
  arccosh: 'acosh',
  ln: 'log'
});

/** Result of splitting `lhs = rhs`. */
export interface IEquationText {
  /** Left-hand side (response), or null when the text has no `=`. */
  lhs: string | null;
  /** Right-hand side (model). */
  rhs: string;
}

/** Applies the bracket, power and alias mappings. */
export function normalizeExpressionText(text: string): string {
  let s = text.replace(/\[/g, '(').replace(/\]/g, ')').replace(/\*\*/g, '^');
  for (const [alias, name] of Object.entries(FUNCTION_ALIASES)) {
    s = s.replace(new RegExp(`\\b${alias}\\s*\\(`, 'g'), `${name}(`);
  }
  return s.trim();
}

/** Splits a normalised `lhs = rhs` text at its single `=` (not `==`, `<=`, `>=`, `!=`). */
export function splitEquation(text: string): IEquationText {
  const parts = text.split(/(?<![<>=!])=(?!=)/);
  if (parts.length === 1) {
    return { lhs: null, rhs: text.trim() };
  }
  if (parts.length !== 2) {
    throw new ExpressionError(`expected at most one '=' in "${text}"`);
  }
  return { lhs: parts[0].trim(), rhs: parts[1].trim() };
}

/** Error in a model expression (syntax, unknown function, unsupported construct). */
export class ExpressionError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'ExpressionError';
  }
}
