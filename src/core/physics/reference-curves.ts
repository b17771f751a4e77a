/**
 * Reduced reference curves m(τ), τ = T/Tc, to overlay on measured order
 * parameters: Weiss mean field (any J), Landau mean field √(1 − τ),
 * tricritical (1 − τ)^(1/4), and the exact 2D Ising magnetisation.
 */
import { ISING2D_TC, ising2dMagnetisation } from './ising2d';
import { msg } from '../messages';
import type { ICoreMessage } from '../messages';
import { PhysicsInputError } from './errors';
import { weissMagnetisation } from './weiss';

/** Available curve kinds. */
export type ReferenceCurveKind = 'weiss' | 'landau-mean-field' | 'tricritical' | 'ising-2d';

/** A sampled curve with its description. */
export interface IReferenceCurve {
  kind: ReferenceCurveKind;
  tau: number[];
  m: number[];
  /** What the curve is, for people (codes `physics.reference.*`). */
  description: ICoreMessage;
}

/** Samples a reference curve on the given τ values (τ > 0). */
export function referenceCurve(kind: ReferenceCurveKind, tau: readonly number[], J = 0.5): IReferenceCurve {
  for (const t of tau) {
    if (!(t > 0) || !Number.isFinite(t)) {
      throw new PhysicsInputError(msg('physics.reference.tau', 'Every reduced temperature τ must be a finite number above 0, but one is %1.', t));
    }
  }
  switch (kind) {
    case 'weiss':
      return { kind, tau: tau.slice(), m: Array.from(weissMagnetisation(J, tau)), description: msg('physics.reference.weiss', 'Weiss mean field with J = %1.', J) };
    case 'landau-mean-field':
      return { kind, tau: tau.slice(), m: tau.map(t => (t < 1 ? Math.sqrt(1 - t) : 0)), description: msg('physics.reference.landau', 'Landau mean field: m = (1 − τ)^(1/2).') };
    case 'tricritical':
      return { kind, tau: tau.slice(), m: tau.map(t => (t < 1 ? Math.pow(1 - t, 0.25) : 0)), description: msg('physics.reference.tricritical', 'Tricritical mean field: m = (1 − τ)^(1/4).') };
    case 'ising-2d':
      return {
        kind,
        tau: tau.slice(),
        m: tau.map(t => ising2dMagnetisation(t * ISING2D_TC)),
        description: msg('physics.reference.ising-2d', 'Exact magnetisation of the 2D Ising model on the square lattice: M = [1 − sinh(2J/kB·T)⁻⁴]^(1/8).')
      };
    default:
      throw new PhysicsInputError(msg('physics.reference.unknown', 'There is no reference curve called “%1”.', String(kind)));
  }
}
