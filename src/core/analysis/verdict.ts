/**
 * Verdict on a fit: does the model describe the data, and can its numbers be
 * quoted? "Converged" only says that the optimiser stopped properly; this
 * module tests the fit itself.
 *
 * - With per-point σ: the χ² goodness-of-fit test (upper tail: the model or
 *   the σ are wrong) and its lower tail (σ far larger than the scatter).
 * - Always: the Wald–Wolfowitz runs test on the signs of the residuals in
 *   order of x (long stretches of one sign = structure the model misses).
 * - Without σ: how much of the variance of y the model accounts for.
 * - Always: parameters at a bound, parameters not determined (relative
 *   standard error above 100 %), pairs the data cannot separate
 *   (|correlation| near 1), and non-finite values, standard errors or χ².
 * - When the drawn curve is given: that it is finite at every point drawn.
 *
 * Every threshold is in {@link VERDICT_THRESHOLDS}. References: [N14] in REFERENCES.md.
 */
import type { IFitResult } from '../fit/types';
import { CoreMessageError, msg } from '../messages';
import type { ICoreMessage, MessageArg } from '../messages';
import { chiSquareLowerTail, chiSquareUpperTail, normalCdf } from '../numeric/chi2';

/** Outcome of the verdict, from best to worst for the UI's styling. */
export type VerdictState = 'fits' | 'does-not-describe' | 'not-converged';

/** One test made on the fit. */
export interface IVerdictCheck {
  /** Stable identifier of the check (`chi2`, `runs`, `bounds`…). */
  code: string;
  passed: boolean;
  /** What was found, in words, with the numbers as arguments. */
  message: ICoreMessage;
  /** The number the check turned on (χ²_red, runs z, largest |correlation|…), when there is one. */
  value?: number;
}

/** The verdict on one fit. */
export interface IVerdict {
  state: VerdictState;
  /** One sentence for the headline, with the number that decided it (e.g. χ²_red and p, or the runs z). */
  summary: ICoreMessage;
  /** Every check made, passed or not, in order of importance. */
  checks: IVerdictCheck[];
  /** χ² upper-tail p-value when σ were given, else null. */
  pValue: number | null;
}

/** The data the fit was made on (the result itself holds no data). */
export interface IVerdictInput {
  /** The fitted points' x, in the order fitted. */
  x: ArrayLike<number>;
  y: ArrayLike<number>;
  /** Per-point σ when the user gave a σ column. */
  sigma?: ArrayLike<number>;
  /** Parameter bounds used, if any (one per parameter, ±∞ for none). */
  lower?: ArrayLike<number>;
  upper?: ArrayLike<number>;
  /**
   * y of the model curve as drawn over the window, when there is one: a
   * curve that is not finite everywhere it is drawn fails the
   * 'curve-not-finite' check (the model does not describe the window).
   */
  curve?: ArrayLike<number>;
}

/**
 * Thresholds of the verdict, all in one place.
 *
 * The three probability thresholds are each 1e-3, so that a correct model
 * with correct σ is wrongly rejected by each test about once in a thousand
 * fits (at most ≈ 0.3 % for the three together), while the misfits that
 * matter in practice, with tens to thousands of points, give probabilities
 * many orders of magnitude smaller. The 1e-3 level is the usual "highly
 * significant" convention (common practice, no source); 0.05 would flag
 * one honest fit in seven.
 */
