/**
 * Double-double refinement of a converged fit whose χ² is dominated by
 * binary64 rounding (residuals many orders of magnitude below the values,
 * e.g. NIST StRD Lanczos1: residuals ≈ 1e-13 on values ≈ 1). Double-double
 * arithmetic [N11 in REFERENCES.md]; accuracy: Lanczos1 reaches the
 * certified residual sum of squares to ≥ 10 digits and the minimum χ² of
 * its exact decimal data to ≥ 12 (test/core/fit/nist.test.ts).
 *
 * Only when the fit converged, the model has `evaluatePrecise`, and the
 * rounding noise of χ² (2‖r‖‖e‖ + ‖e‖², eᵢ = 4ε·wᵢ(|fᵢ| + |yᵢ|)) exceeds
 * `FIT_DEFAULTS.refineNoiseFraction`·χ²: Gauss–Newton steps with residuals computed in
 * double-double from the exact data (x + xLow, y + yLow) at double-double
 * parameters, the step solving J·δ = r in least squares with the binary64
 * Jacobian at the solution (column-scaled SVD), until the predicted χ²
 * change is negligible. Then χ² = Σr² in double-double. Ordinary fits pay
 * nothing but one O(n) pass when the model has `evaluatePrecise`.
 *
 * Skipped, with a warning, when a free parameter is at a bound, above
 * `FIT_DEFAULTS.largeRows` points, when the Jacobian is not finite or
 * rank-deficient, or when the precise model throws, returns NaN/∞ or gives
 * a χ² inconsistent with the binary64 one at the same parameters.
 */
import { tallSvd } from './dense';
import { msg } from '../messages';
import type { ICoreMessage } from '../messages';
import type { IDoubleDouble, IDoubleDoubleArray } from '../numeric/dd/core';
import { add, mulNumber, sqr, sub } from '../numeric/dd/core';
import { wholeNumber } from '../numeric/messageArgs';
import { FIT_DEFAULTS } from './defaults';
import type { ResidualEvaluator } from './evaluator';
import { costNoise } from './kernels';
import type { ILmOutcome } from './lm';
import type { IFitProblem } from './problem';

/**
 * The double-double χ² at the binary64 solution may exceed this multiple of
 * χ² + noise only when `evaluatePrecise` and `evaluate` compute different
 * functions (then no refinement).
 */
const CONSISTENCY_FACTOR = 4;
/** Stop when the step predicts a χ² change below this fraction of χ². */
const PREDICTED_CHANGE_FRACTION = 1e-20;

/** What the refinement did. */
export interface IRefinement {
  /** The outcome to assemble (the input outcome when nothing was done). */
  outcome: ILmOutcome;
  /** Unweighted residuals y − f from double-double arithmetic, rounded; null when not refined. */
  residuals: Float64Array | null;
  /** Gauss–Newton steps taken (0 when not refined). */
  steps: number;
  /** Note for the fit's `notes` when refined (code `fit.note.double-double*`), else null. */
  note: ICoreMessage | null;
  /** Warning when refinement was wanted but could not run (codes `fit.refine-skipped.*`), else null. */
  warning: ICoreMessage | null;
}

/** Why a precise evaluation failed: the model's error text, or null when it gave NaN or ∞. */
interface IPreciseFailure {
  error: string | null;
}

function ddArray(hi: Float64Array, lo: Float64Array | null): IDoubleDoubleArray {
  return { hi: Float64Array.from(hi), lo: lo ? Float64Array.from(lo) : new Float64Array(hi.length) };
}

function at(a: IDoubleDoubleArray, i: number): IDoubleDouble {
  return { hi: a.hi[i], lo: a.lo[i] };
}

/** Weighted residuals w(y − f) in double-double and their χ²; null when not finite or the model threw. */
function preciseResiduals(
  problem: IFitProblem,
  p: IDoubleDoubleArray,
  x: IDoubleDoubleArray,
  y: IDoubleDoubleArray,
  out: IDoubleDoubleArray
): { r: IDoubleDouble[]; chi2: IDoubleDouble } | IPreciseFailure {
  const n = problem.n;
  out.hi.fill(Number.NaN);
  out.lo.fill(0);
  try {
    problem.model.evaluatePrecise!(p, x, out);
  } catch (err) {
    return { error: err instanceof Error ? err.message : String(err) };
  }
  const w = problem.weights;
  const r: IDoubleDouble[] = new Array<IDoubleDouble>(n);
  let chi2: IDoubleDouble = { hi: 0, lo: 0 };
  for (let i = 0; i < n; i++) {
    let ri = sub(at(y, i), at(out, i));
    if (w) {
      ri = mulNumber(ri, w[i]);
    }
    r[i] = ri;
    chi2 = add(chi2, sqr(ri));
  }
  if (!Number.isFinite(chi2.hi) || !Number.isFinite(chi2.lo)) {
    return { error: null };
  }
  return { r, chi2 };
}

