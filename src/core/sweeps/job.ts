/**
 * The isotherm (field-sweep) analysis as one job: the table read with the
 * controls, the global equation-of-state fit as the primary result, the
 * modified Arrott iteration, Kouvel–Fisher, the critical isotherm and the
 * scaling collapse as cross-checks started from it, and the data of every
 * view. The report holds plain data and typed arrays only, so it can be
 * posted from a worker.
 */
import { CoreMessageError, messageOf, msg } from '../messages';
import type { ICoreMessage } from '../messages';
import { arrottAnalysis } from './arrott';
import { agreementOf } from './agreement';
import type { IBootstrapResult } from './bootstrap';
import { bootstrapModifiedArrott } from './bootstrap';
import { drawableArrott, drawableBanerjee, drawableEntropy, drawableKouvelFisher, drawableModifiedArrott, drawableWindow } from './chart-safe';
import type { ICollapseResult } from './collapse';
import { scalingCollapse } from './collapse';
import type { ICriticalIsothermResult } from './critical';
import { criticalIsotherm, scalingChecks } from './critical';
import type { IGlobalResult } from './eos';
import type { IEntropyResult } from './entropy';
import { magneticEntropyChange } from './entropy';
import { checkControls, readIsothermTable } from './job-controls';
import { selectPoints } from './job-points';
import { primaryFit } from './job-primary';
import type { IIsothermJob, IIsothermJobHooks, IIsothermReport, IsothermJobAnswer, IsothermStage, ICrossCheck } from './job-types';
import { mergeWarnings } from './job-warnings';
import { globalWindowScan } from './job-window';
import type { IKouvelFisherResult } from './kouvel';
import { kouvelFisher } from './kouvel';
import { isothermLines } from './lines';
import type { IModifiedArrottResult } from './map';
import { modifiedArrottIteration, windowPoints } from './map';
import { selectBranch } from './sets';
import type { IIsotherm, IIsothermSet, IValueSigma } from './types';
import { setWarnings } from './types';
import type { IExponentWindowScan } from './window';

/** Fewest isotherms the analysis accepts (Tc needs isotherms on both sides, with one near it). */
export const MIN_ISOTHERMS = 3;

/** Fraction of the whole job at which each stage starts. */
export const STAGE_START: Readonly<Record<IsothermStage, number>> = Object.freeze({
  grouping: 0,
  global: 0.05,
  'cross-checks': 0.4,
  collapse: 0.55,
  window: 0.65,
  entropy: 0.85,
  bootstrap: 0.88
});

/**
 * The collapse search starts at the primary result with first steps of 20σ
 * of the primary values (at least 1e-5·Tc, 1e-3 in β, 2e-3 in γ; the simplex
 * expands when the minimum lies farther) and stops when the cost's spread
 * over the simplex is within 1e-9 of its value and the simplex within 1e-3
 * of those steps, i.e. about σ/50.
 */
const COLLAPSE_TOLERANCE = { cost: 1e-9, size: 1e-3 };

function collapseSteps(P: IPrimaryValues): [number, number, number] {
  const s = (v: IValueSigma, floor: number): number => (Number.isFinite(v.sigma) ? Math.max(20 * v.sigma, floor) : 10 * floor);
  return [s(P.Tc, 1e-5 * P.Tc.value), s(P.beta, 1e-3), s(P.gamma, 2e-3)];
}

/** Thrown inside the job when shouldStop says so. */
class Stopped extends Error {}

const finiteValue = (v: IValueSigma): boolean => Number.isFinite(v.value);

function isColumn(c: unknown): boolean {
  const v = (c as { values?: unknown } | null)?.values;
  return typeof c === 'object' && c !== null && (Array.isArray(v) || v instanceof Float64Array);
}

/** Runs the isotherm analysis; never throws for bad input (refusals are answers). */
export function runIsothermJob(job: IIsothermJob, hooks: IIsothermJobHooks = {}): IsothermJobAnswer {
  try {
    return run(job, hooks);
  } catch (e) {
    if (e instanceof Stopped) {
      return { status: 'cancelled' };
    }
    if (e instanceof CoreMessageError) {
      return { status: 'refused', message: e.detail };
    }
    throw e;
  }
}

