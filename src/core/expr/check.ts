/**
 * Checks of a parsed expression tree before it is compiled, each with the
 * place in the text the user typed: functions (unknown, misspelt,
 * a name followed by a parenthesis that was meant as a product, argument
 * counts), operators, numbers, constructions models cannot use, and
 * quantities with units (`5 cm`, `3 kg`), which mathjs would parse as
 * units: a number followed, without `*`, by a unit name of two or more
 * characters that is not the x variable and not used elsewhere as a plain
 * name.
 */
import {
  Unit,
  isAccessorNode,
  isConditionalNode,
  isConstantNode,
  isFunctionNode,
  isIndexNode,
  isOperatorNode,
  isParenthesisNode,
  isRangeNode,
  isRelationalNode,
  isSymbolNode
} from 'mathjs';
import type { MathNode } from 'mathjs';
import { msg } from '../messages';
import type { ICoreMessage } from '../messages';
import { COMPARISONS, SUPPORTED_FUNCTIONS, SUPPORTED_OPERATORS, functionArity, valueChildren } from './compile';
import { editDistance } from './names';
import { ExpressionError, FUNCTION_ALIASES, quote } from './normalize';
import type { Locator } from './syntax';

/** Unit names of magnetism and thermal measurements that mathjs does not know. */
const EXTRA_UNITS: ReadonlySet<string> = new Set(['Oe', 'kOe', 'emu', 'muB', 'μB', 'mu_B', 'μ_B', 'mK', 'uK']);

/** Functions people expect that models do not offer (mathjs has them, or they are common elsewhere). */
const UNAVAILABLE_FUNCTIONS: ReadonlySet<string> = new Set([
  'erf',
  'erfc',
  'gamma',
  'lgamma',
  'floor',
  'ceil',
  'round',
  'fix',
  'mod',
  'factorial',
  'heaviside',
  'step',
  'theta',
  'if',
  'sum',
  'prod',
  'mean'
]);

/** True for a name that reads as a unit when written right after a number. */
export function isUnitName(name: string): boolean {
  if (EXTRA_UNITS.has(name)) {
    return true;
  }
  try {
    return Unit.isValuelessUnit(name);
  } catch {
    return false;
  }
}

/** Nearest supported function name to `name` (a misspelling), or null. */
export function suggestFunction(name: string): string | null {
  const candidates = [...SUPPORTED_FUNCTIONS, ...Object.keys(FUNCTION_ALIASES)];
  const lower = name.toLowerCase();
  let best: string | null = null;
  let bestRank = Number.POSITIVE_INFINITY;
  for (const c of candidates) {
    if (c.length < 3 || name.length < 2) {
      continue;
    }
    const d = c.toLowerCase() === lower ? 0 : editDistance(name, c, 2);
    const allowed = c.length >= 5 ? 2 : 1;
    // Closest first; among equals, the same length (a swap, `tahn` → tanh) before a dropped letter.
    const rank = d * 100 + Math.abs(c.length - name.length);
    if (d <= allowed && rank < bestRank) {
      best = Object.prototype.hasOwnProperty.call(FUNCTION_ALIASES, c) ? FUNCTION_ALIASES[c] : c;
      bestRank = rank;
    }
  }
  return best;
}

/** What the tree check needs to know. */
export interface ICheckContext {
  readonly locator: Locator;
  /** Names of the x variable (never units, even when mathjs knows them as units: `T`, `H`). */
  isVariable(name: string): boolean;
}

function fail(ctx: ICheckContext, at: number | null, build: (charNo: number | null) => ICoreMessage): never {
  const { pos, charNo } = ctx.locator.place(at);
  throw new ExpressionError(build(charNo), pos);
}

/** A factor that holds a number (so `… cm` after it is a quantity): 5, −5, (…) or 2·x written implicitly. */
export function numberLike(node: MathNode): boolean {
  if (isConstantNode(node) || isParenthesisNode(node)) {
    return true;
  }
  if (isOperatorNode(node) && (node.fn === 'unaryMinus' || node.fn === 'unaryPlus')) {
    return numberLike(node.args[0]);
  }
  return isOperatorNode(node) && node.fn === 'multiply' && node.implicit === true && numberLike(node.args[0]);
}

/** The name in `cm` or `cm^2` (the right factor of `5 cm^2`), else null. */
export function unitSymbol(node: MathNode): string | null {
  const base = isOperatorNode(node) && node.fn === 'pow' ? node.args[0] : node;
  return isSymbolNode(base) ? base.name : null;
}

/** Names written as plain factors or terms, outside `number unit` products. */
function explicitNames(node: MathNode, out = new Set<string>()): Set<string> {
  if (isSymbolNode(node)) {
    out.add(node.name);
    return out;
  }
  if (isOperatorNode(node) && node.fn === 'multiply' && node.implicit === true && numberLike(node.args[0]) && unitSymbol(node.args[1]) !== null) {
    explicitNames(node.args[0], out);
    const right = node.args[1];
    if (isOperatorNode(right)) {
      explicitNames(right.args[1], out);
    }
    return out;
  }
  for (const c of valueChildren(node)) {
    explicitNames(c, out);
  }
  return out;
}

/**
 * Walks the tree and throws `ExpressionError` (with the place) at the first
 * thing a model cannot use.
 */
