/**
 * An outcome's model at other parameter values: at the fitted values it
 * gives back the drawn curve, the residuals and χ² of the fit for every
 * kind and weighting; away from them χ² grows as the covariance says; the
 * job's start values are honoured by every kind.
 */
import { describe, expect, it } from 'vitest';
import { runAnalysisJob } from '../../../src/core/analysis';
import type { IAnalysisJob, IAnalysisOutcome } from '../../../src/core/analysis';
import { modelCurve } from '../../../src/core/analysis/model-curve';
import { beanRodbellMagnetisation } from '../../../src/core/physics/bean-rodbell';
import { landauEquilibriumPsi } from '../../../src/core/physics/landau';
import { weissMagnetisation } from '../../../src/core/physics/weiss';
import { normal } from '../physics/prng';

const ALL = { min: -Infinity, max: Infinity };

function weissJob(seed: number, extra: Partial<IAnalysisJob> = {}): IAnalysisJob {
  const rnd = normal(seed);
  const T = Array.from({ length: 120 }, (_, i) => 20 + (320 * i) / 119);
  const m = weissMagnetisation(0.5, T.map(t => t / 287.4));
  return { kind: 'weiss', x: T, y: T.map((_, i) => 92.3 * m[i] + 0.4 * rnd()), window: { min: 0, max: 1000 }, options: { J: 0.5 }, ...extra };
}

function powerLawJob(kind: string, options: Record<string, string | number | boolean>): IAnalysisJob {
  const rnd = normal(77);
  const T = Array.from({ length: 120 }, (_, i) => 150 + i * 1.2);
  const y = T.map(t => {
    const u = Math.max(0, 1 - t / 300);
    return 2 * Math.pow(u, 0.3265) * (1 + 0.8 * Math.pow(u, 0.52)) + 0.0005 * rnd();
  });
  return { kind, x: T, y, window: { min: 150, max: 299 }, options };
}

function landauJobs(): Record<string, IAnalysisJob> {
  const k = { a: 0.8, T0: 240, b: 1.5, c: 0.6, d: 0 };
  const rnd = normal(99);
  const T = Array.from({ length: 100 }, (_, i) => 210 + 0.6 * i);
  const psi = T.map(t => landauEquilibriumPsi(k, t) + 0.003 * rnd());
  const chi = T.map(t => {
    const q = landauEquilibriumPsi(k, t) ** 2;
    return k.a * (t - k.T0) + 3 * k.b * q + 5 * k.c * q * q + 0.05 * rnd();
  });
  return {
    'landau ψ only': { kind: 'landau', x: T, y: psi, window: ALL, options: {} },
    'landau with 1/χ': { kind: 'landau', x: T, y: psi, window: ALL, options: { inverseChi: '1/chi' }, columns: { inverseChi: chi } },
    'landau with ΔC': { kind: 'landau', x: T, y: psi, window: ALL, options: { specificHeatJump: '51.2 ± 1' } }
  };
}

function jobs(): Record<string, IAnalysisJob> {
  const rnd = normal(3);
  const Tcw = Array.from({ length: 40 }, (_, i) => 100 + 5 * i);
  const chi = Tcw.map(t => (0.001 + 7.87811 / (t - 15)) * (1 + 0.002 * rnd()));
  const Tbr = Array.from({ length: 60 }, (_, i) => 0.55 * 250 + (0.6 * 250 * i) / 59);
  const sbr = beanRodbellMagnetisation(0.5, 2, Tbr.map(t => t / 250));
  const rb = normal(7);
  const w = weissJob(11);
  return {
    'weiss, equal weights': w,
    'weiss, σ column': { ...w, sigma: Array.from(w.x, () => 0.4) },
    'weiss, relative weights estimated': { ...w, weights: { mode: 'relative', fraction: null } },
    'weiss, relative weights given': { ...w, weights: { mode: 'relative', fraction: 0.01 } },
    'weiss, J fitted': { ...w, options: { J: 1, freeJ: true } },
    'curie-weiss': { kind: 'curie-weiss', x: Tcw, y: chi, window: ALL, options: { units: 'cgs-emu' } },
    'power-law': powerLawJob('power-law', { proxyPower: 1 }),
    'power-law with background': powerLawJob('power-law', { proxyPower: 1, background: true }),
    'power-law-corrected': powerLawJob('power-law-corrected', { wegnerDelta: 0.52 }),
    'power-law-corrected, Δ free': powerLawJob('power-law-corrected', { wegnerDelta: 0 }),
    ...landauJobs(),
    'bean-rodbell': { kind: 'bean-rodbell', x: Tbr, y: Tbr.map((_, i) => 5 * sbr[i] + 0.01 * rb()), window: ALL, options: { J: 0.5 } },
    expression: { kind: 'expression', x: Tcw, y: chi, window: ALL, options: { expression: 'C/(T - theta) + c0', starts: 'C = 5, theta = 0' }, xNames: ['T (K)'] }
  };
}

