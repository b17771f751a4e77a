/**
 * Student-t and normal quantiles (src/core/numeric/studentT.ts) against
 * published tables [N7 in REFERENCES.md] and closed forms.
 */
import { describe, expect, it } from 'vitest';
import { normalQuantileTwoSided, studentTQuantileTwoSided } from '../../../src/core/numeric/studentT';

describe('quantiles', () => {
  // Two-sided Student-t critical values from standard tables
  // (Abramowitz & Stegun, Handbook of Mathematical Functions, Table 26.10).
  it.each([
    [0.95, 1, 12.706],
    [0.95, 10, 2.228],
    [0.99, 5, 4.032],
    [0.9, 30, 1.697]
  ])('t quantile level %f, dof %d = %f', (level, dof, t) => {
    expect(studentTQuantileTwoSided(level, dof)).toBeCloseTo(t, 3);
  });

  it('normal quantiles: 1.959964 for 95 %, 1 for 68.2689 % (A&S Table 26.1)', () => {
    expect(normalQuantileTwoSided(0.95)).toBeCloseTo(1.959964, 6);
    expect(normalQuantileTwoSided(0.682689492)).toBeCloseTo(1, 6);
  });

  it('t tends to the normal quantile for large dof and is NaN for dof ≤ 0', () => {
    expect(studentTQuantileTwoSided(0.95, 1e6)).toBeCloseTo(normalQuantileTwoSided(0.95), 5);
    expect(studentTQuantileTwoSided(0.95, 0)).toBeNaN();
  });

  it('meets the accuracy of its header: closed forms for ν = 1, 2, the normal quantile, large ν', () => {
    const rel = (a: number, b: number): number => Math.abs(a - b) / Math.abs(b);
    for (const level of [0.5, 0.6827, 0.9, 0.95, 0.99, 0.999, 0.9999]) {
      // ν = 1 (Cauchy): t = tan(π·level/2); ν = 2: t = level·√(2/(1 − level²))
      expect(rel(studentTQuantileTwoSided(level, 1), Math.tan((Math.PI * level) / 2))).toBeLessThan(1e-11);
      expect(rel(studentTQuantileTwoSided(level, 2), level * Math.sqrt(2 / (1 - level * level)))).toBeLessThan(1e-11);
    }
    // z for 95 %, 99 %, 99.9 % to 16 digits (Φ⁻¹(0.975), Φ⁻¹(0.995), Φ⁻¹(0.9995)), and z = 1 at level erf(1/√2)
    expect(rel(normalQuantileTwoSided(0.95), 1.959963984540054)).toBeLessThan(2e-15);
    expect(rel(normalQuantileTwoSided(0.99), 2.5758293035489004)).toBeLessThan(2e-15);
    expect(rel(normalQuantileTwoSided(0.999), 3.2905267314918945)).toBeLessThan(2e-15);
    expect(rel(normalQuantileTwoSided(0.6826894921370859), 1)).toBeLessThan(2e-15);
    // ν = 1e6 against the Cornish–Fisher expansion t = z + g1/ν + g2/ν² + …
    const z = normalQuantileTwoSided(0.95);
    const nu = 1e6;
    const cf = z + (z ** 3 + z) / (4 * nu) + (5 * z ** 5 + 16 * z ** 3 + 3 * z) / (96 * nu * nu);
    expect(rel(studentTQuantileTwoSided(0.95, nu), cf)).toBeLessThan(1e-9);
  });
});
