/**
 * Landau free energy in convention L with optional cubic term,
 *   F(ψ; T, h) = (a/2)(T−T0)ψ² + (d/3)ψ³ + (b/4)ψ⁴ + (c/6)ψ⁶ − hψ,
 * its stationary points (all real roots of F′ by polynomial root isolation),
 * their classification and the global minimum.
 */
import { realPolynomialRoots } from '../../numeric/polyroots';
import { requireFinite } from '../errors';
import type { ILandauCoefficients } from './conventions';
import { validateLandau } from './conventions';

/** Stability of a stationary point. */
export type StationaryKind = 'stable' | 'metastable' | 'unstable' | 'inflection';

/** A stationary point of F at fixed (T, h). */
export interface IStationaryPoint {
  psi: number;
  /** F(ψ) without the background F0(T). */
  F: number;
  /** F″(ψ) = 1/χ at a minimum. */
  curvature: number;
  /** 'stable' = global minimum, 'metastable' = other local minimum, 'unstable' = maximum. */
  kind: StationaryKind;
}

/** All stationary points at (T, h), sorted by ψ, with the global minimum. */
export interface IStationaryResult {
  T: number;
  h: number;
  points: IStationaryPoint[];
  /** Index into `points` of the global minimum. */
  global: number;
  /** True when two minima have equal F within rounding (e.g. ±ψ at h = 0). */
  degenerate: boolean;
  convention: 'L';
}

/** F(ψ) in convention L (without F0). */
export function landauF(k: ILandauCoefficients, T: number, h: number, psi: number): number {
  const p2 = psi * psi;
  return (
    psi * (-h + psi * (0.5 * k.a * (T - k.T0) + psi * ((k.d ?? 0) / 3 + psi * (0.25 * k.b + (p2 * k.c) / 6))))
  );
}

/** F′(ψ) = a(T−T0)ψ + dψ² + bψ³ + cψ⁵ − h. */
export function landauDF(k: ILandauCoefficients, T: number, h: number, psi: number): number {
  const p2 = psi * psi;
  return -h + psi * (k.a * (T - k.T0) + psi * ((k.d ?? 0) + psi * (k.b + k.c * p2)));
}

/** F″(ψ) = a(T−T0) + 2dψ + 3bψ² + 5cψ⁴. */
export function landauD2F(k: ILandauCoefficients, T: number, psi: number): number {
  const p2 = psi * psi;
  return k.a * (T - k.T0) + 2 * (k.d ?? 0) * psi + 3 * k.b * p2 + 5 * k.c * p2 * p2;
}

/** Field on the equation of state: h(ψ) = F′(ψ) + h. */
export function landauField(k: ILandauCoefficients, T: number, psi: number): number {
  return landauDF(k, T, 0, psi);
}

/** Stationary points and global minimum of F at (T, h). */
export function landauStationary(k: ILandauCoefficients, T: number, h = 0): IStationaryResult {
  validateLandau(k);
  requireFinite('T', T);
  requireFinite('h', h);
  return stationaryUnchecked(k, T, h);
}

/** As `landauStationary` without input validation (hot loops). */
export function stationaryUnchecked(k: ILandauCoefficients, T: number, h: number): IStationaryResult {
  const roots = realPolynomialRoots([-h, k.a * (T - k.T0), k.d ?? 0, k.b, 0, k.c]);
  // Sign of F′ on each interval decides min / max / inflection exactly;
  // F′ → −∞ as ψ → −∞ because F is bounded below.
  const signs: number[] = [-1];
  for (let i = 0; i < roots.length; i++) {
    const right = i + 1 < roots.length ? 0.5 * (roots[i] + roots[i + 1]) : roots[i] + Math.max(1, Math.abs(roots[i]));
    const s = landauDF(k, T, h, right);
    signs.push(i + 1 < roots.length ? Math.sign(s) || signs[i] : 1);
  }
  const points: IStationaryPoint[] = roots.map((psi, i) => {
    const l = signs[i];
    const r = signs[i + 1];
    const kind: StationaryKind = l < 0 && r > 0 ? 'metastable' : l > 0 && r < 0 ? 'unstable' : 'inflection';
    return { psi, F: landauF(k, T, h, psi), curvature: landauD2F(k, T, psi), kind };
  });
  let global = -1;
  for (let i = 0; i < points.length; i++) {
    if (points[i].kind !== 'metastable') {
      continue;
    }
    if (global < 0 || points[i].F < points[global].F) {
      global = i;
    }
  }
  let degenerate = false;
  if (global >= 0) {
    let scale = 1e-300;
    for (const p of points) {
      scale = Math.max(scale, Math.abs(p.F));
    }
    for (let i = 0; i < points.length; i++) {
      if (i !== global && points[i].kind === 'metastable' && Math.abs(points[i].F - points[global].F) <= 1e-12 * scale) {
        degenerate = true;
        // prefer the minimum with ψ ≥ 0 (sign convention for spontaneous symmetry breaking)
        if (points[global].psi < 0 && points[i].psi > 0) {
          global = i;
        }
      }
    }
    points[global].kind = 'stable';
  }
  return { T, h, points, global, degenerate, convention: 'L' };
}

/** Global minimum (ψ, F, χ = 1/F″) at (T, h). */
export function landauEquilibrium(
  k: ILandauCoefficients,
  T: number,
  h = 0
): { psi: number; F: number; chi: number; convention: 'L' } {
  const r = landauStationary(k, T, h);
  const p = r.points[r.global];
  return { psi: p.psi, F: p.F, chi: 1 / p.curvature, convention: 'L' };
}
