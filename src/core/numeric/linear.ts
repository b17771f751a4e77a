/**
 * Small closed-form least-squares helpers: a straight line with its
 * covariance (errors scaled by the residual variance), and the derivative
 * of a local quadratic (smoothed derivative for Kouvel–Fisher).
 *
 * Methods: ordinary least squares from sums centred on the means (two
 * passes), covariance s²·(XᵀX)⁻¹ with s² = RSS/(n − 2); the root of the
 * line with σ by first-order propagation of that covariance; the local
 * quadratic from its 3×3 normal equations in u = x − xᵢ, solved by Cramer's
 * rule.
 *
 * Accuracy: the centred sums keep the line's relative error near
 * ε·cond (ε = 2⁻⁵², cond ≈ 1 + |x̄|/sd(x)); the propagated σ of the root
 * is first order, fine while σ(slope) ≪ |slope|. The smoothed derivative
 * is exact for quadratic data; otherwise its truncation error is
 * O(w²·|y‴|) for a window of width w, and its rounding error grows as
 * ε·|y|/w.
 */

/** y = intercept + slope·x with covariance [[var a, cov], [cov, var b]]. */
export interface ILineFit {
  intercept: number;
  slope: number;
  varIntercept: number;
  varSlope: number;
  covariance: number;
  /** Residual variance s² = RSS/(n − 2) (NaN for n ≤ 2). */
  residualVariance: number;
  n: number;
}

/** Unweighted line fit over the points where `use(i)` is true (default all finite). */
export function fitLine(x: ArrayLike<number>, y: ArrayLike<number>, use?: (i: number) => boolean): ILineFit {
  let n = 0;
  let sx = 0;
  let sy = 0;
  for (let i = 0; i < x.length; i++) {
    if ((use === undefined || use(i)) && Number.isFinite(x[i]) && Number.isFinite(y[i])) {
      n++;
      sx += x[i];
      sy += y[i];
    }
  }
  const nan = { intercept: NaN, slope: NaN, varIntercept: NaN, varSlope: NaN, covariance: NaN, residualVariance: NaN, n };
  if (n < 2) {
    return nan;
  }
  const mx = sx / n;
  const my = sy / n;
  let sxx = 0;
  let sxy = 0;
  for (let i = 0; i < x.length; i++) {
    if ((use === undefined || use(i)) && Number.isFinite(x[i]) && Number.isFinite(y[i])) {
      const dx = x[i] - mx;
      sxx += dx * dx;
      sxy += dx * (y[i] - my);
    }
  }
  if (!(sxx > 0)) {
    return nan;
  }
  const slope = sxy / sxx;
  const intercept = my - slope * mx;
  let rss = 0;
  for (let i = 0; i < x.length; i++) {
    if ((use === undefined || use(i)) && Number.isFinite(x[i]) && Number.isFinite(y[i])) {
      const r = y[i] - intercept - slope * x[i];
      rss += r * r;
    }
  }
  const s2 = n > 2 ? rss / (n - 2) : NaN;
  return {
    intercept,
    slope,
    varSlope: s2 / sxx,
    varIntercept: s2 * (1 / n + (mx * mx) / sxx),
    covariance: (-mx * s2) / sxx,
    residualVariance: s2,
    n
  };
}

/** Root x0 = −a/b of a fitted line with σ by linear propagation of the covariance. */
export function lineRoot(f: ILineFit): { value: number; sigma: number } {
  const x0 = -f.intercept / f.slope;
  const da = -1 / f.slope;
  const db = f.intercept / (f.slope * f.slope);
  const v = da * da * f.varIntercept + db * db * f.varSlope + 2 * da * db * f.covariance;
  return { value: x0, sigma: Math.sqrt(Math.max(v, 0)) };
}

/**
 * dy/dx at each x[i] from a quadratic fitted to its `span` nearest points
 * (span ≥ 3; the window slides inwards at the ends). x must be sorted.
 */
export function smoothedDerivative(x: ArrayLike<number>, y: ArrayLike<number>, span = 5): Float64Array {
  const n = x.length;
  const out = new Float64Array(n).fill(NaN);
  const k = Math.min(Math.max(3, span), n);
  if (n < 3) {
    return out;
  }
  for (let i = 0; i < n; i++) {
    let lo = Math.max(0, i - Math.floor(k / 2));
    lo = Math.min(lo, n - k);
    const x0 = x[i];
    // normal equations of y = c0 + c1 u + c2 u², u = x − x0
    let s0 = 0, s1 = 0, s2 = 0, s3 = 0, s4 = 0, t0 = 0, t1 = 0, t2 = 0;
    for (let j = lo; j < lo + k; j++) {
      const u = x[j] - x0;
      const u2 = u * u;
      s0 += 1; s1 += u; s2 += u2; s3 += u2 * u; s4 += u2 * u2;
      t0 += y[j]; t1 += u * y[j]; t2 += u2 * y[j];
    }
    const det = s0 * (s2 * s4 - s3 * s3) - s1 * (s1 * s4 - s3 * s2) + s2 * (s1 * s3 - s2 * s2);
    const d1 = s0 * (t1 * s4 - s3 * t2) - t0 * (s1 * s4 - s3 * s2) + s2 * (s1 * t2 - t1 * s2);
    out[i] = det !== 0 ? d1 / det : NaN;
  }
  return out;
}
