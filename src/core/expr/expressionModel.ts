/**
 * Fit models from user expressions such as `b1*(1-exp(-b2*x))` or
 * `T < Tc ? A*(1 - T/Tc)^β : 0`.
 *
 * The text is normalised (see `normalize.ts`: brackets, `**`, `·`, `×`,
 * `−`, superscript powers, `√`, aliases), checked and parsed by mathjs (see
 * `analyse.ts`), its parameters identified (every symbol that is not a
 * name of the x variable, a given constant or pi/e), compiled to a
 * JavaScript function through a whitelist (see `compile.ts`), and
 * differentiated symbolically (see `derivative.ts`) for an analytic
 * Jacobian when the derivatives are within their size budget.
 *
 * Several independent variables: pass `columns` (one array per variable);
 * the fit's x is then the point index into those columns.
 */
import { isSymbolNode } from 'mathjs';
import { SymbolNode } from '../numeric/mathjs';
import type { MathNode } from 'mathjs';
import type { IFitModel } from '../fit/types';
import { msg } from '../messages';
import type { ICoreMessage } from '../messages';
import { BUILTIN_CONSTANTS, analyseExpression, errorAtName } from './analyse';
import type { IAnalysedExpression } from './analyse';
import { SharedTerms, collectSymbols, numberLiteral, toJavaScript } from './compile';
import { DerivativeLimitError, Differentiator } from './derivative';
import { nameFlags } from './flags';
import { generate, generateCombined, interpret, interpretMany } from './kernelFactory';
import type { CombinedKernel, Kernel } from './kernelFactory';
import { ExpressionError, nameList, quote } from './normalize';
import { buildPreciseKernel, preciseResolver } from './precise';

/** Options of `parseExpressionModel`. */
export interface IExpressionModelOptions {
  /** Independent-variable names; default `['x']`. */
  variables?: string[];
  /**
   * Other names of the first variable (the x column), e.g. `['T']` for a
   * column "T (K)" fitted as x: `A*(1 - T/Tc)` and `A*(1 - x/Tc)` are then
   * the same model. An alias is never a parameter.
   */
  aliases?: readonly string[];
  /** One data column per variable; when given, the fit's x is the point index. */
  columns?: Record<string, ArrayLike<number>>;
  /** Named numeric constants (e.g. `{ pi: 3.14159… }`). */
  constants?: Record<string, number>;
  /** Parameter order; default: order of first appearance in the model. */
  parameters?: string[];
  /** Headers of the table's columns, to flag parameters named like a column (see `flags`). */
  columnNames?: readonly string[];
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
  /** How the model was built, when worth saying (e.g. why the Jacobian is by finite differences). */
  readonly notes: readonly ICoreMessage[];
  /** Names that look mistaken (see `IExpressionInspection.flags`); the model is built all the same. */
  readonly flags: readonly ICoreMessage[];
  /** Applies the left-hand side to observed values (identity when it is a bare symbol). */
  transformResponse(y: ArrayLike<number>): number[];
}

