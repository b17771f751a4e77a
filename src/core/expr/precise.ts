/**
 * Double-double evaluator of a parsed model expression, used by the fit
 * engine to refine fits whose χ² is dominated by binary64 rounding (see
 * `IFitModel.evaluatePrecise`). It walks the same mathjs tree as the
 * generated binary64 kernel, over a smaller whitelist: + − × ÷ ^, unary
 * ±, numbers, pi and e, parameters, variables, the functions in
 * `PRECISE_FUNCTIONS`, comparisons (exact, on the double-double values;
 * 1 or 0), `and` / `or` / `xor` / `not` and the conditional `c ? a : b`
 * (a condition is true when neither 0 nor NaN). A tree with anything else
 * gets no precise evaluator.
 *
 * Conventions: a numeric literal is taken as the decimal it prints as (the
 * shortest decimal that rounds to its binary64 value, e.g. `0.1` is one
 * tenth exactly); named constants given as numbers are taken as those
 * binary64 values exactly; pi and e are the double-double constants.
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
import * as DD from '../numeric/dd/index';
import type { IDoubleDouble, IDoubleDoubleArray } from '../numeric/dd/index';

/** A compiled node: its value from the parameters and the variables of one point. */
type PreciseNode = (p: IDoubleDouble[], v: IDoubleDouble[]) => IDoubleDouble;

/** What a symbol stands for in the precise evaluator. */
export type PreciseSymbol =
  | { kind: 'variable'; index: number }
  | { kind: 'parameter'; index: number }
  | { kind: 'constant'; value: IDoubleDouble };

type Unary = (a: IDoubleDouble) => IDoubleDouble;

const UNARY: Readonly<Record<string, Unary>> = {
  exp: DD.exp,
  expm1: DD.expm1,
  log: DD.log,
  sqrt: DD.sqrt,
  abs: DD.abs,
  square: DD.sqr,
  cube: (a) => DD.powInt(a, 3),
  sin: DD.sin,
  cos: DD.cos,
  tan: DD.tan,
  sec: (a) => DD.div(DD.DD_ONE, DD.cos(a)),
  csc: (a) => DD.div(DD.DD_ONE, DD.sin(a)),
  cot: (a) => DD.div(DD.DD_ONE, DD.tan(a)),
  atan: DD.atan
};

/** Names of the functions the precise evaluator supports. */
export const PRECISE_FUNCTIONS: readonly string[] = Object.freeze([...Object.keys(UNARY), 'pow', 'atan2', 'log', 'min', 'max']);

/** Literal → double-double of its shortest decimal representation. */
function literal(v: number): IDoubleDouble {
  return Number.isInteger(v) ? { hi: v, lo: 0 } : DD.decimalToDoubleDouble(String(v));
}

function compileNode(node: MathNode, resolve: (name: string) => PreciseSymbol | null): PreciseNode | null {
  if (isParenthesisNode(node)) {
    return compileNode(node.content, resolve);
  }
  if (isConstantNode(node)) {
    const v: unknown = node.value;
    if (typeof v !== 'number' || !Number.isFinite(v)) {
      return null;
    }
    const c = literal(v);
    return () => c;
  }
  if (isSymbolNode(node)) {
    const s = resolve(node.name);
    if (s === null) {
      return null;
    }
    if (s.kind === 'constant') {
      const c = s.value;
      return () => c;
    }
    const i = s.index;
    return s.kind === 'parameter' ? (p) => p[i] : (_p, v) => v[i];
  }
  if (isConditionalNode(node)) {
    const c = compileNode(node.condition, resolve);
    const t = compileNode(node.trueExpr, resolve);
    const f = compileNode(node.falseExpr, resolve);
    if (c === null || t === null || f === null) {
      return null;
    }
    return (p, v) => (truthy(c(p, v)) ? t(p, v) : f(p, v));
  }
  if (isRelationalNode(node)) {
    const params = node.params.map((a) => compileNode(a, resolve));
    const tests = node.conditionals.map((fn) => (Object.prototype.hasOwnProperty.call(COMPARE, fn) ? COMPARE[fn] : null));
    if (params.some((a) => a === null) || tests.some((t) => t === null)) {
      return null;
    }
    const ps = params as PreciseNode[];
    const ts = tests as ((c: number) => boolean)[];
    return (p, v) => {
      let left = ps[0](p, v);
      for (let i = 0; i < ts.length; i++) {
        const right = ps[i + 1](p, v);
        if (!ts[i](DD.compare(left, right))) {
          return DD.DD_ZERO;
        }
        left = right;
      }
      return DD.DD_ONE;
    };
  }
  const args = isOperatorNode(node) || isFunctionNode(node) ? node.args.map((a) => compileNode(a, resolve)) : [];
  if (args.some((a) => a === null)) {
    return null;
  }
  const a = args as PreciseNode[];
  if (isOperatorNode(node)) {
    return operator(node.fn, a);
  }
  if (isFunctionNode(node)) {
    const fnNode: unknown = node.fn;
    const name = isSymbolNode(fnNode as MathNode) ? (fnNode as { name: string }).name : '';
    return functionCall(name, a);
  }
  return null;
}

/** Comparison tests on the sign of `DD.compare` (false when NaN). */
const COMPARE: Readonly<Record<string, (c: number) => boolean>> = {
  smaller: (c) => c < 0,
  smallerEq: (c) => c <= 0,
  larger: (c) => c > 0,
  largerEq: (c) => c >= 0,
  equal: (c) => c === 0,
  unequal: (c) => c !== 0
};

/** A condition holds when its value is neither 0 nor NaN (as in mathjs and JavaScript). */
function truthy(a: IDoubleDouble): boolean {
  return a.hi !== 0 && !Number.isNaN(a.hi);
}

