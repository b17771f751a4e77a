/**
 * The whole isotherm analysis in one call: Arrott plot, modified Arrott
 * iteration, Kouvel–Fisher on the iteration's Ms(T) and 1/χ0(T), the critical
 * isotherm at the iteration's Tc and the Widom/Rushbrooke checks; optionally
 * the global equation-of-state fit and the scaling collapse.
 */
import { msg } from '../messages';
import type { ICoreMessage } from '../messages';
import type { IArrottResult } from './arrott';
import { arrottAnalysis } from './arrott';
import type { ICollapseResult } from './collapse';
import { scalingCollapse } from './collapse';
import type { ICriticalIsothermResult, IScalingChecks } from './critical';
import { criticalIsotherm, scalingChecks } from './critical';
import type { IGlobalResult } from './eos';
import { globalEquationOfStateFit } from './eos';
import type { IKouvelFisherResult } from './kouvel';
import { kouvelFisher } from './kouvel';
import type { IFitRegion } from './lines';
import type { IModifiedArrottResult } from './map';
import { modifiedArrottIteration } from './map';
import { selectBranch } from './sets';
import type { Branch, IIsothermSet, ISweepConventions } from './types';
import { conventionsOf, uniqueMessages } from './types';

/** Options of {@link analyseIsotherms}. */
export interface IIsothermAnalysisOptions {
  region?: IFitRegion;
  /** Window of the exponent fits (default 0.1). */
  tMax?: number;
  start?: { beta: number; gamma: number };
  /** Points per local quadratic in Kouvel–Fisher (default 5). */
  kouvelFisherSpan?: number;
  /** Field range of the critical-isotherm fit, A/m. */
  criticalHMin?: number;
  criticalHMax?: number;
  /** Measured α (e.g. from heat capacity) for the Rushbrooke check. */
  alpha?: { value: number; error: number };
  global?: boolean;
  collapse?: boolean;
  branch?: Branch;
}

/** Everything the analysis produced. */
export interface IIsothermAnalysis {
  arrott: IArrottResult;
  modifiedArrott: IModifiedArrottResult;
  kouvelFisher: IKouvelFisherResult;
  criticalIsotherm: ICriticalIsothermResult;
  checks: IScalingChecks;
  global: IGlobalResult | null;
  collapse: ICollapseResult | null;
  conventions: ISweepConventions;
  /** Every warning of the analyses, each once. */
  warnings: ICoreMessage[];
}

/** Runs the analyses on a set. */
export function analyseIsotherms(set: IIsothermSet, options: IIsothermAnalysisOptions = {}): IIsothermAnalysis {
  const tMax = options.tMax ?? 0.1;
  const arrott = arrottAnalysis(set, { region: options.region, branch: options.branch });
  const map = modifiedArrottIteration(set, { region: options.region, tMax, start: options.start, branch: options.branch });
  const powers = Number.isFinite(map.beta.value) && Number.isFinite(map.gamma.value) && map.beta.value > 0 && map.gamma.value > 0 ? { below: 1 / map.beta.value, above: 1 / map.gamma.value } : undefined;
  const kf = kouvelFisher(map.spontaneous, map.inverseChi, options.kouvelFisherSpan ?? 5, powers);
  const iso = selectBranch(set, options.branch).isotherms;
  const crit = criticalIsotherm(iso, map.Tc.value, { hMin: options.criticalHMin, hMax: options.criticalHMax });
  const checks = scalingChecks({
    beta: { value: map.beta.value, error: map.beta.sigma },
    gamma: { value: map.gamma.value, error: map.gamma.sigma },
    delta: Number.isFinite(crit.delta.value) ? { value: crit.delta.value, error: crit.delta.sigma } : undefined,
    alpha: options.alpha
  });
  const global = options.global === true ? globalEquationOfStateFit(set, { tMax, region: options.region, branch: options.branch }) : null;
  const collapse =
    options.collapse === true && Number.isFinite(map.Tc.value)
      ? scalingCollapse(iso, { Tc: map.Tc.value, beta: map.beta.value, gamma: map.gamma.value }, { tMax })
      : null;
  const warnings = uniqueMessages([
    ...arrott.warnings,
    ...map.warnings,
    ...kf.warnings,
    ...crit.warnings,
    ...(global?.warnings ?? []),
    ...(collapse?.warnings ?? [])
  ]);
  return {
    arrott,
    modifiedArrott: map,
    kouvelFisher: kf,
    criticalIsotherm: crit,
    checks,
    global,
    collapse,
    conventions: conventionsOf(set, [
      msg('sweeps.convention.exponent-window', 'Exponent window: |t| ≤ %1.', tMax),
      msg('sweeps.convention.delta-source', 'δ from the critical isotherm at the Tc of the modified Arrott iteration.')
    ]),
    warnings
  };
}
