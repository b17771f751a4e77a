/**
 * From the text a user typed to checked mathjs trees: normalisation (with
 * the map back to the original), character and parenthesis scan, the
 * `response = model` split, parsing with errors in our words, and the tree
 * checks. Shared by `parseExpressionModel` and `inspectExpression`, so both
 * report the same problem at the same place.
 */
import type { MathNode } from 'mathjs';
import { msg } from '../messages';
import { checkTree } from './check';
import { ExpressionError, normalizeWithMap, splitEquationAt } from './normalize';
import type { INormalizedText } from './normalize';
import { Locator, characterNumber, originalIndex, parsePart, scanText } from './syntax';

/** A checked expression. */
export interface IAnalysedExpression {
  readonly original: string;
  readonly normalized: INormalizedText;
  /** Left-hand side (normalised text) or null. */
  readonly lhs: string | null;
  /** Right-hand side (normalised text). */
  readonly rhs: string;
  readonly lhsNode: MathNode | null;
  readonly rhsNode: MathNode;
  readonly lhsLocator: Locator | null;
  readonly rhsLocator: Locator;
}

/** Built-in constants of expressions (a parameter list naming one of them makes it a parameter). */
export const BUILTIN_CONSTANTS: Readonly<Record<string, number>> = Object.freeze({ pi: Math.PI, PI: Math.PI, π: Math.PI, e: Math.E, E: Math.E });

/**
 * Normalises, scans, splits, parses and checks `text`. `isVariable` tells
 * the names of the x variable (exempt from the unit check: `2 T` with a
 * column T is 2·T). Throws `ExpressionError` with the position in `text`.
 */
export function analyseExpression(text: unknown, isVariable: (name: string) => boolean): IAnalysedExpression {
  if (typeof text !== 'string' || text.trim() === '') {
    throw new ExpressionError(msg('expression.empty', 'The model expression is empty: write one, e.g. A*exp(-x/T0) + c.'), null);
  }
  try {
    return analyse(text, isVariable);
  } catch (err) {
    if (err instanceof RangeError) {
      throw new ExpressionError(
        msg('expression.depth', 'The expression is too deeply nested or too long to read; split it into simpler terms.'),
        null
      );
    }
    throw err;
  }
}

function analyse(text: string, isVariable: (name: string) => boolean): IAnalysedExpression {
  const n = normalizeWithMap(text);
  scanText(n, text);
  const split = splitEquationAt(n.text);
  if (split.equals.length > 1) {
    const pos = originalIndex(n, split.equals[1]);
    throw new ExpressionError(
      msg('expression.equals', "Character %1: a second '='. An equation has one: response = model (or just the model).", characterNumber(text, pos)),
      pos
    );
  }
  if (split.rhs === '') {
    const pos = originalIndex(n, n.text.length);
    throw new ExpressionError(msg('expression.model.empty', "Nothing follows '=': write the model after it."), pos);
  }
  if (split.lhs === '') {
    throw new ExpressionError(msg('expression.response.empty', "Nothing stands before '=': write the response there (e.g. y) or remove the '='."), originalIndex(n, 0));
  }
  const rhsEnd = split.rhsOffset + split.rhs.length;
  const rhsLocator = new Locator(n, text, split.rhsOffset, rhsEnd);
  const rhsNode = parsePart(split.rhs, split.rhsOffset, n, text);
  checkTree(rhsNode, { locator: rhsLocator, isVariable });
  let lhsNode: MathNode | null = null;
  let lhsLocator: Locator | null = null;
  if (split.lhs !== null) {
    lhsLocator = new Locator(n, text, split.lhsOffset, split.lhsOffset + split.lhs.length);
    lhsNode = parsePart(split.lhs, split.lhsOffset, n, text);
    checkTree(lhsNode, { locator: lhsLocator, isVariable: () => false });
  }
  return { original: text, normalized: n, lhs: split.lhs, rhs: split.rhs, lhsNode, rhsNode, lhsLocator, rhsLocator };
}

/** ExpressionError at the first place of `name` in `locator` (or without a place). */
export function errorAtName(locator: Locator | null, name: string, build: (charNo: number | string) => ReturnType<typeof msg>): ExpressionError {
  const { pos, charNo } = locator ? locator.place(locator.name(name)) : { pos: null, charNo: null };
  return new ExpressionError(build(charNo ?? '?'), pos);
}
