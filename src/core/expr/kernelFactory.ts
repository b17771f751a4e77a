/**
 * Evaluation kernels of expression models: a JavaScript function generated
 * from whitelisted source (see `compile.ts`), or mathjs `compile` with a
 * scope per point when code generation is not allowed.
 */
import type { MathNode } from 'mathjs';

/** Writes model values (or k values per point, row-major) for parameters p at points x. */
export type Kernel = (p: Float64Array, x: Float64Array, out: Float64Array) => void;

/**
 * Builds a kernel writing `exprs.length` values per point (row-major) from
 * whitelisted JS expressions over q0…q(k−1) (parameters), v0… (variables)
 * and the per-point declarations `prelude` (see `SharedTerms`).
 */
export function generate(
  k: number,
  nv: number,
  indexed: boolean,
  exprs: string[],
  cols: (ArrayLike<number> | null)[],
  prelude: readonly string[] = []
): Kernel {
  const body =
    exprs.length === 1
      ? [`    out[i] = ${exprs[0]};`]
      : [`    const o = i * ${exprs.length};`, ...exprs.map((e, j) => `    out[o + ${j}] = ${e};`)];
  return build(k, nv, indexed, cols, prelude, 'p, x, out', body) as Kernel;
}

/** Writes model values into `out` and the Jacobian (row-major n×k) into `jac` in one pass. */
export type CombinedKernel = (p: Float64Array, x: Float64Array, out: Float64Array, jac: Float64Array) => void;

/**
 * Builds a kernel writing the value `valueExpr` into out[i] and the k
 * derivatives `derivExprs` into jac[i·k + j], per point, after the shared
 * declarations `prelude` (value and derivatives name common sub-terms once).
 */
export function generateCombined(
  k: number,
  nv: number,
  indexed: boolean,
  valueExpr: string,
  derivExprs: string[],
  cols: (ArrayLike<number> | null)[],
  prelude: readonly string[]
): CombinedKernel {
  const body = [`    out[i] = ${valueExpr};`, `    const o = i * ${derivExprs.length};`, ...derivExprs.map((e, j) => `    jac[o + ${j}] = ${e};`)];
  return build(k, nv, indexed, cols, prelude, 'p, x, out, jac', body) as CombinedKernel;
}

function build(
  k: number,
  nv: number,
  indexed: boolean,
  cols: (ArrayLike<number> | null)[],
  prelude: readonly string[],
  signature: string,
  body: string[]
): unknown {
  const lines: string[] = ['"use strict";', `return function (${signature}) {`];
  for (let j = 0; j < k; j++) {
    lines.push(`  const q${j} = p[${j}];`);
  }
  lines.push('  const n = x.length;', '  for (let i = 0; i < n; i++) {');
  if (indexed) {
    lines.push('    const ix = x[i];');
    for (let v = 0; v < nv; v++) {
      lines.push(`    const v${v} = c${v}[ix];`);
    }
  } else {
    lines.push('    const v0 = x[i];');
  }
  lines.push(...prelude.map((l) => `    ${l}`), ...body, '  }', '};');
  const argNames = cols.map((_, v) => `c${v}`);
  const factory = new Function(...argNames, lines.join('\n')) as (...c: unknown[]) => unknown;
  return factory(...cols.map((c) => (c ? Float64Array.from(c) : null)));
}

/**
 * Scope of one point, as a Map: names such as `constructor` or `__proto__`
 * are ordinary parameters there (a plain object would resolve them to, or
 * refuse them as, properties of Object.prototype).
 */
function scopeFor(
  p: Float64Array,
  x: Float64Array,
  i: number,
  parameters: string[],
  variables: string[],
  constants: Record<string, number>,
  cols: (ArrayLike<number> | null)[]
): Map<string, number> {
  const scope = new Map<string, number>();
  for (const name of Object.keys(constants)) {
    scope.set(name, constants[name]);
  }
  parameters.forEach((name, j) => {
    scope.set(name, p[j]);
  });
  variables.forEach((name, v) => {
    const c = cols[v];
    scope.set(name, c ? c[x[i]] : x[i]);
  });
  return scope;
}

/** A mathjs result as a number: booleans (comparisons) are 1 or 0, anything else not numeric is NaN. */
function asNumber(v: unknown): number {
  return typeof v === 'number' ? v : typeof v === 'boolean' ? (v ? 1 : 0) : Number.NaN;
}

/** Fallback when generated functions are not allowed: mathjs compiled evaluation per point. */
export function interpret(
  node: MathNode,
  parameters: string[],
  variables: string[],
  constants: Record<string, number>,
  cols: (ArrayLike<number> | null)[]
): Kernel {
  return interpretMany([node], parameters, variables, constants, cols);
}

export function interpretMany(
  nodes: MathNode[],
  parameters: string[],
  variables: string[],
  constants: Record<string, number>,
  cols: (ArrayLike<number> | null)[]
): Kernel {
  const compiled = nodes.map((nd) => nd.compile());
  return (p, x, out) => {
    for (let i = 0; i < x.length; i++) {
      const scope = scopeFor(p, x, i, parameters, variables, constants, cols);
      compiled.forEach((c, j) => {
        out[i * compiled.length + j] = asNumber(c.evaluate(scope));
      });
    }
  };
}
