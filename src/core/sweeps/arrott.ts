/**
 * Arrott plot [B5 in REFERENCES.md]: M² against H/M, per-isotherm high-field
 * straight lines, Ms(T)² (intercept on the M² axis, T < Tc), 1/χ0(T)
 * (intercept on the H/M axis, T > Tc), Tc where the intercept crosses zero,
 * and the Banerjee criterion as evidence.
 */
import { msg } from '../messages';
import type { ICoreMessage } from '../messages';
import type { IBanerjeeEvidence } from './banerjee';
import { banerjeeEvidence } from './banerjee';
import type { ICrossing, IFitRegion, IIsothermLine } from './lines';
import { highFieldRegion, interceptCrossing, isothermLines, validateWindow } from './lines';
import { selectBranch } from './sets';
import type { Branch, IIsothermSet, ISweepConventions, IValueSigma } from './types';
import { conventionsOf, setWarnings } from './types';

/** Options of {@link arrottAnalysis}. */
export interface IArrottOptions {
  region?: IFitRegion;
  branch?: Branch;
  /** Isotherms each side of the sign change used to locate Tc (default 2). */
  perSide?: number;
  /** Fewest isotherms accepted without a warning (default 5). */
  minIsotherms?: number;
}

/** A temperature-dependent value with σ. */
export interface ITemperaturePoint {
  T: number;
  value: number;
  sigma: number;
}

/** Outcome of the Arrott analysis. */
export interface IArrottResult {
  lines: IIsothermLine[];
  Tc: IValueSigma;
  TcCrossing: ICrossing;
  /** Ms² from intercepts on the M² axis (isotherms with c0 > 0), units of M². */
  spontaneousSquared: ITemperaturePoint[];
  /** 1/χ0 from intercepts on the H/M axis (isotherms with c0 < 0), dimensionless for volume M. */
  inverseChi: ITemperaturePoint[];
  banerjee: IBanerjeeEvidence;
  conventions: ISweepConventions;
  warnings: ICoreMessage[];
}

/** Runs the Arrott analysis on a set. */
export function arrottAnalysis(set: IIsothermSet, options: IArrottOptions = {}): IArrottResult {
  validateWindow(options.region);
  const sel = selectBranch(set, options.branch);
  const warnings = setWarnings(set).concat(sel.warnings);
  const region = options.region ?? {};
  const minIsotherms = options.minIsotherms ?? 5;
  if (sel.isotherms.length < minIsotherms) {
    warnings.push(
      msg('sweeps.arrott.few-isotherms', 'Too few isotherms (%1) for a reliable Tc from where the intercept changes sign: %2 or more are advisable.', sel.isotherms.length, minIsotherms)
    );
  }
  const lines = isothermLines(sel.isotherms, 0.5, 1, region);
  for (const l of lines) {
    if (l.n < 3) {
      warnings.push(
        msg('sweeps.arrott.line-few-points', 'The isotherm at %1 K has too few points in the high-field region (%2) for an uncertainty of its line.', { value: l.T, digits: 6 }, l.n)
      );
    }
  }
  const crossing = interceptCrossing(lines, options.perSide ?? 2);
  if (!crossing.converged) {
    warnings.push(crossing.reason);
  }
  const spontaneousSquared: ITemperaturePoint[] = [];
  const inverseChi: ITemperaturePoint[] = [];
  for (const l of lines) {
    if (l.intercept.value > 0) {
      spontaneousSquared.push({ T: l.T, value: l.intercept.value, sigma: l.intercept.sigma });
    } else if (Number.isFinite(l.inverseChi.value)) {
      inverseChi.push({ T: l.T, value: l.inverseChi.value, sigma: l.inverseChi.sigma });
    }
  }
  const banerjee = banerjeeEvidence(sel.isotherms);
  const notes = [
    msg('sweeps.convention.arrott', 'Arrott plot: M² against H/M, with a straight line M² = c0 + c1·H/M through the high-field part of each isotherm.'),
    highFieldRegion(region)
  ];
  return { lines, Tc: crossing.Tc, TcCrossing: crossing, spontaneousSquared, inverseChi, banerjee, conventions: conventionsOf(set, notes), warnings };
}
