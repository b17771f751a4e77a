/**
 * Symbolic partial derivatives of model expressions, for analytic Jacobians.
 *
 * The rules are the usual ones (sum, product, quotient, power and chain
 * rules, one per whitelisted function); the derivative of a conditional is
 * the conditional of the derivatives, comparisons and logical operators
 * have derivative zero, min/max become conditionals. Results are folded
 * locally while they are built (0·u → 0, 1·u → u, u + 0 → u, numbers
 * combined), and never passed through a general simplifier: mathjs'
 * `simplify` took from 10 ms to over a minute on ordinary models (nested
 * exponentials, sums of many terms), while the generated kernels already
 * name every repeated sub-term once.
 *
 * Cost is bounded: subtrees that do not contain the parameter are skipped
 * at once (derivative 0), unchanged subtrees are shared, not copied, and
 * the total size of the derivatives (counted as trees, as the code
 * generator walks them) is capped by `DERIVATIVE_NODE_BUDGET`; beyond it
 * `DerivativeLimitError` is thrown and the caller uses finite differences.
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
import { ConditionalNode, ConstantNode, FunctionNode, OperatorNode, SymbolNode } from '../numeric/mathjs';
import type { MathNode } from 'mathjs';
import { COMPARISONS, LOGICAL, valueChildren } from './compile';

/** Largest total size (nodes, counted as trees) of all derivatives of one model. */
export const DERIVATIVE_NODE_BUDGET = 50000;

/** Why a derivative was not built. */
export class DerivativeLimitError extends Error {
  constructor(
    readonly reason: 'size' | 'unsupported',
    /** The function without a derivative rule, or the parameter whose derivative is too large. */
    readonly what: string
  ) {
    super(reason === 'size' ? `derivative with respect to ${what} is too large` : `no derivative rule for ${what}`);
    this.name = 'DerivativeLimitError';
  }
}

/* eslint-disable @typescript-eslint/no-explicit-any -- mathjs' node constructors are typed per operator */
const op = (o: string, fn: string, args: MathNode[]): MathNode => new (OperatorNode as any)(o, fn, args) as MathNode;
/* eslint-enable @typescript-eslint/no-explicit-any */
const ZERO: MathNode = new ConstantNode(0);
const ONE: MathNode = new ConstantNode(1);
/** A number node (0 and 1 are shared: derivative trees share unchanged subtrees anyway). */
const num = (v: number): MathNode => (v === 0 && !Object.is(v, -0) ? ZERO : v === 1 ? ONE : new ConstantNode(v));
const call = (name: string, ...args: MathNode[]): MathNode => new FunctionNode(new SymbolNode(name), args);

function strip(n: MathNode): MathNode {
  while (isParenthesisNode(n)) {
    n = n.content;
  }
  return n;
}

function constValue(n: MathNode): number | null {
  const s = strip(n);
  if (isConstantNode(s) && typeof s.value === 'number') {
    return s.value as number;
  }
  return null;
}

const isZero = (n: MathNode): boolean => constValue(n) === 0;

function neg(a: MathNode): MathNode {
  const v = constValue(a);
  if (v !== null) {
    return num(-v);
  }
  const s = strip(a);
  if (isOperatorNode(s) && s.fn === 'unaryMinus') {
    return s.args[0];
  }
  return op('-', 'unaryMinus', [a]);
}

function add(a: MathNode, b: MathNode): MathNode {
  const va = constValue(a);
  const vb = constValue(b);
  if (va !== null && vb !== null) {
    return num(va + vb);
  }
  if (va === 0) {
    return b;
  }
  if (vb === 0) {
    return a;
  }
  const sb = strip(b);
  if (isOperatorNode(sb) && sb.fn === 'unaryMinus') {
    return op('-', 'subtract', [a, sb.args[0]]);
  }
  return op('+', 'add', [a, b]);
}

function sub(a: MathNode, b: MathNode): MathNode {
  const va = constValue(a);
  const vb = constValue(b);
  if (va !== null && vb !== null) {
    return num(va - vb);
  }
  if (vb === 0) {
    return a;
  }
  if (va === 0) {
    return neg(b);
  }
  return op('-', 'subtract', [a, b]);
}

function mul(a: MathNode, b: MathNode): MathNode {
  const va = constValue(a);
  const vb = constValue(b);
  if (va !== null && vb !== null) {
    return num(va * vb);
  }
  if (va === 0 || vb === 0) {
    return num(0);
  }
  if (va === 1) {
    return b;
  }
  if (vb === 1) {
    return a;
  }
  if (va === -1) {
    return neg(b);
  }
  if (vb === -1) {
    return neg(a);
  }
  return op('*', 'multiply', [a, b]);
}

