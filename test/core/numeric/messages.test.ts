/** Messages of the numerical routines: root-search and simplex reasons, refused inputs. */
import { describe, expect, it } from 'vitest';
import { bracketRoot, nelderMead, realPolynomialRoots } from '../../../src/core/numeric/index';
import { decimalToDoubleDouble, DecimalFormatError } from '../../../src/core/numeric/dd/index';
import { NumericInputError } from '../../../src/core/numeric/errors';
import { msg } from '../../../src/core/messages';
import { expectGoodMessages, messageProblems, thrownMessage } from './messageRules';

describe('the message rules', () => {
  it('catch bad codes, placeholder mismatches, internals and unrounded numbers', () => {
    expect(messageProblems(msg('fit.ok', 'Fine: %1.', 1.5))).toEqual([]);
    expect(messageProblems(msg('Fit', 'Fine.'))).toHaveLength(1);
    expect(messageProblems(msg('fit.x', 'Two %1 and %2.', 1))).toHaveLength(2);
    expect(messageProblems(msg('fit.x', 'Below ftol.'))).toHaveLength(1);
    expect(messageProblems(msg('fit.x', 'options.start is NaN.'))).toHaveLength(2);
    expect(messageProblems(msg('fit.x', 'Value %1.', String(321.40169075538586)))).toHaveLength(1);
    expect(messageProblems(msg('fit.x', 'Value %1.', { value: 321.40169075538586, digits: 17 }))).toEqual([]);
  });
});

describe('numeric messages', () => {
  it('every way a root search ends has its own code and a good message', () => {
    const reasons = [
      bracketRoot(x => x - 1, 0, 3),
      bracketRoot(x => x, 0, 3),
      bracketRoot(x => x * x + 1, -1, 1),
      bracketRoot(x => (x > 0.5 ? NaN : x - 1), 0, 2),
      bracketRoot(x => 1 / x, -1, 1),
      bracketRoot(x => Math.sign(x - 0.3) * 1e-300 + (x - 0.3), 0, 1, 0, 2),
      bracketRoot(() => NaN, 0, 1)
    ].map(r => r.reason);
    expectGoodMessages(reasons);
    expect(new Set(reasons.map(r => r.code)).size).toBeGreaterThanOrEqual(5);
  });

  it('simplex reasons and refused inputs are good messages', () => {
    const out = [
      nelderMead(p => (p[0] - 2) ** 2, [1], [0.5]).reason,
      nelderMead(p => p[0] * p[0] + p[1] * p[1], [5, 5], [1, 1], 10).reason,
      thrownMessage(() => realPolynomialRoots([0, 0]), NumericInputError),
      thrownMessage(() => realPolynomialRoots([1, Infinity]), NumericInputError),
      thrownMessage(() => decimalToDoubleDouble('1,5'), DecimalFormatError),
      thrownMessage(() => decimalToDoubleDouble('x'.repeat(100)), DecimalFormatError)
    ];
    expectGoodMessages(out);
    expect(out[1].code).toBe('numeric.simplex.budget');
  });
});
