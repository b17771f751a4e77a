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
import { FIT_DEFAULTS } from './defaults';
import { symmetricEigen, tallSvd } from './dense';
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

/**
 * (JᵀJ)⁻¹ for the weighted row-major n×k Jacobian `jac`, via column
 * equilibration. `normal`, when given, is JᵀJ (k×k, symmetric) already
 * formed from `jac` (the SVD of the scaled `jac` is still used when the
 * normal matrix is ill-conditioned, up to `largeRows` points).
 */
export function inverseNormal(
  jac: Float64Array,
  n: number,
  k: number,
  normal: Float64Array | null = null
): ICovarianceFactor {
  const formed = normal;
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
  let positive = 0;
  let bad = false;
  for (let j = 0; j < k; j++) {
    norms[j] = Math.sqrt(norms[j]);
    if (norms[j] > 0) {
      positive++;
    }
    if (!(norms[j] > 0) || !Number.isFinite(norms[j])) {
      bad = true;
    }
  }
  if (bad) {
    return { inverse: null, rank: positive, condition: Infinity };
  }
  // Eigen-decomposition of the equilibrated normal matrix when it is well
  // conditioned; otherwise the SVD of the equilibrated Jacobian (accurate).
  const cols = Array.from({ length: k }, (_, j) => j);
  const scaled = new Float64Array(k * k);
  if (formed) {
    scaledNormal(formed, k, cols, norms, scaled);
  } else {
    normalMatrix(jac, n, k, cols, norms, scaled);
  }
  const s2 = new Float64Array(k);
  const v = new Float64Array(k * k);
  symmetricEigen(scaled, k, s2, v);
  let emin = Infinity;
  let emax = -Infinity;
  for (let j = 0; j < k; j++) {
    emin = Math.min(emin, s2[j]);
    emax = Math.max(emax, s2[j]);
    s2[j] = Math.max(s2[j], 0);
  }
  const useSvd = n <= FIT_DEFAULTS.largeRows && !(emin / emax >= FIT_DEFAULTS.normalEquationsMinRatio);
  if (useSvd) {
    const js = new Float64Array(n * k);
    for (let j = 0; j < k; j++) {
      for (let i = 0; i < n; i++) {
        js[j * n + i] = jac[i * k + j] / norms[j];
      }
    }
    const s = new Float64Array(k);
    tallSvd(js, n, k, null, s, v, new Float64Array(k), new Float64Array(k * k));
    for (let j = 0; j < k; j++) {
      s2[j] = s[j] * s[j];
    }
  }
  let smin = Infinity;
  let smax = -Infinity;
  for (let j = 0; j < k; j++) {
    smin = Math.min(smin, s2[j]);
    smax = Math.max(smax, s2[j]);
  }
  const tol = useSvd
    ? FIT_DEFAULTS.singularTolerance * FIT_DEFAULTS.singularTolerance
    : Math.max(FIT_DEFAULTS.singularTolerance ** 2, Number.EPSILON * k);
  let rank = 0;
  for (let j = 0; j < k; j++) {
    if (s2[j] > tol * smax) {
      rank++;
    }
  }
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
        sum += (v[a * k + c] * v[b * k + c]) / s2[c];
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
