/**
 * Landau–Devonshire ferroelectric: convention L with ψ = P and h = E
 * [B12 in REFERENCES.md]. The quasi-static P–E loop follows the occupied minimum
 * and jumps where its branch ends, at the extrema dE/dP = 0 of the
 * equation of state E(P) = a(T−T0)P + dP² + bP³ + cP⁵. The intrinsic
 * (thermodynamic) coercive field is E at the end of the ordered branch; it
 * exceeds measured coercive fields by orders of magnitude (never fit to it).
 */
import { realPolynomialRoots } from '../numeric/polyroots';
import { requireFinite } from './errors';
import type { ILandauCoefficients } from './landau/conventions';
import { validateLandau } from './landau/conventions';
import { landauField } from './landau/free-energy';
import type { ILandauPath } from './landau/paths';
import { landauFieldLoop } from './landau/paths';

/** Intrinsic coercive field at temperature T. */
export interface ICoerciveField {
  convention: 'L';
  /** E_c = −E(P*) at the end of the positive ordered branch (NaN if no ordered branch). */
  Ec: number;
  /** P* where the ordered branch ends. */
  Pstar: number;
  /**
   * |E| at which the paraelectric branch (P near 0) ends, when it is metastable
   * inside a double well (T0 < T < T** first-order); NaN otherwise.
   */
  paraelectricEnd: number;
}

/** Extrema of E(P) for P > 0, found as real roots of dE/dP. */
export function devonshireCoerciveField(k: ILandauCoefficients, T: number): ICoerciveField {
  validateLandau(k);
  requireFinite('T', T);
  const d = k.d ?? 0;
  const roots = realPolynomialRoots([k.a * (T - k.T0), 2 * d, 3 * k.b, 0, 5 * k.c]).filter(p => p > 0);
  const d2 = (P: number): number => 2 * d + 6 * k.b * P + 20 * k.c * P * P * P;
  let Pstar = NaN;
  let paraEnd = NaN;
  for (const P of roots) {
    if (d2(P) > 0) {
      Pstar = Number.isNaN(Pstar) ? P : Math.max(Pstar, P);
    }
  }
  for (const P of roots) {
    if (d2(P) < 0 && (Number.isNaN(Pstar) || P < Pstar)) {
      paraEnd = Math.abs(landauField(k, T, P));
    }
  }
  const Ec = Number.isNaN(Pstar) ? NaN : -landauField(k, T, Pstar);
  return { convention: 'L', Ec, Pstar, paraelectricEnd: paraEnd };
}

/** Closed form for c = d = 0, T < T0: E_c = (2/(3√3)) [a(T0 − T)]^(3/2)/√b. */
export function devonshireCoerciveFieldSecondOrder(a: number, T0: number, b: number, T: number): number {
  const al = a * (T0 - T);
  return al > 0 && b > 0 ? ((2 / (3 * Math.sqrt(3))) * Math.pow(al, 1.5)) / Math.sqrt(b) : 0;
}

/** Quasi-static P–E loop at T: E from −Emax to +Emax and back, n states per leg. */
export function devonshireLoop(k: ILandauCoefficients, T: number, Emax: number, n: number): ILandauPath {
  return landauFieldLoop(k, T, Emax, n);
}
