/**
 * What the Landau explorer draws and tabulates, computed from convention-L
 * coefficients with the Landau numerics: the landscape at (T, h), the
 * stationary branches and hysteresis paths over a T range, and the zero-field
 * derived quantities (closed forms for d = 0, numerics with a cubic term).
 */
import type { ICoreMessage } from '../../messages';
import { msg } from '../../messages';
import type { ILandauCoefficients } from './conventions';
import type { LandauRegime } from './derived';
import { landauDerived, landauTransitionNumeric } from './derived';
import type { IStationaryResult, StationaryKind } from './free-energy';
import { landauF, stationaryUnchecked } from './free-energy';
import type { ILandauPath } from './paths';
import { landauThermalHysteresis, linspace } from './paths';

/** A stationary point of the landscape F(ψ) at one (T, h). */
export interface ILandscapePoint {
  psi: number;
  F: number;
  kind: StationaryKind;
}

/** One stationary point at one temperature. */
export interface IBranchPoint {
  T: number;
  psi: number;
  kind: StationaryKind;
}

/** Zero-field quantities shown in the derived-values table (convention L). */
export interface IExplorerDerived {
  convention: 'L';
  regime: LandauRegime;
  /** Supercooling limit (stability limit of ψ = 0). */
  T0: number;
  /** Transition temperature (T0 if continuous). */
  T1: number;
  /** Superheating limit T**; null when the transition is continuous. */
  Tsuperheat: number | null;
  /** Order-parameter jump at T1; null when continuous. */
  psiJump: number | null;
  /** Latent heat in the units of F; null when continuous. */
  latentHeat: number | null;
  /** Barrier between the coexisting minima at T1; null when continuous. */
  barrierPsi: number | null;
  barrierHeight: number | null;
  /** Specific-heat jump at T0 (second order; ∞ at the tricritical point); null for first order. */
  specificHeatJump: number | null;
  /** End of the line of field-induced jumps (closed form, first order, d = 0); null otherwise. */
  criticalEndPoint: { T: number; psi: number; h: number } | null;
  /** Closed forms (d = 0) or numerics (cubic term). */
  method: 'closed-form' | 'numeric';
  converged: boolean;
  /** How the values were found (codes `physics.landau.*`). */
  reason: ICoreMessage;
}

/** Barrier at T (h = 0): the highest maximum between ψ = 0 and the lowest ordered minimum. */
function barrierAt(k: ILandauCoefficients, T: number): { psi: number; height: number } | null {
  const r = stationaryUnchecked(k, T, 0);
  let ordered: { psi: number; F: number } | null = null;
  for (const p of r.points) {
    if ((p.kind === 'stable' || p.kind === 'metastable') && Math.abs(p.psi) > 1e-12 && (ordered === null || p.F < ordered.F)) {
      ordered = p;
    }
  }
  if (ordered === null) {
    return null;
  }
  const lo = Math.min(0, ordered.psi);
  const hi = Math.max(0, ordered.psi);
  let best: { psi: number; height: number } | null = null;
  for (const p of r.points) {
    if (p.kind === 'unstable' && p.psi > lo && p.psi < hi && (best === null || p.F > best.height)) {
      best = { psi: p.psi, height: p.F };
    }
  }
  return best === null ? null : { psi: best.psi, height: best.height - Math.min(0, ordered.F) };
}

/** Derived quantities; `k` must already be valid (validateLandau). */
export function explorerDerived(k: ILandauCoefficients): IExplorerDerived {
  if ((k.d ?? 0) === 0) {
    const d = landauDerived(k);
    const first = d.regime === 'first-order';
    return {
      convention: 'L',
      regime: d.regime,
      T0: d.T0,
      T1: d.Ttransition,
      Tsuperheat: first ? d.Tsuperheat : null,
      psiJump: first ? d.psiJump : null,
      latentHeat: first ? d.latentHeat : null,
      barrierPsi: first ? d.barrierPsi : null,
      barrierHeight: first ? d.barrierHeight : null,
      specificHeatJump: first ? null : d.specificHeatJump,
      criticalEndPoint: first ? d.criticalEndPoint : null,
      method: 'closed-form',
      converged: true,
      reason: msg('physics.landau.closed-forms', 'Found from the closed forms of the free energy without a cubic term.')
    };
  }
  const n = landauTransitionNumeric(k);
  const barrier = n.firstOrder ? barrierAt(k, n.Ttransition) : null;
  return {
    convention: 'L',
    regime: n.firstOrder ? 'first-order' : k.b === 0 ? 'tricritical' : 'second-order',
    T0: k.T0,
    T1: n.Ttransition,
    Tsuperheat: n.firstOrder ? n.Tsuperheat : null,
    psiJump: n.firstOrder ? n.psiJump : null,
    latentHeat: n.firstOrder ? n.latentHeat : null,
    barrierPsi: barrier ? barrier.psi : null,
    barrierHeight: barrier ? barrier.height : null,
    specificHeatJump: null,
    criticalEndPoint: null,
    method: 'numeric',
    converged: n.converged,
    reason: n.reason
  };
}

/**
 * Stationary points with degenerate equilibria made explicit: every minimum
 * whose F equals the global one (±ψ at h = 0, or the coexisting minima at T1)
 * is labelled stable.
 */
export function stationaryPoints(k: ILandauCoefficients, T: number, h: number): { points: ILandscapePoint[]; global: number; result: IStationaryResult } {
  const r = stationaryUnchecked(k, T, h);
  const points: ILandscapePoint[] = r.points.map(p => ({ psi: p.psi, F: p.F, kind: p.kind }));
  if (r.global >= 0) {
    const Fg = points[r.global].F;
    let scale = 1e-300;
    for (const p of points) {
      scale = Math.max(scale, Math.abs(p.F));
    }
    for (const p of points) {
      if (p.kind === 'metastable' && Math.abs(p.F - Fg) <= 1e-9 * scale) {
        p.kind = 'stable';
      }
    }
  }
  return { points, global: r.global, result: r };
}

/** The landscape at (T, h) on `n` points of −ψmax … ψmax. */
export interface ILandscapeData {
  psi: number[];
  F: number[];
  points: ILandscapePoint[];
  global: number;
}

/** F(ψ) and its stationary points at (T, h). */
export function landscapeData(k: ILandauCoefficients, T: number, h: number, psiMax: number, n = 401): ILandscapeData {
  const psi = linspace(-psiMax, psiMax, n);
  const F = psi.map(p => landauF(k, T, h, p));
  const { points, global } = stationaryPoints(k, T, h);
  return { psi, F, points, global };
}

/** Branches and hysteresis over Tmin … Tmax at field h. */
export interface IBranchesData {
  branches: IBranchPoint[];
  heating: ILandauPath;
  cooling: ILandauPath;
  /** Largest |ψ| of any stationary point (1 when all are at 0). */
  psiMax: number;
}

/** Stationary branches and heating / cooling paths on `n` temperatures. */
export function branchesData(k: ILandauCoefficients, Tmin: number, Tmax: number, h: number, n = 241): IBranchesData {
  const T = linspace(Tmin, Tmax, n);
  const branches: IBranchPoint[] = [];
  let psiMax = 0;
  for (const t of T) {
    for (const p of stationaryPoints(k, t, h).points) {
      branches.push({ T: t, psi: p.psi, kind: p.kind });
      psiMax = Math.max(psiMax, Math.abs(p.psi));
    }
  }
  const hyst = landauThermalHysteresis(k, Tmin, Tmax, n, h);
  return { branches, heating: hyst.heating, cooling: hyst.cooling, psiMax: psiMax > 0 ? psiMax : 1 };
}