/** |a − b| within `rel` of the larger magnitude (NaN matches NaN). */
function close(a: number, b: number, rel: number, scale = 0): boolean {
  if (Number.isNaN(a) || Number.isNaN(b)) {
    return Number.isNaN(a) && Number.isNaN(b);
  }
  return Math.abs(a - b) <= rel * Math.max(Math.abs(a), Math.abs(b), scale);
}

const OUTCOMES = new Map<string, [IAnalysisJob, IAnalysisOutcome]>(Object.entries(jobs()).map(([name, job]) => [name, [job, runAnalysisJob(job)]]));

describe('modelCurve at the fitted values', () => {
  it.each([...OUTCOMES.keys()])('reproduces the curve, the residuals and χ² of the fit: %s', name => {
    const [job, outcome] = OUTCOMES.get(name)!;
    const m = modelCurve(job, outcome);
    expect(m).not.toBeNull();
    expect(m!.parameters).toEqual(outcome.fit.parameters);
    const ev = m!.evaluate(outcome.fit.values);
    expect(ev.curveY.length).toBe(outcome.curve.y.length);
    let scale = 0;
    for (const v of outcome.curve.y) {
      scale = Number.isFinite(v) ? Math.max(scale, Math.abs(v)) : scale;
    }
    const badCurve = outcome.curve.y.filter((v, i) => !close(ev.curveY[i], v, 1e-9, scale)).length;
    expect(badCurve).toBe(0);
    // χ² within 1e-9 relative of the engine's.
    expect(Math.abs(ev.chi2 - outcome.fit.chi2)).toBeLessThanOrEqual(1e-9 * outcome.fit.chi2);
    expect(ev.reducedChi2).toBeCloseTo(outcome.fit.reducedChi2, 9);
    let rScale = 0;
    for (const r of outcome.fit.residuals) {
      rScale = Math.max(rScale, Math.abs(r));
    }
    expect(outcome.fit.residuals.filter((r, i) => !close(ev.residuals[i], r, 1e-6, rScale)).length).toBe(0);
  });

  it('weights χ² as the fit did: σ column, relative σ = f·|y|, equal', () => {
    const [, equal] = OUTCOMES.get('weiss, equal weights')!;
    const [, sigma] = OUTCOMES.get('weiss, σ column')!;
    const [job, relative] = OUTCOMES.get('weiss, relative weights given')!;
    expect(equal.fit.errorScaling).toBe('scaled-by-reduced-chi2');
    expect(sigma.fit.errorScaling).toBe('from-sigma');
    // The same residuals over σ = 0.4 give χ²/0.16.
    const m = modelCurve(job, relative)!;
    expect(m.sigma![0]).toBeCloseTo(0.01 * Math.abs(job.y[0]), 12);
    const mEqual = modelCurve(OUTCOMES.get('weiss, equal weights')![0], equal)!;
    expect(mEqual.sigma).toBeNull();
    const mSigma = modelCurve(OUTCOMES.get('weiss, σ column')![0], sigma)!;
    const v = equal.fit.values;
    expect(mSigma.evaluate(v).chi2).toBeCloseTo(mEqual.evaluate(v).chi2 / 0.16, 6);
  });

  it('evaluates again and again into the same arrays', () => {
    const [job, outcome] = OUTCOMES.get('weiss, equal weights')!;
    const m = modelCurve(job, outcome)!;
    const a = m.evaluate(outcome.fit.values);
    const curve = a.curveY;
    const b = m.evaluate([outcome.fit.values[0], outcome.fit.values[1] + 5]);
    expect(b.curveY).toBe(curve);
    expect(b.residuals).toBe(a.residuals);
  });
});

describe('modelCurve away from the fit', () => {
  it('gives Δχ² = 1 at ±1σ for one parameter with known σ', () => {
    // Press, Teukolsky, Vetterling & Flannery, Numerical Recipes (3rd ed., 2007) §15.6: with known σ,
    // χ² − χ²_min = 1 bounds the 68.3 % interval of one parameter; for a model linear in it, exactly at ±σ.
    const rnd = normal(21);
    const x = Array.from({ length: 30 }, (_, i) => 1 + i);
    const y = x.map(t => 2.5 * t + 0.3 * rnd());
    const job: IAnalysisJob = { kind: 'expression', x, y, sigma: x.map(() => 0.3), window: ALL, options: { expression: 'A*x' } };
    const outcome = runAnalysisJob(job);
    const m = modelCurve(job, outcome)!;
    const [A] = outcome.fit.values;
    const s = outcome.fit.standardErrors[0];
    const at = m.evaluate([A]).chi2;
    expect(m.evaluate([A + s]).chi2 - at).toBeCloseTo(1, 9);
    expect(m.evaluate([A - s]).chi2 - at).toBeCloseTo(1, 9);
    expect(m.evaluate([A + 2 * s]).chi2 - at).toBeCloseTo(4, 8);
  });

  it('grows χ² by σ_i²·(C⁻¹)_ii ≥ 1 when one parameter of a nonlinear fit moves by its σ', () => {
    // The same section: with the other parameters held, Δχ² = δ²/σ_i² · 1/(1 − ρ²) for two
    // parameters of correlation ρ (the quadratic form of the inverse covariance), about 1 when ρ is small.
    const [job, outcome] = OUTCOMES.get('weiss, σ column')!;
    const m = modelCurve(job, outcome)!;
    const v = outcome.fit.values;
    const cov = outcome.fit.covariance;
    const rho = cov[0][1] / Math.sqrt(cov[0][0] * cov[1][1]);
    const at = m.evaluate(v).chi2;
    for (const i of [0, 1]) {
      const s = outcome.fit.standardErrors[i];
      for (const sign of [1, -1]) {
        const p = v.slice();
        p[i] += sign * s;
        const delta = m.evaluate(p).chi2 - at;
        expect(delta).toBeGreaterThan(0.95);
        expect(Math.abs(delta - 1 / (1 - rho * rho))).toBeLessThan(0.05 / (1 - rho * rho));
      }
    }
  });
});

