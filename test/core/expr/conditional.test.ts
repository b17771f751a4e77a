/**
 * Comparisons, `and`/`or`/`xor`/`not`, chained comparisons, min/max and the
 * conditional `c ? a : b` in models: values of the generated kernel, of
 * the mathjs fallback and of the double-double evaluator, and the symbolic
 * Jacobian (the conditional of the derivatives; comparisons have
 * derivative zero).
 *
 * Reference values: mathjs evaluation and mathjs `derivative` of each
 * branch (mathjs.org, the library the models are parsed with), and central
 * differences. Points are kept away from the switching points, where
 * mathjs compares with a relative tolerance of 1e-12 and the kernels
 * exactly.
 */
import { derivative, evaluate } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { parseExpressionModel } from '../../../src/core/expr/index';
import type { IExpressionModel } from '../../../src/core/expr/index';
import { fitCurve } from '../../../src/core/fit/index';
import * as DD from '../../../src/core/numeric/dd/index';

function values(m: IExpressionModel, p: number[], xs: number[]): number[] {
  const out = new Float64Array(xs.length);
  m.evaluate(Float64Array.from(p), Float64Array.from(xs), out);
  return Array.from(out);
}

function jacobian(m: IExpressionModel, p: number[], xs: number[]): number[] {
  const out = new Float64Array(xs.length * p.length);
  m.jacobian!(Float64Array.from(p), Float64Array.from(xs), out);
  return Array.from(out);
}

function precise(m: IExpressionModel, p: number[], xs: number[]): number[] {
  const out = { hi: new Float64Array(xs.length), lo: new Float64Array(xs.length) };
  m.evaluatePrecise!({ hi: Float64Array.from(p), lo: new Float64Array(p.length) }, { hi: Float64Array.from(xs), lo: new Float64Array(xs.length) }, out);
  return Array.from(out.hi, (hi, i) => DD.toNumber({ hi, lo: out.lo[i] }));
}

/** mathjs value of `text` with booleans as 1/0 (reference). */
function reference(text: string, scope: Record<string, number>): number {
  const v: unknown = evaluate(text, scope);
  return typeof v === 'boolean' ? (v ? 1 : 0) : (v as number);
}

const CASES: { text: string; variable: string; p: Record<string, number>; xs: number[] }[] = [
  { text: 'T < Tc ? A*(1 - T/Tc)^beta : 0', variable: 'T', p: { Tc: 120, A: 2, beta: 0.33 }, xs: [5, 60, 119, 121, 300] },
  { text: 'x >= a', variable: 'x', p: { a: 1.5 }, xs: [0, 1, 2, 3] },
  { text: 'x > a and x < b ? c : d*x', variable: 'x', p: { a: 1, b: 3, c: 5, d: -2 }, xs: [0.5, 2, 4] },
  { text: '(x < a or x > b) * c + (not (x > a)) * d + (x > a xor x > b) * f', variable: 'x', p: { a: 1, b: 3, c: 5, d: 7, f: 11 }, xs: [0.5, 2, 4] },
  { text: 'a < x <= b ? h*(x - a) : 0', variable: 'x', p: { a: 1, b: 3, h: 2 }, xs: [0.5, 2, 3.5] },
  { text: 'x == a ? 1 : b*x + (x != a)', variable: 'x', p: { a: 2, b: 0.5 }, xs: [1, 2, 3] },
  { text: 'min(a*x, b) + max(c, x/d, 1)', variable: 'x', p: { a: 2, b: 3, c: 0.5, d: 4 }, xs: [0.2, 1, 5, 9] }
];

