/**
 * The verdict on a fit: each check on hand-made cases, the runs test against
 * hand-computed examples, edge inputs, and seeded Monte Carlo runs (correct
 * models must pass, wrong models must be caught).
 */
import { describe, expect, it } from 'vitest';
import { judgeFit, residualRunsTest, VERDICT_THRESHOLDS } from '../../../src/core/analysis/verdict';
import type { IVerdict, IVerdictInput } from '../../../src/core/analysis/verdict';
import { fitCurve } from '../../../src/core/fit/index';
import type { IFitModel, IFitResult } from '../../../src/core/fit/index';
import { CoreMessageError, messageText } from '../../../src/core/messages';
import { chiSquareUpperTail } from '../../../src/core/numeric/chi2';
import { fitPowerLaw } from '../../../src/core/physics/critical/index';
import { weissMagnetisation } from '../../../src/core/physics/weiss';
import { decay, line, linspace } from '../fit/models';
import { mulberry32, normalGenerator } from '../fit/prng';

function gaussian(seed: number): () => number {
  return normalGenerator(mulberry32(seed));
}

/** A straight line y = 2x + 1 with noise 0.1 on 30 points, fitted without σ: the base of the unit tests. */
function lineCase(seed = 7): { fit: IFitResult; input: IVerdictInput } {
  const g = gaussian(seed);
  const x = linspace(0, 10, 30);
  const y = x.map(v => 2 * v + 1 + 0.1 * g());
  const fit = fitCurve(line, { x, y }, { start: [1, 0] });
  return { fit, input: { x, y } };
}

function check(v: IVerdict, code: string) {
  const c = v.checks.find(k => k.code === code);
  expect(c, `check ${code}`).toBeDefined();
  return c!;
}

/** Every placeholder of every message is filled. */
function expectFilled(v: IVerdict): void {
  for (const m of [v.summary, ...v.checks.map(c => c.message)]) {
    expect(messageText(m)).not.toMatch(/%\d/);
  }
}

