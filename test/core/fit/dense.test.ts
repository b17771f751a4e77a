/**
 * Small dense linear algebra of the engine (src/core/fit/dense.ts): the
 * defining identities of an eigen-decomposition and an SVD, checked on
 * seeded random matrices and on a matrix built from chosen singular values;
 * the warm-started eigen-decomposition against the cold one; the Cholesky
 * pivot bound against the eigenvalues (common practice, no source).
 */
import { describe, expect, it } from 'vitest';
import { choleskyPivotRatio, MAX_SWEEPS, symmetricEigen, tallSvd } from '../../../src/core/fit/dense';
import { mulberry32 } from './prng';

const rand = mulberry32(77);

describe('symmetricEigen', () => {
  it.each([1, 2, 3, 5, 8])('A·v = λ·v with orthonormal v (m = %i)', (m) => {
    const a = new Float64Array(m * m);
    for (let i = 0; i < m; i++) {
      for (let j = i; j < m; j++) {
        const v = rand() - 0.5;
        a[i * m + j] = v;
        a[j * m + i] = v;
      }
    }
    const copy = a.slice();
    const values = new Float64Array(m);
    const vectors = new Float64Array(m * m);
    symmetricEigen(copy, m, values, vectors);
    for (let c = 0; c < m; c++) {
      for (let i = 0; i < m; i++) {
        let av = 0;
        for (let j = 0; j < m; j++) {
          av += a[i * m + j] * vectors[j * m + c];
        }
        expect(Math.abs(av - values[c] * vectors[i * m + c])).toBeLessThan(1e-14);
      }
      for (let d = 0; d < m; d++) {
        let dot = 0;
        for (let i = 0; i < m; i++) {
          dot += vectors[i * m + c] * vectors[i * m + d];
        }
        expect(Math.abs(dot - (c === d ? 1 : 0))).toBeLessThan(1e-14);
      }
    }
  });
});

/** Random m×m orthogonal matrix (row-major): Gram–Schmidt, twice, on seeded random columns. */
function randomOrthogonal(m: number): Float64Array {
  const q = Float64Array.from({ length: m * m }, () => rand() - 0.5);
  for (let c = 0; c < m; c++) {
    for (let pass = 0; pass < 2; pass++) {
      for (let d = 0; d < c; d++) {
        let dot = 0;
        for (let i = 0; i < m; i++) {
          dot += q[i * m + c] * q[i * m + d];
        }
        for (let i = 0; i < m; i++) {
          q[i * m + c] -= dot * q[i * m + d];
        }
      }
    }
    let norm = 0;
    for (let i = 0; i < m; i++) {
      norm += q[i * m + c] ** 2;
    }
    for (let i = 0; i < m; i++) {
      q[i * m + c] /= Math.sqrt(norm);
    }
  }
  return q;
}

/** Symmetric m×m Q·diag(λ)·Qᵀ (row-major, both triangles) for the orthogonal `q`. */
function withEigenvalues(q: Float64Array, lambda: readonly number[]): Float64Array {
  const m = lambda.length;
  const a = new Float64Array(m * m);
  for (let i = 0; i < m; i++) {
    for (let j = i; j < m; j++) {
      let sum = 0;
      for (let l = 0; l < m; l++) {
        sum += q[i * m + l] * lambda[l] * q[j * m + l];
      }
      a[i * m + j] = sum;
      a[j * m + i] = sum;
    }
  }
  return a;
}

/** The symmetric `a` plus a seeded random symmetric perturbation of entries up to ±size/2. */
function perturbed(a: Float64Array, m: number, size: number): Float64Array {
  const out = a.slice();
  for (let i = 0; i < m; i++) {
    for (let j = i; j < m; j++) {
      const d = size * (rand() - 0.5);
      out[i * m + j] += d;
      if (j !== i) {
        out[j * m + i] += d;
      }
    }
  }
  return out;
}

interface IEigen {
  values: Float64Array;
  vectors: Float64Array;
  sweeps: number;
}

/** `symmetricEigen` of a copy of `a`, cold or from the basis `start` (copied). */
function eigen(a: Float64Array, m: number, start: Float64Array | null = null): IEigen {
  const values = new Float64Array(m);
  const vectors = start ? start.slice() : new Float64Array(m * m);
  const sweeps = symmetricEigen(a.slice(), m, values, vectors, start !== null);
  return { values, vectors, sweeps };
}

