/**
 * The reference curves the reduced plot offers, m(τ) with τ = T/Tc, from
 * core's {@link reducedReferenceCurves} (Weiss mean field for several
 * spins J, the exact 2D Ising magnetisation, the 3D classes' asymptotic
 * laws, each with its label and citation), and which are shown before the
 * user chooses: mean field J = ½, 2D Ising, and the 3D class whose β is
 * nearest the fitted one.
 */
import type { IReducedReferenceCurve } from '../../core/physics/reference-curves';
import { reducedReferenceCurves } from '../../core/physics/reference-curves';
import { UNIVERSALITY_CLASSES } from '../../core/physics/universality';

/** Reference curves are drawn up to at least this τ (a little past Tc). */
export const REDUCED_TAU_MAX = 1.1;

/** Points of each reference curve, evenly spaced in τ from 0 to the largest τ shown. */
export const CURVE_SAMPLES = 240;

/** The 3D classes offered, by id of UNIVERSALITY_CLASSES. */
export const CLASSES_3D: readonly string[] = Object.freeze(['3d-ising', '3d-xy', '3d-heisenberg']);

/** The id of the 3D class whose β is nearest `beta`. */
export function nearestClass(beta: number): string {
  let best = CLASSES_3D[0];
  let distance = Infinity;
  for (const id of CLASSES_3D) {
    const c = UNIVERSALITY_CLASSES.find(u => u.id === id);
    if (c && Math.abs(c.beta.value - beta) < distance) {
      distance = Math.abs(c.beta.value - beta);
      best = id;
    }
  }
  return best;
}

/** The curves shown before the user chooses, for a fit of exponent `beta`. */
export function defaultCurves(beta: number): string[] {
  return ['weiss-0.5', 'ising-2d', nearestClass(beta)];
}

/** Every reference curve sampled from τ > 0 up to `tauMax` (at least {@link REDUCED_TAU_MAX}). */
export function referenceCurves(tauMax: number): IReducedReferenceCurve[] {
  const top = Math.max(REDUCED_TAU_MAX, Number.isFinite(tauMax) ? tauMax : 0);
  const tau = Array.from({ length: CURVE_SAMPLES }, (_, i) => (top * (i + 1)) / CURVE_SAMPLES);
  return reducedReferenceCurves(tau);
}