function hasOwn(obj: object, key: string): boolean {
  return Object.prototype.hasOwnProperty.call(obj, key);
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

/** What the text and the options say before anything is compiled. */
export interface IPreparedExpression {
  readonly analysed: IAnalysedExpression;
  /** The right-hand side with every alias renamed to the first variable. */
  readonly node: MathNode;
  readonly variables: readonly string[];
  readonly aliases: readonly string[];
  readonly constants: Readonly<Record<string, number>>;
  readonly parameters: readonly string[];
  /** Symbols of the right-hand side in order of appearance (as typed, aliases included). */
  readonly symbols: readonly string[];
}

function renameAliases(node: MathNode, aliases: readonly string[], to: string): MathNode {
  if (aliases.length === 0) {
    return node;
  }
  return node.transform((n, path) => (path !== 'fn' && isSymbolNode(n) && aliases.includes(n.name) ? new SymbolNode(to) : n));
}

/**
 * Checks the text and the options and identifies the parameters, without
 * compiling. Throws `ExpressionError` (with the place in the text when
 * there is one).
 */
export function prepareExpression(text: string, options: IExpressionModelOptions = {}): IPreparedExpression {
  const variables = options.variables ?? ['x'];
  const aliases = (options.aliases ?? []).filter((a) => !variables.includes(a));
  const constants: Record<string, number> = { ...(options.constants ?? {}) };
  const xNames = [...variables, ...aliases];
  const columns = options.columns;
  if (columns) {
    for (const v of variables) {
      if (!hasOwn(columns, v) || !columns[v]) {
        throw new ExpressionError(msg('expression.variable.column', 'The variable %1 has no data column.', quote(v)));
      }
    }
  } else if (variables.length !== 1) {
    throw new ExpressionError(
      msg('expression.variable.columns', 'Several variables (%1) need one data column each (columns); the fit x is then the point index.', nameList(variables))
    );
  }
  const analysed = analyseExpression(text, (name) => xNames.includes(name));
  const symbols = collectSymbols(analysed.rhsNode);
  const isKnown = (s: string): boolean =>
    xNames.includes(s) || hasOwn(constants, s) || (hasOwn(BUILTIN_CONSTANTS, s) && !options.parameters?.includes(s));
  const found = symbols.filter((s) => !isKnown(s));
  let parameters: string[];
  if (options.parameters) {
    parameters = options.parameters.slice();
    const clash = parameters.find((p) => xNames.includes(p));
    if (clash !== undefined) {
      throw new ExpressionError(msg('expression.parameters.variable', '%1 names the x variable; it cannot also be a parameter.', quote(clash)));
    }
    const missing = found.filter((s) => !parameters.includes(s));
    if (missing.length > 0) {
      throw errorAtName(analysed.rhsLocator, missing[0], (k) =>
        msg('expression.parameters.unknown', 'Character %1: %2 is neither a parameter, a variable nor a constant.', k, quote(missing[0], 24))
      );
    }
  } else {
    parameters = found;
  }
  if (parameters.length === 0) {
    const usedConstants = symbols.filter((s) => !xNames.includes(s));
    throw new ExpressionError(
      usedConstants.length > 0
        ? msg(
            'expression.parameters.constants',
            'The expression has no parameters to fit: every name in it is the x variable (%1) or a constant (%2; e and E are Euler’s number, pi is π).',
            nameList(xNames),
            nameList(usedConstants)
          )
        : msg('expression.parameters.none', 'The expression has no parameters to fit: every name in it is the x variable (%1).', nameList(xNames))
    );
  }
  const node = renameAliases(analysed.rhsNode, aliases, variables[0]);
  return { analysed, node, variables, aliases, constants, parameters, symbols };
}

/** Parses, checks and compiles a model expression. Throws `ExpressionError`. */
export function parseExpressionModel(text: string, options: IExpressionModelOptions = {}): IExpressionModel {
  const prepared = prepareExpression(text, options);
  const { analysed, node, constants } = prepared;
  const variables = prepared.variables.slice();
  const parameters = prepared.parameters.slice();
  const columns = options.columns;
  const builtins = Object.keys(BUILTIN_CONSTANTS).filter((b) => !parameters.includes(b));
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
    if (builtins.includes(name)) {
      return numberLiteral(BUILTIN_CONSTANTS[name]);
    }
    return null;
  };
  checkSize(node);
  const valueTerms = new SharedTerms();
  let valueJs: string;
  try {
    // Checks the whitelist (throws ExpressionError) whichever evaluation is used.
    valueJs = toJavaScript(node, resolve, valueTerms);
  } catch (err) {
    if (err instanceof RangeError) {
      throw new ExpressionError(msg('expression.depth', 'The expression is too deeply nested or too long to read; split it into simpler terms.'), null);
    }
    throw err;
  }
  const notes: ICoreMessage[] = [];
  let derivativeNodes: MathNode[] | null = null;
  if (options.symbolicJacobian !== false) {
    derivativeNodes = symbolicDerivatives(node, parameters, notes);
  }
  const colArrays = variables.map((v) => (columns ? columns[v] : null));
  let evaluate: Kernel;
  let jacobian: Kernel | undefined;
  let combined: CombinedKernel | undefined;
  let evaluation: IExpressionModel['evaluation'];
  if (options.evaluation !== 'mathjs' && canGenerate()) {
    // Each kernel names every sub-term once per point (common subexpressions
    // of the derivatives are computed once; small integer powers are products).
    const k = parameters.length;
    const nv = variables.length;
    evaluate = generate(k, nv, Boolean(columns), [valueJs], colArrays, valueTerms.lines);
    if (derivativeNodes) {
      const jacTerms = new SharedTerms();
      const dJs = derivativeNodes.map((d) => toJavaScript(d, resolve, jacTerms));
      jacobian = generate(k, nv, Boolean(columns), dJs, colArrays, jacTerms.lines);
      // Values and derivatives in one pass, sharing their common sub-terms
      // (the value is the same source as `evaluate`'s, so the same number).
      const bothTerms = new SharedTerms();
      const valueAgain = toJavaScript(node, resolve, bothTerms);
      const dBoth = derivativeNodes.map((d) => toJavaScript(d, resolve, bothTerms));
      combined = generateCombined(k, nv, Boolean(columns), valueAgain, dBoth, colArrays, bothTerms.lines);
    }
    evaluation = 'generated-function';
  } else {
    const scopeConstants: Record<string, number> = { ...constants };
    for (const b of builtins) {
      if (!hasOwn(scopeConstants, b)) {
        scopeConstants[b] = BUILTIN_CONSTANTS[b];
      }
    }
    evaluate = interpret(node, parameters, variables, scopeConstants, colArrays);
    jacobian = derivativeNodes ? interpretMany(derivativeNodes, parameters, variables, scopeConstants, colArrays) : undefined;
    evaluation = 'mathjs-compiled';
  }
  const transformResponse = responseTransform(analysed, constants, [...variables, ...prepared.aliases]);
  const model: IExpressionModel = {
    parameters,
    expression: analysed.rhs,
    response: analysed.lhs,
    variables,
    derivatives: null,
    evaluation,
    notes,
    flags: nameFlags(prepared.parameters, prepared.symbols, analysed, {
      xNames: [...variables, ...prepared.aliases],
      columnNames: options.columnNames ?? []
    }),
    evaluate,
    transformResponse,
    // Generated code evaluates each point on its own (several variables: x is the point index).
    pointwise: true
  };
  if (derivativeNodes) {
    // Printed on first use (large derivatives take a while to print).
    const nodes = derivativeNodes;
    let texts: string[] | null = null;
    Object.defineProperty(model, 'derivatives', {
      enumerable: true,
      get: () => (texts ??= nodes.map((d) => d.toString()))
    });
  }
  if (jacobian) {
    model.jacobian = jacobian;
    if (combined) {
      model.evaluateWithJacobian = combined;
    }
  }
  const precise = buildPreciseKernel(node, preciseResolver(variables, constants, parameters), colArrays);
  if (precise) {
    model.evaluatePrecise = precise;
  }
  return model;
}

