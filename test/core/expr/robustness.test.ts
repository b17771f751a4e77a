/**
 * Robustness of expression models: parameter names that are properties of
 * every JavaScript object, quantities with units, symbolic derivatives of
 * large expressions within a size budget (finite differences beyond it,
 * with a note), and derivatives of every NIST StRD model checked against
 * mathjs `derivative` (mathjs.org, a reference library) and central
 * differences.
 */
import path from 'node:path';
import { derivative } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { ExpressionError, guessStarts, inspectExpression, normalizeExpressionText, parseExpressionModel, splitEquation } from '../../../src/core/expr/index';
import type { IExpressionModel } from '../../../src/core/expr/index';
import { fitCurve } from '../../../src/core/fit/index';
import * as DD from '../../../src/core/numeric/dd/index';
import { nistDirectory, nistNames, parseNist } from '../fit/nistData';

function values(m: IExpressionModel, p: ArrayLike<number>, xs: number[]): number[] {
  const out = new Float64Array(xs.length);
  m.evaluate(Float64Array.from(p), Float64Array.from(xs), out);
  return Array.from(out);
}

/**
 * Largest gap between the analytic Jacobian and central differences, in
 * units of what the differences can resolve: 1e-6 relative, plus their
 * rounding error (≈ ε·|f|/h). Below 1 means agreement.
 */
function jacobianGap(m: IExpressionModel, p: number[], xs: number[]): number {
  const k = p.length;
  const jac = new Float64Array(xs.length * k);
  m.jacobian!(Float64Array.from(p), Float64Array.from(xs), jac);
  const f = values(m, p, xs);
  let worst = 0;
  p.forEach((v, j) => {
    const h = 1e-6 * (Math.abs(v) || 1e-6);
    const up = values(m, p.map((q, i) => (i === j ? q + h : q)), xs);
    const down = values(m, p.map((q, i) => (i === j ? q - h : q)), xs);
    xs.forEach((_, i) => {
      const fd = (up[i] - down[i]) / (2 * h);
      const a = jac[i * k + j];
      const allowed = 1e-6 * Math.max(Math.abs(fd), Math.abs(a)) + (100 * Number.EPSILON * Math.max(Math.abs(f[i]), Math.abs(up[i]), Math.abs(down[i]))) / h + 1e-300;
      worst = Math.max(worst, Math.abs(a - fd) / allowed);
    });
  });
  return worst;
}

/** Largest relative gap between the analytic Jacobian and mathjs `derivative` (reference, simplification off). */
function mathjsGap(m: IExpressionModel, text: string, p: Record<string, number>, variable: string, xs: number[]): number {
  const k = m.parameters.length;
  const pv = m.parameters.map((name) => p[name]);
  const jac = new Float64Array(xs.length * k);
  m.jacobian!(Float64Array.from(pv), Float64Array.from(xs), jac);
  let worst = 0;
  m.parameters.forEach((name, j) => {
    const d = derivative(text, name, { simplify: false });
    xs.forEach((x, i) => {
      const ref = d.evaluate({ ...p, [variable]: x }) as number;
      worst = Math.max(worst, Math.abs(jac[i * k + j] - ref) / Math.max(Math.abs(ref), 1e-300));
    });
  });
  return worst;
}

