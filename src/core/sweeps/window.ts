/**
 * Exponents against the fit window (one window hides its bias): the modified
 * Arrott iteration and/or the global equation-of-state fit repeated over a
 * grid of (t_max, H_min), each cell with σ, convergence and reason.
 */
import { msg } from '../messages';
import type { ICoreMessage } from '../messages';
import { criticalIsotherm } from './critical';
import { fitEquationOfState } from './global';
import { kouvelFisher } from './kouvel';
import { equationOfStateStart } from './eos';
import { iterateModifiedArrott, windowPoints } from './map';
import { selectBranch } from './sets';
import type { Branch, IIsothermSet, ISweepConventions, IValueSigma } from './types';
import { conventionsOf, setWarnings, SweepInputError } from './types';

/** One window of the scan. */
export interface IExponentWindowCell {
  tMax: number;
  hMin: number;
  method: 'iteration' | 'global';
  beta: IValueSigma;
  gamma: IValueSigma;
  Tc: IValueSigma;
  /** δ = 1 + γ/β. */
  delta: IValueSigma;
  /** δ from the critical isotherm at this cell's Tc with H ≥ H_min [B8 in REFERENCES.md]. */
  deltaCriticalIsotherm: IValueSigma;
  /** Kouvel–Fisher β and γ on this cell's Ms(T), 1/χ0(T) (iteration cells only; NaN otherwise). */
  kouvelFisherBeta: IValueSigma;
  kouvelFisherGamma: IValueSigma;
  /** Isotherms (iteration) or points (global) used. */
  n: number;
  converged: boolean;
  /** How this cell's iteration or fit ended (codes `sweeps.map.*`, `fit.stop.*`, `sweeps.window.no-start` …). */
  reason: ICoreMessage;
}

/** Options of {@link exponentWindowScan}. */
export interface IWindowScanOptions {
  tMaxs: readonly number[];
  /** Lowest fields, A/m. */
  hMins: readonly number[];
  methods?: readonly ('iteration' | 'global')[];
  start?: { beta: number; gamma: number };
  branch?: Branch;
}

/** Scan result. */
export interface IExponentWindowScan {
  cells: IExponentWindowCell[];
  conventions: ISweepConventions;
  warnings: ICoreMessage[];
}

function widom(beta: IValueSigma, gamma: IValueSigma): IValueSigma {
  return {
    value: 1 + gamma.value / beta.value,
    sigma: Math.sqrt((gamma.sigma / beta.value) ** 2 + ((gamma.value * beta.sigma) / (beta.value * beta.value)) ** 2)
  };
}

/** Runs every (t_max, H_min) cell with each requested method. */
export function exponentWindowScan(set: IIsothermSet, options: IWindowScanOptions): IExponentWindowScan {
  if (options.tMaxs.length === 0 || options.hMins.length === 0) {
    throw new SweepInputError(msg('sweeps.window-scan-empty', 'The window scan needs at least one largest |t| and one lowest field.'));
  }
  for (const t of options.tMaxs) {
    if (!(t > 0)) {
      throw new SweepInputError(msg('sweeps.t-max-invalid', 'The largest |t| of the window must be a finite number above 0, but it is %1.', t));
    }
  }
  const sel = selectBranch(set, options.branch);
  const warnings = setWarnings(set).concat(sel.warnings);
  const methods = options.methods ?? ['iteration'];
  const cells: IExponentWindowCell[] = [];
  const nan = { value: NaN, sigma: NaN };
  for (const tMax of options.tMaxs) {
    for (const hMin of options.hMins) {
      const region = { hMin };
      if (methods.includes('iteration')) {
        const r = iterateModifiedArrott(sel.isotherms, { tMax, region, start: options.start });
        const beta = r.MsFit?.exponent ?? nan;
        const gamma = r.chiFit?.exponent ?? nan;
        const pts = windowPoints(r.lines, r.Tc, 0, tMax);
        const TcS = Math.hypot(r.MsFit?.Tc.sigma ?? NaN, r.chiFit?.Tc.sigma ?? NaN) / 2;
        const powers = beta.value > 0 && gamma.value > 0 ? { below: 1 / beta.value, above: 1 / gamma.value } : undefined;
        const kf = kouvelFisher(pts.ms, pts.chi, 5, powers);
        cells.push({
          tMax,
          hMin,
          method: 'iteration',
          beta,
          gamma,
          Tc: { value: r.Tc, sigma: TcS },
          delta: widom(beta, gamma),
          deltaCriticalIsotherm: criticalIsotherm(sel.isotherms, r.Tc, { hMin }).delta,
          kouvelFisherBeta: kf.below.exponent,
          kouvelFisherGamma: kf.above.exponent,
          n: pts.ms.length + pts.chi.length,
          converged: r.converged,
          reason: r.reason
        });
      }
      if (methods.includes('global')) {
        const start = equationOfStateStart(sel.isotherms, tMax, region);
        if (start === null) {
          cells.push({ tMax, hMin, method: 'global', beta: nan, gamma: nan, Tc: nan, delta: nan, deltaCriticalIsotherm: nan, kouvelFisherBeta: nan, kouvelFisherGamma: nan, n: 0, converged: false, reason: msg('sweeps.window.no-start', 'No start values for the global fit: the modified Arrott iteration failed in this window.') });
        } else {
          const g = fitEquationOfState(sel.isotherms, start, { tMax, hMin });
          const dCrit = Number.isFinite(g.Tc.value) ? criticalIsotherm(sel.isotherms, g.Tc.value, { hMin }).delta : nan;
          cells.push({ tMax, hMin, method: 'global', beta: g.beta, gamma: g.gamma, Tc: g.Tc, delta: g.delta, deltaCriticalIsotherm: dCrit, kouvelFisherBeta: nan, kouvelFisherGamma: nan, n: g.n, converged: g.converged, reason: g.reason });
        }
      }
    }
  }
  const notes = [
    msg(
      'sweeps.convention.window-scan',
      'In each cell Tc is free and |t| is measured from that cell’s own Tc; the lowest field applies to the high-field lines (iteration) or to every point (global fit).'
    )
  ];
  return { cells, conventions: conventionsOf(set, notes), warnings };
}
