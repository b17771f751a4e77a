/**
 * Landau derived quantities with propagated σ, the order with how sure, and
 * the joint fit of ψ(T) with 1/χ(T), through the panel's path. Materials are
 * invented; coefficients in convention L [B3 in REFERENCES.md].
 */
import { describe, expect, it } from 'vitest';
import { runAnalysisJob } from '../../../src/core/analysis';
import type { IAnalysisOutcome } from '../../../src/core/analysis';
import { landauEquilibriumPsi, landauOrder } from '../../../src/core/physics/landau';
import { messageText } from '../../../src/core/messages';
import { normal } from '../physics/prng';

const d = (out: IAnalysisOutcome, name: string) => out.derived.find(v => v.name === name)!;

describe('Landau derived quantities with σ', () => {
  it('first order (b < 0): T1 and T** within 2σ of the closed forms, each σ finite; order first with high confidence', () => {
    // C5 example: a = 0.5, b = −2, c = 4, T0 = 100 → T1 = T0 + 3b²/(16ac) = 100.375, T** = T0 + b²/(4ac) = 100.5 [C5].
    const k = { a: 0.5, T0: 100, b: -2, c: 4, d: 0 };
    const rnd = normal(4242);
    const T = Array.from({ length: 90 }, (_, i) => 92 + 0.1 * i);
    const y = T.map(t => landauEquilibriumPsi(k, t) + 0.002 * rnd());
    const out = runAnalysisJob({ kind: 'landau', x: T, y, window: { min: -Infinity, max: Infinity }, options: {} });
    const T1 = d(out, 'T1');
    const Tss = d(out, 'T**');
    for (const v of [T1, Tss, d(out, 'T0'), d(out, 'Δψ'), d(out, 'L'), d(out, 'Fb')]) {
      expect(Number.isFinite(v.sigma) && v.sigma > 0).toBe(true);
      expect(v.sigmaReason).toBeUndefined();
    }
    expect(Math.abs(T1.value - 100.375)).toBeLessThan(2 * T1.sigma);
    expect(Math.abs(Tss.value - 100.5)).toBeLessThan(2 * Tss.sigma);
    expect(out.transitionOrder!.order).toBe('first');
    expect(out.transitionOrder!.probabilityFirst).toBeGreaterThan(0.999);
    expect(out.transitionOrder!.z).toBeLessThan(-3);
    expect(messageText(out.cautions[0])).toMatch(/^First order: b = .* below 0 \(probability 1 that b < 0/);
  });

  it('second order (b > 0) is stated second order', () => {
    const k = { a: 0.8, T0: 240, b: 1.5, c: 0.6, d: 0 };
    const rnd = normal(77);
    const T = Array.from({ length: 80 }, (_, i) => 200 + 0.6 * i);
    const y = T.map(t => landauEquilibriumPsi(k, t) + 0.003 * rnd());
    const out = runAnalysisJob({ kind: 'landau', x: T, y, window: { min: -Infinity, max: Infinity }, options: {} });
    expect(out.transitionOrder!.order).toBe('second');
    expect(out.transitionOrder!.probabilityFirst).toBeLessThan(0.01);
    expect(d(out, 'T1').value).toBe(d(out, 'T0').value);
    expect(Number.isFinite(d(out, 'ΔC').sigma)).toBe(true);
  });

  it('P(b < 0) is Φ(−b/σ_b): 0.5 at b = 0, 0.02275 at b = 2σ (normal table)', () => {
    // Φ(−2) = 0.0227501 (Abramowitz & Stegun table 26.1 [N7 in REFERENCES.md]).
    expect(landauOrder(0, 1).probabilityFirst).toBeCloseTo(0.5, 12);
    expect(landauOrder(2, 1).probabilityFirst).toBeCloseTo(0.0227501319, 8);
    expect(landauOrder(-2, 1).order).toBe('first');
    expect(landauOrder(1, 1).order).toBe('undecided');
    expect(landauOrder(-1, Number.NaN).z).toBeNaN();
  });
});

describe('joint Landau fit with a 1/χ column', () => {
  it('gives a smaller σ(T0) than ψ(T) alone', () => {
    // Invented ferroelectric-like data: a = 0.8, T0 = 240, b = 1.5, c = 0.6 (second order).
    // 1/χ = F″(ψ_eq) = a(T − T0) above T0, a(T − T0) + 3bψ² + 5cψ⁴ below [B3 (i), stability].
    const k = { a: 0.8, T0: 240, b: 1.5, c: 0.6, d: 0 };
    const rnd = normal(99);
    const T = Array.from({ length: 100 }, (_, i) => 210 + 0.6 * i);
    const psi = T.map(t => landauEquilibriumPsi(k, t) + 0.003 * rnd());
    const chi = T.map(t => {
      const q = landauEquilibriumPsi(k, t) ** 2;
      return k.a * (t - k.T0) + 3 * k.b * q + 5 * k.c * q * q + 0.05 * rnd();
    });
    const alone = runAnalysisJob({ kind: 'landau', x: T, y: psi, window: { min: -Infinity, max: Infinity }, options: {} });
    const joint = runAnalysisJob({
      kind: 'landau',
      x: T,
      y: psi,
      window: { min: -Infinity, max: Infinity },
      options: { inverseChi: '1/chi' },
      columns: { inverseChi: chi }
    });
    expect(joint.fit.parameters).toEqual(['a', 'T0', 'b', 'c']);
    expect(d(joint, 'T0').sigma).toBeLessThan(d(alone, 'T0').sigma);
    expect(Math.abs(d(joint, 'T0').value - 240)).toBeLessThan(3 * d(joint, 'T0').sigma);
    expect(Math.abs(joint.landau!.a - 0.8)).toBeLessThan(0.05);
  });
});

describe('Landau options: the ΔC jump as text and the 1/χ column in saved settings', () => {
  it('reads "ΔC ± σ" and refuses other text', async () => {
    const { parseValueSigma } = await import('../../../src/core/analysis/kinds/landau');
    expect(parseValueSigma('6.25 ± 0.3')).toEqual({ value: 6.25, sigma: 0.3 });
    expect(parseValueSigma('6.25 +- 0.3')).toEqual({ value: 6.25, sigma: 0.3 });
    expect(parseValueSigma('')).toBeNull();
    expect(() => parseValueSigma('six')).toThrow(/value and its σ/);
  });

  it('fits ψ(T) with the jump ΔC = T0·a²/(2b) and fixes the scale a', () => {
    // Second order, c = 0.6: ΔC = T0 a²/(2b) = 240·0.64/3 = 51.2 (the c term does not change the jump [B3 (i)]).
    const k = { a: 0.8, T0: 240, b: 1.5, c: 0.6, d: 0 };
    const rnd = normal(5);
    const T = Array.from({ length: 80 }, (_, i) => 200 + 0.6 * i);
    const psi = T.map(t => landauEquilibriumPsi(k, t) + 0.003 * rnd());
    const out = runAnalysisJob({ kind: 'landau', x: T, y: psi, window: { min: -Infinity, max: Infinity }, options: { specificHeatJump: '51.2 ± 1' } });
    expect(out.fit.parameters).toEqual(['a', 'T0', 'b', 'c']);
    expect(Math.abs(out.landau!.a - 0.8)).toBeLessThan(0.05);
    expect(Math.abs(d(out, 'ΔC').value - 51.2)).toBeLessThan(3 * d(out, 'ΔC').sigma);
  });

  it('accepts a column name (text) for a column option in saved settings and refuses a number', async () => {
    const { validateKindSettings } = await import('../../../src/core/analysis');
    expect(validateKindSettings({ kind: 'landau', options: { inverseChi: 'chi_inv (1/emu)' } })).toBeNull();
    expect(validateKindSettings({ kind: 'landau', options: { inverseChi: 3 } })?.code).toBe('saved.bad-option-type');
  });
});
