/**
 * Loop kernels unrolled over the number of columns k, generated once per k
 * from fixed internal templates (no user input reaches the source). Scalar
 * accumulators instead of typed-array stores make them several times faster
 * for large n. When code generation is not allowed (strict CSP), the
 * generic loops are used.
 */

/** Upper triangle of JᵀJ (row-major k×k, all columns) into `out`. */
export type NormalKernel = (jac: Float64Array, n: number, out: Float64Array) => void;
/** Column norms² and Jᵀr into `norm2`, `grad`. */
export type GradientKernel = (jac: Float64Array, r: Float64Array, n: number, norm2: Float64Array, grad: Float64Array) => void;

const normalCache = new Map<number, NormalKernel | null>();
const gradientCache = new Map<number, GradientKernel | null>();

/** Largest k for which unrolled kernels are generated. */
export const MAX_UNROLLED_COLUMNS = 10;

function compile<T>(params: string[], body: string): T | null {
  try {
    return new Function(...params, body) as T;
  } catch {
    return null;
  }
}

/** Unrolled JᵀJ kernel for k columns, or null. */
export function normalKernel(k: number): NormalKernel | null {
  if (k > MAX_UNROLLED_COLUMNS) {
    return null;
  }
  if (!normalCache.has(k)) {
    const decl: string[] = [];
    const load: string[] = [];
    const acc: string[] = [];
    const store: string[] = [];
    for (let a = 0; a < k; a++) {
      load.push(`const j${a} = jac[o + ${a}];`);
      for (let b = a; b < k; b++) {
        decl.push(`let s${a}_${b} = 0;`);
        acc.push(`s${a}_${b} += j${a} * j${b};`);
        store.push(`out[${a * k + b}] = s${a}_${b};`);
      }
    }
    const body = `"use strict";
${decl.join('\n')}
for (let i = 0; i < n; i++) {
  const o = i * ${k};
  ${load.join(' ')}
  ${acc.join(' ')}
}
${store.join('\n')}`;
    normalCache.set(k, compile<NormalKernel>(['jac', 'n', 'out'], body));
  }
  return normalCache.get(k) ?? null;
}

/** Unrolled column-norm / gradient kernel for k columns, or null. */
export function gradientKernel(k: number): GradientKernel | null {
  if (k > MAX_UNROLLED_COLUMNS) {
    return null;
  }
  if (!gradientCache.has(k)) {
    const decl: string[] = [];
    const loop: string[] = [];
    const store: string[] = [];
    // Jᵀr is summed with compensation: at the solution its terms
    // cancel, and the compensated sum keeps the stationary point accurate.
    for (let a = 0; a < k; a++) {
      decl.push(`let c${a} = 0; let g${a} = 0; let e${a} = 0;`);
      // Branch-free TwoSum: the exact rounding error of g + t, equal to Neumaier's.
      loop.push(
        `const j${a} = jac[o + ${a}]; c${a} += j${a} * j${a}; const t${a} = j${a} * ri; const u${a} = g${a} + t${a}; ` +
          `const w${a} = u${a} - g${a}; e${a} += (g${a} - (u${a} - w${a})) + (t${a} - w${a}); g${a} = u${a};`
      );
      store.push(`norm2[${a}] = c${a}; grad[${a}] = g${a} + e${a};`);
    }
    const body = `"use strict";
${decl.join('\n')}
for (let i = 0; i < n; i++) {
  const o = i * ${k};
  const ri = r[i];
  ${loop.join(' ')}
}
${store.join('\n')}`;
    gradientCache.set(k, compile<GradientKernel>(['jac', 'r', 'n', 'norm2', 'grad'], body));
  }
  return gradientCache.get(k) ?? null;
}

/** out = J·v for k columns; returns ‖J·v‖². */
export type TimesKernel = (jac: Float64Array, v: Float64Array, n: number, out: Float64Array) => number;

const timesCache = new Map<number, TimesKernel | null>();

/** Unrolled J·v kernel for k columns, or null. */
export function timesKernel(k: number): TimesKernel | null {
  if (k > MAX_UNROLLED_COLUMNS) {
    return null;
  }
  if (!timesCache.has(k)) {
    const load: string[] = [];
    const terms: string[] = [];
    for (let a = 0; a < k; a++) {
      load.push(`const v${a} = v[${a}];`);
      terms.push(`jac[o + ${a}] * v${a}`);
    }
    const body = `"use strict";
${load.join(' ')}
let norm2 = 0;
for (let i = 0; i < n; i++) {
  const o = i * ${k};
  const s = ${terms.join(' + ')};
  out[i] = s;
  norm2 += s * s;
}
return norm2;`;
    timesCache.set(k, compile<TimesKernel>(['jac', 'v', 'n', 'out'], body));
  }
  return timesCache.get(k) ?? null;
}