describe('modelCurve edge cases', () => {
  it('is null for an outcome of other points, another expression or an unknown kind', () => {
    const [job, outcome] = OUTCOMES.get('weiss, equal weights')!;
    expect(modelCurve({ ...job, x: Array.from(job.x).slice(0, 60), y: Array.from(job.y).slice(0, 60) }, outcome)).toBeNull();
    expect(modelCurve(job, { ...outcome, kind: 'no-such-kind' })).toBeNull();
    const [ejob, eout] = OUTCOMES.get('expression')!;
    expect(modelCurve({ ...ejob, options: { expression: 'a*x + b + q' } }, eout)).toBeNull();
    expect(modelCurve({ ...ejob, options: { expression: '((' } }, eout)).toBeNull();
  });

  it('uses the outcome window, not the job window', () => {
    const [job, outcome] = OUTCOMES.get('weiss, equal weights')!;
    expect(modelCurve({ ...job, window: { min: 100, max: 200 } }, outcome)).not.toBeNull();
  });

  it('refuses the wrong number of values and gives NaN, without throwing, for values the model cannot take', () => {
    const [job, outcome] = OUTCOMES.get('bean-rodbell')!;
    const m = modelCurve(job, outcome)!;
    expect(() => m.evaluate([1, 2])).toThrow(RangeError);
    const ev = m.evaluate([5, -10, 2]);
    expect(Number.isNaN(ev.chi2)).toBe(true);
    expect(ev.curveY.every(Number.isNaN)).toBe(true);
    const w = modelCurve(...OUTCOMES.get('weiss, equal weights')!)!;
    expect(Number.isNaN(w.evaluate([Number.NaN, 280]).chi2)).toBe(true);
  });

  it('gives NaN for χ²_red without degrees of freedom', () => {
    const job: IAnalysisJob = { kind: 'expression', x: [1, 2], y: [2, 4.1], window: ALL, options: { expression: 'A*x' } };
    const outcome = runAnalysisJob(job);
    const m = modelCurve(job, { ...outcome, fit: { ...outcome.fit, dof: 0 } })!;
    expect(Number.isNaN(m.evaluate(outcome.fit.values).reducedChi2)).toBe(true);
  });
});

describe('start values of a job', () => {
  it.each([...OUTCOMES.keys()])('are taken by every kind, unknown names and non-finite values ignored: %s', name => {
    const [job, outcome] = OUTCOMES.get(name)!;
    const start: Record<string, number> = { 'no such parameter': 1, [outcome.fit.parameters[0]]: Number.NaN };
    outcome.fit.parameters.forEach((p, i) => {
      if (i > 0) {
        start[p] = outcome.fit.values[i];
      }
    });
    const again = runAnalysisJob({ ...job, start });
    expect(again.fit.parameters).toEqual(outcome.fit.parameters);
    // From (most of) the optimum the fit ends where it ended before.
    again.fit.values.forEach((v, i) => expect(close(v, outcome.fit.values[i], 1e-4, 4 * outcome.fit.standardErrors[i])).toBe(true));
  });

  it('start a fit where asked: from the fitted values the fit needs no more iterations than from its own start', () => {
    for (const name of ['weiss, equal weights', 'curie-weiss', 'power-law', 'bean-rodbell', 'expression', 'landau with 1/χ']) {
      const [job, outcome] = OUTCOMES.get(name)!;
      const start = Object.fromEntries(outcome.fit.parameters.map((p, i) => [p, outcome.fit.values[i]]));
      const again = runAnalysisJob({ ...job, start });
      expect(again.fit.iterations, name).toBeLessThanOrEqual(outcome.fit.iterations);
    }
  });

  it('moves the expression fit into another minimum from a start the user gives', () => {
    // y = sin(ω x) has many local minima in ω: the start decides which one the fit finds.
    const x = Array.from({ length: 60 }, (_, i) => 0.1 * i);
    const y = x.map(t => Math.sin(2 * t));
    const job: IAnalysisJob = { kind: 'expression', x, y, window: ALL, options: { expression: 'sin(w*x)', starts: 'w = 2.1' } };
    expect(runAnalysisJob(job).fit.values[0]).toBeCloseTo(2, 6);
    const far = runAnalysisJob({ ...job, start: { w: 7 } });
    expect(Math.abs(far.fit.values[0] - 2)).toBeGreaterThan(0.5);
  });
});
