/**
 * Tail probabilities of the χ² distribution, through the regularised
 * incomplete gamma functions P(a, x) and Q(a, x) = 1 − P(a, x):
 *
 *   P(χ² ≤ c | ν) = P(ν/2, c/2),   P(χ² > c | ν) = Q(ν/2, c/2)
 *
 * (Abramowitz & Stegun 1964, Handbook of Mathematical Functions, §26.4; [N14] in REFERENCES.md).
 * Each tail is computed directly, never as one minus the other when that
 * would cancel: P by its power series where x < a + 1, Q by its continued
 * fraction elsewhere, so a tiny tail keeps its relative precision (a lower
 * tail of 1e-30 is returned as such, not as 0).
 */

/** Iteration limit of the series and the continued fraction (enough for a ≈ 1e8). */
const MAX_TERMS = 100000;

/**
 * ln Γ(a) for a > 0: Stirling's series (Abramowitz & Stegun 1964, 6.1.40–6.1.41)
 * for a ≥ 15, where the first omitted term, 691/(360360 a¹¹), is below
 * 3e-16, and the recurrence Γ(a) = Γ(a + m)/(a (a + 1) … (a + m − 1))
 * below that.
 */
function lnGamma(a: number): number {
  let shift = 0;
  let z = a;
  if (z < 15) {
    let product = 1;
    while (z < 15) {
      product *= z;
      z += 1;
    }
    shift = Math.log(product);
  }
  const inv = 1 / z;
  const inv2 = inv * inv;
  const series =
    inv * (1 / 12 - inv2 * (1 / 360 - inv2 * (1 / 1260 - inv2 * (1 / 1680 - inv2 * (1 / 1188)))));
  return (z - 0.5) * Math.log(z) - z + 0.5 * Math.log(2 * Math.PI) + series - shift;
}

/** ln(e^(−x) x^a / Γ(a)), the common factor of the series and the continued fraction. */
function lnPrefactor(a: number, x: number): number {
  return -x + a * Math.log(x) - lnGamma(a);
}

/**
 * P(a, x) by its power series (Abramowitz & Stegun 1964, 6.5.29):
 * P = e^(−x) x^a / Γ(a + 1) · Σ xⁿ / ((a + 1)…(a + n)). Used for x < a + 1.
 */
function seriesP(a: number, x: number): number {
  let term = 1;
  let sum = 1;
  for (let n = 1; n < MAX_TERMS; n++) {
    term *= x / (a + n);
    sum += term;
    if (term < sum * 1e-17) {
      break;
    }
  }
  return Math.exp(lnPrefactor(a, x) - Math.log(a)) * sum;
}

/**
 * Q(a, x) by Legendre's continued fraction (Abramowitz & Stegun 1964,
 * 6.5.31) in its even form, evaluated by the modified Lentz method
 * (Thompson & Barnett 1986, J. Comput. Phys. 64, 490). Used for x ≥ a + 1.
 */
function continuedFractionQ(a: number, x: number): number {
  const tiny = 1e-300;
  let b = x + 1 - a;
  let c = 1 / tiny;
  let d = 1 / b;
  let h = d;
  for (let i = 1; i < MAX_TERMS; i++) {
    const an = -i * (i - a);
    b += 2;
    d = an * d + b;
    if (Math.abs(d) < tiny) {
      d = tiny;
    }
    c = b + an / c;
    if (Math.abs(c) < tiny) {
      c = tiny;
    }
    d = 1 / d;
    const delta = d * c;
    h *= delta;
    if (Math.abs(delta - 1) < 1e-16) {
      break;
    }
  }
  return Math.exp(lnPrefactor(a, x)) * h;
}

/** Regularised lower incomplete gamma P(a, x) = γ(a, x)/Γ(a), a > 0, x ≥ 0 (NaN otherwise). */
export function regularizedGammaP(a: number, x: number): number {
  if (!(a > 0) || !(x >= 0) || a === Infinity) {
    return Number.NaN;
  }
  if (x === 0) {
    return 0;
  }
  if (x === Infinity) {
    return 1;
  }
  return x < a + 1 ? seriesP(a, x) : 1 - continuedFractionQ(a, x);
}

/** Regularised upper incomplete gamma Q(a, x) = Γ(a, x)/Γ(a), a > 0, x ≥ 0 (NaN otherwise). */
export function regularizedGammaQ(a: number, x: number): number {
  if (!(a > 0) || !(x >= 0) || a === Infinity) {
    return Number.NaN;
  }
  if (x === 0) {
    return 1;
  }
  if (x === Infinity) {
    return 0;
  }
  return x < a + 1 ? 1 - seriesP(a, x) : continuedFractionQ(a, x);
}

/**
 * P(X > chi2) for X ~ χ² with `dof` degrees of freedom (dof > 0, may be
 * non-integer): the p-value of a χ² goodness-of-fit test. NaN for dof ≤ 0,
 * chi2 < 0 or NaN inputs.
 */
export function chiSquareUpperTail(chi2: number, dof: number): number {
  return regularizedGammaQ(dof / 2, chi2 / 2);
}

/**
 * P(X ≤ chi2) for X ~ χ² with `dof` degrees of freedom: small when χ² is
 * implausibly small for `dof` (e.g. overestimated σ). NaN like
 * {@link chiSquareUpperTail}.
 */
export function chiSquareLowerTail(chi2: number, dof: number): number {
  return regularizedGammaP(dof / 2, chi2 / 2);
}

/**
 * Standard normal distribution function Φ(z) = P(Z ≤ z), from
 * P(|Z| > |z|) = Q(1/2, z²/2) (Abramowitz & Stegun 1964, §26.2 with §6.5),
 * with the small tail computed directly.
 */
export function normalCdf(z: number): number {
  if (Number.isNaN(z)) {
    return Number.NaN;
  }
  const half = 0.5 * regularizedGammaQ(0.5, (z * z) / 2);
  return z < 0 ? half : 1 - half;
}