/** Largest |A·v − λ·v| and |VᵀV − I| entry, and ‖A‖ (Frobenius). */
function defects(a: Float64Array, m: number, e: IEigen): { residual: number; orthogonality: number; norm: number } {
  let residual = 0;
  let orthogonality = 0;
  let norm = 0;
  for (let i = 0; i < m * m; i++) {
    norm += a[i] * a[i];
  }
  for (let c = 0; c < m; c++) {
    for (let i = 0; i < m; i++) {
      let av = 0;
      for (let j = 0; j < m; j++) {
        av += a[i * m + j] * e.vectors[j * m + c];
      }
      residual = Math.max(residual, Math.abs(av - e.values[c] * e.vectors[i * m + c]));
    }
    for (let d = 0; d < m; d++) {
      let dot = 0;
      for (let i = 0; i < m; i++) {
        dot += e.vectors[i * m + c] * e.vectors[i * m + d];
      }
      orthogonality = Math.max(orthogonality, Math.abs(dot - (c === d ? 1 : 0)));
    }
  }
  return { residual, orthogonality, norm: Math.sqrt(norm) };
}

/** Index order of descending eigenvalues. */
function descending(values: Float64Array): number[] {
  return Array.from(values.keys()).sort((p, q) => values[q] - values[p]);
}

/**
 * Largest difference of the sorted eigenvalues of `x` and `y`, and of their
 * eigenvectors (matched by sorted position, signs aligned).
 */
function difference(x: IEigen, y: IEigen, m: number): { values: number; vectors: number } {
  const ox = descending(x.values);
  const oy = descending(y.values);
  let values = 0;
  let vectors = 0;
  for (let a = 0; a < m; a++) {
    const cx = ox[a];
    const cy = oy[a];
    values = Math.max(values, Math.abs(x.values[cx] - y.values[cy]));
    let dot = 0;
    for (let i = 0; i < m; i++) {
      dot += x.vectors[i * m + cx] * y.vectors[i * m + cy];
    }
    const sign = dot < 0 ? -1 : 1;
    for (let i = 0; i < m; i++) {
      vectors = Math.max(vectors, Math.abs(x.vectors[i * m + cx] - sign * y.vectors[i * m + cy]));
    }
  }
  return { values, vectors };
}

/** Eigenvalues spread evenly in log between 1 and `smallest`. */
function graded(m: number, smallest: number): number[] {
  return Array.from({ length: m }, (_, i) => (m === 1 ? 1 : smallest ** (i / (m - 1))));
}

