/**
 * Weighting of a job (σ column, relative σ = f·|y|, equal) and the residual
 * check, on a Curie–Weiss susceptibility with relative noise; the Curie–Weiss
 * plausibility checks on p_eff and θ.
 */
import { describe, expect, it } from 'vitest';
import { runAnalysisJob } from '../../../src/core/analysis';
import type { IAnalysisJob, IAnalysisOutcome } from '../../../src/core/analysis';
import { messageText } from '../../../src/core/messages';
import { curiePrefactor, unitMistakeFactor } from '../../../src/core/physics/curie-weiss';
import { normal } from '../physics/prng';

// Invented material: an S = 5/2 (g = 2) paramagnet, p_eff = 2√(S(S+1)) = √35 = 5.9161 [B2],
// C_mol = 0.1250494·p² emu K mol⁻¹ Oe⁻¹ (prefactor N_A μB²/(3 kB), C7 in REFERENCES.md),
// θ = −35 K, Van Vleck χ0 = +2e-4 emu mol⁻¹ Oe⁻¹.
const P_EFF = Math.sqrt(35);
const C = curiePrefactor('cgs-emu') * 35;
const THETA = -35;
const CHI0 = 2e-4;

/** χ = χ0 + C/(T − θ) [B2] with 0.3 % relative noise, 150 points over 70–400 K (T ≥ 2|θ|), fixed seed. */
function curieWeissJob(seed: number, weights?: IAnalysisJob['weights'], units = 'cgs-emu'): IAnalysisJob {
  const rnd = normal(seed);
  const T = Array.from({ length: 150 }, (_, i) => 70 + (330 * i) / 149);
  const chi = T.map(t => (CHI0 + C / (t - THETA)) * (1 + 0.003 * rnd()));
  return { kind: 'curie-weiss', x: T, y: chi, window: { min: 70, max: 400 }, options: { units }, weights };
}

const derived = (out: IAnalysisOutcome, name: string) => out.derived.find(d => d.name === name)!;

describe('weights', () => {
  it('should suggest relative weights for a Curie–Weiss χ with relative noise, and recover p_eff, θ and χ0 with them', () => {
    // Prefactor check: 0.125049365 per p_eff² [C7, CODATA 2018].
    expect(curiePrefactor('cgs-emu')).toBeCloseTo(0.125049365, 7);
    const equal = runAnalysisJob(curieWeissJob(7));
    expect(equal.weighting?.mode).toBe('equal');
    const check = equal.weighting!.check!;
    console.log(messageText(check.message));
    console.log(check.suggestion ? messageText(check.suggestion) : 'no suggestion');
    expect(check.relativeBetter).toBe(true);
    expect(check.suggestion?.code).toBe('weights.suggest-relative.equal');
    expect(check.errorFactors.map(f => f.name)).toEqual(expect.arrayContaining(['θ', 'C', 'χ0', 'p_eff']));
    // The suggested fit: relative weights with f estimated.
    const rel = runAnalysisJob(curieWeissJob(7, { mode: 'relative', fraction: null }));
    expect(rel.fit.converged).toBe(true);
    expect(rel.weighting?.mode).toBe('relative');
    expect(rel.weighting?.fractionEstimated).toBe(true);
    // f̂ close to the 0.3 % put in (150 points: relative sd of f̂ ≈ 1/√(2·147) ≈ 6 %).
    expect(rel.weighting!.fraction!).toBeGreaterThan(0.0025);
    expect(rel.weighting!.fraction!).toBeLessThan(0.0035);
    for (const [name, truth] of [['p_eff', P_EFF], ['θ', THETA], ['χ0', CHI0]] as const) {
      const d = derived(rel, name);
      expect(Math.abs(d.value - truth)).toBeLessThan(2 * d.sigma);
    }
    expect(rel.verdict.state).toBe('fits');
  });

  it('should give 1σ intervals of θ that contain the truth in about 68 % of 200 seeds with relative weights', () => {
    let inside = 0;
    const seeds = 200;
    for (let s = 0; s < seeds; s++) {
      const out = runAnalysisJob(curieWeissJob(1000 + s, { mode: 'relative', fraction: null }), {}, { residualCheck: false });
      const th = derived(out, 'θ');
      if (Math.abs(th.value - THETA) <= th.sigma) {
        inside++;
      }
    }
    const fraction = inside / seeds;
    console.log(`θ 1σ coverage over ${seeds} seeds: ${fraction}`);
    // Binomial(200, 0.683): sd ≈ 0.033, so 0.60–0.76 is about ±2.4 sd.
    expect(fraction).toBeGreaterThanOrEqual(0.6);
    expect(fraction).toBeLessThanOrEqual(0.76);
  });

  it('should use a given f as known σ and refuse a bad one', () => {
    const out = runAnalysisJob(curieWeissJob(8, { mode: 'relative', fraction: 0.003 }));
    expect(out.weighting?.fraction).toBe(0.003);
    expect(out.weighting?.fractionEstimated).toBe(false);
    expect(out.fit.errorScaling).toBe('from-sigma');
    // χ²_red ≈ 1 when f matches the noise (147 dof: 1 ± 0.12 at 1σ).
    expect(out.fit.reducedChi2).toBeGreaterThan(0.7);
    expect(out.fit.reducedChi2).toBeLessThan(1.3);
    expect(() => runAnalysisJob(curieWeissJob(8, { mode: 'relative', fraction: -1 }))).toThrow(/finite number above 0/);
  });

  it('should refuse relative weights when a y is zero, and σ weights without a σ column', () => {
    const job = curieWeissJob(9, { mode: 'relative', fraction: null });
    const y = Array.from(job.y);
    y[20] = 0;
    expect(() => runAnalysisJob({ ...job, y })).toThrow(/Relative weights σ = f·\|y\| need y away from zero, but y = 0 at x = /);
    expect(() => runAnalysisJob({ ...job, weights: { mode: 'sigma' } })).toThrow(/no σ column is chosen/);
  });

  it('should not suggest relative weights for constant noise', () => {
    const job = curieWeissJob(10);
    const rnd = normal(11);
    const y = Array.from(job.x, t => CHI0 + C / (t - THETA) + 3e-5 * rnd());
    const out = runAnalysisJob({ ...job, y });
    expect(out.weighting?.check?.relativeBetter).toBe(false);
    expect(out.weighting?.check?.suggestion).toBeNull();
  });

  it('should check the σ column against σ ∝ |y| as well', () => {
    const job = curieWeissJob(12);
    const sigma = Array.from(job.x, () => 0.003 * (CHI0 + C / (70 - THETA)) * 0.5);
    const out = runAnalysisJob({ ...job, sigma });
    expect(out.weighting?.mode).toBe('sigma');
    expect(out.weighting?.check?.relativeBetter).toBe(true);
    expect(out.weighting?.check?.suggestion?.code).toBe('weights.suggest-relative.sigma');
  });
});

