/**
 * Degenerate inputs through the panel's path (`runAnalysisJob`): flat y,
 * x that takes (nearly) one value, columns beyond what binary64 can square,
 * and curves that are not finite where they are drawn. Each is refused
 * before fitting with a message saying what to change, or flagged by the
 * verdict; none may come back as 'fits'.
 */
import { describe, expect, it } from 'vitest';
import { ANALYSIS_KINDS, AnalysisInputError, runAnalysisJob } from '../../../src/core/analysis';
import type { IAnalysisJob, IAnalysisOutcome } from '../../../src/core/analysis';
import { FLAT_Y, VALUE_LIMITS, distinctCount, yVariation } from '../../../src/core/analysis/kinds/common';
import { judgeFit } from '../../../src/core/analysis/verdict';
import { fitCurve } from '../../../src/core/fit';
import { FitInputError } from '../../../src/core/fit/types';
import type { IFitModel } from '../../../src/core/fit/types';
import { CoreMessageError, messageText } from '../../../src/core/messages';
import type { ICoreMessage } from '../../../src/core/messages';
import { weissMagnetisation } from '../../../src/core/physics/weiss';
import { normal } from '../physics/prng';

/** The message of the error `run` throws (fails the test when it returns). */
function refusal(run: () => unknown): ICoreMessage {
  let outcome: unknown;
  try {
    outcome = run();
  } catch (e) {
    expect(e).toBeInstanceOf(CoreMessageError);
    return (e as CoreMessageError).detail;
  }
  const o = outcome as IAnalysisOutcome;
  throw new Error(`expected a refusal, got a fit with verdict '${o?.verdict?.state}': ${o?.verdict ? messageText(o.verdict.summary) : ''}`);
}

function job(kind: string, x: number[], y: number[], options: IAnalysisJob['options'] = {}, sigma?: number[]): IAnalysisJob {
  return { kind, x, y, sigma, window: { min: -Infinity, max: Infinity }, options };
}

/** T from 20 to 300 K. */
function temperatures(n: number): number[] {
  return Array.from({ length: n }, (_, i) => 20 + (280 * i) / (n - 1));
}

/** Options that make every kind of the catalogue run (the expression kind needs a model). */
function optionsFor(kind: string): IAnalysisJob['options'] {
  return kind === 'expression' ? { expression: 'a + b*x' } : {};
}

describe('flat y: no transition to fit', () => {
  it('refuses a Weiss fit to a constant with tiny noise, before fitting, saying why', () => {
    // Before: the fit "converged" to a Tc of thousands of K far above the data.
    const rnd = normal(1);
    const T = temperatures(100);
    const M = T.map(() => 5 + 1e-3 * rnd());
    for (const J of [0.5, 3.5, Infinity]) {
      const m = refusal(() => runAnalysisJob(job('weiss', T, M, { J })));
      expect(m.code).toBe('analysis.flat-y');
      expect(m.args[2]).toBe(100);
      expect(messageText(m)).toMatch(/hardly changes over the fit window.*no transition to fit/);
    }
  });

  it("refuses a flat Weiss M(T) with σ, which was 'fits' with Tc = 1319 ± 293 K from data between 20 and 300 K", () => {
    const rnd = normal(3);
    const T = temperatures(50);
    const M = T.map(() => 1 + 1e-3 * rnd());
    const sigma = T.map(() => 1e-3);
    expect(refusal(() => runAnalysisJob(job('weiss', T, M, { J: 0.5 }, sigma))).code).toBe('analysis.flat-y');
  });

  it('refuses an exactly constant y with the constant-y message, for every transition kind', () => {
    const T = temperatures(40);
    const y = T.map(() => 2.5);
    for (const kind of ['weiss', 'power-law', 'power-law-corrected', 'landau']) {
      const m = refusal(() => runAnalysisJob(job(kind, T, y)));
      expect(m.code, kind).toBe('analysis.constant-y');
      expect(messageText(m)).toMatch(/40 points differ by at most 0 at a level of 2\.5/);
    }
    const chi = refusal(() => runAnalysisJob(job('curie-weiss', T.map(t => t + 100), y)));
    expect(chi.code).toBe('analysis.constant-y.curie-weiss');
  });

  it('refuses a flat power law and a flat susceptibility', () => {
    const rnd = normal(3);
    const T = Array.from({ length: 60 }, (_, i) => 200 + i);
    const y = T.map(() => 0.7 + 0.01 * rnd());
    expect(refusal(() => runAnalysisJob(job('power-law', T, y))).code).toBe('analysis.flat-y');
    expect(refusal(() => runAnalysisJob(job('curie-weiss', T, y))).code).toBe('analysis.flat-y.curie-weiss');
  });

  it('still fits a weak but real transition (amplitude 10 σ) and noise-free data', () => {
    const rnd = normal(4);
    const T = temperatures(120);
    const m = weissMagnetisation(0.5, T.map(t => t / 250));
    const weak = runAnalysisJob(job('weiss', T, Array.from(m, v => 0.1 * v + 0.01 * rnd()), { J: 0.5 }));
    expect(weak.fit.converged).toBe(true);
    expect(Math.abs(weak.derived.find(d => d.name === 'Tc')!.value - 250)).toBeLessThan(25);
    const clean = runAnalysisJob(job('weiss', T, Array.from(m, v => 3 * v), { J: 0.5 }));
    expect(clean.derived.find(d => d.name === 'Tc')!.value).toBeCloseTo(250, 3);
    // Five noise-free points on a straight line are not flat: no scatter at all.
    const line = yVariation([1, 2, 3, 4, 5], [1, 2, 3, 4, 5]);
    expect(line.scatter).toBe(0);
    expect(line.pValue).toBe(0);
    expect(FLAT_Y.scatterP).toBeGreaterThan(0);
  });
});

