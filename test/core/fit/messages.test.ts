/**
 * Messages of the fit engine as returned and thrown: stable codes,
 * placeholders matching arguments, plain words (no tolerance names, no
 * option paths), numbers rounded.
 */
import { describe, expect, it } from 'vitest';
import { FitInputError, fitCurve } from '../../../src/core/fit/index';
import type { IFitData, IFitModel, IFitOptions, IFitResult } from '../../../src/core/fit/index';
import { messageText } from '../../../src/core/messages';
import type { ICoreMessage } from '../../../src/core/messages';
import { expectGoodMessages, thrownMessage } from '../numeric/messageRules';
import { decay, line, linspace } from './models';

const x = linspace(0, 4, 20);
const y = x.map(v => 2 * Math.exp(-0.8 * v) + 0.1 + 0.001 * Math.sin(7 * v));

function all(r: IFitResult): ICoreMessage[] {
  return [r.reason, ...r.warnings, ...r.notes];
}

const badInputs: [string, () => unknown][] = [
  ['model', () => fitCurve({ parameters: 'a' } as unknown as IFitModel, { x, y }, { start: [1] })],
  ['no parameters', () => fitCurve({ parameters: [], evaluate: () => undefined }, { x, y }, { start: [] })],
  ['duplicate names', () => fitCurve({ parameters: ['a', 'a'], evaluate: () => undefined }, { x, y }, { start: [1, 1] })],
  ['no data', () => fitCurve(decay, null as unknown as IFitData, { start: [1, 1, 0] })],
  ['x not a list', () => fitCurve(decay, { x: 3 as unknown as number[], y }, { start: [1, 1, 0] })],
  ['y not a number', () => fitCurve(decay, { x, y: y.map((v, i) => (i === 2 ? ('a' as unknown as number) : v)) }, { start: [1, 1, 0] })],
  ['y length', () => fitCurve(decay, { x, y: y.slice(1) }, { start: [1, 1, 0] })],
  ['empty', () => fitCurve(decay, { x: [], y: [] }, { start: [1, 1, 0] })],
  ['x not finite', () => fitCurve(decay, { x: [NaN, ...x.slice(1)], y }, { start: [1, 1, 0] })],
  ['sigma', () => fitCurve(decay, { x, y, sigma: x.map(() => -1) }, { start: [1, 1, 0] })],
  ['sigma length', () => fitCurve(decay, { x, y, sigma: [1] }, { start: [1, 1, 0] })],
  ['low parts', () => fitCurve(decay, { x, y, yLow: y.map(() => 1) }, { start: [1, 1, 0] })],
  ['low parts length', () => fitCurve(decay, { x, y, xLow: [0] }, { start: [1, 1, 0] })],
  ['low parts not finite', () => fitCurve(decay, { x, y, xLow: x.map(() => NaN) }, { start: [1, 1, 0] })],
  ['no options', () => fitCurve(decay, { x, y }, null as unknown as IFitOptions)],
  ['start not a list', () => fitCurve(decay, { x, y }, { start: 1 as unknown as number[] })],
  ['start length', () => fitCurve(decay, { x, y }, { start: [1] })],
  ['start not a number', () => fitCurve(decay, { x, y }, { start: [1, 'b' as unknown as number, 0] })],
  ['start not finite', () => fitCurve(decay, { x, y }, { start: [1, Infinity, 0] })],
  ['lower length', () => fitCurve(decay, { x, y }, { start: [1, 1, 0], lower: [0] })],
  ['upper not a number', () => fitCurve(decay, { x, y }, { start: [1, 1, 0], upper: [5, null as unknown as number, 5] })],
  ['fixed length', () => fitCurve(decay, { x, y }, { start: [1, 1, 0], fixed: [true] })],
  ['bounds invalid', () => fitCurve(decay, { x, y }, { start: [1, 1, 0], lower: [Infinity, 0, 0] })],
  ['bounds reversed', () => fitCurve(decay, { x, y }, { start: [1, 1, 0], lower: [0, 3, 0], upper: [5, 2, 5] })],
  ['start outside', () => fitCurve(decay, { x, y }, { start: [1, 321.40169075538586, 0], upper: [5, 295.999999704, 5] })],
  ['equal bounds', () => fitCurve(decay, { x, y }, { start: [1, 1, 0], lower: [0, 1, 0], upper: [5, 1, 5] })],
  ['all fixed', () => fitCurve(decay, { x, y }, { start: [1, 1, 0], fixed: [true, true, true] })],
  ['too few points', () => fitCurve(decay, { x: [1, 2], y: [1, 2] }, { start: [1, 1, 0] })],
  ['budget', () => fitCurve(decay, { x, y }, { start: [1, 1, 0], maxEvaluations: 2.5 })],
  ['confidence', () => fitCurve(decay, { x, y }, { start: [1, 1, 0], confidenceLevel: 2 })],
  ['chi2 tolerance', () => fitCurve(decay, { x, y }, { start: [1, 1, 0], ftol: -1 })],
  ['step tolerance', () => fitCurve(decay, { x, y }, { start: [1, 1, 0], xtol: NaN })],
  ['gradient tolerance', () => fitCurve(decay, { x, y }, { start: [1, 1, 0], gtol: Infinity })]
];

