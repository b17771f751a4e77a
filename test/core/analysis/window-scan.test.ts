/**
 * The exponent-against-window scan and the power law with a correction to
 * scaling, on data of an invented ferromagnet with a Wegner correction.
 */
import { describe, expect, it } from 'vitest';
import { AnalysisInputError, runAnalysisJob } from '../../../src/core/analysis';
import type { IAnalysisJob } from '../../../src/core/analysis';
import { windowScan, WINDOW_SCAN } from '../../../src/core/analysis/window-scan';
import { wegnerEffectiveBeta } from '../../../src/core/physics/critical';
import { messageText } from '../../../src/core/messages';
import { normal } from '../physics/prng';

// Invented material: Tc = 412.5 K, B = 1.35 (arbitrary units). Ms = B|t|^β(1 + aM|t|^Δ) with
// β = 0.3265, Δ = 0.52, aM = −0.3 [B17 in REFERENCES.md; the C6 example], 0.1 % relative noise.
const TC = 412.5;
const BETA = 0.3265;
const DELTA = 0.52;
const AM = -0.3;

function wegnerData(seed: number, n = 120): { T: number[]; y: number[] } {
  const rnd = normal(seed);
  const T: number[] = [];
  const y: number[] = [];
  for (let i = 0; i < n; i++) {
    // |t| log-spaced from 0.3 down to 1e-3
    const t = 0.3 * Math.pow(1e-3 / 0.3, i / (n - 1));
    T.push(TC * (1 - t));
    y.push(1.35 * Math.pow(t, BETA) * (1 + AM * Math.pow(t, DELTA)) * (1 + 0.001 * rnd()));
  }
  return { T, y };
}

function job(T: number[], y: number[], kind = 'power-law', options: IAnalysisJob['options'] = {}): IAnalysisJob {
  return { kind, x: T, y, window: { min: -Infinity, max: Infinity }, options };
}

describe('windowScan', () => {
  const { T, y } = wegnerData(2024);

  it('moves β_eff towards the asymptotic β as t_max falls', () => {
    const scan = windowScan(job(T, y), {})!;
    expect(scan).not.toBeNull();
    const cells = scan.cells;
    expect(cells.length).toBeGreaterThanOrEqual(8);
    // t_max in decreasing order, each window's Tc its own
    for (let i = 1; i < cells.length; i++) {
      expect(cells[i].tMax).toBeLessThan(cells[i - 1].tMax);
    }
    const first = cells[0];
    const last = cells[cells.length - 1];
    // Asserted: the smallest window is closer to β = 0.3265 than the widest, and the
    // widest lies below β as the closed form says (β_eff(0.1) = 0.27469532 [C6]).
    expect(Math.abs(last.beta.value - BETA)).toBeLessThan(Math.abs(first.beta.value - BETA));
    expect(first.beta.value).toBeLessThan(BETA - 0.02);
    expect(wegnerEffectiveBeta(BETA, DELTA, AM, 0.1)).toBeCloseTo(0.27469532, 7);
    // Monotone trend: β of the narrower half of the windows above that of the wider half.
    const half = Math.floor(cells.length / 2);
    const mean = (cs: typeof cells) => cs.reduce((s, c) => s + c.beta.value, 0) / cs.length;
    expect(mean(cells.slice(half))).toBeGreaterThan(mean(cells.slice(0, half)));
    for (const c of cells) {
      expect(c.n).toBeGreaterThanOrEqual(WINDOW_SCAN.minPoints);
      expect(Number.isFinite(c.beta.sigma)).toBe(true);
      expect(Number.isFinite(c.Tc.value)).toBe(true);
    }
    expect(scan.classes.map(c => c.id)).toContain('3d-ising');
    expect(scan.classes.find(c => c.id === '3d-ising')!.beta).toBeCloseTo(0.32648, 5);
    expect(messageText(scan.suggested.reason).length).toBeGreaterThan(20);
    // The suggested window is one whose fit describes the data (the rule of suggestWindow).
    expect(scan.suggested.tMax).not.toBeNull();
    expect(cells.find(c => c.tMax === scan.suggested.tMax)!.verdict).toBe('fits');
  });

  it('recovers β and Tc within 2σ with the Wegner term, Δ fixed to 0.52 (the panel defaults)', () => {
    const out = runAnalysisJob(job(T, y, 'power-law-corrected', {}));
    expect(out.fit.converged).toBe(true);
    const beta = out.derived.find(d => d.name === 'β')!;
    const Tc = out.derived.find(d => d.name === 'Tc')!;
    expect(Math.abs(beta.value - BETA)).toBeLessThan(2 * beta.sigma);
    expect(Math.abs(Tc.value - TC)).toBeLessThan(2 * Tc.sigma);
  });

  it('fits Δ too when asked (choice 0 = free)', () => {
    const out = runAnalysisJob(job(T, y, 'power-law-corrected', { wegnerDelta: 0 }));
    const d = out.derived.find(v => v.name === 'Δ')!;
    const beta = out.derived.find(v => v.name === 'β')!;
    expect(out.fit.converged).toBe(true);
    expect(out.fit.parameters).toContain('Delta');
    // Δ = 0.52 and β = 0.3265 of the data, within 3σ (three correlated parameters; seed 2024).
    expect(Math.abs(d.value - DELTA)).toBeLessThan(3 * d.sigma);
    expect(Math.abs(beta.value - BETA)).toBeLessThan(3 * beta.sigma);
  });
});

