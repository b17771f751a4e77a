/**
 * Honest error bars: over 400 seeded synthetic power-law fits the 1σ
 * (68.27 %) Student-t interval of β must contain the true β in 62–74 % of
 * the cases (nominal 68.27 %; the band allows for binomial scatter,
 * sd ≈ 2.3 % at 400 trials — common practice, no source).
 */
import { describe, expect, it } from 'vitest';
import { fitCurve } from '../../../src/core/fit/index';
import { linspace, powerLaw } from './models';
import { mulberry32, normalGenerator } from './prng';

describe('coverage of the 1σ interval', () => {
  it('contains the true β in 62–74 % of 400 power-law fits', () => {
    const truth = { A: 1, Tc: 300, beta: 0.33 };
    const T = linspace(200, 295, 25);
    let inside = 0;
    let converged = 0;
    const trials = 400;
    for (let s = 0; s < trials; s++) {
      const g = normalGenerator(mulberry32(1000 + s));
      const y = T.map((t) => truth.A * Math.pow(1 - t / truth.Tc, truth.beta) + 0.01 * g());
      const r = fitCurve(powerLaw, { x: T, y }, { start: [0.8, 310, 0.5] });
      if (r.converged) {
        converged++;
      }
      const [lo, hi] = r.confidenceIntervals[2];
      if (lo <= truth.beta && truth.beta <= hi) {
        inside++;
      }
    }
    const fraction = inside / trials;
    expect(converged).toBe(trials);
    expect(fraction).toBeGreaterThanOrEqual(0.62);
    expect(fraction).toBeLessThanOrEqual(0.74);
  });
});