describe('fit messages', () => {
  it('every refused input throws a FitInputError with a good, distinct message', () => {
    const messages = badInputs.map(([what, fn]) => {
      const m = thrownMessage(fn, FitInputError);
      expect(m.code, what).toMatch(/^fit\./);
      return m;
    });
    expect(expectGoodMessages(messages)).toBe(badInputs.length);
    expect(new Set(messages.map(m => m.code)).size).toBeGreaterThan(25);
  });

  it('option paths become plain words', () => {
    const m = thrownMessage(() => fitCurve(decay, { x, y }, { start: [1, 'b' as unknown as number, 0] }), FitInputError);
    expect(messageText(m)).toBe('The start value of parameter 2 (b) is not a number.');
    const outside = thrownMessage(() => fitCurve(decay, { x, y }, { start: [1, 321.40169075538586, 0], upper: [5, 295.999999704, 5] }), FitInputError);
    expect(messageText(outside)).toBe('The start value of b (321.4) is outside the range it may take (−∞ to 296): give a start value inside it.');
  });

  it('results: every stopping reason, warning and note is good, and no reason uses tolerance words', () => {
    const results: IFitResult[] = [];
    const nanModel: IFitModel = { parameters: ['a'], evaluate: (_p, xs, out) => out.fill(NaN) };
    const throwing: IFitModel = {
      parameters: ['a'],
      evaluate() {
        throw new Error('boom');
      }
    };
    results.push(fitCurve(decay, { x, y }, { start: [1, 1, 0] }));
    results.push(fitCurve(decay, { x, y }, { start: [10, 5, 3], maxEvaluations: 5 }));
    results.push(fitCurve(decay, { x, y }, { start: [10, 5, 3], shouldStop: () => true }));
    results.push(fitCurve(nanModel, { x, y }, { start: [1] }));
    results.push(fitCurve(throwing, { x, y }, { start: [1] }));
    results.push(fitCurve(decay, { x: x.map(() => 2), y }, { start: [1, 1, 0] }));
    results.push(fitCurve(line, { x: [0, 1], y: [1, 3] }, { start: [0, 0] }));
    results.push(fitCurve(line, { x, y: x.map(v => 2 * v + 1) }, { start: [0, 0] }));
    results.push(fitCurve(decay, { x, y }, { start: [2, 0.3, 0.5], upper: [10, 0.5, 10] }));
    results.push(
      fitCurve(decay, { x, y }, {
        start: [1, 1, 0],
        onProgress: () => {
          throw new Error('listener failed');
        }
      })
    );
    const short = linspace(0, 0.05, 30);
    results.push(fitCurve(decay, { x: short, y: short.map(v => 1.5 * Math.exp(-0.6 * v) + 0.2 + 1e-4 * Math.sin(40 * v)) }, { start: [1, 1, 0] }));
    const messages = results.flatMap(all);
    expectGoodMessages(messages);
    const codes = new Set(messages.map(m => m.code));
    for (const c of [
      'fit.stop.budget',
      'fit.stop.cancelled',
      'fit.stop.not-finite-at-start',
      'fit.stop.model-failed-at-start',
      'fit.stop.degenerate',
      'fit.stop.callback-failed',
      'fit.covariance-singular',
      'fit.no-degrees-of-freedom',
      'fit.at-bound',
      'fit.strong-correlation'
    ]) {
      expect(codes, c).toContain(c);
    }
    for (const r of results) {
      expect(messageText(r.reason)).not.toMatch(/ftol|gtol|xtol|relative reduction|orthogonal/i);
    }
  });

  it('the stopping rules of converged fits have distinct codes', () => {
    const converged = [
      fitCurve(decay, { x, y }, { start: [1, 1, 0] }),
      fitCurve(line, { x, y: x.map(v => 2 * v + 1) }, { start: [0, 0] }),
      fitCurve(decay, { x, y }, { start: [1, 1, 0], ftol: 1e-3 }),
      fitCurve(decay, { x, y }, { start: [1, 1, 0], ftol: 0, xtol: 1e-3, gtol: 0 })
    ];
    for (const r of converged) {
      expect(r.converged).toBe(true);
      expect(r.reason.code).toMatch(/^fit\.stop\.(exact|gradient|held-at-bounds|stationary|rounding-noise|chi2-settled|machine-precision|parameters-settled)$/);
    }
    expectGoodMessages(converged.flatMap(all));
  });
});
