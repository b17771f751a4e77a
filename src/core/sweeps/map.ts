/**
 * Modified Arrott plot by iteration [B6 in REFERENCES.md]: from trial exponents,
 * straight high-field lines of M^(1/β) against (H/M)^(1/γ) give Ms(T) and
 * 1/χ0(T); power laws with Tc free give new β, γ, Tc; repeat until stable.
 */
import { msg } from '../messages';
import type { ICoreMessage } from '../messages';
import { UNIVERSALITY_CLASSES } from '../physics/universality';
import type { ITemperaturePoint } from './arrott';
import type { ICrossing, IFitRegion, IIsothermLine } from './lines';
import { interceptCrossing, isothermLines, validateWindow } from './lines';
import type { IPowerFit } from './powerfit';
import { fitCriticalPower } from './powerfit';
import { selectBranch } from './sets';
import type { Branch, IIsotherm, IIsothermSet, ISweepConventions, IValueSigma } from './types';
import { conventionsOf, setWarnings, SweepInputError } from './types';

/** Options of {@link modifiedArrottIteration}. */
export interface IModifiedArrottOptions {
  /** Trial exponents (default: 3D Heisenberg, [C2 in REFERENCES.md]). */
  start?: { beta: number; gamma: number };
  region?: IFitRegion;
  /** Largest |t| of isotherms entering the power-law fits (default 0.1). */
  tMax?: number;
  /** Smallest |t| (default 0). */
  tMin?: number;
  maxIterations?: number;
  /** Stop when β, γ and Tc/Tc change by less than this (default 1e-6). */
  tolerance?: number;
  branch?: Branch;
}

/** One step of the iteration. */
export interface IIterationStep {
  beta: number;
  gamma: number;
  Tc: number;
}

/** Outcome of the modified Arrott iteration. */
export interface IModifiedArrottResult {
  beta: IValueSigma;
  gamma: IValueSigma;
  /** δ = 1 + γ/β (Widom) with propagated σ (β, γ taken as independent). */
  deltaWidom: IValueSigma;
  /** Tc: σ-weighted mean of the two power-law Tc. */
  Tc: IValueSigma;
  TcFromMs: IValueSigma;
  TcFromChi: IValueSigma;
  /** Tc where the final lines' intercept crosses zero. */
  TcCrossing: ICrossing;
  MsFit: IPowerFit;
  chiFit: IPowerFit;
  lines: IIsothermLine[];
  spontaneous: ITemperaturePoint[];
  inverseChi: ITemperaturePoint[];
  history: IIterationStep[];
  iterations: number;
  converged: boolean;
  /** How the iteration ended (codes `sweeps.map.*`), as a sentence that can stand as a warning. */
  reason: ICoreMessage;
  conventions: ISweepConventions;
  warnings: ICoreMessage[];
}

const HEIS = UNIVERSALITY_CLASSES.find(c => c.id === '3d-heisenberg');

/** The warning that Tc and β (or the exponent fitted with Tc) are correlated by `r`. */
export function tcBetaCorrelated(r: number): ICoreMessage {
  return msg('sweeps.tc-beta-correlated', 'Tc and β are correlated (r = %1): quote them together.', { value: r, digits: 3 });
}

/** σ-weighted mean of two values (plain mean when a σ is missing); σ is the larger of the statistical σ and half their difference. */
export function combine(a: IValueSigma, b: IValueSigma): IValueSigma {
  if (!Number.isFinite(a.value)) {
    return b;
  }
  if (!Number.isFinite(b.value)) {
    return a;
  }
  if (a.sigma > 0 && b.sigma > 0) {
    const wa = 1 / (a.sigma * a.sigma);
    const wb = 1 / (b.sigma * b.sigma);
    const v = (wa * a.value + wb * b.value) / (wa + wb);
    // add the half-difference as a systematic part when the two disagree
    const stat = Math.sqrt(1 / (wa + wb));
    return { value: v, sigma: Math.max(stat, Math.abs(a.value - b.value) / 2) };
  }
  return { value: 0.5 * (a.value + b.value), sigma: Math.abs(a.value - b.value) / 2 };
}

