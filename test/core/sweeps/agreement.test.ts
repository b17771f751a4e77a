/**
 * Agreement of a cross-check with the primary result: 2σ combined in
 * quadrature; beyond that, "close" within 2 % on exponents and 0.1 % on Tc
 * (the line methods' systematic error; common practice, no source);
 * otherwise "disagrees"; a missing value or σ gives "no-result".
 */
import { describe, expect, it } from 'vitest';
import { agreementOf } from '../../../src/core/sweeps/agreement';

const v = (value: number, sigma: number) => ({ value, sigma });

describe('agreementOf', () => {
  it('agrees within 2σ combined in quadrature', () => {
    // |0.33 − 0.3265| = 0.0035; σ = hypot(0.0015, 0.001) = 0.0018 → 1.94σ.
    expect(agreementOf([{ name: 'β', value: v(0.33, 0.0015), primary: v(0.3265, 0.001) }]).state).toBe('agrees');
  });

  it('is close beyond 2σ but within 2 % (exponents) and 0.1 % (Tc)', () => {
    const a = agreementOf([
      { name: 'γ', value: v(1.228, 0.0008), primary: v(1.2372, 0.0003) },
      { name: 'Tc', value: v(245.2, 0.01), primary: v(245.0, 0.001) }
    ]);
    expect(a.state).toBe('close');
    expect(a.message.text).toMatch(/statistical only/);
  });

  it('disagrees when one value is beyond both', () => {
    expect(agreementOf([{ name: 'Tc', value: v(245.5, 0.01), primary: v(245.0, 0.001) }]).state).toBe('disagrees');
    expect(agreementOf([{ name: 'β', value: v(0.36, 0.001), primary: v(0.3265, 0.001) }]).state).toBe('disagrees');
  });

  it('has no result without a value or a σ', () => {
    expect(agreementOf([]).state).toBe('no-result');
    expect(agreementOf([{ name: 'β', value: v(NaN, 0.1), primary: v(0.3, 0.01) }]).state).toBe('no-result');
    expect(agreementOf([{ name: 'β', value: v(0.3, NaN), primary: v(0.3, 0.01) }]).state).toBe('no-result');
  });
});
