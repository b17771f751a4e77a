/**
 * Expression models compute values and their symbolic Jacobian in one
 * generated pass (`evaluateWithJacobian`), with exactly the numbers of the
 * separate `evaluate` and `jacobian` kernels. Expressions and points chosen
 * here (the first three are NIST StRD model forms) (common practice, no source).
 */
import { describe, expect, it } from 'vitest';
import { parseExpressionModel } from '../../../src/core/expr';

describe('combined value-and-Jacobian kernel', () => {
  it.each([
    ['y = b1*(b2+x)^(-1/b3)', [2500, 46, 0.9]],
    ['y = b1*exp(-b2*x) + b3*exp(-(x-b4)^2/b5^2) + b6*exp(-(x-b7)^2/b8^2)', [98, 0.01, 100, 65, 20, 70, 178, 16]],
    ['y = (b1+b2*x+b3*x^2+b4*x^3)/(1+b5*x+b6*x^2+b7*x^3)', [1.3, 1.5, 0.6, 0.05, 1, 0.4, 0.05]],
    ['y = A*abs(1 - x/Tc)^beta + c', [1, 300, 0.33, 0.1]]
  ] as const)('%s', (text, p) => {
    const model = parseExpressionModel(text, { variables: ['x'] });
    expect(model.evaluateWithJacobian).toBeTypeOf('function');
    const x = Float64Array.from({ length: 50 }, (_, i) => 1 + 3.7 * i);
    const k = p.length;
    const pp = Float64Array.from(p);
    const v1 = new Float64Array(50);
    const j1 = new Float64Array(50 * k);
    model.evaluate(pp, x, v1);
    model.jacobian!(pp, x, j1);
    const v2 = new Float64Array(50);
    const j2 = new Float64Array(50 * k);
    model.evaluateWithJacobian!(pp, x, v2, j2);
    expect(Array.from(v2)).toEqual(Array.from(v1));
    expect(Array.from(j2)).toEqual(Array.from(j1));
    expect(j1.some((v) => v !== 0)).toBe(true);
  });
});
