/**
 * Expression models: normalisation, parameter identification, whitelisted
 * compilation, symbolic Jacobians checked against finite differences,
 * several variables, response transforms and precise errors.
 */
import { describe, expect, it } from 'vitest';
import {
  ExpressionError,
  normalizeExpressionText,
  parseExpressionModel,
  splitEquation
} from '../../../src/core/expr/index';
import { fitCurve } from '../../../src/core/fit/index';
import { messageText } from '../../../src/core/messages';

function values(model: ReturnType<typeof parseExpressionModel>, p: number[], x: number[]): number[] {
  const out = new Float64Array(x.length);
  model.evaluate(Float64Array.from(p), Float64Array.from(x), out);
  return Array.from(out);
}

describe('normalisation', () => {
  it('maps brackets, ** and aliases as printed in reference files', () => {
    expect(normalizeExpressionText('y = b1*(1-exp[-b2*x])')).toBe('y = b1*(1-exp(-b2*x))');
    expect(normalizeExpressionText('b1*(b2+x)**(-1/b3)')).toBe('b1*(b2+x)^(-1/b3)');
    expect(normalizeExpressionText('arctan[b3/(x-b4)] + ln(x)')).toBe('atan(b3/(x-b4)) + log(x)');
    expect(splitEquation('log(y) = b1 - x')).toEqual({ lhs: 'log(y)', rhs: 'b1 - x' });
    expect(splitEquation('b1 - x')).toEqual({ lhs: null, rhs: 'b1 - x' });
  });
});