describe('parameter names that are properties of every object', () => {
  const NAMES = ['constructor', '__proto__', 'toString', 'hasOwnProperty', 'valueOf'];
  const text = 'constructor*x + __proto__ + toString*x^2 + hasOwnProperty*exp(-x) + valueOf*sin(x)';
  const truth = [2, -1, 0.5, 3, 0.25];
  const f = (x: number): number => truth[0] * x + truth[1] + truth[2] * x * x + truth[3] * Math.exp(-x) + truth[4] * Math.sin(x);
  const xs = Array.from({ length: 20 }, (_, i) => i * 0.3);

  it('are ordinary parameters in every evaluation path', () => {
    for (const evaluation of ['generated', 'mathjs'] as const) {
      const m = parseExpressionModel(text, { evaluation });
      expect(m.parameters).toEqual(NAMES);
      values(m, truth, xs).forEach((v, i) => expect(v, `${evaluation} at ${xs[i]}`).toBeCloseTo(f(xs[i]), 12));
      expect(jacobianGap(m, truth, xs), evaluation).toBeLessThan(1);
    }
    const m = parseExpressionModel(text);
    const out = { hi: new Float64Array(1), lo: new Float64Array(1) };
    m.evaluatePrecise!({ hi: Float64Array.from(truth), lo: new Float64Array(5) }, { hi: Float64Array.from([0.9]), lo: new Float64Array(1) }, out);
    expect(DD.toNumber({ hi: out.hi[0], lo: out.lo[0] })).toBeCloseTo(f(0.9), 14);
    expect(inspectExpression(text, { xNames: ['x'] }).parameters).toEqual(NAMES);
  });

  it('get start values and fit, with no start given and with some given', () => {
    const y = xs.map(f);
    for (const evaluation of ['generated', 'mathjs'] as const) {
      const m = parseExpressionModel(text, { evaluation });
      for (const given of [{}, { constructor: 1.5, valueOf: 0 }] as Record<string, number>[]) {
        const g = guessStarts(m, xs, y, given);
        expect(g.start.every((v) => typeof v === 'number' && Number.isFinite(v))).toBe(true);
        const r = fitCurve(m, { x: xs, y }, { start: g.start });
        expect(r.converged, evaluation).toBe(true);
        r.values.forEach((v, j) => expect(v, `${evaluation} ${NAMES[j]}`).toBeCloseTo(truth[j], 6));
      }
    }
  });
});

describe('units in expressions', () => {
  it('refuses quantities with units instead of fitting the unit as a parameter', () => {
    for (const [text, unit] of [
      ['a*x + 5 cm', 'cm'],
      ['a*x + 5cm', 'cm'],
      ['3 kg', 'kg'],
      ['a*(x - 300 mK)', 'mK'],
      ['a*x + 2 mT', 'mT'],
      ['a*x + 10 Oe', 'Oe'],
      ['(a*x + 2) emu', 'emu'],
      ['a*x + 5 cm^2', 'cm']
    ]) {
      let error: unknown = null;
      try {
        parseExpressionModel(text);
      } catch (e) {
        error = e;
      }
      expect(error, text).toBeInstanceOf(ExpressionError);
      expect((error as ExpressionError).detail.code, text).toBe('expression.unit');
      expect((error as ExpressionError).detail.args[2], text).toBe(unit);
    }
    expect(() => parseExpressionModel('a*x to cm')).toThrow(/unit conversions/);
  });

  it('still reads the x column named like a unit, and a unit name used as a parameter', () => {
    expect(parseExpressionModel('2 T + a', { variables: ['T'] }).parameters).toEqual(['a']);
    expect(parseExpressionModel('A*x + 2*cm').parameters).toEqual(['A', 'cm']);
    expect(parseExpressionModel('Ms*x + 2 Ms').parameters).toEqual(['Ms']);
  });

  it('reads a number before a one-letter name as a product, and flags it when the letter is a unit', () => {
    // b (bit), m (metre), K (kelvin) are units to mathjs, but 2b is far more often a coefficient.
    expect(parseExpressionModel('a + 2b*x + 3m').parameters).toEqual(['a', 'b', 'm']);
    const m = parseExpressionModel('a*(x - 300 K)');
    expect(m.parameters).toEqual(['a', 'K']);
    expect(m.flags.map((f) => [f.code, f.args[0]])).toEqual([['expression.flag.unit-letter', 'K']]);
  });
});