export const VERDICT_THRESHOLDS = {
  /**
   * χ² upper-tail p below this: the scatter about the curve is too large
   * for the σ given, so the model (or σ) is wrong.
   */
  chi2UpperP: 1e-3,
  /**
   * χ² lower-tail probability below this: the scatter is far smaller than
   * the σ given (σ overestimated, e.g. a wrong unit or a σ of the mean
   * taken for one of the points).
   */
  chi2LowerP: 1e-3,
  /**
   * One-sided p of the runs test below this (z ≈ −3.09 in the normal
   * approximation): too few runs, i.e. the residuals run in long stretches
   * of one sign.
   */
  runsP: 1e-3,
  /**
   * Up to this many non-zero residuals the runs test uses the exact
   * distribution of the number of runs (C(1000, 500) ≈ 2.7e299 still fits
   * in binary64); above it, the normal approximation with continuity
   * correction. Compared here with the exact tail near p = 1e-3, the
   * approximation is off by up to 17 % at 60 points and 11 % at 1000
   * (worst for unequal numbers of + and −), a shift of the effective z
   * threshold by about 0.03: harmless above 1000 points, worth avoiding
   * below.
   */
  exactRunsMaxPoints: 1000,
  /**
   * Without σ: adjusted R² below this, i.e. residual rms (√(RSS/dof))
   * above 1/√2 ≈ 0.71 of the standard deviation of y. The model then
   * accounts for less than half of the variation of y: there is more noise
   * than curve in the data, and the parameters mostly fit noise. Half is a
   * round line one can explain (common practice, no source); the stricter
   * rms > 0.5·std(y) (adjusted R² < 0.75) would also reject honest fits of
   * weak but real trends in noisy data.
   */
  minAdjustedR2: 0.5,
  /**
   * A free parameter within this relative distance of a finite bound (scale:
   * the larger of |bound| and the width of the range when both bounds are
   * finite) is "at the bound". The engine projects onto bounds, so a
   * parameter held by a bound sits exactly on it; 1e-6 also catches one
   * stopped a rounding step away.
   */
  boundRelative: 1e-6,
  /** Relative standard error σ_p/|p| above this (100 %): the data do not determine the parameter. */
  maxRelativeError: 1,
  /**
   * |correlation| between two free parameters above this: the data fix
   * their combination, not each one. At |ρ| = 0.999 the error of either
   * with the other held fixed is √(1 − ρ²) ≈ 4.5 % of its quoted standard
   * error, so the quoted errors describe a ridge, not two measurements
   * (common practice, no source).
   */
  maxCorrelation: 0.999
} as const;

/**
 * Probabilities below this are shown as "below 1e-300" rather than as the
 * number, which is then near or past the end of the binary64 range (0 after
 * underflow).
 */
const SMALLEST_SHOWN_P = 1e-300;

/** Result of the runs test on the signs of the residuals. */
export interface IRunsTestResult {
  /** Residuals above zero. */
  positive: number;
  /** Residuals below zero (residuals exactly zero are left out). */
  negative: number;
  /** Number of runs of equal signs along x. */
  runs: number;
  /** Expected number of runs for independent signs. */
  expected: number;
  /** Standardised number of runs, (runs + ½ − expected)/sd (continuity-corrected); 0 when sd = 0. */
  z: number;
  /** One-sided probability of this few runs or fewer for independent signs. */
  pValue: number;
  /** Whether `pValue` is from the exact distribution (else the normal approximation). */
  exact: boolean;
}

/** Binomial coefficient C(n, k) in floating point (0 outside 0 ≤ k ≤ n). */
function choose(n: number, k: number): number {
  if (k < 0 || k > n) {
    return 0;
  }
  const kk = Math.min(k, n - k);
  let c = 1;
  for (let i = 1; i <= kk; i++) {
    c = (c * (n - kk + i)) / i;
  }
  return c;
}

/**
 * P(R ≤ runs) for the number of runs R in a random arrangement of n1 and n2
 * signs (n1, n2 ≥ 1), from the exact distribution (Mood 1940, Ann. Math.
 * Stat. 11, 367; tabulated by Swed & Eisenhart 1943, Ann. Math. Stat. 14, 66):
 *   P(R = 2k)     = 2 C(n1−1, k−1) C(n2−1, k−1) / C(n1+n2, n1)
 *   P(R = 2k + 1) = [C(n1−1, k) C(n2−1, k−1) + C(n1−1, k−1) C(n2−1, k)] / C(n1+n2, n1)
 */