function div(a: MathNode, b: MathNode): MathNode {
  const vb = constValue(b);
  if (isZero(a) && vb !== 0) {
    return num(0);
  }
  if (vb === 1) {
    return a;
  }
  return op('/', 'divide', [a, b]);
}

function pow(a: MathNode, b: MathNode): MathNode {
  const vb = constValue(b);
  if (vb === 1) {
    return a;
  }
  if (vb === 0) {
    return num(1);
  }
  return op('^', 'pow', [a, b]);
}

const sq = (a: MathNode): MathNode => pow(a, num(2));

/** Symbols (not function names) below each node, memoised. */
class Dependencies {
  private readonly _memo = new WeakMap<MathNode, ReadonlySet<string>>();

  of(node: MathNode): ReadonlySet<string> {
    const hit = this._memo.get(node);
    if (hit) {
      return hit;
    }
    let out: ReadonlySet<string>;
    if (isSymbolNode(node)) {
      out = new Set([node.name]);
    } else {
      const children = valueChildren(node);
      if (children.length === 1) {
        out = this.of(children[0]);
      } else {
        const set = new Set<string>();
        for (const c of children) {
          for (const s of this.of(c)) {
            set.add(s);
          }
        }
        out = set;
      }
    }
    this._memo.set(node, out);
    return out;
  }
}

/** Size of `node` counted as a tree (shared subtrees count each time), memoised. */
export function treeSize(node: MathNode, memo: WeakMap<MathNode, number> = new WeakMap()): number {
  const hit = memo.get(node);
  if (hit !== undefined) {
    return hit;
  }
  let size = 1;
  for (const c of valueChildren(node)) {
    size += treeSize(c, memo);
  }
  memo.set(node, size);
  return size;
}

/** Differentiator of one expression with respect to any of its parameters. */
export class Differentiator {
  private readonly _deps = new Dependencies();
  private readonly _sizes = new WeakMap<MathNode, number>();
  private _used = 0;

  constructor(private readonly _budget: number = DERIVATIVE_NODE_BUDGET) {}

  /** ∂node/∂name. Throws `DerivativeLimitError` when unsupported or over the budget. */
  derivative(node: MathNode, name: string): MathNode {
    const d = this._d(node, name);
    this._used += treeSize(d, this._sizes);
    if (this._used > this._budget) {
      throw new DerivativeLimitError('size', name);
    }
    return d;
  }

  private _d(node: MathNode, p: string): MathNode {
    if (!this._deps.of(node).has(p)) {
      return num(0);
    }
    if (isParenthesisNode(node)) {
      return this._d(node.content, p);
    }
    if (isSymbolNode(node)) {
      return num(node.name === p ? 1 : 0);
    }
    if (isConditionalNode(node)) {
      const t = this._d(node.trueExpr, p);
      const f = this._d(node.falseExpr, p);
      return isZero(t) && isZero(f) ? num(0) : new ConditionalNode(node.condition, t, f);
    }
    if (isRelationalNode(node)) {
      return num(0);
    }
    if (isOperatorNode(node)) {
      return this._operator(node.fn as string, node.args, p);
    }
    if (isFunctionNode(node)) {
      const fnNode = node.fn as unknown as MathNode;
      const name = isSymbolNode(fnNode) ? fnNode.name : '?';
      return this._function(name, node.args, p);
    }
    throw new DerivativeLimitError('unsupported', node.type);
  }

  private _operator(fn: string, args: MathNode[], p: string): MathNode {
    if (Object.prototype.hasOwnProperty.call(COMPARISONS, fn) || LOGICAL.includes(fn)) {
      return num(0);
    }
    switch (fn) {
      case 'unaryMinus':
        return neg(this._d(args[0], p));
      case 'unaryPlus':
        return this._d(args[0], p);
      case 'add':
        return args.map((a) => this._d(a, p)).reduce(add);
      case 'subtract':
        return sub(this._d(args[0], p), this._d(args[1], p));
      case 'multiply': {
        let sum: MathNode = num(0);
        args.forEach((a, i) => {
          const da = this._d(a, p);
          if (isZero(da)) {
            return;
          }
          let term = da;
          args.forEach((b, j) => {
            if (j !== i) {
              term = j < i ? mul(b, term) : mul(term, b);
            }
          });
          sum = add(sum, term);
        });
        return sum;
      }
      case 'divide': {
        const [u, v] = args;
        const du = this._d(u, p);
        const dv = this._d(v, p);
        if (isZero(dv)) {
          return div(du, v);
        }
        const second = div(mul(u, dv), sq(v));
        return isZero(du) ? neg(second) : sub(div(du, v), second);
      }
      case 'pow':
        return this._power(args[0], args[1], p);
      default:
        throw new DerivativeLimitError('unsupported', fn);
    }
  }

