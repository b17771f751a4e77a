import type { ISpectralModel } from './subproblem';
import { geodesicKernel, gradientKernel, normalGradientKernel, timesKernel } from './unrolled';

/**
 * O(n·k) loops of the iteration, kept in plain functions so that they are
 * optimised independently of the generator that drives the iteration.
 *
 * Method: plain dense loops over the row-major n×k Jacobian (column norms
 * and Jᵀr for Moré's column scaling, J·v, the upper triangle of JᵀJ, vᵀNv,
 * the scaled ‖D·v‖) and the one-extra-point second directional derivative
 * of the geodesic acceleration [N2, N3 in REFERENCES.md]; unrolled variants
 * per k from `unrolled.ts` when code generation is allowed, with the same
 * arithmetic.
 *
 * Accuracy: ordinary recursive summation, relative error of each sum at
 * most about n·ε·Σ|terms| (ε = 2⁻⁵²); the iteration accounts for rounding
 * through `costNoise` (2‖r‖‖e‖ + ‖e‖², the noise level of Σr²) rather than
 * by compensated sums. `quadraticForm` is clamped at 0. `secondDirectional`
 * has the truncation error O(h‖v‖³) noted in `geodesic.ts`.
 */

/** colNorm[j] = ‖J_j‖, grad[j] = (Jᵀr)_j for row-major n×k `jac`. */
export function columnNormsAndGradient(
  jac: Float64Array,
  r: Float64Array,
  n: number,
  k: number,
  colNorm: Float64Array,
  grad: Float64Array
): void {
  const fast = gradientKernel(k);
  if (fast) {
    fast(jac, r, n, colNorm, grad);
    for (let j = 0; j < k; j++) {
      colNorm[j] = Math.sqrt(colNorm[j]);
    }
    return;
  }
  colNorm.fill(0);
  grad.fill(0);
  for (let i = 0; i < n; i++) {
    const row = i * k;
    const ri = r[i];
    for (let j = 0; j < k; j++) {
      const v = jac[row + j];
      colNorm[j] += v * v;
      grad[j] += v * ri;
    }
  }
  for (let j = 0; j < k; j++) {
    colNorm[j] = Math.sqrt(colNorm[j]);
  }
}

/** out = J·v; returns ‖J·v‖². */
export function jacobianTimes(jac: Float64Array, v: Float64Array, n: number, k: number, out: Float64Array): number {
  const fast = timesKernel(k);
  if (fast) {
    return fast(jac, v, n, out);
  }
  let norm2 = 0;
  for (let i = 0; i < n; i++) {
    const row = i * k;
    let s = 0;
    for (let j = 0; j < k; j++) {
      s += jac[row + j] * v[j];
    }
    out[i] = s;
    norm2 += s * s;
  }
  return norm2;
}

/**
 * Second directional derivative of r along v by one extra point:
 * out = (2/h)·((r(p + h v) − r(p))/h − J v), with `dp` = (p + h v) − p.
 */
export function secondDirectional(
  jac: Float64Array,
  dp: Float64Array,
  rShift: Float64Array,
  r: Float64Array,
  h: number,
  n: number,
  k: number,
  out: Float64Array
): void {
  const scale = 2 / (h * h);
  for (let i = 0; i < n; i++) {
    const row = i * k;
    let jv = 0;
    for (let j = 0; j < k; j++) {
      jv += jac[row + j] * dp[j];
    }
    out[i] = scale * (rShift[i] - r[i] - jv);
  }
}

/** out[a] = (Jᵀ v)_{cols[a]} / diag[cols[a]]. */
export function scaledTransposeTimes(
  jac: Float64Array,
  v: Float64Array,
  n: number,
  k: number,
  cols: number[],
  diag: Float64Array,
  out: Float64Array
): void {
  const m = cols.length;
  out.fill(0);
  if (m === k) {
    for (let i = 0; i < n; i++) {
      const row = i * k;
      const vi = v[i];
      for (let a = 0; a < k; a++) {
        out[a] += jac[row + a] * vi;
      }
    }
  } else {
    for (let i = 0; i < n; i++) {
      const row = i * k;
      const vi = v[i];
      for (let a = 0; a < m; a++) {
        out[a] += jac[row + cols[a]] * vi;
      }
    }
  }
  for (let a = 0; a < m; a++) {
    out[a] /= diag[cols[a]];
  }
}

