/**
 * Small dense linear algebra on flat Float64Arrays for the fit engine: the
 * symmetric eigen-decomposition of an m×m matrix (optionally started from
 * the eigenvectors of a nearby matrix), a Cholesky-based bound on its
 * condition, and the singular values, right singular vectors and Uᵀb of a
 * tall n×m matrix, with no matrix objects and no allocation when the caller
 * passes its work arrays.
 *
 * Method (general knowledge of numerical linear algebra, [N5] in
 * REFERENCES.md): cyclic Jacobi rotations for the symmetric eigenproblem,
 * in Rutishauser's form (the Handbook's contribution II/1: diagonal
 * updated by ∓t·apq, the other entries through τ = s/(1+c)) on the upper
 * triangle only; a warm start replaces A by Vᵀ·A·V for the previous
 * eigenvectors V and accumulates the rotations onto V (common practice,
 * no source). The condition bound uses that every pivot of a Cholesky
 * factorisation (a diagonal entry of a Schur complement) lies in
 * [λmin, λmax]. For the tall matrix, Householder QR (column-major, the
 * reflections applied to b as they are formed, so Qᵀb comes for free)
 * followed by one-sided (Hestenes) Jacobi on the m×m triangle R = U S Vᵀ.
 *
 * Accuracy (ε = 2⁻⁵²): Householder QR is backward stable (the computed R is
 * exact for a matrix within about m·n·ε·‖A‖ of A), and one-sided Jacobi
 * gives each singular value of R with an error of order ε·s (relative, for
 * R with well-scaled columns) — the accuracy of an SVD of A itself, so
 * directions with sᵢ ≥ 1e-13·s_max are resolved as by LAPACK's SVD. Cyclic
 * Jacobi on a symmetric matrix gives eigenvalues with absolute error
 * ≈ ε·‖A‖ and orthonormal eigenvectors to ≈ m·ε; a warm start adds the
 * start basis's own departure from orthonormality δ (Vᵀ·A·V is a
 * congruence, so each eigenvalue moves by a relative ≈ 2δ, and the
 * eigenvectors inherit δ). It stops at the same test either way: the
 * off-diagonal norm below 1e-17 of the diagonal's.
 */

/** Sweeps allowed for either Jacobi iteration (quadratic convergence needs far fewer). */
export const MAX_SWEEPS = 60;

/**
 * Eigen-decomposition of the symmetric m×m `a` (row-major, both triangles
 * set; overwritten, its lower triangle left stale). Writes the eigenvalues
 * into `values` (unsorted) and the eigenvectors as columns of `vectors`
 * (row-major m×m: component b of vector a at vectors[b*m + a]). Returns
 * the number of sweeps done (MAX_SWEEPS when not converged).
 *
 * With `warm`, `vectors` holds on entry an orthonormal basis V (the
 * eigenvectors of a nearby matrix): `a` is replaced by Vᵀ·a·V and the
 * rotations are accumulated onto V. A nearly diagonal Vᵀ·a·V needs fewer
 * sweeps: on the NIST StRD fits (m = 3…9, each decomposition started from
 * the previous one's eigenvectors) 2.3–3.5 on average instead of 3.1–6.1
 * from the identity. Any orthonormal V gives the same decomposition (Jacobi
 * converges from any start) under the same stopping test.
 *
 * Threshold Jacobi (a sweep skipping entries below 1 % of the mean squared
 * off-diagonal entry) was measured and not kept: on the graded normal
 * matrices of ill-conditioned fits the skipped entries are the ones that
 * set the small eigenvalues, and the sweeps rose (Lanczos1 from its first
 * start: 8.2 per decomposition on average against 3.6 without it).
 */
