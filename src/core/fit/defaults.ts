/**
 * Every default of the fit engine, defined once.
 *
 * | name | value | meaning |
 * |---|---|---|
 * | `ftol` | 1e-15 | stop when both the actual and the predicted relative reduction of χ² are below `ftol` |
 * | `xtol` | 1e-15 | stop when the trust radius is below `xtol`·‖D·p‖ (D = Moré column scaling) |
 * | `gtol` | 1e-15 | stop when the largest cosine between the residual vector and a Jacobian column is below `gtol` |
 * | `maxEvaluationsPerParameter` | 400 | default `maxEvaluations` = 400·(k+1), k = free parameters (Jacobian columns by finite differences count) |
 * | `confidenceLevel` | 0.6827 | Student-t intervals cover ±1σ for a normal variable |
 * | `initialStepFactor` | 1 | first trust radius = factor·‖D·p₀‖ (or factor when that is 0); MINPACK uses 100, 1 avoids first steps onto plateaus (e.g. exp(−b·x) → 0) |
 * | `forwardStep` | √ε | relative forward-difference step |
 * | `centralStep` | ε^(1/3) | relative central-difference step |
 * | `extrapolatedStep` | ε^(1/5) | relative step h of Richardson-extrapolated central differences (h and h/2): double-double polishing (`refine.ts`), and an analytic Jacobian that is not finite |
 * | `largeRows` | 20000 | large-problem threshold n. Up to this many points the trust-region step may use an SVD of the scaled Jacobian (accuracy on small ill-conditioned problems such as NIST StRD). Above it: the eigen-decomposition of the k×k JᵀJ only (formed in one tight pass; for n ≫ k the statistical error dwarfs its rounding), and stopping rule 1b |
 * | `normalEquationsMinRatio` | 1e-11 | the trust-region model uses the eigen-decomposition of the scaled JᵀJ when λmin/λmax ≥ this (condition of the scaled Jacobian ≤ 3e5), otherwise the SVD of the scaled Jacobian (up to `largeRows` points) |
 * | `stationaryRows` | 1000 | rule 1b applies from this many points on (statistical errors then dwarf the last digits that a second confirming step would settle) |
 * | `stationaryNoiseFraction` | 1e-4 | rule 1b: the full Gauss–Newton step predicts a χ² reduction below this fraction of the rounding noise of χ² |
 * | `stationaryErrorFraction` | 3e-5 | rule 1b also: the full Gauss–Newton step moves the parameters by less than this fraction of their standard errors (χ² reduction ≤ fraction²·χ²/dof; ≤ fraction² when σ were given and χ²/dof > 1) |
 * | `reuseJacobianStep` | 0.1 | rule 1c: largest last step, in standard errors, after which the previous point's Jacobian may test the new point |
 * | `singularTolerance` | 1e-13 | singular values below tolerance·s_max are treated as zero (rank deficiency) |
 * | `correlationWarning` | 0.99 | |correlation| above this adds a warning |
 * | `conditionWarning` | 1e12 | condition number of the scaled Jacobian above this adds a warning |
 * | `restartReductionThreshold` | 1e-10 | a stop on a small step while the Gauss–Newton model still predicts a relative χ² reduction above this restarts from the best point (a reduction of 1e-10·χ² moves parameters by ≈ 1e-5·√dof standard errors) |
 * | `maxRestarts` | 3 | restarts allowed by the rule above before the fit is declared not converged |
 * | `warmStartRows` | 1000 | from this many points on, a pointwise model is first fitted to an evenly strided subsample and the full-data iteration starts from that solution (`warmStart.ts`); the subsample stage applies the same rule to itself |
 * | `warmStartSample` | 16384 | largest size of that subsample, and its size from `warmStartFullSampleRows` points on |
 * | `warmStartFullSampleRows` | 50000 | from this many points on the subsample has `warmStartSample` points (stride ⌊n / 16384⌋) |
 * | `warmStartErrorFraction` | 0.05 | a subsample stage stops (rule 1b at any size, forward differences allowed) once its next step would move the parameters by less than this fraction of the subsample's standard errors: its answer is only a start, about √stride full-data standard errors from the full-data minimum |
 * | `warmStartMinSample` | 100 | smallest size of that subsample |
 * | `warmStartSampleFactor` | 10 | below `warmStartFullSampleRows` points: subsample size ≈ factor·√n (stride ⌊n / size⌋) when that is at least `warmStartRows` points (the subsample stage then has a subsample of its own) |
 * | `warmStartInnerFactor` | 5 | otherwise (the innermost stage, which runs from the user's start): ≈ factor·√n points, at least `warmStartMinSample` |
 * | `refineNoiseFraction` | 1e-9 | a converged fit whose χ² rounding noise exceeds this fraction of χ² is polished with double-double residuals when the model has `evaluatePrecise` (`refine.ts`) |
 * | `refineMaxSteps` | 8 | Gauss–Newton steps of that refinement at most |
 * | `geodesicAcceleration` | true | while damped (μ > 0), add ½a, the geodesic acceleration (one extra evaluation), to the step |
 * | `geodesicAlpha` | 0.75 | when ‖a‖ > α‖v‖ (scaled norms) the path curves too much: the step is not tried and the radius is halved |
 *
 * Stopping rules (first met wins; `converged` is true only for 1–4 and only
 * when the Jacobian at the solution has full rank):
 * 1. two consecutive Gauss–Newton steps (μ = 0) whose predicted and actual
 *    χ² changes are within the rounding noise of χ² (2‖r‖‖e‖ + ‖e‖²,
 *    eᵢ = 4ε·wᵢ(|fᵢ| + |yᵢ|)), with the accurate Jacobian;
 * 1b. only from `stationaryRows` points on: after an accepted undamped, unclipped
 *    step whose actual χ² change matched the prediction (|ρ − 1| ≤ 0.1, or
 *    at noise level), the Jacobian at the new point (accurate scheme) gives
 *    a full Gauss–Newton step predicting a χ² reduction ≤
 *    `stationaryNoiseFraction` × noise (the point is stationary far inside
 *    the rounding noise; this saves the two confirming steps of rule 1), or
 *    one that moves the parameters by less than `stationaryErrorFraction`
 *    of their standard errors;
 * 1c. as 1b's statistical test, for Jacobians that cost model passes of
 *    their own (differences; analytic without values): after two such
 *    Gauss–Newton steps of d₁ and d₂ standard errors converging
 *    quadratically ((d₂/d₁)² ≤ fraction, d₂ ≤ `reuseJacobianStep`: the
 *    next step and the change of the Jacobian over d₂ are then below the
 *    fraction), the previous point's Jacobian (d₂ standard errors away)
 *    with the new residuals; the covariance then comes from that Jacobian;
 * 2. `ftol` test (MINPACK form), 3. `xtol` test on the trust radius — a stop
 *    on 3 while the Gauss–Newton model still predicts a relative reduction
 *    above `restartReductionThreshold` restarts from the best point instead;
 * 4. `gtol` test, or zero residual;
 * otherwise: maximum evaluations, cancellation, non-finite values — all
 * with `converged: false` and the best point so far.
 * Finite differences start forward; below `stationaryRows` points, at the
 * first stop signal the Jacobian switches to central differences (step
 * `centralStep`, relative error ≈ ε^(2/3); every NIST StRD fit keeps its
 * certified digits with them, as with Richardson extrapolation at twice the
 * passes) and the iteration continues until a rule is met again with that
 * Jacobian. From `stationaryRows` points on (and in subsample stages) forward
 * differences stay: their error moves the step and the standard errors by
 * about √ε·|p·f''/f'| of a standard error, far below rule 1b's fraction.
 */
