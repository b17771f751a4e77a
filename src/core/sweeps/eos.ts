/**
 * Global equation-of-state analysis of a set: starting values from the
 * modified Arrott iteration (β, γ, Tc; M1 from the line slopes, T1 from the
 * 1/χ0 amplitude), then one nonlinear fit of all points in the window.
 */
import { msg } from '../messages';
import type { ICoreMessage } from '../messages';
import type { IEquationOfStateStart, IGlobalFit } from './global';
import { fitEquationOfState } from './global';
import type { IFitRegion } from './lines';
import { validateWindow } from './lines';
import { iterateModifiedArrott, tcBetaCorrelated } from './map';
import { selectBranch } from './sets';
import type { Branch, IIsotherm, IIsothermSet, ISweepConventions } from './types';
import { conventionsOf, setWarnings } from './types';

/** Options of {@link globalEquationOfStateFit}. */
export interface IGlobalOptions {
  /** Largest |t| of isotherms used (default 0.1). */
  tMax?: number;
  /** Lowest field used, A/m (default: every H > 0). */
  hMin?: number;
  /** Starting values; default from the modified Arrott iteration. */
  start?: IEquationOfStateStart;
  /** Region of the high-field lines of the starting iteration. */
  region?: IFitRegion;
  branch?: Branch;
}

/** Global fit result with conventions and warnings. */
export interface IGlobalResult extends IGlobalFit {
  start: IEquationOfStateStart | null;
  conventions: ISweepConventions;
  warnings: ICoreMessage[];
}

/** Starting values for the global fit from the modified Arrott iteration. */
export function equationOfStateStart(isotherms: readonly IIsotherm[], tMax: number, region: IFitRegion = {}): IEquationOfStateStart | null {
  const r = iterateModifiedArrott(isotherms, { tMax, region });
  if (r.MsFit === null || r.chiFit === null || !Number.isFinite(r.beta) || !Number.isFinite(r.chiFit.amplitude.value)) {
    return null;
  }
  const slopes = r.lines.map(l => l.slope.value).filter(s => s > 0 && Number.isFinite(s));
  if (slopes.length === 0) {
    return null;
  }
  slopes.sort((a, b) => a - b);
  const c1 = slopes[Math.floor(slopes.length / 2)];
  const G = r.chiFit.amplitude.value;
  return { Tc: r.Tc, beta: r.beta, gamma: r.gamma, M1: Math.pow(c1, r.beta), T1: r.Tc / Math.pow(G, 1 / r.gamma) };
}

/** Runs the global equation-of-state fit on a set. */
export function globalEquationOfStateFit(set: IIsothermSet, options: IGlobalOptions = {}): IGlobalResult {
  const sel = selectBranch(set, options.branch);
  const warnings = setWarnings(set).concat(sel.warnings);
  const tMax = options.tMax ?? 0.1;
  validateWindow(options.region, tMax);
  const start = options.start ?? equationOfStateStart(sel.isotherms, tMax, options.region);
  const notes = [
    msg('sweeps.convention.equation-of-state', 'Arrott–Noakes equation of state (H/M)^(1/γ) = (T − Tc)/T1 + (M/M1)^(1/β), fitted to ln M of every point.'),
    msg('sweeps.convention.eos-window', 'Window: |t| ≤ %1 around the starting Tc, and H ≥ %2 A/m.', tMax, options.hMin ?? 0)
  ];
  if (start === null) {
    const nan = { value: NaN, sigma: NaN };
    const none = msg('sweeps.eos.no-start', 'The global fit has no start values because the modified Arrott iteration failed: give start values.');
    warnings.push(none);
    return { Tc: nan, beta: nan, gamma: nan, T1: nan, M1: nan, delta: nan, correlationTcBeta: NaN, n: 0, converged: false, reason: none, fit: null, start, conventions: conventionsOf(set, notes), warnings };
  }
  const g = fitEquationOfState(sel.isotherms, start, { tMax, hMin: options.hMin });
  if (!g.converged) {
    warnings.push(msg('sweeps.eos.not-converged', 'The global fit of the equation of state did not converge.'), g.reason);
  }
  if (Number.isFinite(g.correlationTcBeta)) {
    warnings.push(tcBetaCorrelated(g.correlationTcBeta));
  }
  return { ...g, start, conventions: conventionsOf(set, notes), warnings: warnings.concat(g.fit?.warnings ?? []) };
}