describe('parseExpressionModel', () => {
  it('identifies parameters in order of appearance, excluding variables and constants', () => {
    const m = parseExpressionModel('A*(1 - T/Tc)^beta + c0*pi', { variables: ['T'] });
    expect(m.parameters).toEqual(['A', 'Tc', 'beta', 'c0']);
    expect(values(m, [2, 100, 0.5, 0], [75])[0]).toBeCloseTo(1, 14);
  });

  it('honours an explicit parameter order and user constants', () => {
    const m = parseExpressionModel('b2*x + b1 + k', { parameters: ['b1', 'b2'], constants: { k: 10 } });
    expect(m.parameters).toEqual(['b1', 'b2']);
    expect(values(m, [1, 2], [3])).toEqual([17]);
  });

  it('evaluates like the equivalent JavaScript', () => {
    const m = parseExpressionModel('a*exp(-b*x) + c*sin(x)^2 - sqrt(abs(x))/d');
    const p = [1.3, 0.7, -0.2, 4];
    const xs = [-2, -0.5, 0, 0.3, 1, 5];
    const expected = xs.map((x) => p[0] * Math.exp(-p[1] * x) + p[2] * Math.sin(x) ** 2 - Math.sqrt(Math.abs(x)) / p[3]);
    values(m, p, xs).forEach((v, i) => expect(v).toBeCloseTo(expected[i], 13));
    expect(m.evaluation).toBe('generated-function');
  });

  it('symbolic Jacobian agrees with central differences', () => {
    const m = parseExpressionModel('b1 / ((1+exp(b2-b3*x))^(1/b4)) + atan(b3/(x-b4))');
    expect(m.derivatives).not.toBeNull();
    const p = Float64Array.from([700, 5, 0.75, 1.3]);
    const xs = Float64Array.from([1, 2.5, 4, 9]);
    const jac = new Float64Array(xs.length * 4);
    m.jacobian!(p, xs, jac);
    const fp = new Float64Array(xs.length);
    const fm = new Float64Array(xs.length);
    for (let j = 0; j < 4; j++) {
      const h = 1e-6 * Math.abs(p[j]);
      const pp = Float64Array.from(p);
      const pm = Float64Array.from(p);
      pp[j] += h;
      pm[j] -= h;
      m.evaluate(pp, xs, fp);
      m.evaluate(pm, xs, fm);
      for (let i = 0; i < xs.length; i++) {
        const fd = (fp[i] - fm[i]) / (2 * h);
        expect(Math.abs(jac[i * 4 + j] - fd)).toBeLessThan(1e-6 * Math.max(1, Math.abs(fd)));
      }
    }
  });

  it('supports several variables through columns (x = point index)', () => {
    const H = [0.1, 0.5, 1, 2, 0.3, 0.8];
    const T = [10, 10, 10, 20, 20, 20];
    const m = parseExpressionModel('chi0 + C/(T - theta) * H', { variables: ['H', 'T'], columns: { H, T } });
    expect(m.parameters).toEqual(['chi0', 'C', 'theta']);
    const y = H.map((h, i) => 0.01 + (2 / (T[i] - 3)) * h);
    const r = fitCurve(m, { x: H.map((_, i) => i), y }, { start: [0, 1, 0] });
    expect(r.converged).toBe(true);
    expect(r.values[0]).toBeCloseTo(0.01, 9);
    expect(r.values[1]).toBeCloseTo(2, 9);
    expect(r.values[2]).toBeCloseTo(3, 8);
  });

  it('applies a response transform from the left-hand side', () => {
    const m = parseExpressionModel('log[y] = b1 - b2*x');
    expect(m.response).toBe('log(y)');
    expect(m.transformResponse([1, Math.E])).toEqual([0, 1]);
    expect(parseExpressionModel('y = b1*x').transformResponse([3, 4])).toEqual([3, 4]);
  });

  it('fits through the expression with the symbolic Jacobian', () => {
    const m = parseExpressionModel('b1*(1-exp[-b2*x])');
    const xs = [1, 2, 3, 5, 7, 10];
    const y = xs.map((x) => 200 * (1 - Math.exp(-0.5 * x)));
    const r = fitCurve(m, { x: xs, y }, { start: [100, 0.75] });
    expect(r.converged).toBe(true);
    expect(r.values[0]).toBeCloseTo(200, 8);
    expect(r.values[1]).toBeCloseTo(0.5, 10);
    expect(r.jacobianEvaluations).toBeGreaterThan(0);
  });

  it('falls back to finite differences when a derivative is not compilable', () => {
    const m = parseExpressionModel('a*x + b', { symbolicJacobian: false });
    expect(m.derivatives).toBeNull();
    expect(m.jacobian).toBeUndefined();
  });

  it('rejects bad expressions with precise ExpressionErrors', () => {
    // Messages are our own sentences (ICoreMessage); tests check the code and the place.
    const fails = (text: string, options?: Parameters<typeof parseExpressionModel>[1]): ExpressionError => {
      try {
        parseExpressionModel(text, options);
      } catch (e) {
        expect(e).toBeInstanceOf(ExpressionError);
        const err = e as ExpressionError;
        expect(err.message).toBe(messageText(err.detail));
        return err;
      }
      throw new Error(`${text} was accepted`);
    };
    expect(fails('a*exp(-b*x')).toMatchObject({ detail: { code: 'expression.parenthesis.unclosed' }, position: 5 });
    expect(fails('').detail.code).toBe('expression.empty');
    expect(fails('a*foo(x)')).toMatchObject({ detail: { code: 'expression.function.call' }, position: 2 });
    expect(fails('a*x[1]').detail.code).toBe('expression.function.call');
    expect(fails('x + 1').detail.code).toBe('expression.parameters.none');
    expect(fails('a*"s"')).toMatchObject({ detail: { code: 'expression.character.quote' }, position: 2 });
    expect(fails('a = b = c')).toMatchObject({ detail: { code: 'expression.equals' }, position: 6 });
    expect(fails('a*x + q', { parameters: ['a'] })).toMatchObject({ detail: { code: 'expression.parameters.unknown' }, position: 6 });
    expect(fails('a*H*T', { variables: ['H', 'T'] }).detail.code).toBe('expression.variable.columns');
    expect(fails('x = a*x')).toMatchObject({ detail: { code: 'expression.response.variable' }, position: 0 });
  });

  it('cannot be used to inject code: names never reach the generated source', () => {
    // A symbol named like a JS global is just a parameter.
    const m = parseExpressionModel('process*x + constructor');
    expect(m.parameters).toEqual(['process', 'constructor']);
    expect(values(m, [2, 1], [3])).toEqual([7]);
    expect(() => parseExpressionModel('f(x) = 1')).toThrow(ExpressionError);
  });
});

