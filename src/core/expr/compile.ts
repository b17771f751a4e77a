/**
 * Translation of a mathjs expression tree into JavaScript source over a
 * whitelist: numbers, symbols resolved by the caller, + − × ÷ ^, the
 * functions in `FUNCTIONS`, comparisons (`<`, `<=`, `>`, `>=`, `==`, `!=`,
 * chains such as `0 < x < a`), `and` / `or` / `xor` / `not` and the
 * conditional `c ? a : b`. Anything else is rejected, so the generated
 * source never contains user text (symbol names become array accesses,
 * numbers are re-printed from their parsed value).
 *
 * Comparisons and logical operators give 1 or 0; a condition is true when
 * its value is neither 0 nor NaN (as in mathjs). Comparisons are exact:
 * mathjs' own evaluation treats values within its relative tolerance
 * (1e-12) as equal, so the two can differ only at such near-ties.
 */
import {
  isConditionalNode,
  isConstantNode,
  isFunctionNode,
  isOperatorNode,
  isParenthesisNode,
  isRelationalNode,
  isSymbolNode
} from 'mathjs';
import type { MathNode } from 'mathjs';
import { msg } from '../messages';
import { ExpressionError, quote } from './normalize';

type Emit = (args: string[]) => string;

/** Whitelisted functions: name → allowed argument counts and JS emitter. */
const FUNCTIONS: Readonly<Record<string, { arity: number[]; emit: Emit }>> = {
  exp: { arity: [1], emit: (a) => `Math.exp(${a[0]})` },
  expm1: { arity: [1], emit: (a) => `Math.expm1(${a[0]})` },
  log: {
    arity: [1, 2],
    emit: (a) => (a.length === 1 ? `Math.log(${a[0]})` : `(Math.log(${a[0]}) / Math.log(${a[1]}))`)
  },
  log10: { arity: [1], emit: (a) => `Math.log10(${a[0]})` },
  log2: { arity: [1], emit: (a) => `Math.log2(${a[0]})` },
  log1p: { arity: [1], emit: (a) => `Math.log1p(${a[0]})` },
  sqrt: { arity: [1], emit: (a) => `Math.sqrt(${a[0]})` },
  cbrt: { arity: [1], emit: (a) => `Math.cbrt(${a[0]})` },
  abs: { arity: [1], emit: (a) => `Math.abs(${a[0]})` },
  sign: { arity: [1], emit: (a) => `Math.sign(${a[0]})` },
  sin: { arity: [1], emit: (a) => `Math.sin(${a[0]})` },
  cos: { arity: [1], emit: (a) => `Math.cos(${a[0]})` },
  tan: { arity: [1], emit: (a) => `Math.tan(${a[0]})` },
  sec: { arity: [1], emit: (a) => `(1 / Math.cos(${a[0]}))` },
  csc: { arity: [1], emit: (a) => `(1 / Math.sin(${a[0]}))` },
  cot: { arity: [1], emit: (a) => `(1 / Math.tan(${a[0]}))` },
  asin: { arity: [1], emit: (a) => `Math.asin(${a[0]})` },
  acos: { arity: [1], emit: (a) => `Math.acos(${a[0]})` },
  atan: { arity: [1], emit: (a) => `Math.atan(${a[0]})` },
  atan2: { arity: [2], emit: (a) => `Math.atan2(${a[0]}, ${a[1]})` },
  sinh: { arity: [1], emit: (a) => `Math.sinh(${a[0]})` },
  cosh: { arity: [1], emit: (a) => `Math.cosh(${a[0]})` },
  tanh: { arity: [1], emit: (a) => `Math.tanh(${a[0]})` },
  sech: { arity: [1], emit: (a) => `(1 / Math.cosh(${a[0]}))` },
  csch: { arity: [1], emit: (a) => `(1 / Math.sinh(${a[0]}))` },
  coth: { arity: [1], emit: (a) => `(1 / Math.tanh(${a[0]}))` },
  asinh: { arity: [1], emit: (a) => `Math.asinh(${a[0]})` },
  acosh: { arity: [1], emit: (a) => `Math.acosh(${a[0]})` },
  atanh: { arity: [1], emit: (a) => `Math.atanh(${a[0]})` },
  square: { arity: [1], emit: (a) => `((${a[0]}) * (${a[0]}))` },
  cube: { arity: [1], emit: (a) => `Math.pow(${a[0]}, 3)` },
  pow: { arity: [2], emit: (a) => `Math.pow(${a[0]}, ${a[1]})` },
  nthRoot: {
    arity: [1, 2],
    emit: (a) =>
      a.length === 1
        ? `Math.sqrt(${a[0]})`
        : `(Math.sign(${a[0]}) * Math.pow(Math.abs(${a[0]}), 1 / (${a[1]})))`
  },
  min: { arity: [2, 3, 4], emit: (a) => `Math.min(${a.join(', ')})` },
  max: { arity: [2, 3, 4], emit: (a) => `Math.max(${a.join(', ')})` }
};

