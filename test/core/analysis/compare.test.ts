/**
 * Model comparison over one window: the spin of a Brillouin M(T) picked by
 * AICc among the fixed-J Weiss fits, J fitted freely, and refusals.
 */
import { describe, expect, it } from 'vitest';
import { compareModels, looksLikeSusceptibility } from '../../../src/core/analysis/compare';
import { defaultOptions } from '../../../src/core/analysis';
import type { IAnalysisJob } from '../../../src/core/analysis';
import { messageText } from '../../../src/core/messages';
import { weissMagnetisation } from '../../../src/core/physics/weiss';
import { normal } from '../physics/prng';

// Invented material: a J = 5/2 ferromagnet with Tc = 412.7 K and Ms = 4.83 μB/f.u.
const TRUE = { J: 2.5, Tc: 412.7, Ms: 4.83 };

/** M(T) = Ms·m(T/Tc) of the Weiss/Brillouin mean field [B1 in REFERENCES.md], 0.3 % of Ms noise, fixed seed. */
function brillouinJob(seed: number, n = 200): IAnalysisJob {
  const rnd = normal(seed);
  const T = Array.from({ length: n }, (_, i) => 10 + (470 * i) / (n - 1));
  const m = weissMagnetisation(TRUE.J, T.map(t => t / TRUE.Tc));
  const M = T.map((_, i) => TRUE.Ms * m[i] + 0.003 * TRUE.Ms * rnd());
  return { kind: 'weiss', x: T, y: M, window: { min: 10, max: 480 }, options: defaultOptions('weiss') };
}

describe('compareModels', () => {
  it('should rank J = 5/2 first among the fixed spins for a J = 5/2 Brillouin curve, and the J-free fit should agree', () => {
    const job = brillouinJob(2024);
    const progress: number[] = [];
    const cmp = compareModels(job, { onProgress: f => progress.push(f) })!;
    expect(cmp).not.toBeNull();
    const weiss = cmp.models.filter(m => m.kind === 'weiss' && m.options.freeJ === false && m.converged);
    console.log(weiss.map(m => `${messageText(m.label)}: AICc ${m.aicc.toFixed(1)}, Δ ${m.deltaAicc.toFixed(1)}, w ${m.weight.toExponential(2)}, χ²red ${m.reducedChi2.toExponential(3)}`).join('\n'));
    console.log(cmp.models.map(m => `${m.kind} ${JSON.stringify(m.options)} conv=${m.converged} ${m.verdict} AICc=${m.aicc} ${m.note ? messageText(m.note) : ''}`).join('\n'));
    console.log(messageText(cmp.summary), messageText(cmp.convention));
    expect(weiss).toHaveLength(7);
    expect(weiss[0].options.J).toBe(2.5);
    // The J-free fit contains 5/2 within 2σ.
    expect(cmp.freeJ).not.toBeNull();
    expect(Math.abs(cmp.freeJ!.value - 2.5)).toBeLessThan(2 * cmp.freeJ!.sigma);
    // Tc of the preferred fixed-J fit within 2σ of the truth.
    const Tc = weiss[0].values.Tc;
    expect(Math.abs(Tc.value - TRUE.Tc)).toBeLessThan(2 * Tc.sigma);
    expect(progress.at(-1)).toBe(1);
  });
});

describe('compareModels on other data and bad input', () => {
  it('should add Curie–Weiss for a susceptibility above the ordering and rank it first', () => {
    // χ = χ0 + C/(T − θ) [B2] with an invented C = 4.3767, θ = −35 K, χ0 = 2e-4, 0.3 % relative noise.
    const rnd = normal(31);
    const T = Array.from({ length: 120 }, (_, i) => 70 + (330 * i) / 119);
    const chi = T.map(t => (2e-4 + 4.3767 / (t + 35)) * (1 + 0.003 * rnd()));
    expect(looksLikeSusceptibility(T, chi)).toBe(true);
    const cmp = compareModels({ kind: 'curie-weiss', x: T, y: chi, window: { min: 0, max: 1000 }, options: { units: 'cgs-emu' }, weights: { mode: 'relative', fraction: null } })!;
    expect(cmp.models[0].kind).toBe('curie-weiss');
    expect(cmp.convention.code).toBe('compare.convention.profiled-relative');
  });

  it('should not take an ordered M(T) for a susceptibility', () => {
    const job = brillouinJob(5);
    expect(looksLikeSusceptibility(job.x, job.y)).toBe(false);
  });

  it('should return null when cancelled, and report progress until then', () => {
    let polls = 0;
    const progress: number[] = [];
    const out = compareModels(brillouinJob(6), { shouldStop: () => ++polls > 40, onProgress: f => progress.push(f) });
    expect(out).toBeNull();
    expect(progress.every(f => f > 0 && f < 1)).toBe(true);
  });

  it('should refuse an empty or inverted window, one point, constant x, and zero y with relative weights', () => {
    const job = brillouinJob(7);
    expect(() => compareModels({ ...job, window: { min: 500, max: 400 } })).toThrow(/fit window is empty/);
    expect(() => compareModels({ ...job, window: { min: 1000, max: 2000 } })).toThrow(/at least 4 points in the fit window, but it holds 0/);
    expect(() => compareModels({ ...job, x: [300], y: [1] })).toThrow(/at least 4 points in the fit window, but it holds 1/);
    expect(() => compareModels({ ...job, x: [300, 300, 300, 300, 300], y: [1, 2, 3, 4, 5] })).toThrow(/same x/);
    const y = Array.from(job.y);
    y[3] = 0;
    expect(() => compareModels({ ...job, y, weights: { mode: 'relative', fraction: 0.01 } })).toThrow(/need y away from zero/);
  });

  it('should leave out NaN and ±∞ in y, say so, and refuse when nothing is left', () => {
    const job = brillouinJob(8, 60);
    const y = Array.from(job.y);
    y[2] = Number.NaN;
    y[5] = Infinity;
    y[9] = -Infinity;
    const cmp = compareModels({ ...job, y })!;
    expect(cmp.warnings.some(w => w.code === 'compare.skipped' && w.args[0] === 3)).toBe(true);
    expect(cmp.models.filter(m => m.converged).every(m => m.n === 57)).toBe(true);
    expect(() => compareModels({ ...job, y: Array.from(job.y, () => Number.NaN) })).toThrow(/holds 0 \(60 more were left out/);
  });

  it('should fit data with duplicated rows', () => {
    const job = brillouinJob(9, 60);
    const cmp = compareModels({ ...job, x: [...Array.from(job.x), ...Array.from(job.x)], y: [...Array.from(job.y), ...Array.from(job.y)] })!;
    expect(cmp.models[0].n).toBe(120);
    expect(cmp.models[0].converged).toBe(true);
  });
});
