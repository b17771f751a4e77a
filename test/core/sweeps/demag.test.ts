import { describe, expect, it } from 'vitest';
import { apparentSusceptibility, demagnetisingFactorSI, internalField, internalFieldCgs, SweepInputError, volumeMagnetisation } from '../../../src/core/sweeps/index';
import { convertQuantity } from '../../../src/core/units/index';

describe('demagnetisation (REFERENCE.md A5.1)', () => {
  it('sphere N = 1/3, linear sample of true chi: closed form M = chi H_a/(1 + chi/3), H_int = H_a/(1 + chi/3)', () => {
    // closed form from H_int = H_a − N M and M = chi H_int (A5.1); chi_meas = chi/(1 + N chi)
    const chi = 2.5;
    const Ha = [1e4, 5e4, 2e5];
    const M = Ha.map(h => (chi * h) / (1 + chi / 3));
    const Hi = internalField(Ha, M, { value: 1 / 3, convention: 'SI' });
    for (let i = 0; i < Ha.length; i++) {
      expect(Hi[i]).toBeCloseTo(Ha[i] / (1 + chi / 3), 8);
      expect(M[i] / Hi[i]).toBeCloseTo(chi, 12);
    }
    expect(apparentSusceptibility(chi, { value: 1 / 3, convention: 'SI' })).toBeCloseTo(chi / (1 + chi / 3), 14);
    // a strong ferromagnet's apparent susceptibility saturates at 1/N_d = 3
    expect(apparentSusceptibility(1e9, { value: 1 / 3, convention: 'SI' })).toBeCloseTo(3, 6);
  });

  it('worked example: H_a = 10 kOe, M = 100 emu/cm^3, sphere: H_int = 10000 − (4 pi/3)·100 Oe, same in SI', () => {
    // cgs form H_int = H_a − 4 pi N_d M (A5.1); value by hand: 10000 − 418.879 = 9581.1205 Oe
    const cgs = internalFieldCgs(10000, 100, { value: 1 / 3, convention: 'SI' });
    expect(cgs).toBeCloseTo(10000 - (400 * Math.PI) / 3, 9);
    expect(cgs).toBeCloseTo(9581.1205, 3);
    // SI: H_a = 795774.7 A/m, M = 1e5 A/m (C7: emu/cm^3 = 1e3 A/m)
    const si = internalField([convertQuantity(10000, 'Oe', 'A/m')], [1e5], { value: 4 * Math.PI / 3, convention: 'cgs' })[0];
    expect(convertQuantity(si, 'A/m', 'Oe')).toBeCloseTo(cgs, 8);
  });

  it('N_cgs = 4 pi N_SI (C7, NBS SP 696) and out-of-range factors are refused', () => {
    expect(demagnetisingFactorSI({ value: 4 * Math.PI, convention: 'cgs' })).toBeCloseTo(1, 14);
    expect(() => demagnetisingFactorSI({ value: 1.2, convention: 'SI' })).toThrow(SweepInputError);
    expect(() => demagnetisingFactorSI({ value: -0.1, convention: 'SI' })).toThrow(SweepInputError);
    expect(() => demagnetisingFactorSI({ value: 13, convention: 'cgs' })).toThrow(SweepInputError);
    expect(() => demagnetisingFactorSI({ value: NaN, convention: 'SI' })).toThrow(SweepInputError);
    expect(() => internalField([1, 2], [1], { value: 0, convention: 'SI' })).toThrow(SweepInputError);
  });

  it('volume magnetisation = mass magnetisation x density; bad densities throw', () => {
    expect(Array.from(volumeMagnetisation([2, 3], 7874))).toEqual([15748, 23622]);
    expect(() => volumeMagnetisation([1], 0)).toThrow(SweepInputError);
    expect(() => volumeMagnetisation([1], Infinity)).toThrow(SweepInputError);
  });
});
