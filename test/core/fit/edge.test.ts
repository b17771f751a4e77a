/**
 * Edge inputs: precise `FitInputError`s at the boundary, flagged results
 * for model failures and degenerate problems, cancellation and limits.
 */
import { describe, expect, it } from 'vitest';
import { FitInputError, fitCurve } from '../../../src/core/fit/index';
import type { IFitModel } from '../../../src/core/fit/index';
import { messageText } from '../../../src/core/messages';
import { decay, line, linspace } from './models';

const x = linspace(0, 4, 20);
const y = x.map((v) => 2 * Math.exp(-0.8 * v) + 0.1 + 0.001 * Math.sin(7 * v));

function inputError(fn: () => unknown, code: string, pattern: RegExp): void {
  let caught: unknown = null;
  try {
    fn();
  } catch (err) {
    caught = err;
  }
  expect(caught).toBeInstanceOf(FitInputError);
  const error = caught as FitInputError;
  expect(error.name).toBe('FitInputError');
  expect(error.detail.code).toBe(code);
  expect(error.message).toBe(messageText(error.detail));
  expect(error.message).toMatch(pattern);
}

describe('boundary validation', () => {
  it('rejects NaN and ±∞ in the data with the offending index', () => {
    inputError(() => fitCurve(decay, { x, y: [...y.slice(0, 3), NaN, ...y.slice(4)] }, { start: [1, 1, 0] }), 'fit.data-not-finite', /^Value 4 of y is NaN: /);
    inputError(() => fitCurve(decay, { x: [Infinity, ...x.slice(1)], y }, { start: [1, 1, 0] }), 'fit.data-not-finite', /^Value 1 of x is ∞: /);
    inputError(() => fitCurve(decay, { x, y: [...y.slice(0, 19), -Infinity] }, { start: [1, 1, 0] }), 'fit.data-not-finite', /^Value 20 of y is −∞: /);
  });

  it('rejects empty data, mismatched lengths and too few points', () => {
    inputError(() => fitCurve(decay, { x: [], y: [] }, { start: [1, 1, 0] }), 'fit.empty-data', /no data points/);
    inputError(() => fitCurve(decay, { x, y: y.slice(1) }, { start: [1, 1, 0] }), 'fit.data-length', /^There are 19 values of y for 20 points/);
    inputError(() => fitCurve(decay, { x: [1, 2], y: [1, 2] }, { start: [1, 1, 0] }), 'fit.too-few-points', /^2 data points cannot determine 3 free parameters/);
  });

  it('rejects zero, negative or non-finite σ', () => {
    const sigma = x.map(() => 0.1);
    inputError(() => fitCurve(decay, { x, y, sigma: sigma.map((s, i) => (i === 5 ? 0 : s)) }, { start: [1, 1, 0] }), 'fit.sigma-not-positive', /σ of point 6 is 0:/);
    inputError(() => fitCurve(decay, { x, y, sigma: sigma.map((s, i) => (i === 2 ? -1 : s)) }, { start: [1, 1, 0] }), 'fit.sigma-not-positive', /σ of point 3 is −1:/);
    inputError(() => fitCurve(decay, { x, y, sigma: sigma.map((s, i) => (i === 1 ? NaN : s)) }, { start: [1, 1, 0] }), 'fit.sigma-not-positive', /σ of point 2 is NaN/);
  });

  it('rejects bad starts, bounds and options', () => {
    inputError(() => fitCurve(decay, { x, y }, { start: [1, 1] }), 'fit.start-length', /^There are 2 start values for 3 parameters \(a, b, c\)/);
    inputError(() => fitCurve(decay, { x, y }, { start: [1, NaN, 0] }), 'fit.start-not-finite', /^The start value of parameter 2 \(b\) is NaN/);
    inputError(() => fitCurve(decay, { x, y }, { start: [1, 1, 0], lower: [0, 2, 0] }), 'fit.start-outside-bounds', /^The start value of b \(1\) is outside the range it may take \(2 to ∞\)/);
    inputError(() => fitCurve(decay, { x, y }, { start: [1, 1, 0], lower: [2, 0, 0], upper: [1, 5, 5] }), 'fit.bounds-reversed', /^The lower bound of a \(2\) is above its upper bound \(1\)/);
    inputError(() => fitCurve(decay, { x, y }, { start: [1, 1, 0], fixed: [true, true, true] }), 'fit.all-fixed', /Every parameter is fixed/);
    inputError(() => fitCurve(decay, { x, y }, { start: [1, 1, 0], maxEvaluations: 0 }), 'fit.budget-invalid', /evaluation budget is 0/);
    inputError(() => fitCurve(decay, { x, y }, { start: [1, 1, 0], ftol: -1 }), 'fit.tolerance-invalid.chi2', /relative change of χ² is −1/);
    inputError(() => fitCurve(decay, { x, y }, { start: [1, 1, 0], confidenceLevel: 1 }), 'fit.confidence-level-invalid', /confidence level is 1:/);
  });

  it('shows a start value and a bound that differ only in late digits with enough digits to tell them apart', () => {
    const model: IFitModel = { parameters: ['theta'], evaluate: (p, xs, out) => out.fill(p[0]) };
    let caught: unknown = null;
    try {
      fitCurve(model, { x, y }, { start: [296.00000012], upper: [295.999999704] });
    } catch (err) {
      caught = err;
    }
    expect(caught).toBeInstanceOf(FitInputError);
    expect((caught as Error).message).toBe(
      'The start value of theta (296.0000001) is outside the range it may take (−∞ to 295.9999997): give a start value inside it.'
    );
  });
});