describe('residualRunsTest', () => {
  it('counts runs along increasing x, not in the order given', () => {
    // Signs by increasing x: + + + + − − − −; given in reverse x order.
    const x = [8, 7, 6, 5, 4, 3, 2, 1];
    const r = [-1, -2, -1, -3, 2, 1, 3, 1];
    const t = residualRunsTest(x, r);
    expect(t.runs).toBe(2);
    expect(t.positive).toBe(4);
    expect(t.negative).toBe(4);
    // Hand computation from the exact distribution (Swed & Eisenhart 1943,
    // Ann. Math. Stat. 14, 66): P(R = 2) = 2/C(8,4) = 2/70.
    expect(t.pValue).toBeCloseTo(2 / 70, 14);
    expect(t.exact).toBe(true);
    // Mean 1 + 2·4·4/8 = 5 (Wald & Wolfowitz 1940, Ann. Math. Stat. 11, 147).
    expect(t.expected).toBe(5);
  });

  it('matches the hand-computed exact lower tail for + + − − + + − −', () => {
    // n1 = n2 = 4, R = 4: P(R=2) = 2/70, P(R=3) = [C(3,1)C(3,0) + C(3,0)C(3,1)]/70 = 6/70,
    // P(R=4) = 2·C(3,1)C(3,1)/70 = 18/70, so P(R ≤ 4) = 26/70 (Swed & Eisenhart 1943, formula of their §2).
    const t = residualRunsTest([1, 2, 3, 4, 5, 6, 7, 8], [1, 1, -1, -1, 1, 1, -1, -1]);
    expect(t.runs).toBe(4);
    expect(t.pValue).toBeCloseTo(26 / 70, 14);
    // Variance 2·16·(32 − 8)/(64·7) = 12/7; z = (4 + 0.5 − 5)/√(12/7).
    expect(t.z).toBeCloseTo(-0.5 / Math.sqrt(12 / 7), 12);
  });

  it('exact distribution: alternating signs reach the largest number of runs, P(R ≤ max) = 1', () => {
    const x = Array.from({ length: 100 }, (_, i) => i);
    const t = residualRunsTest(x, x.map(i => (i % 2 === 0 ? 1 : -1)));
    expect(t.runs).toBe(100);
    expect(t.exact).toBe(true);
    expect(t.pValue).toBeCloseTo(1, 12);
  });

  it('leaves exact zeros out and uses the normal approximation above 1000 points', () => {
    // 600 positive and 600 negative residuals in 540 runs (270 of each sign:
    // 60 of length 3 and 210 of length 2), with zeros between that must not count.
    const signs: number[] = [];
    for (let k = 0; k < 270; k++) {
      const len = k < 60 ? 3 : 2;
      for (let i = 0; i < len; i++) {
        signs.push(1);
      }
      signs.push(0);
      for (let i = 0; i < len; i++) {
        signs.push(-1);
      }
    }
    const x = signs.map((_, i) => i);
    const t = residualRunsTest(x, signs);
    expect(t.positive).toBe(600);
    expect(t.negative).toBe(600);
    expect(t.runs).toBe(540);
    expect(t.exact).toBe(false);
    // By hand (Wald & Wolfowitz 1940): mean = 1 + 2·600·600/1200 = 601;
    // variance = 720000·718800/(1200²·1199) = 299.7498, sd = 17.3133;
    // z = (540 + 0.5 − 601)/17.3133 = −3.4944; Φ(−3.4944) ≈ 2.376e-4,
    // interpolated in the standard normal table (Abramowitz & Stegun 1964,
    // Table 26.1: Φ(−3.49) = 2.415e-4, Φ(−3.50) = 2.326e-4).
    expect(t.expected).toBe(601);
    expect(t.z).toBeCloseTo(-3.4944, 4);
    expect(t.pValue).toBeGreaterThan(2.36e-4);
    expect(t.pValue).toBeLessThan(2.39e-4);
  });

  it('one sign only: probability 2^(1−n) that n independent fair signs all agree (common practice, no source)', () => {
    const t = residualRunsTest([1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12], new Array(12).fill(0.3));
    expect(t.runs).toBe(1);
    expect(t.negative).toBe(0);
    expect(t.pValue).toBeCloseTo(Math.pow(2, -11), 15);
    expect(t.expected).toBe(6.5);
  });

  it('no residuals or only zeros: one certain outcome, p = 1', () => {
    expect(residualRunsTest([], []).pValue).toBe(1);
    const z = residualRunsTest([1, 2, 3], [0, 0, 0]);
    expect(z.runs).toBe(0);
    expect(z.pValue).toBe(1);
    expect(z.z).toBe(0);
  });
});

