/**
 * The modified Arrott iteration (REFERENCES.md B6) never reports exponents
 * from a step that left too few isotherms or gave an exponent that is not a
 * result: it stops and keeps the last usable step, or reports none with the
 * reason. Data: Arrott–Noakes isotherms with 3D Heisenberg exponents
 * β = 0.3689, γ = 1.396 (Campostrini et al., Phys. Rev. B 65, 144520 (2002); C2),
 * invented Tc = 300 K, T1 = 5 K, M1 = 1e5 A/m, seeded noise on M.
 */
import { describe, expect, it } from 'vitest';
import { messageText } from '../../../src/core/messages';
import { modifiedArrottIteration, usableExponent } from '../../../src/core/sweeps/index';
import type { IPowerFit } from '../../../src/core/sweeps/index';
import { anSet, linspace } from './generators';

const P = { Tc: 300, beta: 0.3689, gamma: 1.396, T1: 5, M1: 1e5 };
const Hs = linspace(1e3, 1e5, 60);

function power(value: number, sigma: number): IPowerFit {
  return { amplitude: { value: 1, sigma: 0 }, Tc: { value: 300, sigma: 0.1 }, exponent: { value, sigma }, correlationTcExponent: 0, n: 4, converged: true, reason: { code: 'x', text: 'x', args: [] }, fit: null };
}

describe('modified Arrott iteration: steps with too few points', () => {
  it('an exponent at its limit or known to no better than 100 % is not a result', () => {
    expect(usableExponent(power(5, 137), [0.05, 3])).toBe(false);
    expect(usableExponent(power(0.37, 0.5), [0.05, 3])).toBe(false);
    expect(usableExponent(power(3, 0.01), [0.05, 3])).toBe(false);
    expect(usableExponent(power(NaN, 0.01), [0.05, 3])).toBe(false);
    expect(usableExponent(power(0.37, NaN), [0.05, 3])).toBe(false);
    expect(usableExponent(power(0.37, 0.01), [0.05, 3])).toBe(true);
  });

  it('three isotherms below Tc: no exponents, and the reason says how many isotherms each side had', () => {
    const set = anSet(P, [297, 298, 299, 301, 302, 303, 304, 305, 306], Hs, 2e-3, 5);
    const r = modifiedArrottIteration(set);
    expect(r.beta.value).toBeNaN();
    expect(r.gamma.value).toBeNaN();
    expect(r.converged).toBe(false);
    expect(r.reason.code).toBe('sweeps.map.step-too-few');
    expect(r.reason.args.slice(0, 3)).toEqual([1, 3, 6]);
    expect(r.warnings.map(w => w.code)).toContain('sweeps.map.no-usable-step');
    expect(messageText(r.reason)).toContain('only 3 isotherms below');
  });

  it('over hostile windows and few isotherms, every reported exponent is a usable one', () => {
    const configs: { Ts: number[]; tMax: number; start?: { beta: number; gamma: number } }[] = [];
    for (const below of [3, 4, 5, 6]) {
      for (const tMax of [0.008, 0.012, 0.02, 0.05]) {
        const Ts = [...linspace(300 - 1.5 * below, 299.2, below), ...linspace(300.8, 306, 6)];
        configs.push({ Ts, tMax }, { Ts, tMax, start: { beta: 0.5, gamma: 1 } }, { Ts, tMax, start: { beta: 1.5, gamma: 0.4 } });
      }
    }
    let none = 0;
    let some = 0;
    configs.forEach((c, k) => {
      const r = modifiedArrottIteration(anSet(P, c.Ts, Hs, 3e-3, 10 + k), { tMax: c.tMax, start: c.start });
      for (const [v, lo, hi] of [
        [r.beta, 0.05, 3],
        [r.gamma, 0.2, 5]
      ] as const) {
        if (Number.isNaN(v.value)) {
          none++;
          // no exponent: the reason says why
          expect(r.reason.code).not.toBe('sweeps.map.converged');
        } else {
          some++;
          expect(v.value).toBeGreaterThan(lo);
          expect(v.value).toBeLessThan(hi);
          expect(v.sigma).toBeLessThan(v.value);
        }
      }
      // the last step of the history is the one whose values are reported
      if (Number.isFinite(r.beta.value)) {
        expect(r.history.length).toBeGreaterThan(1);
      }
    });
    expect(none).toBeGreaterThan(0);
    expect(some).toBeGreaterThan(0);
  });
});
