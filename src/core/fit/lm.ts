/**
 * Levenberg–Marquardt trust-region iteration: Moré column scaling, projected
 * box bounds with an active set, geodesic acceleration, forward differences
 * switching to central ones before convergence is declared,
 * rounding-noise-aware acceptance near the solution, and a restart from the
 * best point when the step collapses while the Gauss–Newton model still
 * predicts progress. Stopping rules: see `defaults.ts`.
 *
 * Method and references (keys of REFERENCES.md): Levenberg–Marquardt [N1]
 * in Moré's trust-region form [N2]: scaling D = running maximum of the
 * Jacobian column norms, the damping μ for the trust radius Δ from the
 * spectral model of the scaled Jacobian (`subproblem.ts`, SVD or symmetric
 * eigen-decomposition [N5]), and the radius update and gain-ratio test of
 * MINPACK's lmder [N2]. Geodesic acceleration [N3] (`geodesic.ts`) while
 * μ > 0; Jacobians by forward differences until the first noise-level step,
 * then central differences below `stationaryRows` points (forward differences throughout from there on, or
 * the model's analytic Jacobian throughout).
 *
 * Accuracy: a fit is reported converged only by the stopping rules of
 * `defaults.ts`, all of which hold at a point where the gradient vanishes
 * to within the rounding noise of χ² (2‖r‖‖e‖ + ‖e‖²). On the 27 NIST StRD
 * problems [N6], from both certified starts and through both hand-written
 * and parsed models, every fit converges with at least 6.2 correct digits
 * in every parameter (6.3 through parsed models), 6.3 in every standard
 * error and 10.4 in the residual sum of squares (measured; the rounding of
 * the trust-region step moves the worst case, ENSO, between 6.2 and 6.8;
 * test/core/fit/nist.test.ts asserts 6, 4 and 6).
 * The double-double refinement (`refine.ts`) covers problems whose χ² is
 * below binary64 rounding of the data (Lanczos1).
 */
import { msg } from '../messages';
import type { ICoreMessage } from '../messages';
import { wholeNumber } from '../numeric/messageArgs';
import { FIT_DEFAULTS } from './defaults';
import type { DifferenceScheme, ResidualEvaluator } from './evaluator';
import type { IFitProblem } from './problem';
import { accelerate, geodesicWork } from './geodesic';
import { allFinite } from './residualSums';
import {
  costNoise,
  gaussNewtonReduction,
  jacobianTimes,
  normalAndGradient,
  quadraticForm,
  scaledNorm
} from './kernels';
import { dampingForRadius, SpectralWork, spectralModel, stepForMu } from './subproblem';
import type { ISpectralModel } from './subproblem';
import type { IFitProgress } from './types';

/** Outcome of the iteration (free parameters only). */
export interface ILmOutcome {
  /** Best free-parameter values found. */
  p: Float64Array;
  /** Weighted residuals at `p`. */
  r: Float64Array;
  /** Raw model values at `p`. */
  f: Float64Array;
  /** Σr² at `p`. */
  cost: number;
  /** Weighted Jacobian (row-major n×k) at `p` when the iteration holds it, else null. */
  jacobian: Float64Array | null;
  /** Unscaled JᵀJ (k×k, symmetric) at `p` when formed there, else null. */
  normal: Float64Array | null;
  iterations: number;
  converged: boolean;
  /** Why the iteration stopped (codes `fit.stop.*`). */
  reason: ICoreMessage;
  /** Largest cosine between r and a Jacobian column at the last Jacobian (NaN if none). */
  gradientCosine: number;
  restarts: number;
  /** `jacobian` came from the analytic Jacobian or an accurate difference scheme (fit for the covariance). */
  jacobianAccurate: boolean;
}

/** Callbacks steering the iteration. */
export interface ILmHooks {
  onProgress?: (p: IFitProgress) => void;
  shouldStop?: () => boolean;
  /**
   * The iteration only provides a start for another one (a subsample stage
   * of the warm start): rule 1b applies at any size, with
   * `warmStartErrorFraction`, and forward differences are accurate enough.
   */
  coarse?: boolean;
}