describe('judgeFit: single checks', () => {
  it('a good straight-line fit without σ fits, and every check passed', () => {
    const { fit, input } = lineCase();
    const v = judgeFit(fit, input);
    expect(v.state).toBe('fits');
    expect(v.pValue).toBeNull();
    expect(v.checks.every(c => c.passed)).toBe(true);
    expect(v.checks.map(c => c.code)).toEqual(['converged', 'dof', 'finite', 'runs', 'explained', 'bounds', 'relative-error', 'correlation']);
    expect(v.summary.code).toBe('verdict.summary.fits');
    expectFilled(v);
  });

  it('not converged: state not-converged, one check, plain message', () => {
    const { fit, input } = lineCase();
    const v = judgeFit({ ...fit, converged: false }, input);
    expect(v.state).toBe('not-converged');
    expect(v.checks).toHaveLength(1);
    expect(v.checks[0].passed).toBe(false);
    expect(messageText(v.summary)).toMatch(/did not converge/);
  });

  it('a parameter at a bound, or within 1e-6 relative of it, fails; 1e-5 away passes', () => {
    const { fit, input } = lineCase();
    const m = fit.values[0];
    const lowerAt = [m, -Infinity];
    const v = judgeFit(fit, { ...input, lower: lowerAt, upper: [Infinity, Infinity] });
    expect(v.state).toBe('does-not-describe');
    expect(check(v, 'bounds').passed).toBe(false);
    expect(v.summary.code).toBe('verdict.bounds.failed');
    expect(messageText(v.summary)).toContain('m');
    expect(judgeFit(fit, { ...input, upper: [m * (1 + 5e-7), Infinity] }).state).toBe('does-not-describe');
    const away = judgeFit(fit, { ...input, upper: [m * (1 + 1e-5), Infinity] });
    expect(check(away, 'bounds').passed).toBe(true);
    expect(away.state).toBe('fits');
    // A value beyond its bound counts too.
    expect(check(judgeFit(fit, { ...input, upper: [m * 0.9, Infinity] }), 'bounds').passed).toBe(false);
  });

  it('relative standard error above 100 % fails; 99 % passes; NaN counts as above', () => {
    const { fit, input } = lineCase();
    const se = (f: number) => [Math.abs(fit.values[0]) * f, fit.standardErrors[1]];
    const bad = judgeFit({ ...fit, standardErrors: se(1.01) }, input);
    expect(bad.state).toBe('does-not-describe');
    expect(bad.summary.code).toBe('verdict.relative-error.failed');
    expect(messageText(bad.summary)).toMatch(/^Not determined by the data: m /);
    expect(check(bad, 'relative-error').value).toBeCloseTo(1.01, 12);
    expect(check(judgeFit({ ...fit, standardErrors: se(0.99) }, input), 'relative-error').passed).toBe(true);
    const nan = judgeFit({ ...fit, standardErrors: [Number.NaN, fit.standardErrors[1]] }, input);
    expect(check(nan, 'relative-error').passed).toBe(false);
    expect(check(nan, 'finite').passed).toBe(false);
  });

  it('|correlation| 0.9995 between free parameters fails; 0.9985 passes', () => {
    const { fit, input } = lineCase();
    const corr = (r: number) => [
      [1, r],
      [r, 1]
    ];
    const bad = judgeFit({ ...fit, correlation: corr(-0.9995) }, input);
    expect(bad.state).toBe('does-not-describe');
    expect(bad.summary.code).toBe('verdict.correlation.failed');
    expect(messageText(bad.summary)).toContain('m–q');
    expect(check(bad, 'correlation').value).toBeCloseTo(0.9995, 12);
    const ok = judgeFit({ ...fit, correlation: corr(0.9985) }, input);
    expect(check(ok, 'correlation').passed).toBe(true);
    expect(ok.state).toBe('fits');
  });

  it('NaN values fail the finiteness check and name the parameter', () => {
    const { fit, input } = lineCase();
    const v = judgeFit({ ...fit, values: [fit.values[0], Number.NaN] }, input);
    expect(v.state).toBe('does-not-describe');
    expect(v.summary.code).toBe('verdict.finite.parameters');
    expect(messageText(v.summary)).toContain('q');
    const r = judgeFit({ ...fit, residuals: fit.residuals.map((x, i) => (i === 3 ? Number.NaN : x)) }, input);
    expect(r.summary.code).toBe('verdict.finite.residuals');
    expect(r.checks.find(c => c.code === 'runs')).toBeUndefined();
  });

  it('fixed parameters are skipped by every parameter check', () => {
    const { fit, input } = lineCase();
    // q fixed: zero standard error, value on its bound, no correlation.
    const fixedFit: IFitResult = {
      ...fit,
      fixed: [false, true],
      standardErrors: [fit.standardErrors[0], 0],
      correlation: [
        [1, 0],
        [0, 1]
      ]
    };
    const v = judgeFit(fixedFit, { ...input, lower: [-Infinity, fit.values[1]], upper: [Infinity, Infinity] });
    expect(check(v, 'bounds').passed).toBe(true);
    expect(check(v, 'relative-error').passed).toBe(true);
    // The same value unfixed is at its bound.
    expect(check(judgeFit(fit, { ...input, lower: [-Infinity, fit.values[1]] }), 'bounds').passed).toBe(false);
  });

  it('with correct σ the fit passes and pValue is the χ² upper tail', () => {
    const g = gaussian(21);
    const x = linspace(0, 10, 40);
    const y = x.map(v => 2 * v + 1 + 0.1 * g());
    const sigma = x.map(() => 0.1);
    const fit = fitCurve(line, { x, y, sigma }, { start: [1, 0] });
    const v = judgeFit(fit, { x, y, sigma });
    expect(v.state).toBe('fits');
    expect(v.pValue).toBeCloseTo(chiSquareUpperTail(fit.chi2, fit.dof), 14);
    expect(v.summary.code).toBe('verdict.summary.fits-sigma');
    expect(v.checks.map(c => c.code)).toEqual(['converged', 'dof', 'finite', 'chi2', 'sigma-scale', 'runs', 'bounds', 'relative-error', 'correlation']);
    expectFilled(v);
  });

  it('σ ten times too small: χ² test fails with χ²_red and p in the message', () => {
    const g = gaussian(22);
    const x = linspace(0, 10, 40);
    const y = x.map(v => 2 * v + 1 + 0.1 * g());
    const sigma = x.map(() => 0.01);
    const fit = fitCurve(line, { x, y, sigma }, { start: [1, 0] });
    const v = judgeFit(fit, { x, y, sigma });
    expect(v.state).toBe('does-not-describe');
    expect(v.summary.code).toBe('verdict.chi2.failed');
    expect(v.pValue!).toBeLessThan(1e-10);
    expect(v.summary.args).toContainEqual({ value: fit.reducedChi2, digits: 3 });
    expectFilled(v);
  });

  it('σ a hundred times too large: not the success state, and the message gives the factor', () => {
    const g = gaussian(23);
    const x = linspace(0, 10, 40);
    const y = x.map(v => 2 * v + 1 + 0.1 * g());
    const sigma = x.map(() => 10);
    const fit = fitCurve(line, { x, y, sigma }, { start: [1, 0] });
    const v = judgeFit(fit, { x, y, sigma });
    expect(v.state).toBe('does-not-describe');
    expect(v.summary.code).toBe('verdict.sigma-scale.failed');
    expect(check(v, 'chi2').passed).toBe(true);
    const factor = v.summary.args[3] as { value: number };
    expect(factor.value).toBeGreaterThan(70);
    expect(factor.value).toBeLessThan(140);
  });

  it('σ given but not used by the fit: χ² is formed from the residuals and σ', () => {
    const { fit, input } = lineCase();
    const sigma = Array.from(input.x, () => 0.1);
    const v = judgeFit(fit, { ...input, sigma });
    let chi2 = 0;
    for (const r of fit.residuals) {
      chi2 += (r / 0.1) ** 2;
    }
    expect(v.pValue).toBeCloseTo(chiSquareUpperTail(chi2, fit.dof), 14);
  });

  it('a model that explains less than half the variance fails without σ', () => {
    // y = 5 + 0.05 x + noise of σ = 1 on x in [0, 10]: the model is right, but its
    // trend (0.5 over the range) is buried in the noise; not a description of the data.
    const g = gaussian(31);
    const x = linspace(0, 10, 60);
    const y = x.map(v => 5 + 0.05 * v + g());
    const fit = fitCurve(line, { x, y }, { start: [0, 1] });
    const v = judgeFit(fit, { x, y });
    expect(v.state).toBe('does-not-describe');
    expect(check(v, 'explained').passed).toBe(false);
    expect(check(v, 'explained').value!).toBeLessThan(VERDICT_THRESHOLDS.minAdjustedR2);
  });
});

