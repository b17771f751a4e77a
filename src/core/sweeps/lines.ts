/**
 * High-field straight lines of (modified) Arrott isotherms:
 * y = M^(1/β) against x = (H/M)^(1/γ), fitted as y = c0 + c1·x on the
 * high-field part of each isotherm. β = ½, γ = 1 is the Arrott plot [B5 in REFERENCES.md].
 * c0 > 0 gives Ms = c0^β; x0 = −c0/c1 > 0 gives 1/χ0 = x0^γ [B5, B6 in REFERENCES.md].
 */
import { msg } from '../messages';
import type { ICoreMessage } from '../messages';
import type { ILineFit } from '../numeric/linear';
import { fitLine, lineRoot } from '../numeric/linear';
import type { IIsotherm, IValueSigma } from './types';
import { SweepInputError } from './types';

/** Which points of an isotherm enter its high-field line. */
export interface IFitRegion {
  /** Lowest field used, A/m (default: set by `topFraction`). */
  hMin?: number;
  /** Upper fraction of each isotherm's field range used when hMin is absent (default 0.5). */
  topFraction?: number;
}

/** One isotherm's line and the quantities read from it. */
export interface IIsothermLine {
  T: number;
  /** Intercept on the y axis, c0 (Ms^(1/β) when > 0). */
  intercept: IValueSigma;
  /** Slope c1. */
  slope: IValueSigma;
  /** Spontaneous magnetisation Ms = c0^β (NaN when c0 ≤ 0). */
  Ms: IValueSigma;
  /** Inverse initial susceptibility 1/χ0 = x0^γ (NaN when x0 ≤ 0). */
  inverseChi: IValueSigma;
  /** Points used. */
  n: number;
  fit: ILineFit;
}

/** A value that may not be a number, as a message argument. */
function shown(v: unknown): number | string {
  return typeof v === 'number' ? v : String(v);
}

/** Throws `SweepInputError` for a region or window that cannot select points. */
export function validateWindow(region: IFitRegion | undefined, tMax?: number): void {
  if (region?.topFraction !== undefined && !(region.topFraction > 0 && region.topFraction <= 1)) {
    throw new SweepInputError(
      msg('sweeps.top-fraction-invalid', 'The high-field share of each isotherm must lie above 0 and at most 1, but it is %1.', shown(region.topFraction))
    );
  }
  if (region?.hMin !== undefined && !Number.isFinite(region.hMin)) {
    throw new SweepInputError(msg('sweeps.h-min-invalid', 'The lowest field of the high-field region must be a finite field in A/m, but it is %1.', shown(region.hMin)));
  }
  if (tMax !== undefined && !(tMax > 0 && Number.isFinite(tMax))) {
    throw new SweepInputError(msg('sweeps.t-max-invalid', 'The largest |t| of the window must be a finite number above 0, but it is %1.', shown(tMax)));
  }
}

/** The high-field region as written in the conventions of a result. */
export function highFieldRegion(region: IFitRegion): ICoreMessage {
  return region.hMin !== undefined
    ? msg('sweeps.convention.region-h-min', 'High-field region: H ≥ %1 A/m.', region.hMin)
    : msg('sweeps.convention.region-share', 'High-field region: the upper %1 % of the field range of each isotherm.', (region.topFraction ?? 0.5) * 100);
}

/** Indices of the points of an isotherm inside the region (H > 0, M > 0 only). */
export function regionMask(iso: IIsotherm, region: IFitRegion): boolean[] {
  let hLo = Infinity;
  let hHi = -Infinity;
  for (let i = 0; i < iso.H.length; i++) {
    if (iso.H[i] > 0 && iso.M[i] > 0) {
      hLo = Math.min(hLo, iso.H[i]);
      hHi = Math.max(hHi, iso.H[i]);
    }
  }
  const frac = region.topFraction ?? 0.5;
  const cut = region.hMin ?? hHi - frac * (hHi - hLo);
  const out: boolean[] = [];
  for (let i = 0; i < iso.H.length; i++) {
    out.push(iso.H[i] > 0 && iso.M[i] > 0 && iso.H[i] >= cut);
  }
  return out;
}