/** Names of the functions an expression may call. */
export const SUPPORTED_FUNCTIONS: readonly string[] = Object.freeze(Object.keys(FUNCTIONS));

/** Allowed argument counts of a supported function, or null. */
export function functionArity(name: string): readonly number[] | null {
  return Object.prototype.hasOwnProperty.call(FUNCTIONS, name) ? FUNCTIONS[name].arity : null;
}

/** Comparison operators (mathjs function name → JS operator). */
export const COMPARISONS: Readonly<Record<string, string>> = {
  smaller: '<',
  smallerEq: '<=',
  larger: '>',
  largerEq: '>=',
  equal: '===',
  unequal: '!=='
};

/** Logical operators (mathjs function names). */
export const LOGICAL: readonly string[] = ['and', 'or', 'xor', 'not'];

/** Operators (mathjs function names) a model may use. */
export const SUPPORTED_OPERATORS: readonly string[] = Object.freeze([
  'add',
  'subtract',
  'multiply',
  'divide',
  'pow',
  'unaryMinus',
  'unaryPlus',
  ...Object.keys(COMPARISONS),
  ...LOGICAL
]);

const BINARY: Readonly<Record<string, string>> = {
  add: '+',
  subtract: '-',
  multiply: '*',
  divide: '/'
};

/** Resolves a symbol to a JS snippet (an array access or a number), or null if unknown. */
export type SymbolResolver = (name: string) => string | null;

/** Prints a finite number so that it parses back to the same double. */
export function numberLiteral(v: number): string {
  if (!Number.isFinite(v)) {
    throw new ExpressionError(msg('expression.compile.number', 'A number in the expression is infinite or not a number (%1).', v));
  }
  const s = String(v);
  return v < 0 ? `(${s})` : s;
}

/**
 * Common subexpressions of expressions evaluated at the same point: every
 * operator or function application becomes a `const tN = …;` line, and an
 * application already seen (same source after its arguments were named)
 * reuses its name. The arithmetic is unchanged, only done once.
 */
export class SharedTerms {
  /** Declarations, in dependency order. */
  readonly lines: string[] = [];
  /** Source already produced per node (trees of derivatives share subtrees). */
  readonly byNode = new WeakMap<MathNode, string>();
  private readonly _names = new Map<string, string>();

  /** Name of the temporary holding `js` (declared on first use). */
  intern(js: string): string {
    let name = this._names.get(js);
    if (name === undefined) {
      name = `t${this._names.size}`;
      this._names.set(js, name);
      this.lines.push(`const ${name} = ${js};`);
    }
    return name;
  }
}

/** Small integer exponents written as products (only where the base is a name or a number). */
function integerPower(base: string, exponent: MathNode): string | null {
  while (isParenthesisNode(exponent)) {
    exponent = exponent.content;
  }
  let e: unknown = null;
  if (isConstantNode(exponent)) {
    e = exponent.value;
  } else if (isOperatorNode(exponent) && exponent.fn === 'unaryMinus' && isConstantNode(exponent.args[0])) {
    const v: unknown = exponent.args[0].value;
    e = typeof v === 'number' ? -v : null;
  }
  if (!/^(?:[a-z]\w*|\(?-?[\d.e+-]+\)?)$/i.test(base)) {
    return null;
  }
  switch (e) {
    case 2:
      return `(${base} * ${base})`;
    case 3:
      return `(${base} * ${base} * ${base})`;
    case -1:
      return `(1 / ${base})`;
    case -2:
      return `(1 / (${base} * ${base}))`;
    default:
      return null;
  }
}

/**
 * JS source for `node`. Throws `ExpressionError` for anything outside the
 * whitelist. With `shared`, every application is named there (see
 * `SharedTerms`) and the result is a name or a literal.
 */
export function toJavaScript(node: MathNode, resolve: SymbolResolver, shared?: SharedTerms): string {
  if (shared) {
    const done = shared.byNode.get(node);
    if (done !== undefined) {
      return done;
    }
    const js = emit(node, resolve, shared);
    shared.byNode.set(node, js);
    return js;
  }
  return emit(node, resolve);
}

