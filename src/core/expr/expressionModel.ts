/**
 * Fit models from user expressions such as `b1*(1-exp(-b2*x))`.
 *
 * The text is normalised (`[ ]` → `( )`, `**` → `^`, aliases), parsed by
 * mathjs, its parameters identified (every symbol that is not a variable, a
 * given constant or pi/e), compiled to a JavaScript function through a
 * whitelist (see `compile.ts`), and differentiated symbolically with mathjs
 * for an analytic Jacobian when every derivative compiles.
 *
 * Several independent variables: pass `columns` (one array per variable);
 * the fit's x is then the point index into those columns.
 */
import { compile, derivative, parse } from 'mathjs';
import type { MathNode } from 'mathjs';
import type { IFitModel } from '../fit/types';
import { SharedTerms, collectSymbols, numberLiteral, toJavaScript } from './compile';
import { generate, interpret, interpretMany } from './kernelFactory';
import type { Kernel } from './kernelFactory';
import { ExpressionError, normalizeExpressionText, splitEquation } from './normalize';
import { buildPreciseKernel, preciseResolver } from './precise';

/** Options of `parseExpressionModel`. */
export interface IExpressionModelOptions {
  /** Independent-variable names; default `['x']`. */
  variables?: string[];
  /** One data column per variable; when given, the fit's x is the point index. */
  columns?: Record<string, ArrayLike<number>>;
  /** Named numeric constants (e.g. `{ pi: 3.14159… }`). */
  constants?: Record<string, number>;
  /** Parameter order; default: order of first appearance in the model. */
  parameters?: string[];
  /** Use symbolic derivatives for the Jacobian when possible; default true. */
  symbolicJacobian?: boolean;
  /**
   * 'generated' (default when the environment allows `new Function`): compile
   * to a JavaScript function through the whitelist; 'mathjs': evaluate with
   * mathjs `compile` and a scope per point (slower; used automatically when
   * code generation is not allowed).
   */
  evaluation?: 'generated' | 'mathjs';
}

/** A compiled expression model. */
export interface IExpressionModel extends IFitModel {
  /** Normalised model expression (right-hand side). */
  readonly expression: string;
  /** Left-hand side (response expression) or null. */
  readonly response: string | null;
  readonly variables: readonly string[];
  /** Symbolic ∂f/∂pⱼ as text, or null when the Jacobian is by finite differences. */
  readonly derivatives: readonly string[] | null;
  /** How the expression is evaluated. */
  readonly evaluation: 'generated-function' | 'mathjs-compiled';
  /** Applies the left-hand side to observed values (identity when it is a bare symbol). */
  transformResponse(y: ArrayLike<number>): number[];
}

const BUILTIN_CONSTANTS: Readonly<Record<string, number>> = { pi: Math.PI, PI: Math.PI, e: Math.E, E: Math.E };

function hasOwn(obj: Record<string, number>, key: string): boolean {
  return Object.prototype.hasOwnProperty.call(obj, key);
}

function parseNode(text: string): MathNode {
  try {
    return parse(text);
  } catch (err) {
    throw new ExpressionError(`cannot parse "${text}": ${err instanceof Error ? err.message : String(err)}`);
  }
}

let functionConstructorAllowed: boolean | null = null;
function canGenerate(): boolean {
  if (functionConstructorAllowed === null) {
    try {
      functionConstructorAllowed = new Function('return 1')() === 1;
    } catch {
      functionConstructorAllowed = false;
    }
  }
  return functionConstructorAllowed;
}

