/**
 * Demagnetising-factor presets. Checks: the ellipsoid sum rule N_x + N_y + N_z = 1
 * (SI) holds across each shape's three axes [Osborn, Phys. Rev. 67, 351 (1945)];
 * cgs = 4π × SI; unknown ids give null.
 */
import { describe, expect, it } from 'vitest';
import { DEMAG_CGS_PER_SI, DEMAG_PRESETS, demagPresetValue } from '../../../src/core/units/demag-shapes';

const value = (id: string): number => demagPresetValue(id, 'SI')!;

describe('demagnetising-factor presets', () => {
  it('obey the sum rule over three axes (Osborn 1945)', () => {
    // Sphere and cube: three equal axes.
    expect(3 * value('sphere')).toBeCloseTo(1, 12);
    expect(3 * value('cube')).toBeCloseTo(1, 12);
    // Thin plate: one perpendicular axis and two in-plane axes.
    expect(value('thin-plate-perpendicular') + 2 * value('thin-plate-in-plane')).toBeCloseTo(1, 12);
    // Long cylinder: one axis along (the needle limit) and two across.
    expect(value('long-needle-along') + 2 * value('long-cylinder-across')).toBeCloseTo(1, 12);
  });

  it('converts to the cgs convention by 4π and refuses unknown shapes', () => {
    expect(DEMAG_CGS_PER_SI).toBeCloseTo(12.566370614359172, 12);
    expect(demagPresetValue('sphere', 'cgs')).toBeCloseTo((4 * Math.PI) / 3, 12);
    expect(demagPresetValue('torus', 'SI')).toBeNull();
    expect(new Set(DEMAG_PRESETS.map(p => p.id)).size).toBe(DEMAG_PRESETS.length);
    for (const p of DEMAG_PRESETS) {
      expect(p.valueSI).toBeGreaterThanOrEqual(0);
      expect(p.valueSI).toBeLessThanOrEqual(1);
    }
  });
});
