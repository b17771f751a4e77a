/** Closed-form line fit, its root and the smoothed derivative (src/core/numeric/linear.ts). */
import { describe, expect, it } from 'vitest';
import { fitLine, lineRoot, smoothedDerivative } from '../../../src/core/numeric/linear';

describe('fitLine', () => {
  it('recovers an exact line with zero residual variance', () => {
    const x = [1, 2, 3, 4, 5];
    const f = fitLine(
      x,
      x.map((v) => 2 - 0.5 * v)
    );
    expect(f.slope).toBeCloseTo(-0.5, 14);
    expect(f.intercept).toBeCloseTo(2, 14);
    expect(f.residualVariance).toBeCloseTo(0, 25);
    expect(lineRoot(f).value).toBeCloseTo(4, 13);
  });

  it('gives the textbook covariance s²(XᵀX)⁻¹', () => {
    // y = 1, 3, 2, 5 at x = 0…3: slope 1.1, intercept 1.1, RSS 2.7, s² = 1.35, Sxx = 5.
    const f = fitLine([0, 1, 2, 3], [1, 3, 2, 5]);
    expect(f.slope).toBeCloseTo(1.1, 14);
    expect(f.intercept).toBeCloseTo(1.1, 14);
    expect(f.residualVariance).toBeCloseTo(1.35, 14);
    expect(f.varSlope).toBeCloseTo(1.35 / 5, 14);
    expect(f.varIntercept).toBeCloseTo(1.35 * (1 / 4 + 2.25 / 5), 14);
    expect(f.covariance).toBeCloseTo((-1.5 * 1.35) / 5, 14);
  });

  it('skips non-finite and unselected points; NaN for fewer than two', () => {
    const f = fitLine([0, 1, NaN, 2, 9], [0, 2, 5, 4, 100], (i) => i !== 4);
    expect(f.n).toBe(3);
    expect(f.slope).toBeCloseTo(2, 14);
    expect(fitLine([1], [1]).slope).toBeNaN();
    expect(fitLine([1, 1], [1, 2]).slope).toBeNaN();
  });
});

describe('smoothedDerivative', () => {
  it('is exact for quadratic data, also at the ends and on uneven spacing', () => {
    const x = [0, 0.1, 0.35, 0.4, 0.8, 1.3, 1.5];
    const d = smoothedDerivative(
      x,
      x.map((v) => 3 - 2 * v + 0.5 * v * v),
      5
    );
    x.forEach((v, i) => expect(d[i]).toBeCloseTo(-2 + v, 10));
  });

  it('returns NaN for fewer than three points', () => {
    expect(Array.from(smoothedDerivative([0, 1], [0, 1]))).toEqual([NaN, NaN]);
  });
});