describe('mathjs evaluation fallback', () => {
  it('gives the same values and Jacobian as the generated function', () => {
    const text = 'b1 / ((1+exp(b2-b3*x))^(1/b4))';
    const gen = parseExpressionModel(text);
    const mj = parseExpressionModel(text, { evaluation: 'mathjs' });
    expect(mj.evaluation).toBe('mathjs-compiled');
    const p = Float64Array.from([700, 5, 0.75, 1.3]);
    const xs = Float64Array.from([1, 2.5, 4, 9]);
    const a = new Float64Array(4);
    const b = new Float64Array(4);
    gen.evaluate(p, xs, a);
    mj.evaluate(p, xs, b);
    a.forEach((v, i) => expect(b[i]).toBeCloseTo(v, 12));
    const ja = new Float64Array(16);
    const jb = new Float64Array(16);
    gen.jacobian!(p, xs, ja);
    mj.jacobian!(p, xs, jb);
    ja.forEach((v, i) => expect(jb[i]).toBeCloseTo(v, 10));
  });
});

describe('generated code: shared terms and small integer powers', () => {
  it('names each repeated sub-term once and writes x^2, x^3, x^-1, x^-2 as products', async () => {
    const { parse } = await import('mathjs');
    const { SharedTerms, toJavaScript } = await import('../../../src/core/expr/compile');
    const terms = new SharedTerms();
    const resolve = (s: string): string | null => (s === 'x' ? 'v0' : s === 'a' ? 'q0' : null);
    const out = toJavaScript(parse('exp(a*x) + exp(a*x)^2 + x^3 + x^-1 + x^(-2) + x^2.5'), resolve, terms);
    const src = terms.lines.join('\n');
    expect(src.match(/Math\.exp/g)).toHaveLength(1);
    expect(src).toContain('(v0 * v0 * v0)');
    expect(src).toContain('(1 / v0)');
    expect(src).toContain('(1 / (v0 * v0))');
    expect(src).toContain('Math.pow(v0, 2.5)');
    expect(src.match(/Math\.pow/g)).toHaveLength(1);
    expect(out).toMatch(/^t\d+$/);
  });

  it('gives the values and Jacobian of mathjs evaluation, for polynomial and rational terms', () => {
    // Hahn1-like rational function with x^2 and x^3 (NIST StRD model form)
    const text = '(b1+b2*x+b3*x^2+b4*x^3)/(1+b5*x+b6*x^2+b7*x^3) + b1*(x-b2)^(-2)';
    const gen = parseExpressionModel(text);
    const mj = parseExpressionModel(text, { evaluation: 'mathjs' });
    const p = Float64Array.from([1.08, -0.12, 4.1e-3, -1.4e-6, -5.8e-3, 2.4e-4, -1.2e-7]);
    const xs = Float64Array.from([-3, 24.4, 300, 813.5, 1e-3]);
    const a = new Float64Array(xs.length);
    const b = new Float64Array(xs.length);
    gen.evaluate(p, xs, a);
    mj.evaluate(p, xs, b);
    a.forEach((v, i) => expect(Math.abs(b[i] - v)).toBeLessThanOrEqual(4 * Number.EPSILON * Math.abs(v)));
    const ja = new Float64Array(xs.length * 7);
    const jb = new Float64Array(xs.length * 7);
    gen.jacobian!(p, xs, ja);
    mj.jacobian!(p, xs, jb);
    ja.forEach((v, i) => expect(Math.abs(jb[i] - v)).toBeLessThanOrEqual(1e-13 * Math.max(1, Math.abs(v))));
  });
});
