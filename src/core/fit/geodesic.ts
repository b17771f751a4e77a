/**
 * Geodesic acceleration for Levenberg–Marquardt [N3 in REFERENCES.md]: the
 * second directional derivative of the residuals along the velocity v (one
 * extra evaluation) gives a second-order correction
 * a = −(JᵀJ + μDᵀD)⁻¹Jᵀr_vv; the step becomes v + ½a when ‖a‖ ≤ α‖v‖
 * (scaled norms). A larger ratio means the path curves too much within the
 * trust region, and the step is rejected.
 *
 * Method: r_vv = (2/h²)(r(p + h v) − r(p) − h J v) with h = 0.1, the
 * finite-difference step of Transtrum & Sethna [N3]; the damped system is
 * solved with the spectral model of the velocity (`subproblem.ts`), so the
 * acceleration costs one residual evaluation and O(n·k) work.
 *
 * Accuracy: r_vv has a truncation error O(h‖v‖³) (third derivatives of r),
 * so a is only an estimate. It shapes the path, not the answer: an
 * accelerated step is accepted by the same gain-ratio test as any other
 * (with the predicted reduction of the whole step), and the solution meets
 * the same stopping rules whether or not acceleration is on.
 */
import { FIT_DEFAULTS } from './defaults';
import type { ResidualEvaluator } from './evaluator';
import { geodesicRightHandSide } from './kernels';
import { solveDamped } from './subproblem';
import type { ISpectralModel } from './subproblem';
import type { Workspace } from './workspace';

/** State of the iteration the acceleration reads (and `step` it updates). */
export interface IGeodesicState {
  n: number;
  k: number;
  p: Float64Array;
  r: Float64Array;
  jac: Float64Array;
  diag: Float64Array;
  lower: Float64Array;
  upper: Float64Array;
  /** Scaled velocity over the model's columns. */
  z: Float64Array;
  /** Unscaled step (velocity), updated in place when the acceleration is used. */
  step: Float64Array;
  /** Scratch buffers: a trial point, its residuals and model values. */
  pT: Float64Array;
  rT: Float64Array;
  fT: Float64Array;
}

/** Preallocated work arrays. */
export interface IGeodesicWork {
  /** r_vv (length n), allocated only when no unrolled kernel exists for k. */
  rvv: () => Float64Array;
  za: Float64Array;
  rhs: Float64Array;
  full: Float64Array;
}

/** Allocates work arrays for n points and k parameters (the length-n one from `workspace`). */
export function geodesicWork(n: number, k: number, workspace: Workspace): IGeodesicWork {
  let rvv: Float64Array | null = null;
  return {
    rvv: () => (rvv ??= workspace.take(n)),
    za: new Float64Array(k),
    rhs: new Float64Array(k),
    full: new Float64Array(k)
  };
}

/** Finite-difference step along v for the second directional derivative. */
const DIRECTIONAL_STEP = 0.1;

/** Adds ½a to `s.step` ('used'), or reports 'rejected' / 'none' (evaluation failed). */
export function accelerate(
  ev: ResidualEvaluator,
  m: ISpectralModel,
  mu: number,
  s: IGeodesicState,
  w: IGeodesicWork
): 'used' | 'rejected' | 'none' {
  const { n, k, p, step, pT } = s;
  const h = DIRECTIONAL_STEP;
  for (let j = 0; j < k; j++) {
    pT[j] = Math.min(s.upper[j], Math.max(s.lower[j], p[j] + h * step[j]));
  }
  if (!Number.isFinite(ev.residuals(pT, s.rT, s.fT))) {
    return 'none';
  }
  for (let j = 0; j < k; j++) {
    w.za[j] = pT[j] - p[j];
  }
  geodesicRightHandSide(s.jac, w.za, s.rT, s.r, h, n, k, m.cols, s.diag, w.rhs, w.full, w.rvv);
  solveDamped(m, mu, w.rhs, w.za);
  let an = 0;
  let vn = 0;
  for (let a = 0; a < m.cols.length; a++) {
    an += w.za[a] * w.za[a];
    vn += s.z[a] * s.z[a];
  }
  if (!(Math.sqrt(an) <= FIT_DEFAULTS.geodesicAlpha * Math.sqrt(vn))) {
    return 'rejected';
  }
  for (let a = 0; a < m.cols.length; a++) {
    step[m.cols[a]] += (0.5 * w.za[a]) / s.diag[m.cols[a]];
  }
  return 'used';
}