export function symmetricEigen(a: Float64Array, m: number, values: Float64Array, vectors: Float64Array, warm = false): number {
  if (warm) {
    congruence(a, m, vectors, values);
  } else {
    vectors.fill(0, 0, m * m);
    for (let i = 0; i < m; i++) {
      vectors[i * m + i] = 1;
    }
  }
  let sweep = 0;
  for (; sweep < MAX_SWEEPS; sweep++) {
    let off = 0;
    let diag = 0;
    for (let p = 0; p < m; p++) {
      const row = p * m;
      diag += a[row + p] * a[row + p];
      for (let q = p + 1; q < m; q++) {
        off += a[row + q] * a[row + q];
      }
    }
    if (!(off > 1e-34 * diag)) {
      break;
    }
    for (let p = 0; p < m; p++) {
      const rowP = p * m;
      for (let q = p + 1; q < m; q++) {
        const rowQ = q * m;
        const apq = a[rowP + q];
        if (apq === 0) {
          continue;
        }
        const app = a[rowP + p];
        const aqq = a[rowQ + q];
        if (Math.abs(apq) <= 1e-18 * Math.sqrt(Math.abs(app * aqq))) {
          a[rowP + q] = 0;
          continue;
        }
        // Rotation in the (p, q) plane zeroing apq (t = tan of its angle,
        // the smaller root).
        const theta = (aqq - app) / (2 * apq);
        const t = (theta >= 0 ? 1 : -1) / (Math.abs(theta) + Math.sqrt(theta * theta + 1));
        const c = 1 / Math.sqrt(t * t + 1);
        const s = t * c;
        const tau = s / (1 + c);
        a[rowP + p] = app - t * apq;
        a[rowQ + q] = aqq + t * apq;
        a[rowP + q] = 0;
        // Upper triangle only: the entries of rows/columns p and q are
        // a[r][p], a[r][q] (r < p), a[p][r], a[r][q] (p < r < q), a[p][r], a[q][r] (r > q).
        for (let r = 0; r < p; r++) {
          const rowR = r * m;
          const arp = a[rowR + p];
          const arq = a[rowR + q];
          a[rowR + p] = arp - s * (arq + tau * arp);
          a[rowR + q] = arq + s * (arp - tau * arq);
        }
        for (let r = p + 1; r < q; r++) {
          const arp = a[rowP + r];
          const arq = a[r * m + q];
          a[rowP + r] = arp - s * (arq + tau * arp);
          a[r * m + q] = arq + s * (arp - tau * arq);
        }
        for (let r = q + 1; r < m; r++) {
          const arp = a[rowP + r];
          const arq = a[rowQ + r];
          a[rowP + r] = arp - s * (arq + tau * arp);
          a[rowQ + r] = arq + s * (arp - tau * arq);
        }
        for (let r = 0; r < m; r++) {
          const rowR = r * m;
          const vrp = vectors[rowR + p];
          const vrq = vectors[rowR + q];
          vectors[rowR + p] = vrp - s * (vrq + tau * vrp);
          vectors[rowR + q] = vrq + s * (vrp - tau * vrq);
        }
      }
    }
  }
  for (let i = 0; i < m; i++) {
    values[i] = a[i * m + i];
  }
  return sweep;
}

/**
 * The upper triangle of Vᵀ·a·V in place of `a` (symmetric m×m, both
 * triangles read) for the m×m `v` (both row-major), with `t` (length m) as
 * scratch: first a·V row by row, then Vᵀ·(a·V) column by column, entries on
 * and above the diagonal only (column j is overwritten only after it is
 * read, and no later column is touched). 1.5·m³ multiply-adds.
 */
function congruence(a: Float64Array, m: number, v: Float64Array, t: Float64Array): void {
  for (let i = 0; i < m; i++) {
    const row = i * m;
    for (let j = 0; j < m; j++) {
      let sum = 0;
      for (let l = 0; l < m; l++) {
        sum += a[row + l] * v[l * m + j];
      }
      t[j] = sum;
    }
    for (let j = 0; j < m; j++) {
      a[row + j] = t[j];
    }
  }
  for (let j = 0; j < m; j++) {
    for (let i = 0; i <= j; i++) {
      let sum = 0;
      for (let l = 0; l < m; l++) {
        sum += v[l * m + i] * a[l * m + j];
      }
      t[i] = sum;
    }
    for (let i = 0; i <= j; i++) {
      a[i * m + j] = t[i];
    }
  }
}

/**
 * Smallest pivot of the Cholesky factorisation with diagonal pivoting of
 * the symmetric m×m `a` (row-major, not modified; `w` is m×m scratch),
 * divided by the largest diagonal entry of `a`. Every pivot is a diagonal
 * entry of a Schur complement, hence at least λmin, and λmax is at least
 * the largest diagonal entry, so a result below r proves λmin < r·λmax
 * (up to rounding of order ε). The factorisation stops at the first pivot
 * below `floor` and returns its ratio (≤ 0 when `a` is not numerically
 * positive definite); NaN when the diagonal is not positive.
 */
export function choleskyPivotRatio(a: Float64Array, m: number, floor: number, w: Float64Array): number {
  let top = 0;
  for (let i = 0; i < m; i++) {
    top = Math.max(top, a[i * m + i]);
  }
  if (!(top > 0)) {
    return Number.NaN;
  }
  for (let i = 0; i < m * m; i++) {
    w[i] = a[i];
  }
  let ratio = Infinity;
  for (let j = 0; j < m; j++) {
    // the largest remaining diagonal entry moves to position j (rows and columns swapped)
    let pivot = j;
    for (let i = j + 1; i < m; i++) {
      if (w[i * m + i] > w[pivot * m + pivot]) {
        pivot = i;
      }
    }
    if (pivot !== j) {
      for (let i = 0; i < m; i++) {
        swap(w, j * m + i, pivot * m + i);
      }
      for (let i = 0; i < m; i++) {
        swap(w, i * m + j, i * m + pivot);
      }
    }
    const d = w[j * m + j];
    ratio = Math.min(ratio, d / top);
    if (!(d / top >= floor)) {
      return d / top;
    }
    // Schur complement of the pivot in the trailing block (upper triangle, mirrored).
    for (let i = j + 1; i < m; i++) {
      const f = w[j * m + i] / d;
      for (let l = i; l < m; l++) {
        const val = w[i * m + l] - f * w[j * m + l];
        w[i * m + l] = val;
        w[l * m + i] = val;
      }
    }
  }
  return ratio;
}

