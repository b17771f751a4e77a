/**
 * Slider ranges and steps that follow the values: a coefficient's range
 * spans its sign and magnitude, the temperature range is centred on T0 with
 * a width set by the hysteresis window T** − T0 (or by b²/(4ac) when the
 * transition is continuous), and the field range by the natural field scale
 * a·ΔT·ψ; and the temperature the landscape opens at.
 */
import type { ILandauCoefficients } from '../../core/physics/landau/index';
import { explorerDerived, stationaryUnchecked, validateLandau } from '../../core/physics/landau/index';
import type { FieldRange } from './fields';

/** Bounds and step of a range input. */
export interface ISliderRange {
  min: number;
  max: number;
  step: number;
}

/** A 1-2-5 step giving about `divisions` steps over `span`. */
export function niceStep(span: number, divisions = 200): number {
  if (!(span > 0) || !Number.isFinite(span)) {
    return 1;
  }
  const raw = span / divisions;
  const p = Math.pow(10, Math.floor(Math.log10(raw)));
  const m = raw / p;
  return (m < 1.5 ? 1 : m < 3.5 ? 2 : m < 7.5 ? 5 : 10) * p;
}

/** Rounds `v` to a multiple of `step`, without binary noise in the printed value. */
export function snap(v: number, step: number): number {
  const decimals = Math.max(0, -Math.floor(Math.log10(step)) + 1);
  return Number((Math.round(v / step) * step).toFixed(Math.min(20, decimals)));
}

function bounded(min: number, max: number): ISliderRange {
  const step = niceStep(max - min);
  return { min: snap(min, step), max: snap(max, step), step };
}

/** Range of a coefficient slider around its current value. */
export function coefficientRange(value: number, kind: FieldRange): ISliderRange {
  const v = Number.isFinite(value) ? value : 0;
  const mag = Math.abs(v) > 0 ? Math.abs(v) : 1;
  switch (kind) {
    case 'positive': {
      const r = bounded(0, 2 * mag);
      return { ...r, min: r.step };
    }
    case 'non-negative':
      return bounded(0, 2 * mag);
    case 'signed':
      return bounded(-2 * mag, 2 * mag);
    case 'temperature': {
      const w = Math.max(0.5 * Math.abs(v), 1);
      return bounded(v - w, v + w);
    }
  }
}

/**
 * Temperature scale S of the picture: T** − T0 for a first-order transition
 * (from `superheat`), b²/(4ac) for b > 0 and c > 0, else 1 % of |T0| (at least 10⁻³).
 */
export function temperatureScale(k: ILandauCoefficients, superheat: number): number {
  const s = superheat - k.T0;
  if (s > 0 && Number.isFinite(s)) {
    return s;
  }
  if (k.b > 0 && k.c > 0) {
    return (k.b * k.b) / (4 * k.a * k.c);
  }
  return Math.max(0.01 * Math.abs(k.T0), 1e-3);
}

/**
 * Ranges of T (T0 − 2S … T0 + 3S) and of h (±H with H the larger of
 * a·S·|ψ_eq(T0 − 2S)| and twice the critical end-point field).
 */
export function stateRanges(k: ILandauCoefficients, superheat: number, hEnd: number): { T: ISliderRange; h: ISliderRange } {
  const S = temperatureScale(k, superheat);
  const T = bounded(k.T0 - 2 * S, k.T0 + 3 * S);
  const r = stationaryUnchecked(k, k.T0 - 2 * S, 0);
  const psi = r.global >= 0 ? Math.abs(r.points[r.global].psi) : 0;
  let H = k.a * S * (psi > 0 ? psi : 1);
  if (Number.isFinite(hEnd) && 2 * Math.abs(hEnd) > H) {
    H = 2 * Math.abs(hEnd);
  }
  if (!(H > 0) || !Number.isFinite(H)) {
    H = 1;
  }
  return { T, h: bounded(-H, H) };
}

/**
 * Temperature the landscape opens at: T1 for a first-order transition (the
 * coexisting minima), T0 − S/2 otherwise (S from `temperatureScale`); T0 for
 * coefficients that give no landscape.
 */
export function defaultTemperature(k: ILandauCoefficients): number {
  try {
    validateLandau(k);
    const d = explorerDerived(k);
    if (d.regime === 'first-order') {
      return d.T1;
    }
    return k.T0 - 0.5 * temperatureScale(k, d.Tsuperheat ?? k.T0);
  } catch {
    return Number.isFinite(k.T0) ? k.T0 : 0;
  }
}
