/**
 * Double-double refinement of converged fits (src/core/fit/refine.ts):
 * a synthetic problem whose exact minimum χ² is known by construction
 * (residuals orthogonal to the Jacobian columns at the chosen parameters,
 * so those parameters are the exact minimiser and χ²_min = Σ dᵢ²,
 * evaluated with BigInt fractions), where binary64 cannot get χ² right;
 * ordinary fits left bit-for-bit untouched; failing precise evaluations;
 * validation of the low parts.
 */
import { describe, expect, it } from 'vitest';
import { messageText } from '../../../src/core/messages';
import { FIT_DEFAULTS, FitInputError, fitCurve } from '../../../src/core/fit/index';
import type { IFitModel, IFitResult } from '../../../src/core/fit/index';
import * as DD from '../../../src/core/numeric/dd/index';
import { fromDouble, plus, times, toNumber } from '../numeric/dd/exact';
import { decay } from './models';
import type { IFraction } from '../numeric/dd/exact';
import { mulberry32 } from '../../../src/core/numeric/random';

/** f = a·exp(−b·x) + c, with analytic Jacobian and a double-double evaluator. */
function decayModel(precise: 'dd' | 'none' | 'throws' | 'nan' | 'wrong' = 'dd'): IFitModel {
  const model: IFitModel = { ...decay };
  if (precise === 'dd') {
    model.evaluatePrecise = (p, x, out) => {
      const a = { hi: p.hi[0], lo: p.lo[0] };
      const b = { hi: p.hi[1], lo: p.lo[1] };
      const c = { hi: p.hi[2], lo: p.lo[2] };
      for (let i = 0; i < x.hi.length; i++) {
        const xi = { hi: x.hi[i], lo: x.lo[i] };
        const v = DD.add(DD.mul(a, DD.exp(DD.neg(DD.mul(b, xi)))), c);
        out.hi[i] = v.hi;
        out.lo[i] = v.lo;
      }
    };
  } else if (precise === 'throws') {
    model.evaluatePrecise = () => {
      throw new Error('no precise model today');
    };
  } else if (precise === 'wrong') {
    // A different function: a·exp(−b·x) + c + 1e-10.
    model.evaluatePrecise = (p, x, out) => {
      for (let i = 0; i < x.hi.length; i++) {
        const v = DD.add(DD.dd(p.hi[0] * Math.exp(-p.hi[1] * x.hi[i]) + p.hi[2]), DD.dd(1e-10));
        out.hi[i] = v.hi;
        out.lo[i] = v.lo;
      }
    };
  } else if (precise === 'nan') {
    model.evaluatePrecise = (_p, _x, out) => {
      out.hi.fill(Number.NaN);
    };
  }
  return model;
}

const TRUE_P = [1.5, 0.8, 0.25];
const N = 30;

interface ISynthetic {
  x: number[];
  xLow: number[];
  y: number[];
  yLow: number[];
  sigma?: number[];
  /** Residuals y − f at TRUE_P (binary64 numbers, exact). */
  d: number[];
  /** Exact minimum χ² = Σ (wᵢ dᵢ)². */
  chi2: IFraction;
}

/**
 * Data y = f(x; TRUE_P) + d in double-double, with x = i/20 as exact
 * decimals and d (≈ 3e-14) orthogonal, in the weighted inner product, to
 * the Jacobian columns at TRUE_P (Gram–Schmidt twice).
 */
function synthetic(weighted: boolean): ISynthetic {
  const xdd = Array.from({ length: N }, (_, i) => DD.decimalToDoubleDouble((i / 20).toFixed(2)));
  const sigma = weighted ? Array.from({ length: N }, (_, i) => 0.5 + i / 60) : undefined;
  const w = Array.from({ length: N }, (_, i) => (sigma ? 1 / sigma[i] : 1));
  const [a, b] = TRUE_P;
  const cols = [
    xdd.map((x, i) => Math.exp(-b * x.hi) * w[i]),
    xdd.map((x, i) => -a * x.hi * Math.exp(-b * x.hi) * w[i]),
    xdd.map((_, i) => w[i])
  ];
  const rand = mulberry32(2024);
  let e = Array.from({ length: N }, () => rand() - 0.5);
  for (let pass = 0; pass < 2; pass++) {
    for (let j = 0; j < 3; j++) {
      // Orthogonalise the columns among themselves once, lazily (j-th against earlier ones).
      const q = cols[j].slice();
      for (let m = 0; m < j; m++) {
        const qm = cols[m];
        const dot = q.reduce((s, v, i) => s + v * qm[i], 0) / qm.reduce((s, v) => s + v * v, 0);
        for (let i = 0; i < N; i++) {
          q[i] -= dot * qm[i];
        }
      }
      cols[j] = q;
      const dot = e.reduce((s, v, i) => s + v * q[i], 0) / q.reduce((s, v) => s + v * v, 0);
      e = e.map((v, i) => v - dot * q[i]);
    }
  }
  const d = e.map((v, i) => (v * 6e-14) / w[i]);
  const model = decayModel('dd');
  const p = { hi: Float64Array.from(TRUE_P), lo: new Float64Array(3) };
  const xArr = { hi: Float64Array.from(xdd, (v) => v.hi), lo: Float64Array.from(xdd, (v) => v.lo) };
  const f = { hi: new Float64Array(N), lo: new Float64Array(N) };
  model.evaluatePrecise!(p, xArr, f);
  const y = Array.from({ length: N }, (_, i) => DD.add({ hi: f.hi[i], lo: f.lo[i] }, { hi: d[i], lo: 0 }));
  let chi2: IFraction = { num: 0n, den: 1n };
  for (let i = 0; i < N; i++) {
    const r = times(fromDouble(d[i]), fromDouble(w[i]));
    chi2 = plus(chi2, times(r, r));
  }
  return {
    x: xdd.map((v) => v.hi),
    xLow: xdd.map((v) => v.lo),
    y: y.map((v) => v.hi),
    yLow: y.map((v) => v.lo),
    sigma,
    d,
    chi2
  };
}

