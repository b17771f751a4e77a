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
 * The eigen-decomposition starts from the eigenvectors of the previous one
 * over the same columns (`symmetricEigen` with a warm start; a cold start
 * after 32 warm ones in a row), and when the previous model's λmin/λmax was
 * near or below `normalEquationsMinRatio`, a pivoted Cholesky
 * factorisation first tries to prove the SVD necessary, which skips the
 * eigen-decomposition (`choleskyPivotRatio`: a pivot bounds λmin from
 * above, so the test chooses the SVD only where the eigenvalues would, up
 * to rounding at the threshold itself; on the NIST StRD fits it decides 97
 * of the 101 SVD models and no other).
 *
 * References (keys of REFERENCES.md): [N2] for the scaling and the
 * iteration for μ, [N5] for the decompositions (`dense.ts`).
 *
 * Accuracy: the SVD gives singular values with absolute error ≈ ε·s_max
 * (ε = 2⁻⁵²), so directions with sᵢ below `singularTolerance`·s_max are
 * dropped as rank-deficient; the eigen-decomposition of JsᵀJs squares the
 * condition number and is used only when λmin/λmax ≥
 * `normalEquationsMinRatio` (or for many points, where statistical error
 * dwarfs it). A warm start changes the model only by rounding: its basis
 * departs from orthonormality by ≈ 2e-15 after 32 warm starts (measured,
 * m ≤ 9). μ is found to the accuracy the trust region needs
 * (‖z(μ)‖ within 10 % of Δ), not to full precision.
 */
import { FIT_DEFAULTS } from './defaults';
import { choleskyPivotRatio, MAX_SWEEPS, symmetricEigen, tallSvd } from './dense';
import { allFinite } from './residualSums';
import { normalKernel } from './unrolled';
import type { Workspace } from './workspace';

/** Smallest column count whose eigen-decomposition starts from the previous eigenvectors (m = 2 takes one rotation from cold). */
const WARM_MIN_COLUMNS = 3;
/**
 * Consecutive warm starts before a cold one: each adds rounding of order ε
 * to the basis's departure from orthonormality (a random walk: ≈ 2e-15
 * after 32, measured for m ≤ 9), which the next decomposition inherits.
 */
const WARM_MAX_CHAIN = 32;
/**
 * The Cholesky test for an ill-conditioned normal matrix runs when the
 * previous λmin/λmax for the same column count was below this multiple of
 * `normalEquationsMinRatio` (or unknown); otherwise it would rarely decide.
 */
const PRETEST_MARGIN = 1e3;

/** State kept between decompositions with the same column count m. */
export interface ISpectralBasis {
  /** Eigenvectors (columns, row-major m×m) of the last decomposition or SVD. */
  vectors: Float64Array;
  /** The columns they belong to. */
  cols: number[];
  /** `vectors` is orthonormal and may start the next decomposition over `cols`. */
  valid: boolean;
  /** Warm starts since the last cold decomposition or SVD. */
  age: number;
  /** λmin/λmax of the last model (NaN before the first). */
  ratio: number;
}

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
 * Work arrays of the spectral model for one fit (n points, k free
 * parameters), allocated once: the model for each column count m ≤ k is a
 * reused object, so an iteration allocates nothing. The model returned by
 * `spectralModel` stays valid until the next call with the same m. For
 * each m it also keeps the last eigenvectors, the start of the next
 * eigen-decomposition over the same columns.
 */
export class SpectralWork {
  readonly n: number;
  readonly k: number;
  private readonly _models: (ISpectralModel | undefined)[] = [];
  readonly normal: Float64Array;
  readonly values: Float64Array;
  readonly g: Float64Array;
  readonly order: number[] = [];
  readonly triangle: Float64Array;
  readonly s: Float64Array;
  readonly ub: Float64Array;
  private readonly _bases: (ISpectralBasis | undefined)[] = [];
  private _js: Float64Array | null = null;
  private _rhs: Float64Array | null = null;
  private readonly _workspace: Workspace | null;