function emit(node: MathNode, resolve: SymbolResolver, shared?: SharedTerms): string {
  const named = (js: string): string => (shared ? shared.intern(js) : js);
  if (isParenthesisNode(node)) {
    return toJavaScript(node.content, resolve, shared);
  }
  if (isConstantNode(node)) {
    const v: unknown = node.value;
    if (typeof v !== 'number') {
      throw new ExpressionError(msg('expression.compile.constant', 'Only numbers can be constants in a model; “%1” is not a number.', quote(String(v), 20)));
    }
    return numberLiteral(v);
  }
  if (isSymbolNode(node)) {
    const js = resolve(node.name);
    if (js === null) {
      throw new ExpressionError(msg('expression.compile.symbol', 'The name “%1” is neither a parameter, a variable nor a constant.', quote(node.name)));
    }
    return js;
  }
  if (isConditionalNode(node)) {
    const c = toJavaScript(node.condition, resolve, shared);
    const t = toJavaScript(node.trueExpr, resolve, shared);
    const f = toJavaScript(node.falseExpr, resolve, shared);
    return named(`((${c}) ? (${t}) : (${f}))`);
  }
  if (isRelationalNode(node)) {
    const params = node.params.map((a) => toJavaScript(a, resolve, shared));
    const parts = node.conditionals.map((fn, i) => {
      const op = Object.prototype.hasOwnProperty.call(COMPARISONS, fn) ? COMPARISONS[fn] : null;
      if (op === null) {
        throw new ExpressionError(msg('expression.compile.operator', 'The operator “%1” is not supported in model expressions.', fn));
      }
      return `(${params[i]}) ${op} (${params[i + 1]})`;
    });
    return named(`((${parts.join(' && ')}) ? 1 : 0)`);
  }
  if (isOperatorNode(node)) {
    const args = node.args.map((a) => toJavaScript(a, resolve, shared));
    const fn: string = node.fn;
    if (fn === 'unaryMinus' && args.length === 1) {
      return named(`(-(${args[0]}))`);
    }
    if (fn === 'unaryPlus' && args.length === 1) {
      return `(${args[0]})`;
    }
    if (fn === 'pow' && args.length === 2) {
      return named((shared ? integerPower(args[0], node.args[1]) : null) ?? `Math.pow(${args[0]}, ${args[1]})`);
    }
    const op = BINARY[fn];
    if (op && args.length >= 2) {
      return named(`(${args.map((a) => `(${a})`).join(` ${op} `)})`);
    }
    if (Object.prototype.hasOwnProperty.call(COMPARISONS, fn) && args.length === 2) {
      return named(`((${args[0]}) ${COMPARISONS[fn]} (${args[1]}) ? 1 : 0)`);
    }
    if (fn === 'and' && args.length === 2) {
      return named(`((${args[0]}) && (${args[1]}) ? 1 : 0)`);
    }
    if (fn === 'or' && args.length === 2) {
      return named(`((${args[0]}) || (${args[1]}) ? 1 : 0)`);
    }
    if (fn === 'xor' && args.length === 2) {
      return named(`(!(${args[0]}) !== !(${args[1]}) ? 1 : 0)`);
    }
    if (fn === 'not' && args.length === 1) {
      return named(`((${args[0]}) ? 0 : 1)`);
    }
    throw new ExpressionError(msg('expression.compile.operator', 'The operator “%1” is not supported in model expressions.', String(node.op)));
  }
  if (isFunctionNode(node)) {
    const fnNode: unknown = node.fn;
    const name = isSymbolNode(fnNode as MathNode) ? (fnNode as { name: string }).name : '';
    const spec = Object.prototype.hasOwnProperty.call(FUNCTIONS, name) ? FUNCTIONS[name] : undefined;
    if (!spec) {
      throw new ExpressionError(
        msg('expression.compile.function', 'There is no function “%1” in model expressions; the functions are: %2.', quote(name) || '?', SUPPORTED_FUNCTIONS.join(', '))
      );
    }
    if (!spec.arity.includes(node.args.length)) {
      throw new ExpressionError(
        msg('expression.compile.arity', '%1() takes %2 argument(s); here it has %3.', name, spec.arity.join(' or '), node.args.length)
      );
    }
    return named(spec.emit(node.args.map((a) => toJavaScript(a, resolve, shared))));
  }
  throw new ExpressionError(msg('expression.compile.construct', 'The expression contains a construction that models cannot use (%1).', node.type));
}

/** Children of a node that hold values (not a function's name). */
export function valueChildren(node: MathNode): MathNode[] {
  if (isParenthesisNode(node)) {
    return [node.content];
  }
  if (isOperatorNode(node) || isFunctionNode(node)) {
    return node.args;
  }
  if (isConditionalNode(node)) {
    return [node.condition, node.trueExpr, node.falseExpr];
  }
  if (isRelationalNode(node)) {
    return node.params;
  }
  return [];
}

/** Symbols used in `node` (excluding function names), in order of first appearance. */
export function collectSymbols(node: MathNode, out: string[] = []): string[] {
  const seen = new Set<string>(out);
  const stack: MathNode[] = [node];
  while (stack.length > 0) {
    const n = stack.pop()!;
    if (isSymbolNode(n)) {
      if (!seen.has(n.name)) {
        seen.add(n.name);
        out.push(n.name);
      }
      continue;
    }
    const children = valueChildren(n);
    for (let i = children.length - 1; i >= 0; i--) {
      stack.push(children[i]);
    }
  }
  return out;
}
