/**
 * Scaling collapse [B9 in REFERENCES.md] with a numeric cost: isotherms in scaled
 * coordinates ln m = ln M − β ln|t|, ln h = ln H − (β + γ) ln|t| must fall on
 * two branches (t < 0, t > 0). The cost is the mean squared difference in
 * ln m between each isotherm and its next `neighbours` isotherms of the same
 * branch, interpolated in ln h where they overlap; it is minimised over
 * (Tc, β, γ) by Nelder–Mead. σ from the cost's Hessian, treating the cost as
 * a residual mean square.
 */
import { msg } from '../messages';
import type { ICoreMessage } from '../messages';
import { hessian, invert, nelderMead } from '../numeric/simplex';
import type { IIsotherm, IValueSigma } from './types';

/** Options of {@link scalingCollapse}. */
export interface ICollapseOptions {
  /** Isotherms with tMin ≤ |t| ≤ tMax are used (defaults 1e-3, 0.1). */
  tMin?: number;
  tMax?: number;
  /** Lowest field used, A/m. */
  hMin?: number;
  /** Same-branch neighbours each isotherm is compared with (default 3). */
  neighbours?: number;
  /** First steps of the search in (Tc, β, γ) (default 2e-3·Tc, 0.02, 0.05). */
  steps?: readonly [number, number, number];
  /** Stopping tolerances of the search: relative spread of the cost, and simplex size relative to the first steps (defaults 1e-10, 1e-7). */
  tolerance?: { cost: number; size: number };
}

/** The collapse cost and its pieces. */
export interface ICollapseCost {
  /** Mean squared ln m difference (NaN when no overlaps). */
  cost: number;
  /** Sum of squared differences and their number. */
  sum: number;
  count: number;
}

interface IPrepared {
  T: number;
  lnH: Float64Array;
  lnM: Float64Array;
}

function prepare(isotherms: readonly IIsotherm[], hMin: number): IPrepared[] {
  return isotherms.map(iso => {
    const h: number[] = [];
    const m: number[] = [];
    for (let i = 0; i < iso.H.length; i++) {
      if (iso.H[i] > 0 && iso.M[i] > 0 && iso.H[i] >= hMin) {
        h.push(Math.log(iso.H[i]));
        m.push(Math.log(iso.M[i]));
      }
    }
    return { T: iso.T, lnH: Float64Array.from(h), lnM: Float64Array.from(m) };
  });
}

// scratch buffers of the scaled coordinates, reused between calls (grown on demand)
let scratchX = new Float64Array(0);
let scratchY = new Float64Array(0);

function cost(prep: readonly IPrepared[], Tc: number, beta: number, gamma: number, tMin: number, tMax: number, k: number): ICollapseCost {
  let sum = 0;
  let count = 0;
  let total = 0;
  for (const p of prep) {
    total += p.lnH.length;
  }
  if (scratchX.length < total) {
    scratchX = new Float64Array(total);
    scratchY = new Float64Array(total);
  }
  const sx = scratchX;
  const sy = scratchY;
  const bg = beta + gamma;
  for (const sign of [-1, 1]) {
    const br: { p: IPrepared; at: number }[] = [];
    for (const p of prep) {
      const t = (p.T - Tc) / Tc;
      if (Math.sign(t) === sign && Math.abs(t) >= tMin && Math.abs(t) <= tMax) {
        br.push({ p, at: Math.abs(t) });
      }
    }
    br.sort((a, b) => a.at - b.at);
    // scaled coordinates of the branch, isotherm after isotherm in the scratch buffers
    const start: number[] = [];
    let o = 0;
    for (const q of br) {
      const lt = Math.log(q.at);
      start.push(o);
      const h = q.p.lnH;
      const m = q.p.lnM;
      for (let i = 0; i < h.length; i++) {
        sx[o] = h[i] - bg * lt;
        sy[o] = m[i] - beta * lt;
        o++;
      }
    }
    start.push(o);
    for (let i = 0; i < br.length; i++) {
      for (let j = i + 1; j <= Math.min(br.length - 1, i + k); j++) {
        const a0 = start[i];
        const a1 = start[i + 1];
        const b0 = start[j];
        const b1 = start[j + 1];
        if (b1 - b0 < 1) {
          continue;
        }
        const bLo = sx[b0];
        const bHi = sx[b1 - 1];
        let s = b0;
        for (let q = a0; q < a1; q++) {
          const x = sx[q];
          if (!(x >= bLo && x <= bHi)) {
            continue;
          }
          while (s + 1 < b1 - 1 && sx[s + 1] < x) {
            s++;
          }
          const w = sx[s + 1] === sx[s] || s + 1 >= b1 ? 0 : (x - sx[s]) / (sx[s + 1] - sx[s]);
          const d = sy[q] - (sy[s] + w * ((s + 1 < b1 ? sy[s + 1] : sy[s]) - sy[s]));
          sum += d * d;
          count++;
        }
      }
    }
  }
  return { cost: count > 0 ? sum / count : NaN, sum, count };
}