describe('x taking (nearly) one value', () => {
  it('refuses a Landau fit when every T is the same (it reported zero residual and every parameter ± 0)', () => {
    const rnd = normal(5);
    const T = Array.from({ length: 30 }, () => 100);
    const psi = T.map((_, i) => 1 + 0.02 * i + 0.001 * rnd());
    const m = refusal(() => runAnalysisJob(job('landau', T, psi)));
    expect(m.code).toBe('analysis.x-constant');
    expect(messageText(m)).toBe('All 30 points in the fit window have the same x (100): no curve against x can be fitted. Widen the window or choose another x column.');
  });

  it('refuses all-equal x for every kind of the catalogue, through the common check', () => {
    const x = Array.from({ length: 20 }, () => 150);
    const y = x.map((_, i) => 1 + 0.1 * i);
    for (const kind of ANALYSIS_KINDS) {
      const m = refusal(() => runAnalysisJob(job(kind.id, x, y, optionsFor(kind.id))));
      expect(m.code, kind.id).toBe('analysis.x-constant');
    }
  });

  it('counts x equal to rounding (relative 1e-15) as one value', () => {
    const x = Array.from({ length: 20 }, (_, i) => 100 * (1 + (i % 3) * 1e-15));
    expect(distinctCount(x)).toBe(1);
    const y = x.map((_, i) => 1 + 0.1 * i);
    expect(refusal(() => runAnalysisJob(job('landau', x, y))).code).toBe('analysis.x-constant');
    // A clock in seconds since 1970 still resolves one second.
    expect(distinctCount([1.7e9, 1.7e9 + 1, 1.7e9 + 2])).toBe(3);
  });

  it('refuses fewer distinct x than free parameters + 1, with the counts', () => {
    const x = Array.from({ length: 12 }, (_, i) => (i % 3) * 10 + 200);
    const y = x.map((v, i) => 2 - 0.001 * v + 0.01 * (i % 2));
    const m = refusal(() => runAnalysisJob(job('expression', x, y, { expression: 'a + b*x + c*x^2 + d*x^3' })));
    expect(m.code).toBe('analysis.too-few-distinct-x');
    expect(m.args).toEqual([12, 3, 4, 5]);
    // Weiss has 2 free parameters: 3 distinct temperatures are enough to be tried.
    const T = Array.from({ length: 12 }, (_, i) => [100, 200, 300][i % 3]);
    const M = T.map(t => (t < 250 ? 1 - t / 400 : 0.05));
    expect(() => runAnalysisJob(job('weiss', T, M, { J: 0.5 }))).not.toThrow();
    const two = T.map(t => Math.min(t, 200));
    expect(refusal(() => runAnalysisJob(job('weiss', two, M, { J: 0.5 }))).args).toEqual([12, 2, 2, 3]);
  });
});

