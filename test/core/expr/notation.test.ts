/**
 * Expressions as people type them: the product's own notation (· × − ² ⁻¹ √
 * Greek letters, subscripts), positions mapped back to the original text,
 * and several names for the one x variable.
 *
 * Reference values: mathjs evaluation (mathjs.org, the parser the models are
 * built on) of the plain ASCII form of each expression.
 */
import { evaluate } from 'mathjs';
import { describe, expect, it } from 'vitest';
import {
  inspectExpression,
  normalizeExpressionText,
  normalizeWithMap,
  parseExpressionModel,
  variableNamesFromHeader
} from '../../../src/core/expr/index';

function values(model: ReturnType<typeof parseExpressionModel>, p: number[], x: number[]): number[] {
  const out = new Float64Array(x.length);
  model.evaluate(Float64Array.from(p), Float64Array.from(x), out);
  return Array.from(out);
}

/** mathjs evaluation of `ascii` at every x (reference). */
function mathjsValues(ascii: string, scope: Record<string, number>, xs: number[], xName = 'x'): number[] {
  return xs.map((x) => evaluate(ascii, { ...scope, [xName]: x }) as number);
}

describe('notation', () => {
  it('maps · × − superscripts √ ∛ ≤ ≥ ≠ && || subscripts and µ to mathjs syntax', () => {
    expect(normalizeExpressionText('A·x² + B×x − C')).toBe('A*x^2 + B*x - C');
    expect(normalizeExpressionText('a·x⁻¹ + b·x⁻²³ + c·x¹⁰')).toBe('a*x^(-1) + b*x^(-23) + c*x^10');
    expect(normalizeExpressionText('√x + √(1 − x) + ∛x + √ 2 + √exp(−x/τ)')).toBe('sqrt(x) + sqrt(1 - x) + cbrt(x) + sqrt(2) + sqrt(exp(-x/τ))');
    expect(normalizeExpressionText('√x²')).toBe('sqrt(x)^2');
    expect(normalizeExpressionText('√√x')).toBe('sqrt(sqrt(x))');
    // A digit after a superscript multiplies; a name after one is an implicit product as mathjs reads it.
    expect(normalizeExpressionText('x²3')).toBe('x^2*3');
    expect(normalizeExpressionText('a·x² b')).toBe('a*x^2 b');
    // Spacing before a call's parenthesis is kept (keyword operators read the same); aliases drop it.
    expect(normalizeExpressionText('x > 0 and (x < a) + ln (x)')).toBe('x > 0 and (x < a) + log(x)');
    expect(normalizeExpressionText('x ≤ a && x ≥ b || x ≠ c')).toBe('x <= a  and  x >= b  or  x != c');
    expect(normalizeExpressionText('χ₀ + µ·x')).toBe('χ0 + μ*x');
    expect(normalizeExpressionText('a\u00a0*\tx\n+ b')).toBe('a * x + b');
  });

  it('leaves e and E exponents of numbers as they are', () => {
    expect(normalizeExpressionText('1.5e-3*a + 2E6*b + 3e+2*x + .5e1')).toBe('1.5e-3*a + 2E6*b + 3e+2*x + .5e1');
    expect(normalizeExpressionText('1.5e−3*a')).toBe('1.5e-3*a');
    const m = parseExpressionModel('1.5e-3*a + 2E6*b*x');
    expect(values(m, [2, 1e-6], [3])[0]).toBeCloseTo(0.003 + 6, 12);
  });

  it('maps every normalised character back to the character it came from', () => {
    const text = '  A·x⁻¹ + √x';
    const n = normalizeWithMap(text);
    expect(n.text).toBe('A*x^(-1) + sqrt(x)');
    // 'A' at 2, '*' from '·' at 3, '^(-1)' from '⁻¹' at 5, 'sqrt(' from '√' at 10, 'x' at 11.
    expect(n.map.slice(0, 4)).toEqual([2, 3, 4, 5]);
    expect(n.map[n.text.indexOf('sqrt')]).toBe(10);
    expect(n.map[n.text.lastIndexOf('x')]).toBe(11);
    expect(n.map[n.text.length]).toBe(text.length);
  });

  it('evaluates the typed notation like mathjs evaluates the ASCII form', () => {
    const cases: [string, string, Record<string, number>][] = [
      ['A·x² + B×x − C', 'A*x^2 + B*x - C', { A: 1.5, B: -0.25, C: 2 }],
      ['a·x⁻¹ + √x·b', 'a*x^(-1) + sqrt(x)*b', { a: 3, b: 0.7 }],
      ['β·(1 − x/θ)^(1/3) + χ₀', 'β*(1 - x/θ)^(1/3) + χ0', { β: 2, θ: 10, χ0: 0.1 }],
      ['A·∛x + τ·√(x + 1)²', 'A*cbrt(x) + τ*sqrt(x + 1)^2', { A: 1.1, τ: 0.3 }],
      ['a·e^(−x/T₀) + π·c', 'a*e^(-x/T0) + pi*c', { a: 2, T0: 4, c: 0.5 }]
    ];
    const xs = [0.5, 1, 2.5, 7];
    for (const [typed, ascii, scope] of cases) {
      const m = parseExpressionModel(typed);
      const p = m.parameters.map((name) => scope[name]);
      const got = values(m, p, xs);
      mathjsValues(ascii, scope, xs).forEach((ref, i) => expect(got[i], typed).toBeCloseTo(ref, 12));
    }
  });

  it('accepts Greek parameter names and keeps them in the order they appear', () => {
    const m = parseExpressionModel('χ0 + C/(T − θ)', { variables: ['T'] });
    expect(m.parameters).toEqual(['χ0', 'C', 'θ']);
    expect(inspectExpression('M0·(1 − T/Tc)^β', { xNames: ['T'] }).parameters).toEqual(['M0', 'Tc', 'β']);
  });
});