describe('judgeFit: edge inputs', () => {
  it('dof = 0: no test possible, never the success state; with σ the p-value is null', () => {
    const x = [1, 2];
    const y = [3, 5.5];
    const fit = fitCurve(line, { x, y }, { start: [1, 0] });
    expect(fit.dof).toBe(0);
    const v = judgeFit(fit, { x, y });
    expect(v.state).toBe('does-not-describe');
    expect(v.summary.code).toBe('verdict.dof.failed');
    expect(v.checks.find(c => c.code === 'runs')).toBeUndefined();
    const sigma = [0.1, 0.1];
    const s = judgeFit(fitCurve(line, { x, y, sigma }, { start: [1, 0] }), { x, y, sigma });
    expect(s.pValue).toBeNull();
    expect(s.state).toBe('does-not-describe');
    expectFilled(s);
  });

  it('one point', () => {
    const constant: IFitModel = {
      parameters: ['c'],
      evaluate(p, x, out) {
        out.fill(p[0]);
      }
    };
    const fit = fitCurve(constant, { x: [1], y: [2] }, { start: [1] });
    const v = judgeFit(fit, { x: [1], y: [2] });
    expect(v.state).not.toBe('fits');
    expectFilled(v);
  });

  it('empty residuals (a result with no points) gives a verdict, not an exception', () => {
    const { fit } = lineCase();
    const v = judgeFit({ ...fit, residuals: new Float64Array(0), dof: -2, chi2: 0, reducedChi2: Number.NaN }, { x: [], y: [] });
    expect(v.state).toBe('does-not-describe');
    expect(v.summary.code).toBe('verdict.dof.failed');
    expectFilled(v);
  });

  it('all-equal residuals: one sign everywhere fails, all zero (exact data) fits', () => {
    const { fit, input } = lineCase();
    const same = judgeFit({ ...fit, residuals: fit.residuals.map(() => 0.05) }, input);
    expect(same.state).toBe('does-not-describe');
    expect(same.summary.code).toBe('verdict.runs.one-sign');
    const zero = judgeFit({ ...fit, residuals: fit.residuals.map(() => 0), chi2: 0, reducedChi2: 0 }, input);
    expect(check(zero, 'runs').passed).toBe(true);
    expect(zero.state).toBe('fits');
    // Zero scatter against σ = 0.1 is implausible: σ far too large.
    const zs = judgeFit(
      { ...fit, residuals: fit.residuals.map(() => 0), chi2: 0, reducedChi2: 0, errorScaling: 'from-sigma' },
      { ...input, sigma: Array.from(input.x, () => 0.1) }
    );
    expect(zs.summary.code).toBe('verdict.sigma-scale.failed');
  });

  it('inputs of the wrong length are refused with a message', () => {
    const { fit, input } = lineCase();
    expect(() => judgeFit(fit, { x: input.x, y: [1, 2] })).toThrow(CoreMessageError);
    expect(() => judgeFit(fit, { ...input, lower: [0] })).toThrow(CoreMessageError);
  });
});

