/**
 * Thermal response of the Landau equilibrium (convention L, any h, optional
 * cubic term). Only the quadratic coefficient depends on T, so
 *   S = S0 − (a/2)ψ²   and, with dψ/dT = −aψ/F″ from the equation of state,
 *   C − C0 = T dS/dT = T a² ψ² / F″(ψ).
 * This reproduces ΔC = T0 a²/(2b) (second order) and
 * C = (T/4)√(a³/(c(T0 − T))) at the tricritical point [B3 in REFERENCES.md].
 */
import type { ILandauCoefficients } from './conventions';
import { landauStationary } from './free-energy';

/** Excess entropy, specific heat and susceptibility of the global minimum at (T, h). */
export interface ILandauThermal {
  convention: 'L';
  psi: number;
  /** S − S0 = −(a/2)ψ² (units of F per kelvin). */
  entropy: number;
  /** C − C0 = T a² ψ²/F″ (units of F per kelvin). */
  specificHeat: number;
  /** χ = 1/F″. */
  chi: number;
}

/** Entropy, specific heat and χ of the equilibrium state at (T, h). */
export function landauThermal(k: ILandauCoefficients, T: number, h = 0): ILandauThermal {
  const r = landauStationary(k, T, h);
  const p = r.points[r.global];
  const psi2 = p.psi * p.psi;
  return {
    convention: 'L',
    psi: p.psi,
    entropy: -(k.a / 2) * psi2,
    specificHeat: psi2 === 0 ? 0 : (T * k.a * k.a * psi2) / p.curvature,
    chi: 1 / p.curvature
  };
}
