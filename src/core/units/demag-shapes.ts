/**
 * Demagnetising-factor presets for common sample shapes, SI convention
 * (N_x + N_y + N_z = 1; cgs N = 4π × SI). The values are the limits of the
 * ellipsoid factors [Osborn, Phys. Rev. 67, 351 (1945)]; the cube's average
 * factor is 1/3 by symmetry (the trace is 1 and the three axes are equal).
 * Real plates and needles of finite aspect ratio lie between these limits:
 * the presets are where to start, not a measurement.
 */

/** A preset: its id (saved with the analysis) and N_d in SI. */
export interface IDemagPreset {
  id: 'sphere' | 'cube' | 'thin-plate-perpendicular' | 'thin-plate-in-plane' | 'long-needle-along' | 'long-cylinder-across';
  /** N_d, SI convention (0–1). */
  valueSI: number;
}

/** The presets, in the order offered. */
export const DEMAG_PRESETS: readonly IDemagPreset[] = Object.freeze([
  { id: 'sphere', valueSI: 1 / 3 },
  { id: 'cube', valueSI: 1 / 3 },
  { id: 'thin-plate-perpendicular', valueSI: 1 },
  { id: 'thin-plate-in-plane', valueSI: 0 },
  { id: 'long-needle-along', valueSI: 0 },
  { id: 'long-cylinder-across', valueSI: 1 / 2 }
]);

/** cgs demagnetising factor per SI one: N_cgs = 4π N_SI. */
export const DEMAG_CGS_PER_SI = 4 * Math.PI;

/** N_d of a preset in a convention. */
export function demagPresetValue(id: string, convention: 'SI' | 'cgs'): number | null {
  const preset = DEMAG_PRESETS.find(p => p.id === id);
  if (!preset) {
    return null;
  }
  return convention === 'SI' ? preset.valueSI : preset.valueSI * DEMAG_CGS_PER_SI;
}
