/**
 * Nelder–Mead minimisation (standard reflection/expansion/contraction/shrink
 * coefficients 1, 2, ½, ½) with a finite-difference Hessian for error
 * estimates. Reports convergence and keeps the best point seen.
 *
 * Methods: the simplex method of Nelder & Mead with the coefficients of
 * Lagarias et al. [N9 in REFERENCES.md]; the Hessian by central differences
 * (diagonal from three points, off-diagonal from four); a small matrix
 * inverse by Gauss–Jordan elimination with partial pivoting.
 *
 * Accuracy: Nelder–Mead has no general convergence guarantee (it can stall
 * away from a minimum in higher dimensions); "converged" means only that the
 * function values at the simplex's vertices agree to the requested relative
 * tolerance and the simplex has shrunk below the requested fraction of the
 * initial steps, so a minimum is located to about that size, and its value
 * to that tolerance. The Hessian has truncation error O(h²) and rounding error
 * O(ε|f|/h²) (ε = 2⁻⁵²): choose h near ε^(1/4) times the parameter scale.
 */
import { msg } from '../messages';
import type { ICoreMessage } from '../messages';
import { wholeNumber } from './messageArgs';

/** Outcome of a minimisation. */
export interface ISimplexResult {
  x: number[];
  value: number;
  evaluations: number;
  converged: boolean;
  /** How the search ended (codes `numeric.simplex.*`). */
  reason: ICoreMessage;
}

/** Minimises f from x0 with initial steps `step`; stops when the simplex values agree to ftol (relative) and its size to xtol·step. */
export function nelderMead(f: (x: number[]) => number, x0: readonly number[], step: readonly number[], maxEvaluations = 2000, ftol = 1e-10, xtol = 1e-8): ISimplexResult {
  const n = x0.length;
  const safe = (x: number[]): number => {
    const v = f(x);
    return Number.isFinite(v) ? v : Infinity;
  };
  let pts: number[][] = [x0.slice()];
  for (let i = 0; i < n; i++) {
    const p = x0.slice();
    p[i] += step[i];
    pts.push(p);
  }
  let vals = pts.map(safe);
  let evals = n + 1;
  while (evals < maxEvaluations) {
    const order = vals.map((v, i) => i).sort((a, b) => vals[a] - vals[b]);
    pts = order.map(i => pts[i]);
    vals = order.map(i => vals[i]);
    const spread = Math.abs(vals[n] - vals[0]);
    let size = 0;
    for (let i = 1; i <= n; i++) {
      for (let j = 0; j < n; j++) {
        size = Math.max(size, Math.abs(pts[i][j] - pts[0][j]) / Math.abs(step[j]));
      }
    }
    if (spread <= ftol * (Math.abs(vals[0]) + 1e-300) && size <= 1e3 * xtol) {
      return { x: pts[0], value: vals[0], evaluations: evals, converged: true, reason: msg('numeric.simplex.settled', 'The search for the minimum settled: the values and the spread of its trial points are within the tolerances.') };
    }
    if (size <= xtol) {
      return { x: pts[0], value: vals[0], evaluations: evals, converged: true, reason: msg('numeric.simplex.closed-in', 'The search for the minimum settled: its trial points closed in on one point.') };
    }
    const c = new Array<number>(n).fill(0);
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) {
        c[j] += pts[i][j] / n;
      }
    }
    const at = (t: number): number[] => c.map((cj, j) => cj + t * (pts[n][j] - cj));
    const xr = at(-1);
    const fr = safe(xr);
    evals++;
    if (fr < vals[0]) {
      const xe = at(-2);
      const fe = safe(xe);
      evals++;
      if (fe < fr) {
        pts[n] = xe;
        vals[n] = fe;
      } else {
        pts[n] = xr;
        vals[n] = fr;
      }
    } else if (fr < vals[n - 1]) {
      pts[n] = xr;
      vals[n] = fr;
    } else {
      const xc = fr < vals[n] ? at(-0.5) : at(0.5);
      const fc = safe(xc);
      evals++;
      if (fc < Math.min(fr, vals[n])) {
        pts[n] = xc;
        vals[n] = fc;
      } else {
        for (let i = 1; i <= n; i++) {
          pts[i] = pts[i].map((v, j) => pts[0][j] + 0.5 * (v - pts[0][j]));
          vals[i] = safe(pts[i]);
          evals++;
        }
      }
    }
  }
  let best = 0;
  for (let i = 1; i < vals.length; i++) {
    if (vals[i] < vals[best]) {
      best = i;
    }
  }
  return {
    x: pts[best],
    value: vals[best],
    evaluations: evals,
    converged: false,
    reason: msg('numeric.simplex.budget', 'The search for the minimum used its %1 evaluations before it settled.', wholeNumber(maxEvaluations))
  };
}

/** Central finite-difference Hessian of f at x with steps h. */
export function hessian(f: (x: number[]) => number, x: readonly number[], h: readonly number[]): number[][] {
  const n = x.length;
  const H: number[][] = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  const f0 = f(x.slice());
  const shifted = (d: [number, number][]): number => {
    const p = x.slice();
    for (const [i, s] of d) {
      p[i] += s * h[i];
    }
    return f(p);
  };
  for (let i = 0; i < n; i++) {
    H[i][i] = (shifted([[i, 1]]) - 2 * f0 + shifted([[i, -1]])) / (h[i] * h[i]);
    for (let j = i + 1; j < n; j++) {
      const v = (shifted([[i, 1], [j, 1]]) - shifted([[i, 1], [j, -1]]) - shifted([[i, -1], [j, 1]]) + shifted([[i, -1], [j, -1]])) / (4 * h[i] * h[j]);
      H[i][j] = v;
      H[j][i] = v;
    }
  }
  return H;
}

/** Inverse of a small symmetric matrix by Gauss–Jordan; null when singular. */
export function invert(A: readonly number[][]): number[][] | null {
  const n = A.length;
  const M = A.map((row, i) => [...row, ...Array.from({ length: n }, (_v, j) => (i === j ? 1 : 0))]);
  for (let c = 0; c < n; c++) {
    let p = c;
    for (let r = c + 1; r < n; r++) {
      if (Math.abs(M[r][c]) > Math.abs(M[p][c])) {
        p = r;
      }
    }
    if (!(Math.abs(M[p][c]) > 0)) {
      return null;
    }
    [M[c], M[p]] = [M[p], M[c]];
    const d = M[c][c];
    for (let j = 0; j < 2 * n; j++) {
      M[c][j] /= d;
    }
    for (let r = 0; r < n; r++) {
      if (r !== c) {
        const k = M[r][c];
        for (let j = 0; j < 2 * n; j++) {
          M[r][j] -= k * M[c][j];
        }
      }
    }
  }
  return M.map(row => row.slice(n));
}
