/**
 * Joins the stationary points found at successive temperatures into
 * continuous branches, so that ψ(T) can be drawn as lines. Points at one T are
 * matched to those at the previous T in order of ψ (branches of a polynomial's
 * roots do not cross) with the least total |Δψ|; unmatched points start or
 * end a branch (saddle-node births and deaths). A branch is cut into segments
 * wherever its kind changes, the boundary point belonging to both.
 */
import type { IBranchPoint } from '../../core/physics/landau/index';
import { finite } from './common';

export type { IBranchPoint };

/** A point of a drawn segment: `segment` identifies the line, `order` its drawing order. */
export interface ISegmentPoint extends IBranchPoint {
  segment: number;
  order: number;
}

/**
 * Pairs (i, j) aligning sorted `a` with sorted `b` in order, as many pairs as
 * the shorter list, with the least total |a[i] − b[j]|.
 */
export function alignSorted(a: readonly number[], b: readonly number[]): [number, number][] {
  if (a.length > b.length) {
    return alignSorted(b, a).map(([j, i]) => [i, j] as [number, number]);
  }
  const m = a.length;
  const n = b.length;
  // cost[i][j]: best cost of matching the first i of a within the first j of b
  const cost: number[][] = Array.from({ length: m + 1 }, () => new Array<number>(n + 1).fill(Infinity));
  for (let j = 0; j <= n; j++) {
    cost[0][j] = 0;
  }
  for (let i = 1; i <= m; i++) {
    for (let j = i; j <= n; j++) {
      cost[i][j] = Math.min(cost[i][j - 1], cost[i - 1][j - 1] + Math.abs(a[i - 1] - b[j - 1]));
    }
  }
  const pairs: [number, number][] = [];
  let i = m;
  let j = n;
  while (i > 0) {
    if (j > i && cost[i][j] === cost[i][j - 1]) {
      j--;
    } else {
      pairs.push([i - 1, j - 1]);
      i--;
      j--;
    }
  }
  return pairs.reverse();
}

/** Groups finite points by T in the order the temperatures first appear, each group sorted by ψ. */
function groupByT(points: readonly IBranchPoint[]): IBranchPoint[][] {
  const groups: IBranchPoint[][] = [];
  const index = new Map<number, number>();
  for (const p of points) {
    if (!finite(p.T) || !finite(p.psi)) {
      continue;
    }
    let g = index.get(p.T);
    if (g === undefined) {
      g = groups.length;
      index.set(p.T, g);
      groups.push([]);
    }
    groups[g].push({ T: p.T, psi: p.psi, kind: p.kind });
  }
  for (const g of groups) {
    g.sort((u, v) => u.psi - v.psi);
  }
  return groups;
}

/** Continuous segments of constant kind through the stationary points; the input is not changed. */
export function traceBranches(points: readonly IBranchPoint[]): ISegmentPoint[] {
  const groups = groupByT(points);
  const branches: IBranchPoint[][] = [];
  let prevIds: number[] = [];
  let prev: IBranchPoint[] = [];
  for (const g of groups) {
    const ids = new Array<number>(g.length).fill(-1);
    for (const [i, j] of alignSorted(
      prev.map(p => p.psi),
      g.map(p => p.psi)
    )) {
      ids[j] = prevIds[i];
    }
    for (let j = 0; j < g.length; j++) {
      if (ids[j] < 0) {
        ids[j] = branches.length;
        branches.push([]);
      }
      branches[ids[j]].push(g[j]);
    }
    prev = g;
    prevIds = ids;
  }
  const out: ISegmentPoint[] = [];
  let segment = 0;
  for (const branch of branches) {
    let order = 0;
    for (let i = 0; i < branch.length; i++) {
      const p = branch[i];
      if (i > 0 && p.kind !== branch[i - 1].kind) {
        segment++;
        order = 0;
        out.push({ ...branch[i - 1], kind: p.kind, segment, order: order++ });
      }
      out.push({ ...p, segment, order: order++ });
    }
    segment++;
  }
  return out;
}
