/**
 * Double-double evaluator of parsed expressions (src/core/expr/precise.ts):
 * attached only when every node is supported, agrees with the binary64
 * kernel to rounding and with direct double-double compositions exactly,
 * literals are their decimals, pi/e are the double-double constants.
 */
import { describe, expect, it } from 'vitest';
import { parseExpressionModel } from '../../../src/core/expr/index';
import type { IExpressionModel } from '../../../src/core/expr/index';
import * as DD from '../../../src/core/numeric/dd/index';
import type { IDoubleDouble } from '../../../src/core/numeric/dd/index';

function evalPrecise(m: IExpressionModel, p: IDoubleDouble[], x: IDoubleDouble[]): IDoubleDouble[] {
  const out = { hi: new Float64Array(x.length), lo: new Float64Array(x.length) };
  m.evaluatePrecise!(
    { hi: Float64Array.from(p, (v) => v.hi), lo: Float64Array.from(p, (v) => v.lo) },
    { hi: Float64Array.from(x, (v) => v.hi), lo: Float64Array.from(x, (v) => v.lo) },
    out
  );
  return Array.from(out.hi, (hi, i) => ({ hi, lo: out.lo[i] }));
}

function evalBinary(m: IExpressionModel, p: number[], x: number[]): number[] {
  const out = new Float64Array(x.length);
  m.evaluate(Float64Array.from(p), Float64Array.from(x), out);
  return Array.from(out);
}

const XS = [0.05, 0.3, 1.7, 4.2].map((v) => DD.decimalToDoubleDouble(String(v)));

