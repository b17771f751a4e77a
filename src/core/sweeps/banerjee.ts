/**
 * Banerjee criterion [B10 in REFERENCES.md] as evidence, not a verdict: the local
 * slope of each Arrott isotherm, d(H/M)/d(M²), from sliding straight-line fits
 * along the isotherm. A slope below zero by more than `zThreshold` standard
 * errors flags the isotherm.
 */
import { formatNumberArg, msg } from '../messages';
import type { ICoreMessage } from '../messages';
import { fitLine } from '../numeric/linear';
import type { IIsotherm, IValueSigma } from './types';

/** Local-slope summary of one isotherm. */
export interface IBanerjeeIsotherm {
  T: number;
  /** Most negative local slope d(H/M)/d(M²) with its σ. */
  minLocalSlope: IValueSigma;
  /** M² at the centre of that window. */
  atMSquared: number;
  negative: boolean;
}

/** The criterion's evidence with its caveats. */
export interface IBanerjeeEvidence {
  isotherms: IBanerjeeIsotherm[];
  negativeCount: number;
  /** Plain statement of what was seen, never a verdict on the order (codes `sweeps.banerjee.negative`, `sweeps.banerjee.none`). */
  evidence: ICoreMessage;
  /** Codes `sweeps.banerjee.caveat-*`. */
  caveats: ICoreMessage[];
}

function caveats(): ICoreMessage[] {
  return [
    msg('sweeps.banerjee.caveat-necessary', 'The Banerjee criterion is necessary rather than sufficient.'),
    msg(
      'sweeps.banerjee.caveat-other-causes',
      'Negative or S-shaped Arrott slopes can also come from demagnetisation, sample inhomogeneity, antiferromagnetic or metamagnetic components, and exponents other than mean-field ones.'
    ),
    msg('sweeps.banerjee.caveat-corroborate', 'Corroborate with thermal hysteresis, latent heat and a volume discontinuity before calling the transition first order.')
  ];
}

/** Local slopes along one isotherm (points with H > 0 and M > 0, in field order). */
export function banerjeeIsotherm(iso: IIsotherm, window?: number, zThreshold = 3): IBanerjeeIsotherm {
  const x: number[] = [];
  const y: number[] = [];
  for (let i = 0; i < iso.H.length; i++) {
    if (iso.H[i] > 0 && iso.M[i] > 0) {
      x.push(iso.M[i] * iso.M[i]);
      y.push(iso.H[i] / iso.M[i]);
    }
  }
  const w = Math.max(4, window ?? Math.round(x.length / 10));
  let best: IValueSigma = { value: NaN, sigma: NaN };
  let at = NaN;
  let negative = false;
  for (let s = 0; s + w <= x.length; s += Math.max(1, Math.floor(w / 2))) {
    const f = fitLine(x.slice(s, s + w), y.slice(s, s + w));
    if (!Number.isFinite(f.slope)) {
      continue;
    }
    const sig = Math.sqrt(Math.max(f.varSlope, 0));
    if (!(best.value <= f.slope)) {
      best = { value: f.slope, sigma: sig };
      at = 0.5 * (x[s] + x[s + w - 1]);
    }
    if (f.slope < 0 && -f.slope > zThreshold * sig) {
      negative = true;
    }
  }
  return { T: iso.T, minLocalSlope: best, atMSquared: at, negative };
}

/** The criterion over a family of isotherms. */
export function banerjeeEvidence(isotherms: readonly IIsotherm[], window?: number, zThreshold = 3): IBanerjeeEvidence {
  const list = isotherms.map(iso => banerjeeIsotherm(iso, window, zThreshold));
  const neg = list.filter(l => l.negative);
  const evidence =
    neg.length > 0
      ? msg(
          'sweeps.banerjee.negative',
          '%1 of %2 Arrott isotherms have a significantly negative local slope (at T = %3 K): consistent with b < 0, i.e. a first-order transition, if the caveats are excluded.',
          neg.length,
          list.length,
          neg.map(l => formatNumberArg(l.T, 6)).join(', ')
        )
      : msg(
          'sweeps.banerjee.none',
          'No Arrott isotherm has a significantly negative local slope (%1 isotherms): consistent with a second-order transition, which this alone does not prove.',
          list.length
        );
  return { isotherms: list, negativeCount: neg.length, evidence, caveats: caveats() };
}
