/**
 * Translation of a mathjs expression tree into JavaScript source over a
 * whitelist: numbers, symbols resolved by the caller, + − × ÷ ^ and the
 * functions in `FUNCTIONS`. Anything else is rejected, so the generated
 * source never contains user text (symbol names become array accesses,
 * numbers are re-printed from their parsed value).
 */
import {
  isConstantNode,
  isFunctionNode,
  isOperatorNode,
  isParenthesisNode,
  isSymbolNode
} from 'mathjs';
import type { MathNode } from 'mathjs';
import { ExpressionError } from './normalize';

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
    throw new ExpressionError(`non-finite constant ${v} in expression`);
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
  const named = (js: string): string => (shared ? shared.intern(js) : js);
  if (isParenthesisNode(node)) {
    return toJavaScript(node.content, resolve, shared);
  }
  if (isConstantNode(node)) {
    const v: unknown = node.value;
    if (typeof v !== 'number') {
      throw new ExpressionError(`unsupported constant ${String(v)}`);
    }
    return numberLiteral(v);
  }
  if (isSymbolNode(node)) {
    const js = resolve(node.name);
    if (js === null) {
      throw new ExpressionError(`unknown symbol "${node.name}"`);
    }
    return js;
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
    throw new ExpressionError(`unsupported operator "${node.op}"`);
  }
  if (isFunctionNode(node)) {
    const fnNode: unknown = node.fn;
    const name = isSymbolNode(fnNode as MathNode) ? (fnNode as { name: string }).name : '';
    const spec = Object.prototype.hasOwnProperty.call(FUNCTIONS, name) ? FUNCTIONS[name] : undefined;
    if (!spec) {
      throw new ExpressionError(
        `unsupported function "${name || '?'}"; supported: ${SUPPORTED_FUNCTIONS.join(', ')}`
      );
    }
    if (!spec.arity.includes(node.args.length)) {
      throw new ExpressionError(`${name}() takes ${spec.arity.join(' or ')} argument(s), got ${node.args.length}`);
    }
    return named(spec.emit(node.args.map((a) => toJavaScript(a, resolve, shared))));
  }
  throw new ExpressionError(`unsupported construct (${node.type}) in expression`);
}

/** Symbols used in `node` (excluding function names), in order of first appearance. */
export function collectSymbols(node: MathNode, out: string[] = []): string[] {
  if (isSymbolNode(node)) {
    if (!out.includes(node.name)) {
      out.push(node.name);
    }
    return out;
  }
  if (isParenthesisNode(node)) {
    return collectSymbols(node.content, out);
  }
  if (isOperatorNode(node) || isFunctionNode(node)) {
    for (const a of node.args) {
      collectSymbols(a, out);
    }
  }
  return out;
}
