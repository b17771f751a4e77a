/**
 * Two order parameters with biquadratic coupling (convention L for each):
 *   F(ψ, φ) = (a1/2)(T − T1)ψ² + (b1/4)ψ⁴ + (a2/2)(T − T2)φ² + (b2/4)φ⁴ + (λ/2)ψ²φ²
 * In u = ψ², v = φ² the stationary phases are: disordered (0, 0), ψ-only,
 * φ-only and mixed (both ≠ 0, a minimum only when b1 b2 > λ²). The
 * equilibrium is the lowest-F phase; boundaries are located by bisection on
 * a temperature grid.
 */
import { msg } from '../messages';
import type { ICoreMessage } from '../messages';
import { PhysicsInputError, requireFinite } from './errors';

/** Convention stored with coupled-order-parameter results (code `physics.coupled.convention`). */
export const COUPLED_CONVENTION: ICoreMessage = Object.freeze(
  msg('physics.coupled.convention', 'F = (a1/2)(T − T1)ψ² + (b1/4)ψ⁴ + (a2/2)(T − T2)φ² + (b2/4)φ⁴ + (λ/2)ψ²φ²')
);

/** Coefficients of the coupled free energy. */
export interface ICoupledCoefficients {
  a1: number;
  T1: number;
  b1: number;
  a2: number;
  T2: number;
  b2: number;
  lambda: number;
}

/** Phase labels. */
export type CoupledPhase = 'disordered' | 'psi' | 'phi' | 'mixed';

/** One candidate phase at temperature T. */
export interface ICoupledPhaseState {
  phase: CoupledPhase;
  psi: number;
  phi: number;
  F: number;
  /** Local minimum of F (Hessian in (u, v) on the allowed set positive). */
  stable: boolean;
}

function validate(k: ICoupledCoefficients): void {
  for (const [n, v] of Object.entries(k)) {
    requireFinite(n, v);
  }
  if (!(k.a1 > 0) || !(k.a2 > 0) || !(k.b1 > 0) || !(k.b2 > 0)) {
    throw new PhysicsInputError(msg('physics.coupled.not-positive', 'The coefficients a1, a2, b1 and b2 must all be above 0.'));
  }
  if (!(k.b1 * k.b2 > 0) || k.lambda < -Math.sqrt(k.b1 * k.b2)) {
    throw new PhysicsInputError(
      msg('physics.coupled.unbounded', 'The free energy has no lower bound: the coupling λ (%1) must be above −√(b1·b2) (%2).', k.lambda, -Math.sqrt(k.b1 * k.b2))
    );
  }
}

/** All phases that exist at T, and the equilibrium (lowest F). */
export function coupledPhases(
  k: ICoupledCoefficients,
  T: number
): { states: ICoupledPhaseState[]; equilibrium: ICoupledPhaseState; convention: ICoreMessage } {
  validate(k);
  requireFinite('T', T);
  const A1 = k.a1 * (T - k.T1);
  const A2 = k.a2 * (T - k.T2);
  const F = (u: number, v: number): number => 0.5 * A1 * u + 0.25 * k.b1 * u * u + 0.5 * A2 * v + 0.25 * k.b2 * v * v + 0.5 * k.lambda * u * v;
  const states: ICoupledPhaseState[] = [];
  states.push({ phase: 'disordered', psi: 0, phi: 0, F: 0, stable: A1 >= 0 && A2 >= 0 });
  if (A1 < 0) {
    const u = -A1 / k.b1;
    states.push({ phase: 'psi', psi: Math.sqrt(u), phi: 0, F: F(u, 0), stable: A2 + k.lambda * u >= 0 });
  }
  if (A2 < 0) {
    const v = -A2 / k.b2;
    states.push({ phase: 'phi', psi: 0, phi: Math.sqrt(v), F: F(0, v), stable: A1 + k.lambda * v >= 0 });
  }
  const det = k.b1 * k.b2 - k.lambda * k.lambda;
  if (det !== 0) {
    const u = (-A1 * k.b2 + k.lambda * A2) / det;
    const v = (-A2 * k.b1 + k.lambda * A1) / det;
    if (u > 0 && v > 0) {
      states.push({ phase: 'mixed', psi: Math.sqrt(u), phi: Math.sqrt(v), F: F(u, v), stable: det > 0 });
    }
  }
  let eq = states[0];
  for (const s of states) {
    if (s.F < eq.F) {
      eq = s;
    }
  }
  return { states, equilibrium: eq, convention: COUPLED_CONVENTION };
}

/** A boundary between equilibrium phases. */
export interface ICoupledBoundary {
  T: number;
  from: CoupledPhase;
  to: CoupledPhase;
  /** True when (ψ, φ) jumps across it (first order), false when continuous. */
  discontinuous: boolean;
}

/** Equilibrium phase sequence between Tmin and Tmax (n grid points, boundaries refined by bisection). */
export function coupledPhaseBoundaries(k: ICoupledCoefficients, Tmin: number, Tmax: number, n = 400): ICoupledBoundary[] {
  validate(k);
  const out: ICoupledBoundary[] = [];
  // typical order-parameter size over the scan, used to tell a finite jump from a continuous onset
  let typical = 1e-300;
  for (let i = 0; i < n; i++) {
    const e = coupledPhases(k, Tmin + ((Tmax - Tmin) * i) / (n - 1)).equilibrium;
    typical = Math.max(typical, Math.hypot(e.psi, e.phi));
  }
  let Tp = Tmin;
  let ph = coupledPhases(k, Tp).equilibrium;
  for (let i = 1; i < n; i++) {
    const T = Tmin + ((Tmax - Tmin) * i) / (n - 1);
    const e = coupledPhases(k, T).equilibrium;
    if (e.phase !== ph.phase) {
      let lo = Tp;
      let hi = T;
      for (let it = 0; it < 100; it++) {
        const mid = 0.5 * (lo + hi);
        if (coupledPhases(k, mid).equilibrium.phase === ph.phase) {
          lo = mid;
        } else {
          hi = mid;
        }
      }
      const a = coupledPhases(k, lo).equilibrium;
      const b = coupledPhases(k, hi).equilibrium;
      // F crossings are resolved only to ~sqrt(eps) in T near a continuous onset, where the
      // vanishing amplitude is still ~(ΔT)^(1/2): a jump below 1 % of the typical size counts as continuous
      const jump = Math.hypot(a.psi - b.psi, a.phi - b.phi);
      out.push({ T: 0.5 * (lo + hi), from: ph.phase, to: e.phase, discontinuous: jump > 1e-2 * typical });
    }
    Tp = T;
    ph = e;
  }
  return out;
}
