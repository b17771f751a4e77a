/**
 * Uncertainty analysis at the solution: covariance from a column-scaled SVD
 * of the weighted Jacobian (or an eigen-decomposition of JᵀJ for many
 * points), standard errors, correlations, Student-t intervals and
 * information criteria.
 *
 * References (keys of REFERENCES.md): decompositions [N5], t and normal
 * quantiles [N7], AIC, AICc and BIC [N13].
 *
 * Accuracy: the column-scaled SVD keeps the covariance's relative error near
 * ε·cond(Js) (ε = 2⁻⁵², Js the equilibrated Jacobian) instead of
 * ε·cond(Js)² for the normal equations; the NIST StRD standard errors come
 * out to at least 6 digits (see `lm.ts`).
 */
import { EigenvalueDecomposition, Matrix, SingularValueDecomposition } from 'ml-matrix';
import { FIT_DEFAULTS } from './defaults';
import { normalMatrix, scaledNormal } from './subproblem';

/** Covariance of the free parameters, unscaled: (JᵀJ)⁻¹. */
export interface ICovarianceFactor {
  /** k×k (JᵀJ)⁻¹, or null when J is rank-deficient. */
  inverse: number[][] | null;
  /** Numerical rank of the column-scaled Jacobian. */
  rank: number;
  /** Condition number of the column-scaled Jacobian. */
  condition: number;
}

/** Smallest and largest value by a loop (spreading a long array into Math.min/max overflows the call stack); NaN propagates. */
function extremes(values: ArrayLike<number>): { min: number; max: number } {
  let min = Infinity;
  let max = -Infinity;
  for (let i = 0; i < values.length; i++) {
    min = Math.min(min, values[i]);
    max = Math.max(max, values[i]);
  }
  return { min, max };
}

/**
 * (JᵀJ)⁻¹ for the weighted row-major n×k Jacobian `jac`, via column
 * equilibration. `normal`, when given, is JᵀJ (k×k, symmetric) already
 * formed from `jac`; it is used above `largeRows` points.
 */
export function inverseNormal(
  jac: Float64Array,
  n: number,
  k: number,
  normal: Float64Array | null = null
): ICovarianceFactor {
  const formed = normal !== null && n > FIT_DEFAULTS.largeRows ? normal : null;
  const norms = new Float64Array(k);
  if (formed) {
    for (let j = 0; j < k; j++) {
      norms[j] = formed[j * k + j];
    }
  } else {
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < k; j++) {
        norms[j] += jac[i * k + j] * jac[i * k + j];
      }
    }
  }
  for (let j = 0; j < k; j++) {
    norms[j] = Math.sqrt(norms[j]);
  }
  if (norms.some((v) => !(v > 0) || !Number.isFinite(v))) {
    return { inverse: null, rank: norms.filter((v) => v > 0).length, condition: Infinity };
  }
  // Eigen-decomposition of the equilibrated normal matrix when it is well
  // conditioned; otherwise the SVD of the equilibrated Jacobian (accurate).
  const cols = Array.from({ length: k }, (_, j) => j);
  const scaled = formed ? scaledNormal(formed, k, cols, norms) : normalMatrix(jac, n, k, cols, norms);
  const evd = new EigenvalueDecomposition(scaled, {
    assumeSymmetric: true
  });
  let s2 = evd.realEigenvalues.map((e) => Math.max(e, 0));
  let v: Matrix = evd.eigenvectorMatrix;
  const eig = extremes(evd.realEigenvalues);
  const ratio = eig.min / eig.max;
  const useSvd = n <= FIT_DEFAULTS.largeRows && !(ratio >= FIT_DEFAULTS.normalEquationsMinRatio);
  if (useSvd) {
    const js = new Matrix(n, k);
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < k; j++) {
        js.set(i, j, jac[i * k + j] / norms[j]);
      }
    }
    const svd = new SingularValueDecomposition(js, {
      computeLeftSingularVectors: false,
      computeRightSingularVectors: true,
      autoTranspose: false
    });
    s2 = svd.diagonal.map((s) => s * s);
    v = svd.rightSingularVectors;
  }
  const { min: smin, max: smax } = extremes(s2);
  const tol = useSvd
    ? FIT_DEFAULTS.singularTolerance * FIT_DEFAULTS.singularTolerance
      : Math.max(FIT_DEFAULTS.singularTolerance ** 2, Number.EPSILON * k);
  const rank = s2.filter((s) => s > tol * smax).length;
  const condition = smin > 0 ? Math.sqrt(smax / smin) : Infinity;
  if (rank < k) {
    return { inverse: null, rank, condition };
  }
  const inverse: number[][] = [];
  for (let a = 0; a < k; a++) {
    const row: number[] = [];
    for (let b = 0; b < k; b++) {
      let sum = 0;
      for (let c = 0; c < k; c++) {
        sum += (v.get(a, c) * v.get(b, c)) / s2[c];
      }
      row.push(sum / (norms[a] * norms[b]));
    }
    inverse.push(row);
  }
  // exact symmetry
  for (let a = 0; a < k; a++) {
    for (let b = a + 1; b < k; b++) {
      const m = 0.5 * (inverse[a][b] + inverse[b][a]);
      inverse[a][b] = m;
      inverse[b][a] = m;
    }
  }
  return { inverse, rank, condition };
}

/** Information criteria and the convention that produced them. */
export interface ICriteria {
  aic: number;
  aicc: number;
  bic: number;
}

/**
 * AIC, AICc and BIC for Gaussian errors with k free parameters.
 * Known σ: −2 ln L = χ² (+ constant), so AIC = χ² + 2k, BIC = χ² + k ln n.
 * Unknown σ (variance profiled out, not counted): AIC = n ln(χ²/n) + 2k,
 * BIC = n ln(χ²/n) + k ln n. Both: AICc = AIC + 2k(k+1)/(n−k−1) (NaN when n−k−1 ≤ 0).
 */
export function informationCriteria(chi2: number, n: number, k: number, knownSigma: boolean): ICriteria {
  const base = knownSigma ? chi2 : n * Math.log(chi2 / n);
  const aic = base + 2 * k;
  const bic = base + k * Math.log(n);
  const aicc = n - k - 1 > 0 ? aic + (2 * k * (k + 1)) / (n - k - 1) : Number.NaN;
  return { aic, aicc, bic };
}