/** The collapse cost at given (Tc, β, γ). */
export function collapseCost(isotherms: readonly IIsotherm[], Tc: number, beta: number, gamma: number, options: ICollapseOptions = {}): ICollapseCost {
  return cost(prepare(isotherms, options.hMin ?? 0), Tc, beta, gamma, options.tMin ?? 1e-3, options.tMax ?? 0.1, options.neighbours ?? 3);
}

/** Minimised collapse. */
export interface ICollapseResult {
  Tc: IValueSigma;
  beta: IValueSigma;
  gamma: IValueSigma;
  cost: number;
  /** Cost at the starting point, for comparison. */
  startCost: number;
  count: number;
  evaluations: number;
  converged: boolean;
  /** How the minimisation ended (codes `numeric.simplex.*`). */
  reason: ICoreMessage;
  warnings: ICoreMessage[];
}

/** Minimises the collapse cost over (Tc, β, γ) from a start (e.g. the modified Arrott result). */
export function scalingCollapse(isotherms: readonly IIsotherm[], start: { Tc: number; beta: number; gamma: number }, options: ICollapseOptions = {}): ICollapseResult {
  const prep = prepare(isotherms, options.hMin ?? 0);
  const tMin = options.tMin ?? 1e-3;
  const tMax = options.tMax ?? 0.1;
  const k = options.neighbours ?? 3;
  const f = (x: number[]): number => (x[1] > 0.01 && x[2] > 0.05 && x[0] > 0 ? cost(prep, x[0], x[1], x[2], tMin, tMax, k).cost : Infinity);
  const x0 = [start.Tc, start.beta, start.gamma];
  const startCost = f(x0);
  const warnings = [msg('sweeps.collapse.weak-evidence', 'A collapse that looks good on log axes is weak evidence on its own; its cost says how good it is.')];
  const r = nelderMead(f, x0, options.steps ?? [2e-3 * start.Tc, 0.02, 0.05], 3000, options.tolerance?.cost ?? 1e-10, options.tolerance?.size ?? 1e-7);
  const best = cost(prep, r.x[0], r.x[1], r.x[2], tMin, tMax, k);
  const steps = [1e-4 * r.x[0], 2e-3, 5e-3];
  const sumF = (x: number[]): number => cost(prep, x[0], x[1], x[2], tMin, tMax, k).sum;
  const Hs = hessian(sumF, r.x, steps);
  const inv = invert(Hs);
  const s2 = best.count > 3 ? best.sum / (best.count - 3) : NaN;
  const sig = (i: number): number => (inv !== null && inv[i][i] > 0 ? Math.sqrt(2 * s2 * inv[i][i]) : NaN);
  if (inv === null || !(sig(0) >= 0)) {
    warnings.push(msg('sweeps.collapse.no-curvature', 'The cost does not rise in every direction from its minimum, so there are no uncertainties.'));
  }
  if (best.count === 0) {
    warnings.push(msg('sweeps.collapse.no-overlap', 'No isotherms overlap in the scaled coordinates.'));
  }
  return {
    Tc: { value: r.x[0], sigma: sig(0) },
    beta: { value: r.x[1], sigma: sig(1) },
    gamma: { value: r.x[2], sigma: sig(2) },
    cost: best.cost,
    startCost,
    count: best.count,
    evaluations: r.evaluations,
    converged: r.converged,
    reason: r.reason,
    warnings
  };
}
