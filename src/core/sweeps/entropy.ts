/**
 * Magnetic entropy change from the Maxwell relation across isotherms:
 *   ΔS_M(T, ΔH) = μ0 ∫_0^ΔH (∂M/∂T)_H dH
 * computed as μ0 [I(T_{k+1}) − I(T_k)]/(T_{k+1} − T_k) at the mid
 * temperature, I(T) = ∫_0^ΔH M dH by the trapezoid rule on each isotherm.
 * Refrigerant capacity over the full width at half maximum of |ΔS_M|:
 * RC = ∫ |ΔS_M| dT and RCP = |ΔS_M|max × δT_FWHM.
 * Units: J/(kg K) for a mass magnetisation, J/(m³ K) for a volume one.
 */
import { formatNumberArg, msg } from '../messages';
import type { ICoreMessage } from '../messages';
import { PHYS } from '../units/constants';
import type { IIsotherm, IIsothermSet, ISweepConventions } from './types';
import { conventionsOf, setWarnings, SweepInputError } from './types';
import { selectBranch } from './sets';
import type { Branch } from './types';

/** ΔS_M at one mid temperature. */
export interface IEntropyPoint {
  T: number;
  dS: number;
  sigma: number;
}

/** Result for one field change. */
export interface IEntropyCurve {
  /** Field change, A/m. */
  deltaH: number;
  /** μ0ΔH, T. */
  mu0DeltaH: number;
  points: IEntropyPoint[];
  peak: IEntropyPoint | null;
  /** Full width at half maximum of |ΔS_M|, K (NaN when the half maximum is not reached on both sides). */
  fwhm: number;
  halfMaximumAt: [number, number] | null;
  /** RC = ∫ |ΔS_M| dT over the FWHM (J/kg or J/m³). */
  refrigerantCapacity: number;
  /** RCP = |ΔS_M|max × FWHM. */
  relativeCoolingPower: number;
  warnings: ICoreMessage[];
}

/** Result over all field changes. */
export interface IEntropyResult {
  curves: IEntropyCurve[];
  unit: 'J/(kg K)' | 'J/(m^3 K)';
  conventions: ISweepConventions;
  warnings: ICoreMessage[];
}

/** Noise of M along an isotherm from second differences: σ² ≈ ⟨Δ²M⟩/6. */
function noiseOf(M: Float64Array): number {
  if (M.length < 5) {
    return NaN;
  }
  let s = 0;
  for (let i = 1; i + 1 < M.length; i++) {
    const d = M[i + 1] - 2 * M[i] + M[i - 1];
    s += d * d;
  }
  return Math.sqrt(s / (M.length - 2) / 6);
}

/** ∫_0^ΔH M dH on one isotherm and its σ; NaN when the isotherm stops short of ΔH. */
export function fieldIntegral(iso: IIsotherm, deltaH: number): { value: number; sigma: number; lowGap: number } {
  const H = iso.H;
  const M = iso.M;
  const n = H.length;
  if (n === 0 || H[n - 1] < deltaH * (1 - 1e-9)) {
    return { value: NaN, sigma: NaN, lowGap: NaN };
  }
  let first = 0;
  while (first < n && H[first] < 0) {
    first++;
  }
  if (first >= n) {
    return { value: NaN, sigma: NaN, lowGap: NaN };
  }
  const sM = noiseOf(M);
  const lowGap = H[first];
  let value = H[first] * M[first];
  let varI = (H[first] * sM) ** 2;
  for (let i = first; i + 1 < n && H[i] < deltaH; i++) {
    const hi = Math.min(H[i + 1], deltaH);
    const w = hi - H[i];
    const Mhi = H[i + 1] > deltaH ? M[i] + ((deltaH - H[i]) / (H[i + 1] - H[i])) * (M[i + 1] - M[i]) : M[i + 1];
    value += 0.5 * w * (M[i] + Mhi);
    varI += (0.5 * w * sM) ** 2 * 2;
  }
  return { value, sigma: Math.sqrt(varI), lowGap };
}