function exactRunsLowerTail(n1: number, n2: number, runs: number): number {
  const total = choose(n1 + n2, n1);
  let sum = 0;
  for (let r = 2; r <= runs; r++) {
    const k = Math.floor(r / 2);
    if (r % 2 === 0) {
      sum += 2 * choose(n1 - 1, k - 1) * choose(n2 - 1, k - 1);
    } else {
      sum += choose(n1 - 1, k) * choose(n2 - 1, k - 1) + choose(n1 - 1, k - 1) * choose(n2 - 1, k);
    }
  }
  return Math.min(1, sum / total);
}

/**
 * Wald–Wolfowitz runs test (Wald & Wolfowitz 1940, Ann. Math. Stat. 11, 147)
 * on the signs of the residuals taken in order of increasing x (ties keep
 * the fitted order). One-sided: only too few runs (residuals in long
 * stretches of one sign) count against the model.
 *
 * With n1 positive and n2 negative residuals, n = n1 + n2, the number of
 * runs has mean 1 + 2 n1 n2 / n and variance
 * 2 n1 n2 (2 n1 n2 − n) / (n² (n − 1)). When every residual has the same
 * sign the test conditional on n1, n2 says nothing, so independent signs
 * equally likely either way are assumed instead: P(all n alike) = 2^(1−n).
 */
export function residualRunsTest(x: ArrayLike<number>, residuals: ArrayLike<number>): IRunsTestResult {
  const n = residuals.length;
  const order = Array.from({ length: n }, (_, i) => i);
  order.sort((a, b) => x[a] - x[b] || a - b);
  let positive = 0;
  let negative = 0;
  let runs = 0;
  let last = 0;
  for (const i of order) {
    const r = residuals[i];
    const s = r > 0 ? 1 : r < 0 ? -1 : 0;
    if (s === 0) {
      continue;
    }
    if (s > 0) {
      positive++;
    } else {
      negative++;
    }
    if (s !== last) {
      runs++;
      last = s;
    }
  }
  const m = positive + negative;
  if (positive === 0 || negative === 0) {
    // One sign (or none): binomial model with p = ½ for each sign.
    const expected = m === 0 ? 0 : (m + 1) / 2;
    const sd = Math.sqrt(Math.max(0, m - 1) / 4);
    return {
      positive,
      negative,
      runs,
      expected,
      z: sd > 0 ? (runs + 0.5 - expected) / sd : 0,
      pValue: m <= 1 ? 1 : Math.pow(2, 1 - m),
      exact: true
    };
  }
  const product = 2 * positive * negative;
  const expected = 1 + product / m;
  const variance = (product * (product - m)) / (m * m * (m - 1));
  const z = variance > 0 ? (runs + 0.5 - expected) / Math.sqrt(variance) : 0;
  const exact = m <= VERDICT_THRESHOLDS.exactRunsMaxPoints;
  const pValue = exact ? exactRunsLowerTail(positive, negative, runs) : Math.min(1, normalCdf(z));
  return { positive, negative, runs, expected, z, pValue, exact };
}

/** An integer shown in full (the default 4 significant digits would round 12345). */
function count(n: number): MessageArg {
  return { value: n, digits: 15 };
}

/** A number shown with `digits` significant digits. */
function num(value: number, digits: number): MessageArg {
  return { value, digits };
}

function requireLength(name: string, values: ArrayLike<number> | undefined, length: number): void {
  if (values !== undefined && values.length !== length) {
    throw new CoreMessageError(
      msg('verdict.input-length', 'The verdict needs %1 values of %2 (one per fitted point or parameter), got %3.', count(length), name, count(values.length))
    );
  }
}

/** Free parameters (not fixed), by index. */
function freeIndices(fit: IFitResult): number[] {
  const out: number[] = [];
  for (let j = 0; j < fit.parameters.length; j++) {
    if (fit.fixed[j] !== true) {
      out.push(j);
    }
  }
  return out;
}