// ---------------------------------------------------------------------------
// Seeded Monte Carlo runs, 200 fits each.

const RUNS = 200;

/** Share of RUNS seeded cases whose verdict is `state`. */
function share(state: IVerdict['state'], make: (seed: number) => IVerdict): number {
  let hits = 0;
  for (let seed = 1; seed <= RUNS; seed++) {
    if (make(seed).state === state) {
      hits++;
    }
  }
  return hits / RUNS;
}

/** Bounds fitPowerLaw uses by default (Tc above the highest T, β in [1e-3, 5]). */
function powerLawBounds(T: number[]): { lower: number[]; upper: number[] } {
  const Tmax = Math.max(...T);
  return { lower: [-Infinity, Tmax * (1 + 1e-12) + 1e-300, 1e-3], upper: [Infinity, Infinity, 5] };
}

/** Critical power law y = A(1 − T/Tc)^β, A = 1.2, Tc = 300 K, β = 0.35, over 200–298 K, noise σ = 0.004. */
function powerLawCase(seed: number, withSigma: boolean): IVerdict {
  const g = gaussian(1000 + seed);
  const T = linspace(200, 298, 80);
  const y = T.map(t => 1.2 * Math.pow(1 - t / 300, 0.35) + 0.004 * g());
  const sigma = withSigma ? T.map(() => 0.004) : undefined;
  const fit = fitPowerLaw({ T, y, sigma }, { start: { A: 1, Tc: 305, beta: 0.4 } });
  return judgeFit(fit, { x: T, y, sigma, ...powerLawBounds(T) });
}

/** Exponential decay y = 2 e^(−0.5 x) + 0.3 on 0…10, noise σ = 0.01. */
function decayData(seed: number): { x: number[]; y: number[] } {
  const g = gaussian(2000 + seed);
  const x = linspace(0, 10, 50);
  return { x, y: x.map(v => 2 * Math.exp(-0.5 * v) + 0.3 + 0.01 * g()) };
}

/** The decay data fitted through fitCurve, with or without σ. */
function decayCase(seed: number, withSigma: boolean): IVerdict {
  const { x, y } = decayData(seed);
  const sigma = withSigma ? x.map(() => 0.01) : undefined;
  const fit = fitCurve(decay, { x, y, sigma }, { start: [1, 1, 0] });
  return judgeFit(fit, { x, y, sigma });
}

/** x and residuals of the decay fit without σ, for the runs test alone. */
function decayResiduals(seed: number): [number[], number[]] {
  const { x, y } = decayData(seed);
  return [x, Array.from(fitCurve(decay, { x, y }, { start: [1, 1, 0] }).residuals)];
}