/** Rounding-noise level of Σr²: 2‖r‖‖e‖ + ‖e‖² for ‖e‖² = `e2` (see `ResidualEvaluator.lastRoundingNorm2`). */
export function costNoise(cost: number, e2: number): number {
  return 2 * Math.sqrt(cost * e2) + e2;
}

/** χ² reduction predicted by the full Gauss–Newton step of the model: Σ cᵢ²/sᵢ². */
export function gaussNewtonReduction(m: ISpectralModel): number {
  let sum = 0;
  for (let a = 0; a < m.s2.length; a++) {
    if (m.s2[a] > 0) {
      sum += (m.c[a] * m.c[a]) / m.s2[a];
    }
  }
  return sum;
}

/** ‖D·v‖ for the diagonal scaling D. */
export function scaledNorm(diag: Float64Array, v: Float64Array): number {
  let s = 0;
  for (let j = 0; j < v.length; j++) {
    const t = diag[j] * v[j];
    s += t * t;
  }
  return Math.sqrt(s);
}

/**
 * One pass over the row-major n×k `jac`: upper triangle of JᵀJ into
 * `normal` (k×k row-major) and Jᵀr into `grad`, compensated when
 * `compensated` (the default; large problems, whose stopping rules are
 * statistical, sum plainly: the rounding of Jᵀr then moves the step by
 * about ε·√n standard errors). Returns false when a sum is not finite
 * (then `jac` has a non-finite entry, or entries whose squares overflow).
 */
export function normalAndGradient(
  jac: Float64Array,
  r: Float64Array,
  n: number,
  k: number,
  normal: Float64Array,
  grad: Float64Array,
  compensated = true
): boolean {
  const fast = normalGradientKernel(k, compensated);
  if (fast) {
    fast(jac, r, n, normal, grad);
  } else {
    normal.fill(0);
    grad.fill(0);
    for (let i = 0; i < n; i++) {
      const row = i * k;
      const ri = r[i];
      for (let a = 0; a < k; a++) {
        const ja = jac[row + a];
        grad[a] += ja * ri;
        for (let b = a; b < k; b++) {
          normal[a * k + b] += ja * jac[row + b];
        }
      }
    }
  }
  let check = 0;
  for (let a = 0; a < k; a++) {
    check += normal[a * k + a] * 0 + grad[a] * 0;
    for (let b = 0; b < a; b++) {
      normal[a * k + b] = normal[b * k + a];
    }
  }
  return check === 0;
}

/** vᵀ·N·v for the symmetric k×k `normal` (= ‖J·v‖² when N = JᵀJ). */
export function quadraticForm(normal: Float64Array, k: number, v: Float64Array): number {
  let sum = 0;
  for (let a = 0; a < k; a++) {
    let row = 0;
    for (let b = 0; b < k; b++) {
      row += normal[a * k + b] * v[b];
    }
    sum += v[a] * row;
  }
  return Math.max(sum, 0);
}

/**
 * Right-hand side of the geodesic acceleration over `cols`, scaled:
 * out[a] = (Jᵀ r_vv)_{cols[a]} / diag[cols[a]], with the second directional
 * derivative r_vv = (2/h²)(r(p + dp) − r(p) − J·dp) (dp = h·v), in one pass
 * when an unrolled kernel exists. `full` is scratch of length k.
 */
export function geodesicRightHandSide(
  jac: Float64Array,
  dp: Float64Array,
  rShift: Float64Array,
  r: Float64Array,
  h: number,
  n: number,
  k: number,
  cols: number[],
  diag: Float64Array,
  out: Float64Array,
  full: Float64Array,
  rvv: () => Float64Array
): void {
  const fast = geodesicKernel(k);
  if (fast) {
    fast(jac, dp, rShift, r, 2 / (h * h), n, full);
    for (let a = 0; a < cols.length; a++) {
      out[a] = full[cols[a]] / diag[cols[a]];
    }
    return;
  }
  const buf = rvv();
  secondDirectional(jac, dp, rShift, r, h, n, k, buf);
  scaledTransposeTimes(jac, buf, n, k, cols, diag, out);
}
