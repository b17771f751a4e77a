/**
 * Small dense linear algebra on flat Float64Arrays for the fit engine: the
 * symmetric eigen-decomposition of an m×m matrix and the singular values,
 * right singular vectors and Uᵀb of a tall n×m matrix, with no matrix
 * objects and no allocation when the caller passes its work arrays.
 *
 * Method (general knowledge of numerical linear algebra, [N5] in
 * REFERENCES.md): cyclic Jacobi rotations for the symmetric eigenproblem;
 * for the tall matrix, Householder QR (column-major, the reflections applied
 * to b as they are formed, so Qᵀb comes for free) followed by one-sided
 * (Hestenes) Jacobi on the m×m triangle R = U S Vᵀ.
 *
 * Accuracy (ε = 2⁻⁵²): Householder QR is backward stable (the computed R is
 * exact for a matrix within about m·n·ε·‖A‖ of A), and one-sided Jacobi
 * gives each singular value of R with an error of order ε·s (relative, for
 * R with well-scaled columns) — the accuracy of an SVD of A itself, so
 * directions with sᵢ ≥ 1e-13·s_max are resolved as by LAPACK's SVD. Cyclic
 * Jacobi on a symmetric matrix gives eigenvalues with absolute error
 * ≈ ε·‖A‖ and orthonormal eigenvectors to ≈ m·ε.
 */

/** Sweeps allowed for either Jacobi iteration (quadratic convergence needs far fewer). */
const MAX_SWEEPS = 60;

/**
 * Eigen-decomposition of the symmetric m×m `a` (row-major; overwritten).
 * Writes the eigenvalues into `values` (unsorted) and the eigenvectors as
 * columns of `vectors` (row-major m×m: component b of vector a at
 * vectors[b*m + a]).
 */
export function symmetricEigen(a: Float64Array, m: number, values: Float64Array, vectors: Float64Array): void {
  vectors.fill(0, 0, m * m);
  for (let i = 0; i < m; i++) {
    vectors[i * m + i] = 1;
  }
  for (let sweep = 0; sweep < MAX_SWEEPS; sweep++) {
    let off = 0;
    let diag = 0;
    for (let p = 0; p < m; p++) {
      diag += a[p * m + p] * a[p * m + p];
      for (let q = p + 1; q < m; q++) {
        off += a[p * m + q] * a[p * m + q];
      }
    }
    if (!(off > 1e-34 * diag)) {
      break;
    }
    for (let p = 0; p < m; p++) {
      for (let q = p + 1; q < m; q++) {
        const apq = a[p * m + q];
        if (apq === 0) {
          continue;
        }
        const app = a[p * m + p];
        const aqq = a[q * m + q];
        if (Math.abs(apq) <= 1e-18 * Math.sqrt(Math.abs(app * aqq))) {
          a[p * m + q] = 0;
          a[q * m + p] = 0;
          continue;
        }
        const theta = (aqq - app) / (2 * apq);
        const t = (theta >= 0 ? 1 : -1) / (Math.abs(theta) + Math.sqrt(theta * theta + 1));
        const c = 1 / Math.sqrt(t * t + 1);
        const s = t * c;
        for (let r = 0; r < m; r++) {
          const arp = a[r * m + p];
          const arq = a[r * m + q];
          a[r * m + p] = c * arp - s * arq;
          a[r * m + q] = s * arp + c * arq;
        }
        for (let r = 0; r < m; r++) {
          const apr = a[p * m + r];
          const aqr = a[q * m + r];
          a[p * m + r] = c * apr - s * aqr;
          a[q * m + r] = s * apr + c * aqr;
        }
        a[p * m + q] = 0;
        a[q * m + p] = 0;
        for (let r = 0; r < m; r++) {
          const vrp = vectors[r * m + p];
          const vrq = vectors[r * m + q];
          vectors[r * m + p] = c * vrp - s * vrq;
          vectors[r * m + q] = s * vrp + c * vrq;
        }
      }
    }
  }
  for (let i = 0; i < m; i++) {
    values[i] = a[i * m + i];
  }
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
