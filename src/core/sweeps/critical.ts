/**
 * Critical isotherm [B8 in REFERENCES.md]: M = D H^(1/δ) at T = Tc, from the
 * isotherm at Tc or by interpolation in T at fixed H between the two
 * isotherms that bracket Tc (flagged: never across a jump); and the Widom and
 * Rushbrooke checks [B4 in REFERENCES.md].
 */
import { formatNumberArg, msg } from '../messages';
import type { ICoreMessage } from '../messages';
import type { IMeasuredExponents, IRelationCheck } from '../physics/universality';
import { checkScalingRelations } from '../physics/universality';
import { fitLine } from '../numeric/linear';
import type { IIsotherm, IValueSigma } from './types';

/** Options of {@link criticalIsotherm}. */
export interface ICriticalIsothermOptions {
  /** Lowest field used, A/m (default: every H > 0). */
  hMin?: number;
  hMax?: number;
  /** Largest |T − Tc|/Tc for using an isotherm as it is (default 2e-4). */
  tTolerance?: number;
}

/** δ from the critical isotherm. */
export interface ICriticalIsothermResult {
  delta: IValueSigma;
  /** Amplitude D of M = D H^(1/δ). */
  D: IValueSigma;
  source: 'isotherm' | 'interpolated';
  /** Temperatures of the isotherm(s) used. */
  temperatures: number[];
  Tc: number;
  n: number;
  warnings: ICoreMessage[];
}

function interpolate(x: Float64Array, y: Float64Array, at: number): number {
  if (!(at >= x[0] && at <= x[x.length - 1])) {
    return NaN;
  }
  let lo = 0;
  let hi = x.length - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (x[mid] <= at) {
      lo = mid;
    } else {
      hi = mid;
    }
  }
  const w = x[hi] === x[lo] ? 0 : (at - x[lo]) / (x[hi] - x[lo]);
  return y[lo] + w * (y[hi] - y[lo]);
}

/** δ from ln M against ln H on the critical isotherm (isotherms sorted by T, fields sorted). */
export function criticalIsotherm(isotherms: readonly IIsotherm[], Tc: number, options: ICriticalIsothermOptions = {}): ICriticalIsothermResult {
  const warnings: ICoreMessage[] = [];
  const nan = { value: NaN, sigma: NaN };
  const fail = (why: ICoreMessage): ICriticalIsothermResult => ({ delta: nan, D: nan, source: 'isotherm', temperatures: [], Tc, n: 0, warnings: [why] });
  if (!Number.isFinite(Tc) || isotherms.length === 0) {
    return fail(msg('sweeps.critical.no-tc', 'There is no critical isotherm: Tc is unknown, or there are no isotherms.'));
  }
  const sorted = isotherms.slice().sort((a, b) => a.T - b.T);
  let nearest = sorted[0];
  for (const iso of sorted) {
    if (Math.abs(iso.T - Tc) < Math.abs(nearest.T - Tc)) {
      nearest = iso;
    }
  }
  const tol = options.tTolerance ?? 2e-4;
  let H: Float64Array;
  let M: Float64Array;
  let source: 'isotherm' | 'interpolated' = 'isotherm';
  let temperatures: number[];
  if (Math.abs(nearest.T - Tc) / Tc <= tol) {
    H = nearest.H;
    M = nearest.M;
    temperatures = [nearest.T];
  } else {
    const below = sorted.filter(i => i.T < Tc);
    const above = sorted.filter(i => i.T > Tc);
    if (below.length === 0 || above.length === 0) {
      return fail(
        msg('sweeps.critical.not-bracketed', 'There is no critical isotherm: Tc = %1 K does not lie between two isotherms, and none lies within |t| ≤ %2 of it.', { value: Tc, digits: 6 }, tol)
      );
    }
    source = 'interpolated';
    // up to two isotherms each side: Lagrange polynomial in T of ln M at fixed H
    const used = [...below.slice(-2), ...above.slice(0, 2)];
    temperatures = used.map(i => i.T);
    const ref = below[below.length - 1];
    const h: number[] = [];
    const m: number[] = [];
    for (let i = 0; i < ref.H.length; i++) {
      const lnM = used.map(u => Math.log(interpolate(u.H, u.M, ref.H[i])));
      if (!(ref.H[i] > 0) || lnM.some(v => !Number.isFinite(v))) {
        continue;
      }
      let v = 0;
      for (let a = 0; a < used.length; a++) {
        let w = 1;
        for (let b = 0; b < used.length; b++) {
          if (b !== a) {
            w *= (Tc - used[b].T) / (used[a].T - used[b].T);
          }
        }
        v += w * lnM[a];
      }
      h.push(ref.H[i]);
      m.push(Math.exp(v));
    }
    H = Float64Array.from(h);
    M = Float64Array.from(m);
    warnings.push(
      msg(
        'sweeps.critical.interpolated',
        'The critical isotherm was interpolated in T at fixed H (ln M, Lagrange polynomial through the isotherms at %1 K), across Tc: this is invalid if the transition is discontinuous between them, and an isotherm slightly off Tc biases δ.',
        temperatures.map(t => formatNumberArg(t, 6)).join(', ')
      )
    );
  }
  const lnH: number[] = [];
  const lnM: number[] = [];
  for (let i = 0; i < H.length; i++) {
    if (H[i] > 0 && M[i] > 0 && H[i] >= (options.hMin ?? 0) && H[i] <= (options.hMax ?? Infinity)) {
      lnH.push(Math.log(H[i]));
      lnM.push(Math.log(M[i]));
    }
  }
  const f = fitLine(lnH, lnM);
  if (!Number.isFinite(f.slope) || f.n < 3) {
    return { ...fail(msg('sweeps.critical.few-points', 'The critical isotherm has too few usable points (%1) for δ: at least 3 are needed.', f.n)), source, temperatures };
  }
  const delta = { value: 1 / f.slope, sigma: Math.sqrt(f.varSlope) / (f.slope * f.slope) };
  const D = { value: Math.exp(f.intercept), sigma: Math.exp(f.intercept) * Math.sqrt(f.varIntercept) };
  return { delta, D, source, temperatures, Tc, n: f.n, warnings };
}

/** Widom and Rushbrooke checks with their inputs. */
export interface IScalingChecks {
  relations: IRelationCheck[];
  /** α implied by Rushbrooke from β and γ (2 − 2β − γ) when α was not measured. */
  alphaFromRushbrooke: IValueSigma | null;
  notes: ICoreMessage[];
}

/** Runs the scaling-relation checks (k = coverage factor, default 2). */
export function scalingChecks(m: IMeasuredExponents, k = 2): IScalingChecks {
  const relations = checkScalingRelations(m, k);
  const notes: ICoreMessage[] = [];
  let alphaFromRushbrooke: IValueSigma | null = null;
  if (m.alpha === undefined && m.beta !== undefined && m.gamma !== undefined) {
    alphaFromRushbrooke = { value: 2 - 2 * m.beta.value - m.gamma.value, sigma: Math.hypot(2 * m.beta.error, m.gamma.error) };
    notes.push(msg('sweeps.checks.alpha-implied', 'α was not measured, so Rushbrooke cannot be tested: only the α it implies is given.'));
  }
  if (m.delta === undefined) {
    notes.push(msg('sweeps.checks.no-delta', 'δ was not measured independently, so Widom cannot be tested.'));
  }
  return { relations, alphaFromRushbrooke, notes };
}