const START = [1.3, 0.9, 0.2];

function relErr(a: number, b: number): number {
  return Math.abs(a - b) / Math.abs(b);
}

describe('double-double refinement', () => {
  for (const weighted of [false, true]) {
    it(`recovers the exact minimum χ² where binary64 cannot (${weighted ? 'with σ' : 'no σ'})`, () => {
      const s = synthetic(weighted);
      const exact = toNumber(s.chi2);
      const data = { x: s.x, y: s.y, sigma: s.sigma, xLow: s.xLow, yLow: s.yLow };
      const refined = fitCurve(decayModel('dd'), data, { start: START });
      const plain = fitCurve(decayModel('none'), data, { start: START });
      expect(refined.converged).toBe(true);
      expect(plain.converged).toBe(true);
      expect(refined.residualArithmetic).toBe('double-double');
      expect(plain.residualArithmetic).toBe('binary64');
      expect(refined.notes.map((n) => n.code)).toEqual(['fit.note.double-double-exact-data']);
      expect(messageText(refined.notes[0])).toMatch(/^χ² and the residuals were computed with about 32 significant digits from the data exactly as written, after \d+ refinement steps/);
      // binary64: χ² is off in the first digits; double-double: to ~1e-12 or better.
      expect(relErr(plain.chi2, exact)).toBeGreaterThan(1e-6);
      expect(relErr(refined.chi2, exact)).toBeLessThan(1e-12);
      // The parameters are the exact minimiser TRUE_P, to rounding.
      refined.values.forEach((v, j) => expect(relErr(v, TRUE_P[j])).toBeLessThan(2.3e-16));
      // Residuals y − f are d.
      const dMax = s.d.reduce((m, v) => Math.max(m, Math.abs(v)), 0);
      refined.residuals.forEach((r, i) => expect(Math.abs(r - s.d[i])).toBeLessThan(1e-12 * dMax));
      if (weighted) {
        // Known σ: errors do not depend on χ², so both fits agree on them.
        refined.standardErrors.forEach((v, j) => expect(relErr(v, plain.standardErrors[j])).toBeLessThan(1e-6));
      } else {
        // Errors scaled by √(χ²/dof) use the refined χ².
        const dof = N - 3;
        refined.standardErrors.forEach((v, j) => {
          const unscaled = (plain.standardErrors[j] ** 2 * dof) / plain.chi2;
          expect(relErr(v, Math.sqrt((unscaled * exact) / dof))).toBeLessThan(1e-6);
        });
      }
    });
  }

  it('refines with a fixed parameter too', () => {
    const s = synthetic(false);
    const r = fitCurve(decayModel('dd'), { x: s.x, y: s.y, xLow: s.xLow, yLow: s.yLow }, {
      start: [1.3, 0.9, TRUE_P[2]],
      fixed: [false, false, true]
    });
    expect(r.residualArithmetic).toBe('double-double');
    expect(relErr(r.chi2, toNumber(s.chi2))).toBeLessThan(1e-12);
    expect(r.values[2]).toBe(TRUE_P[2]);
  });

  it('without the low parts it refines the binary64-rounded data (a different, also exact, minimum)', () => {
    const s = synthetic(false);
    const r = fitCurve(decayModel('dd'), { x: s.x, y: s.y }, { start: START });
    expect(r.residualArithmetic).toBe('double-double');
    expect(r.notes.map((n) => n.code)).toEqual(['fit.note.double-double']);
    // Dropping yLow (≈ 1e-17) and xLow moves χ² by far more than 1e-12.
    expect(relErr(r.chi2, toNumber(s.chi2))).toBeGreaterThan(1e-6);
  });

  it('leaves ordinary fits untouched: same numbers with or without evaluatePrecise and low parts', () => {
    const rand = mulberry32(7);
    const x = Array.from({ length: 40 }, (_, i) => i / 10);
    const y = x.map((v) => 2 * Math.exp(-0.7 * v) + 0.1 + 1e-3 * (rand() - 0.5));
    const xLow = x.map(() => 0);
    const yLow = y.map(() => 0);
    const a = fitCurve(decayModel('dd'), { x, y, xLow, yLow }, { start: START });
    const b = fitCurve(decayModel('none'), { x, y }, { start: START });
    expect(a.converged).toBe(true);
    expect(a.residualArithmetic).toBe('binary64');
    expect(a).toEqual(b);
    // χ² is far above the rounding noise that triggers refinement.
    expect(a.chi2 * FIT_DEFAULTS.refineNoiseFraction).toBeGreaterThan(1e-20);
  });

  it('skips refinement with a warning when the precise evaluation throws, returns NaN or computes another function', () => {
    const s = synthetic(false);
    const data = { x: s.x, y: s.y, xLow: s.xLow, yLow: s.yLow };
    const plain = fitCurve(decayModel('none'), data, { start: START });
    for (const kind of ['throws', 'nan', 'wrong'] as const) {
      const r: IFitResult = fitCurve(decayModel(kind), data, { start: START });
      expect(r.converged).toBe(true);
      expect(r.residualArithmetic).toBe('binary64');
      expect(r.values).toEqual(plain.values);
      expect(r.chi2).toBe(plain.chi2);
      const warning = r.warnings.find((w) => w.code.startsWith('fit.refine-skipped.'));
      const why = { throws: 'fit.refine-skipped.precise-failed', nan: 'fit.refine-skipped.precise-not-finite', wrong: 'fit.refine-skipped.precise-disagrees' };
      expect(warning?.code, kind).toBe(why[kind]);
      if (kind === 'throws') {
        expect(messageText(warning!)).toMatch(/no precise model today/);
      }
    }
  });

  it('does not refine above FIT_DEFAULTS.largeRows points (warning instead)', () => {
    const n = FIT_DEFAULTS.largeRows + 1;
    const x = Array.from({ length: n }, (_, i) => i / n);
    const y = x.map((v) => TRUE_P[0] * Math.exp(-TRUE_P[1] * v) + TRUE_P[2]);
    const r = fitCurve(decayModel('dd'), { x, y }, { start: START });
    expect(r.converged).toBe(true);
    expect(r.residualArithmetic).toBe('binary64');
    const warning = r.warnings.find((w) => w.code === 'fit.refine-skipped.too-many-points');
    expect(warning && messageText(warning)).toMatch(/at most 20000 points/);
  });

  it('does not refine a fit that did not converge', () => {
    const s = synthetic(false);
    const r = fitCurve(decayModel('dd'), { x: s.x, y: s.y, xLow: s.xLow, yLow: s.yLow }, { start: START, maxEvaluations: 3 });
    expect(r.converged).toBe(false);
    expect(r.residualArithmetic).toBe('binary64');
  });
});

