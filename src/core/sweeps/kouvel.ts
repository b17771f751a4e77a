/**
 * Kouvel–Fisher method [B7 in REFERENCES.md]: X = Ms/(dMs/dT) = (T − Tc)/β below Tc,
 * Y = χ0⁻¹/(dχ0⁻¹/dT) = (T − Tc)/γ above Tc. Derivatives come from local
 * quadratic fits (raw differences amplify noise), optionally of Ms^p and
 * (1/χ0)^q with powers that make them nearly linear in T; straight lines through X(T) and
 * Y(T) give 1/β, 1/γ and Tc with σ from the line covariance. Local slopes
 * give effective exponents at each T.
 */
import { msg } from '../messages';
import type { ICoreMessage } from '../messages';
import type { ITemperaturePoint } from './arrott';
import { fitLine, lineRoot, smoothedDerivative } from '../numeric/linear';
import type { IValueSigma } from './types';
import { SweepInputError } from './types';

/** One side of the Kouvel–Fisher analysis. */
export interface IKouvelFisherSide {
  /** X (or Y) at each temperature, K. */
  points: { T: number; value: number }[];
  exponent: IValueSigma;
  Tc: IValueSigma;
  /** Effective exponent from the local slope (two-point) between neighbours, at their mid temperature. */
  effective: { T: number; exponent: number }[];
  n: number;
  /** How the side was fitted, or why it was not (codes `sweeps.kouvel.*`). */
  reason: ICoreMessage;
}

/** Kouvel–Fisher exponents on both sides. */
export interface IKouvelFisherResult {
  below: IKouvelFisherSide;
  above: IKouvelFisherSide;
  /** σ-weighted combination of both Tc (half the difference added when they disagree). */
  Tc: IValueSigma;
  /** Points in each local quadratic. */
  span: number;
  /** Definitions used (X, Y, derivative smoothing), code `sweeps.kouvel.convention`. */
  convention: ICoreMessage;
  warnings: ICoreMessage[];
}

function side(points: readonly ITemperaturePoint[], span: number, power: number): IKouvelFisherSide {
  const pts = points.filter(p => Number.isFinite(p.value) && p.value > 0).slice().sort((a, b) => a.T - b.T);
  const nan = { value: NaN, sigma: NaN };
  if (pts.length < 3) {
    return { points: [], exponent: nan, Tc: nan, effective: [], n: pts.length, reason: msg('sweeps.kouvel.too-few', 'Too few points (%1) for Kouvel–Fisher on this side of Tc: at least 3 are needed.', pts.length) };
  }
  const T = pts.map(p => p.T);
  // X = Ms/(dMs/dT) = p·y/(dy/dT) with y = Ms^p exactly; a p that makes y nearly linear in T
  // only makes the local-quadratic derivative more accurate
  const y = pts.map(p => Math.pow(p.value, power));
  const d = smoothedDerivative(T, y, span);
  const X = pts.map((_p, i) => (power * y[i]) / d[i]);
  const f = fitLine(T, X);
  // X = (T − Tc)/e: slope 1/e, Tc = root
  const e = 1 / f.slope;
  const eSigma = Math.sqrt(f.varSlope) / (f.slope * f.slope);
  const root = lineRoot(f);
  const effective: { T: number; exponent: number }[] = [];
  for (let i = 0; i + 1 < T.length; i++) {
    const s = (X[i + 1] - X[i]) / (T[i + 1] - T[i]);
    effective.push({ T: 0.5 * (T[i] + T[i + 1]), exponent: 1 / s });
  }
  return {
    points: T.map((t, i) => ({ T: t, value: X[i] })),
    exponent: { value: e, sigma: eSigma },
    Tc: root,
    effective,
    n: pts.length,
    reason:
      pts.length < 5
        ? msg('sweeps.kouvel.few', 'Straight line through fewer than 5 points: its σ rests on very few degrees of freedom.')
        : msg('sweeps.kouvel.line', 'Straight line through the Kouvel–Fisher points of this side of Tc.')
  };
}

/**
 * Kouvel–Fisher from Ms(T) (below Tc) and 1/χ0(T) (above Tc), which should come
 * from Arrott / modified Arrott extrapolation, not finite-field M(T).
 */
export function kouvelFisher(
  Ms: readonly ITemperaturePoint[],
  inverseChi: readonly ITemperaturePoint[],
  span = 5,
  powers: { below: number; above: number } = { below: 1, above: 1 }
): IKouvelFisherResult {
  for (const v of [powers.below, powers.above]) {
    if (!(v > 0) || !Number.isFinite(v)) {
      throw new SweepInputError(msg('sweeps.kouvel.powers', 'The smoothing powers of Kouvel–Fisher must be finite numbers above 0, but one is %1.', v));
    }
  }
  const below = side(Ms, span, powers.below);
  const above = side(inverseChi, span, powers.above);
  const warnings: ICoreMessage[] = [];
  if (below.n < 5 || above.n < 5) {
    warnings.push(msg('sweeps.kouvel.few-points', 'Kouvel–Fisher has %1 points below and %2 above Tc, where 5 or more on each side are advisable.', below.n, above.n));
  }
  let Tc: IValueSigma = { value: NaN, sigma: NaN };
  const a = below.Tc;
  const b = above.Tc;
  if (Number.isFinite(a.value) && Number.isFinite(b.value)) {
    const wa = a.sigma > 0 ? 1 / (a.sigma * a.sigma) : 1;
    const wb = b.sigma > 0 ? 1 / (b.sigma * b.sigma) : 1;
    const v = (wa * a.value + wb * b.value) / (wa + wb);
    Tc = { value: v, sigma: Math.max(Math.sqrt(1 / (wa + wb)), Math.abs(a.value - b.value) / 2) };
  } else {
    Tc = Number.isFinite(a.value) ? a : b;
  }
  const convention = msg(
    'sweeps.kouvel.convention',
    'X = Ms/(dMs/dT) = (T − Tc)/β and Y = (1/χ0)/(d(1/χ0)/dT) = (T − Tc)/γ, with derivatives from local quadratics through %1 points of Ms^%2 and (1/χ0)^%3 (X = p·y/(dy/dT) for y = Ms^p, exact for any p); T in K.',
    span,
    powers.below,
    powers.above
  );
  return { below, above, Tc, span, convention, warnings };
}
