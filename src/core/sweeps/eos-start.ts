/**
 * Start values of the global equation-of-state fit that need no iteration to
 * succeed. For trial exponents (β, γ) the Arrott–Noakes equation of state
 * [B6 in REFERENCES.md], (H/M)^(1/γ) = (T − Tc)/T1 + (M/M1)^(1/β), is linear
 * in 1/T1, M1^(−1/β) and (with Tc free) −Tc/T1:
 *   y = a·T + c + b·x,   y = (H/M)^(1/γ), x = M^(1/β),
 * so least squares over the points give Tc = −c/a (a data-driven Tc), and at
 * a given Tc the line through the origin in (T − Tc, x) gives T1 = 1/a and
 * M1 = b^(−β). Each candidate (exponents, Tc) is scored by the mean squared
 * ln M residual of the equation of state on a subsample of the points.
 */
import type { IEquationOfStateStart } from './global';
import { solveLnM } from './eos-model';
import type { IIsotherm } from './types';

/** Where a trial Tc came from. */
export type StartTcSource = 'arrott' | 'iteration' | 'data' | 'middle';

/** Trial exponents with a name for the report. */
export interface ITrialExponents {
  name: string;
  beta: number;
  gamma: number;
}

/** One scored start. */
export interface IStartCandidate {
  start: IEquationOfStateStart;
  exponents: ITrialExponents;
  tcSource: StartTcSource;
  /** Mean squared ln M residual at the start (Infinity when it cannot be evaluated). */
  cost: number;
}

/** Solves the k×k normal equations (k ≤ 3) by Gaussian elimination; null when singular. */
function solveSmall(A: number[][], b: number[]): number[] | null {
  const k = b.length;
  const M = A.map((row, i) => [...row, b[i]]);
  for (let c = 0; c < k; c++) {
    let p = c;
    for (let r = c + 1; r < k; r++) {
      if (Math.abs(M[r][c]) > Math.abs(M[p][c])) {
        p = r;
      }
    }
    if (!(Math.abs(M[p][c]) > 0)) {
      return null;
    }
    [M[c], M[p]] = [M[p], M[c]];
    for (let r = 0; r < k; r++) {
      if (r !== c) {
        const f = M[r][c] / M[c][c];
        for (let j = c; j <= k; j++) {
          M[r][j] -= f * M[c][j];
        }
      }
    }
  }
  const out = M.map((row, i) => row[k] / row[i]);
  return out.every(Number.isFinite) ? out : null;
}

/** Columns scaled to unit size before solving, for conditioning (M^(1/β) spans many decades). */
function leastSquares(cols: Float64Array[], y: Float64Array): number[] | null {
  const k = cols.length;
  const scale = cols.map(c => {
    let s = 0;
    for (const v of c) {
      s = Math.max(s, Math.abs(v));
    }
    return s > 0 ? s : 1;
  });
  const A = Array.from({ length: k }, () => new Array<number>(k).fill(0));
  const b = new Array<number>(k).fill(0);
  for (let i = 0; i < y.length; i++) {
    for (let p = 0; p < k; p++) {
      const vp = cols[p][i] / scale[p];
      b[p] += vp * y[i];
      for (let q = 0; q <= p; q++) {
        A[p][q] += vp * (cols[q][i] / scale[q]);
      }
    }
  }
  for (let p = 0; p < k; p++) {
    for (let q = p + 1; q < k; q++) {
      A[p][q] = A[q][p];
    }
  }
  const s = solveSmall(A, b);
  return s === null ? null : s.map((v, p) => v / scale[p]);
}

interface IPointArrays {
  H: Float64Array;
  M: Float64Array;
  T: Float64Array;
}

/** Every point with H > 0, M > 0 of the isotherms, every `stride`-th. */
function pointsOf(isotherms: readonly IIsotherm[], stride: number): IPointArrays {
  const H: number[] = [];
  const M: number[] = [];
  const T: number[] = [];
  let k = 0;
  for (const iso of isotherms) {
    for (let i = 0; i < iso.H.length; i++) {
      if (iso.H[i] > 0 && iso.M[i] > 0 && k++ % stride === 0) {
        H.push(iso.H[i]);
        M.push(iso.M[i]);
        T.push(iso.T);
      }
    }
  }
  return { H: Float64Array.from(H), M: Float64Array.from(M), T: Float64Array.from(T) };
}

function columns(p: IPointArrays, e: ITrialExponents): { y: Float64Array; x: Float64Array } {
  const n = p.H.length;
  const y = new Float64Array(n);
  const x = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    y[i] = Math.pow(p.H[i] / p.M[i], 1 / e.gamma);
    x[i] = Math.pow(p.M[i], 1 / e.beta);
  }
  return { y, x };
}

