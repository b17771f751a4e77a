/**
 * Quasi-static paths through the Landau landscape. A path visits a sequence
 * of states (T_i, h_i) and, at each state, relaxes from the previous ψ into
 * the minimum of the basin that contains it: it follows a metastable branch
 * until that branch ends (saddle-node), then jumps. Heating and cooling
 * sweeps in T give thermal hysteresis; sweeps in h give P–E / M–H loops.
 */
import { msg } from '../../messages';
import { wholeNumber } from '../../numeric/messageArgs';
import { lengthsDiffer, PhysicsInputError, pointNotFinite } from '../errors';
import type { ILandauCoefficients } from './conventions';
import { validateLandau } from './conventions';
import type { StationaryKind } from './free-energy';
import { stationaryUnchecked } from './free-energy';

/** One state on a path. */
export interface IPathPoint {
  T: number;
  h: number;
  psi: number;
  F: number;
  /** Curvature F″ (1/χ) of the occupied minimum. */
  curvature: number;
  /** Whether the occupied minimum is the global one here. */
  kind: StationaryKind;
}

/** A discontinuity on a path: the occupied minimum vanished between two states. */
export interface IPathJump {
  /** Index of the first state after the jump. */
  index: number;
  T: number;
  h: number;
  psiBefore: number;
  psiAfter: number;
}

/** A quasi-static path with its jumps. */
export interface ILandauPath {
  points: IPathPoint[];
  jumps: IPathJump[];
  convention: 'L';
}

/** What a path needs of the landscape at one state: its stationary points (sorted by ψ) and the global minimum. */
export interface IPathLandscape {
  points: readonly { psi: number; F: number; curvature: number; kind: StationaryKind }[];
  /** Index of the global minimum in `points` (−1: none). */
  global: number;
}

/** Minimum of the basin containing ψ (basins are separated by maxima). */
function basinMinimum(r: IPathLandscape, psi: number, preferUp: boolean): number {
  const pts = r.points;
  let lowMax = -Infinity;
  let highMax = Infinity;
  for (const p of pts) {
    if (p.kind !== 'unstable') {
      continue;
    }
    const tol = 1e-10 * Math.max(1, Math.abs(p.psi));
    if (Math.abs(p.psi - psi) <= tol) {
      // sitting on a maximum: fall to the side given by preferUp
      if (preferUp) {
        lowMax = p.psi;
      } else {
        highMax = p.psi;
      }
      continue;
    }
    if (p.psi < psi && p.psi > lowMax) {
      lowMax = p.psi;
    }
    if (p.psi > psi && p.psi < highMax) {
      highMax = p.psi;
    }
  }
  let best = -1;
  for (let i = 0; i < pts.length; i++) {
    const p = pts[i];
    if ((p.kind === 'stable' || p.kind === 'metastable') && p.psi > lowMax && p.psi < highMax) {
      if (best < 0 || p.F < pts[best].F) {
        best = i;
      }
    }
  }
  return best >= 0 ? best : r.global;
}

/**
 * Follows the occupied minimum through the states (T[i], h[i]) of any
 * landscape given by `at` (checked finite states). The first state starts in
 * the global minimum. A state whose previous ψ lies on a maximum falls
 * towards the sign of h (or +ψ at h = 0). A jump is recorded when the new ψ
 * lies outside the basin of the previously occupied minimum of the previous
 * landscape (that minimum has ended). States with no minimum at all end the path.
 */