const bool = (b: boolean): IDoubleDouble => (b ? DD.DD_ONE : DD.DD_ZERO);

function operator(fn: string, a: PreciseNode[]): PreciseNode | null {
  if (a.length === 2 && Object.prototype.hasOwnProperty.call(COMPARE, fn)) {
    const test = COMPARE[fn];
    const [l, r] = a;
    return (p, v) => bool(test(DD.compare(l(p, v), r(p, v))));
  }
  if (a.length === 2 && (fn === 'and' || fn === 'or' || fn === 'xor')) {
    const [l, r] = a;
    const join = fn === 'and' ? (x: boolean, y: boolean) => x && y : fn === 'or' ? (x: boolean, y: boolean) => x || y : (x: boolean, y: boolean) => x !== y;
    return (p, v) => bool(join(truthy(l(p, v)), truthy(r(p, v))));
  }
  if (a.length === 1 && fn === 'not') {
    const [u] = a;
    return (p, v) => bool(!truthy(u(p, v)));
  }
  if (a.length === 1) {
    const [u] = a;
    if (fn === 'unaryMinus') {
      return (p, v) => DD.neg(u(p, v));
    }
    return fn === 'unaryPlus' ? u : null;
  }
  if (a.length === 2 && (fn === 'pow' || fn === 'divide' || fn === 'subtract')) {
    const [l, r] = a;
    const op = fn === 'pow' ? DD.pow : fn === 'divide' ? DD.div : DD.sub;
    return (p, v) => op(l(p, v), r(p, v));
  }
  if (a.length >= 2 && (fn === 'add' || fn === 'multiply')) {
    const op = fn === 'add' ? DD.add : DD.mul;
    return (p, v) => {
      let acc = a[0](p, v);
      for (let j = 1; j < a.length; j++) {
        acc = op(acc, a[j](p, v));
      }
      return acc;
    };
  }
  return null;
}

function functionCall(name: string, a: PreciseNode[]): PreciseNode | null {
  if (a.length >= 2 && (name === 'min' || name === 'max')) {
    const sign = name === 'min' ? -1 : 1;
    return (p, v) => {
      let best = a[0](p, v);
      for (let j = 1; j < a.length; j++) {
        const c = a[j](p, v);
        if (Number.isNaN(c.hi) || Number.isNaN(best.hi)) {
          return { hi: Number.NaN, lo: Number.NaN };
        }
        if (sign * DD.compare(c, best) > 0) {
          best = c;
        }
      }
      return best;
    };
  }
  if (a.length === 1 && Object.prototype.hasOwnProperty.call(UNARY, name)) {
    const f = UNARY[name];
    const [u] = a;
    return (p, v) => f(u(p, v));
  }
  if (a.length === 2) {
    const [l, r] = a;
    if (name === 'pow') {
      return (p, v) => DD.pow(l(p, v), r(p, v));
    }
    if (name === 'atan2') {
      return (p, v) => DD.atan2(l(p, v), r(p, v));
    }
    if (name === 'log') {
      return (p, v) => DD.div(DD.log(l(p, v)), DD.log(r(p, v)));
    }
  }
  return null;
}

/**
 * Symbol resolution of the precise evaluator, mirroring the binary64 one:
 * variables, then named constants (their binary64 values), then
 * parameters, then pi/PI and e/E (double-double constants).
 */
export function preciseResolver(
  variables: readonly string[],
  constants: Readonly<Record<string, number>>,
  parameters: readonly string[]
): (name: string) => PreciseSymbol | null {
  return (name) => {
    const vi = variables.indexOf(name);
    if (vi >= 0) {
      return { kind: 'variable', index: vi };
    }
    if (Object.prototype.hasOwnProperty.call(constants, name)) {
      return { kind: 'constant', value: { hi: constants[name], lo: 0 } };
    }
    const pi = parameters.indexOf(name);
    if (pi >= 0) {
      return { kind: 'parameter', index: pi };
    }
    if (name === 'pi' || name === 'PI' || name === 'π') {
      return { kind: 'constant', value: DD.DD_PI };
    }
    if (name === 'e' || name === 'E') {
      return { kind: 'constant', value: DD.DD_E };
    }
    return null;
  };
}

/** Signature of `IFitModel.evaluatePrecise`. */
export type PreciseKernel = (p: IDoubleDoubleArray, x: IDoubleDoubleArray, out: IDoubleDoubleArray) => void;

/**
 * Double-double kernel for the expression `node`, or null when some node is
 * outside the precise whitelist. `columns` (one per variable, or null):
 * when given, x is the point index and variable j reads columns[j][x]
 * (binary64 values, taken as exact); otherwise the single variable is x.
 */
export function buildPreciseKernel(
  node: MathNode,
  resolve: (name: string) => PreciseSymbol | null,
  columns: (ArrayLike<number> | null)[]
): PreciseKernel | null {
  const root = compileNode(node, resolve);
  if (root === null) {
    return null;
  }
  const byIndex = columns.length > 0 && columns.every((c) => c !== null);
  return (p, x, out) => {
    const params = Array.from(p.hi, (hi, j) => ({ hi, lo: p.lo[j] }));
    const vars: IDoubleDouble[] = new Array<IDoubleDouble>(Math.max(columns.length, 1));
    for (let i = 0; i < x.hi.length; i++) {
      if (byIndex) {
        const idx = x.hi[i];
        for (let j = 0; j < columns.length; j++) {
          vars[j] = { hi: columns[j]![idx], lo: 0 };
        }
      } else {
        vars[0] = { hi: x.hi[i], lo: x.lo[i] };
      }
      const r = root(params, vars);
      out.hi[i] = r.hi;
      out.lo[i] = r.lo;
    }
  };
}
