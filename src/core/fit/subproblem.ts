/**
 * The Levenberg–Marquardt trust-region subproblem in scaled variables.
 *
 * With Js = J·D⁻¹ (D = Moré column scaling) decomposed as Js = U S Vᵀ
 * (SVD, accurate) or JsᵀJs = V S² Vᵀ (eigen-decomposition of the normal
 * matrix, fast for many points), the damped step in scaled variables is
 *   z(μ) = −V diag(cᵢ / (sᵢ² + μ)),  c = Vᵀ Jsᵀ r = S Uᵀ r,
 * and μ ≥ 0 is chosen so that ‖z(μ)‖ ≈ Δ (Hebden / Moré iteration on
 * 1/‖z(μ)‖, which is concave in μ so Newton from the left converges
 * monotonically).
 *
 * References (keys of REFERENCES.md): [N2] for the scaling and the
 * iteration for μ, [N5] for the decompositions (ml-matrix).
 *
 * Accuracy: the SVD gives singular values with absolute error ≈ ε·s_max
 * (ε = 2⁻⁵²), so directions with sᵢ below `singularTolerance`·s_max are
 * dropped as rank-deficient; the eigen-decomposition of JsᵀJs squares the
 * condition number and is used only when λmin/λmax ≥
 * `normalEquationsMinRatio` (or for many points, where statistical error
 * dwarfs it). μ is found to the accuracy the trust region needs
 * (‖z(μ)‖ within 10 % of Δ), not to full precision.
 */
import { EigenvalueDecomposition, Matrix, SingularValueDecomposition } from 'ml-matrix';
import { FIT_DEFAULTS } from './defaults';
import { normalKernel } from './unrolled';

/** Spectral form of the scaled Gauss–Newton model restricted to `cols`. */
export interface ISpectralModel {
  /** Indices (into the free parameters) of the columns in this model. */
  cols: number[];
  /** Right singular vectors / eigenvectors, m×m, row-major (m = cols.length). */
  v: Float64Array;
  /** Squared singular values sᵢ², descending, with rank-deficient ones set to 0. */
  s2: Float64Array;
  /** cᵢ = (Vᵀ Jsᵀ r)ᵢ. */
  c: Float64Array;
}

/**
 * Builds the spectral model from the weighted Jacobian `jac` (row-major n×k)
 * restricted to `cols`, scaled by `diag`, for residuals `r` whose unscaled
 * gradient Jᵀr is `grad` (length k).
 * The m×m normal matrix is formed in a tight loop and eigen-decomposed; when
 * `useSvd` and its eigenvalue ratio is below `normalEquationsMinRatio`
 * (ill-conditioned), the SVD of the n×m scaled Jacobian is used instead.
 * `normal`, when given, is the unscaled k×k JᵀJ (symmetric, row-major)
 * already formed, and saves the pass over `jac`.
 */
export function spectralModel(
  jac: Float64Array,
  n: number,
  k: number,
  cols: number[],
  diag: Float64Array,
  r: Float64Array,
  grad: Float64Array,
  useSvd: boolean,
  singularTolerance: number,
  normalFull: Float64Array | null = null
): ISpectralModel {
  const m = cols.length;
  const v = new Float64Array(m * m);
  const s2 = new Float64Array(m);
  const c = new Float64Array(m);
  if (m === 0) {
    return { cols, v, s2, c };
  }
  const normal = normalFull ? scaledNormal(normalFull, k, cols, diag) : normalMatrix(jac, n, k, cols, diag);
  const g = new Float64Array(m);
  for (let a = 0; a < m; a++) {
    g[a] = grad[cols[a]] / diag[cols[a]];
  }
  const evd = new EigenvalueDecomposition(normal, { assumeSymmetric: true });
  const ev = evd.realEigenvalues;
  const vec = evd.eigenvectorMatrix;
  const order = ev.map((_, i) => i).sort((p, q) => ev[q] - ev[p]);
  const lmax = Math.max(ev[order[0]], 0);
  const lmin = ev[order[m - 1]];
  if (useSvd && !(lmin >= FIT_DEFAULTS.normalEquationsMinRatio * lmax)) {
    return svdModel(jac, n, k, cols, diag, r, singularTolerance);
  }
  const cut = Math.max(singularTolerance * singularTolerance, Number.EPSILON * m) * lmax;
  for (let a = 0; a < m; a++) {
    const col = order[a];
    const la = ev[col] > cut ? ev[col] : 0;
    s2[a] = la;
    let ca = 0;
    for (let b = 0; b < m; b++) {
      const vb = vec.get(b, col);
      v[b * m + a] = vb;
      ca += vb * g[b];
    }
    c[a] = la > 0 ? ca : 0;
  }
  return { cols, v, s2, c };
}

/** Spectral model from the SVD of the n×m scaled Jacobian (accurate when ill-conditioned). */
function svdModel(
  jac: Float64Array,
  n: number,
  k: number,
  cols: number[],
  diag: Float64Array,
  r: Float64Array,
  singularTolerance: number
): ISpectralModel {
  const m = cols.length;
  const v = new Float64Array(m * m);
  const s2 = new Float64Array(m);
  const c = new Float64Array(m);
  const js = new Matrix(n, m);
  for (let i = 0; i < n; i++) {
    const row = i * k;
    for (let a = 0; a < m; a++) {
      js.set(i, a, jac[row + cols[a]] / diag[cols[a]]);
    }
  }
  const svd = new SingularValueDecomposition(js, {
    computeLeftSingularVectors: true,
    computeRightSingularVectors: true,
    autoTranspose: false
  });
  const s = svd.diagonal;
  const u = svd.leftSingularVectors;
  const vv = svd.rightSingularVectors;
  const smax = s[0];
  for (let a = 0; a < m; a++) {
    let ur = 0;
    for (let i = 0; i < n; i++) {
      ur += u.get(i, a) * r[i];
    }
    const sa = s[a] > singularTolerance * smax ? s[a] : 0;
    s2[a] = sa * sa;
    c[a] = sa * ur;
    for (let b = 0; b < m; b++) {
      v[b * m + a] = vv.get(b, a);
    }
  }
  return { cols, v, s2, c };
}