describe('windowScan on awkward input', () => {
  const { T, y } = wegnerData(99, 60);

  it('refuses fewer than 6 points, naming the count', () => {
    let err: unknown = null;
    try {
      windowScan(job(T.slice(0, 5), y.slice(0, 5)));
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(AnalysisInputError);
    expect((err as AnalysisInputError).detail.code).toBe('window-scan.too-few-points');
  });

  it('refuses data with no points below Tc (a flat paramagnetic tail)', () => {
    const rnd = normal(3);
    const Tp = Array.from({ length: 40 }, (_, i) => 420 + i);
    const yp = Tp.map(() => 0.001 * rnd());
    expect(() => windowScan(job(Tp, yp))).toThrow(AnalysisInputError);
  });

  it('leaves NaN rows out and says how many', () => {
    const Tn = T.slice();
    const yn = y.slice();
    yn[10] = Number.NaN;
    Tn[20] = Number.NaN;
    const scan = windowScan(job(Tn, yn))!;
    expect(scan.cells.length).toBeGreaterThan(3);
    expect(scan.warnings.map(w => w.code)).toContain('window-scan.skipped');
    expect(scan.cells.every(c => Number.isFinite(c.beta.value))).toBe(true);
  });

  it('returns null when stopped, and reports progress up to 1', () => {
    const fractions: number[] = [];
    let calls = 0;
    expect(windowScan(job(T, y), {}, { shouldStop: () => ++calls > 40 })).toBeNull();
    const scan = windowScan(job(T, y), { tMaxs: [0.2, 0.05, -1, Number.NaN] }, { onProgress: f => fractions.push(f) })!;
    expect(scan.cells.map(c => c.tMax)).toEqual([0.2, 0.05]);
    expect(scan.warnings.map(w => w.code)).toContain('window-scan.bad-tmax');
    expect(fractions[fractions.length - 1]).toBe(1);
  });

  it('scans a non-power-law job with the plain power law and says so', () => {
    const scan = windowScan(job(T, y, 'weiss', { J: 0.5 }))!;
    expect(scan.warnings.map(w => w.code)).toContain('window-scan.plain-power-law');
  });
});

describe('power law with Δ fitted', () => {
  it('has the Jacobian of central differences, the ∂/∂Δ column included', async () => {
    const { powerLawModel } = await import('../../../src/core/physics/critical');
    const model = powerLawModel({ freeDelta: true, background: true });
    expect(model.parameters).toEqual(['A', 'Tc', 'beta', 'y0', 'aW', 'Delta']);
    const p = Float64Array.from([1.3, 400, 0.33, 0.01, -0.3, 0.52]);
    const x = Float64Array.from([300, 350, 380, 399, 401]);
    const k = p.length;
    const jac = new Float64Array(x.length * k);
    const out = new Float64Array(x.length);
    model.evaluateWithJacobian!(p, x, out, jac);
    for (let j = 0; j < k; j++) {
      const h = 1e-6 * Math.max(1, Math.abs(p[j]));
      const up = Float64Array.from(p);
      const dn = Float64Array.from(p);
      up[j] += h;
      dn[j] -= h;
      const a = new Float64Array(x.length);
      const b = new Float64Array(x.length);
      model.evaluate(up, x, a);
      model.evaluate(dn, x, b);
      for (let i = 0; i < x.length; i++) {
        expect(jac[i * k + j]).toBeCloseTo((a[i] - b[i]) / (2 * h), 5);
      }
    }
  });
});