function convergedCheck(fit: IFitResult): IVerdictCheck {
  return fit.converged
    ? {
        code: 'converged',
        passed: true,
        message: msg('verdict.converged.passed', 'The optimiser reached a best fit after %1 iterations.', count(fit.iterations)),
        value: fit.iterations
      }
    : {
        code: 'converged',
        passed: false,
        message: msg(
          'verdict.converged.failed',
          'The fit did not converge: the optimiser stopped after %1 iterations without reaching a best fit, so the values shown are not a result. Try other starting values, a narrower window or fewer free parameters.',
          count(fit.iterations)
        ),
        value: fit.iterations
      };
}

function dofCheck(fit: IFitResult, n: number, k: number): IVerdictCheck {
  return fit.dof > 0
    ? {
        code: 'dof',
        passed: true,
        message: msg('verdict.dof.passed', '%1 degrees of freedom: %2 points for %3 free parameters.', count(fit.dof), count(n), count(k)),
        value: fit.dof
      }
    : {
        code: 'dof',
        passed: false,
        message: msg(
          'verdict.dof.failed',
          'Nothing tests this fit: %1 points for %2 free parameters leave no degrees of freedom, so the curve can pass through every point whatever the model. Add points or fix parameters.',
          count(n),
          count(k)
        ),
        value: fit.dof
      };
}

/** Number of residuals that are not finite. */
function nonFiniteResiduals(fit: IFitResult): number {
  let bad = 0;
  for (let i = 0; i < fit.residuals.length; i++) {
    if (!Number.isFinite(fit.residuals[i])) {
      bad++;
    }
  }
  return bad;
}

function finiteCheck(fit: IFitResult, free: number[], chi2: number): IVerdictCheck {
  const names = free
    .filter(j => !Number.isFinite(fit.values[j]) || !Number.isFinite(fit.standardErrors[j]))
    .map(j => fit.parameters[j]);
  if (names.length > 0) {
    return {
      code: 'finite',
      passed: false,
      message: msg(
        'verdict.finite.parameters',
        'No usable number for %1: the fit returned a value or standard error that is not finite (NaN or ∞), so it cannot be quoted.',
        names.join(', ')
      ),
      value: names.length
    };
  }
  const bad = nonFiniteResiduals(fit);
  if (bad === 0 && !Number.isFinite(chi2)) {
    return {
      code: 'finite',
      passed: false,
      message: msg(
        'verdict.finite.chi2',
        'χ² is %1 although every residual is finite: the squares of the residuals overflow, so the quality of the fit cannot be judged. Rescale the y column (and σ) before fitting.',
        chi2
      ),
      value: 0
    };
  }
  if (bad > 0 || !Number.isFinite(chi2)) {
    return {
      code: 'finite',
      passed: false,
      message: msg(
        'verdict.finite.residuals',
        'The model or its χ² is not finite at %1 of the fitted points, so the quality of the fit cannot be judged.',
        count(bad)
      ),
      value: bad
    };
  }
  return {
    code: 'finite',
    passed: true,
    message: msg('verdict.finite.passed', 'All values, standard errors and residuals are finite.'),
    value: 0
  };
}

/**
 * The drawn curve: a model that gives no finite value somewhere on the grid
 * it is drawn on (NaN, ±∞, overflow) does not describe the data over the
 * window, whatever its residuals at the fitted points say.
 */
function curveCheck(curve: ArrayLike<number>): IVerdictCheck {
  let bad = 0;
  for (let i = 0; i < curve.length; i++) {
    if (!Number.isFinite(curve[i])) {
      bad++;
    }
  }
  return bad === 0
    ? {
        code: 'curve-not-finite',
        passed: true,
        message: msg('verdict.curve.passed', 'The fitted curve is finite at all %1 points where it is drawn.', count(curve.length)),
        value: 0
      }
    : {
        code: 'curve-not-finite',
        passed: false,
        message: msg(
          'verdict.curve.failed',
          'The fitted model gives no finite value at %1 of the %2 points where its curve is drawn across the window, so it does not describe the data there. Narrow the window, check the model, or rescale the columns.',
          count(bad),
          count(curve.length)
        ),
        value: bad
      };
}

