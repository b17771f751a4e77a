/**
 * Closed-form consequences of the Landau 2-4-6 free energy in convention L
 * without cubic term ([B3 in REFERENCES.md] (i)–(iv)), and numerical
 * counterparts that also work with a cubic term.
 */
import { bracketRoot } from '../../numeric/scalar';
import { regularizedGammaQ } from '../../numeric/chi2';
import { msg } from '../../messages';
import type { ICoreMessage } from '../../messages';
import { PhysicsInputError } from '../errors';
import type { ILandauCoefficients } from './conventions';
import { validateLandau } from './conventions';
import { stationaryUnchecked } from './free-energy';

/** Order of the zero-field transition. */
export type LandauRegime = 'second-order' | 'first-order' | 'tricritical';

/** Derived quantities of a 2-4-6 Landau free energy (convention L, d = 0). */
export interface ILandauDerived {
  convention: 'L';
  regime: LandauRegime;
  /** Supercooling limit / stability limit of the disordered state. */
  T0: number;
  /** Transition temperature: T0 (second order, tricritical) or T1 (first order). */
  Ttransition: number;
  /** Superheating limit T** (first order only, otherwise = T0). */
  Tsuperheat: number;
  /** Order-parameter jump at the transition (0 if continuous). */
  psiJump: number;
  /** Latent heat per unit of F (0 if continuous). */
  latentHeat: number;
  /** Barrier at T1: position and height (first order only, else NaN). */
  barrierPsi: number;
  barrierHeight: number;
  /** 1/χ on the disordered and ordered sides at the transition (first order; 0 otherwise). */
  inverseChiDisordered: number;
  inverseChiOrdered: number;
  /** d(1/χ)/dT on the disordered and ordered sides at the transition. */
  inverseChiSlopeDisordered: number;
  inverseChiSlopeOrdered: number;
  /** Specific-heat jump at T0 (second order; Infinity at the tricritical point, NaN for first order). */
  specificHeatJump: number;
  /** Critical end point of the line of field-induced jumps (first order only, else NaN). */
  criticalEndPoint: { T: number; psi: number; h: number };
  /** ψ on the ordered branch at T0 (first order: √(|b|/c)). */
  psiOrderedAtT0: number;
}

/** Closed forms of [B3 in REFERENCES.md] for convention-L coefficients with no cubic term. */
export function landauDerived(k: ILandauCoefficients): ILandauDerived {
  validateLandau(k);
  if ((k.d ?? 0) !== 0) {
    throw new PhysicsInputError(
      msg('physics.landau.closed-forms-need-no-cubic', 'The closed forms hold only without a cubic term (d = 0); with a cubic term the transition is found numerically.')
    );
  }
  const { a, b, c, T0 } = k;
  const nan = { T: NaN, psi: NaN, h: NaN };
  if (b >= 0) {
    // Continuous transition at T0: no jump, no barrier, no latent heat;
    // below T0 the slope of 1/χ is −2a (second order) or −4a (tricritical, b = 0).
    const tricritical = b === 0;
    return {
      convention: 'L',
      regime: tricritical ? 'tricritical' : 'second-order',
      T0,
      Ttransition: T0,
      Tsuperheat: T0,
      psiJump: 0,
      latentHeat: 0,
      barrierPsi: NaN,
      barrierHeight: NaN,
      inverseChiDisordered: 0,
      inverseChiOrdered: 0,
      inverseChiSlopeDisordered: a,
      inverseChiSlopeOrdered: (tricritical ? -4 : -2) * a,
      specificHeatJump: tricritical ? Infinity : (T0 * a * a) / (2 * b),
      criticalEndPoint: nan,
      psiOrderedAtT0: 0
    };
  }
  const B = -b;
  const T1 = T0 + (3 * B * B) / (16 * a * c);
  const psi1 = Math.sqrt((3 * B) / (4 * c));
  const psiCp = Math.sqrt((3 * B) / (10 * c));
  return {
    convention: 'L',
    regime: 'first-order',
    T0,
    Ttransition: T1,
    Tsuperheat: T0 + (B * B) / (4 * a * c),
    psiJump: psi1,
    latentHeat: (3 * a * B * T1) / (8 * c),
    barrierPsi: Math.sqrt(B / (4 * c)),
    barrierHeight: (B * B * B) / (96 * c * c),
    inverseChiDisordered: (3 * B * B) / (16 * c),
    inverseChiOrdered: (3 * B * B) / (4 * c),
    inverseChiSlopeDisordered: a,
    inverseChiSlopeOrdered: -8 * a,
    specificHeatJump: NaN,
    criticalEndPoint: { T: T0 + (9 * B * B) / (20 * a * c), psi: psiCp, h: (6 / 25) * ((B * B) / c) * psiCp },
    psiOrderedAtT0: Math.sqrt(B / c)
  };
}

