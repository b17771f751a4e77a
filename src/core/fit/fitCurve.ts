/**
 * `fitCurve`: validated inputs → Levenberg–Marquardt → uncertainty analysis.
 */
import { msg } from '../messages';
import type { ICoreMessage } from '../messages';
import { FIT_DEFAULTS } from './defaults';
import { ResidualEvaluator } from './evaluator';
import type { ILmOutcome } from './lm';
import { buildProblem } from './problem';
import type { IFitProblem } from './problem';
import { refineInDoubleDouble } from './refine';
import { warmStartedSteps, withWarmStart } from './warmStart';
import type { IWarmStartInfo } from './warmStart';
import type { IRefinement } from './refine';
import { informationCriteria, inverseNormal } from './statistics';
import { normalQuantileTwoSided, studentTQuantileTwoSided } from '../numeric/studentT';
import type { IFitData, IFitModel, IFitOptions, IFitResult } from './types';

/**
 * Fits `model` to `data` by weighted nonlinear least squares.
 *
 * Throws `FitInputError` for invalid inputs (non-finite data, σ ≤ 0, wrong
 * lengths, start outside bounds, fewer points than free parameters …).
 * Model failures (exceptions, NaN) never throw: they end the fit with
 * `converged: false` and a reason (codes `fit.stop.*`), keeping the best point found.
 */
export function fitCurve(model: IFitModel, data: IFitData, options: IFitOptions): IFitResult {
  const run = startFit(model, data, options);
  for (;;) {
    const step = run.step();
    if (step !== null) {
      return step;
    }
  }
}

/** A fit in progress, advanced one trial step at a time. */
export interface IFitRun {
  /** Advances one trial step; returns the result when finished, else null. */
  step(): IFitResult | null;
}

/** Validates inputs (throws `FitInputError`) and returns a steppable fit. */
export function startFit(model: IFitModel, data: IFitData, options: IFitOptions): IFitRun {
  const problem = buildProblem(model, data, options);
  const ev = new ResidualEvaluator(problem);
  // A throwing callback stops the fit like a cancellation, keeping the best point.
  let callbackError: string | null = null;
  const guard = (fn: () => void): void => {
    try {
      fn();
    } catch (err) {
      callbackError = err instanceof Error ? err.message : String(err);
    }
  };
  const { onProgress, shouldStop } = options;
  const steps = warmStartedSteps(problem, ev, {
    onProgress: onProgress ? (p) => guard(() => onProgress(p)) : undefined,
    shouldStop: () => {
      let stop = false;
      if (shouldStop) {
        guard(() => {
          stop = shouldStop() === true;
        });
      }
      return stop || callbackError !== null;
    }
  });
  return {
    step(): IFitResult | null {
      let outcome: ILmOutcome;
      let warmStart: IWarmStartInfo | null = null;
      try {
        const next = steps.next();
        if (!next.done) {
          return null;
        }
        outcome = next.value.outcome;
        warmStart = next.value.warmStart;
        if (callbackError !== null) {
          outcome = { ...outcome, converged: false, reason: callbackFailed(callbackError) };
        }
      } catch (err) {
        // Only a callback (onProgress / shouldStop) can throw here.
        outcome = abortedOutcome(problem, ev, err);
      }
      const result = withWarmStart(assemble(problem, ev, refineInDoubleDouble(problem, ev, outcome)), warmStart);
      // The result holds copies only: the work arrays go back to the pool.
      problem.workspace.release();
      return result;
    }
  };
}

/** The reason of a fit stopped because a progress or cancellation callback threw. */
function callbackFailed(error: string): ICoreMessage {
  return msg('fit.stop.callback-failed', 'The fit was stopped because its progress or cancel handler failed (%1).', error);
}

function abortedOutcome(problem: IFitProblem, ev: ResidualEvaluator, err: unknown): ILmOutcome {
  const error = err instanceof Error ? err.message : String(err);
  const p = Float64Array.from(problem.free, (j) => problem.start[j]);
  const r = new Float64Array(problem.n);
  const f = new Float64Array(problem.n);
  const cost = ev.residuals(p, r, f);
  return {
    p,
    r,
    f,
    cost,
    jacobian: null,
    normal: null,
    iterations: 0,
    converged: false,
    reason: callbackFailed(error),
    gradientCosine: Number.NaN,
    restarts: 0,
    jacobianAccurate: false
  };
}

/** Quantiles already computed, by confidence level and degrees of freedom (∞: normal); a few dozen at most. */
const quantiles = new Map<string, number>();

/** The two-sided normal (dof = ∞) or Student-t quantile, remembered: fits of one size repeat it. */
function intervalQuantile(level: number, dof: number): number {
  const key = `${level} ${dof}`;
  let q = quantiles.get(key);
  if (q === undefined) {
    q = dof === Infinity ? normalQuantileTwoSided(level) : studentTQuantileTwoSided(level, dof);
    if (quantiles.size >= 64) {
      quantiles.clear();
    }
    quantiles.set(key, q);
  }
  return q;
}

/** out = a − b over the first n entries (a tight function of its own: V8 optimises it apart from `assemble`, which runs once per fit). */
function difference(a: Float64Array, b: Float64Array, n: number, out: Float64Array): void {
  for (let i = 0; i < n; i++) {
    out[i] = a[i] - b[i];
  }
}

