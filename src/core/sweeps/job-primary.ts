/**
 * The primary result of the isotherm analysis: the global equation-of-state
 * fit [B6 in REFERENCES.md] from a start that does not need the modified
 * Arrott iteration to succeed. Trial exponents of four universality classes
 * [C2 in REFERENCES.md] are combined with trial Tc (the Arrott intercepts'
 * sign change, the iteration's Tc when it converges, and the Tc of the
 * linearised equation of state), with T1 and M1 from the data; the starts of
 * lowest cost are fitted on a thinned copy of the data, and the best of those
 * is fitted on every point.
 */
import { msg } from '../messages';
import type { ICoreMessage } from '../messages';
import { UNIVERSALITY_CLASSES } from '../physics/universality';
import type { IArrottResult } from './arrott';
import type { IEquationOfStateStart, IGlobalFit, IGlobalFitHooks } from './global';
import { fitEquationOfState } from './global';
import type { IGlobalResult } from './eos';
import type { IStartCandidate, ITrialExponents, StartTcSource } from './eos-start';
import { equationOfStateCandidates } from './eos-start';
import type { IEquationOfStateVerdict } from './eos-verdict';
import { equationOfStateVerdict } from './eos-verdict';
import { iterateModifiedArrott, tcBetaCorrelated } from './map';
import type { IIsotherm, IIsothermSet } from './types';
import { conventionsOf, setWarnings } from './types';

/** Classes whose exponents are tried as starts. */
const TRIAL_CLASSES = ['mean-field', '3d-ising', '3d-xy', '3d-heisenberg'];

/** Trial exponents from the universality table. */
export function trialExponents(): ITrialExponents[] {
  return TRIAL_CLASSES.map(id => UNIVERSALITY_CLASSES.find(c => c.id === id))
    .filter(c => c !== undefined)
    .map(c => ({ name: c.name, beta: c.beta.value, gamma: c.gamma.value }));
}

/** |r| of Tc and β from which the report says to quote them together. */
const STRONG_CORRELATION = 0.5;
/** Starts fitted on the thinned data. */
const SCREENED = 3;
/** Points of the thinned copy the iteration proposing a Tc runs on (about). */
const ITERATION_POINTS = 3000;
/** Points of the thinned copy (about). */
const SCREEN_POINTS = 1000;

/** Every `stride`-th point of each isotherm. */
export function thinned(isotherms: readonly IIsotherm[], maxPoints: number): IIsotherm[] {
  let total = 0;
  for (const i of isotherms) {
    total += i.H.length;
  }
  const stride = Math.max(1, Math.floor(total / maxPoints));
  if (stride === 1) {
    return isotherms.slice();
  }
  return isotherms.map(iso => {
    const keep: number[] = [];
    for (let i = iso.H.length - 1; i >= 0; i -= stride) {
      keep.unshift(i);
    }
    return { ...iso, H: Float64Array.from(keep, i => iso.H[i]), M: Float64Array.from(keep, i => iso.M[i]), rows: [] };
  });
}

/** The primary fit with what it took to get it. */
export interface IPrimaryFit {
  global: IGlobalResult;
  verdict: IEquationOfStateVerdict;
  startMessage: ICoreMessage;
  /** Start of the full fit (its window is centred on start.Tc). */
  start: IEquationOfStateStart | null;
}

function startMessage(c: IStartCandidate, tried: number): ICoreMessage {
  const args = [c.exponents.name, c.exponents.beta, c.exponents.gamma, { value: c.start.Tc, digits: 6 }, tried] as const;
  const byTc: Record<StartTcSource, () => ICoreMessage> = {
    arrott: () => msg('sweeps.start.arrott', 'Started from the %1 exponents (β = %2, γ = %3) and Tc = %4 K where the Arrott intercepts change sign: the best of %5 trial starts.', ...args),
    iteration: () => msg('sweeps.start.iteration', 'Started from the %1 exponents (β = %2, γ = %3) and Tc = %4 K of the modified Arrott iteration: the best of %5 trial starts.', ...args),
    data: () => msg('sweeps.start.data', 'Started from the %1 exponents (β = %2, γ = %3) and Tc = %4 K from the linearised equation of state: the best of %5 trial starts.', ...args),
    middle: () => msg('sweeps.start.middle', 'Started from the %1 exponents (β = %2, γ = %3) and Tc = %4 K, the middle of the isotherms’ temperatures: the best of %5 trial starts.', ...args)
  };
  return byTc[c.tcSource]();
}