describe('columns beyond what binary64 can square', () => {
  const x = Array.from({ length: 61 }, (_, i) => Math.pow(10, -300 + 10 * i));

  it('refuses x from 1e-300 to 1e300 for every kind, saying to rescale', () => {
    // Before: "converged" with χ²_red ≈ 1e229 or 1e246 and a curve of NaN.
    const y = x.map(v => Math.sqrt(v));
    for (const kind of ANALYSIS_KINDS) {
      const m = refusal(() => runAnalysisJob(job(kind.id, x, y, kind.id === 'expression' ? { expression: 'a*x^b' } : {})));
      expect(m.code, kind.id).toBe('analysis.column-too-large');
      expect(messageText(m)).toBe('The x column reaches 1e300 in the fit window; beyond ±1e150 the squares the fit sums overflow. Rescale the column (e.g. change its unit) before fitting.');
    }
  });

  it('refuses a y or σ column beyond the limits, and a column whose largest value is tiny', () => {
    const T = temperatures(30);
    const big = T.map(t => 1e200 * (1 - t / 400));
    expect(refusal(() => runAnalysisJob(job('weiss', T, big, { J: 0.5 })))).toMatchObject({ code: 'analysis.column-too-large', args: ['y', 9.5e199, VALUE_LIMITS.largest] });
    const tiny = T.map(t => 1e-200 * (1 - t / 400));
    expect(refusal(() => runAnalysisJob(job('power-law', T, tiny))).code).toBe('analysis.column-too-small');
    const y = T.map(t => 1 - t / 400);
    expect(refusal(() => runAnalysisJob(job('expression', T, y, { expression: 'a + b*x' }, T.map(() => 1e-160)))).args[0]).toBe('σ');
  });

  it('the engine itself refuses y/σ whose squares overflow', () => {
    const line: IFitModel = {
      parameters: ['a'],
      evaluate: (p, xs, out) => {
        for (let i = 0; i < xs.length; i++) {
          out[i] = p[0];
        }
      }
    };
    const grab = (run: () => unknown): ICoreMessage => {
      try {
        run();
      } catch (e) {
        expect(e).toBeInstanceOf(FitInputError);
        return (e as FitInputError).detail;
      }
      throw new Error('expected a FitInputError');
    };
    expect(grab(() => fitCurve(line, { x: [1, 2, 3], y: [1, 2e155, 3] }, { start: [1] })).code).toBe('fit.y-too-large');
    expect(grab(() => fitCurve(line, { x: [1, 2, 3], y: [1, 2, 3], sigma: [1, 1e-152, 1] }, { start: [1] })).code).toBe('fit.y-too-large-for-sigma');
    expect(fitCurve(line, { x: [1, 2, 3], y: [1e149, 2e149, 3e149] }, { start: [1e149] }).values[0]).toBeCloseTo(2e149, -136);
  });
});

describe('a curve that is not finite where it is drawn', () => {
  // Finite at every integer x (cos 2πx = 1 there), NaN between them: the
  // residuals at the data are fine, the drawn curve is mostly NaN.
  const x = Array.from({ length: 30 }, (_, i) => i);
  const rnd = normal(6);
  const y = x.map(v => 1 + 2 * v + 0.1 * rnd());
  const expression = 'a + b*x + 1e-9*sqrt(cos(2*pi*x))';

  it("is never 'fits': the verdict fails its 'curve-not-finite' check", () => {
    const out = runAnalysisJob(job('expression', x, y, { expression }));
    expect(out.fit.converged).toBe(true);
    expect(out.curve.y.some(v => !Number.isFinite(v))).toBe(true);
    expect(out.verdict.state).toBe('does-not-describe');
    const check = out.verdict.checks.find(c => c.code === 'curve-not-finite')!;
    expect(check.passed).toBe(false);
    expect(out.verdict.summary).toEqual(check.message);
    expect(messageText(check.message)).toMatch(/^The fitted model gives no finite value at \d+ of the 300 points where its curve is drawn across the window/);
  });

  it('passes for a finite curve, and judgeFit without a curve makes no such check', () => {
    const out = runAnalysisJob(job('expression', x, y, { expression: 'a + b*x' }));
    expect(out.verdict.state).toBe('fits');
    expect(out.verdict.checks.find(c => c.code === 'curve-not-finite')!.passed).toBe(true);
    const plain = judgeFit(out.fit, { x, y });
    expect(plain.checks.find(c => c.code === 'curve-not-finite')).toBeUndefined();
    expect(judgeFit(out.fit, { x, y, curve: [1, Infinity] }).state).toBe('does-not-describe');
  });

  it('flags a χ² that overflows although every residual is finite', () => {
    const out = runAnalysisJob(job('expression', x, y, { expression: 'a + b*x' }));
    const v = judgeFit({ ...out.fit, chi2: Infinity }, { x, y });
    expect(v.state).toBe('does-not-describe');
    expect(v.summary.code).toBe('verdict.finite.chi2');
  });
});

describe('refusals are analysis input errors', () => {
  it('with a code and a short English sentence', () => {
    const T = temperatures(20);
    const e = (() => {
      try {
        runAnalysisJob(job('weiss', T, T.map(() => 1), { J: 0.5 }));
      } catch (err) {
        return err;
      }
      return null;
    })();
    expect(e).toBeInstanceOf(AnalysisInputError);
    expect((e as AnalysisInputError).message.length).toBeLessThan(300);
  });
});
