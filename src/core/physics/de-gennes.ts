/**
 * Landau–de Gennes free energy for the nematic–isotropic transition
 * [B14 in REFERENCES.md]: F = (a/2)(T − T*)S² − (B/3)S³ + (C/4)S⁴. It maps onto
 * convention L with a cubic term d = −B, quartic b = C and c = 0, so the
 * Landau machinery (stationary points, paths) applies unchanged.
 */
import { msg } from '../messages';
import type { ICoreMessage } from '../messages';
import { PhysicsInputError, requireFinite } from './errors';
import type { ILandauCoefficients } from './landau/conventions';
import { landauTransitionNumeric } from './landau/derived';

/** Coefficients of the Landau–de Gennes form. */
export interface IDeGennesCoefficients {
  a: number;
  Tstar: number;
  B: number;
  C: number;
}

/** Mapping to convention L. */
export function deGennesToLandau(k: IDeGennesCoefficients): ILandauCoefficients {
  return { a: k.a, T0: k.Tstar, d: -k.B, b: k.C, c: 0 };
}

/** Closed-form N–I quantities, with a numerical cross-check of T_NI. */
export interface IDeGennesResult {
  /** The free energy, for people (code `physics.de-gennes.convention`). */
  convention: ICoreMessage;
  TNI: number;
  SNI: number;
  superheatingLimit: number;
  supercoolingLimit: number;
  latentHeat: number;
  /** T_NI from direct minimisation (convention L engine). */
  TNINumeric: number;
}

/** T_NI = T* + 2B²/(9aC), S_NI = 2B/(3C), T* + B²/(4aC), L = T_NI a S_NI²/2. */
export function deGennesTransition(k: IDeGennesCoefficients): IDeGennesResult {
  requireFinite('a', k.a);
  requireFinite('Tstar', k.Tstar);
  requireFinite('B', k.B);
  requireFinite('C', k.C);
  if (!(k.a > 0) || !(k.C > 0) || !(k.B > 0)) {
    throw new PhysicsInputError(msg('physics.de-gennes.not-positive', 'The Landau–de Gennes coefficients a, B and C must all be above 0.'));
  }
  const TNI = k.Tstar + (2 * k.B * k.B) / (9 * k.a * k.C);
  const SNI = (2 * k.B) / (3 * k.C);
  const num = landauTransitionNumeric(deGennesToLandau(k));
  return {
    convention: msg('physics.de-gennes.convention', 'Landau–de Gennes free energy: F = (a/2)(T − T*)S² − (B/3)S³ + (C/4)S⁴.'),
    TNI,
    SNI,
    superheatingLimit: k.Tstar + (k.B * k.B) / (4 * k.a * k.C),
    supercoolingLimit: k.Tstar,
    latentHeat: (TNI * k.a * SNI * SNI) / 2,
    TNINumeric: num.Ttransition
  };
}