/** Parses, checks and compiles a model expression. Throws `ExpressionError`. */
export function parseExpressionModel(text: string, options: IExpressionModelOptions = {}): IExpressionModel {
  if (typeof text !== 'string' || text.trim() === '') {
    throw new ExpressionError('model expression is empty');
  }
  const { lhs, rhs } = splitEquation(normalizeExpressionText(text));
  const variables = options.variables ?? ['x'];
  const constants: Record<string, number> = { ...(options.constants ?? {}) };
  const columns = options.columns;
  if (columns) {
    for (const v of variables) {
      if (!columns[v]) {
        throw new ExpressionError(`no data column for variable "${v}"`);
      }
    }
  } else if (variables.length !== 1) {
    throw new ExpressionError('several variables need `columns` (the fit x is then the point index)');
  }
  const node = parseNode(rhs);
  const symbols = collectSymbols(node);
  const isKnown = (s: string): boolean =>
    variables.includes(s) || hasOwn(constants, s) || (hasOwn(BUILTIN_CONSTANTS, s) && !options.parameters?.includes(s));
  const found = symbols.filter((s) => !isKnown(s));
  let parameters: string[];
  if (options.parameters) {
    parameters = options.parameters.slice();
    const missing = found.filter((s) => !parameters.includes(s));
    if (missing.length > 0) {
      throw new ExpressionError(`symbols ${missing.join(', ')} are neither parameters, variables nor constants`);
    }
  } else {
    parameters = found;
  }
  if (parameters.length === 0) {
    throw new ExpressionError(`"${rhs}" has no parameters to fit`);
  }
  const resolve = (name: string): string | null => {
    const vi = variables.indexOf(name);
    if (vi >= 0) {
      return `v${vi}`;
    }
    if (hasOwn(constants, name)) {
      return numberLiteral(constants[name]);
    }
    const pi = parameters.indexOf(name);
    if (pi >= 0) {
      return `q${pi}`;
    }
    if (hasOwn(BUILTIN_CONSTANTS, name)) {
      return numberLiteral(BUILTIN_CONSTANTS[name]);
    }
    return null;
  };
  // Checks the whitelist (throws ExpressionError) whichever evaluation is used.
  toJavaScript(node, resolve);
  let derivativeNodes: MathNode[] | null = null;
  if (options.symbolicJacobian !== false) {
    try {
      const nodes = parameters.map((p) => derivative(node, p));
      nodes.forEach((d) => toJavaScript(d, resolve));
      derivativeNodes = nodes;
    } catch {
      derivativeNodes = null;
    }
  }
  const colArrays = variables.map((v) => (columns ? columns[v] : null));
  let evaluate: Kernel;
  let jacobian: Kernel | undefined;
  let evaluation: IExpressionModel['evaluation'];
  if (options.evaluation !== 'mathjs' && canGenerate()) {
    // Each kernel names every sub-term once per point (common subexpressions
    // of the derivatives are computed once; small integer powers are products).
    const k = parameters.length;
    const nv = variables.length;
    const valueTerms = new SharedTerms();
    evaluate = generate(k, nv, Boolean(columns), [toJavaScript(node, resolve, valueTerms)], colArrays, valueTerms.lines);
    if (derivativeNodes) {
      const jacTerms = new SharedTerms();
      const dJs = derivativeNodes.map((d) => toJavaScript(d, resolve, jacTerms));
      jacobian = generate(k, nv, Boolean(columns), dJs, colArrays, jacTerms.lines);
    }
    evaluation = 'generated-function';
  } else {
    evaluate = interpret(node, parameters, variables, constants, colArrays);
    jacobian = derivativeNodes ? interpretMany(derivativeNodes, parameters, variables, constants, colArrays) : undefined;
    evaluation = 'mathjs-compiled';
  }
  const transformResponse = responseTransform(lhs, constants, variables);
  const model: IExpressionModel = {
    parameters,
    expression: rhs,
    response: lhs,
    variables,
    derivatives: derivativeNodes ? derivativeNodes.map((d) => d.toString()) : null,
    evaluation,
    evaluate,
    transformResponse,
    // Generated code evaluates each point on its own (several variables: x is the point index).
    pointwise: true
  };
  if (jacobian) {
    model.jacobian = jacobian;
  }
  const precise = buildPreciseKernel(node, preciseResolver(variables, constants, parameters), colArrays);
  if (precise) {
    model.evaluatePrecise = precise;
  }
  return model;
}

function responseTransform(
  lhs: string | null,
  constants: Record<string, number>,
  variables: string[]
): (y: ArrayLike<number>) => number[] {
  if (lhs === null) {
    return (y) => Array.from(y);
  }
  const node = parseNode(lhs);
  const symbols = collectSymbols(node).filter((s) => !(hasOwn(constants, s)) && !(hasOwn(BUILTIN_CONSTANTS, s)));
  if (symbols.length !== 1) {
    throw new ExpressionError(`left-hand side "${lhs}" must contain exactly one response symbol`);
  }
  if (variables.includes(symbols[0])) {
    throw new ExpressionError(`the response "${symbols[0]}" is also an independent variable`);
  }
  if (node.type === 'SymbolNode') {
    return (y) => Array.from(y);
  }
  const js = toJavaScript(node, (name) =>
    name === symbols[0]
      ? 'v0'
      : hasOwn(constants, name)
        ? numberLiteral(constants[name])
        : hasOwn(BUILTIN_CONSTANTS, name)
          ? numberLiteral(BUILTIN_CONSTANTS[name])
          : null
  );
  if (canGenerate()) {
    const kernel = generate(0, 1, false, [js], [null]);
    return (y) => {
      const out = new Float64Array(y.length);
      kernel(new Float64Array(0), Float64Array.from(y), out);
      return Array.from(out);
    };
  }
  const c = compile(lhs);
  return (y) =>
    Array.from(y, (v) => {
      const r: unknown = c.evaluate({ ...constants, [symbols[0]]: v });
      return typeof r === 'number' ? r : Number.NaN;
    });
}
