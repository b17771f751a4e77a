/**
 * The coefficients each Landau convention shows, and the explicit conversion
 * between the displayed values and convention L through the core's
 * conversion functions (`fromConventionL`, `toConventionL`).
 */
import type { AnyLandauCoefficients, ILandauCoefficients, LandauConvention } from '../../core/physics/landau/index';
import { fromConventionL, toConventionL } from '../../core/physics/landau/index';

/** How a coefficient's slider range is chosen. */
export type FieldRange = 'positive' | 'non-negative' | 'signed' | 'temperature';

/** One coefficient of a convention. */
export interface ICoefficientField {
  /** Property name in the convention's coefficient object. */
  key: string;
  /** Symbol shown beside the slider. */
  symbol: string;
  range: FieldRange;
}

/** The conventions in picker order. */
export const CONVENTIONS: readonly LandauConvention[] = ['L', 'no-fractions', 'devonshire', 'ginzburg-landau'];

/** Fields of each convention, in display order. */
export const CONVENTION_FIELDS: Record<LandauConvention, readonly ICoefficientField[]> = {
  L: [
    { key: 'a', symbol: 'a', range: 'positive' },
    { key: 'T0', symbol: 'T0', range: 'temperature' },
    { key: 'b', symbol: 'b', range: 'signed' },
    { key: 'c', symbol: 'c', range: 'non-negative' },
    { key: 'd', symbol: 'd', range: 'signed' }
  ],
  'no-fractions': [
    { key: 'A', symbol: 'A', range: 'positive' },
    { key: 'T0', symbol: 'T0', range: 'temperature' },
    { key: 'B', symbol: 'B', range: 'signed' },
    { key: 'C', symbol: 'C', range: 'non-negative' },
    { key: 'D', symbol: 'D', range: 'signed' }
  ],
  devonshire: [
    { key: 'curieConstant', symbol: 'C_CW (K)', range: 'positive' },
    { key: 'T0', symbol: 'T0', range: 'temperature' },
    { key: 'alpha11', symbol: 'α11', range: 'signed' },
    { key: 'alpha111', symbol: 'α111', range: 'non-negative' }
  ],
  'ginzburg-landau': [
    { key: 'alphaPrime', symbol: 'α′', range: 'positive' },
    { key: 'Tc', symbol: 'Tc', range: 'temperature' },
    { key: 'beta', symbol: 'β', range: 'positive' }
  ]
};

/** The free energy of each convention, written out. */
export const CONVENTION_FORMULAS: Record<LandauConvention, string> = {
  L: 'F = (a/2)(T − T0)ψ² + (d/3)ψ³ + (b/4)ψ⁴ + (c/6)ψ⁶ − hψ',
  'no-fractions': 'F = A(T − T0)ψ² + Dψ³ + Bψ⁴ + Cψ⁶ − hψ   (a = 2A, d = 3D, b = 4B, c = 6C)',
  devonshire: 'F = α1 P² + α11 P⁴ + α111 P⁶ − EP,  α1 = (T − T0)/(2 ε0 C_CW)   (a = 1/(ε0 C_CW), b = 4α11, c = 6α111)',
  'ginzburg-landau': 'F = α′(T − Tc)|ψ|² + (β/2)|ψ|⁴ − hψ   (a = 2α′, b = 2β, c = 0)'
};

/**
 * Convention-L coefficients expressed in `convention`, as a plain record of
 * the convention's fields.
 *
 * @throws PhysicsInputError when the form cannot hold them (a cubic term in
 * the Devonshire form; a sextic or cubic term in the Ginzburg–Landau form).
 */
export function valuesIn(k: ILandauCoefficients, convention: LandauConvention): Record<string, number> {
  const tagged = fromConventionL(k, convention);
  const source = tagged.coefficients as unknown as Record<string, number | undefined>;
  const out: Record<string, number> = {};
  for (const f of CONVENTION_FIELDS[convention]) {
    out[f.key] = source[f.key] ?? 0;
  }
  return out;
}

/**
 * Convention-L coefficients from the displayed values of `convention`.
 *
 * @throws PhysicsInputError for values the conversion refuses (C_CW ≤ 0).
 */
export function coefficientsFrom(convention: LandauConvention, values: Record<string, number>): ILandauCoefficients {
  return toConventionL({ convention, coefficients: { ...values } } as unknown as AnyLandauCoefficients);
}