/** χ² = Σ(r/σ)², from the engine when it weighted by σ, else from the residuals. */
function weightedChi2(fit: IFitResult, sigma: ArrayLike<number>): number {
  if (fit.errorScaling === 'from-sigma') {
    return fit.chi2;
  }
  let chi2 = 0;
  for (let i = 0; i < fit.residuals.length; i++) {
    const w = fit.residuals[i] / sigma[i];
    chi2 += w * w;
  }
  return chi2;
}

function chi2Check(reduced: number, dof: number, p: number): IVerdictCheck {
  return p >= VERDICT_THRESHOLDS.chi2UpperP
    ? {
        code: 'chi2',
        passed: true,
        message: msg(
          'verdict.chi2.passed',
          'χ²_red = %1 for %2 degrees of freedom (p = %3): the scatter about the curve is what the σ given lead one to expect.',
          num(reduced, 3),
          count(dof),
          num(p, 2)
        ),
        value: reduced
      }
    : {
        code: 'chi2',
        passed: false,
        message:
          p >= SMALLEST_SHOWN_P
            ? msg(
                'verdict.chi2.failed',
                'The model does not describe the data: χ²_red = %1 for %2 degrees of freedom, which has probability p = %3 if the model and the σ are right. The curve misses a feature of the data, or the σ are too small.',
                num(reduced, 3),
                count(dof),
                num(p, 2)
              )
            : msg(
                'verdict.chi2.failed',
                'The model does not describe the data: χ²_red = %1 for %2 degrees of freedom, which has probability p below %3 if the model and the σ are right. The curve misses a feature of the data, or the σ are too small.',
                num(reduced, 3),
                count(dof),
                SMALLEST_SHOWN_P
              ),
        value: reduced
      };
}

/**
 * Overestimated σ. Verdict: 'does-not-describe', never 'fits'. The standard
 * errors of a fit with σ come from σ alone ('from-sigma'), so they are too
 * large by 1/√χ²_red and cannot be quoted; and with σ that large the χ² test
 * could not have noticed a model that misses the data. Showing such a fit in
 * the success style would endorse both.
 */
function sigmaScaleCheck(reduced: number, dof: number, pLow: number): IVerdictCheck {
  return pLow >= VERDICT_THRESHOLDS.chi2LowerP
    ? {
        code: 'sigma-scale',
        passed: true,
        message: msg(
          'verdict.sigma-scale.passed',
          'χ²_red = %1 is not too small for the σ given (probability of a value this small: %2).',
          num(reduced, 3),
          num(pLow, 2)
        ),
        value: reduced
      }
    : {
        code: 'sigma-scale',
        passed: false,
        message:
          pLow >= SMALLEST_SHOWN_P
            ? msg(
                'verdict.sigma-scale.failed',
                'The σ column is much larger than the scatter of the data: χ²_red = %1 for %2 degrees of freedom has probability %3 if the σ are right. The standard errors, taken from σ, are too large by about a factor %4; check the units and meaning of the σ column.',
                num(reduced, 3),
                count(dof),
                num(pLow, 2),
                num(1 / Math.sqrt(reduced), 2)
              )
            : msg(
                'verdict.sigma-scale.failed',
                'The σ column is much larger than the scatter of the data: χ²_red = %1 for %2 degrees of freedom has a probability below %3 if the σ are right. The standard errors, taken from σ, are too large by about a factor %4; check the units and meaning of the σ column.',
                num(reduced, 3),
                count(dof),
                SMALLEST_SHOWN_P,
                num(1 / Math.sqrt(reduced), 2)
              ),
        value: reduced
      };
}