describe('comparisons and conditionals', () => {
  it('evaluate like mathjs in the generated kernel, the mathjs fallback and double-double', () => {
    for (const c of CASES) {
      const gen = parseExpressionModel(c.text, { variables: [c.variable] });
      const mj = parseExpressionModel(c.text, { variables: [c.variable], evaluation: 'mathjs' });
      const p = gen.parameters.map((name) => c.p[name]);
      const ref = c.xs.map((x) => reference(c.text, { ...c.p, [c.variable]: x }));
      const a = values(gen, p, c.xs);
      const b = values(mj, p, c.xs);
      expect(gen.evaluatePrecise, c.text).toBeTypeOf('function');
      const d = precise(gen, p, c.xs);
      ref.forEach((r, i) => {
        expect(a[i], `${c.text} @ ${c.xs[i]}`).toBeCloseTo(r, 13);
        expect(b[i], `${c.text} @ ${c.xs[i]} (mathjs fallback)`).toBeCloseTo(r, 13);
        expect(d[i], `${c.text} @ ${c.xs[i]} (double-double)`).toBeCloseTo(r, 13);
      });
    }
  });

  it('differentiate symbolically: each branch as mathjs derives it, comparisons zero', () => {
    const m = parseExpressionModel('T < Tc ? A*(1 - T/Tc)^beta : 0', { variables: ['T'] });
    expect(m.derivatives).not.toBeNull();
    expect(m.parameters).toEqual(['Tc', 'A', 'beta']);
    const p = { Tc: 120, A: 2, beta: 0.33 };
    const xs = [5, 60, 119, 121, 300];
    const jac = jacobian(m, [p.Tc, p.A, p.beta], xs);
    xs.forEach((T, i) => {
      m.parameters.forEach((name, j) => {
        const branch = T < p.Tc ? derivative('A*(1 - T/Tc)^beta', name).evaluate({ ...p, T }) : 0;
        expect(jac[i * 3 + j], `∂/∂${name} at T = ${T}`).toBeCloseTo(branch as number, 10);
      });
    });
    // A pure comparison has derivative zero.
    const step = parseExpressionModel('x >= a');
    expect(jacobian(step, [1.5], [0, 3])).toEqual([0, 0]);
  });

  it('gives the same Jacobian as central differences for every case, in both evaluations', () => {
    for (const c of CASES) {
      for (const evaluation of ['generated', 'mathjs'] as const) {
        const m = parseExpressionModel(c.text, { variables: [c.variable], evaluation });
        const p = m.parameters.map((name) => c.p[name]);
        const jac = jacobian(m, p, c.xs);
        p.forEach((v, j) => {
          const h = 1e-6 * Math.max(1, Math.abs(v));
          const up = values(m, p.map((q, k) => (k === j ? q + h : q)), c.xs);
          const down = values(m, p.map((q, k) => (k === j ? q - h : q)), c.xs);
          c.xs.forEach((_, i) => {
            const fd = (up[i] - down[i]) / (2 * h);
            expect(Math.abs(jac[i * p.length + j] - fd), `${c.text} ∂/∂${m.parameters[j]} (${evaluation})`).toBeLessThan(1e-6 * Math.max(1, Math.abs(fd)));
          });
        });
      }
    }
  });

  it('fits an order parameter that vanishes above Tc', () => {
    const T = Array.from({ length: 60 }, (_, i) => 2 + i * 2.5);
    const truth = { Tc: 95, A: 1.8, beta: 0.36 };
    const y = T.map((t) => (t < truth.Tc ? truth.A * (1 - t / truth.Tc) ** truth.beta : 0));
    const m = parseExpressionModel('T < Tc ? A*(1 - T/Tc)^beta : 0', { variables: ['T'] });
    const r = fitCurve(m, { x: T, y }, { start: [100, 1.5, 0.3] });
    expect(r.converged).toBe(true);
    expect(r.values[0]).toBeCloseTo(truth.Tc, 6);
    expect(r.values[1]).toBeCloseTo(truth.A, 6);
    expect(r.values[2]).toBeCloseTo(truth.beta, 6);
    expect(r.jacobianEvaluations).toBeGreaterThan(0);
  });
});
