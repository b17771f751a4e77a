/**
 * Whether the global equation-of-state fit describes the data within their
 * noise. The noise of ln M is estimated on each isotherm from second
 * differences along the field (robustly: the median of |Δ²ln M|, which for
 * Gaussian noise of σ is 0.6745·√6·σ), and χ²_red of the fit's ln M
 * residuals is computed with it.
 */
import { msg } from '../messages';
import type { ICoreMessage } from '../messages';
import type { IGlobalFit, IGlobalWindow } from './global';
import { equationOfStatePoints } from './global';
import type { IIsotherm } from './types';

/** Smallest σ of ln M used (relative resolution of a good magnetometer reading; keeps noise-free data finite). */
const SIGMA_FLOOR = 1e-7;

/**
 * χ²_red at or below which the fit is said to describe the data (common
 * practice, no source: a reduced χ² up to about 2 is read as a fit within
 * the noise, given that the noise itself is only estimated).
 */
export const FITS_CHI2_RED = 2;

/** σ of ln M of one isotherm from the median |second difference| (NaN with fewer than 5 points). */
export function lnMNoise(iso: IIsotherm): number {
  const d: number[] = [];
  for (let i = 1; i + 1 < iso.M.length; i++) {
    if (iso.M[i - 1] > 0 && iso.M[i] > 0 && iso.M[i + 1] > 0) {
      d.push(Math.abs(Math.log(iso.M[i + 1]) - 2 * Math.log(iso.M[i]) + Math.log(iso.M[i - 1])));
    }
  }
  if (d.length < 3) {
    return NaN;
  }
  d.sort((a, b) => a - b);
  const med = d.length % 2 === 1 ? d[(d.length - 1) / 2] : 0.5 * (d[d.length / 2 - 1] + d[d.length / 2]);
  return med / (0.6745 * Math.sqrt(6));
}

/** The verdict on a global fit. */
export interface IEquationOfStateVerdict {
  state: 'fits' | 'does-not-fit' | 'not-converged';
  message: ICoreMessage;
  /** χ²_red with the estimated noise (NaN without a fit). */
  reducedChi2: number;
}

/** The verdict for a fit made on `isotherms` with the window around `windowTc`. */
export function equationOfStateVerdict(isotherms: readonly IIsotherm[], fit: IGlobalFit, windowTc: number, window: IGlobalWindow): IEquationOfStateVerdict {
  if (fit.fit === null || !fit.converged) {
    return {
      state: 'not-converged',
      message: msg('sweeps.verdict.not-converged', 'The global fit of the equation of state did not converge, so its values are not a result.'),
      reducedChi2: NaN
    };
  }
  const pts = equationOfStatePoints(isotherms, windowTc, window);
  const sigma = isotherms.map(iso => lnMNoise(iso));
  const r = fit.fit.residuals;
  let chi2 = 0;
  let n = 0;
  for (let i = 0; i < r.length && i < pts.isotherm.length; i++) {
    const s = sigma[pts.isotherm[i]];
    if (Number.isFinite(s) && Number.isFinite(r[i])) {
      const v = Math.max(s, SIGMA_FLOOR);
      chi2 += (r[i] / v) ** 2;
      n++;
    }
  }
  const dof = n - 5;
  if (dof < 1) {
    return {
      state: 'not-converged',
      message: msg('sweeps.verdict.no-noise', 'The noise of M could not be estimated on enough points to judge the fit.'),
      reducedChi2: NaN
    };
  }
  const red = chi2 / dof;
  return red <= FITS_CHI2_RED
    ? {
        state: 'fits',
        message: msg('sweeps.verdict.fits', 'χ²_red = %1 with the noise of M estimated on each isotherm: the equation of state describes the data within their noise.', red),
        reducedChi2: red
      }
    : {
        state: 'does-not-fit',
        message: msg(
          'sweeps.verdict.does-not-fit',
          'χ²_red = %1 with the noise of M estimated on each isotherm, above %2: the data deviate from the equation of state by more than their noise. Check N_d, the window and whether the transition is continuous.',
          red,
          FITS_CHI2_RED
        ),
        reducedChi2: red
      };
}
