/**
 * Reduced reference curves m(τ), τ = T/Tc, to overlay on measured order
 * parameters: Weiss mean field (any J), Landau mean field √(1 − τ),
 * tricritical (1 − τ)^(1/4), and the exact 2D Ising magnetisation; and all
 * curves of the reduced plot at once ({@link reducedReferenceCurves}).
 */
import { ISING2D_TC, ising2dMagnetisation } from './ising2d';
import { msg } from '../messages';
import type { ICoreMessage } from '../messages';
import { PhysicsInputError } from './errors';
import { UNIVERSALITY_CLASSES } from './universality';
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

/** Where an amplitude comes from: a checked publication, recollection not checked, or none (B = 1, shape only). */
export type AmplitudeProvenance = 'published' | 'from-memory' | 'none';

/** Leading asymptotic law M/M0 = B(1 − T/Tc)^β of one 3D class on one lattice. */
export interface IAsymptoticLaw {
  /** Id of the class in `UNIVERSALITY_CLASSES` (β and its citation come from there). */
  classId: string;
  lattice: string;
  B: number;
  provenance: AmplitudeProvenance;
  /** Source of B, or why there is none. */
  amplitudeSource: string;
}

/**
 * Amplitudes of the 3D laws. Only the simple-cubic Ising amplitude is given
 * a number; no amplitude for the XY and Heisenberg classes was at hand when
 * this was written, so those curves are drawn with B = 1 and say so.
 */
export const ASYMPTOTIC_LAWS: readonly IAsymptoticLaw[] = [
  {
    classId: '3d-ising',
    lattice: 'simple cubic, spin ½',
    // [from memory: unverified] leading coefficient a0 of the Monte Carlo fit m = t^β(a0 − a1 t^θ − a2 t), t = 1 − T/Tc.
    B: 1.6919045,
    provenance: 'from-memory',
    amplitudeSource: 'A. L. Talapov, H. W. J. Blöte, J. Phys. A 29, 5727 (1996) (from memory, not checked against the original; fitted there with β = 0.32694)'
  },
  {
    classId: '3d-xy',
    lattice: 'simple cubic (plane rotator)',
    B: 1,
    provenance: 'none',
    amplitudeSource: 'no published amplitude at hand: B = 1 draws the shape of the law only'
  },
  {
    classId: '3d-heisenberg',
    lattice: 'simple cubic (classical spins)',
    B: 1,
    provenance: 'none',
    amplitudeSource: 'no published amplitude at hand: B = 1 draws the shape of the law only'
  }
];

/** One curve of the reduced plot M/M0 against τ = T/Tc. */
export interface IReducedReferenceCurve {
  /** 'weiss-0.5', 'weiss-inf', 'ising-2d', '3d-ising', … */
  id: string;
  label: ICoreMessage;
  /** Sources of the formula and of every number in it. */
  citation: string;
  tau: number[];
  m: number[];
  /** The asymptotic laws: amplitude, exponent and where B comes from. */
  law?: { B: number; beta: number; lattice: string; provenance: AmplitudeProvenance };
}

const WEISS_CITATION = 'P. Weiss, J. Phys. Théor. Appl. 6, 661 (1907); L. Brillouin, J. Phys. Radium 8, 74 (1927) [B1]';
const ISING_2D_CITATION = 'L. Onsager, Phys. Rev. 65, 117 (1944); C. N. Yang, Phys. Rev. 85, 808 (1952) [C1]';

/** Spins of the mean-field curves by default (∞: the classical Langevin limit). */
export const REFERENCE_SPINS: readonly number[] = [0.5, 1, 3.5, Infinity];

/**
 * Every reference curve of the reduced plot on one τ grid (τ > 0): the
 * mean-field Brillouin curves m = B_J(3J m/((J + 1)τ)) for each J of
 * `spins` [B1 in REFERENCES.md], the exact square-lattice Ising magnetisation
 * M = (1 − sinh⁻⁴(2J/kT))^(1/8) with kTc/J = 2/ln(1 + √2) [C1], and the
 * 3D Ising, XY and Heisenberg laws M/M0 = B(1 − τ)^β (0 from τ = 1 on) with
 * β of [C2] and B of {@link ASYMPTOTIC_LAWS}. Each curve carries its id,
 * label and citation.
 */
export function reducedReferenceCurves(tau: readonly number[], options: { spins?: readonly number[] } = {}): IReducedReferenceCurve[] {
  for (const t of tau) {
    if (!(t > 0) || !Number.isFinite(t)) {
      throw new PhysicsInputError(msg('physics.reference.tau', 'Every reduced temperature τ must be a finite number above 0, but one is %1.', t));
    }
  }
  const out: IReducedReferenceCurve[] = [];
  for (const J of options.spins ?? REFERENCE_SPINS) {
    out.push({
      id: `weiss-${J === Infinity ? 'inf' : J}`,
      label:
        J === Infinity
          ? msg('physics.reference.langevin-label', 'Mean field, J = ∞ (Langevin).')
          : msg('physics.reference.weiss-label', 'Mean field, J = %1.', J % 1 === 0 ? String(J) : `${2 * J}/2`),
      citation: WEISS_CITATION,
      tau: tau.slice(),
      m: Array.from(weissMagnetisation(J, tau))
    });
  }
  out.push({
    id: 'ising-2d',
    label: msg('physics.reference.ising-2d-label', '2D Ising, exact (square lattice).'),
    citation: ISING_2D_CITATION,
    tau: tau.slice(),
    m: tau.map(t => ising2dMagnetisation(t * ISING2D_TC))
  });
  for (const law of ASYMPTOTIC_LAWS) {
    const cls = UNIVERSALITY_CLASSES.find(c => c.id === law.classId);
    if (!cls) {
      continue;
    }
    const beta = cls.beta.value;
    out.push({
      id: law.classId,
      label:
        law.provenance === 'none'
          ? msg('physics.reference.law-shape-label', '%1, (1 − T/Tc)^β with β = %2 (shape only: amplitude not known here).', cls.name, { value: beta, digits: 5 })
          : msg('physics.reference.law-label', '%1, %2(1 − T/Tc)^β with β = %3 (%4 lattice).', cls.name, { value: law.B, digits: 5 }, { value: beta, digits: 5 }, law.lattice),
      citation: `β: ${cls.citation} [C2]; B: ${law.amplitudeSource}`,
      tau: tau.slice(),
      m: tau.map(t => (t < 1 ? law.B * Math.pow(1 - t, beta) : 0)),
      law: { B: law.B, beta, lattice: law.lattice, provenance: law.provenance }
    });
  }
  return out;
}