export const FIT_DEFAULTS = Object.freeze({
  ftol: 1e-15,
  xtol: 1e-15,
  gtol: 1e-15,
  maxEvaluationsPerParameter: 400,
  confidenceLevel: 0.6827,
  initialStepFactor: 1,
  forwardStep: Math.sqrt(Number.EPSILON),
  centralStep: Math.cbrt(Number.EPSILON),
  extrapolatedStep: Math.pow(Number.EPSILON, 0.2),
  largeRows: 20000,
  normalEquationsMinRatio: 1e-11,
  stationaryRows: 1000,
  stationaryNoiseFraction: 1e-4,
  stationaryErrorFraction: 3e-5,
  reuseJacobianStep: 0.1,
  singularTolerance: 1e-13,
  correlationWarning: 0.99,
  conditionWarning: 1e12,
  restartReductionThreshold: 1e-10,
  maxRestarts: 3,
  warmStartRows: 1000,
  warmStartSample: 16384,
  warmStartFullSampleRows: 50000,
  warmStartMinSample: 100,
  warmStartErrorFraction: 0.05,
  warmStartSampleFactor: 10,
  warmStartInnerFactor: 5,
  refineNoiseFraction: 1e-9,
  refineMaxSteps: 8,
  geodesicAcceleration: true,
  geodesicAlpha: 0.75
});
