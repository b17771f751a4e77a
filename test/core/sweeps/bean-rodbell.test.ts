/**
 * Banerjee criterion on Bean–Rodbell J = ½ equilibrium isotherms
 * (REFERENCE.md B10, B11): η = 2 is first order (C5: Tc/T0 = 1.0557369245), so
 * negative Arrott slopes must be flagged; η = 0.5 is second order, none flagged.
 */
import { describe, expect, it } from 'vitest';
import { messageText } from '../../../src/core/messages';
import { arrottAnalysis, banerjeeEvidence, isothermSetFromArrays, magneticEntropyChange } from '../../../src/core/sweeps/index';
import { beanRodbellSet, linspace, normal } from './generators';

const hs = linspace(0.002, 0.1, 50);

describe('Banerjee criterion as evidence', () => {
  it('eta = 2: negative slopes flagged on isotherms just above Tc, none well below; caveats attached', () => {
    const set = beanRodbellSet(2, linspace(1.0057, 1.1057, 11), hs);
    const a = arrottAnalysis(set);
    const flagged = a.banerjee.isotherms.filter(i => i.negative).map(i => i.T);
    expect(flagged.length).toBeGreaterThan(0);
    // the field-induced transition lies above Tc/T0 = 1.0557369245 (C5)
    expect(Math.min(...flagged)).toBeGreaterThan(1.0557);
    expect(a.banerjee.isotherms.find(i => Math.abs(i.T - 1.0057) < 1e-9)?.negative).toBe(false);
    expect(a.banerjee.evidence.code).toBe('sweeps.banerjee.negative');
    expect(messageText(a.banerjee.evidence)).toContain('consistent with b < 0');
    expect(a.banerjee.caveats.length).toBeGreaterThanOrEqual(3);
    expect(a.banerjee.caveats.map(messageText).join(' ')).toContain('demagnetisation');
  });

  it('eta = 0.5: no isotherm flagged', () => {
    const set = beanRodbellSet(0.5, linspace(0.95, 1.1, 11), hs);
    const a = arrottAnalysis(set);
    expect(a.banerjee.negativeCount).toBe(0);
    expect(a.banerjee.evidence.code).toBe('sweeps.banerjee.none');
  });

  it('noise alone does not flag a positive-slope isotherm (common practice, no source: 3-sigma threshold)', () => {
    const g = normal(5);
    const H = linspace(0.01, 1, 200);
    // Arrott-linear isotherm H/M = 0.1 + M^2 with 0.1 % noise on M
    const M = H.map(h => {
      // root of m³ + 0.1 m − h = 0 by bisection on (0, 2)
      let lo = 0;
      let hi = 2;
      for (let i = 0; i < 200; i++) {
        const m = 0.5 * (lo + hi);
        if (m * m * m + 0.1 * m < h) {
          lo = m;
        } else {
          hi = m;
        }
      }
      return 0.5 * (lo + hi) * (1 + 1e-3 * g());
    });
    const ev = banerjeeEvidence(isothermSetFromArrays([{ T: 1, H, M }]).isotherms);
    expect(ev.negativeCount).toBe(0);
  });

  it('entropy change across the first-order jump (eta = 2, Tc/T0 = 1.0557369245, C5) is flagged; eta = 0.5 is not', () => {
    const taus = linspace(1.0, 1.1, 21);
    const fields = linspace(0, 0.02, 41);
    const first = magneticEntropyChange(beanRodbellSet(2, taus, fields), [0.02]).curves[0];
    const flagged = first.warnings.filter(w => w.code === 'sweeps.entropy.jump');
    expect(flagged.length).toBeGreaterThan(0);
    expect(messageText(flagged[0])).toContain('between 1.0525 K and');
    const second = magneticEntropyChange(beanRodbellSet(0.5, taus, fields), [0.02]).curves[0];
    expect(second.warnings.filter(w => w.code === 'sweeps.entropy.jump')).toEqual([]);
  });
});