/** Lowest ordered (ψ ≠ 0) local minimum at (T, h = 0), or null. */
function orderedMinimum(k: ILandauCoefficients, T: number): { psi: number; F: number } | null {
  const r = stationaryUnchecked(k, T, 0);
  let best: { psi: number; F: number } | null = null;
  const tiny = 1e-12;
  for (const p of r.points) {
    if ((p.kind === 'stable' || p.kind === 'metastable') && Math.abs(p.psi) > tiny) {
      if (best === null || p.F < best.F) {
        best = { psi: p.psi, F: p.F };
      }
    }
  }
  return best;
}

/** Numerically determined zero-field transition (works with a cubic term). */
export interface ILandauTransitionNumeric {
  convention: 'L';
  firstOrder: boolean;
  /** Superheating limit: highest T with an ordered local minimum. */
  Tsuperheat: number;
  /** Transition temperature (equal free energies; = T0 if continuous). */
  Ttransition: number;
  psiJump: number;
  /** T1 · a ψ1²/2 (entropy S = S0 − (a/2)ψ² holds with a cubic term too). */
  latentHeat: number;
  converged: boolean;
  /** How the transition was found (`physics.landau.continuous`, or the root search's `numeric.root.*`). */
  reason: ICoreMessage;
}

/**
 * Zero-field transition found numerically: the superheating limit by
 * bisection on the existence of an ordered minimum, then T1 by Brent's
 * method on F_ordered(T) − F(0) = 0.
 */
export function landauTransitionNumeric(k: ILandauCoefficients): ILandauTransitionNumeric {
  validateLandau(k);
  const { a, T0 } = k;
  // expand upward until no ordered minimum exists
  let span = 1e-3 * Math.max(1, Math.abs(T0));
  let hi = T0 + span;
  let guard = 0;
  while (orderedMinimum(k, hi) !== null && guard++ < 200) {
    span *= 2;
    hi = T0 + span;
  }
  const exists = orderedMinimum(k, T0 + 1e-12 * Math.max(1, Math.abs(T0))) !== null;
  if (!exists) {
    return {
      convention: 'L',
      firstOrder: false,
      Tsuperheat: T0,
      Ttransition: T0,
      psiJump: 0,
      latentHeat: 0,
      converged: true,
      reason: msg('physics.landau.continuous', 'The transition is continuous: there is no ordered minimum above T0.')
    };
  }
  let lo = T0;
  for (let it = 0; it < 200 && hi - lo > 4 * Number.EPSILON * Math.abs(hi); it++) {
    const mid = 0.5 * (lo + hi);
    if (orderedMinimum(k, mid) !== null) {
      lo = mid;
    } else {
      hi = mid;
    }
  }
  const Tss = lo;
  const dF = (T: number): number => {
    const o = orderedMinimum(k, T);
    return o === null ? Infinity : o.F; // F(0) = 0 at h = 0
  };
  const r = bracketRoot(dF, T0, Tss, 1e-13 * Math.max(1, Math.abs(T0)));
  const T1 = r.root;
  const o = orderedMinimum(k, T1);
  const psi1 = o === null ? NaN : Math.abs(o.psi);
  return {
    convention: 'L',
    firstOrder: true,
    Tsuperheat: Tss,
    Ttransition: T1,
    psiJump: psi1,
    latentHeat: (T1 * a * psi1 * psi1) / 2,
    converged: r.converged && o !== null,
    reason: r.reason
  };
}