/** Least-squares δ of J·δ = rhs (J weighted, row-major n×k) by a column-scaled SVD (`tallSvd`); null when rank-deficient. */
function solveStep(jac: Float64Array, rhs: Float64Array, n: number, k: number): Float64Array | null {
  const norms = new Float64Array(k);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < k; j++) {
      norms[j] += jac[i * k + j] ** 2;
    }
  }
  const a = new Float64Array(n * k);
  for (let j = 0; j < k; j++) {
    norms[j] = Math.sqrt(norms[j]);
    if (!(norms[j] > 0) || !Number.isFinite(norms[j])) {
      return null;
    }
    for (let i = 0; i < n; i++) {
      a[j * n + i] = jac[i * k + j] / norms[j];
    }
  }
  const s = new Float64Array(k);
  const v = new Float64Array(k * k);
  const ub = new Float64Array(k);
  tallSvd(a, n, k, rhs.slice(0, n), s, v, ub, new Float64Array(k * k));
  const smax = s[0];
  for (let c = 0; c < k; c++) {
    if (!(s[c] > FIT_DEFAULTS.singularTolerance * smax)) {
      return null;
    }
  }
  const delta = new Float64Array(k);
  for (let c = 0; c < k; c++) {
    const coef = ub[c] / s[c];
    for (let j = 0; j < k; j++) {
      delta[j] += v[j * k + c] * coef;
    }
  }
  for (let j = 0; j < k; j++) {
    delta[j] /= norms[j];
  }
  return delta;
}

/** Rounding noise of χ² at the outcome (same estimate as the iteration's). */
function roundingNoise(problem: IFitProblem, o: ILmOutcome): number {
  const { y, weights, n } = problem;
  const scale = 4 * Number.EPSILON;
  let e2 = 0;
  for (let i = 0; i < n; i++) {
    const ei = (Math.abs(o.f[i]) + Math.abs(y[i])) * (weights ? weights[i] : 1) * scale;
    e2 += ei * ei;
  }
  return costNoise(o.cost, e2);
}

function unchanged(o: ILmOutcome, warning: ICoreMessage | null = null): IRefinement {
  return { outcome: o, residuals: null, steps: 0, note: null, warning };
}

/**
 * Refines a converged outcome in double-double when its χ² is dominated by
 * binary64 rounding and the model can evaluate precisely (see file header).
 * Never throws: a failing precise evaluation leaves the outcome as it is,
 * with a warning.
 */