describe('Curie–Weiss plausibility', () => {
  it('should name cgs data read as SI, with the conversion factor', () => {
    // 1 cm³/mol = 4π·10⁻⁶ m³/mol [C7], so p_eff of a cgs number read as SI is √(0.1/μ0) ≈ √(10⁶/4π) = 282.09 times larger.
    expect(unitMistakeFactor()).toBeCloseTo(Math.sqrt(1e6 / (4 * Math.PI)), 3);
    const out = runAnalysisJob(curieWeissJob(13, undefined, 'SI'));
    const p = derived(out, 'p_eff').value;
    // 797.727·√C [C7] with C the cgs number.
    expect(p / (797.727056 * Math.sqrt(derived(out, 'C').value))).toBeCloseTo(1, 5);
    const m = out.cautions.find(c => c.code === 'physics.curie-weiss.peff-cgs-as-si');
    expect(m).toBeDefined();
    const text = messageText(m!);
    console.log(text);
    expect(text).toMatch(/^p_eff = 16\d\d μB: the data look like cgs-emu values .* read as SI/);
    expect(text).toMatch(/282\.1 times too large; read as cgs-emu it is 5\.9\d? μB/);
  });

  it('should name SI data read as cgs-emu, and a per-gram or raw moment otherwise', () => {
    const job = curieWeissJob(14);
    // SI molar χ = 4π·10⁻⁶ × the cgs number [C7].
    const si = runAnalysisJob({ ...job, y: Array.from(job.y, v => v * 4 * Math.PI * 1e-6) });
    expect(si.cautions.some(c => c.code === 'physics.curie-weiss.peff-si-as-cgs')).toBe(true);
    // A per-gram χ of a compound of 1e4 g/mol: p_eff √(1e4) = 100 times too small, 0.059 μB.
    const perGram = runAnalysisJob({ ...job, y: Array.from(job.y, v => v / 1e4) });
    expect(derived(perGram, 'p_eff').value).toBeCloseTo(P_EFF / 100, 2);
    expect(perGram.cautions.some(c => c.code === 'physics.curie-weiss.peff-si-as-cgs' || c.code === 'physics.curie-weiss.peff-low')).toBe(true);
    expect(runAnalysisJob(job).cautions.some(c => c.code.startsWith('physics.curie-weiss.peff'))).toBe(false);
  });

  it('should warn when θ lies far below a narrow window', () => {
    // Noise-free χ over 380–400 K: θ = −35 K lies 415 K below the data, 21 times the 20 K range (limit 5).
    const job = curieWeissJob(15);
    const y = Array.from(job.x, t => CHI0 + C / (t - THETA));
    const out = runAnalysisJob({ ...job, y, window: { min: 380, max: 400 } });
    expect(derived(out, 'θ').value).toBeCloseTo(THETA, 3);
    const m = out.cautions.find(c => c.code === 'physics.curie-weiss.theta-extrapolated');
    expect(m).toBeDefined();
  });
});