function inWindow(T: number, Tc: number, tMin: number, tMax: number): boolean {
  const t = Math.abs(T - Tc) / Tc;
  return t <= tMax && t >= tMin;
}

/** Reads Ms and 1/χ0 points of the lines inside the window. */
export function windowPoints(lines: readonly IIsothermLine[], Tc: number, tMin: number, tMax: number) {
  const ms: ITemperaturePoint[] = [];
  const chi: ITemperaturePoint[] = [];
  for (const l of lines) {
    if (!inWindow(l.T, Tc, tMin, tMax)) {
      continue;
    }
    if (l.T < Tc && Number.isFinite(l.Ms.value)) {
      ms.push({ T: l.T, value: l.Ms.value, sigma: l.Ms.sigma });
    } else if (l.T > Tc && Number.isFinite(l.inverseChi.value)) {
      chi.push({ T: l.T, value: l.inverseChi.value, sigma: l.inverseChi.sigma });
    }
  }
  return { ms, chi };
}

/** Fewest isotherms on each side of Tc for a step's power laws (amplitude, Tc and exponent need 4). */
export const MIN_ISOTHERMS_PER_SIDE = 4;
/** Range of β and γ a step may report (an exponent at or beyond these limits is not a result). */
const BETA_RANGE: readonly [number, number] = [0.05, 3];
const GAMMA_RANGE: readonly [number, number] = [0.2, 5];

/** Whether a power law's exponent is a result: finite, inside the range, and known better than to 100 %. */
export function usableExponent(f: IPowerFit, range: readonly [number, number]): boolean {
  const e = f.exponent;
  return Number.isFinite(e.value) && e.value > range[0] && e.value < range[1] && Number.isFinite(e.sigma) && e.sigma >= 0 && e.sigma < e.value;
}

/** Why step `it` of the iteration gives no usable exponents, or null when it does. */
function stepProblem(it: number, below: number, above: number, fm: IPowerFit, fc: IPowerFit): { reason: ICoreMessage; cause: ICoreMessage | null } | null {
  const kept =
    it === 1
      ? msg('sweeps.map.no-usable-step', 'No step of the modified Arrott iteration gave usable exponents, so it reports none.')
      : msg('sweeps.map.kept-step', 'The values are those of step %1, the last usable one.', it - 1);
  if (below < MIN_ISOTHERMS_PER_SIDE || above < MIN_ISOTHERMS_PER_SIDE) {
    return {
      reason: msg(
        'sweeps.map.step-too-few',
        'The modified Arrott iteration stopped at step %1: only %2 isotherms below and %3 above Tc had a usable line in the window, where %4 on each side are needed.',
        it,
        below,
        above,
        MIN_ISOTHERMS_PER_SIDE
      ),
      cause: kept
    };
  }
  if (!Number.isFinite(fm.exponent.value)) {
    return { reason: msg('sweeps.map.ms-fit-failed', 'The modified Arrott iteration stopped: the power law of Ms(T) could not be fitted.'), cause: fm.reason };
  }
  if (!Number.isFinite(fc.exponent.value)) {
    return { reason: msg('sweeps.map.chi-fit-failed', 'The modified Arrott iteration stopped: the power law of 1/χ0(T) could not be fitted.'), cause: fc.reason };
  }
  for (const [f, range, name] of [
    [fm, BETA_RANGE, 'β'],
    [fc, GAMMA_RANGE, 'γ']
  ] as const) {
    if (!usableExponent(f, range)) {
      return {
        reason: msg(
          'sweeps.map.step-unusable',
          'The modified Arrott iteration stopped at step %1: its power law gave %2 = %3 ± %4, outside %5 to %6 or with an uncertainty as large as the value.',
          it,
          name,
          f.exponent.value,
          f.exponent.sigma,
          range[0],
          range[1]
        ),
        cause: kept
      };
    }
  }
  return null;
}