describe('symmetricEigen from a start basis', () => {
  // The fit's case: the basis is the eigenvectors of the previous, slightly
  // different normal matrix. Eigenvalues well separated (1 … 0.1), so the
  // eigenvectors are determined to ≈ ε: both starts must agree to 1e-14 in
  // every eigenvalue and eigenvector component, and the warm one must need
  // fewer sweeps.
  it.each([3, 5, 9])('matches the cold start to 1e-14 from a perturbed basis, in fewer sweeps (m = %i)', (m) => {
    const a = withEigenvalues(randomOrthogonal(m), graded(m, 0.1));
    const cold = eigen(a, m);
    const previous = eigen(perturbed(a, m, 1e-6), m);
    const warm = eigen(a, m, previous.vectors);
    const diff = difference(warm, cold, m);
    expect(diff.values).toBeLessThan(1e-14);
    expect(diff.vectors).toBeLessThan(1e-14);
    const d = defects(a, m, warm);
    expect(d.residual).toBeLessThan(1e-14 * d.norm);
    expect(d.orthogonality).toBeLessThan(1e-14);
    expect(warm.sweeps).toBeLessThan(cold.sweeps);
  });

  // Graded matrices like the normal matrices of ill-conditioned fits
  // (eigenvalues 1 … 1e-12): the small eigenvalues are determined only to
  // ≈ ε·‖A‖ absolutely, and both starts must reach that, each with the
  // decomposition's residual at rounding level.
  it.each([4, 7])('agrees with the cold start to ε·‖A‖ on a graded matrix (m = %i)', (m) => {
    const a = withEigenvalues(randomOrthogonal(m), graded(m, 1e-12));
    const cold = eigen(a, m);
    const warm = eigen(a, m, eigen(perturbed(a, m, 1e-5), m).vectors);
    expect(difference(warm, cold, m).values).toBeLessThan(1e-15);
    for (const e of [cold, warm]) {
      const d = defects(a, m, e);
      expect(d.residual).toBeLessThan(1e-15 * d.norm);
      expect(d.orthogonality).toBeLessThan(1e-14);
    }
  });

  // Jacobi converges from any orthonormal start: an unrelated random basis
  // and a signed permutation of the identity give a full decomposition with
  // the cold start's eigenvalues.
  it.each([3, 6])('converges from an unrelated basis (m = %i)', (m) => {
    const a = withEigenvalues(randomOrthogonal(m), graded(m, 1e-3));
    const cold = eigen(a, m);
    const permutation = new Float64Array(m * m);
    for (let i = 0; i < m; i++) {
      permutation[i * m + ((i + 1) % m)] = i % 2 === 0 ? 1 : -1;
    }
    for (const start of [randomOrthogonal(m), permutation]) {
      const warm = eigen(a, m, start);
      expect(warm.sweeps).toBeLessThan(MAX_SWEEPS);
      expect(difference(warm, cold, m).values).toBeLessThan(1e-14);
      const d = defects(a, m, warm);
      expect(d.residual).toBeLessThan(1e-14 * d.norm);
      expect(d.orthogonality).toBeLessThan(1e-14);
    }
  });

  // m = 1: the start basis is ±1 and Vᵀ·a·V = a. m = 2: one rotation from
  // any basis.
  it('handles m = 1 and m = 2', () => {
    const one = eigen(Float64Array.of(2.5), 1, Float64Array.of(-1));
    expect(one.values[0]).toBe(2.5);
    expect(Math.abs(one.vectors[0])).toBe(1);
    const a = withEigenvalues(randomOrthogonal(2), [3, 0.5]);
    const warm = eigen(a, 2, randomOrthogonal(2));
    expect(difference(warm, eigen(a, 2), 2).values).toBeLessThan(1e-15);
    const d = defects(a, 2, warm);
    expect(d.residual).toBeLessThan(1e-15 * d.norm);
    expect(d.orthogonality).toBeLessThan(1e-15);
  });

  // Rank 2 of 5 (a normal matrix with dependent columns): three eigenvalues
  // vanish to ≈ ε·‖A‖ and the nonzero ones match the cold start.
  it('handles a rank-deficient matrix', () => {
    const m = 5;
    const a = withEigenvalues(randomOrthogonal(m), [2, 0.7, 0, 0, 0]);
    const cold = eigen(a, m);
    const warm = eigen(a, m, eigen(perturbed(a, m, 1e-6), m).vectors);
    expect(difference(warm, cold, m).values).toBeLessThan(1e-15);
    const order = descending(warm.values);
    for (const c of order.slice(2)) {
      expect(Math.abs(warm.values[c])).toBeLessThan(1e-15);
    }
    const d = defects(a, m, warm);
    expect(d.residual).toBeLessThan(1e-15 * d.norm);
    expect(d.orthogonality).toBeLessThan(1e-14);
  });

  // A start at the exact eigenvectors leaves Vᵀ·a·V diagonal to rounding:
  // at most one sweep.
  it('needs at most one sweep from the eigenvectors of the same matrix', () => {
    const m = 6;
    const a = withEigenvalues(randomOrthogonal(m), graded(m, 1e-4));
    expect(eigen(a, m, eigen(a, m).vectors).sweeps).toBeLessThanOrEqual(1);
  });

  // The fit chains warm starts (each from the last one's eigenvectors);
  // rounding makes the basis drift from orthonormality as a random walk.
  // After 200 steps along a slowly changing matrix it stays below 1e-14.
  it('keeps the basis orthonormal along a chain of 200 warm starts', () => {
    const m = 6;
    let a = withEigenvalues(randomOrthogonal(m), graded(m, 1e-6));
    let vectors = eigen(a, m).vectors;
    for (let step = 0; step < 200; step++) {
      a = perturbed(a, m, 1e-4);
      const e = eigen(a, m, vectors);
      vectors = e.vectors;
      const d = defects(a, m, e);
      expect(d.residual).toBeLessThan(1e-14 * d.norm);
      expect(d.orthogonality).toBeLessThan(1e-14);
    }
  });
});