/**
 * Thin SVD data of the column-major n×m `a` (n ≥ m; overwritten): singular
 * values into `s` (descending), right singular vectors as columns of `v`
 * (row-major m×m, as in `symmetricEigen`), and, when `b` (length n,
 * overwritten) is given, Uᵀb into `ub` (length m). `r` is m×m scratch.
 */
export function tallSvd(
  a: Float64Array,
  n: number,
  m: number,
  b: Float64Array | null,
  s: Float64Array,
  v: Float64Array,
  ub: Float64Array,
  r: Float64Array
): void {
  // Householder QR: R (upper triangle, row-major m×m) into r, Qᵀb into b.
  r.fill(0, 0, m * m);
  for (let j = 0; j < m; j++) {
    const cj = j * n;
    let norm2 = 0;
    for (let i = j; i < n; i++) {
      norm2 += a[cj + i] * a[cj + i];
    }
    const norm = Math.sqrt(norm2);
    const ajj = a[cj + j];
    if (norm === 0) {
      r[j * m + j] = 0;
      for (let c = j + 1; c < m; c++) {
        r[j * m + c] = a[c * n + j];
      }
      continue;
    }
    const alpha = ajj > 0 ? -norm : norm;
    const v0 = ajj - alpha;
    const vtv = norm2 - ajj * ajj + v0 * v0;
    a[cj + j] = v0;
    const beta = 2 / vtv;
    for (let c = j + 1; c < m; c++) {
      const cc = c * n;
      let dot = 0;
      for (let i = j; i < n; i++) {
        dot += a[cj + i] * a[cc + i];
      }
      const f = beta * dot;
      for (let i = j; i < n; i++) {
        a[cc + i] -= f * a[cj + i];
      }
      r[j * m + c] = a[cc + j];
    }
    if (b) {
      let dot = 0;
      for (let i = j; i < n; i++) {
        dot += a[cj + i] * b[i];
      }
      const f = beta * dot;
      for (let i = j; i < n; i++) {
        b[i] -= f * a[cj + i];
      }
    }
    r[j * m + j] = alpha;
  }
  // One-sided Jacobi on R (columns rotated until orthogonal): R V = U S.
  v.fill(0, 0, m * m);
  for (let i = 0; i < m; i++) {
    v[i * m + i] = 1;
  }
  for (let sweep = 0; sweep < MAX_SWEEPS; sweep++) {
    let rotated = false;
    for (let p = 0; p < m; p++) {
      for (let q = p + 1; q < m; q++) {
        let alpha = 0;
        let beta = 0;
        let gamma = 0;
        for (let i = 0; i < m; i++) {
          const rp = r[i * m + p];
          const rq = r[i * m + q];
          alpha += rp * rp;
          beta += rq * rq;
          gamma += rp * rq;
        }
        if (gamma === 0 || Math.abs(gamma) <= 4 * Number.EPSILON * Math.sqrt(alpha * beta)) {
          continue;
        }
        rotated = true;
        const zeta = (beta - alpha) / (2 * gamma);
        const t = (zeta >= 0 ? 1 : -1) / (Math.abs(zeta) + Math.sqrt(1 + zeta * zeta));
        const c = 1 / Math.sqrt(1 + t * t);
        const sn = c * t;
        for (let i = 0; i < m; i++) {
          const rp = r[i * m + p];
          const rq = r[i * m + q];
          r[i * m + p] = c * rp - sn * rq;
          r[i * m + q] = sn * rp + c * rq;
          const vp = v[i * m + p];
          const vq = v[i * m + q];
          v[i * m + p] = c * vp - sn * vq;
          v[i * m + q] = sn * vp + c * vq;
        }
      }
    }
    if (!rotated) {
      break;
    }
  }
  for (let a2 = 0; a2 < m; a2++) {
    let sum = 0;
    for (let i = 0; i < m; i++) {
      sum += r[i * m + a2] * r[i * m + a2];
    }
    s[a2] = Math.sqrt(sum);
    let dot = 0;
    if (b && s[a2] > 0) {
      for (let i = 0; i < m; i++) {
        dot += r[i * m + a2] * b[i];
      }
      dot /= s[a2];
    }
    ub[a2] = dot;
  }
  sortDescending(s, v, ub, m);
}

/** Sorts `s` descending (insertion sort, m is small), permuting the columns of `v` and the entries of `ub` alike. */
function sortDescending(s: Float64Array, v: Float64Array, ub: Float64Array, m: number): void {
  for (let a = 1; a < m; a++) {
    for (let b = a; b > 0 && s[b] > s[b - 1]; b--) {
      swap(s, b, b - 1);
      swap(ub, b, b - 1);
      for (let i = 0; i < m; i++) {
        swap(v, i * m + b, i * m + b - 1);
      }
    }
  }
}

function swap(x: Float64Array, i: number, j: number): void {
  const t = x[i];
  x[i] = x[j];
  x[j] = t;
}