  private _power(a: MathNode, b: MathNode, p: string): MathNode {
    const da = this._d(a, p);
    const db = this._d(b, p);
    if (isZero(db)) {
      const vb = constValue(b);
      const bMinus1 = vb !== null ? num(vb - 1) : sub(b, num(1));
      return mul(mul(b, pow(a, bMinus1)), da);
    }
    const whole = pow(a, b);
    if (isZero(da)) {
      return mul(mul(whole, call('log', a)), db);
    }
    return mul(whole, add(mul(db, call('log', a)), div(mul(b, da), a)));
  }

  private _function(name: string, args: MathNode[], p: string): MathNode {
    const [u, v] = args;
    const chain = (outer: MathNode): MathNode => mul(outer, this._d(u, p));
    if (args.length === 1) {
      switch (name) {
        case 'exp':
        case 'expm1':
          return chain(call('exp', u));
        case 'log':
          return div(this._d(u, p), u);
        case 'log10':
          return div(this._d(u, p), mul(u, call('log', num(10))));
        case 'log2':
          return div(this._d(u, p), mul(u, call('log', num(2))));
        case 'log1p':
          return div(this._d(u, p), add(num(1), u));
        case 'sqrt':
        case 'nthRoot':
          return div(this._d(u, p), mul(num(2), call('sqrt', u)));
        case 'cbrt':
          return div(this._d(u, p), mul(num(3), sq(call('cbrt', u))));
        case 'abs':
          return chain(call('sign', u));
        case 'sign':
          return num(0);
        case 'sin':
          return chain(call('cos', u));
        case 'cos':
          return neg(chain(call('sin', u)));
        case 'tan':
          return div(this._d(u, p), sq(call('cos', u)));
        case 'sec':
          return chain(mul(call('sec', u), call('tan', u)));
        case 'csc':
          return neg(chain(mul(call('csc', u), call('cot', u))));
        case 'cot':
          return neg(div(this._d(u, p), sq(call('sin', u))));
        case 'asin':
          return div(this._d(u, p), call('sqrt', sub(num(1), sq(u))));
        case 'acos':
          return neg(div(this._d(u, p), call('sqrt', sub(num(1), sq(u)))));
        case 'atan':
          return div(this._d(u, p), add(num(1), sq(u)));
        case 'sinh':
          return chain(call('cosh', u));
        case 'cosh':
          return chain(call('sinh', u));
        case 'tanh':
          return div(this._d(u, p), sq(call('cosh', u)));
        case 'sech':
          return neg(chain(mul(call('sech', u), call('tanh', u))));
        case 'csch':
          return neg(chain(mul(call('csch', u), call('coth', u))));
        case 'coth':
          return neg(div(this._d(u, p), sq(call('sinh', u))));
        case 'asinh':
          return div(this._d(u, p), call('sqrt', add(sq(u), num(1))));
        case 'acosh':
          return div(this._d(u, p), call('sqrt', sub(sq(u), num(1))));
        case 'atanh':
          return div(this._d(u, p), sub(num(1), sq(u)));
        case 'square':
          return chain(mul(num(2), u));
        case 'cube':
          return chain(mul(num(3), sq(u)));
        default:
          throw new DerivativeLimitError('unsupported', name);
      }
    }
    if (args.length === 2) {
      switch (name) {
        case 'pow':
          return this._power(u, v, p);
        case 'log':
          return this._d(op('/', 'divide', [call('log', u), call('log', v)]), p);
        case 'atan2': {
          // atan2(y, x): (x·y′ − y·x′) / (x² + y²)
          const dy = this._d(u, p);
          const dx = this._d(v, p);
          return div(sub(mul(v, dy), mul(u, dx)), add(sq(u), sq(v)));
        }
        case 'nthRoot': {
          if (this._deps.of(v).has(p)) {
            throw new DerivativeLimitError('unsupported', name);
          }
          return chain(div(call('nthRoot', u, v), mul(v, u)));
        }
        default:
          break;
      }
    }
    if (name === 'min' || name === 'max') {
      // min(a, rest…) = a <= min(rest…) ? a : min(rest…), and so for the derivative.
      const [first, ...rest] = args;
      const other = rest.length === 1 ? rest[0] : call(name, ...rest);
      const cond = op(name === 'min' ? '<=' : '>=', name === 'min' ? 'smallerEq' : 'largerEq', [first, other]);
      const t = this._d(first, p);
      const f = this._d(other, p);
      return isZero(t) && isZero(f) ? num(0) : new ConditionalNode(cond, t, f);
    }
    throw new DerivativeLimitError('unsupported', name);
  }
}