describe('names of the x variable', () => {
  it('takes every alias as the one x input, never as a parameter', () => {
    const m = parseExpressionModel('A*(1 - T/Tc)^beta + c*x', { variables: ['x'], aliases: ['T'] });
    expect(m.parameters).toEqual(['A', 'Tc', 'beta', 'c']);
    const xs = [10, 50, 90];
    const scope = { A: 2, Tc: 100, beta: 0.35, c: 0.01 };
    const got = values(m, [2, 100, 0.35, 0.01], xs);
    xs.forEach((x, i) => expect(got[i]).toBeCloseTo(evaluate('A*(1 - x/Tc)^beta + c*x', { ...scope, x }) as number, 13));
    // The mathjs fallback, the Jacobian and the precise evaluator see the alias as x too.
    const mj = parseExpressionModel('A*(1 - T/Tc)^beta + c*x', { variables: ['x'], aliases: ['T'], evaluation: 'mathjs' });
    values(mj, [2, 100, 0.35, 0.01], xs).forEach((v, i) => expect(v).toBeCloseTo(got[i], 13));
    expect(m.evaluatePrecise).toBeTypeOf('function');
    const jac = new Float64Array(xs.length * 4);
    m.jacobian!(Float64Array.from([2, 100, 0.35, 0.01]), Float64Array.from(xs), jac);
    expect(jac[3]).toBeCloseTo(10, 14);
  });

  it('refuses an alias listed as a parameter', () => {
    expect(() => parseExpressionModel('A*T', { variables: ['x'], aliases: ['T'], parameters: ['A', 'T'] })).toThrow(/names the x variable/);
  });

  it('offers the column header without its unit as a name', () => {
    expect(variableNamesFromHeader('T (K)')).toEqual(['T']);
    expect(variableNamesFromHeader('H [Oe]')).toEqual(['H']);
    expect(variableNamesFromHeader('M / emu')).toEqual(['M']);
    expect(variableNamesFromHeader('sample temp (K)')).toEqual(['sample_temp']);
    expect(variableNamesFromHeader('χ_m')).toEqual(['χ_m']);
    expect(variableNamesFromHeader('1/T')).toEqual([]);
  });

  it('flags a name that matches a column or the x variable in another case instead of fitting it silently', () => {
    const r = inspectExpression('A*t + H*B', { xNames: ['x', 'T'], columnNames: ['T (K)', 'H (Oe)', 'M (emu)'] });
    expect(r.ok).toBe(true);
    expect(r.parameters).toEqual(['A', 't', 'H', 'B']);
    expect(r.flags.map((f) => [f.code, f.args[0]])).toEqual([
      ['expression.flag.x-case', 't'],
      ['expression.flag.column', 'H']
    ]);
    // The x column's own name is the variable, not a flagged parameter.
    const ok = inspectExpression('A*T', { xNames: ['x', 'T'], columnNames: ['T (K)', 'H (Oe)'] });
    expect(ok.parameters).toEqual(['A']);
    expect(ok.flags).toEqual([]);
  });
});