function curve(isotherms: readonly IIsotherm[], deltaH: number): IEntropyCurve {
  const warnings: ICoreMessage[] = [];
  const I = isotherms.map(iso => fieldIntegral(iso, deltaH));
  const short = isotherms.filter((_iso, k) => !Number.isFinite(I[k].value)).map(i => i.T);
  if (short.length > 0) {
    warnings.push(
      msg(
        'sweeps.entropy.short-isotherms',
        'The isotherms at %1 K do not reach the field change of %2 A/m and were left out.',
        short.map(t => formatNumberArg(t, 6)).join(', '),
        deltaH
      )
    );
  }
  let gap = -Infinity;
  for (const v of I) {
    gap = Math.max(gap, Number.isFinite(v.lowGap) ? v.lowGap : 0);
  }
  if (gap > 0.01 * deltaH) {
    warnings.push(
      msg(
        'sweeps.entropy.low-field-gap',
        'The lowest measured field (%1 A/m) exceeds 1 % of the field change: the part from 0 was taken as M(H_lowest)·H_lowest.',
        gap
      )
    );
  }
  const ok = isotherms.map((iso, k) => ({ T: iso.T, ...I[k] })).filter(v => Number.isFinite(v.value));
  const points: IEntropyPoint[] = [];
  for (let k = 0; k + 1 < ok.length; k++) {
    const dT = ok[k + 1].T - ok[k].T;
    if (!(dT > 0)) {
      continue;
    }
    points.push({
      T: 0.5 * (ok[k].T + ok[k + 1].T),
      dS: (PHYS.mu0 * (ok[k + 1].value - ok[k].value)) / dT,
      sigma: (PHYS.mu0 * Math.hypot(ok[k].sigma, ok[k + 1].sigma)) / dT
    });
  }
  if (ok.length < 3) {
    warnings.push(msg('sweeps.entropy.few-isotherms', 'Too few isotherms (%1) reach this field change for a ΔS_M(T) curve.', ok.length));
  }
  let peak: IEntropyPoint | null = null;
  for (const p of points) {
    if (peak === null || Math.abs(p.dS) > Math.abs(peak.dS)) {
      peak = p;
    }
  }
  // a step by more than 3x between neighbouring values near the peak: a jump of M between isotherms
  const big = peak === null ? Infinity : 0.25 * Math.abs(peak.dS);
  for (let k = 0; k + 1 < points.length; k++) {
    const a = Math.abs(points[k].dS);
    const b = Math.abs(points[k + 1].dS);
    if (Math.max(a, b) > big && Math.max(a, b) > 3 * Math.min(a, b)) {
      warnings.push(
        msg(
          'sweeps.entropy.jump',
          '|ΔS_M| changes more than threefold between %1 K and %2 K: the isotherms may straddle a discontinuity (a first-order jump), where the finite difference is not a derivative; measure more isotherms there.',
          { value: points[k].T, digits: 6 },
          { value: points[k + 1].T, digits: 6 }
        )
      );
    }
  }
  let fwhm = NaN;
  let halfAt: [number, number] | null = null;
  let rc = NaN;
  if (peak !== null) {
    const half = Math.abs(peak.dS) / 2;
    const k0 = points.indexOf(peak);
    const abs = points.map(p => Math.abs(p.dS));
    let l = k0;
    while (l > 0 && abs[l - 1] >= half) {
      l--;
    }
    let r = k0;
    while (r + 1 < points.length && abs[r + 1] >= half) {
      r++;
    }
    if (l > 0 && r + 1 < points.length) {
      const tl = points[l - 1].T + ((half - abs[l - 1]) / (abs[l] - abs[l - 1])) * (points[l].T - points[l - 1].T);
      const tr = points[r].T + ((abs[r] - half) / (abs[r] - abs[r + 1])) * (points[r + 1].T - points[r].T);
      halfAt = [tl, tr];
      fwhm = tr - tl;
      rc = 0.5 * (half + abs[l]) * (points[l].T - tl) + 0.5 * (half + abs[r]) * (tr - points[r].T);
      for (let k = l; k < r; k++) {
        rc += 0.5 * (abs[k] + abs[k + 1]) * (points[k + 1].T - points[k].T);
      }
    } else {
      warnings.push(
        msg('sweeps.entropy.no-fwhm', 'The half maximum of |ΔS_M| is not reached on both sides of the peak within the data, so there is no FWHM, RC or RCP.')
      );
    }
  }
  return {
    deltaH,
    mu0DeltaH: PHYS.mu0 * deltaH,
    points,
    peak,
    fwhm,
    halfMaximumAt: halfAt,
    refrigerantCapacity: rc,
    relativeCoolingPower: peak !== null ? Math.abs(peak.dS) * fwhm : NaN,
    warnings
  };
}

/** ΔS_M(T) for each field change (A/m). */
export function magneticEntropyChange(set: IIsothermSet, deltaHs: readonly number[], branch?: Branch): IEntropyResult {
  if (deltaHs.length === 0 || deltaHs.some(d => !(d > 0) || !Number.isFinite(d))) {
    throw new SweepInputError(msg('sweeps.entropy.field-changes', 'Every field change must be a finite number of A/m above 0, and at least one is needed.'));
  }
  const sel = selectBranch(set, branch);
  const warnings = setWarnings(set).concat(sel.warnings);
  const isotherms = sel.isotherms.slice().sort((a, b) => a.T - b.T);
  const notes = [
    msg(
      'sweeps.convention.maxwell',
      'Maxwell relation: ΔS_M(T, ΔH) = μ0 ∫₀^ΔH (∂M/∂T)_H dH, as a finite difference between neighbouring isotherms at their mid temperature.'
    ),
    msg('sweeps.convention.refrigerant-capacity', 'RC: the integral of |ΔS_M| over the FWHM of |ΔS_M|(T); RCP = |ΔS_M|max × FWHM.'),
    msg('sweeps.convention.entropy-sigma', 'σ from the noise of M, estimated by second differences along each isotherm.')
  ];
  return {
    curves: deltaHs.map(d => curve(isotherms, d)),
    unit: set.magnetisationUnit === 'A/m' ? 'J/(m^3 K)' : 'J/(kg K)',
    conventions: conventionsOf(set, notes),
    warnings
  };
}
