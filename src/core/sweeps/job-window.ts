/**
 * Exponents of the global equation-of-state fit against the window: a small
 * grid of t_max and H_min, each cell a global fit started from the primary
 * result (so each converges in a few steps), with δ from the critical
 * isotherm at that cell's Tc [B8 in REFERENCES.md].
 */
import { msg } from '../messages';
import { criticalIsotherm } from './critical';
import type { IEquationOfStateStart, IGlobalFit, IGlobalFitHooks } from './global';
import { fitEquationOfState } from './global';
import type { IIsothermSet } from './types';
import { conventionsOf } from './types';
import type { IExponentWindowCell, IExponentWindowScan } from './window';

/** The t_max of the scan: fractions of the analysis window (or of the isotherms' own extent when narrower). */
export const WINDOW_T_FRACTIONS: readonly number[] = [1 / 3, 2 / 3, 1];
/** The H_min of the scan: fractions of the highest field every isotherm reaches. */
export const WINDOW_H_FRACTIONS: readonly number[] = [0, 0.3];

/** The grid scan from the primary start; `onCell` is told how many cells are done. */
export function globalWindowScan(
  set: IIsothermSet,
  start: IEquationOfStateStart,
  tMax: number,
  hooks: IGlobalFitHooks & {
    onCell?: (done: number, total: number) => void;
    /** The fit over the whole window (every field, |t| ≤ tMax around `Tc`), reused as that cell when it holds the same isotherms. */
    whole?: { fit: IGlobalFit; Tc: number };
  } = {}
): IExponentWindowScan {
  const iso = set.isotherms;
  let hTop = Infinity;
  for (const i of iso) {
    hTop = Math.min(hTop, i.H[i.H.length - 1]);
  }
  // a window wider than the isotherms holds the same points as the whole: scale to what is there
  let extent = 0;
  for (const i of iso) {
    extent = Math.max(extent, Math.abs(i.T - start.Tc) / start.Tc);
  }
  const widest = Math.min(tMax, extent);
  const tMaxs = WINDOW_T_FRACTIONS.map(f => (f === 1 ? tMax : f * widest));
  const hMins = WINDOW_H_FRACTIONS.map(f => f * (Number.isFinite(hTop) ? hTop : 0));
  const inside = (Tc: number): string => iso.map(i => (Math.abs(i.T - Tc) / Tc <= tMax ? '1' : '0')).join('');
  const reuse = hooks.whole !== undefined && inside(hooks.whole.Tc) === inside(start.Tc) ? hooks.whole.fit : null;
  const cells: IExponentWindowCell[] = [];
  const nan = { value: NaN, sigma: NaN };
  const total = tMaxs.length * hMins.length;
  for (const t of tMaxs) {
    for (const hMin of hMins) {
      if (hooks.shouldStop?.() === true) {
        break;
      }
      const g = t === tMax && hMin === 0 && reuse !== null ? reuse : fitEquationOfState(iso, start, { tMax: t, hMin }, { shouldStop: hooks.shouldStop });
      const dCrit = Number.isFinite(g.Tc.value) ? criticalIsotherm(iso, g.Tc.value, { hMin }).delta : nan;
      cells.push({
        tMax: t,
        hMin,
        method: 'global',
        beta: g.beta,
        gamma: g.gamma,
        Tc: g.Tc,
        delta: g.delta,
        deltaCriticalIsotherm: dCrit,
        kouvelFisherBeta: nan,
        kouvelFisherGamma: nan,
        n: g.n,
        converged: g.converged,
        reason: g.reason
      });
      hooks.onCell?.(cells.length, total);
    }
  }
  const notes = [
    msg(
      'sweeps.convention.job-window',
      'Each cell of the window scan is a global fit started from the primary result, over the isotherms with |T − Tc|/Tc ≤ t_max around the primary Tc and the points with H ≥ H_min.'
    )
  ];
  return { cells, conventions: conventionsOf(set, notes), warnings: [] };
}
