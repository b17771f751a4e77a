/**
 * Residuals and Jacobians of a fit problem, with preallocated buffers,
 * evaluation counting and containment of model failures (a model that
 * throws or returns NaN/∞ yields a non-finite cost, never an exception).
 *
 * Finite-difference Jacobians: forward differences with relative step √ε,
 * central with ε^(1/3), and Richardson-extrapolated central differences
 * [N4 in REFERENCES.md] from steps h = ε^(1/5) and h/2, falling back to a
 * central step where the two disagree (a nearby singularity) or a bound is
 * in the way. Accuracy per column, relative to the derivative's scale
 * (ε = 2⁻⁵²): forward ≈ √ε ≈ 1e-8, central ≈ ε^(2/3) ≈ 4e-11,
 * extrapolated ≈ ε^(4/5) ≈ 3e-13, for smooth models evaluated to about ε.
 */
import { FIT_DEFAULTS } from './defaults';
import type { IFitProblem } from './problem';
import { allFinite, residualSums } from './residualSums';

/** Largest relative disagreement ‖D(h) − D(h/2)‖/‖D(h/2)‖ accepted for Richardson extrapolation. */
const RICHARDSON_AGREEMENT = 1e-3;

/** Finite-difference scheme for the Jacobian. */
export type DifferenceScheme = 'forward' | 'central' | 'extrapolated';

/** Evaluates weighted residuals rᵢ = wᵢ(f(xᵢ; p) − yᵢ) and their Jacobian over the free parameters. */
export class ResidualEvaluator {
  readonly n: number;
  readonly k: number;
  /** Model evaluations so far (each finite-difference column counts as one). */
  evaluations = 0;
  /** Analytic Jacobian evaluations so far. */
  jacobianEvaluations = 0;
  /**
   * ‖e‖² of the rounding error of the last residual vector,
   * eᵢ ≈ 4ε·wᵢ(|fᵢ| + |yᵢ|) (binary64 evaluation of one residual).
   */
  lastRoundingNorm2 = 0;
  /** Message of the last model exception, if any. */
  lastError: string | null = null;
  /** Whether the Jacobian written by the last `residualsWithJacobian` is finite. */
  lastJacobianFinite = false;
  private readonly problem: IFitProblem;
  private readonly full: Float64Array;
  /** Analytic Jacobian supplied by the model. */
  private readonly hasJacobian: boolean;
  /** Analytic Jacobian written straight into the n×k buffer (no weights, nothing fixed). */
  private readonly direct: boolean;
  // Allocated on first use, not cleared (written in full before any read):
  // difference buffers and the all-parameter Jacobian.
  private fplusBuf: Float64Array | null = null;
  private fminusBuf: Float64Array | null = null;
  private fplus2Buf: Float64Array | null = null;
  private fminus2Buf: Float64Array | null = null;
  private jfullBuf: Float64Array | null = null;
  /** Σr² and ‖e‖² of large problems. */
  private readonly sums = new Float64Array(2);

  constructor(problem: IFitProblem) {
    this.problem = problem;
    this.n = problem.n;
    this.k = problem.free.length;
    this.full = Float64Array.from(problem.start);
    this.hasJacobian = typeof problem.model.jacobian === 'function';
    this.direct = !problem.weights && this.k === problem.kAll;
  }

  /** True when the model supplies an analytic Jacobian. */
  get analytic(): boolean {
    return this.hasJacobian;
  }

  /** True when the model computes values and Jacobian in one pass (`evaluateWithJacobian` and `jacobian`). */
  get combined(): boolean {
    return this.hasJacobian && typeof this.problem.model.evaluateWithJacobian === 'function';
  }

  private get fplus(): Float64Array {
    return (this.fplusBuf ??= this.problem.workspace.scratch(this.n));
  }

  private get fminus(): Float64Array {
    return (this.fminusBuf ??= this.problem.workspace.scratch(this.n));
  }

  private get fplus2(): Float64Array {
    return (this.fplus2Buf ??= this.problem.workspace.scratch(this.n));
  }

  private get fminus2(): Float64Array {
    return (this.fminus2Buf ??= this.problem.workspace.scratch(this.n));
  }

  private get jfull(): Float64Array {
    return (this.jfullBuf ??= this.problem.workspace.scratch(this.n * this.problem.kAll));
  }

  /** Full parameter vector (fixed values included) for free values `p`. */
  fullParameters(p: Float64Array): Float64Array {
    const out = Float64Array.from(this.full);
    for (let j = 0; j < this.k; j++) {
      out[this.problem.free[j]] = p[j];
    }
    return out;
  }

  private setFree(p: Float64Array): void {
    const free = this.problem.free;
    for (let j = 0; j < this.k; j++) {
      this.full[free[j]] = p[j];
    }
  }

