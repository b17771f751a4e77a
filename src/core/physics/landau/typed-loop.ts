/**
 * The field loop of a free energy typed by the user: at fixed T, h runs
 * −hMax → +hMax → −hMax and the occupied minimum is followed (the same rule
 * as the Landau form's loop, {@link followLandscape}); it jumps where the
 * minimum it sits in ends.
 */
import type { ILandauPath, IPathLandscape } from './paths';
import { followLandscape, linspace } from './paths';
import type { ITypedFreeEnergy } from './typed';
import { typedStationary } from './typed';
import { requireFinite, requirePositive } from '../errors';

/** Stationary points of the typed free energy with their curvature F″, for a path. */
export function typedLandscape(f: ITypedFreeEnergy, T: number, h: number, values: Readonly<Record<string, number>>, psiMax: number, n = 400): IPathLandscape {
  const st = typedStationary(f, T, h, values, { psiMax, n });
  const at = new Float64Array(st.points.map(p => p.psi));
  const d = f.evaluate(at, T, h, values);
  return { points: st.points.map((p, i) => ({ ...p, curvature: d[3 * i + 2] })), global: st.global };
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
  return { ...followLandscape(hs.map(() => T), hs, (t, h) => typedLandscape(f, t, h, values, psiMax)), convention: 'L' };
}
