/**
 * Field hysteresis between the up and down branches of each isotherm
 * (evidence for the order of the transition): the largest
 * difference M_down − M_up on the common field range, the down branch
 * interpolated linearly in H at the up branch's fields.
 */
import type { IIsothermSet } from './types';

/** Hysteresis of one temperature. */
export interface IBranchHysteresis {
  T: number;
  /** Largest |M_down − M_up|, in the set's magnetisation unit. */
  maxDifference: number;
  /** That difference relative to the largest |M| of the isotherm. */
  relative: number;
  /** Field of the largest difference, A/m. */
  atField: number;
  /** Common field points compared. */
  compared: number;
}

/** Pairs up/down branches whose temperatures differ by at most `tolerance` K (default 0.5). */
export function branchHysteresis(set: IIsothermSet, tolerance = 0.5): IBranchHysteresis[] {
  const ups = set.isotherms.filter(i => i.branch === 'up');
  const downs = set.isotherms.filter(i => i.branch === 'down');
  const out: IBranchHysteresis[] = [];
  for (const up of ups) {
    const down = downs.find(d => Math.abs(d.T - up.T) <= tolerance);
    if (down === undefined || down.H.length < 2) {
      continue;
    }
    let best = 0;
    let at = NaN;
    let scale = 0;
    let compared = 0;
    for (let i = 0; i < up.H.length; i++) {
      const h = up.H[i];
      scale = Math.max(scale, Math.abs(up.M[i]));
      if (!(h >= down.H[0] && h <= down.H[down.H.length - 1])) {
        continue;
      }
      let k = 0;
      while (k + 2 < down.H.length && down.H[k + 1] < h) {
        k++;
      }
      const w = down.H[k + 1] === down.H[k] ? 0 : (h - down.H[k]) / (down.H[k + 1] - down.H[k]);
      const md = down.M[k] + w * (down.M[k + 1] - down.M[k]);
      compared++;
      if (Math.abs(md - up.M[i]) > Math.abs(best)) {
        best = md - up.M[i];
        at = h;
      }
    }
    out.push({ T: up.T, maxDifference: Math.abs(best), relative: scale > 0 ? Math.abs(best) / scale : NaN, atField: at, compared });
  }
  return out;
}