/** ψ at h = 0 on the tricritical or second-order equilibrium branch (closed form, d = 0, b ≥ 0). */
export function landauOrderParameterClosedForm(k: ILandauCoefficients, T: number): number {
  if (T >= k.T0) {
    return 0;
  }
  const { a, b, c } = k;
  if (c === 0) {
    return Math.sqrt((a * (k.T0 - T)) / b);
  }
  const disc = b * b + 4 * a * c * (k.T0 - T);
  // (−b + √disc)/(2c) written without cancellation
  const psi2 = (4 * a * (k.T0 - T)) / (2 * (b + Math.sqrt(disc)));
  return Math.sqrt(psi2);
}

/** Convention-L coefficients without cubic term, in the order of a covariance matrix: a, T0, b, c. */
export interface ILandauParameters {
  a: number;
  T0: number;
  b: number;
  c: number;
}

/** A derived quantity with its standard error propagated through the fit covariance. */
export interface ILandauDerivedValue {
  /** 'T0', 'T1', 'T**', 'Δψ', 'L', 'ψb', 'Fb' or 'ΔC'. */
  name: string;
  value: number;
  sigma: number;
  /** Why σ is not a number (null whenever σ is finite). */
  sigmaReason: ICoreMessage | null;
}

/** Order of the transition from the sign of b, with how sure. */
export interface ILandauOrder {
  order: 'first' | 'second' | 'undecided';
  /** b/σ_b (NaN when σ_b is not known). */
  z: number;
  /** Probability that b < 0 under a normal approximation N(b, σ_b²). */
  probabilityFirst: number;
  statement: ICoreMessage;
}

/**
 * Step of the central differences of the derived quantities, as a fraction
 * of each coefficient's standard error: h_i = 1e-3·σ_i. Relative to σ the
 * quantities are smooth (closed forms of [B3]), so the truncation error of
 * the gradient is O(h²) ≈ 1e-6 of its scale, and the step is far above
 * rounding for any σ the engine reports. Coefficients with σ = 0 (held
 * fixed) add no variance and are not stepped.
 */
export const DERIVED_STEP = 1e-3;

/** |z| at or beyond which the order is stated (2σ: 97.7 % one-sided). */
export const ORDER_Z = 2;

/** Φ(x) of the standard normal, from the regularised incomplete gamma function. */
function normalCdf(x: number): number {
  const tail = 0.5 * regularizedGammaQ(0.5, (x * x) / 2);
  return x >= 0 ? 1 - tail : tail;
}

type Formula = (p: ILandauParameters) => number;

/** Closed forms of [B3 in REFERENCES.md] (i) and (ii), written as smooth functions of (a, T0, b, c) on each side of b = 0. */
const FIRST_ORDER: readonly [string, Formula][] = [
  ['T0', p => p.T0],
  ['T1', p => p.T0 + (3 * p.b * p.b) / (16 * p.a * p.c)],
  ['T**', p => p.T0 + (p.b * p.b) / (4 * p.a * p.c)],
  ['Δψ', p => Math.sqrt((-3 * p.b) / (4 * p.c))],
  ['L', p => (3 * p.a * -p.b * (p.T0 + (3 * p.b * p.b) / (16 * p.a * p.c))) / (8 * p.c)],
  ['ψb', p => Math.sqrt(-p.b / (4 * p.c))],
  ['Fb', p => (-p.b * p.b * p.b) / (96 * p.c * p.c)]
];

const SECOND_ORDER: readonly [string, Formula][] = [
  ['T0', p => p.T0],
  ['T1', p => p.T0],
  ['ΔC', p => (p.T0 * p.a * p.a) / (2 * p.b)]
];

const KEYS = ['a', 'T0', 'b', 'c'] as const;

/**
 * T0, T1, T** (first order), the jump Δψ at T1, the latent heat L, the
 * barrier position ψb and height Fb at T1 (first order), or ΔC (second
 * order), each with σ from the linear propagation σ² = gᵀΣg, g the
 * central-difference gradient (step {@link DERIVED_STEP}·σ_i); and the order
 * from b/σ_b. The regime is that of the fitted b; the formulas of that
 * regime are used for every step, so the gradient never crosses b = 0.
 *
 * @param covariance 4×4 in the order a, T0, b, c (rows of a fixed coefficient zero).
 */