function runsCheck(test: IRunsTestResult): IVerdictCheck {
  const passed = test.pValue >= VERDICT_THRESHOLDS.runsP;
  if (passed) {
    return {
      code: 'runs',
      passed,
      message: msg(
        'verdict.runs.passed',
        'The residuals change sign as often as chance predicts: %1 runs of one sign along x where about %2 are expected (z = %3).',
        count(test.runs),
        num(test.expected, 3),
        num(test.z, 3)
      ),
      value: test.z
    };
  }
  if (test.positive === 0 || test.negative === 0) {
    return {
      code: 'runs',
      passed,
      message: msg(
        'verdict.runs.one-sign',
        'The model does not describe the data: all %1 residuals have the same sign, so the curve lies entirely on one side of the points.',
        count(test.positive + test.negative)
      ),
      value: test.z
    };
  }
  return {
    code: 'runs',
    passed,
    message:
      test.pValue >= SMALLEST_SHOWN_P
        ? msg(
            'verdict.runs.failed',
            'The model does not describe the shape of the data: the residuals run in long stretches of one sign (%1 runs where about %2 are expected; z = %3, p = %4). The curve misses a systematic feature; try another model or a narrower window.',
            count(test.runs),
            num(test.expected, 3),
            num(test.z, 3),
            num(test.pValue, 2)
          )
        : msg(
            'verdict.runs.failed',
            'The model does not describe the shape of the data: the residuals run in long stretches of one sign (%1 runs where about %2 are expected; z = %3, p below %4). The curve misses a systematic feature; try another model or a narrower window.',
            count(test.runs),
            num(test.expected, 3),
            num(test.z, 3),
            SMALLEST_SHOWN_P
          ),
    value: test.z
  };
}

/** Without σ: adjusted R² = 1 − (RSS/dof)/(SST/(n − 1)) against {@link VERDICT_THRESHOLDS.minAdjustedR2}. */
function explainedCheck(fit: IFitResult, y: ArrayLike<number>): IVerdictCheck {
  const n = y.length;
  let mean = 0;
  for (let i = 0; i < n; i++) {
    mean += y[i];
  }
  mean /= n;
  let sst = 0;
  for (let i = 0; i < n; i++) {
    sst += (y[i] - mean) * (y[i] - mean);
  }
  let rss = 0;
  for (let i = 0; i < n; i++) {
    rss += fit.residuals[i] * fit.residuals[i];
  }
  const rms = Math.sqrt(rss / fit.dof);
  const spread = n > 1 ? Math.sqrt(sst / (n - 1)) : 0;
  const adjusted = spread > 0 ? 1 - (rms * rms) / (spread * spread) : rss === 0 ? 1 : -Infinity;
  return adjusted >= VERDICT_THRESHOLDS.minAdjustedR2
    ? {
        code: 'explained',
        passed: true,
        message: msg(
          'verdict.explained.passed',
          'The model accounts for %1 % of the variation of y (adjusted R²); residual rms %2 against a spread of y of %3.',
          num(100 * adjusted, 3),
          num(rms, 3),
          num(spread, 3)
        ),
        value: adjusted
      }
    : {
        code: 'explained',
        passed: false,
        message: msg(
          'verdict.explained.failed',
          'The model explains little of the data: the residuals scatter by %1 against a spread of y of %2 (adjusted R² = %3, below %4). Its parameters mostly describe noise.',
          num(rms, 3),
          num(spread, 3),
          num(adjusted, 3),
          num(VERDICT_THRESHOLDS.minAdjustedR2, 3)
        ),
        value: adjusted
      };
}