export function followLandscape(T: ArrayLike<number>, h: ArrayLike<number>, at: (T: number, h: number) => IPathLandscape): { points: IPathPoint[]; jumps: IPathJump[] } {
  if (T.length !== h.length) {
    throw new PhysicsInputError(lengthsDiffer({ T: T.length, h: h.length }));
  }
  const points: IPathPoint[] = [];
  const jumps: IPathJump[] = [];
  let prev = NaN;
  let prevResult: IPathLandscape | null = null;
  let prevIdx = -1;
  for (let i = 0; i < T.length; i++) {
    if (!Number.isFinite(T[i])) {
      throw new PhysicsInputError(pointNotFinite(i, 'T', T[i]));
    }
    if (!Number.isFinite(h[i])) {
      throw new PhysicsInputError(pointNotFinite(i, 'h', h[i]));
    }
    const r = at(T[i], h[i]);
    const idx = prevResult === null ? r.global : basinMinimum(r, prev, h[i] >= 0);
    if (idx < 0) {
      break;
    }
    const p = r.points[idx];
    points.push({ T: T[i], h: h[i], psi: p.psi, F: p.F, curvature: p.curvature, kind: p.kind });
    if (prevResult !== null && basinMinimum(prevResult, p.psi, h[i] >= 0) !== prevIdx) {
      jumps.push({ index: points.length - 1, T: T[i], h: h[i], psiBefore: prev, psiAfter: p.psi });
    }
    prev = p.psi;
    prevResult = r;
    prevIdx = idx;
  }
  return { points, jumps };
}

/**
 * Follows the occupied minimum of the Landau free energy through the states
 * (T[i], h[i]); see {@link followLandscape}.
 */
export function followPath(
  k: ILandauCoefficients,
  T: ArrayLike<number>,
  h: ArrayLike<number>
): ILandauPath {
  validateLandau(k);
  return { ...followLandscape(T, h, (t, hh) => stationaryUnchecked(k, t, hh)), convention: 'L' };
}

/** Evenly spaced values from `from` to `to` inclusive. */
export function linspace(from: number, to: number, n: number): number[] {
  if (!(n >= 2) || !Number.isInteger(n) || !Number.isFinite(from) || !Number.isFinite(to)) {
    throw new PhysicsInputError(
      msg('physics.grid-invalid', 'A grid needs finite ends and a whole number of at least 2 points, but here it runs from %1 to %2 with %3 points.', from, to, typeof n === 'number' ? wholeNumber(n) : String(n))
    );
  }
  return Array.from({ length: n }, (_, i) => from + ((to - from) * i) / (n - 1));
}

/** Heating and cooling sweeps at fixed h, plus the equilibrium (global-minimum) curve. */
export interface ILandauThermalHysteresis {
  heating: ILandauPath;
  cooling: ILandauPath;
  equilibrium: IPathPoint[];
  convention: 'L';
}

/** Thermal hysteresis between Tmin and Tmax (n states each way) at field h. */
export function landauThermalHysteresis(
  k: ILandauCoefficients,
  Tmin: number,
  Tmax: number,
  n: number,
  h = 0
): ILandauThermalHysteresis {
  const up = linspace(Tmin, Tmax, n);
  const hs = up.map(() => h);
  const heating = followPath(k, up, hs);
  const cooling = followPath(k, up.slice().reverse(), hs);
  const equilibrium = up.map(T => {
    const r = stationaryUnchecked(k, T, h);
    const p = r.points[r.global];
    return { T, h, psi: p.psi, F: p.F, curvature: p.curvature, kind: p.kind };
  });
  return { heating, cooling, equilibrium, convention: 'L' };
}

/** Field loop at temperature T: −hMax → +hMax → −hMax, n states per leg. */
export function landauFieldLoop(k: ILandauCoefficients, T: number, hMax: number, n: number): ILandauPath {
  const up = linspace(-hMax, hMax, n);
  const hs = up.concat(up.slice(0, -1).reverse());
  return followPath(
    k,
    hs.map(() => T),
    hs
  );
}

/** All stationary points over a grid of T (or h), for drawing the branches. */
export function landauBranches(
  k: ILandauCoefficients,
  T: ArrayLike<number>,
  h: ArrayLike<number>
): { T: number; h: number; psi: number; F: number; kind: StationaryKind }[] {
  validateLandau(k);
  const out: { T: number; h: number; psi: number; F: number; kind: StationaryKind }[] = [];
  for (let i = 0; i < T.length; i++) {
    const r = stationaryUnchecked(k, T[i], h[i]);
    for (const p of r.points) {
      out.push({ T: T[i], h: h[i], psi: p.psi, F: p.F, kind: p.kind });
    }
  }
  return out;
}
