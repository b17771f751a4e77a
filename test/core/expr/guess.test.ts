/**
 * guessStarts: start values from the data for parameters without one, good
 * enough for the fit to reach the truth where starting every parameter at
 * 1 stalls; deterministic and of bounded cost; a model that gives no number
 * at any tried value is reported in our words.
 */
import { describe, expect, it } from 'vitest';
import { GUESS_EVALUATIONS, GUESS_POINTS, guessStarts, parseExpressionModel } from '../../../src/core/expr/index';
import { fitCurve } from '../../../src/core/fit/index';
import type { IFitModel } from '../../../src/core/fit/index';
import { messageText } from '../../../src/core/messages';

/** Deterministic noise in [−amplitude/2, amplitude/2] (Park–Miller generator). */
function noise(n: number, amplitude: number, seed = 11): number[] {
  let s = seed;
  return Array.from({ length: n }, () => {
    s = (s * 16807) % 2147483647;
    return (s / 2147483647 - 0.5) * amplitude;
  });
}

function fitFromGuess(text: string, x: number[], y: number[], given: Record<string, number> = {}) {
  const model = parseExpressionModel(text);
  const guess = guessStarts(model, x, y, given);
  expect(guess.problems).toEqual([]);
  return { model, guess, fit: fitCurve(model, { x, y }, { start: guess.start }) };
}