function boundsCheck(fit: IFitResult, free: number[], lower?: ArrayLike<number>, upper?: ArrayLike<number>): IVerdictCheck {
  const names: string[] = [];
  let first: { name: string; bound: number } | null = null;
  for (const j of free) {
    const v = fit.values[j];
    if (!Number.isFinite(v)) {
      continue;
    }
    const lo = lower ? lower[j] : -Infinity;
    const hi = upper ? upper[j] : Infinity;
    const width = Number.isFinite(hi - lo) ? hi - lo : 0;
    for (const [bound, side] of [
      [lo, 1],
      [hi, -1]
    ] as const) {
      if (!Number.isFinite(bound)) {
        continue;
      }
      const tol = VERDICT_THRESHOLDS.boundRelative * Math.max(Math.abs(bound), width);
      // side·(v − bound): distance inside the range (negative = outside).
      if (side * (v - bound) <= tol) {
        names.push(fit.parameters[j]);
        first ??= { name: fit.parameters[j], bound };
        break;
      }
    }
  }
  if (first === null) {
    return {
      code: 'bounds',
      passed: true,
      message: msg('verdict.bounds.passed', 'No free parameter is at a limit of its allowed range.'),
      value: 0
    };
  }
  return {
    code: 'bounds',
    passed: false,
    message: msg(
      'verdict.bounds.failed',
      'At a limit of the allowed range: %1 (%2 = %3). The best fit lies at or beyond that limit, so the value and its error cannot be quoted; widen the range or fix the parameter.',
      names.join(', '),
      first.name,
      first.bound
    ),
    value: names.length
  };
}

function relativeErrorCheck(fit: IFitResult, free: number[]): IVerdictCheck {
  const names: string[] = [];
  let worst = 0;
  for (const j of free) {
    const rel = fit.standardErrors[j] / Math.abs(fit.values[j]);
    if (!(rel <= VERDICT_THRESHOLDS.maxRelativeError)) {
      names.push(fit.parameters[j]);
      worst = Number.isNaN(rel) ? Infinity : Math.max(worst, rel);
    } else {
      worst = Math.max(worst, rel);
    }
  }
  return names.length === 0
    ? {
        code: 'relative-error',
        passed: true,
        message: msg(
          'verdict.relative-error.passed',
          'Every free parameter is larger than its standard error (largest relative standard error %1 %).',
          num(100 * worst, 3)
        ),
        value: worst
      }
    : {
        code: 'relative-error',
        passed: false,
        message: msg(
          'verdict.relative-error.failed',
          'Not determined by the data: %1 (standard error up to %2 % of the value). Fix these parameters, drop them from the model, or add data that constrain them.',
          names.join(', '),
          num(100 * worst, 3)
        ),
        value: worst
      };
}

function correlationCheck(fit: IFitResult, free: number[]): IVerdictCheck {
  const pairs: string[] = [];
  let worst = 0;
  let undefinedPair = false;
  for (let a = 0; a < free.length; a++) {
    for (let b = a + 1; b < free.length; b++) {
      const ja = free[a];
      const jb = free[b];
      const sa = fit.standardErrors[ja];
      const sb = fit.standardErrors[jb];
      // With a zero or non-finite standard error the correlation is undefined
      // (exact data, or already reported by the finiteness check).
      if (!(sa > 0 && sb > 0 && Number.isFinite(sa) && Number.isFinite(sb))) {
        continue;
      }
      const rho = Math.abs(fit.correlation[ja]?.[jb]);
      if (!(rho <= VERDICT_THRESHOLDS.maxCorrelation)) {
        pairs.push(`${fit.parameters[ja]}–${fit.parameters[jb]}`);
      }
      if (Number.isNaN(rho)) {
        undefinedPair = true;
      } else {
        worst = Math.max(worst, rho);
      }
    }
  }
  if (undefinedPair) {
    worst = Number.NaN;
  }
  return pairs.length === 0
    ? {
        code: 'correlation',
        passed: true,
        message: msg(
          'verdict.correlation.passed',
          'No two free parameters are correlated beyond %1 (largest |correlation| %2).',
          num(VERDICT_THRESHOLDS.maxCorrelation, 4),
          num(worst, 4)
        ),
        value: worst
      }
    : {
        code: 'correlation',
        passed: false,
        message: msg(
          'verdict.correlation.failed',
          'Almost fully correlated: %1 (|correlation| up to %2). The data fix a combination of these parameters but not each one, so their values cannot be quoted; fix one of each pair or extend the data range.',
          pairs.join(', '),
          num(worst, 5)
        ),
        value: worst
      };
}