describe('flagged results, never a throw from inside', () => {
  it('flags a model that returns NaN at the start', () => {
    const nanModel: IFitModel = {
      parameters: ['a', 'b'],
      evaluate(p, xs, out) {
        for (let i = 0; i < xs.length; i++) {
          out[i] = p[0] * Math.sqrt(p[1] - 1);
        }
      }
    };
    const r = fitCurve(nanModel, { x, y }, { start: [1, 0] });
    expect(r.converged).toBe(false);
    expect(r.reason.code).toBe('fit.stop.not-finite-at-start');
    expect(r.values).toEqual([1, 0]);
  });

  it('flags a model that throws, with its message', () => {
    const throwing: IFitModel = {
      parameters: ['a'],
      evaluate() {
        throw new Error('boom');
      }
    };
    const r = fitCurve(throwing, { x, y }, { start: [1] });
    expect(r.converged).toBe(false);
    expect(r.reason.code).toBe('fit.stop.model-failed-at-start');
    expect(messageText(r.reason)).toMatch(/boom/);
  });

  it('backs off from a region where the model is NaN', () => {
    // y = sqrt(a)·x + c; a < 0 gives NaN, the data need a ≈ 0.04.
    const model: IFitModel = {
      parameters: ['a', 'c'],
      evaluate(p, xs, out) {
        for (let i = 0; i < xs.length; i++) {
          out[i] = Math.sqrt(p[0]) * xs[i] + p[1];
        }
      }
    };
    const data = { x, y: x.map((v) => 0.2 * v + 1) };
    const r = fitCurve(model, data, { start: [4, 0] });
    expect(r.converged).toBe(true);
    expect(r.values[0]).toBeCloseTo(0.04, 8);
  });

  it('does not claim convergence when all x are equal (degenerate)', () => {
    const same = x.map(() => 2);
    const r = fitCurve(decay, { x: same, y }, { start: [1, 1, 0] });
    expect(r.converged).toBe(false);
    expect(r.reason.code).toBe('fit.stop.degenerate');
    expect(r.warnings.map((w) => w.code)).toContain('fit.covariance-singular');
    // the stopping rule that was met is kept among the notes
    expect(r.notes[0].code).toMatch(/^fit\.stop\./);
    expect(r.standardErrors.every((s) => Number.isNaN(s))).toBe(true);
  });

  it('fits with a parameter fixed at a bound', () => {
    const r = fitCurve(decay, { x, y }, { start: [1, 1, 0], lower: [0, 0, 0], fixed: [false, false, true] });
    expect(r.values[2]).toBe(0);
    expect(r.converged).toBe(true);
    expect(r.warnings.some((w) => w.code === 'fit.at-bound')).toBe(false);
  });

  it('reports no degrees of freedom when points equal free parameters', () => {
    const r = fitCurve(line, { x: [0, 1], y: [1, 3] }, { start: [0, 0] });
    expect(r.values[0]).toBeCloseTo(2, 10);
    expect(r.values[1]).toBeCloseTo(1, 10);
    expect(r.dof).toBe(0);
    expect(r.warnings.map((w) => w.code)).toContain('fit.no-degrees-of-freedom');
  });

  it('handles duplicated x values', () => {
    const xd = [...x, ...x];
    const yd = [...y, ...y.map((v) => v + 0.01)];
    const r = fitCurve(decay, { x: xd, y: yd }, { start: [1, 1, 0] });
    expect(r.converged).toBe(true);
    expect(r.dof).toBe(37);
  });
});

describe('stopping', () => {
  it('stops on the evaluation limit without claiming convergence', () => {
    const r = fitCurve(decay, { x, y }, { start: [10, 5, 3], maxEvaluations: 5 });
    expect(r.converged).toBe(false);
    expect(r.reason.code).toBe('fit.stop.budget');
    expect(messageText(r.reason)).toBe('The evaluation budget (5 model evaluations) ran out before the fit settled.');
  });

  it('returns the best point so far when cancelled', () => {
    let calls = 0;
    const costs: number[] = [];
    const r = fitCurve(
      decay,
      { x, y },
      {
        start: [10, 5, 3],
        onProgress: (p) => costs.push(p.cost),
        shouldStop: () => ++calls > 4
      }
    );
    expect(r.converged).toBe(false);
    expect(r.reason.code).toBe('fit.stop.cancelled');
    const startCost = y.reduce((s, v, i) => s + (v - (10 * Math.exp(-5 * x[i]) + 3)) ** 2, 0);
    expect(r.chi2).toBeLessThan(startCost);
    expect(r.chi2).toBe(Math.min(...costs));
  });

  it('reports progress with non-decreasing evaluation counts', () => {
    const ev: number[] = [];
    fitCurve(decay, { x, y }, { start: [1, 1, 0], onProgress: (p) => ev.push(p.evaluations) });
    expect(ev.length).toBeGreaterThan(2);
    ev.slice(1).forEach((v, i) => expect(v).toBeGreaterThanOrEqual(ev[i]));
  });

  it('turns a throwing callback into a flagged result', () => {
    const r = fitCurve(decay, { x, y }, {
      start: [1, 1, 0],
      onProgress: () => {
        throw new Error('listener failed');
      }
    });
    expect(r.converged).toBe(false);
    expect(r.reason.code).toBe('fit.stop.callback-failed');
    expect(messageText(r.reason)).toMatch(/listener failed/);
  });
});