function assemble(problem: IFitProblem, ev: ResidualEvaluator, refinement: IRefinement): IFitResult {
  const o = refinement.outcome;
  const { n, kAll, free, names } = problem;
  const k = free.length;
  const warnings: ICoreMessage[] = refinement.warning ? [refinement.warning] : [];
  const notes: ICoreMessage[] = refinement.note ? [refinement.note] : [];
  let converged = o.converged;
  let reason = o.reason;
  const full = ev.fullParameters(o.p);
  const values = Array.from(full);
  const chi2 = o.cost;
  const dof = n - k;
  const reducedChi2 = dof > 0 ? chi2 / dof : Number.NaN;
  const knownSigma = problem.weights !== null;
  const evaluationsBeforeStats = ev.evaluations;
  const jacobiansBeforeStats = ev.jacobianEvaluations;

  // Jacobian at the solution: analytic (reused from the iteration when it
  // holds it there), or central differences.
  const reuse = o.jacobian !== null && o.jacobianAccurate;
  const jac = reuse ? o.jacobian! : problem.workspace.take(n * k);
  const finite = Number.isFinite(chi2) && (reuse || ev.jacobian(o.p, o.f, jac, 'central'));
  const factor = finite
    ? inverseNormal(jac, n, k, reuse ? o.normal : null)
    : { inverse: null, rank: 0, condition: NaN };
  const scale = knownSigma ? 1 : reducedChi2;
  const covariance = Array.from({ length: kAll }, () => new Array<number>(kAll).fill(0));
  if (factor.inverse) {
    for (let a = 0; a < k; a++) {
      for (let b = 0; b < k; b++) {
        covariance[free[a]][free[b]] = factor.inverse[a][b] * scale;
      }
    }
  } else {
    for (const a of free) {
      for (const b of free) {
        covariance[a][b] = Number.NaN;
      }
    }
    if (finite) {
      warnings.push(
        msg(
          'fit.covariance-singular',
          'The data determine only %1 independent combinations of the %2 free parameters, so there are no uncertainties: fix a parameter or add data that tell them apart.',
          factor.rank,
          k
        )
      );
      if (converged) {
        converged = false;
        // The stopping rule that was met stays in the notes.
        notes.unshift(reason);
        reason = msg(
          'fit.stop.degenerate',
          'The fit ended where the data determine only %1 of the %2 free parameters: the values are not a unique best fit.',
          factor.rank,
          k
        );
      }
    } else {
      warnings.push(msg('fit.slopes-not-finite-at-result', 'The slopes of the model are not finite at the result, so there are no uncertainties.'));
    }
  }
  if (factor.inverse && factor.condition > FIT_DEFAULTS.conditionWarning) {
    warnings.push(
      msg(
        'fit.ill-conditioned',
        'The uncertainties are unreliable: some parameters are nearly interchangeable (condition number %1). Fix one of them, or add data that tell them apart.',
        { value: factor.condition, digits: 2 }
      )
    );
  }
  if (!knownSigma && !(dof > 0)) {
    warnings.push(
      msg('fit.no-degrees-of-freedom', 'There are no more points than free parameters, so the standard errors cannot be estimated from the scatter: add points, or give σ for each point.')
    );
  }
  const standardErrors = covariance.map((row, j) => Math.sqrt(row[j]));
  const correlation = covariance.map((row, a) =>
    row.map((c, b) => {
      if (problem.fixed[a] || problem.fixed[b]) {
        return a === b ? 1 : 0;
      }
      return a === b ? (Number.isFinite(c) ? 1 : Number.NaN) : c / (standardErrors[a] * standardErrors[b]);
    })
  );
  for (let a = 0; a < kAll; a++) {
    for (let b = a + 1; b < kAll; b++) {
      if (Math.abs(correlation[a][b]) > FIT_DEFAULTS.correlationWarning) {
        warnings.push(
          msg(
            'fit.strong-correlation',
            '%1 and %2 are strongly correlated (correlation %3): quote them together, or fix one of them.',
            names[a],
            names[b],
            { value: correlation[a][b], digits: 6 }
          )
        );
      }
    }
  }
  for (const j of free) {
    const tol = 1e-12 * Math.max(1, Math.abs(values[j]));
    if (values[j] - problem.lower[j] <= tol || problem.upper[j] - values[j] <= tol) {
      warnings.push(
        msg('fit.at-bound', '%1 = %2 is at the edge of the range it may take, so its standard error means little.', names[j], { value: values[j], digits: 6 })
      );
    }
  }
  const q = intervalQuantile(problem.confidenceLevel, knownSigma ? Infinity : dof);
  const confidenceIntervals = values.map(
    (v, j) => [v - q * standardErrors[j], v + q * standardErrors[j]] as [number, number]
  );
  const criteria = informationCriteria(chi2, n, k, knownSigma);
  const residuals = new Float64Array(n);
  const precise = refinement.residuals;
  if (precise) {
    residuals.set(precise);
  } else {
    difference(problem.y, o.f, n, residuals);
  }
  if (o.restarts > 0) {
    notes.push(msg('fit.note.restarted', 'Restarts from the best point after the steps collapsed: %1.', o.restarts));
  }
  return {
    parameters: names.slice(),
    values,
    standardErrors,
    covariance,
    correlation,
    confidenceIntervals,
    confidenceLevel: problem.confidenceLevel,
    errorScaling: knownSigma ? 'from-sigma' : 'scaled-by-reduced-chi2',
    intervalQuantile: q,
    chi2,
    reducedChi2,
    dof,
    ...criteria,
    criteriaConvention: knownSigma ? 'known-sigma' : 'profiled-variance',
    residualArithmetic: refinement.residuals ? 'double-double' : 'binary64',
    residuals,
    evaluations: evaluationsBeforeStats,
    jacobianEvaluations: jacobiansBeforeStats,
    iterations: o.iterations,
    converged,
    reason,
    warnings,
    notes,
    fixed: problem.fixed.slice(),
    bounds: { lower: Array.from(problem.lower), upper: Array.from(problem.upper) }
  };
}
