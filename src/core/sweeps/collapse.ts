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

function cost(prep: readonly IPrepared[], Tc: number, beta: number, gamma: number, tMin: number, tMax: number, k: number): ICollapseCost {
  let sum = 0;
  let count = 0;
  for (const sign of [-1, 1]) {
    const br = prep
      .map(p => ({ p, t: (p.T - Tc) / Tc }))
      .filter(q => Math.sign(q.t) === sign && Math.abs(q.t) >= tMin && Math.abs(q.t) <= tMax)
      .sort((a, b) => Math.abs(a.t) - Math.abs(b.t));
    const scaled = br.map(q => {
      const lt = Math.log(Math.abs(q.t));
      return { x: q.p.lnH.map(v => v - (beta + gamma) * lt), y: q.p.lnM.map(v => v - beta * lt) };
    });
    for (let i = 0; i < scaled.length; i++) {
      for (let j = i + 1; j <= Math.min(scaled.length - 1, i + k); j++) {
        const a = scaled[i];
        const b = scaled[j];
        let s = 0;
        for (let q = 0; q < a.x.length; q++) {
          const x = a.x[q];
          if (!(x >= b.x[0] && x <= b.x[b.x.length - 1])) {
            continue;
          }
          while (s + 1 < b.x.length - 1 && b.x[s + 1] < x) {
            s++;
          }
          const w = b.x[s + 1] === b.x[s] ? 0 : (x - b.x[s]) / (b.x[s + 1] - b.x[s]);
          const d = a.y[q] - (b.y[s] + w * (b.y[s + 1] - b.y[s]));
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
  const r = nelderMead(f, x0, [2e-3 * start.Tc, 0.02, 0.05], 3000, 1e-10, 1e-7);
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
