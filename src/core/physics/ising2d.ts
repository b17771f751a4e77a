/**
 * Exact results for the square-lattice Ising model H = −J Σ s_i s_j,
 * s = ±1, isotropic J [C1 in REFERENCES.md], for overlay on data:
 * Onsager's critical point sinh(2J/kB Tc) = 1 and Yang's spontaneous
 * magnetisation M = [1 − sinh(2J/kB T)^−4]^(1/8).
 */
import { msg } from '../messages';
import { PhysicsInputError } from './errors';

/** kB Tc / J = 2/ln(1 + √2). */
export const ISING2D_TC = 2 / Math.log(1 + Math.SQRT2);

/** Spontaneous magnetisation at kB T/J = `T` (0 at and above Tc). */
export function ising2dMagnetisation(T: number): number {
  if (!(T > 0) || !Number.isFinite(T)) {
    throw new PhysicsInputError(msg('physics.ising.temperature', 'The reduced temperature kB·T/J must be a finite number above 0, but it is %1.', T));
  }
  if (T >= ISING2D_TC) {
    return 0;
  }
  const s = Math.sinh(2 / T);
  const s2 = s * s;
  const v = 1 - 1 / (s2 * s2);
  return v > 0 ? Math.pow(v, 0.125) : 0;
}

/** Mean-field critical temperature kB Tc = z J for coordination z [C9 in REFERENCES.md]. */
export function meanFieldIsingTc(z: number): number {
  if (!(z > 0)) {
    throw new PhysicsInputError(msg('physics.ising.coordination', 'The coordination number must be above 0, but it is %1.', z));
  }
  return z;
}