describe('guessStarts', () => {
  it('A*exp(-x/T0) + c: the fit converges from the guesses to the truth', () => {
    const x = Array.from({ length: 61 }, (_, i) => i * 5);
    const y = x.map((v) => 3 * Math.exp(-v / 50) + 0.2);
    const { guess, fit } = fitFromGuess('A*exp(-x/T0) + c', x, y);
    expect(guess.guessed).toEqual(['A', 'T0', 'c']);
    // Scale-aware: T0 is guessed on the scale of x, not 1.
    expect(guess.start[1]).toBeGreaterThan(10);
    expect(fit.converged).toBe(true);
    expect(fit.values[0]).toBeCloseTo(3, 8);
    expect(fit.values[1]).toBeCloseTo(50, 6);
    expect(fit.values[2]).toBeCloseTo(0.2, 8);
  });

  it('A*tanh(x/Tc) with x far above 1: sane values and errors where starting at 1 is degenerate', () => {
    const x = Array.from({ length: 81 }, (_, i) => 1000 + i * 50);
    const e = noise(x.length, 0.01);
    for (const [text, f, truth] of [
      ['A*tanh(x/Tc)', (v: number) => 2 * Math.tanh(v / 3000), [2, 3000]],
      ['A*tanh(x/Tc) + c', (v: number) => 2 * Math.tanh(v / 3000) - 0.4, [2, 3000, -0.4]]
    ] as const) {
      const y = x.map((v, i) => f(v) + e[i]);
      const { fit } = fitFromGuess(text, x, y);
      expect(fit.converged, text).toBe(true);
      fit.values.forEach((v, j) => {
        const se = fit.standardErrors[j];
        expect(Number.isFinite(se) && se > 0, `${text}: σ of ${fit.parameters[j]} = ${se}`).toBe(true);
        expect(se).toBeLessThan(0.01 * Math.max(1, Math.abs(truth[j])));
        expect(Math.abs(v - truth[j]), `${text}: ${fit.parameters[j]}`).toBeLessThan(5 * se);
      });
    }
  });

  it('finds a transition just beyond the data, a peak and two decay times', () => {
    const T = Array.from({ length: 60 }, (_, i) => 2 + i * 3.5);
    const power = fitFromGuess('x < Tc ? A*(1 - x/Tc)^beta : 0', T, T.map((t) => 1.7 * (1 - t / 220) ** 0.35), {}).fit;
    expect(power.converged).toBe(true);
    expect(power.values.map((v) => +v.toPrecision(6))).toEqual([220, 1.7, 0.35]);

    const x = Array.from({ length: 151 }, (_, i) => i * 2);
    const peak = fitFromGuess('A*exp(-((x - mu)/s)^2) + b', x, x.map((v) => 5 * Math.exp(-(((v - 130) / 20) ** 2)) + 1)).fit;
    expect(peak.converged).toBe(true);
    expect(peak.values.map((v) => +v.toPrecision(6))).toEqual([5, 130, 20, 1]);

    const e = noise(x.length, 0.02);
    const two = fitFromGuess('a1*exp(-x/t1) + a2*exp(-x/t2)', x, x.map((v, i) => 2 * Math.exp(-v / 10) + Math.exp(-v / 100) + e[i])).fit;
    expect(two.converged).toBe(true);
    const byTime = [0, 1].map((i) => ({ a: two.values[2 * i], t: two.values[2 * i + 1] })).sort((p, q) => p.t - q.t);
    expect(byTime[0].t).toBeCloseTo(10, 0);
    expect(byTime[1].t).toBeCloseTo(100, -1);
    expect(byTime[0].a).toBeCloseTo(2, 1);
    expect(byTime[1].a).toBeCloseTo(1, 1);
  });

  it('keeps given values, guesses the rest, and reports a given value that is not a number', () => {
    const model = parseExpressionModel('A*exp(-x/T0) + c');
    const x = [0, 10, 20, 40, 80];
    const y = x.map((v) => 3 * Math.exp(-v / 50) + 0.2);
    const g = guessStarts(model, x, y, { T0: 45, c: Number.NaN });
    expect(g.start[1]).toBe(45);
    expect(g.guessed).toEqual(['A', 'c']);
    expect(g.problems.map((p) => p.code)).toEqual(['expression.guess.given']);
  });

  it('says which start value to give when the model gives no number at any tried value', () => {
    const model = parseExpressionModel('A*log(-Tc - 1e9 - x)');
    const x = [1, 2, 3, 4];
    const y = [1, 2, 3, 4];
    const one = guessStarts(model, x, y, { A: 2 });
    expect(one.guessed).toEqual(['Tc']);
    expect(one.problems.map((p) => messageText(p))).toEqual([
      'The fit cannot start: the model gives no number at any tried value of Tc. Give a start value for Tc.'
    ]);
    const both = guessStarts(model, x, y, {});
    expect(both.problems.map((p) => p.code)).toEqual(['expression.guess.cannot-start-all']);
    expect(both.problems[0].args).toEqual(['A, Tc']);
    // With a workable start value given, nothing to report.
    expect(guessStarts(model, x, y, { Tc: -2e9 }).problems).toEqual([]);
  });

  it('is deterministic and bounded: at most GUESS_EVALUATIONS evaluations of at most GUESS_POINTS points', () => {
    const inner = parseExpressionModel('a1*exp(-x/t1) + a2*exp(-x/t2) + c');
    let calls = 0;
    let largest = 0;
    const counted: IFitModel = {
      parameters: inner.parameters,
      pointwise: true,
      evaluate(p, x, out) {
        calls++;
        largest = Math.max(largest, x.length);
        inner.evaluate(p, x, out);
      }
    };
    const x = Array.from({ length: 100_000 }, (_, i) => i * 0.003);
    const y = x.map((v) => 2 * Math.exp(-v / 10) + Math.exp(-v / 100) + 0.1);
    const a = guessStarts(counted, x, y, {});
    expect(calls).toBeLessThanOrEqual(GUESS_EVALUATIONS + 2);
    expect(largest).toBeLessThanOrEqual(GUESS_POINTS + 1);
    const b = guessStarts(counted, x, y, {});
    expect(b).toEqual(a);
  });

  it('reports data it cannot use', () => {
    const model = parseExpressionModel('a*x + b');
    const g = guessStarts(model, [Number.NaN, 1], [1, Number.POSITIVE_INFINITY], {});
    expect(g.start).toEqual([1, 1]);
    expect(g.problems.map((p) => p.code)).toEqual(['expression.guess.no-data']);
  });
});
