/**
 * Model comparison over one window: the spin of a Brillouin M(T) picked by
 * AICc among the fixed-J Weiss fits, J fitted freely, and refusals.
 */
import { describe, expect, it } from 'vitest';
import { compareModels } from '../../../src/core/analysis/compare';
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