export function checkTree(root: MathNode, ctx: ICheckContext): void {
  const plain = explicitNames(root);
  const walk = (node: MathNode): void => {
    if (isConstantNode(node)) {
      checkConstant(node.value as unknown, ctx);
      return;
    }
    if (isSymbolNode(node)) {
      return;
    }
    if (isOperatorNode(node)) {
      const fn: string = node.fn;
      if (fn === 'multiply' && node.implicit === true && numberLike(node.args[0])) {
        const unit = unitSymbol(node.args[1]);
        // One letter (`2b`, `300 K`) is more often a coefficient than a unit: that is a flag (see flags.ts), not an error.
        if (unit !== null && Array.from(unit).length > 1 && !ctx.isVariable(unit) && !plain.has(unit) && isUnitName(unit)) {
          const q = ctx.locator.quantity(unit);
          const amount = q.text.slice(0, q.text.length - unit.length).trim();
          const example = `${/^[0-9.]/.test(amount) ? amount : '2'}*${unit}`;
          fail(ctx, q.at, (k) =>
            msg(
              'expression.unit',
              'Character %1: “%2” reads as a quantity in %3. Expressions hold plain numbers in the units of your columns; if %3 is a parameter, write the product with *, as in %4.',
              k ?? '?',
              quote(q.text, 20),
              quote(unit, 12),
              quote(example, 20)
            )
          );
        }
      }
      if (!SUPPORTED_OPERATORS.includes(fn)) {
        checkOperator(fn, String(node.op), ctx);
      }
      node.args.forEach(walk);
      return;
    }
    if (isFunctionNode(node)) {
      checkFunction(node, ctx);
      node.args.forEach(walk);
      return;
    }
    if (isParenthesisNode(node) || isConditionalNode(node)) {
      valueChildren(node).forEach(walk);
      return;
    }
    if (isRelationalNode(node)) {
      for (const c of node.conditionals) {
        if (!Object.prototype.hasOwnProperty.call(COMPARISONS, c)) {
          checkOperator(c, c, ctx);
        }
      }
      node.params.forEach(walk);
      return;
    }
    if (isAccessorNode(node) || isIndexNode(node)) {
      fail(ctx, ctx.locator.operator('.'), (k) =>
        msg('expression.construct.dot', 'Character %1: a dot belongs inside a number such as 0.5; a name cannot be followed by a dot.', k ?? '?')
      );
    }
    if (isRangeNode(node)) {
      fail(ctx, ctx.locator.operator(':'), (k) =>
        msg('expression.construct.colon', 'Character %1: a colon belongs to a condition, written condition ? value if true : value if false.', k ?? '?')
      );
    }
    fail(ctx, null, () => msg('expression.construct', 'The expression contains a construction that models cannot use (%1).', node.type));
  };
  walk(root);
}

function checkConstant(v: unknown, ctx: ICheckContext): void {
  if (typeof v === 'number') {
    if (!Number.isFinite(v)) {
      const at = Number.isNaN(v) ? ctx.locator.name('NaN') : (ctx.locator.name('Infinity') ?? ctx.locator.number((t) => !Number.isFinite(Number(t))));
      fail(ctx, at, (k) =>
        msg('expression.number.infinite', 'Character %1: this number is infinite or not a number; models need finite numbers.', k ?? '?')
      );
    }
    return;
  }
  const word = String(v);
  fail(ctx, ctx.locator.name(word), (k) =>
    msg('expression.number.word', 'Character %1: “%2” is not a number; write 1 or 0, or a condition such as x > a.', k ?? '?', quote(word, 12))
  );
}

function checkOperator(fn: string, op: string, ctx: ICheckContext): never {
  if (fn === 'to') {
    fail(ctx, ctx.locator.operator(op) ?? ctx.locator.operator('in'), (k) =>
      msg('expression.unit.conversion', 'Character %1: unit conversions (“to”, “in”) are not part of model expressions; write plain numbers in the units of your columns.', k ?? '?')
    );
  }
  if (fn === 'factorial') {
    fail(ctx, ctx.locator.operator('!'), (k) =>
      msg('expression.operator.factorial', 'Character %1: “!” (factorial) is not supported; use != to compare.', k ?? '?')
    );
  }
  if (fn === 'mod') {
    fail(ctx, ctx.locator.operator('mod'), (k) => msg('expression.operator.mod', 'Character %1: remainders (mod) are not supported in models.', k ?? '?'));
  }
  fail(ctx, ctx.locator.operator(op), (k) =>
    msg('expression.operator.unsupported', 'Character %1: the operator “%2” is not supported in model expressions.', k ?? '?', quote(op, 8))
  );
}

function checkFunction(node: MathNode & { fn: unknown; args: MathNode[] }, ctx: ICheckContext): void {
  const fnNode = node.fn as MathNode;
  if (!isSymbolNode(fnNode)) {
    fail(ctx, null, () => msg('expression.function.form', 'A parenthesis directly after another one is read as a function call; write * between them.'));
  }
  const name = fnNode.name;
  const arity = functionArity(name);
  if (arity) {
    if (!arity.includes(node.args.length)) {
      fail(ctx, ctx.locator.name(name, true), (k) =>
        msg('expression.function.arity', 'Character %1: %2() takes %3 argument(s); here it has %4.', k ?? '?', name, arity.join(' or '), node.args.length)
      );
    }
    return;
  }
  const at = ctx.locator.name(name, true);
  const suggestion = suggestFunction(name);
  if (suggestion !== null) {
    fail(ctx, at, (k) => msg('expression.function.typo', 'Character %1: there is no function “%2” (did you mean %3?).', k ?? '?', quote(name, 24), suggestion));
  }
  if (UNAVAILABLE_FUNCTIONS.has(name)) {
    fail(ctx, at, (k) =>
      msg('expression.function.unavailable', 'Character %1: the function %2 is not available in model expressions. The functions are: %3.', k ?? '?', name, SUPPORTED_FUNCTIONS.join(', '))
    );
  }
  fail(ctx, at, (k) =>
    msg(
      'expression.function.call',
      'Character %1: “%2(…)” reads as a call of a function named %2, which does not exist. To multiply, write %2*(…).',
      k ?? '?',
      quote(name, 24)
    )
  );
}