describe('choleskyPivotRatio', () => {
  // Every pivot lies in [λmin, λmax] and the largest diagonal entry is at
  // most λmax, so the ratio is at least λmin/λmax (up to rounding, ≈ ε
  // here) and at most 1; below the floor it stops at the first such pivot.
  it.each([1e-2, 1e-6, 1e-10, 1e-12, 1e-14])('bounds λmin/λmax = %s from above', (ratio) => {
    for (const m of [2, 4, 7]) {
      const a = withEigenvalues(randomOrthogonal(m), graded(m, ratio));
      const r = choleskyPivotRatio(a, m, 0, new Float64Array(m * m));
      expect(r).toBeGreaterThanOrEqual(ratio - 1e-15);
      expect(r).toBeLessThanOrEqual(1);
      const stopped = choleskyPivotRatio(a, m, 1e-11, new Float64Array(m * m));
      expect(stopped >= 1e-11 ? stopped === r : stopped < 1e-11).toBe(true);
    }
  });

  // The fit's use: a ratio below 1e-11 must never occur where the
  // eigenvalues say λmin/λmax ≥ 1e-11, here for condition numbers around
  // that threshold.
  it('proves ill-conditioning only where the eigenvalues agree', () => {
    const floor = 1e-11;
    for (let trial = 0; trial < 200; trial++) {
      const m = 3 + (trial % 6);
      const ratio = 10 ** (-9 - 4 * rand());
      const a = withEigenvalues(randomOrthogonal(m), graded(m, ratio));
      if (choleskyPivotRatio(a, m, floor, new Float64Array(m * m)) < floor) {
        const e = eigen(a, m);
        expect(Math.min(...e.values)).toBeLessThan(floor * Math.max(...e.values));
      }
    }
  });

  // Semidefinite (rank 2 of 4): a pivot at rounding level, far below any
  // useful floor. A zero matrix has no positive diagonal: NaN (undecided).
  it('reports a semidefinite matrix and gives NaN for a zero one', () => {
    const a = withEigenvalues(randomOrthogonal(4), [1, 0.5, 0, 0]);
    expect(choleskyPivotRatio(a, 4, 1e-11, new Float64Array(16))).toBeLessThan(1e-13);
    expect(choleskyPivotRatio(new Float64Array(9), 3, 1e-11, new Float64Array(9))).toBeNaN();
  });
});

/** Column-major n×m matrix U·diag(s)·Vᵀ from Householder reflections of seeded random vectors. */
function withSingularValues(n: number, s: number[]): Float64Array {
  const m = s.length;
  const a = new Float64Array(n * m);
  for (let j = 0; j < m; j++) {
    a[j * n + j] = s[j];
  }
  // left: I − 2uuᵀ on the columns; right: I − 2wwᵀ on the rows
  const u = Float64Array.from({ length: n }, () => rand() - 0.5);
  const un = Math.hypot(...u);
  u.forEach((v, i) => (u[i] = v / un));
  for (let j = 0; j < m; j++) {
    let dot = 0;
    for (let i = 0; i < n; i++) {
      dot += u[i] * a[j * n + i];
    }
    for (let i = 0; i < n; i++) {
      a[j * n + i] -= 2 * dot * u[i];
    }
  }
  const w = Float64Array.from({ length: m }, () => rand() - 0.5);
  const wn = Math.hypot(...w);
  w.forEach((v, i) => (w[i] = v / wn));
  for (let i = 0; i < n; i++) {
    let dot = 0;
    for (let j = 0; j < m; j++) {
      dot += a[j * n + i] * w[j];
    }
    for (let j = 0; j < m; j++) {
      a[j * n + i] -= 2 * dot * w[j];
    }
  }
  return a;
}

describe('tallSvd', () => {
  it('recovers chosen singular values down to 1e-12 of the largest, each to a relative 1e-4 or better', () => {
    const chosen = [3, 1, 1e-6, 1e-12];
    const n = 40;
    const a = withSingularValues(n, chosen);
    const s = new Float64Array(4);
    tallSvd(a, n, 4, null, s, new Float64Array(16), new Float64Array(4), new Float64Array(16));
    chosen.forEach((v, j) => expect(Math.abs(s[j] - v) / v).toBeLessThan(1e-4));
  });

  it('A·vⱼ = sⱼ·uⱼ, descending s, and Uᵀb matches (A·vⱼ)ᵀb / sⱼ', () => {
    const n = 25;
    const m = 4;
    const a = Float64Array.from({ length: n * m }, () => rand() - 0.5);
    const b = Float64Array.from({ length: n }, () => rand() - 0.5);
    const s = new Float64Array(m);
    const v = new Float64Array(m * m);
    const ub = new Float64Array(m);
    tallSvd(a.slice(), n, m, b.slice(), s, v, ub, new Float64Array(m * m));
    for (let j = 1; j < m; j++) {
      expect(s[j]).toBeLessThanOrEqual(s[j - 1]);
    }
    for (let c = 0; c < m; c++) {
      let proj = 0;
      let norm2 = 0;
      for (let i = 0; i < n; i++) {
        let av = 0;
        for (let j = 0; j < m; j++) {
          av += a[j * n + i] * v[j * m + c];
        }
        proj += av * b[i];
        norm2 += av * av;
      }
      expect(Math.sqrt(norm2)).toBeCloseTo(s[c], 13);
      expect(proj / s[c]).toBeCloseTo(ub[c], 13);
    }
  });
});