  /** Length-n arrays come from `workspace` when given. */
  constructor(n: number, k: number, workspace: Workspace | null = null) {
    this.n = n;
    this.k = k;
    this._workspace = workspace;
    this.normal = new Float64Array(k * k);
    this.values = new Float64Array(k);
    this.g = new Float64Array(k);
    this.triangle = new Float64Array(k * k);
    this.s = new Float64Array(k);
    this.ub = new Float64Array(k);
  }

  /** The reused model object for m columns (its `cols` filled from `cols`). */
  model(cols: readonly number[]): ISpectralModel {
    const m = cols.length;
    let model = this._models[m];
    if (!model) {
      model = { cols: new Array<number>(m).fill(0), v: new Float64Array(m * m), s2: new Float64Array(m), c: new Float64Array(m) };
      this._models[m] = model;
    }
    for (let a = 0; a < m; a++) {
      model.cols[a] = cols[a];
    }
    return model;
  }

  /** The state kept between decompositions with m columns. */
  basis(m: number): ISpectralBasis {
    let basis = this._bases[m];
    if (!basis) {
      basis = { vectors: new Float64Array(m * m), cols: new Array<number>(m).fill(-1), valid: false, age: 0, ratio: Number.NaN };
      this._bases[m] = basis;
    }
    return basis;
  }

  /** Column-major n×k scratch for the scaled Jacobian. */
  get js(): Float64Array {
    return (this._js ??= this._array(this.n * this.k));
  }

  /** Length-n scratch for the residuals. */
  get rhs(): Float64Array {
    return (this._rhs ??= this._array(this.n));
  }

  private _array(length: number): Float64Array {
    return this._workspace ? this._workspace.take(length) : new Float64Array(length);
  }
}

