/**
 * Edge inputs: precise `FitInputError`s at the boundary, flagged results
 * for model failures and degenerate problems, cancellation and limits.
 */
import { describe, expect, it } from 'vitest';
import { FitInputError, fitCurve } from '../../../src/core/fit/index';
import type { IFitModel } from '../../../src/core/fit/index';
import { decay, line, linspace } from './models';

const x = linspace(0, 4, 20);
const y = x.map((v) => 2 * Math.exp(-0.8 * v) + 0.1 + 0.001 * Math.sin(7 * v));

function inputError(fn: () => unknown, pattern: RegExp): void {
  let caught: unknown = null;
  try {
    fn();
  } catch (err) {
    caught = err;
  }
  expect(caught).toBeInstanceOf(FitInputError);
  expect((caught as Error).message).toMatch(pattern);
}

describe('boundary validation', () => {
  it('rejects NaN and ±∞ in the data with the offending index', () => {
    inputError(() => fitCurve(decay, { x, y: [...y.slice(0, 3), NaN, ...y.slice(4)] }, { start: [1, 1, 0] }), /data\.y\[3\] is NaN/);
    inputError(() => fitCurve(decay, { x: [Infinity, ...x.slice(1)], y }, { start: [1, 1, 0] }), /data\.x\[0\] is Infinity/);
    inputError(() => fitCurve(decay, { x, y: [...y.slice(0, 19), -Infinity] }, { start: [1, 1, 0] }), /data\.y\[19\]/);
  });

  it('rejects empty data, mismatched lengths and too few points', () => {
    inputError(() => fitCurve(decay, { x: [], y: [] }, { start: [1, 1, 0] }), /empty/);
    inputError(() => fitCurve(decay, { x, y: y.slice(1) }, { start: [1, 1, 0] }), /data\.y has length 19, expected 20/);
    inputError(() => fitCurve(decay, { x: [1, 2], y: [1, 2] }, { start: [1, 1, 0] }), /2 data points cannot determine 3 free parameters/);
  });

  it('rejects zero, negative or non-finite σ', () => {
    const sigma = x.map(() => 0.1);
    inputError(() => fitCurve(decay, { x, y, sigma: sigma.map((s, i) => (i === 5 ? 0 : s)) }, { start: [1, 1, 0] }), /sigma\[5\] is 0/);
    inputError(() => fitCurve(decay, { x, y, sigma: sigma.map((s, i) => (i === 2 ? -1 : s)) }, { start: [1, 1, 0] }), /sigma\[2\] is -1/);
    inputError(() => fitCurve(decay, { x, y, sigma: sigma.map((s, i) => (i === 1 ? NaN : s)) }, { start: [1, 1, 0] }), /sigma\[1\]/);
  });

  it('rejects bad starts, bounds and options', () => {
    inputError(() => fitCurve(decay, { x, y }, { start: [1, 1] }), /options\.start has length 2, expected 3/);
    inputError(() => fitCurve(decay, { x, y }, { start: [1, NaN, 0] }), /options\.start\[1\] is NaN/);
    inputError(() => fitCurve(decay, { x, y }, { start: [1, 1, 0], lower: [0, 2, 0] }), /start value of b \(1\) lies outside its bounds/);
    inputError(() => fitCurve(decay, { x, y }, { start: [1, 1, 0], lower: [2, 0, 0], upper: [1, 5, 5] }), /lower bound of a/);
    inputError(() => fitCurve(decay, { x, y }, { start: [1, 1, 0], fixed: [true, true, true] }), /all parameters are fixed/);
    inputError(() => fitCurve(decay, { x, y }, { start: [1, 1, 0], maxEvaluations: 0 }), /maxEvaluations/);
    inputError(() => fitCurve(decay, { x, y }, { start: [1, 1, 0], ftol: -1 }), /ftol/);
    inputError(() => fitCurve(decay, { x, y }, { start: [1, 1, 0], confidenceLevel: 1 }), /confidenceLevel/);
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
    expect(r.reason).toMatch(/non-finite residuals at the start values/);
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
    expect(r.reason).toMatch(/boom/);
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
    expect(r.reason).toMatch(/degenerate/);
    expect(r.warnings.join(' ')).toMatch(/covariance is singular/);
    expect(r.standardErrors.every((s) => Number.isNaN(s))).toBe(true);
  });

  it('fits with a parameter fixed at a bound', () => {
    const r = fitCurve(decay, { x, y }, { start: [1, 1, 0], lower: [0, 0, 0], fixed: [false, false, true] });
    expect(r.values[2]).toBe(0);
    expect(r.converged).toBe(true);
    expect(r.warnings.some((w) => w.includes('at a bound'))).toBe(false);
  });

  it('reports no degrees of freedom when points equal free parameters', () => {
    const r = fitCurve(line, { x: [0, 1], y: [1, 3] }, { start: [0, 0] });
    expect(r.values[0]).toBeCloseTo(2, 10);
    expect(r.values[1]).toBeCloseTo(1, 10);
    expect(r.dof).toBe(0);
    expect(r.warnings.join(' ')).toMatch(/no degrees of freedom/);
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
    expect(r.reason).toMatch(/maximum number of evaluations \(5\)/);
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
    expect(r.reason).toBe('cancelled');
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
    expect(r.reason).toMatch(/listener failed/);
  });
});
