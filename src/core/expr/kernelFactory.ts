/**
 * Evaluation kernels of expression models: a JavaScript function generated
 * from whitelisted source (see `compile.ts`), or mathjs `compile` with a
 * scope per point when code generation is not allowed.
 */
import { compile } from 'mathjs';
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

function scopeFor(
  p: Float64Array,
  x: Float64Array,
  i: number,
  parameters: string[],
  variables: string[],
  constants: Record<string, number>,
  cols: (ArrayLike<number> | null)[]
): Record<string, number> {
  const scope: Record<string, number> = { ...constants };
  parameters.forEach((name, j) => {
    scope[name] = p[j];
  });
  variables.forEach((name, v) => {
    const c = cols[v];
    scope[name] = c ? c[x[i]] : x[i];
  });
  return scope;
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
  const compiled = nodes.map((nd) => compile(nd.toString()));
  return (p, x, out) => {
    for (let i = 0; i < x.length; i++) {
      const scope = scopeFor(p, x, i, parameters, variables, constants, cols);
      compiled.forEach((c, j) => {
        const v: unknown = c.evaluate(scope);
        out[i * compiled.length + j] = typeof v === 'number' ? v : Number.NaN;
      });
    }
  };
}