/** The m×m scaled normal matrix JsᵀJs over `cols`, formed row by row. */
export function normalMatrix(
  jac: Float64Array,
  n: number,
  k: number,
  cols: number[],
  diag: Float64Array
): Matrix {
  const m = cols.length;
  const acc = new Float64Array(m * m);
  const fast = m === k ? normalKernel(k) : null;
  if (fast) {
    fast(jac, n, acc);
  } else {
    // one pass per column pair with a scalar accumulator
    for (let a = 0; a < m; a++) {
      const ca = cols[a];
      for (let b = a; b < m; b++) {
        const cb = cols[b];
        let sum = 0;
        for (let i = 0; i < n; i++) {
          const row = i * k;
          sum += jac[row + ca] * jac[row + cb];
        }
        acc[a * m + b] = sum;
      }
    }
  }
  const out = new Matrix(m, m);
  for (let a = 0; a < m; a++) {
    for (let b = a; b < m; b++) {
      const val = acc[a * m + b] / (diag[cols[a]] * diag[cols[b]]);
      out.set(a, b, val);
      out.set(b, a, val);
    }
  }
  return out;
}

/** The m×m scaled normal matrix over `cols` from the unscaled k×k JᵀJ `normal`. */
export function scaledNormal(normal: Float64Array, k: number, cols: number[], diag: Float64Array): Matrix {
  const m = cols.length;
  const out = new Matrix(m, m);
  for (let a = 0; a < m; a++) {
    for (let b = a; b < m; b++) {
      const val = normal[cols[a] * k + cols[b]] / (diag[cols[a]] * diag[cols[b]]);
      out.set(a, b, val);
      out.set(b, a, val);
    }
  }
  return out;
}

/** ‖z(μ)‖ for the spectral model. */
function stepNorm(model: ISpectralModel, mu: number): number {
  let sum = 0;
  for (let a = 0; a < model.s2.length; a++) {
    const den = model.s2[a] + mu;
    if (den > 0) {
      const t = model.c[a] / den;
      sum += t * t;
    }
  }
  return Math.sqrt(sum);
}

/** Writes z(μ) (scaled step over `model.cols`) into `out`. */
export function stepForMu(model: ISpectralModel, mu: number, out: Float64Array): void {
  const m = model.cols.length;
  out.fill(0, 0, m);
  for (let a = 0; a < m; a++) {
    const den = model.s2[a] + mu;
    if (!(den > 0)) {
      continue;
    }
    const w = -model.c[a] / den;
    for (let b = 0; b < m; b++) {
      out[b] += model.v[b * m + a] * w;
    }
  }
}

/**
 * Damping μ ≥ 0 such that ‖z(μ)‖ ≤ Δ, within 10 % of Δ when μ > 0.
 * `mu0` is a warm start (the previous μ); μ = 0 is used when the
 * Gauss–Newton step already fits.
 */
export function dampingForRadius(model: ISpectralModel, delta: number): number {
  const gn = stepNorm(model, 0);
  if (gn <= 1.1 * delta) {
    return 0;
  }
  // Newton on ψ(μ) = 1/‖z(μ)‖ − 1/Δ, concave and increasing: monotone from the left.
  let mu = 0;
  for (let iter = 0; iter < 60; iter++) {
    let sum = 0;
    let sum3 = 0;
    for (let a = 0; a < model.s2.length; a++) {
      const den = model.s2[a] + mu;
      if (den > 0) {
        const t = model.c[a] / den;
        sum += t * t;
        sum3 += (t * t) / den;
      }
    }
    const norm = Math.sqrt(sum);
    if (norm <= 1.1 * delta && norm >= 0.9 * delta) {
      return mu;
    }
    if (norm === 0) {
      return mu;
    }
    // dψ/dμ = Σ c²/(s²+μ)³ / ‖z‖³
    const psi = 1 / norm - 1 / delta;
    const dpsi = sum3 / (norm * norm * norm);
    if (!(dpsi > 0)) {
      break;
    }
    const next = mu - psi / dpsi;
    if (!(next > mu) && psi < 0) {
      // safeguard against stagnation from rounding
      mu = mu === 0 ? 1e-300 : mu * 2;
    } else {
      mu = next;
    }
  }
  return mu;
}

/**
 * out = −(JsᵀJs + μI)⁺ rhs over `model.cols` (pseudo-inverse for zero
 * modes when μ = 0). Used for the geodesic acceleration.
 */
export function solveDamped(
  model: ISpectralModel,
  mu: number,
  rhs: Float64Array,
  out: Float64Array
): void {
  const m = model.cols.length;
  out.fill(0, 0, m);
  for (let a = 0; a < m; a++) {
    const den = model.s2[a] + mu;
    if (!(den > 0)) {
      continue;
    }
    let proj = 0;
    for (let b = 0; b < m; b++) {
      proj += model.v[b * m + a] * rhs[b];
    }
    const w = -proj / den;
    for (let b = 0; b < m; b++) {
      out[b] += model.v[b * m + a] * w;
    }
  }
}