/** Largest expression tree compiled (nodes), and its deepest nesting: beyond them the recursive compiler could run out of stack. */
export const MAX_EXPRESSION_NODES = 20_000;
export const MAX_EXPRESSION_DEPTH = 200;

/** Refuse trees too large or too deep to compile, walking them without recursion (so the check itself cannot overflow). */
function checkSize(root: MathNode): void {
  const stack: [MathNode, number][] = [[root, 1]];
  let nodes = 0;
  while (stack.length) {
    const [node, depth] = stack.pop()!;
    nodes++;
    if (nodes > MAX_EXPRESSION_NODES || depth > MAX_EXPRESSION_DEPTH) {
      throw new ExpressionError(msg('expression.depth', 'The expression is too deeply nested or too long to read; split it into simpler terms.'), null);
    }
    node.forEach(child => stack.push([child, depth + 1]));
  }
}

/** ∂f/∂p for every parameter, or null (with a note saying why) when finite differences must do. */
function symbolicDerivatives(node: MathNode, parameters: readonly string[], notes: ICoreMessage[]): MathNode[] | null {
  const differentiator = new Differentiator();
  try {
    return parameters.map((p) => differentiator.derivative(node, p));
  } catch (err) {
    if (err instanceof DerivativeLimitError) {
      notes.push(
        err.reason === 'size'
          ? msg(
              'expression.jacobian.size',
              'The Jacobian is computed by finite differences: the symbolic derivatives of this expression would be too large to evaluate quickly.'
            )
          : msg('expression.jacobian.unsupported', 'The Jacobian is computed by finite differences: %1 has no symbolic derivative here.', quote(err.what, 24))
      );
      return null;
    }
    if (err instanceof RangeError) {
      notes.push(msg('expression.jacobian.depth', 'The Jacobian is computed by finite differences: the expression is too deeply nested for symbolic derivatives.'));
      return null;
    }
    throw err;
  }
}

function responseTransform(
  analysed: IAnalysedExpression,
  constants: Record<string, number>,
  xNames: string[]
): (y: ArrayLike<number>) => number[] {
  const node = analysed.lhsNode;
  if (node === null) {
    return (y) => Array.from(y);
  }
  const symbols = collectSymbols(node).filter((s) => !hasOwn(constants, s) && !hasOwn(BUILTIN_CONSTANTS, s));
  if (symbols.length !== 1) {
    throw new ExpressionError(
      msg('expression.response.symbols', 'The left of “=” must name exactly one response (like y or log(y)); it has %1.', symbols.length),
      analysed.lhsLocator?.place(0).pos ?? null
    );
  }
  const response = symbols[0];
  if (xNames.includes(response)) {
    throw errorAtName(analysed.lhsLocator, response, (k) =>
      msg('expression.response.variable', 'Character %1: the response %2 is also the x variable; the left of “=” names the measured y.', k, quote(response, 24))
    );
  }
  if (node.type === 'SymbolNode') {
    return (y) => Array.from(y);
  }
  const js = toJavaScript(node, (name) =>
    name === response
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
  const scope = { ...constants };
  for (const b of Object.keys(BUILTIN_CONSTANTS)) {
    if (!hasOwn(scope, b)) {
      scope[b] = BUILTIN_CONSTANTS[b];
    }
  }
  const kernel = interpret(node, [], [response], scope, [null]);
  return (y) => {
    const out = new Float64Array(y.length);
    kernel(new Float64Array(0), Float64Array.from(y), out);
    return Array.from(out);
  };
}