/**
 * χ² reduction of a step that moves the parameters by
 * `stationaryErrorFraction` of their standard errors: fraction²·χ²/dof
 * (errors scaled by √χ²_red), at most fraction² when σ were given.
 */
function stationaryThreshold(problem: IFitProblem, n: number, k: number, cost: number, fraction: number): number {
  const dof = n - k;
  const unit = dof > 0 ? (problem.weights ? Math.min(1, cost / dof) : cost / dof) : 0;
  return fraction * fraction * unit;
}

/** Runs the iteration from `problem.start` to the end. Never throws for model failures. */
export function levenbergMarquardt(problem: IFitProblem, ev: ResidualEvaluator, hooks: ILmHooks): ILmOutcome {
  const steps = levenbergMarquardtSteps(problem, ev, hooks);
  for (;;) {
    const next = steps.next();
    if (next.done) {
      return next.value;
    }
  }
}

/**
 * The iteration as a generator that yields after every trial step, so that
 * a driver can interleave other work (message handling, cancellation).
 */
export function* levenbergMarquardtSteps(
  problem: IFitProblem,
  ev: ResidualEvaluator,
  hooks: ILmHooks
): Generator<void, ILmOutcome, void> {
  const { n } = problem;
  const k = problem.free.length;
  const lower = Float64Array.from(problem.free, (j) => problem.lower[j]);
  const upper = Float64Array.from(problem.free, (j) => problem.upper[j]);
  const ws = problem.workspace;
  let p = Float64Array.from(problem.free, (j) => problem.start[j]);
  let r = ws.take(n);
  let f = ws.take(n);
  let pT = new Float64Array(k);
  // Written in full before they are read: not cleared (`Workspace.scratch`).
  let rT = ws.scratch(n);
  let fT = ws.scratch(n);
  let jac = ws.scratch(n * k);
  // Combined models: the Jacobian at each trial point comes with its values.
  const combined = ev.combined;
  let jacT = combined ? ws.scratch(n * k) : null;
  const large = n > FIT_DEFAULTS.largeRows;
  // Rule 1b (one confirming Jacobian instead of two noise-level steps).
  const coarse = hooks.coarse === true;
  const stationaryRule = coarse || n >= FIT_DEFAULTS.stationaryRows;
  const errorFraction = coarse ? FIT_DEFAULTS.warmStartErrorFraction : FIT_DEFAULTS.stationaryErrorFraction;
  // JᵀJ and Jᵀr in one pass (also the finiteness check of the Jacobian); ‖J·s‖² from JᵀJ for large problems.
  // Compensated Jᵀr only where the stopping rules are at rounding level (below `stationaryRows`, full data):
  // with the statistical rule 1b its rounding moves the step by ≈ ε·√n standard errors.
  const compensated = !stationaryRule;
  const normal = new Float64Array(k * k);
  const jd = large ? null : ws.scratch(n);
  const diag = new Float64Array(k);
  const colNorm = new Float64Array(k);
  const grad = new Float64Array(k);
  const z = new Float64Array(k);
  const step = new Float64Array(k);
  const useSvd = !large;
  const useGeodesic = FIT_DEFAULTS.geodesicAcceleration;
  const work = geodesicWork(n, k, ws);
  const spectral = new SpectralWork(n, k, ws);
  const cols: number[] = [];
  // The accurate difference scheme below `stationaryRows` points: central
  // differences (relative error ≈ ε^(2/3), 2 passes per column) until a
  // stopping rule is first met, then Richardson-extrapolated ones (≈ ε^(4/5),
  // 4 passes) for the one step that settles the last digits (`polish`): the
  // point where a Gauss–Newton step vanishes moves with the Jacobian's error
  // (by ≈ (JᵀJ)⁻¹Eᵀr), and the certified digits of small problems need the
  // smaller one; the steps before it only need to get there. From there on, and in a subsample stage, forward
  // differences are final: their relative error (≈ √ε·|p·f''/f'|) moves
  // the Gauss–Newton step by about that fraction of a standard error and
  // the standard errors by that fraction, far below the stopping rule's
  // `stationaryErrorFraction`, at half the passes of central differences.
  const accurate: DifferenceScheme = coarse || n >= FIT_DEFAULTS.stationaryRows ? 'forward' : 'central';
  let scheme: DifferenceScheme = ev.analytic ? accurate : 'forward';
  // The Jacobian is analytic or comes from the accurate scheme.
  let settled = ev.analytic || accurate === 'forward';
  // At a stopping rule met with central differences: Richardson-extrapolated
  // ones from here, and the rule must be met again with them (true: go on).
  const polish = (): boolean => {
    if (ev.analytic || scheme !== 'central') {
      return false;
    }
    scheme = 'extrapolated';
    jacAtP = false;
    needJacobian = true;
    return true;
  };

  const out = (converged: boolean, reason: ICoreMessage): ILmOutcome => {
    // A Jacobian from a combined pass is checked here unless JᵀJ was formed from it.
    const jacobianOk = jacAtP && (normalAtP || allFinite(jac, n * k));
    return {
      p,
      r,
      f,
      cost,
      jacobian: jacobianOk ? jac : null,
      normal: normalAtP ? normal : null,
      iterations,
      converged,
      reason,
      gradientCosine: gcos,
      restarts,
      jacobianAccurate: jacobianOk && settled
    };
  };

  let cost = combined ? ev.residualsWithJacobian(p, r, f, jac, false) : ev.residuals(p, r, f);
  // jac holds the Jacobian at p; normal holds JᵀJ at p.
  let jacAtP = combined && ev.lastJacobianFinite;
  let normalAtP = false;
  let iterations = 0;
  let gcos = Number.NaN;
  let restarts = 0;
  if (!Number.isFinite(cost)) {
    return out(
      false,
      ev.lastError
        ? msg('fit.stop.model-failed-at-start', 'The model failed at the start values (%1): check the model, or choose other start values.', ev.lastError)
        : msg('fit.stop.not-finite-at-start', 'The model gives no finite value at the start values: choose other start values.')
    );
  }
  let needJacobian = true;
  let first = true;
  let delta = 0;
  let model: ISpectralModel | null = null;
  let noise = costNoise(cost, ev.lastRoundingNorm2);
  let noisePrevious = noise;
  let noiseSteps = 0;
  let costPrevious = cost;
  let havePrevious = false;
  // The last accepted step was an undamped, unclipped step whose actual χ²
  // reduction matched the prediction (0.9 ≤ ρ ≤ 1.1) or was at noise level.
  let lastGaussNewton = false;
  // Sizes in standard errors of the last two accepted steps when both were
  // such Gauss–Newton steps (NaN otherwise), and whether the Jacobian held
  // is the previous point's, kept for rule 1c.
  let stepErrors = Number.NaN;
  let stepErrorsBefore = Number.NaN;
  let reused = false;
  const progress = (): void => {
    hooks.onProgress?.({
      iteration: iterations,
      evaluations: ev.evaluations,
      cost,
      parameters: problem.names,
      values: Array.from(ev.fullParameters(p))
    });
  };

  for (;;) {
    if (hooks.shouldStop?.()) {
      return out(false, msg('fit.stop.cancelled', 'You stopped the fit.'));
    }
    if (ev.evaluations >= problem.maxEvaluations) {
      return out(false, msg('fit.stop.budget', 'The evaluation budget (%1 model evaluations) ran out before the fit settled.', wholeNumber(problem.maxEvaluations)));
    }
    if (needJacobian) {
      // Large problems check the entries of a Jacobian from a combined pass
      // through the sums of JᵀJ; a non-finite one is evaluated again alone
      // (with the difference fallback of the evaluator).
      let ok = jacAtP && (!normal || (normalAtP = normalAndGradient(jac, r, n, k, normal, grad, compensated)));
      if (!ok && ev.jacobian(p, f, jac, scheme)) {
        ok = !normal || (normalAtP = normalAndGradient(jac, r, n, k, normal, grad, compensated));
      }
      jacAtP = ok;
      if (!ok) {
        normalAtP = false;
        if (iterations === 0 || !havePrevious) {
          return out(
            false,
            ev.lastError
              ? msg('fit.stop.slopes-failed', 'The model failed while its slopes with respect to the parameters were computed (%1).', ev.lastError)
              : msg('fit.stop.slopes-not-finite', 'The slopes of the model with respect to the parameters are not finite numbers at the values reached: choose other start values or bounds.')
          );
        }
        // Step back to the previous point and shrink the trust region.
        [p, pT] = [pT, p];
        [r, rT] = [rT, r];
        [f, fT] = [fT, f];
        cost = costPrevious;
        noise = noisePrevious;
        jacAtP = false;
        havePrevious = false;
        delta *= 0.1;
        continue;
      }
      havePrevious = false;
      for (let j = 0; j < k; j++) {
        colNorm[j] = Math.sqrt(normal[j * k + j]);
      }
      const rnorm = Math.sqrt(cost);
      gcos = 0;
      for (let j = 0; j < k; j++) {
        const scale = colNorm[j] > 0 ? colNorm[j] : 1;
        diag[j] = first ? scale : Math.max(diag[j], colNorm[j]);
        if (colNorm[j] > 0 && rnorm > 0) {
          gcos = Math.max(gcos, Math.abs(grad[j]) / (colNorm[j] * rnorm));
        }
      }
      if (first) {
        const pn = scaledNorm(diag, p);
        delta = FIT_DEFAULTS.initialStepFactor * (pn > 0 ? pn : 1);
      }
      if (cost === 0) {
        return out(true, msg('fit.stop.exact', 'The model passes exactly through every point.'));
      }
      if (gcos <= problem.gtol && settled) {
        if (polish()) {
          continue;
        }
        return out(true, msg('fit.stop.gradient', 'The gradient vanished: a minimum was found.'));
      }
      cols.length = 0;
      for (let j = 0; j < k; j++) {
        const blockedLow = p[j] <= lower[j] && grad[j] > 0;
        const blockedHigh = p[j] >= upper[j] && grad[j] < 0;
        if (!blockedLow && !blockedHigh) {
          cols.push(j);
        }
      }
      if (cols.length === 0 && !reused) {
        return out(true, msg('fit.stop.held-at-bounds', 'Every free parameter is held at the edge of its range: χ² would fall only outside the ranges.'));
      }
      model = cols.length > 0 ? spectralModel(jac, n, k, cols, diag, r, grad, useSvd, FIT_DEFAULTS.singularTolerance, normal, spectral) : null;
      needJacobian = false;
      if (reused) {
        // Rule 1c: the previous point's Jacobian, with the residuals here.
        reused = false;
        if (model !== null && gaussNewtonReduction(model) <= stationaryThreshold(problem, n, k, cost, errorFraction)) {
          return out(
            true,
            msg('fit.stop.stationary-statistical', 'The next step would move the parameters by less than %1 of their standard errors: a minimum was found.', errorFraction)
          );
        }
        jacAtP = false;
        normalAtP = false;
        needJacobian = true;
        continue;
      }
      // Many points: after an accepted Gauss–Newton step that the linear
      // model predicted well, the full Gauss–Newton step from here (accurate
      // Jacobian) promises a χ² reduction below 1e-4 of its rounding noise.
      // Or it moves the parameters by less than `stationaryErrorFraction` of
      // their standard errors (a χ² change of fraction² in units of χ²/dof,
      // or of 1 when σ were given and χ²/dof exceeds 1).
      if (stationaryRule && lastGaussNewton) {
        const gn = gaussNewtonReduction(model!);
        if (!settled) {
          // The forward-difference model (relative error ≈ 1e-8) already
          // predicts a negligible step: take the accurate Jacobian here and
          // apply the test below to it.
          if (gn <= FIT_DEFAULTS.stationaryNoiseFraction * noise || gn <= stationaryThreshold(problem, n, k, cost, errorFraction) * 100) {
            scheme = accurate;
            settled = true;
            jacAtP = false;
            needJacobian = true;
            continue;
          }
        } else if (gn <= FIT_DEFAULTS.stationaryNoiseFraction * noise) {
          return out(true, msg('fit.stop.stationary', 'No step can lower χ² by more than its rounding noise: a minimum was found.'));
        } else if (gn <= stationaryThreshold(problem, n, k, cost, errorFraction)) {
          return out(
            true,
            msg('fit.stop.stationary-statistical', 'The next step would move the parameters by less than %1 of their standard errors: a minimum was found.', errorFraction)
          );
        }
      }
    }
    const m = model!;
    const mu = dampingForRadius(m, delta);
    stepForMu(m, mu, z);
    step.fill(0);
    for (let a = 0; a < m.cols.length; a++) {
      step[m.cols[a]] = z[a] / diag[m.cols[a]];
    }
    const acceleration =
      useGeodesic && mu > 0
        ? accelerate(ev, m, mu, { n, k, p, r, jac, diag, lower, upper, z, step, pT, rT, fT }, work)
        : 'none';
    if (acceleration === 'rejected') {
      // The path curves too much within this radius: shrink it.
      delta *= 0.5;
      first = false;
      progress();
      yield;
      continue;
    }
    const accelerated = acceleration === 'used';
    let clipped = false;
    for (let j = 0; j < k; j++) {
      let v = p[j] + step[j];
      if (v < lower[j]) {
        v = lower[j];
        clipped = true;
      } else if (v > upper[j]) {
        v = upper[j];
        clipped = true;
      }
      pT[j] = v;
      step[j] = v - p[j];
    }
    const pnorm = scaledNorm(diag, step);
    if (first) {
      delta = Math.min(delta, pnorm);
      first = false;
    }
    // Predicted reduction of Σr² from the linear model.
    const jdNorm2 = large ? quadraticForm(normal, k, step) : jacobianTimes(jac, step, n, k, jd!);
    let gStep = 0;
    for (let j = 0; j < k; j++) {
      gStep += grad[j] * step[j];
    }
    const dnorm2 = pnorm * pnorm;
    const pred = clipped || accelerated ? -2 * gStep - jdNorm2 : jdNorm2 + 2 * mu * dnorm2;
    const costT = jacT ? ev.residualsWithJacobian(pT, rT, fT, jacT, false) : ev.residuals(pT, rT, fT);
    const jacTFinite = jacT !== null && ev.lastJacobianFinite;
    const roundingT = ev.lastRoundingNorm2;
    const actual = Number.isFinite(costT) ? cost - costT : -Infinity;
    const rho = pred > 0 ? actual / pred : actual > 0 ? 1 : -1;
    const costBefore = cost;
    // Near the solution χ² differences drown in rounding noise; a Gauss–Newton
    // step whose predicted and actual changes are both at that level is accepted.
    const atNoise = Number.isFinite(costT) && pred <= noise && actual >= -noise && mu === 0;
    if (atNoise) {
      delta = Math.max(delta, pnorm / 0.5);
    } else if (rho <= 0.25) {
      let temp = 0.5;
      if (!Number.isFinite(actual)) {
        temp = 0.1;
      } else if (actual < 0) {
        const dirder = -(jdNorm2 + mu * dnorm2);
        temp = (0.5 * dirder) / (dirder + 0.5 * actual);
        temp = Math.min(0.5, Math.max(0.1, Number.isFinite(temp) ? temp : 0.1));
      }
      delta = temp * Math.min(delta, pnorm / 0.1);
    } else if (mu === 0 || rho >= 0.75) {
      delta = pnorm / 0.5;
    }
    const accepted = atNoise || (rho >= 1e-4 && Number.isFinite(costT) && costT <= cost);
    noiseSteps = atNoise ? noiseSteps + 1 : accepted ? 0 : noiseSteps;
    if (accepted) {
      lastGaussNewton = mu === 0 && !clipped && !accelerated && (atNoise || Math.abs(rho - 1) <= 0.1);
      const unit = stationaryThreshold(problem, n, k, cost, 1);
      stepErrorsBefore = lastGaussNewton ? stepErrors : Number.NaN;
      stepErrors = lastGaussNewton && unit > 0 ? Math.sqrt(Math.max(pred, 0) / unit) : Number.NaN;
      costPrevious = cost;
      havePrevious = true;
      [p, pT] = [pT, p];
      [r, rT] = [rT, r];
      [f, fT] = [fT, f];
      if (jacT) {
        [jac, jacT] = [jacT, jac];
      }
      jacAtP = jacTFinite;
      normalAtP = false;
      // Rule 1c (a Jacobian that costs passes of its own: differences, or an
      // analytic one without values): after two Gauss–Newton steps of d₁
      // and d₂ standard errors, quadratic convergence (d₂ ≈ c·d₁²) puts the
      // next step at c·d₂², and the previous point's Jacobian differs from
      // this point's by about c·d₂ of a standard error in the step it gives.
      // With (d₂/d₁)² = c·d₂ below the stopping fraction and d₂ below
      // `reuseJacobianStep`, the previous point's Jacobian tests this point;
      // the fit ends here when it passes rule 1b's statistical test.
      const ratio = stepErrors / stepErrorsBefore;
      if (!combined && settled && stationaryRule && !jacAtP && stepErrors <= FIT_DEFAULTS.reuseJacobianStep && ratio * ratio <= errorFraction) {
        jacAtP = true;
        reused = true;
      }
      cost = costT;
      noisePrevious = noise;
      noise = costNoise(costT, roundingT);
      needJacobian = true;
      iterations++;
    }
    progress();
    yield;
    // Forward differences: switch to the accurate Jacobian at the first
    // noise-level step; then two consecutive noise-level steps end the fit.
    // The first noise-level step with central differences counts towards
    // rule 1: one more with Richardson-extrapolated ones ends the fit.
    if (settled && noiseSteps === 1 && polish()) {
      continue;
    }
    if (noiseSteps >= (settled ? 2 : 1)) {
      if (!settled) {
        scheme = accurate;
        settled = true;
        jacAtP = false;
        noiseSteps = 0;
        needJacobian = true;
        continue;
      }
      return out(true, msg('fit.stop.rounding-noise', 'Further steps change χ² only at the level of its rounding noise: a minimum was found.'));
    }
    const actRel = Number.isFinite(actual) ? Math.abs(actual) / costBefore : Infinity;
    const predRel = pred / costBefore;
    const ftolHit = actRel <= problem.ftol && predRel <= problem.ftol && rho <= 2;
    const xnorm = scaledNorm(diag, p);
    const xtolHit = delta <= problem.xtol * xnorm || delta <= Number.MIN_VALUE * 1e10;
    const machineHit = actRel <= Number.EPSILON && predRel <= Number.EPSILON && rho <= 2;
    if (ftolHit || xtolHit || machineHit) {
      if (!settled) {
        scheme = accurate;
        settled = true;
        jacAtP = false;
        needJacobian = true;
        const pn = scaledNorm(diag, p);
        delta = Math.max(delta, pn > 0 ? pn : 1);
        continue;
      }
      const gnRel = gaussNewtonReduction(m) / cost;
      if (!ftolHit && !machineHit && gnRel > FIT_DEFAULTS.restartReductionThreshold) {
        if (restarts >= FIT_DEFAULTS.maxRestarts) {
          return out(
            false,
            msg(
              'fit.stop.stalled',
              'The parameters stopped changing while χ² could still fall (by a fraction of about %1), even after %2 restarts: try other start values.',
              { value: gnRel, digits: 2 },
              restarts
            )
          );
        }
        restarts++;
        const pn = scaledNorm(diag, p);
        delta = FIT_DEFAULTS.initialStepFactor * (pn > 0 ? pn : 1);
        needJacobian = true;
        continue;
      }
      if (polish()) {
        continue;
      }
      const which = ftolHit
        ? msg('fit.stop.chi2-settled', 'χ² stopped decreasing.')
        : machineHit
          ? msg('fit.stop.machine-precision', 'χ² cannot decrease any further at the precision of the computer.')
          : msg('fit.stop.parameters-settled', 'The parameters stopped changing.');
      return out(true, which);
    }
  }
}