/**
 * Spin-½ Weiss mean-field magnetisation M = Ms m(T/Tc) (REFERENCE B1;
 * Weiss 1907, J. Phys. Théor. Appl. 6, 661), Ms = 1, Tc = 100 K, over
 * 10–99 K with noise 0.003, fitted by a pure power law over the whole
 * ordered range: exponentially flat at low T, so no A(1 − T/Tc)^β follows it.
 */
function weissCase(seed: number, withSigma: boolean): IVerdict {
  const g = gaussian(3000 + seed);
  const T = linspace(10, 99, 90);
  const m = weissMagnetisation(0.5, T.map(t => t / 100));
  const y = T.map((_, i) => m[i] + 0.003 * g());
  const sigma = withSigma ? T.map(() => 0.003) : undefined;
  const fit = fitPowerLaw({ T, y, sigma }, { start: { A: 1, Tc: 101, beta: 0.4 } });
  return judgeFit(fit, { x: T, y, sigma, ...powerLawBounds(T) });
}

/** A straight line through a parabola y = x² on 0…1 (40 points, noise 0.02). */
function parabolaCase(seed: number, withSigma: boolean): IVerdict {
  const g = gaussian(4000 + seed);
  const x = linspace(0, 1, 40);
  const y = x.map(v => v * v + 0.02 * g());
  const sigma = withSigma ? x.map(() => 0.02) : undefined;
  const fit = fitCurve(line, { x, y, sigma }, { start: [1, 0] });
  return judgeFit(fit, { x, y, sigma });
}

describe('judgeFit: verdicts over seeded fits', () => {
  it('well-specified fits WITH σ: "fits" in 97–100 % (power law via fitPowerLaw, decay via fitCurve)', () => {
    const power = share('fits', s => powerLawCase(s, true));
    const dec = share('fits', s => decayCase(s, true));
    expect(power).toBeGreaterThanOrEqual(0.97);
    expect(dec).toBeGreaterThanOrEqual(0.97);
  });

  it('well-specified fits WITHOUT σ: "fits" in ≥ 97 %', () => {
    const power = share('fits', s => powerLawCase(s, false));
    const dec = share('fits', s => decayCase(s, false));
    expect(power).toBeGreaterThanOrEqual(0.97);
    expect(dec).toBeGreaterThanOrEqual(0.97);
  });

  it('the tests are calibrated: for correct models about 5 % of p-values fall below 0.05', () => {
    // Under a correct model the χ² p-value is uniform on (0, 1) (Pearson 1900,
    // Phil. Mag. 50, 157; for fitted parameters Fisher 1924, J. R. Stat. Soc.
    // 87, 442), so 200 fits put 10 ± 3 below 0.05; 3–20 is a > 99 % binomial
    // range. The same holds roughly (discrete) for the runs test's p-value.
    let chi2Low = 0;
    let runsLow = 0;
    for (let seed = 1; seed <= RUNS; seed++) {
      const withSigma = decayCase(seed, true);
      if (withSigma.pValue! < 0.05) {
        chi2Low++;
      }
      const runs = residualRunsTest(...decayResiduals(seed));
      if (runs.pValue < 0.05) {
        runsLow++;
      }
    }
    expect(chi2Low).toBeGreaterThanOrEqual(3);
    expect(chi2Low).toBeLessThanOrEqual(20);
    expect(runsLow).toBeGreaterThanOrEqual(3);
    expect(runsLow).toBeLessThanOrEqual(20);
  });

  it('mean-field data fitted by a pure power law over 0.1–0.99 Tc: "does-not-describe" in ≥ 95 %, with and without σ', () => {
    expect(share('does-not-describe', s => weissCase(s, true))).toBeGreaterThanOrEqual(0.95);
    expect(share('does-not-describe', s => weissCase(s, false))).toBeGreaterThanOrEqual(0.95);
  });

  it('a straight line through a parabola: "does-not-describe" in ≥ 95 %, with and without σ', () => {
    expect(share('does-not-describe', s => parabolaCase(s, true))).toBeGreaterThanOrEqual(0.95);
    expect(share('does-not-describe', s => parabolaCase(s, false))).toBeGreaterThanOrEqual(0.95);
  });
});
