/**
 * Reduced reference curves m(τ), τ = T/Tc, to overlay on measured order
 * parameters: Weiss mean field (any J), Landau mean field √(1 − τ),
 * tricritical (1 − τ)^(1/4), and the exact 2D Ising magnetisation.
 */
import { ISING2D_TC, ising2dMagnetisation } from './ising2d';
import { PhysicsInputError } from './errors';
import { weissMagnetisation } from './weiss';

/** Available curve kinds. */
export type ReferenceCurveKind = 'weiss' | 'landau-mean-field' | 'tricritical' | 'ising-2d';

/** A sampled curve with its description. */
export interface IReferenceCurve {
  kind: ReferenceCurveKind;
  tau: number[];
  m: number[];
  description: string;
}

/** Samples a reference curve on the given τ values (τ > 0). */
export function referenceCurve(kind: ReferenceCurveKind, tau: readonly number[], J = 0.5): IReferenceCurve {
  for (const t of tau) {
    if (!(t > 0) || !Number.isFinite(t)) {
      throw new PhysicsInputError(`tau values must be finite and > 0, got ${t}`);
    }
  }
  switch (kind) {
    case 'weiss':
      return { kind, tau: tau.slice(), m: Array.from(weissMagnetisation(J, tau)), description: `Weiss mean field, J = ${J}` };
    case 'landau-mean-field':
      return { kind, tau: tau.slice(), m: tau.map(t => (t < 1 ? Math.sqrt(1 - t) : 0)), description: 'm = (1 - tau)^(1/2)' };
    case 'tricritical':
      return { kind, tau: tau.slice(), m: tau.map(t => (t < 1 ? Math.pow(1 - t, 0.25) : 0)), description: 'm = (1 - tau)^(1/4)' };
    case 'ising-2d':
      return {
        kind,
        tau: tau.slice(),
        m: tau.map(t => ising2dMagnetisation(t * ISING2D_TC)),
        description: 'exact 2D Ising (square lattice), M = [1 - sinh(2J/kBT)^-4]^(1/8)'
      };
    default:
      throw new PhysicsInputError(`unknown reference curve ${String(kind)}`);
  }
}