function run(job: IIsothermJob, hooks: IIsothermJobHooks): IsothermJobAnswer {
  const stopped = (): boolean => hooks.shouldStop?.() === true;
  const check = (): void => {
    if (stopped()) {
      throw new Stopped();
    }
  };
  const stage = (s: IsothermStage, within = 0, next?: IsothermStage): void => {
    check();
    const a = STAGE_START[s];
    const b = next !== undefined ? STAGE_START[next] : 1;
    hooks.onProgress?.(s, Math.min(1, a + within * (b - a)));
  };

  // 1. the table and the controls
  stage('grouping');
  if (typeof job !== 'object' || job === null || !isColumn(job.temperature) || !isColumn(job.field) || !isColumn(job.magnetisation) || typeof job.controls !== 'object' || job.controls === null) {
    return { status: 'refused', message: msg('sweeps.job.malformed', 'The analysis needs three columns of numbers (temperature, field, magnetisation) and its controls.') };
  }
  const bad = checkControls(job.controls);
  if (bad !== null) {
    return bad;
  }
  const read = readIsothermTable(job);
  if ('status' in read) {
    return read;
  }
  const controls = read.controls;
  const tMax = controls.tMax;
  const rows = job.temperature.values.length;
  const picked = selectPoints(read.set, rows, controls.demagSI, controls.hAppliedMin, controls.hAppliedMax);
  const branch = selectBranch(picked.set);
  const set: IIsothermSet = { ...picked.set, isotherms: branch.isotherms };
  const iso = set.isotherms;
  if (iso.length < MIN_ISOTHERMS) {
    if (picked.demagDropped > 0) {
      return {
        status: 'refused',
        message: msg(
          'sweeps.job.demag-nothing-left',
          'With N_d = %1 (SI) the internal field H_a − N_d·M is zero or negative at so many points that fewer than %2 isotherms are left. Check N_d and its convention (SI: 0 to 1; cgs: 0 to 4π).',
          { value: controls.demagSI ?? NaN, digits: 4 },
          MIN_ISOTHERMS
        )
      };
    }
    return {
      status: 'refused',
      message:
        iso.length === 0
          ? msg('sweeps.job.no-points', 'No row has a finite temperature, a field above 0 within the range and a finite magnetisation: there is nothing to analyse.')
          : msg('sweeps.job.few-isotherms', 'The table gives %1 isotherms with usable points, but the analysis needs at least %2 (Tc must lie between isotherms).', iso.length, MIN_ISOTHERMS)
    };
  }
  stage('grouping', 0.5, 'global');
  const arrott = arrottAnalysis(set);

  // 2. the primary result
  stage('global');
  const primary = primaryFit(set, arrott, tMax, {
    shouldStop: hooks.shouldStop,
    onStep: f => {
      check();
      hooks.onProgress?.('global', STAGE_START.global + f * (STAGE_START['cross-checks'] - STAGE_START.global));
    }
  });
  check();
  const g = primary.global;
  const P = primaryValues(g);

  // 3. cross-checks from the primary result
  stage('cross-checks');
  const modifiedArrott = crossCheckModifiedArrott(set, P, tMax);
  stage('cross-checks', 0.3, 'collapse');
  const kf = crossCheckKouvelFisher(iso, P, tMax, modifiedArrott.result);
  stage('cross-checks', 0.5, 'collapse');
  const crit = crossCheckCriticalIsotherm(iso, P);
  const checks = scalingChecks({
    beta: finiteValue(g.beta) ? { value: g.beta.value, error: g.beta.sigma } : undefined,
    gamma: finiteValue(g.gamma) ? { value: g.gamma.value, error: g.gamma.sigma } : undefined,
    delta: crit.result !== null && finiteValue(crit.result.delta) ? { value: crit.result.delta.value, error: crit.result.delta.sigma } : undefined
  });

  // 4. the scaling collapse from the primary result
  stage('collapse');
  const collapse = crossCheckCollapse(iso, P, tMax);

  // 5. exponents against the window
  stage('window');
  let window: IExponentWindowScan | null = null;
  let windowLeft = 0;
  if (primary.start !== null && P.ok) {
    const scan = globalWindowScan(set, { Tc: P.Tc.value, beta: P.beta.value, gamma: P.gamma.value, T1: g.T1.value, M1: g.M1.value }, tMax, {
      shouldStop: hooks.shouldStop,
      whole: { fit: g, Tc: primary.start.Tc },
      onCell: (done, total) => stage('window', done / total, 'entropy')
    });
    check();
    const d = drawableWindow(scan);
    window = d.scan;
    windowLeft = d.left;
  }

  // 6. ΔS_M for field changes every isotherm reaches
  stage('entropy');
  let entropy: IEntropyResult | null = null;
  let hTop = Infinity;
  for (const i of iso) {
    hTop = Math.min(hTop, i.H[i.H.length - 1]);
  }
  if (hTop > 0 && Number.isFinite(hTop)) {
    entropy = drawableEntropy(magneticEntropyChange(set, [0.25 * hTop, 0.5 * hTop, hTop]));
  }

  // 7. bootstrap over isotherms
  let bootstrap: IBootstrapResult | null = null;
  if (controls.bootstrapSamples > 0) {
    stage('bootstrap');
    const samples = controls.bootstrapSamples;
    bootstrap = bootstrapModifiedArrott(set, {
      samples,
      seed: 1,
      tMax,
      start: P.ok ? { beta: P.beta.value, gamma: P.gamma.value } : undefined,
      shouldStop: hooks.shouldStop,
      onSample: k => hooks.onProgress?.('bootstrap', STAGE_START.bootstrap + (k / samples) * (1 - STAGE_START.bootstrap))
    });
    check();
  }

  const warnings = mergeWarnings([
    ...setWarnings(set),
    ...branch.warnings,
    ...picked.warnings,
    ...g.warnings,
    ...arrott.warnings,
    ...(modifiedArrott.result?.warnings ?? []),
    ...(kf.result?.warnings ?? []),
    ...(crit.result?.warnings ?? []),
    ...(collapse.result?.warnings ?? []),
    ...(entropy?.warnings ?? []),
    ...(entropy?.curves.flatMap(c => c.warnings) ?? []),
    ...(windowLeft > 0 ? [msg('sweeps.job.window-cells-left', '%1 cells of the window scan gave no exponents and are not shown.', windowLeft)] : [])
  ]);
  const conventions: ICoreMessage[] = [
    ...set.conventions,
    ...picked.conventions,
    ...g.conventions.notes,
    msg('sweeps.convention.verdict', 'Verdict: χ²_red of the ln M residuals with the noise of ln M estimated on each isotherm from second differences along the field.'),
    msg('sweeps.convention.cross-checks', 'Cross-checks start from the primary result and agree when every compared value lies within 2σ (σ combined in quadrature).'),
    msg('sweeps.convention.critical-sigma', 'σ of the critical-isotherm δ includes the change of δ when Tc moves by ±σ(Tc).'),
    ...(window?.conventions.notes ?? []),
    ...(entropy?.conventions.notes ?? [])
  ];
  const report: IIsothermReport = {
    set,
    fieldUse: picked.fieldUse,
    tMax,
    primary: {
      fit: g,
      covariance: g.fit !== null ? g.fit.covariance.map(r => r.slice()) : null,
      verdict: { state: primary.verdict.state, message: primary.verdict.message },
      start: primary.startMessage
    },
    modifiedArrott: { ...modifiedArrott, result: modifiedArrott.result !== null ? drawableModifiedArrott(modifiedArrott.result) : null },
    kouvelFisher: { ...kf, result: kf.result !== null ? drawableKouvelFisher(kf.result) : null },
    criticalIsotherm: crit,
    collapse,
    arrott: drawableArrott(arrott),
    banerjee: drawableBanerjee(arrott.banerjee),
    checks,
    window,
    entropy,
    bootstrap,
    summary: { Tc: g.Tc, beta: g.beta, gamma: g.gamma, delta: g.delta },
    warnings,
    conventions: mergeConventions(conventions)
  };
  hooks.onProgress?.(bootstrap !== null ? 'bootstrap' : 'entropy', 1);
  return { status: 'ok', report };
}

