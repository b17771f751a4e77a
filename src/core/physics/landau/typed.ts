/**
 * Stationary points of a free energy given as a kernel of F, F′ and F″ in ψ
 * (e.g. one typed by the user and compiled by src/core/expr/free-energy.ts):
 * roots of F′ bracketed on a grid and polished by Newton steps (bisection
 * where Newton leaves the bracket), classified by F″ (or by the sign change
 * of F′ where F″ = 0); the lowest minimum is the global one.
 */
import type { ILandscapePoint } from './explorer';

/** A free energy F(ψ; T, h, coefficients) with its first two ψ-derivatives. */
export interface ITypedFreeEnergy {
  /** The text as typed. */
  readonly text: string;
  /** Coefficient names, in order of first appearance. */
  readonly coefficients: readonly string[];
  /** F, F′ and F″ at each ψ (3 values per point, row-major). */
  evaluate(psi: Float64Array, T: number, h: number, values: Readonly<Record<string, number>>): Float64Array;
}

/** Stationary points of a typed free energy at one (T, h). */
export interface ITypedStationary {
  points: ILandscapePoint[];
  /** Index of the global minimum in `points`, or −1 when there is none. */
  global: number;
}

/** Options of {@link typedStationary}. */
export interface ITypedStationaryOptions {
  /** Half-width of the ψ range searched (default 10). */
  psiMax?: number;
  /** Grid intervals of the bracketing scan (default 800). */
  n?: number;
}

/**
 * Stationary points on [−ψmax, ψmax]: sign changes of F′ on a grid (and grid
 * points where F′ is exactly 0), each refined by safeguarded Newton on F′.
 * Minima (F″ > 0, or F′ going from − to +) are 'metastable' except the lowest
 * ('stable', with every minimum of equal F); maxima are 'unstable'.
 */
export function typedStationary(f: ITypedFreeEnergy, T: number, h: number, values: Readonly<Record<string, number>>, options: ITypedStationaryOptions = {}): ITypedStationary {
  const R = options.psiMax && options.psiMax > 0 ? options.psiMax : 10;
  const n = Math.max(8, Math.floor(options.n ?? 800));
  const grid = new Float64Array(n + 1);
  for (let i = 0; i <= n; i++) {
    grid[i] = -R + (2 * R * i) / n;
  }
  const g = f.evaluate(grid, T, h, values);
  const one = new Float64Array(1);
  const at = (x: number): [number, number, number] => {
    one[0] = x;
    const o = f.evaluate(one, T, h, values);
    return [o[0], o[1], o[2]];
  };
  return stationaryFromSamples(grid, g, at);
}

/**
 * The stationary points from F, F′, F″ sampled on an increasing grid (3
 * values per point in `g`) and `at`, which gives them at any ψ (for the
 * Newton steps); see {@link typedStationary}.
 */
export function stationaryFromSamples(grid: Float64Array, g: Float64Array, at: (x: number) => [number, number, number]): ITypedStationary {
  const n = grid.length - 1;
  const roots: { psi: number; rising: boolean }[] = [];
  for (let i = 0; i < n; i++) {
    const a = grid[i];
    const b = grid[i + 1];
    const fa = g[3 * i + 1];
    const fb = g[3 * (i + 1) + 1];
    if (!Number.isFinite(fa) || !Number.isFinite(fb)) {
      continue;
    }
    if (fa === 0) {
      const prev = i > 0 ? g[3 * (i - 1) + 1] : Number.NaN;
      if (i > 0 && Number.isFinite(prev) && Math.sign(prev) !== Math.sign(fb) && prev !== 0) {
        roots.push({ psi: a, rising: fb > 0 });
      }
      continue;
    }
    if (fb === 0 || Math.sign(fa) === Math.sign(fb)) {
      continue;
    }
    let lo = a;
    let hi = b;
    let flo = fa;
    let x = a - (fa * (b - a)) / (fb - fa);
    for (let it = 0; it < 60; it++) {
      const [, d, dd] = at(x);
      if (d === 0) {
        break;
      }
      if (Math.sign(d) === Math.sign(flo)) {
        lo = x;
        flo = d;
      } else {
        hi = x;
      }
      let next = dd !== 0 && Number.isFinite(dd) ? x - d / dd : Number.NaN;
      if (!(next > Math.min(lo, hi) && next < Math.max(lo, hi))) {
        next = 0.5 * (lo + hi);
      }
      if (Math.abs(next - x) <= 4e-16 * Math.max(1, Math.abs(x))) {
        x = next;
        break;
      }
      x = next;
    }
    roots.push({ psi: x, rising: fb > 0 });
  }
  const points: ILandscapePoint[] = roots.map(r => {
    const [F, , dd] = at(r.psi);
    const minimum = dd > 0 || (dd === 0 && r.rising);
    return { psi: r.psi, F, kind: minimum ? 'metastable' : dd < 0 || !r.rising ? 'unstable' : 'inflection' };
  });
  let global = -1;
  for (let i = 0; i < points.length; i++) {
    if (points[i].kind === 'metastable' && Number.isFinite(points[i].F) && (global < 0 || points[i].F < points[global].F)) {
      global = i;
    }
  }
  if (global >= 0) {
    let scale = 1e-300;
    for (const p of points) {
      if (Number.isFinite(p.F)) {
        scale = Math.max(scale, Math.abs(p.F));
      }
    }
    const Fg = points[global].F;
    for (const p of points) {
      if (p.kind === 'metastable' && Math.abs(p.F - Fg) <= 1e-9 * scale) {
        p.kind = 'stable';
      }
    }
  }
  return { points, global };
}

/** F(ψ) on `n` points of −ψmax … ψmax. */
export function typedCurve(f: ITypedFreeEnergy, T: number, h: number, values: Readonly<Record<string, number>>, psiMax: number, n = 401): { psi: number[]; F: number[] } {
  const psi = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    psi[i] = -psiMax + (2 * psiMax * i) / (n - 1);
  }
  const out = f.evaluate(psi, T, h, values);
  const F: number[] = [];
  for (let i = 0; i < n; i++) {
    F.push(out[3 * i]);
  }
  return { psi: Array.from(psi), F };
}