/**
 * Builds the spectral model from the weighted Jacobian `jac` (row-major n×k)
 * restricted to `cols`, scaled by `diag`, for residuals `r` whose unscaled
 * gradient Jᵀr is `grad` (length k).
 * The m×m normal matrix is formed in a tight loop and eigen-decomposed
 * (from the eigenvectors of the previous call with the same `cols` in
 * `work`); when `useSvd` and its eigenvalue ratio is below
 * `normalEquationsMinRatio` (ill-conditioned), the SVD of the n×m scaled
 * Jacobian is used instead (Householder QR, then Jacobi on the triangle).
 * When a Cholesky pivot of the normal matrix already proves that ratio,
 * the eigen-decomposition is skipped.
 * `normalFull`, when given, is the unscaled k×k JᵀJ (symmetric, row-major)
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
  normalFull: Float64Array | null = null,
  work: SpectralWork = new SpectralWork(n, k)
): ISpectralModel {
  const m = cols.length;
  const model = work.model(cols);
  const { v, s2, c } = model;
  if (m === 0) {
    return model;
  }
  const normal = work.normal;
  if (normalFull) {
    scaledNormal(normalFull, k, cols, diag, normal);
  } else {
    normalMatrix(jac, n, k, cols, diag, normal);
  }
  const g = work.g;
  for (let a = 0; a < m; a++) {
    g[a] = grad[cols[a]] / diag[cols[a]];
  }
  // The eigenvectors of the previous decomposition over the same columns
  // start this one.
  const basis = work.basis(m);
  let same = basis.valid;
  for (let a = 0; a < m; a++) {
    same &&= basis.cols[a] === cols[a];
    basis.cols[a] = cols[a];
  }
  basis.valid = false;
  const minRatio = FIT_DEFAULTS.normalEquationsMinRatio;
  // A pivot of the Cholesky factorisation below minRatio·max diagonal proves
  // λmin/λmax < minRatio: the SVD is then taken without the decomposition.
  if (useSvd && !(basis.ratio >= PRETEST_MARGIN * minRatio) && choleskyPivotRatio(normal, m, minRatio, work.triangle) < minRatio) {
    svdModel(jac, n, k, cols, diag, r, singularTolerance, work, model);
    basis.vectors.set(v);
    basis.valid = allFinite(v, m * m);
    basis.age = 0;
    basis.ratio = (work.s[m - 1] / work.s[0]) ** 2;
    return model;
  }
  const ev = work.values;
  const vec = basis.vectors;
  const warm = same && m >= WARM_MIN_COLUMNS && basis.age < WARM_MAX_CHAIN;
  const sweeps = symmetricEigen(normal, m, ev, vec, warm);
  basis.age = warm ? basis.age + 1 : 0;
  // Descending eigenvalues by insertion sort of the indices (stable, m is small).
  const order = work.order;
  order.length = m;
  let finite = sweeps < MAX_SWEEPS;
  for (let a = 0; a < m; a++) {
    const e = ev[a];
    finite &&= Number.isFinite(e);
    let b = a;
    for (; b > 0 && ev[order[b - 1]] < e; b--) {
      order[b] = order[b - 1];
    }
    order[b] = a;
  }
  basis.valid = finite;
  const lmax = Math.max(ev[order[0]], 0);
  const lmin = ev[order[m - 1]];
  basis.ratio = lmin / lmax;
  if (useSvd && !(lmin >= minRatio * lmax)) {
    svdModel(jac, n, k, cols, diag, r, singularTolerance, work, model);
    return model;
  }
  const cut = Math.max(singularTolerance * singularTolerance, Number.EPSILON * m) * lmax;
  for (let a = 0; a < m; a++) {
    const col = order[a];
    const la = ev[col] > cut ? ev[col] : 0;
    s2[a] = la;
    let ca = 0;
    for (let b = 0; b < m; b++) {
      const vb = vec[b * m + col];
      v[b * m + a] = vb;
      ca += vb * g[b];
    }
    c[a] = la > 0 ? ca : 0;
  }
  return model;
}

/** Spectral model from the SVD of the n×m scaled Jacobian (accurate when ill-conditioned). */
function svdModel(
  jac: Float64Array,
  n: number,
  k: number,
  cols: number[],
  diag: Float64Array,
  r: Float64Array,
  singularTolerance: number,
  work: SpectralWork,
  model: ISpectralModel
): void {
  const m = cols.length;
  const { v, s2, c } = model;
  const js = work.js;
  for (let a = 0; a < m; a++) {
    const col = cols[a];
    const inv = 1 / diag[col];
    const o = a * n;
    for (let i = 0; i < n; i++) {
      js[o + i] = jac[i * k + col] * inv;
    }
  }
  const rhs = work.rhs;
  for (let i = 0; i < n; i++) {
    rhs[i] = r[i];
  }
  const s = work.s;
  const ub = work.ub;
  tallSvd(js, n, m, rhs, s, v, ub, work.triangle);
  const smax = s[0];
  for (let a = 0; a < m; a++) {
    const sa = s[a] > singularTolerance * smax ? s[a] : 0;
    s2[a] = sa * sa;
    c[a] = sa * ub[a];
  }
}

/** The m×m scaled normal matrix JsᵀJs over `cols` (row-major, into `out`), formed row by row. */
export function normalMatrix(
  jac: Float64Array,
  n: number,
  k: number,
  cols: readonly number[],
  diag: Float64Array,
  out: Float64Array
): void {
  const m = cols.length;
  const fast = m === k ? normalKernel(k) : null;
  if (fast) {
    fast(jac, n, out);
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
        out[a * m + b] = sum;
      }
    }
  }
  for (let a = 0; a < m; a++) {
    for (let b = a; b < m; b++) {
      const val = out[a * m + b] / (diag[cols[a]] * diag[cols[b]]);
      out[a * m + b] = val;
      out[b * m + a] = val;
    }
  }
}

/** The m×m scaled normal matrix over `cols` (row-major, into `out`) from the unscaled k×k JᵀJ `normal`. */
export function scaledNormal(normal: Float64Array, k: number, cols: readonly number[], diag: Float64Array, out: Float64Array): void {
  const m = cols.length;
  for (let a = 0; a < m; a++) {
    for (let b = a; b < m; b++) {
      const val = normal[cols[a] * k + cols[b]] / (diag[cols[a]] * diag[cols[b]]);
      out[a * m + b] = val;
      out[b * m + a] = val;
    }
  }
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