function mergeConventions(list: readonly ICoreMessage[]): ICoreMessage[] {
  const seen = new Set<string>();
  return list.filter(m => {
    const key = `${m.code}\u0000${JSON.stringify(m.args)}`;
    if (seen.has(key)) {
      return false;
    }
    seen.add(key);
    return true;
  });
}

/** The primary values the cross-checks start from. */
export interface IPrimaryValues {
  ok: boolean;
  Tc: IValueSigma;
  beta: IValueSigma;
  gamma: IValueSigma;
  delta: IValueSigma;
}

function primaryValues(g: IGlobalResult): IPrimaryValues {
  const ok = [g.Tc, g.beta, g.gamma, g.T1, g.M1].every(v => Number.isFinite(v.value)) && g.beta.value > 0 && g.gamma.value > 0;
  return { ok, Tc: g.Tc, beta: g.beta, gamma: g.gamma, delta: g.delta };
}

function noPrimary<T>(): ICrossCheck<T> {
  return {
    result: null,
    agreement: { state: 'no-result', message: msg('sweeps.agree.no-primary', 'The global fit gave no result, so there is nothing to start from or compare with.') }
  };
}

function failed<T>(e: unknown): ICrossCheck<T> {
  if (e instanceof Stopped) {
    throw e;
  }
  const detail = messageOf(e);
  return { result: null, agreement: { state: 'no-result', message: msg('sweeps.agree.failed', 'The method stopped with an error, so it gives no result.'), detail } };
}

