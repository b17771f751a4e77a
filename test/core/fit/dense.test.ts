/**
 * Small dense linear algebra of the engine (src/core/fit/dense.ts): the
 * defining identities of an eigen-decomposition and an SVD, checked on
 * seeded random matrices and on a matrix built from chosen singular values
 * (common practice, no source).
 */
import { describe, expect, it } from 'vitest';
import { symmetricEigen, tallSvd } from '../../../src/core/fit/dense';
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