/**
 * Judges a fit: 'not-converged' when the optimiser did not reach a best fit
 * (no other check is made: they would judge a point that is not a minimum);
 * 'does-not-describe' when any check fails (the summary is the message of
 * the most important failed check); 'fits' when every check passes.
 *
 * No degrees of freedom (dof ≤ 0) gives 'does-not-describe': nothing tests
 * the model then, and the success style would claim a test passed. The
 * goodness-of-fit checks are skipped in that case; the parameter checks are
 * still made.
 *
 * Throws `CoreMessageError` when `x`, `y`, `sigma` do not hold one value per
 * fitted point, or the bounds one per parameter.
 */
export function judgeFit(fit: IFitResult, input: IVerdictInput): IVerdict {
  const n = fit.residuals.length;
  requireLength('x', input.x, n);
  requireLength('y', input.y, n);
  requireLength('σ', input.sigma, n);
  requireLength('lower bounds', input.lower, fit.parameters.length);
  requireLength('upper bounds', input.upper, fit.parameters.length);
  const free = freeIndices(fit);
  const hasSigma = input.sigma !== undefined;
  const chi2 = hasSigma ? weightedChi2(fit, input.sigma!) : fit.chi2;
  // The goodness-of-fit checks need degrees of freedom and finite residuals.
  const testable = fit.dof > 0 && Number.isFinite(chi2) && nonFiniteResiduals(fit) === 0;
  const pValue = hasSigma && testable ? chiSquareUpperTail(chi2, fit.dof) : null;

  const converged = convergedCheck(fit);
  if (!converged.passed) {
    return { state: 'not-converged', summary: converged.message, checks: [converged], pValue };
  }

  const checks: IVerdictCheck[] = [converged, dofCheck(fit, n, free.length), finiteCheck(fit, free, chi2)];
  if (input.curve !== undefined) {
    checks.push(curveCheck(input.curve));
  }
  let runs: IRunsTestResult | null = null;
  let reduced = Number.NaN;
  if (testable) {
    if (hasSigma) {
      reduced = chi2 / fit.dof;
      checks.push(chi2Check(reduced, fit.dof, pValue!));
      checks.push(sigmaScaleCheck(reduced, fit.dof, chiSquareLowerTail(chi2, fit.dof)));
    }
    runs = residualRunsTest(input.x, fit.residuals);
    checks.push(runsCheck(runs));
    if (!hasSigma) {
      checks.push(explainedCheck(fit, input.y));
    }
  }
  checks.push(boundsCheck(fit, free, input.lower, input.upper));
  checks.push(relativeErrorCheck(fit, free));
  checks.push(correlationCheck(fit, free));

  const failed = checks.find(c => !c.passed);
  if (failed !== undefined) {
    return { state: 'does-not-describe', summary: failed.message, checks, pValue };
  }
  // Every check passed, so the goodness-of-fit checks were made: `runs` is set.
  const r = runs!;
  const summary =
    pValue !== null
      ? msg(
          'verdict.summary.fits-sigma',
          'The model describes the data: χ²_red = %1 for %2 degrees of freedom (p = %3), no structure in the residuals, and every parameter is determined.',
          num(reduced, 3),
          count(fit.dof),
          num(pValue, 2)
        )
      : msg(
          'verdict.summary.fits',
          'The model describes the data: %1 runs of residual signs along x where about %2 are expected (z = %3), and every parameter is determined.',
          count(r.runs),
          num(r.expected, 3),
          num(r.z, 3)
        );
  return { state: 'fits', summary, checks, pValue };
}