/** Upper triangle of JᵀJ (row-major k×k) and Jᵀr, in one pass. */
export type NormalGradientKernel = (jac: Float64Array, r: Float64Array, n: number, normal: Float64Array, grad: Float64Array) => void;

const normalGradientCache = new Map<number, NormalGradientKernel | null>();
const plainNormalGradientCache = new Map<number, NormalGradientKernel | null>();

/**
 * Unrolled fused JᵀJ / Jᵀr kernel for k columns, or null. Jᵀr is summed
 * with compensation when `compensated` (about twice the arithmetic per
 * point), otherwise plainly.
 */
export function normalGradientKernel(k: number, compensated = true): NormalGradientKernel | null {
  if (k > MAX_UNROLLED_COLUMNS) {
    return null;
  }
  const cache = compensated ? normalGradientCache : plainNormalGradientCache;
  if (!cache.has(k)) {
    const decl: string[] = [];
    const load: string[] = [];
    const acc: string[] = [];
    const store: string[] = [];
    for (let a = 0; a < k; a++) {
      decl.push(`let g${a} = 0; let e${a} = 0;`);
      load.push(`const j${a} = jac[o + ${a}];`);
      // Jᵀr compensated by branch-free TwoSum, as in the gradient kernel.
      acc.push(
        compensated
          ? `const t${a} = j${a} * ri; const u${a} = g${a} + t${a}; const w${a} = u${a} - g${a}; ` +
              `e${a} += (g${a} - (u${a} - w${a})) + (t${a} - w${a}); g${a} = u${a};`
          : `g${a} += j${a} * ri;`
      );
      store.push(`grad[${a}] = g${a} + e${a};`);
      for (let b = a; b < k; b++) {
        decl.push(`let s${a}_${b} = 0;`);
        acc.push(`s${a}_${b} += j${a} * j${b};`);
        store.push(`normal[${a * k + b}] = s${a}_${b};`);
      }
    }
    const body = `"use strict";
${decl.join('\n')}
for (let i = 0; i < n; i++) {
  const o = i * ${k};
  const ri = r[i];
  ${load.join(' ')}
  ${acc.join(' ')}
}
${store.join('\n')}`;
    cache.set(k, compile<NormalGradientKernel>(['jac', 'r', 'n', 'normal', 'grad'], body));
  }
  return cache.get(k) ?? null;
}

/**
 * out = Jᵀ·(scale·(rShift − r − J·dp)) over all k columns, in one pass
 * (the right-hand side of the geodesic acceleration).
 */
export type GeodesicKernel = (
  jac: Float64Array,
  dp: Float64Array,
  rShift: Float64Array,
  r: Float64Array,
  scale: number,
  n: number,
  out: Float64Array
) => void;

const geodesicCache = new Map<number, GeodesicKernel | null>();

/** Unrolled geodesic right-hand-side kernel for k columns, or null. */
export function geodesicKernel(k: number): GeodesicKernel | null {
  if (k > MAX_UNROLLED_COLUMNS) {
    return null;
  }
  if (!geodesicCache.has(k)) {
    const decl: string[] = [];
    const load: string[] = [];
    const terms: string[] = [];
    const acc: string[] = [];
    const store: string[] = [];
    for (let a = 0; a < k; a++) {
      decl.push(`const d${a} = dp[${a}]; let s${a} = 0;`);
      load.push(`const j${a} = jac[o + ${a}];`);
      terms.push(`j${a} * d${a}`);
      acc.push(`s${a} += j${a} * v;`);
      store.push(`out[${a}] = s${a};`);
    }
    const body = `"use strict";
${decl.join('\n')}
for (let i = 0; i < n; i++) {
  const o = i * ${k};
  ${load.join(' ')}
  const jv = ${terms.join(' + ')};
  const v = scale * (rShift[i] - r[i] - jv);
  ${acc.join(' ')}
}
${store.join('\n')}`;
    geodesicCache.set(k, compile<GeodesicKernel>(['jac', 'dp', 'rShift', 'r', 'scale', 'n', 'out'], body));
  }
  return geodesicCache.get(k) ?? null;
}
