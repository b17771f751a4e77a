/**
 * Models with `evaluateWithJacobian` (values and Jacobian in one pass) and
 * the large-problem path (n above FIT_DEFAULTS.largeRows: JᵀJ formed in one
 * pass, stopping rule 1b). Truth values of the synthetic data are chosen
 * here (common practice, no source).
 */
import { describe, expect, it } from 'vitest';
import { messageText } from '../../../src/core/messages';
import { FIT_DEFAULTS, fitCurve } from '../../../src/core/fit/index';
import type { IFitModel } from '../../../src/core/fit/index';
import { decay, expectStationary, linspace } from './models';
import { mulberry32, normalGenerator } from './prng';

/** `decay` with a combined pass that counts its calls. */
function combinedDecay(): IFitModel & { calls: { combined: number } } {
  const calls = { combined: 0 };
  return {
    calls,
    parameters: decay.parameters,
    evaluate: decay.evaluate,
    jacobian: decay.jacobian,
    evaluateWithJacobian(p, x, out, jac) {
      calls.combined++;
      for (let i = 0; i < x.length; i++) {
        const e = Math.exp(-p[1] * x[i]);
        out[i] = p[0] * e + p[2];
        jac[i * 3] = e;
        jac[i * 3 + 1] = -p[0] * x[i] * e;
        jac[i * 3 + 2] = 1;
      }
    }
  };
}

function decayData(n: number, seed: number): { x: Float64Array; y: Float64Array } {
  const x = Float64Array.from(linspace(0, 5, n));
  const g = normalGenerator(mulberry32(seed));
  return { x, y: x.map((v) => 1.5 * Math.exp(-0.6 * v) + 0.2 + 0.02 * g()) };
}

describe('combined value-and-Jacobian pass', () => {
  it('gives the fit of separate evaluate/jacobian calls and is used at trial points', () => {
    const { x, y } = decayData(200, 11);
    const separate = fitCurve(decay, { x, y }, { start: [1, 1, 0] });
    const model = combinedDecay();
    const joint = fitCurve(model, { x, y }, { start: [1, 1, 0] });
    expect(joint.converged).toBe(true);
    expect(model.calls.combined).toBeGreaterThan(1);
    for (let j = 0; j < 3; j++) {
      expect(Math.abs(joint.values[j] - separate.values[j])).toBeLessThan(1e-10 * separate.standardErrors[j]);
      expect(joint.standardErrors[j]).toBeCloseTo(separate.standardErrors[j], 12);
    }
    expect(joint.chi2).toBeCloseTo(separate.chi2, 14);
  });

  it.each([100, FIT_DEFAULTS.largeRows + 1000])('falls back to the separate Jacobian when the combined one is not finite (n = %i)', (n) => {
    const { x, y } = decayData(n, 12);
    const model: IFitModel = {
      ...decay,
      evaluateWithJacobian(p, xs, out, jac) {
        decay.evaluate(p, xs, out);
        jac.fill(Number.NaN);
      }
    };
    const r = fitCurve(model, { x, y }, { start: [1, 1, 0] });
    const reference = fitCurve(decay, { x, y }, { start: [1, 1, 0] });
    expect(r.converged).toBe(true);
    r.values.forEach((v, j) => expect(v).toBeCloseTo(reference.values[j], 9));
  });

  it('reports a combined pass that throws as a model failure, keeping the start point', () => {
    const { x, y } = decayData(50, 13);
    const model: IFitModel = {
      ...decay,
      evaluateWithJacobian() {
        throw new Error('combined pass failed');
      }
    };
    const r = fitCurve(model, { x, y }, { start: [1, 1, 0] });
    expect(r.converged).toBe(false);
    expect(messageText(r.reason)).toMatch(/combined pass failed/);
  });
});

describe(`large problems (n > largeRows = ${FIT_DEFAULTS.largeRows})`, () => {
  const n = FIT_DEFAULTS.largeRows + 5000;
  const { x, y } = decayData(n, 21);

  it('recover the parameters within their standard errors, with and without the combined pass', () => {
    const model = combinedDecay();
    for (const m of [decay, model]) {
      const r = fitCurve(m, { x, y }, { start: [1, 1, 0] });
      expect(r.converged, messageText(r.reason)).toBe(true);
      [1.5, 0.6, 0.2].forEach((truth, j) => expect(Math.abs(r.values[j] - truth)).toBeLessThan(4 * r.standardErrors[j]));
      expect(r.residuals.length).toBe(n);
    }
    expect(model.calls.combined).toBeGreaterThan(1);
  });

  it('stop at a stationary point: gradient cosines far below the noise-free scale', () => {
    const r = fitCurve(combinedDecay(), { x, y }, { start: [1, 1, 0] });
    const p = Float64Array.from(r.values);
    const jac = new Float64Array(n * 3);
    decay.jacobian!(p, x, jac);
    expectStationary(jac, r.residuals, n, 3, 1e-8);
  });
});