/** Tc from the linear form with Tc free over every point (NaN when the fit gives no Tc in the data's range). */
export function dataDrivenTc(isotherms: readonly IIsotherm[], e: ITrialExponents, stride = 1): number {
  const p = pointsOf(isotherms, stride);
  if (p.H.length < 5) {
    return NaN;
  }
  const { y, x } = columns(p, e);
  const one = new Float64Array(y.length).fill(1);
  const s = leastSquares([p.T, one, x], y);
  if (s === null || !(s[0] > 0)) {
    return NaN;
  }
  const Tc = -s[1] / s[0];
  const lo = isotherms[0].T;
  const hi = isotherms[isotherms.length - 1].T;
  return Tc > lo && Tc < hi ? Tc : NaN;
}

/** T1 and M1 at given exponents and Tc from the points within |t| ≤ tMax; null when either comes out ≤ 0. */
export function amplitudesAt(isotherms: readonly IIsotherm[], e: ITrialExponents, Tc: number, tMax: number, stride = 1): { T1: number; M1: number } | null {
  const near = isotherms.filter(iso => Math.abs(iso.T - Tc) / Tc <= tMax);
  const p = pointsOf(near, stride);
  if (p.H.length < 5) {
    return null;
  }
  const { y, x } = columns(p, e);
  const dT = p.T.map(T => T - Tc);
  const s = leastSquares([dT, x], y);
  if (s === null || !(s[0] > 0) || !(s[1] > 0)) {
    return null;
  }
  const T1 = 1 / s[0];
  const M1 = Math.pow(s[1], -e.beta);
  return Number.isFinite(T1) && Number.isFinite(M1) && M1 > 0 ? { T1, M1 } : null;
}

/** Mean squared ln M residual of the equation of state at `start` over (at most `maxPoints` of) the window's points. */
export function startCost(isotherms: readonly IIsotherm[], start: IEquationOfStateStart, tMax: number, maxPoints = 600): number {
  const near = isotherms.filter(iso => Math.abs(iso.T - start.Tc) / start.Tc <= tMax);
  let total = 0;
  for (const iso of near) {
    total += iso.H.length;
  }
  const p = pointsOf(near, Math.max(1, Math.floor(total / maxPoints)));
  const n = p.H.length;
  if (n < 10) {
    return Infinity;
  }
  const lnM1 = Math.log(start.M1);
  let sum = 0;
  for (let i = 0; i < n; i++) {
    const lnM = Math.log(p.M[i]);
    const u = solveLnM(Math.log(p.H[i]), (p.T[i] - start.Tc) / start.T1, lnM1, start.beta, start.gamma, lnM);
    if (!Number.isFinite(u)) {
      return Infinity;
    }
    sum += (u - lnM) ** 2;
  }
  return sum / n;
}

/**
 * Every (exponents × Tc) start with amplitudes from the data, scored and sorted
 * by cost (lowest first); duplicate Tc within 1e-9 relative are scored once.
 */
export function equationOfStateCandidates(
  isotherms: readonly IIsotherm[],
  trials: readonly ITrialExponents[],
  tcs: readonly { Tc: number; source: StartTcSource }[],
  tMax: number,
  shouldStop: () => boolean = () => false
): IStartCandidate[] {
  let total = 0;
  for (const iso of isotherms) {
    total += iso.H.length;
  }
  const stride = Math.max(1, Math.floor(total / 2000));
  const out: IStartCandidate[] = [];
  for (const e of trials) {
    const seen: number[] = [];
    const own = dataDrivenTc(isotherms, e, stride);
    const list = Number.isFinite(own) ? [...tcs, { Tc: own, source: 'data' as const }] : tcs;
    for (const c of list) {
      if (shouldStop()) {
        return out.sort((a, b) => a.cost - b.cost);
      }
      if (!(c.Tc > 0) || seen.some(t => Math.abs(t - c.Tc) <= 1e-9 * c.Tc)) {
        continue;
      }
      seen.push(c.Tc);
      const amp = amplitudesAt(isotherms, e, c.Tc, tMax, stride);
      if (amp === null) {
        continue;
      }
      const start = { Tc: c.Tc, beta: e.beta, gamma: e.gamma, T1: amp.T1, M1: amp.M1 };
      out.push({ start, exponents: e, tcSource: c.source, cost: startCost(isotherms, start, tMax) });
    }
  }
  return out.filter(c => Number.isFinite(c.cost)).sort((a, b) => a.cost - b.cost);
}