describe('precise expression evaluator', () => {
  it('every NIST-style construct: agrees with the binary64 kernel to ~1e-15', () => {
    const texts = [
      'b1*exp(-b2*x) + b3*exp(-b4*x) + b5*exp(-b6*x)',
      'b1*(b2+x)^(-1/b3)',
      '(b1 + b2*x + b3*x^2 + b4*x^3) / (1 + b5*x + b6*x^2 + b7*x^3)',
      'b1 - b2*x - atan(b3/(x-b4))/pi',
      'b1 + b2*cos(2*pi*x/12) + b3*sin(2*pi*x/12) + b4*sqrt(x) + b5*log(x) + b6*tan(x/10)',
      'b1 / (1+exp(b2-b3*x))^(1/b4)',
      'b1*(1-(1+b2*x/2)^(-2)) + square(b3) + cube(b4) + abs(-b5) + pow(x, b6) + expm1(b7*x)'
    ];
    for (const text of texts) {
      const m = parseExpressionModel(text);
      expect(m.evaluatePrecise, text).toBeTypeOf('function');
      const k = m.parameters.length;
      const p = Array.from({ length: k }, (_, j) => 0.3 + 0.17 * j);
      const want = evalBinary(m, p, XS.map((v) => v.hi));
      const got = evalPrecise(m, p.map((v) => DD.dd(v)), XS);
      got.forEach((g, i) => expect(Math.abs(DD.toNumber(g) - want[i]), text).toBeLessThanOrEqual(1e-14 * Math.abs(want[i])));
    }
  });

  it('equals the direct double-double composition (Lanczos form)', () => {
    const m = parseExpressionModel('b1*exp(-b2*x) + b3*exp(-b4*x)');
    const p = [DD.dd(0.0951, 1e-18), DD.dd(1.0000000001), DD.dd(0.8607), DD.dd(3.0000000002, -1e-17)];
    const got = evalPrecise(m, p, XS);
    XS.forEach((x, i) => {
      const direct = DD.add(DD.mul(p[0], DD.exp(DD.neg(DD.mul(p[1], x)))), DD.mul(p[2], DD.exp(DD.neg(DD.mul(p[3], x)))));
      expect(got[i]).toEqual(direct);
    });
  });

  it('equals the direct double-double composition (Roszman1 and ENSO forms: atan, pi, cos, sin)', () => {
    const ros = parseExpressionModel('b1 - b2*x - atan(b3/(x-b4))/pi', { parameters: ['b1', 'b2', 'b3', 'b4'] });
    const p = [DD.dd(0.2), DD.dd(-1.9e-5), DD.dd(1.1e3), DD.dd(-1.8e2)];
    const got = evalPrecise(ros, p, XS);
    XS.forEach((x, i) => {
      const direct = DD.sub(DD.sub(p[0], DD.mul(p[1], x)), DD.div(DD.atan(DD.div(p[2], DD.sub(x, p[3]))), DD.DD_PI));
      expect(got[i]).toEqual(direct);
    });
    const enso = parseExpressionModel('b1 + b2*cos(2*pi*x/12) + b3*sin(2*pi*x/b4)', { parameters: ['b1', 'b2', 'b3', 'b4'] });
    const q = [DD.dd(10.5), DD.dd(3.07), DD.dd(0.53), DD.dd(26.9)];
    const got2 = evalPrecise(enso, q, XS);
    XS.forEach((x, i) => {
      const arg = DD.mul(DD.mul(DD.dd(2), DD.DD_PI), x);
      const direct = DD.add(
        DD.add(q[0], DD.mul(q[1], DD.cos(DD.div(arg, DD.dd(12))))),
        DD.mul(q[2], DD.sin(DD.div(arg, q[3])))
      );
      expect(got2[i]).toEqual(direct);
    });
  });

  it('literals are their decimals, pi and e the double-double constants', () => {
    const tenth = parseExpressionModel('a*0.1', { variables: ['x'] });
    expect(evalPrecise(tenth, [DD.DD_ONE], [DD.DD_ONE])[0]).toEqual(DD.decimalToDoubleDouble('0.1'));
    const piE = parseExpressionModel('a*pi + 0*x', { variables: ['x'] });
    expect(evalPrecise(piE, [DD.DD_ONE], [DD.DD_ONE])[0]).toEqual(DD.DD_PI);
    const e = parseExpressionModel('a*e + 0*x');
    expect(evalPrecise(e, [DD.DD_ONE], [DD.DD_ONE])[0]).toEqual(DD.DD_E);
    // A named constant given as a number is that binary64 value exactly.
    const c = parseExpressionModel('a*k + 0*x', { constants: { k: 0.1 } });
    expect(evalPrecise(c, [DD.DD_ONE], [DD.DD_ONE])[0]).toEqual({ hi: 0.1, lo: 0 });
  });

  it('several variables read their columns by point index', () => {
    const m = parseExpressionModel('b1 - b2*x1*exp(-b3*x2)', {
      variables: ['x1', 'x2'],
      columns: { x1: [1, 2, 4], x2: [0.5, 0.25, 0.125] }
    });
    const p = [DD.dd(3), DD.dd(0.5), DD.dd(2)];
    const got = evalPrecise(m, p, [DD.dd(2), DD.dd(0)]);
    const want = [DD.sub(p[0], DD.mul(DD.mulNumber(p[1], 4), DD.exp(DD.neg(DD.mulNumber(p[2], 0.125))))), DD.sub(p[0], DD.mul(DD.mulNumber(p[1], 1), DD.exp(DD.neg(DD.mulNumber(p[2], 0.5)))))];
    expect(got).toEqual(want);
  });

  it('no precise evaluator when a function is outside its whitelist; the binary64 model is unchanged', () => {
    for (const text of ['a*asinh(x)', 'a*log10(x)', 'a*cbrt(x)', 'a*sign(x)', 'a*log1p(x)']) {
      const m = parseExpressionModel(text);
      expect(m.evaluatePrecise, text).toBeUndefined();
      expect(m.evaluation).toBe('generated-function');
      expect(evalBinary(m, [2], [0.5])[0]).toBeTypeOf('number');
    }
  });

  it('precise edge values: log of a negative number gives NaN, division by zero ±∞', () => {
    const m = parseExpressionModel('a*log(x) + 1/(x - b)');
    const got = evalPrecise(m, [DD.DD_ONE, DD.dd(2)], [DD.dd(-1), DD.dd(2)]);
    expect(got[0].hi).toBeNaN();
    expect(got[1].hi).toBe(Infinity);
  });
});