export function refineInDoubleDouble(problem: IFitProblem, ev: ResidualEvaluator, o: ILmOutcome): IRefinement {
  const { n, free, kAll } = problem;
  const k = free.length;
  if (!o.converged || typeof problem.model.evaluatePrecise !== 'function' || !Number.isFinite(o.cost)) {
    return unchanged(o);
  }
  const noise = roundingNoise(problem, o);
  if (!(noise > FIT_DEFAULTS.refineNoiseFraction * o.cost)) {
    return unchanged(o);
  }
  const share = { value: noise / Math.max(o.cost, Number.MIN_VALUE), digits: 2 };
  const skip = (warning: ICoreMessage): IRefinement => unchanged(o, warning);
  const failed = (f: IPreciseFailure): IRefinement =>
    skip(
      f.error !== null
        ? msg('fit.refine-skipped.precise-failed', 'χ² is within the rounding noise of double precision (%1 of χ²) and was not recomputed more precisely: the precise form of the model failed (%2).', share, f.error)
        : msg('fit.refine-skipped.precise-not-finite', 'χ² is within the rounding noise of double precision (%1 of χ²) and was not recomputed more precisely: the precise form of the model gives values that are not finite.', share)
    );
  if (n > FIT_DEFAULTS.largeRows) {
    return skip(
      msg('fit.refine-skipped.too-many-points', 'χ² is within the rounding noise of double precision (%1 of χ²) and was not recomputed more precisely: that is done for at most %2 points.', share, wholeNumber(FIT_DEFAULTS.largeRows))
    );
  }
  const full = ev.fullParameters(o.p);
  for (const j of free) {
    const tol = 1e-12 * Math.max(1, Math.abs(full[j]));
    if (full[j] - problem.lower[j] <= tol || problem.upper[j] - full[j] <= tol) {
      return skip(
        msg('fit.refine-skipped.at-bound', 'χ² is within the rounding noise of double precision (%1 of χ²) and was not recomputed more precisely: %2 is at the edge of its range.', share, problem.names[j])
      );
    }
  }
  const jac = new Float64Array(n * k);
  if (o.jacobian) {
    jac.set(o.jacobian.subarray(0, n * k));
  } else if (!ev.jacobian(o.p, o.f, jac, 'extrapolated')) {
    return skip(
      msg('fit.refine-skipped.slopes-not-finite', 'χ² is within the rounding noise of double precision (%1 of χ²) and was not recomputed more precisely: the slopes of the model are not finite at the result.', share)
    );
  }
  const p = ddArray(full, null);
  const x = ddArray(problem.x, problem.xLow);
  const y = ddArray(problem.y, problem.yLow);
  // Model values at the current parameters, and at the trial ones.
  let out: IDoubleDoubleArray = { hi: new Float64Array(n), lo: new Float64Array(n) };
  let outTrial: IDoubleDoubleArray = { hi: new Float64Array(n), lo: new Float64Array(n) };
  let current = preciseResiduals(problem, p, x, y, out);
  if (!('chi2' in current)) {
    return failed(current);
  }
  // A correct precise model differs from the binary64 one by rounding only:
  // its χ² at the same point is within a few times χ² + noise.
  const chi2Start = current.chi2.hi + current.chi2.lo;
  if (!(chi2Start <= CONSISTENCY_FACTOR * (o.cost + noise))) {
    return skip(
      msg(
        'fit.refine-skipped.precise-disagrees',
        'χ² is within the rounding noise of double precision (%1 of χ²) and was not recomputed more precisely: the precise form of the model disagrees with the ordinary one (χ² %2 against %3 at the same parameters).',
        share,
        chi2Start,
        o.cost
      )
    );
  }
  let steps = 0;
  const rhs = new Float64Array(n);
  const trial: IDoubleDoubleArray = { hi: new Float64Array(kAll), lo: new Float64Array(kAll) };
  while (steps < FIT_DEFAULTS.refineMaxSteps) {
    for (let i = 0; i < n; i++) {
      rhs[i] = current.r[i].hi + current.r[i].lo;
    }
    const delta = solveStep(jac, rhs, n, k);
    if (!delta) {
      return skip(
        msg('fit.refine-skipped.rank-deficient', 'χ² is within the rounding noise of double precision (%1 of χ²) and was not recomputed more precisely: the data do not determine every parameter at the result.', share)
      );
    }
    // Predicted χ² change ‖J·δ‖².
    let predicted = 0;
    for (let i = 0; i < n; i++) {
      let s = 0;
      for (let j = 0; j < k; j++) {
        s += jac[i * k + j] * delta[j];
      }
      predicted += s * s;
    }
    trial.hi.set(p.hi);
    trial.lo.set(p.lo);
    let inside = true;
    for (let a = 0; a < k; a++) {
      const j = free[a];
      const v = add({ hi: p.hi[j], lo: p.lo[j] }, { hi: delta[a], lo: 0 });
      trial.hi[j] = v.hi;
      trial.lo[j] = v.lo;
      inside = inside && v.hi >= problem.lower[j] && v.hi <= problem.upper[j];
    }
    if (!inside) {
      break;
    }
    const next = preciseResiduals(problem, trial, x, y, outTrial);
    if (!('chi2' in next)) {
      return failed(next);
    }
    const chi2Now = current.chi2.hi + current.chi2.lo;
    const chi2Next = next.chi2.hi + next.chi2.lo;
    if (chi2Next > chi2Now) {
      break;
    }
    p.hi.set(trial.hi);
    p.lo.set(trial.lo);
    [out, outTrial] = [outTrial, out];
    current = next;
    steps++;
    if (!(predicted > PREDICTED_CHANGE_FRACTION * chi2Now)) {
      break;
    }
  }
  // Rounded results at the refined parameters.
  const final = current;
  const pRounded = Float64Array.from(free, (j) => p.hi[j] + p.lo[j]);
  const f = new Float64Array(n);
  const r = new Float64Array(n);
  const residuals = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    f[i] = out.hi[i] + out.lo[i];
    r[i] = -(final.r[i].hi + final.r[i].lo);
    const u = sub(at(y, i), at(out, i));
    residuals[i] = u.hi + u.lo;
  }
  const chi2 = final.chi2.hi + final.chi2.lo;
  return {
    outcome: { ...o, p: pRounded, r, f, cost: chi2, jacobian: null, normal: null },
    residuals,
    steps,
    note:
      problem.xLow || problem.yLow
        ? msg(
            'fit.note.double-double-exact-data',
            'χ² and the residuals were computed with about 32 significant digits from the data exactly as written, after %1 refinement steps, because double-precision rounding noise was %2 of χ².',
            steps,
            share
          )
        : msg(
            'fit.note.double-double',
            'χ² and the residuals were computed with about 32 significant digits, after %1 refinement steps, because double-precision rounding noise was %2 of χ².',
            steps,
            share
          ),
    warning: null
  };
}
