/**
 * Published critical exponents of common universality classes (values and
 * provenance in [C2 in REFERENCES.md]) and the scaling
 * relations used to check a set of measured exponents.
 */
import { msg } from '../messages';
import type { ICoreMessage } from '../messages';

/** A value with its standard uncertainty (0 for exact values). */
export interface IValueError {
  value: number;
  error: number;
}

/** Exponents of one class with their source. */
export interface IUniversalityClass {
  id: string;
  name: string;
  alpha: IValueError;
  beta: IValueError;
  gamma: IValueError;
  delta: IValueError;
  nu: IValueError;
  eta: IValueError;
  /** Bibliographic source. */
  citation: string;
}

const v = (value: number, error = 0): IValueError => ({ value, error });

/** Universality classes of [C2 in REFERENCES.md]. */
export const UNIVERSALITY_CLASSES: readonly IUniversalityClass[] = [
  {
    id: '3d-ising',
    name: '3D Ising',
    alpha: v(0.1099, 0.0007),
    beta: v(0.32648, 0.00018),
    gamma: v(1.2371, 0.0004),
    delta: v(4.7893, 0.0022),
    nu: v(0.63002, 0.00023),
    eta: v(0.0364, 0.0004),
    citation: 'M. Campostrini, A. Pelissetto, P. Rossi, E. Vicari, Phys. Rev. E 60, 3526 (1999)'
  },
  {
    id: '3d-ising-bootstrap',
    name: '3D Ising (conformal bootstrap, derived)',
    alpha: v(0.110087, 0.000012),
    beta: v(0.3264187, 0.0000022),
    gamma: v(1.2370752, 0.0000079),
    delta: v(4.789841, 0.000011),
    nu: v(0.6299709, 0.000004),
    eta: v(0.0362978, 0.000002),
    citation: 'derived from F. Kos, D. Poland, D. Simmons-Duffin, A. Vichi, JHEP 08 (2016) 036 (scaling dimensions)'
  },
  {
    id: '3d-xy',
    name: '3D XY',
    alpha: v(-0.0151, 0.0003),
    beta: v(0.3486, 0.0001),
    gamma: v(1.3178, 0.0002),
    delta: v(4.78, 0.001),
    nu: v(0.6717, 0.0001),
    eta: v(0.0381, 0.0002),
    citation: 'M. Campostrini, M. Hasenbusch, A. Pelissetto, E. Vicari, Phys. Rev. B 74, 144506 (2006)'
  },
  {
    id: '3d-heisenberg',
    name: '3D Heisenberg',
    alpha: v(-0.1336, 0.0015),
    beta: v(0.3689, 0.0003),
    gamma: v(1.396, 0.0009),
    delta: v(4.783, 0.003),
    nu: v(0.7112, 0.0005),
    eta: v(0.0375, 0.0005),
    citation: 'M. Campostrini, M. Hasenbusch, A. Pelissetto, P. Rossi, E. Vicari, Phys. Rev. B 65, 144520 (2002)'
  },
  {
    id: 'mean-field',
    name: 'Mean field (Landau, d >= 4)',
    alpha: v(0),
    beta: v(0.5),
    gamma: v(1),
    delta: v(3),
    nu: v(0.5),
    eta: v(0),
    citation: 'H. E. Stanley, Introduction to Phase Transitions and Critical Phenomena (OUP 1971)'
  },
  {
    id: 'tricritical',
    name: 'Tricritical mean field',
    alpha: v(0.5),
    beta: v(0.25),
    gamma: v(1),
    delta: v(5),
    nu: v(0.5),
    eta: v(0),
    citation: 'R. B. Griffiths, Phys. Rev. Lett. 24, 715 (1970)'
  },
  {
    id: '2d-ising',
    name: '2D Ising (exact)',
    alpha: v(0),
    beta: v(0.125),
    gamma: v(1.75),
    delta: v(15),
    nu: v(1),
    eta: v(0.25),
    citation: 'L. Onsager, Phys. Rev. 65, 117 (1944); C. N. Yang, Phys. Rev. 85, 808 (1952)'
  }
];

/** Measured exponents (any subset) with uncertainties. */
export interface IMeasuredExponents {
  alpha?: IValueError;
  beta?: IValueError;
  gamma?: IValueError;
  delta?: IValueError;
  nu?: IValueError;
}

/** How well the measured exponents agree with one class. */
export interface IClassComparison {
  id: string;
  name: string;
  /** Σ z² over the exponents given. */
  chi2: number;
  /** Number of exponents compared. */
  count: number;
  /** Per-exponent z = (measured − class)/√(σ_m² + σ_c²). */
  z: Record<string, number>;
  citation: string;
}

/**
 * Compares measured exponents with every class, best match first. A single
 * exponent is weak evidence; a class needs at least two plus the
 * scaling relations (`warning` says so when fewer than two were given).
 */
export function compareWithClasses(m: IMeasuredExponents): { ranking: IClassComparison[]; warning: ICoreMessage | null } {
  const keys = (['alpha', 'beta', 'gamma', 'delta', 'nu'] as const).filter(k => m[k] !== undefined);
  const ranking = UNIVERSALITY_CLASSES.map(c => {
    const z: Record<string, number> = {};
    let chi2 = 0;
    for (const k of keys) {
      const meas = m[k] as IValueError;
      const ref = c[k];
      const s = Math.sqrt(meas.error * meas.error + ref.error * ref.error);
      const zz = s > 0 ? (meas.value - ref.value) / s : meas.value === ref.value ? 0 : Infinity;
      z[k] = zz;
      chi2 += zz * zz;
    }
    return { id: c.id, name: c.name, chi2, count: keys.length, z, citation: c.citation };
  }).sort((a, b) => a.chi2 - b.chi2);
  return {
    ranking,
    warning:
      keys.length < 2
        ? msg('physics.universality.one-exponent', 'A universality class cannot be assigned from fewer than two exponents: measure at least two, and check the scaling relations.')
        : null
  };
}

/** Outcome of one scaling relation. */
export interface IRelationCheck {
  relation: 'Rushbrooke' | 'Widom';
  /** Left-hand side minus right-hand side. */
  deviation: number;
  /** Propagated standard uncertainty of the deviation. */
  error: number;
  /** |deviation| ≤ max(k·error, tolerance). */
  satisfied: boolean;
}

/**
 * Rushbrooke α + 2β + γ = 2 and Widom δ = 1 + γ/β [B4 in REFERENCES.md], each when
 * its exponents are present. `k` (default 2) is the coverage factor,
 * `tolerance` (default 1e-9) the floor for exact inputs.
 */
export function checkScalingRelations(m: IMeasuredExponents, k = 2, tolerance = 1e-9): IRelationCheck[] {
  const out: IRelationCheck[] = [];
  const { alpha, beta, gamma, delta } = m;
  if (alpha && beta && gamma) {
    const dev = alpha.value + 2 * beta.value + gamma.value - 2;
    const err = Math.sqrt(alpha.error ** 2 + 4 * beta.error ** 2 + gamma.error ** 2);
    out.push({ relation: 'Rushbrooke', deviation: dev, error: err, satisfied: Math.abs(dev) <= Math.max(k * err, tolerance) });
  }
  if (beta && gamma && delta) {
    const dev = delta.value - 1 - gamma.value / beta.value;
    const err = Math.sqrt(delta.error ** 2 + (gamma.error / beta.value) ** 2 + ((gamma.value * beta.error) / (beta.value * beta.value)) ** 2);
    out.push({ relation: 'Widom', deviation: dev, error: err, satisfied: Math.abs(dev) <= Math.max(k * err, tolerance) });
  }
  return out;
}