/** The iteration on given isotherms (no branch selection, no set warnings). */
export function iterateModifiedArrott(isotherms: readonly IIsotherm[], options: IModifiedArrottOptions = {}) {
  let beta = options.start?.beta ?? HEIS?.beta.value ?? 0.3689;
  let gamma = options.start?.gamma ?? HEIS?.gamma.value ?? 1.396;
  const region = options.region ?? {};
  const tMax = options.tMax ?? 0.1;
  const tMin = options.tMin ?? 0;
  const maxIt = options.maxIterations ?? 100;
  const tol = options.tolerance ?? 1e-6;
  let lines = isothermLines(isotherms, beta, gamma, region);
  let first = interceptCrossing(lines);
  let startNote: ICoreMessage | null = null;
  if (!first.converged && options.start === undefined) {
    // the default trial exponents give no intercept crossing: try the other classes of [C2 in REFERENCES.md]
    for (const c of UNIVERSALITY_CLASSES) {
      const trial = isothermLines(isotherms, c.beta.value, c.gamma.value, region);
      const cross = interceptCrossing(trial);
      if (cross.converged) {
        beta = c.beta.value;
        gamma = c.gamma.value;
        lines = trial;
        first = cross;
        startNote = msg(
          'sweeps.map.other-start',
          'The 3D Heisenberg exponents gave no sign change of the intercept, so the iteration started from the %1 exponents (β = %2, γ = %3).',
          c.name,
          beta,
          gamma
        );
        break;
      }
    }
  }
  let Tc = first.converged ? first.Tc.value : isotherms.length > 0 ? isotherms[Math.floor(isotherms.length / 2)].T : NaN;
  const history: IIterationStep[] = [{ beta, gamma, Tc }];
  let MsFit: IPowerFit | null = null;
  let chiFit: IPowerFit | null = null;
  let converged = false;
  let reason = msg('sweeps.map.iteration-limit', 'The modified Arrott iteration reached its limit of %1 steps before the exponents and Tc settled.', maxIt);
  // The failed power-law fit that stopped the iteration, if one did.
  let cause: ICoreMessage | null = null;
  let it = 0;
  for (it = 1; it <= maxIt; it++) {
    const pts = windowPoints(lines, Tc, tMin, tMax);
    const fm = fitCriticalPower(pts.ms.map(p => p.T), pts.ms.map(p => p.value), 'below', { Tc, exponent: beta }, pts.ms.map(p => p.sigma));
    const fc = fitCriticalPower(pts.chi.map(p => p.T), pts.chi.map(p => p.value), 'above', { Tc, exponent: gamma }, pts.chi.map(p => p.sigma));
    const problem = stepProblem(it, pts.ms.length, pts.chi.length, fm, fc);
    if (problem !== null) {
      // never report exponents from this step: keep the last usable step's fits, or none
      reason = problem.reason;
      cause = problem.cause;
      if (it === 1) {
        MsFit = usableExponent(fm, BETA_RANGE) ? fm : null;
        chiFit = usableExponent(fc, GAMMA_RANGE) ? fc : null;
        if (MsFit === null || chiFit === null) {
          MsFit = null;
          chiFit = null;
        }
      }
      break;
    }
    MsFit = fm;
    chiFit = fc;
    const nb = Math.min(Math.max(fm.exponent.value, BETA_RANGE[0]), BETA_RANGE[1]);
    const ng = Math.min(Math.max(fc.exponent.value, GAMMA_RANGE[0]), GAMMA_RANGE[1]);
    const nTc = combine(fm.Tc, fc.Tc).value;
    const change = Math.max(Math.abs(nb - beta), Math.abs(ng - gamma), Math.abs(nTc - Tc) / Math.abs(Tc));
    beta = nb;
    gamma = ng;
    Tc = nTc;
    history.push({ beta, gamma, Tc });
    lines = isothermLines(isotherms, beta, gamma, region);
    if (change < tol) {
      converged = true;
      reason = msg('sweeps.map.converged', 'The exponents and Tc changed by less than %1 (relative for Tc) in the last step.', { value: tol, digits: 2 });
      break;
    }
  }
  return { beta, gamma, Tc, lines, MsFit, chiFit, history, iterations: Math.min(it, maxIt), converged, reason, cause, region, tMin, tMax, startNote };
}

