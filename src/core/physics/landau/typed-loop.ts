/**
 * The field loop of a free energy typed by the user: at fixed T, h runs
 * −hMax → +hMax → −hMax and the occupied minimum is followed (the same rule
 * as the Landau form's loop, {@link followLandscape}); it jumps where the
 * minimum it sits in ends. When the field enters as −hψ, F′ at every h is
 * G′ − h of one sampling of G at h = 0, so the free energy is sampled once
 * per loop rather than once per field.
 */
import type { ILandauPath, IPathLandscape } from './paths';
import { followLandscape, linspace } from './paths';
import type { ITypedFreeEnergy } from './typed';
import { stationaryFromSamples, typedStationary } from './typed';
import { fieldIsLinear } from './typed-phase-diagram';
import { requireFinite, requirePositive } from '../errors';

/** Stationary points of the typed free energy with their curvature F″, for a path. */
export function typedLandscape(f: ITypedFreeEnergy, T: number, h: number, values: Readonly<Record<string, number>>, psiMax: number, n = 400): IPathLandscape {
  const st = typedStationary(f, T, h, values, { psiMax, n });
  const at = new Float64Array(st.points.map(p => p.psi));
  const d = f.evaluate(at, T, h, values);
  return { points: st.points.map((p, i) => ({ ...p, curvature: d[3 * i + 2] })), global: st.global };
}

/**
 * A field range for the loop at T: 1.5 × the largest |F′(ψ; T, 0)| where
 * F″ < 0 on [−psiMax, psiMax] (past the field at which a minimum ends), or
 * 0 when F has no such region there (then the caller chooses).
 */
export function typedLoopRange(f: ITypedFreeEnergy, values: Readonly<Record<string, number>>, T: number, psiMax: number, n = 801): number {
  const psi = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    psi[i] = -psiMax + (2 * psiMax * i) / (n - 1);
  }
  const out = f.evaluate(psi, T, 0, values);
  let end = 0;
  for (let i = 0; i < n; i++) {
    if (out[3 * i + 2] < 0 && Number.isFinite(out[3 * i + 1])) {
      end = Math.max(end, Math.abs(out[3 * i + 1]));
    }
  }
  return 1.5 * end;
}

/**
 * Field loop at T, `n` states per leg, minima sought on [−psiMax, psiMax].
 * The path ends early where no minimum is left in that range.
 */
export function typedFieldLoop(f: ITypedFreeEnergy, values: Readonly<Record<string, number>>, T: number, hMax: number, n: number, psiMax: number): ILandauPath {
  requireFinite('T', T);
  requirePositive('hMax', hMax);
  requirePositive('psiMax', psiMax);
  const up = linspace(-hMax, hMax, n);
  const hs = up.concat(up.slice(0, -1).reverse());
  const at = fieldIsLinear(f, values, T, psiMax) ? linearFieldLandscape(f, values, T, psiMax) : (t: number, h: number) => typedLandscape(f, t, h, values, psiMax);
  return { ...followLandscape(hs.map(() => T), hs, at), convention: 'L' };
}

/** Landscapes at T for any h of F = G − hψ, from one sampling of G (400 intervals, like {@link typedLandscape}). */
function linearFieldLandscape(f: ITypedFreeEnergy, values: Readonly<Record<string, number>>, T: number, psiMax: number, n = 400): (t: number, h: number) => IPathLandscape {
  const grid = new Float64Array(n + 1);
  for (let i = 0; i <= n; i++) {
    grid[i] = -psiMax + (2 * psiMax * i) / n;
  }
  const g0 = f.evaluate(grid, T, 0, values);
  const g = new Float64Array(g0.length);
  const one = new Float64Array(1);
  return (_t, h) => {
    for (let i = 0; i <= n; i++) {
      g[3 * i] = g0[3 * i] - h * grid[i];
      g[3 * i + 1] = g0[3 * i + 1] - h;
      g[3 * i + 2] = g0[3 * i + 2];
    }
    const at = (x: number): [number, number, number] => {
      one[0] = x;
      const o = f.evaluate(one, T, 0, values);
      return [o[0] - h * x, o[1] - h, o[2]];
    };
    const st = stationaryFromSamples(grid, g, at);
    return { points: st.points.map(p => ({ ...p, curvature: at(p.psi)[2] })), global: st.global };
  };
}