  /** Raw model values at the current `full` vector into `out`; false on failure. */
  private callModel(out: Float64Array): boolean {
    this.evaluations++;
    try {
      this.problem.model.evaluate(this.full, this.problem.x, out);
    } catch (err) {
      this.lastError = err instanceof Error ? err.message : String(err);
      return false;
    }
    return true;
  }

  /**
   * Writes weighted residuals for free values `p` into `r` and the raw model
   * values into `f`; returns Σr² (NaN on failure).
   */
  residuals(p: Float64Array, r: Float64Array, f: Float64Array): number {
    this.setFree(p);
    if (!this.callModel(f)) {
      return Number.NaN;
    }
    return this.weighResiduals(r, f);
  }

  /**
   * Like `residuals`, and writes the weighted Jacobian (row-major n×k over
   * free parameters) at `p` into `jac` from the same model pass; sets
   * `lastJacobianFinite` (without checking the entries when `checkFinite`
   * is false: the caller checks them in its own pass). Only for `combined` models.
   */
  residualsWithJacobian(
    p: Float64Array,
    r: Float64Array,
    f: Float64Array,
    jac: Float64Array,
    checkFinite = true
  ): number {
    this.setFree(p);
    this.evaluations++;
    this.jacobianEvaluations++;
    this.lastJacobianFinite = false;
    const target = this.direct ? jac : this.jfull;
    try {
      this.problem.model.evaluateWithJacobian!(this.full, this.problem.x, f, target);
    } catch (err) {
      this.lastError = err instanceof Error ? err.message : String(err);
      return Number.NaN;
    }
    const cost = this.weighResiduals(r, f);
    if (!this.direct) {
      this.selectColumns(jac);
    }
    this.lastJacobianFinite = !checkFinite || allFinite(jac, this.n * this.k);
    return cost;
  }

  /** jac = weighted free columns of the all-parameter Jacobian `jfull`. */
  private selectColumns(jac: Float64Array): void {
    const { n, k } = this;
    const { weights, free, kAll } = this.problem;
    const jfull = this.jfull;
    for (let i = 0; i < n; i++) {
      const w = weights ? weights[i] : 1;
      for (let j = 0; j < k; j++) {
        jac[i * k + j] = jfull[i * kAll + free[j]] * w;
      }
    }
  }

  /** r = w(f − y); returns Σr² (NaN when not finite) and sets the rounding norm. */
  private weighResiduals(r: Float64Array, f: Float64Array): number {
    const { y, weights } = this.problem;
    const scale = 4 * Number.EPSILON;
    if (this.n > FIT_DEFAULTS.largeRows) {
      const sums = this.sums;
      residualSums(f, y, weights, r, this.n, sums);
      this.lastRoundingNorm2 = sums[1] * scale * scale;
      return Number.isFinite(sums[0]) ? sums[0] : Number.NaN;
    }
    let sum = 0;
    let e2 = 0;
    if (weights) {
      for (let i = 0; i < this.n; i++) {
        const ri = (f[i] - y[i]) * weights[i];
        r[i] = ri;
        sum += ri * ri;
        const ei = (Math.abs(f[i]) + Math.abs(y[i])) * weights[i];
        e2 += ei * ei;
      }
    } else {
      for (let i = 0; i < this.n; i++) {
        const fi = f[i];
        const yi = y[i];
        const ri = fi - yi;
        r[i] = ri;
        sum += ri * ri;
        const ei = Math.abs(fi) + Math.abs(yi);
        e2 += ei * ei;
      }
    }
    this.lastRoundingNorm2 = e2 * scale * scale;
    return Number.isFinite(sum) ? sum : Number.NaN;
  }

  /**
   * Weighted Jacobian (row-major n×k over free parameters) at `p` into `jac`.
   * `f0` must hold the raw model values at `p`. Returns false when it is not finite.
   */
  jacobian(p: Float64Array, f0: Float64Array, jac: Float64Array, requested: DifferenceScheme): boolean {
    const { n, k } = this;
    this.setFree(p);
    let scheme = requested;
    if (this.hasJacobian) {
      this.jacobianEvaluations++;
      const direct = this.direct;
      const target = direct ? jac : this.jfull;
      try {
        this.problem.model.jacobian!(this.full, this.problem.x, target);
      } catch (err) {
        this.lastError = err instanceof Error ? err.message : String(err);
        target.fill(Number.NaN);
      }
      if (!direct) {
        this.selectColumns(jac);
      }
      if (allFinite(jac, n * k)) {
        return true;
      }
      // An analytic derivative can be singular where the model is smooth
      // (e.g. log x · x^b at x = 0): fall back to differences.
      scheme = 'extrapolated';
    }
    for (let j = 0; j < k; j++) {
      if (!this.differenceColumn(p, f0, jac, j, scheme)) {
        this.setFree(p);
        return false;
      }
    }
    this.setFree(p);
    return true;
  }