/** Runs the modified Arrott iteration on a set. */
export function modifiedArrottIteration(set: IIsothermSet, options: IModifiedArrottOptions = {}): IModifiedArrottResult {
  validateWindow(options.region, options.tMax);
  if (options.start !== undefined && !(options.start.beta > 0 && options.start.gamma > 0)) {
    throw new SweepInputError(msg('sweeps.trial-exponents', 'The trial exponents must be above 0, but β = %1 and γ = %2.', options.start.beta, options.start.gamma));
  }
  const sel = selectBranch(set, options.branch);
  const warnings = setWarnings(set).concat(sel.warnings);
  const r = iterateModifiedArrott(sel.isotherms, options);
  const nan: IValueSigma = { value: NaN, sigma: NaN };
  const fm = r.MsFit;
  const fc = r.chiFit;
  const beta = fm ? fm.exponent : nan;
  const gamma = fc ? fc.exponent : nan;
  const delta = {
    value: 1 + gamma.value / beta.value,
    sigma: Math.sqrt((gamma.sigma / beta.value) ** 2 + ((gamma.value * beta.sigma) / (beta.value * beta.value)) ** 2)
  };
  const TcFromMs = fm ? fm.Tc : nan;
  const TcFromChi = fc ? fc.Tc : nan;
  if (Number.isFinite(TcFromMs.value) && Number.isFinite(TcFromChi.value)) {
    const s = Math.hypot(TcFromMs.sigma, TcFromChi.sigma);
    if (Math.abs(TcFromMs.value - TcFromChi.value) > 3 * s) {
      warnings.push(
        msg('sweeps.map.tc-disagree', 'Tc from Ms(T) (%1 K) and Tc from 1/χ0(T) (%2 K) differ by more than 3σ.', { value: TcFromMs.value, digits: 6 }, { value: TcFromChi.value, digits: 6 })
      );
    }
  }
  if (r.startNote !== null) {
    warnings.push(r.startNote);
  }
  if (!r.converged) {
    warnings.push(r.reason);
    if (r.cause !== null) {
      warnings.push(r.cause);
    }
  }
  const pts = windowPoints(r.lines, r.Tc, r.tMin, r.tMax);
  if (pts.ms.length < 4 || pts.chi.length < 4) {
    warnings.push(
      msg(
        'sweeps.map.few-in-window',
        'Too few isotherms in the window |t| ≤ %1: %2 below and %3 above Tc, where 4 or more on each side are advisable.',
        r.tMax,
        pts.ms.length,
        pts.chi.length
      )
    );
  }
  if (fm && Number.isFinite(fm.correlationTcExponent)) {
    warnings.push(tcBetaCorrelated(fm.correlationTcExponent));
  }
  const notes = [
    msg('sweeps.convention.modified-arrott', 'Modified Arrott plot: M^(1/β) against (H/M)^(1/γ); Ms = c0^β and 1/χ0 = (−c0/c1)^γ.'),
    msg('sweeps.convention.power-laws', 'Power laws Ms = M0(−t)^β and 1/χ0 = G·t^γ fitted with Tc free over %1 ≤ |t| ≤ %2.', r.tMin, r.tMax)
  ];
  return {
    beta,
    gamma,
    deltaWidom: delta,
    Tc: combine(TcFromMs, TcFromChi),
    TcFromMs,
    TcFromChi,
    TcCrossing: interceptCrossing(r.lines),
    MsFit: fm ?? fitCriticalPower([], [], 'below', { Tc: NaN, exponent: NaN }),
    chiFit: fc ?? fitCriticalPower([], [], 'above', { Tc: NaN, exponent: NaN }),
    lines: r.lines,
    spontaneous: pts.ms,
    inverseChi: pts.chi,
    history: r.history,
    iterations: r.iterations,
    converged: r.converged,
    reason: r.reason,
    conventions: conventionsOf(set, notes),
    warnings
  };
}