function crossCheckModifiedArrott(set: IIsothermSet, P: IPrimaryValues, tMax: number): ICrossCheck<IModifiedArrottResult> {
  if (!P.ok) {
    return noPrimary();
  }
  try {
    const r = modifiedArrottIteration(set, { tMax, start: { beta: P.beta.value, gamma: P.gamma.value } });
    const agreement = agreementOf(
      [
        { name: 'Tc', value: r.Tc, primary: P.Tc },
        { name: 'β', value: r.beta, primary: P.beta },
        { name: 'γ', value: r.gamma, primary: P.gamma }
      ],
      r.converged ? undefined : r.reason
    );
    return { result: r, agreement };
  } catch (e) {
    return failed(e);
  }
}

function crossCheckKouvelFisher(iso: readonly IIsotherm[], P: IPrimaryValues, tMax: number, map: IModifiedArrottResult | null): ICrossCheck<IKouvelFisherResult> {
  if (!P.ok) {
    return noPrimary();
  }
  try {
    // Ms(T) and 1/χ0(T) of the iteration when it has them, else of the lines at the primary exponents
    let ms = map?.spontaneous ?? [];
    let chi = map?.inverseChi ?? [];
    if (ms.length < 3 || chi.length < 3 || map === null || !finiteValue(map.beta)) {
      const pts = windowPoints(isothermLines(iso, P.beta.value, P.gamma.value, {}), P.Tc.value, 0, tMax);
      ms = pts.ms;
      chi = pts.chi;
    }
    const r = kouvelFisher(ms, chi, 5, { below: 1 / P.beta.value, above: 1 / P.gamma.value });
    const detail = !finiteValue(r.below.exponent) ? r.below.reason : !finiteValue(r.above.exponent) ? r.above.reason : undefined;
    const agreement = agreementOf(
      [
        { name: 'Tc', value: r.Tc, primary: P.Tc },
        { name: 'β', value: r.below.exponent, primary: P.beta },
        { name: 'γ', value: r.above.exponent, primary: P.gamma }
      ],
      detail
    );
    return { result: r, agreement };
  } catch (e) {
    return failed(e);
  }
}

function crossCheckCriticalIsotherm(iso: readonly IIsotherm[], P: IPrimaryValues): ICrossCheck<ICriticalIsothermResult> {
  if (!P.ok) {
    return noPrimary();
  }
  try {
    const r = criticalIsotherm(iso, P.Tc.value);
    let delta = r.delta;
    if (finiteValue(delta) && Number.isFinite(P.Tc.sigma) && P.Tc.sigma > 0) {
      // the σ of Tc moves the critical isotherm: add the change of δ over Tc ± σ(Tc) in quadrature
      const up = criticalIsotherm(iso, P.Tc.value + P.Tc.sigma).delta.value;
      const down = criticalIsotherm(iso, P.Tc.value - P.Tc.sigma).delta.value;
      const spread = Number.isFinite(up) && Number.isFinite(down) ? Math.abs(up - down) / 2 : NaN;
      delta = { value: delta.value, sigma: Number.isFinite(spread) ? Math.hypot(delta.sigma, spread) : delta.sigma };
    }
    const result = { ...r, delta };
    const agreement = agreementOf([{ name: 'δ', value: delta, primary: P.delta }], finiteValue(delta) ? undefined : r.warnings[0]);
    return { result, agreement };
  } catch (e) {
    return failed(e);
  }
}

function crossCheckCollapse(iso: readonly IIsotherm[], P: IPrimaryValues, tMax: number): ICrossCheck<ICollapseResult> {
  if (!P.ok) {
    return noPrimary();
  }
  try {
    const r = scalingCollapse(iso, { Tc: P.Tc.value, beta: P.beta.value, gamma: P.gamma.value }, { tMax, tolerance: COLLAPSE_TOLERANCE, steps: collapseSteps(P) });
    const agreement = agreementOf(
      [
        { name: 'Tc', value: r.Tc, primary: P.Tc },
        { name: 'β', value: r.beta, primary: P.beta },
        { name: 'γ', value: r.gamma, primary: P.gamma }
      ],
      r.converged ? undefined : r.reason
    );
    return { result: r, agreement };
  } catch (e) {
    return failed(e);
  }
}