/** Fits the line of one isotherm for exponents (β, γ). */
export function isothermLine(iso: IIsotherm, beta: number, gamma: number, region: IFitRegion): IIsothermLine {
  const mask = regionMask(iso, region);
  const n = iso.H.length;
  const x = new Float64Array(n);
  const y = new Float64Array(n);
  const ib = 1 / beta;
  const ig = 1 / gamma;
  for (let i = 0; i < n; i++) {
    if (mask[i]) {
      x[i] = Math.pow(iso.H[i] / iso.M[i], ig);
      y[i] = Math.pow(iso.M[i], ib);
    }
  }
  const f = fitLine(x, y, i => mask[i]);
  const c0 = f.intercept;
  const sc0 = Math.sqrt(f.varIntercept);
  const Ms = c0 > 0 ? { value: Math.pow(c0, beta), sigma: beta * Math.pow(c0, beta - 1) * sc0 } : { value: NaN, sigma: NaN };
  const root = lineRoot(f);
  const inverseChi = root.value > 0 ? { value: Math.pow(root.value, gamma), sigma: gamma * Math.pow(root.value, gamma - 1) * root.sigma } : { value: NaN, sigma: NaN };
  return { T: iso.T, intercept: { value: c0, sigma: sc0 }, slope: { value: f.slope, sigma: Math.sqrt(f.varSlope) }, Ms, inverseChi, n: f.n, fit: f };
}

/** Lines of every isotherm. */
export function isothermLines(isotherms: readonly IIsotherm[], beta: number, gamma: number, region: IFitRegion): IIsothermLine[] {
  return isotherms.map(iso => isothermLine(iso, beta, gamma, region));
}

/** Temperature where the intercept c0(T) crosses zero. */
export interface ICrossing {
  Tc: IValueSigma;
  converged: boolean;
  /** How Tc was found, or why it was not (codes `sweeps.crossing.*`), as a sentence that can stand as a warning. */
  reason: ICoreMessage;
  /** Temperatures of the isotherms either side of the crossing. */
  bracket: [number, number] | null;
}

/**
 * Tc where c0(T) changes sign (from + below to − above): a straight line through
 * up to `perSide` isotherms either side of the first sign change, σ by
 * propagation of the line covariance.
 */
export function interceptCrossing(lines: readonly IIsothermLine[], perSide = 2): ICrossing {
  const pts = lines.filter(l => Number.isFinite(l.intercept.value)).sort((a, b) => a.T - b.T);
  let k = -1;
  for (let i = 0; i + 1 < pts.length; i++) {
    if (pts[i].intercept.value > 0 && pts[i + 1].intercept.value <= 0) {
      k = i;
      break;
    }
  }
  if (k < 0) {
    const allPos = pts.every(p => p.intercept.value > 0);
    const reason =
      pts.length < 2
        ? msg('sweeps.crossing.too-few', 'Tc was not found: fewer than two isotherms have a usable high-field line.')
        : allPos
          ? msg('sweeps.crossing.all-below', 'Tc was not found: every isotherm has a positive intercept, so all of them lie below Tc.')
          : msg('sweeps.crossing.all-above', 'Tc was not found: no isotherm has a positive intercept, so all of them lie above Tc.');
    return { Tc: { value: NaN, sigma: NaN }, converged: false, reason, bracket: null };
  }
  const lo = Math.max(0, k - perSide + 1);
  const hi = Math.min(pts.length - 1, k + perSide);
  const T = pts.slice(lo, hi + 1).map(p => p.T);
  const c = pts.slice(lo, hi + 1).map(p => p.intercept.value);
  const f = fitLine(T, c);
  let root = lineRoot(f);
  if (!Number.isFinite(root.value) || root.value < pts[k].T || root.value > pts[k + 1].T) {
    // linear interpolation between the two bracketing isotherms
    const a = pts[k];
    const b = pts[k + 1];
    const v = a.T + (a.intercept.value * (b.T - a.T)) / (a.intercept.value - b.intercept.value);
    root = { value: v, sigma: Number.isFinite(root.sigma) ? root.sigma : NaN };
  }
  return { Tc: root, converged: Number.isFinite(root.value), reason: msg('sweeps.crossing.line', 'Tc from a straight line through %1 isotherms around the sign change of the intercept.', T.length), bracket: [pts[k].T, pts[k + 1].T] };
}
