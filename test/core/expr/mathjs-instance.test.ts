/**
 * The mathjs instance built from factories (src/core/numeric/mathjs.ts) holds
 * every function and operator a model expression may use, so mathjs's own
 * evaluation of a parsed model works for all of them; values agree with
 * JavaScript's Math (the functions' definitions, no other source).
 */
import { describe, expect, it } from 'vitest';
import { parse } from '../../../src/core/numeric/mathjs';
import { SUPPORTED_FUNCTIONS, SUPPORTED_OPERATORS, functionArity } from '../../../src/core/expr/compile';

const evaluate = (text: string): number => parse(text).compile().evaluate() as number;

describe('the factory-built mathjs instance', () => {
  it.each(SUPPORTED_FUNCTIONS.map(name => [name]))('evaluates %s', name => {
    const arity = functionArity(name)![0];
    // acosh is real from 1 on; every other function is real at 0.5.
    const args = [name === 'acosh' ? 1.5 : 0.5, 2, 3, 4].slice(0, arity).join(', ');
    const value = evaluate(`${name}(${args})`);
    expect(typeof value).toBe('number');
    expect(Number.isFinite(value)).toBe(true);
  });

  it('evaluates every operator a model may use', () => {
    const cases: Record<string, [string, number]> = {
      add: ['1.5 + 2', 3.5],
      subtract: ['1.5 - 2', -0.5],
      multiply: ['1.5 * 2', 3],
      divide: ['3 / 2', 1.5],
      pow: ['2 ^ 0.5', Math.SQRT2],
      unaryMinus: ['-(2)', -2],
      unaryPlus: ['+(2)', 2],
      smaller: ['1 < 2', 1],
      smallerEq: ['2 <= 2', 1],
      larger: ['1 > 2', 0],
      largerEq: ['1 >= 2', 0],
      equal: ['2 == 2', 1],
      unequal: ['2 != 2', 0],
      and: ['1 and 0', 0],
      or: ['1 or 0', 1],
      xor: ['1 xor 1', 0],
      not: ['not 0', 1]
    };
    expect(Object.keys(cases).sort()).toEqual([...SUPPORTED_OPERATORS].sort());
    for (const [text, expected] of Object.values(cases)) {
      expect(Number(evaluate(text))).toBeCloseTo(expected, 14);
    }
  });

  it('knows the constants pi and e, and a conditional', () => {
    expect(evaluate('pi')).toBe(Math.PI);
    expect(evaluate('e')).toBe(Math.E);
    expect(evaluate('2 < 3 ? 5 : 7')).toBe(5);
  });
});