  /** One finite-difference column; chooses directions that stay inside the bounds. */
  private differenceColumn(
    p: Float64Array,
    f0: Float64Array,
    jac: Float64Array,
    j: number,
    scheme: DifferenceScheme
  ): boolean {
    const { n, k } = this;
    const idx = this.problem.free[j];
    const lo = this.problem.lower[idx];
    const hi = this.problem.upper[idx];
    const pj = p[j];
    const rel =
      scheme === 'central'
        ? FIT_DEFAULTS.centralStep
        : scheme === 'extrapolated'
          ? FIT_DEFAULTS.extrapolatedStep
          : FIT_DEFAULTS.forwardStep;
    const h = rel * (pj !== 0 ? Math.abs(pj) : 1);
    const w = this.problem.weights;
    if (scheme === 'extrapolated' && pj - h >= lo && pj + h <= hi) {
      // Richardson: R = (4·D(h/2) − D(h)) / 3, error O(h⁴).
      const a1 = pj + h;
      const b1 = pj - h;
      const a2 = pj + h / 2;
      const b2 = pj - h / 2;
      let ok = true;
      this.full[idx] = a1;
      ok = this.callModel(this.fplus) && ok;
      this.full[idx] = b1;
      ok = this.callModel(this.fminus) && ok;
      this.full[idx] = a2;
      ok = this.callModel(this.fplus2) && ok;
      this.full[idx] = b2;
      ok = this.callModel(this.fminus2) && ok;
      this.full[idx] = pj;
      if (ok) {
        const inv1 = 1 / (a1 - b1);
        const inv2 = 1 / (a2 - b2);
        let diff2 = 0;
        let ref2 = 0;
        let check = 0;
        const { fplus, fminus, fplus2, fminus2 } = this;
        for (let i = 0; i < n; i++) {
          const wi = w ? w[i] : 1;
          const d1 = (fplus[i] - fminus[i]) * inv1 * wi;
          const d2 = (fplus2[i] - fminus2[i]) * inv2 * wi;
          const v = (4 * d2 - d1) / 3;
          jac[i * k + j] = v;
          check += v * 0;
          diff2 += (d1 - d2) * (d1 - d2);
          ref2 += d2 * d2;
        }
        // D(h) and D(h/2) must agree to O(h²); if not, h is too large for this
        // model here (e.g. a nearby singularity): use a small central step.
        if (check === 0 && diff2 <= RICHARDSON_AGREEMENT * RICHARDSON_AGREEMENT * ref2) {
          return true;
        }
      }
      return this.differenceColumn(p, f0, jac, j, 'central');
    }
    if (scheme === 'central' && pj - h >= lo && pj + h <= hi) {
      const plus = pj + h;
      const minus = pj - h;
      this.full[idx] = plus;
      const okPlus = this.callModel(this.fplus);
      this.full[idx] = minus;
      const okMinus = this.callModel(this.fminus);
      this.full[idx] = pj;
      if (okPlus && okMinus) {
        if (quotientColumn(this.fplus, this.fminus, 1 / (plus - minus), w, jac, n, k, j)) {
          return true;
        }
      }
    }
    // One-sided: forward (or backward near the upper bound); second order when central was asked.
    const twoSided = scheme !== 'forward';
    const dir = pj + (twoSided ? 2 * h : h) <= hi ? 1 : -1;
    const step = (pj + dir * h) - pj;
    this.full[idx] = pj + step;
    if (!this.callModel(this.fplus)) {
      this.full[idx] = pj;
      return false;
    }
    if (twoSided) {
      this.full[idx] = pj + 2 * step;
      const ok = this.callModel(this.fminus);
      this.full[idx] = pj;
      if (!ok) {
        return false;
      }
      // f'(p) ≈ (−3f(p) + 4f(p+s) − f(p+2s)) / (2s)
      const inv2 = 1 / (2 * step);
      let check = 0;
      for (let i = 0; i < n; i++) {
        const v = (-3 * f0[i] + 4 * this.fplus[i] - this.fminus[i]) * inv2 * (w ? w[i] : 1);
        jac[i * k + j] = v;
        check += v * 0;
      }
      return check === 0;
    }
    this.full[idx] = pj;
    return quotientColumn(this.fplus, f0, 1 / step, w, jac, n, k, j);
  }
}

/**
 * Column j of `jac` = (a − b)·inv·w (w = 1 without weights), written with
 * its finiteness check in the same pass (x·0 is 0 for finite x, NaN otherwise).
 */
function quotientColumn(a: Float64Array, b: Float64Array, inv: number, w: Float64Array | null, jac: Float64Array, n: number, k: number, j: number): boolean {
  let check = 0;
  if (w) {
    for (let i = 0; i < n; i++) {
      const v = (a[i] - b[i]) * inv * w[i];
      jac[i * k + j] = v;
      check += v * 0;
    }
  } else {
    for (let i = 0; i < n; i++) {
      const v = (a[i] - b[i]) * inv;
      jac[i * k + j] = v;
      check += v * 0;
    }
  }
  return check === 0;
}

