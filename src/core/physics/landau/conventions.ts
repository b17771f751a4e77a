/**
 * Landau coefficient conventions and their explicit mapping to convention L
 * ([B3 in REFERENCES.md]):
 *
 *   L:              F = (a/2)(T−T0)ψ² + (d/3)ψ³ + (b/4)ψ⁴ + (c/6)ψ⁶ − hψ
 *   no-fractions:   F = A(T−T0)ψ² + Dψ³ + Bψ⁴ + Cψ⁶       a = 2A, d = 3D, b = 4B, c = 6C
 *   devonshire:     F = α1 P² + α11 P⁴ + α111 P⁶, α1 = (T−T0)/(2 ε0 C_CW)
 *                                                       a = 1/(ε0 C_CW), b = 4α11, c = 6α111
 *   ginzburg-landau F = α′(T−Tc)|ψ|² + (β/2)|ψ|⁴           a = 2α′, b = 2β, c = 0
 *
 * Every result object in this package states the convention it used.
 */
import { msg } from '../../messages';
import type { ICoreMessage } from '../../messages';
import { PhysicsInputError, requireFinite } from '../errors';
import { PHYS } from '../../units/constants';

/** Names of the supported conventions. */
export type LandauConvention = 'L' | 'no-fractions' | 'devonshire' | 'ginzburg-landau';

/** Coefficients in convention L. `d` (cubic, term (d/3)ψ³) defaults to 0. */
export interface ILandauCoefficients {
  a: number;
  T0: number;
  b: number;
  c: number;
  d?: number;
}

/** "No fractions" form A(T−T0)ψ² + Dψ³ + Bψ⁴ + Cψ⁶. */
export interface INoFractionsCoefficients {
  A: number;
  T0: number;
  B: number;
  C: number;
  D?: number;
}

/** Devonshire ferroelectric form; `curieConstant` is C_CW in kelvin. */
export interface IDevonshireCoefficients {
  curieConstant: number;
  T0: number;
  alpha11: number;
  alpha111: number;
  /** Vacuum permittivity override (F/m); default CODATA 2018. */
  eps0?: number;
}

/** Ginzburg–Landau form α′(T−Tc)|ψ|² + (β/2)|ψ|⁴. */
export interface IGinzburgLandauCoefficients {
  alphaPrime: number;
  Tc: number;
  beta: number;
}

/** Tagged union of coefficient sets in any convention. */
export type AnyLandauCoefficients =
  | { convention: 'L'; coefficients: ILandauCoefficients }
  | { convention: 'no-fractions'; coefficients: INoFractionsCoefficients }
  | { convention: 'devonshire'; coefficients: IDevonshireCoefficients }
  | { convention: 'ginzburg-landau'; coefficients: IGinzburgLandauCoefficients };

function unknownConvention(convention: unknown): ICoreMessage {
  return msg('physics.landau.unknown-convention', 'There is no Landau convention called “%1”.', String(convention));
}

/** Converts coefficients given in any convention into convention L. */
export function toConventionL(input: AnyLandauCoefficients): ILandauCoefficients {
  switch (input.convention) {
    case 'L':
      return { ...input.coefficients, d: input.coefficients.d ?? 0 };
    case 'no-fractions': {
      const k = input.coefficients;
      return { a: 2 * k.A, T0: k.T0, b: 4 * k.B, c: 6 * k.C, d: 3 * (k.D ?? 0) };
    }
    case 'devonshire': {
      const k = input.coefficients;
      const eps0 = k.eps0 ?? PHYS.eps0;
      if (!(k.curieConstant > 0)) {
        throw new PhysicsInputError(
          msg('physics.landau.curie-constant', 'The Curie constant of the Devonshire form must be above 0, but it is %1.', k.curieConstant)
        );
      }
      return { a: 1 / (eps0 * k.curieConstant), T0: k.T0, b: 4 * k.alpha11, c: 6 * k.alpha111, d: 0 };
    }
    case 'ginzburg-landau': {
      const k = input.coefficients;
      return { a: 2 * k.alphaPrime, T0: k.Tc, b: 2 * k.beta, c: 0, d: 0 };
    }
    default:
      throw new PhysicsInputError(unknownConvention((input as { convention?: unknown }).convention));
  }
}

/** Expresses convention-L coefficients in the "no fractions" form. */
export function toNoFractions(k: ILandauCoefficients): INoFractionsCoefficients {
  return { A: k.a / 2, T0: k.T0, B: k.b / 4, C: k.c / 6, D: (k.d ?? 0) / 3 };
}

/** Expresses convention-L coefficients in the Devonshire form (no cubic term allowed). */
export function toDevonshire(k: ILandauCoefficients, eps0: number = PHYS.eps0): IDevonshireCoefficients {
  if ((k.d ?? 0) !== 0) {
    throw new PhysicsInputError(
      msg('physics.landau.devonshire-no-cubic', 'The Devonshire form has no cubic term, so coefficients with d ≠ 0 cannot be written in it.')
    );
  }
  return { curieConstant: 1 / (eps0 * k.a), T0: k.T0, alpha11: k.b / 4, alpha111: k.c / 6, eps0 };
}

/** Expresses convention-L coefficients in the Ginzburg–Landau form (requires c = d = 0). */
export function toGinzburgLandau(k: ILandauCoefficients): IGinzburgLandauCoefficients {
  if (k.c !== 0 || (k.d ?? 0) !== 0) {
    throw new PhysicsInputError(
      msg('physics.landau.ginzburg-landau-terms', 'The Ginzburg–Landau form has no sextic or cubic term, so coefficients with c ≠ 0 or d ≠ 0 cannot be written in it.')
    );
  }
  return { alphaPrime: k.a / 2, Tc: k.T0, beta: k.b / 2 };
}

/** Expresses convention-L coefficients in the requested convention (tagged). */
export function fromConventionL(k: ILandauCoefficients, convention: LandauConvention, eps0: number = PHYS.eps0): AnyLandauCoefficients {
  switch (convention) {
    case 'L':
      return { convention, coefficients: { ...k, d: k.d ?? 0 } };
    case 'no-fractions':
      return { convention, coefficients: toNoFractions(k) };
    case 'devonshire':
      return { convention, coefficients: toDevonshire(k, eps0) };
    case 'ginzburg-landau':
      return { convention, coefficients: toGinzburgLandau(k) };
    default:
      throw new PhysicsInputError(unknownConvention(convention));
  }
}

/**
 * Validates convention-L coefficients: finite, a > 0, and F bounded below
 * (c > 0, or c = 0 with b > 0).
 */
export function validateLandau(k: ILandauCoefficients): void {
  requireFinite('a', k.a);
  requireFinite('T0', k.T0);
  requireFinite('b', k.b);
  requireFinite('c', k.c);
  requireFinite('d', k.d ?? 0);
  if (!(k.a > 0)) {
    throw new PhysicsInputError(msg('physics.landau.a-not-positive', 'The coefficient a must be above 0 in convention L, but it is %1.', k.a));
  }
  if (k.c < 0 || (k.c === 0 && !(k.b > 0))) {
    throw new PhysicsInputError(
      msg('physics.landau.unbounded', 'The free energy has no lower bound: c must be above 0, or c = 0 with b above 0 (here b = %1, c = %2).', k.b, k.c)
    );
  }
}
