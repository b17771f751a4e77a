/**
 * The landscape of two coupled order parameters on a grid,
 *   F(ψ, φ) = (a1/2)(T − T1)ψ² + (b1/4)ψ⁴ + (a2/2)(T − T2)φ² + (b2/4)φ⁴ + (λ/2)ψ²φ²,
 * with its minima (exact, from the stationary phases of coupled.ts, with
 * both signs of each non-zero order parameter) and the equilibrium phase:
 * ψ only, φ only, both (mixed) or neither (disordered).
 */
import type { CoupledPhase, ICoupledCoefficients } from '../coupled';
import { coupledPhases } from '../coupled';

/** One minimum of F(ψ, φ). */
export interface ILandscape2dMinimum {
  psi: number;
  phi: number;
  F: number;
  phase: CoupledPhase;
  /** True for the lowest F (all symmetry-related copies are global). */
  global: boolean;
}

/** F on an n × n grid (row-major: index j·n + i is ψ[i], φ[j]) with minima and phase. */
export interface ILandscape2d {
  n: number;
  psi: Float64Array;
  phi: Float64Array;
  F: Float64Array;
  /** Smallest and largest F on the grid. */
  Fmin: number;
  Fmax: number;
  minima: ILandscape2dMinimum[];
  /** Equilibrium phase at T. */
  phase: CoupledPhase;
}

/** Options of {@link coupledLandscape}. */
export interface ILandscape2dOptions {
  /** Grid points per axis (default 200). */
  n?: number;
  /** Half-widths of the ψ and φ ranges (default 1.3 × the largest minimum, at least the order of √(|A|/b)). */
  psiMax?: number;
  phiMax?: number;
}

/** Default half-width of an axis: a little beyond the farthest minimum (or the would-be ordered value). */
function defaultHalfWidth(a: number, Tc: number, b: number, T: number, reach: number): number {
  const natural = Math.sqrt(Math.abs(a * (T - Tc)) / b);
  const m = Math.max(reach, natural, 1e-3);
  return 1.35 * m;
}

/**
 * F(ψ, φ) at T on a grid. Coefficients are checked by `coupledPhases`
 * (throws PhysicsInputError). The grid is filled in one pass over typed
 * arrays: the ψ terms of a row are computed once per column.
 */
export function coupledLandscape(k: ICoupledCoefficients, T: number, options: ILandscape2dOptions = {}): ILandscape2d {
  const { states, equilibrium } = coupledPhases(k, T);
  let reachPsi = 0;
  let reachPhi = 0;
  for (const s of states) {
    reachPsi = Math.max(reachPsi, s.psi);
    reachPhi = Math.max(reachPhi, s.phi);
  }
  const n = Math.max(2, Math.floor(options.n ?? 200));
  const pm = options.psiMax && options.psiMax > 0 ? options.psiMax : defaultHalfWidth(k.a1, k.T1, k.b1, T, reachPsi);
  const fm = options.phiMax && options.phiMax > 0 ? options.phiMax : defaultHalfWidth(k.a2, k.T2, k.b2, T, reachPhi);
  const psi = new Float64Array(n);
  const phi = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    psi[i] = -pm + (2 * pm * i) / (n - 1);
    phi[i] = -fm + (2 * fm * i) / (n - 1);
  }
  const A1 = 0.5 * k.a1 * (T - k.T1);
  const A2 = 0.5 * k.a2 * (T - k.T2);
  const B1 = 0.25 * k.b1;
  const B2 = 0.25 * k.b2;
  const L = 0.5 * k.lambda;
  // ψ part and ψ² of each column, once
  const u = new Float64Array(n);
  const fPsi = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const p2 = psi[i] * psi[i];
    u[i] = p2;
    fPsi[i] = p2 * (A1 + B1 * p2);
  }
  const F = new Float64Array(n * n);
  let lo = Infinity;
  let hi = -Infinity;
  for (let j = 0; j < n; j++) {
    const v = phi[j] * phi[j];
    const fPhi = v * (A2 + B2 * v);
    const c = L * v;
    const row = j * n;
    for (let i = 0; i < n; i++) {
      const f = fPsi[i] + fPhi + c * u[i];
      F[row + i] = f;
      if (f < lo) {
        lo = f;
      }
      if (f > hi) {
        hi = f;
      }
    }
  }
  const minima: ILandscape2dMinimum[] = [];
  const Fg = equilibrium.F;
  let scale = 1e-300;
  for (const s of states) {
    scale = Math.max(scale, Math.abs(s.F));
  }
  const tol = 1e-9 * scale;
  for (const s of states) {
    if (!s.stable) {
      continue;
    }
    const psiSigns = s.psi > 0 ? [1, -1] : [1];
    const phiSigns = s.phi > 0 ? [1, -1] : [1];
    for (const a of psiSigns) {
      for (const b of phiSigns) {
        minima.push({ psi: a * s.psi, phi: b * s.phi, F: s.F, phase: s.phase, global: Math.abs(s.F - Fg) <= tol });
      }
    }
  }
  return { n, psi, phi, F, Fmin: lo, Fmax: hi, minima, phase: equilibrium.phase };
}
