/**
 * Residual bootstrap of a job: seeded and reproducible, spread comparable to
 * the fit's standard errors on a well-specified problem, cancel and refusals.
 */
import { describe, expect, it } from 'vitest';
import { bootstrapJob, quantileSorted } from '../../../src/core/analysis/bootstrap';
import type { IAnalysisJob } from '../../../src/core/analysis';
import { runAnalysisJob } from '../../../src/core/analysis';
import { normal } from '../physics/prng';

/** χ = χ0 + C/(T − θ) [B2] with constant Gaussian noise (equal weights are then right); invented C, θ, χ0. */
function job(seed: number): IAnalysisJob {
  const rnd = normal(seed);
  const T = Array.from({ length: 80 }, (_, i) => 60 + 4 * i);
  const y = T.map(t => 3e-4 + 2.1 / (t + 12) + 2e-5 * rnd());
  return { kind: 'curie-weiss', x: T, y, window: { min: 0, max: 1e4 }, options: { units: 'cgs-emu' } };
}

describe('bootstrapJob', () => {
  it('should be reproducible for a seed and differ between seeds', () => {
    const a = bootstrapJob(job(1), { samples: 60, seed: 42 })!;
    const b = bootstrapJob(job(1), { samples: 60, seed: 42 })!;
    const c = bootstrapJob(job(1), { samples: 60, seed: 43 })!;
    expect(a).toEqual(b);
    expect(a.stats[1].sd).not.toBe(c.stats[1].sd);
    expect(a.parameters).toEqual(['C', 'theta', 'chi0']);
    expect(a.failed).toBe(0);
    expect(a.convention.code).toBe('bootstrap.convention.residuals');
  });

  it('should give a spread comparable to the standard errors of a well-specified fit', () => {
    const j = job(2);
    const fit = runAnalysisJob(j).fit;
    const progress: number[] = [];
    const out = bootstrapJob(j, { samples: 400, seed: 7 }, { onProgress: f => progress.push(f) })!;
    expect(progress).toHaveLength(400);
    expect(progress.at(-1)).toBe(1);
    out.stats.forEach((s, i) => {
      const ratio = s.sd / fit.standardErrors[i];
      console.log(`${s.name}: bootstrap sd ${s.sd.toExponential(3)}, fit σ ${fit.standardErrors[i].toExponential(3)}, ratio ${ratio.toFixed(3)}`);
      // 400 samples: the sd itself scatters by ≈ 1/√(2·400) = 3.5 %; the linearised σ is itself approximate.
      expect(ratio).toBeGreaterThan(0.8);
      expect(ratio).toBeLessThan(1.25);
      expect(s.p16).toBeLessThan(s.fitted);
      expect(s.p84).toBeGreaterThan(s.fitted);
      expect(s.p025).toBeLessThan(s.p16);
      expect(s.p975).toBeGreaterThan(s.p84);
    });
  });

  it('should return null when cancelled', () => {
    let polls = 0;
    expect(bootstrapJob(job(3), { samples: 50, seed: 1 }, { shouldStop: () => ++polls > 30 })).toBeNull();
  });

  it('should refuse a bad sample count', () => {
    expect(() => bootstrapJob(job(4), { samples: 0, seed: 1 })).toThrow(/whole number of samples/);
    expect(() => bootstrapJob(job(4), { samples: 2.5, seed: 1 })).toThrow(/whole number of samples/);
  });

  it('should interpolate percentiles between order statistics', () => {
    // Hyndman & Fan (1996) definition 7: h = (n − 1)q; [1, 2, 3, 4] at q = 0.5 → 2.5, at 0.16 → 1.48.
    expect(quantileSorted([1, 2, 3, 4], 0.5)).toBe(2.5);
    expect(quantileSorted([1, 2, 3, 4], 0.16)).toBeCloseTo(1.48, 12);
    expect(quantileSorted([], 0.5)).toBeNaN();
  });
});
