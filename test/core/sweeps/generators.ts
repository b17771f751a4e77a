/**
 * Synthetic isotherm families for the sweep tests: exact Weiss J = ½
 * (reference B1: m = tanh((m + h)/τ)), the Arrott–Noakes equation of state
 * (reference B6), and Bean–Rodbell equilibrium (reference B11).
 */
import { beanRodbellState, solveWeiss } from '../../../src/core/physics/index';
import { isothermSetFromArrays } from '../../../src/core/sweeps/index';
import type { IIsothermSet } from '../../../src/core/sweeps/index';
import { mulberry32 } from '../../../src/core/numeric/random';
export { mulberry32 };


/** Standard normal deviates (Box–Muller) from a seed. */
export function normal(seed: number): () => number {
  const u = mulberry32(seed);
  return () => Math.sqrt(-2 * Math.log(Math.max(u(), 1e-300))) * Math.cos(2 * Math.PI * u());
}

/** Evenly spaced values. */
export function linspace(a: number, b: number, n: number): number[] {
  return Array.from({ length: n }, (_v, i) => a + ((b - a) * i) / (n - 1));
}

/** Exact J = ½ Weiss isotherms in reduced units (T = τ, H = h, M = m). */
export function weissSet(taus: readonly number[], hs: readonly number[]): IIsothermSet {
  return isothermSetFromArrays(
    taus.map(tau => {
      const m = solveWeiss(0.5, new Float64Array(hs.length).fill(tau), Float64Array.from(hs)).m;
      return { T: tau, H: Float64Array.from(hs), M: m };
    })
  );
}

/** Parameters of the Arrott–Noakes equation of state (H/M)^(1/γ) = (T − Tc)/T1 + (M/M1)^(1/β). */
export interface IANParams {
  Tc: number;
  beta: number;
  gamma: number;
  T1: number;
  M1: number;
}

/** Field of the Arrott–Noakes equation of state at (T, M); NaN where it has no solution. */
export function anField(p: IANParams, T: number, M: number): number {
  const b = (T - p.Tc) / p.T1 + Math.pow(M / p.M1, 1 / p.beta);
  return b > 0 ? M * Math.pow(b, p.gamma) : NaN;
}

/** M at (T, H) of the Arrott–Noakes equation by bisection in ln M. */
export function anMagnetisation(p: IANParams, T: number, H: number): number {
  let lo = Math.log(p.M1) - 60;
  let hi = Math.log(p.M1) + 10;
  for (let i = 0; i < 200; i++) {
    const mid = 0.5 * (lo + hi);
    const h = anField(p, T, Math.exp(mid));
    if (Number.isNaN(h) || h < H) {
      lo = mid;
    } else {
      hi = mid;
    }
  }
  return Math.exp(0.5 * (lo + hi));
}

/** Arrott–Noakes isotherms on a field grid with relative Gaussian noise on M. */
export function anSet(p: IANParams, Ts: readonly number[], Hs: readonly number[], relNoise: number, seed: number): IIsothermSet {
  const g = normal(seed);
  return isothermSetFromArrays(
    Ts.map(T => ({
      T,
      H: Float64Array.from(Hs),
      M: Float64Array.from(Hs, H => anMagnetisation(p, T, H) * (1 + relNoise * g()))
    }))
  );
}

/** Bean–Rodbell J = ½ equilibrium isotherms, τ′ = T/T0, reduced field h. */
export function beanRodbellSet(eta: number, taus: readonly number[], hs: readonly number[]): IIsothermSet {
  return isothermSetFromArrays(taus.map(tau => ({ T: tau, H: Float64Array.from(hs), M: Float64Array.from(hs, h => beanRodbellState(0.5, eta, tau, h).sigma) })));
}