describe('validation of the low parts', () => {
  const x = [0, 1, 2, 3];
  const y = [1, 0.5, 0.25, 0.125];
  const opts = { start: [1, 1, 0] };
  it('rejects a wrong length, non-finite entries and entries above one ulp', () => {
    expect(() => fitCurve(decayModel(), { x, y, xLow: [0, 0, 0] }, opts)).toThrow('There are 3 low-order parts of x for 4 points: give one per point.');
    expect(() => fitCurve(decayModel(), { x, y, yLow: [0, Number.NaN, 0, 0] }, opts)).toThrow(FitInputError);
    expect(() => fitCurve(decayModel(), { x, y, yLow: [0, Infinity, 0, 0] }, opts)).toThrow(/^Low-order part 2 of y is ∞: /);
    expect(() => fitCurve(decayModel(), { x, y, yLow: [0, 1e-15, 0, 0] }, opts)).toThrow(
      /^Low-order part 2 of y \(1e-15\) is larger than one unit in the last place of its value \(0\.5\)/
    );
    // Zero high part: only a low part of at most the smallest subnormal.
    expect(() => fitCurve(decayModel(), { x, y, xLow: [1e-300, 0, 0, 0] }, opts)).toThrow(/^Low-order part 1 of x /);
  });

  it('accepts low parts up to one ulp', () => {
    const ulpHalf = 2 ** -53; // ulp(0.5) = 2^-53
    const r = fitCurve(decayModel(), { x, y, yLow: [0, ulpHalf, 0, 0] }, opts);
    expect(r.parameters).toEqual(['a', 'b', 'c']);
  });
});