describe('symbolic derivatives within a budget', () => {
  function timed<T>(f: () => T): { value: T; ms: number } {
    const t0 = performance.now();
    const value = f();
    return { value, ms: performance.now() - t0 };
  }

  it('exp nested 30 deep: symbolic Jacobian, quickly, agreeing with central differences', () => {
    let unbounded = 'a*x';
    let bounded = 'a*x';
    for (let i = 0; i < 30; i++) {
      unbounded = `exp(${unbounded})`;
      bounded = `exp(-b*${bounded})`;
    }
    const u = timed(() => parseExpressionModel(unbounded));
    expect(u.ms).toBeLessThan(2000);
    expect(u.value.jacobian).toBeTypeOf('function');
    const b = timed(() => parseExpressionModel(bounded));
    expect(b.ms).toBeLessThan(2000);
    expect(b.value.notes).toEqual([]);
    expect(b.value.parameters).toEqual(['b', 'a']);
    const xs = [0.1, 0.5, 1, 2];
    expect(mathjsGap(b.value, bounded, { a: 0.7, b: 1.3 }, 'x', xs)).toBeLessThan(1e-12);
    expect(jacobianGap(b.value, [1.3, 0.7], xs)).toBeLessThan(1);
  });

  it('30 terms a_i*exp(-x/b_i): symbolic Jacobian, quickly, agreeing with central differences', () => {
    const text = Array.from({ length: 30 }, (_, i) => `a${i}*exp(-x/b${i})`).join(' + ');
    const r = timed(() => parseExpressionModel(text));
    expect(r.ms).toBeLessThan(2000);
    const m = r.value;
    expect(m.parameters).toHaveLength(60);
    expect(m.derivatives).not.toBeNull();
    const p = Array.from({ length: 60 }, (_, j) => (j % 2 === 0 ? 1 + j / 10 : 2 + j));
    const byName = Object.fromEntries(m.parameters.map((name, j) => [name, p[j]]));
    expect(m.parameters.slice(0, 4)).toEqual(['a0', 'b0', 'a1', 'b1']);
    expect(mathjsGap(m, text, byName, 'x', [0.5, 3, 20])).toBeLessThan(1e-12);
    expect(jacobianGap(m, p, [0.5, 3, 20])).toBeLessThan(1);
  });

  it('beyond the size budget: finite differences, with a note saying so, still quickly', () => {
    let tower = 'x';
    for (let i = 0; i < 30; i++) {
      tower = `(${tower})^(a${i}*x)`;
    }
    const r = timed(() => parseExpressionModel(tower));
    expect(r.ms).toBeLessThan(2000);
    expect(r.value.jacobian).toBeUndefined();
    expect(r.value.derivatives).toBeNull();
    expect(r.value.notes.map((n) => n.code)).toEqual(['expression.jacobian.size']);
    expect(Number.isFinite(values(r.value, new Array<number>(30).fill(0.01), [1.1])[0])).toBe(true);
  });

  it('NIST StRD models: the symbolic Jacobian agrees with mathjs derivative and with central differences', () => {
    const dir = nistDirectory();
    for (const name of nistNames(dir)) {
      const p = parseNist(path.join(dir, `${name}.dat`));
      const vars = p.columns.filter((c) => c !== 'y');
      if (vars.length > 1) {
        continue;
      }
      const m = parseExpressionModel(p.modelText, { variables: vars, constants: p.constants, parameters: p.parameters });
      expect(m.derivatives, name).not.toBeNull();
      const xs = p.data[vars[0]].filter((_, i) => i % Math.ceil(p.data[vars[0]].length / 5) === 0);
      const b = p.certified;
      const k = b.length;
      const jac = new Float64Array(xs.length * k);
      m.jacobian!(Float64Array.from(b), Float64Array.from(xs), jac);
      const rhs = splitEquation(normalizeExpressionText(p.modelText)).rhs;
      p.parameters.forEach((param, j) => {
        // mathjs derivative as the reference (simplification off: same value, far faster).
        const d = derivative(rhs, param, { simplify: false });
        xs.forEach((x, i) => {
          const scope: Record<string, number> = { ...p.constants, [vars[0]]: x };
          p.parameters.forEach((q, l) => (scope[q] = b[l]));
          const ref = d.evaluate(scope) as number;
          expect(Math.abs(jac[i * k + j] - ref), `${name} ∂/∂${param} at ${x}`).toBeLessThanOrEqual(1e-12 * Math.max(1, Math.abs(ref)));
        });
      });
      expect(jacobianGap(m, b, xs), name).toBeLessThan(1);
    }
  });
});

describe('very long expressions', () => {
  it('should refuse a 20 000-character sum with a typed message, never a stack overflow (found by fuzzing)', () => {
    const text = 'exp(-x/a)+'.repeat(2000) + 'x';
    let caught: unknown = null;
    try {
      parseExpressionModel(text, { variables: ['x'] });
    } catch (e) {
      caught = e;
    }
    expect(caught).toBeInstanceOf(ExpressionError);
    expect((caught as ExpressionError).detail.code).toBe('expression.depth');
  });
});