export function landauDerivedWithErrors(p: ILandauParameters, covariance: readonly (readonly number[])[]): { values: ILandauDerivedValue[]; order: ILandauOrder } {
  const sig = KEYS.map((_, i) => Math.sqrt(covariance[i]?.[i] ?? Number.NaN));
  const covOk = covariance.length === 4 && covariance.every(r => r.length === 4 && r.every(v => Number.isFinite(v)));
  const first = p.b < 0;
  const formulas = first ? FIRST_ORDER : SECOND_ORDER;
  const values: ILandauDerivedValue[] = formulas.map(([name, f]) => {
    const value = f(p);
    if (!Number.isFinite(value)) {
      return { name, value, sigma: Number.NaN, sigmaReason: msg('physics.landau.sigma-undefined', 'This quantity is not defined at the fitted coefficients (c must be above 0 for a first-order transition, b above 0 for a second-order one).') };
    }
    if (!covOk) {
      return { name, value, sigma: Number.NaN, sigmaReason: msg('physics.landau.sigma-no-covariance', 'The fit gave no finite covariance of the coefficients, so no uncertainty can be propagated.') };
    }
    const g = [0, 0, 0, 0];
    for (let i = 0; i < 4; i++) {
      if (!(sig[i] > 0)) {
        continue;
      }
      const h = DERIVED_STEP * sig[i];
      const up = { ...p, [KEYS[i]]: p[KEYS[i]] + h };
      const down = { ...p, [KEYS[i]]: p[KEYS[i]] - h };
      g[i] = (f(up) - f(down)) / (2 * h);
      if (!Number.isFinite(g[i])) {
        return {
          name,
          value,
          sigma: Number.NaN,
          sigmaReason: msg('physics.landau.sigma-step', 'The coefficient %1 lies within the difference step (%2 of its σ) of where this quantity stops being defined, so its uncertainty cannot be propagated linearly.', KEYS[i], DERIVED_STEP)
        };
      }
    }
    let v = 0;
    for (let i = 0; i < 4; i++) {
      for (let j = 0; j < 4; j++) {
        v += g[i] * covariance[i][j] * g[j];
      }
    }
    return { name, value, sigma: Math.sqrt(Math.max(0, v)), sigmaReason: null };
  });
  return { values, order: landauOrder(p.b, sig[2]) };
}

/** The order from the sign of b and how sure: z = b/σ_b, P(b < 0) = Φ(−z) under a normal approximation. */
export function landauOrder(b: number, sigmaB: number): ILandauOrder {
  if (!(sigmaB >= 0) || !Number.isFinite(sigmaB)) {
    return {
      order: b < 0 ? 'first' : 'second',
      z: Number.NaN,
      probabilityFirst: b < 0 ? 1 : 0,
      statement: msg('physics.landau.order.unknown-sigma', 'Order from the sign of b alone (b = %1): its uncertainty is not known, so how sure this is cannot be said.', b)
    };
  }
  const z = sigmaB > 0 ? b / sigmaB : b < 0 ? -Infinity : b > 0 ? Infinity : 0;
  const pFirst = sigmaB > 0 ? normalCdf(-z) : b < 0 ? 1 : 0;
  const probability = { value: pFirst, digits: 3 };
  if (z <= -ORDER_Z) {
    return { order: 'first', z, probabilityFirst: pFirst, statement: msg('physics.landau.order.first', 'First order: b = %1 ± %2 lies %3σ below 0 (probability %4 that b < 0, normal approximation).', b, sigmaB, { value: -z, digits: 3 }, probability) };
  }
  if (z >= ORDER_Z) {
    return { order: 'second', z, probabilityFirst: pFirst, statement: msg('physics.landau.order.second', 'Second order: b = %1 ± %2 lies %3σ above 0 (probability %4 that b < 0, normal approximation).', b, sigmaB, { value: z, digits: 3 }, probability) };
  }
  return {
    order: 'undecided',
    z,
    probabilityFirst: pFirst,
    statement: msg('physics.landau.order.undecided', 'Order undecided: b = %1 ± %2 is within %3σ of 0 (probability %4 that b < 0, normal approximation), close to a tricritical point.', b, sigmaB, ORDER_Z, probability)
  };
}