/** Runs the multi-start global fit on the set's isotherms within |t| ≤ tMax. */
export function primaryFit(set: IIsothermSet, arrott: IArrottResult, tMax: number, hooks: IGlobalFitHooks & { onStep?: (fraction: number) => void } = {}): IPrimaryFit {
  const iso = set.isotherms;
  const stop = (): boolean => hooks.shouldStop?.() === true;
  const tcs: { Tc: number; source: StartTcSource }[] = [];
  if (arrott.TcCrossing.converged && Number.isFinite(arrott.Tc.value)) {
    tcs.push({ Tc: arrott.Tc.value, source: 'arrott' });
  }
  // the iteration only proposes a Tc here: a thinned copy of the data is enough
  const it = iterateModifiedArrott(thinned(iso, ITERATION_POINTS), { tMax, maxIterations: 30 });
  if (it.converged && Number.isFinite(it.Tc)) {
    tcs.push({ Tc: it.Tc, source: 'iteration' });
  }
  const temps = iso.map(i => i.T).sort((a, b) => a - b);
  if (temps.length > 0) {
    tcs.push({ Tc: temps[Math.floor(temps.length / 2)], source: 'middle' });
  }
  hooks.onStep?.(0.2);
  const candidates = equationOfStateCandidates(iso, trialExponents(), tcs, tMax, stop);
  hooks.onStep?.(0.35);
  const notes = [
    msg('sweeps.convention.equation-of-state', 'Arrott–Noakes equation of state (H/M)^(1/γ) = (T − Tc)/T1 + (M/M1)^(1/β), fitted to ln M of every point.'),
    msg('sweeps.convention.eos-window', 'Window: |t| ≤ %1 around the starting Tc, and H ≥ %2 A/m.', tMax, 0)
  ];
  const warnings = setWarnings(set);
  const nan = { value: NaN, sigma: NaN };
  if (candidates.length === 0) {
    const none = msg('sweeps.start.none', 'No trial start of the global fit could be evaluated: no exponents and Tc gave positive T1 and M1 from the data.');
    const fit: IGlobalFit = { Tc: nan, beta: nan, gamma: nan, T1: nan, M1: nan, delta: nan, correlationTcBeta: NaN, n: 0, converged: false, reason: none, fit: null };
    return {
      global: { ...fit, start: null, conventions: conventionsOf(set, notes), warnings: [...warnings, none] },
      verdict: equationOfStateVerdict(iso, fit, NaN, { tMax }),
      startMessage: none,
      start: null
    };
  }
  // fit the best few starts on a thinned copy; keep the one of lowest mean squared residual
  const thin = thinned(iso, SCREEN_POINTS);
  let best: { candidate: IStartCandidate; from: IEquationOfStateStart; cost: number } | null = null;
  const screened = candidates.slice(0, SCREENED);
  for (let k = 0; k < screened.length && !stop(); k++) {
    const c = screened[k];
    const g = fitEquationOfState(thin, c.start, { tMax }, { shouldStop: hooks.shouldStop });
    const cost = g.fit !== null && g.n > 0 ? g.fit.chi2 / g.n : Infinity;
    const ok = g.fit !== null && Number.isFinite(g.Tc.value) && Number.isFinite(cost);
    const from = ok ? { Tc: g.Tc.value, beta: g.beta.value, gamma: g.gamma.value, T1: g.T1.value, M1: g.M1.value } : c.start;
    const score = ok ? cost : c.cost;
    if (best === null || score < best.cost) {
      best = { candidate: c, from, cost: score };
    }
    hooks.onStep?.(0.35 + (0.3 * (k + 1)) / screened.length);
  }
  const chosen = best ?? { candidate: candidates[0], from: candidates[0].start, cost: candidates[0].cost };
  const g = fitEquationOfState(iso, chosen.from, { tMax }, { shouldStop: hooks.shouldStop, onProgress: () => hooks.onStep?.(0.8) });
  hooks.onStep?.(1);
  if (!g.converged) {
    warnings.push(msg('sweeps.eos.not-converged', 'The global fit of the equation of state did not converge.'), g.reason);
  }
  if (Math.abs(g.correlationTcBeta) >= STRONG_CORRELATION) {
    warnings.push(tcBetaCorrelated(g.correlationTcBeta));
  }
  const global: IGlobalResult = { ...g, start: chosen.from, conventions: conventionsOf(set, notes), warnings: warnings.concat(g.fit?.warnings ?? []) };
  return {
    global,
    verdict: equationOfStateVerdict(iso, g, chosen.from.Tc, { tMax }),
    startMessage: startMessage(chosen.candidate, candidates.length),
    start: chosen.from
  };
}
