/**
 * Model comparison: every kind of the catalogue that applies to an x–y job,
 * fitted to the same window points with the same weights, ranked by AICc
 * with Akaike weights [N13 in REFERENCES.md; weights: K. P. Burnham &
 * D. R. Anderson, "Model Selection and Multimodel Inference", 2nd ed.,
 * Springer 2002].
 *
 * Candidates: the critical power law (the job's proxy option, else the
 * default), the same with Wegner's correction, Weiss mean field for
 * J ∈ {½, 1, 3/2, 2, 5/2, 7/2, ∞} and with J fitted, Landau, Bean–Rodbell
 * when the catalogue has it, and Curie–Weiss when the data look like a
 * susceptibility above an ordering temperature: every y > 0, y falling with
 * T (Spearman rank correlation ≤ −0.9) and convex in T (the quadratic
 * least-squares fit of y on T curves upwards). An ordered M(T) is concave
 * below Tc and reaches (near) zero above it, so it fails this rule; a
 * Curie–Weiss χ(T) passes it. Each candidate runs through runAnalysisJob,
 * so each has its verdict.
 *
 * Criteria, the same convention for all: with the σ column or relative
 * weights with f given, known σ (AIC = χ² + 2k); otherwise the variance
 * scale is profiled (AIC = n ln(S/n) + 2k, S = Σ r² for equal weights and
 * Σ (r/y)² for relative weights with f estimated, the common Σ ln|y| term
 * left out); AICc = AIC + 2k(k + 1)/(n − k − 1), BIC with k ln n; k free
 * parameters, n the window's points, the same for every model. Residuals
 * are y − model at the window points: Landau, fitted as T against ψ, is
 * scored on the y-residuals of its equilibrium ψ(T), which that fit did not
 * minimise, so its criteria are upper bounds.
 */
import { informationCriteria } from '../fit/statistics';
import { messageOf, messageText, msg } from '../messages';
import type { ICoreMessage } from '../messages';
import { landauEquilibriumPsi } from '../physics/landau';
import type { IValueSigma } from '../sweeps/types';
import { AnalysisInputError } from './errors';
import { defaultOptions, kindById } from './kinds';
import { requireDistinctX } from './kinds/common';
import type { OptionValue } from './kinds/types';
import { freeCount, runAnalysisJob } from './run';
import type { IComparedModel, IModelComparison, ITaskHooks } from './tasks-types';
import type { IAnalysisJob, IAnalysisOutcome } from './types';
import { resolveWeights, spearman } from './weights';
import { windowedPoints } from './window';

/** The spins of the fixed-J Weiss candidates. */
export const COMPARED_SPINS = [0.5, 1, 1.5, 2, 2.5, 3.5, Infinity] as const;

/** Fewest window points a comparison runs with (the smallest need of its candidates). */
export const COMPARE_MIN_POINTS = 4;

/** Spearman correlation of y with T at or below which y counts as falling (common practice, no source). */
export const SUSCEPTIBILITY_FALLING = -0.9;

interface ICandidate {
  kind: string;
  options: Record<string, OptionValue>;
  label: ICoreMessage;
}

/** J as a fraction for labels: 5/2, 2, ∞. */
export function spinText(J: number): string {
  return J === Infinity ? '∞' : J % 1 === 0 ? String(J) : `${2 * J}/2`;
}

/** Coefficient of T² of the least-squares quadratic through the points (T centred and scaled). */
function quadraticCurvature(x: ArrayLike<number>, y: ArrayLike<number>): number {
  const n = x.length;
  let mean = 0;
  let min = Infinity;
  let max = -Infinity;
  for (let i = 0; i < n; i++) {
    mean += x[i];
    min = Math.min(min, x[i]);
    max = Math.max(max, x[i]);
  }
  mean /= n;
  const half = (max - min) / 2 || 1;
  // normal equations of y = a + b u + c u², u ∈ [−1, 1]
  const s = new Array<number>(5).fill(0);
  const t = new Array<number>(3).fill(0);
  for (let i = 0; i < n; i++) {
    const u = (x[i] - mean) / half;
    let p = 1;
    for (let j = 0; j < 5; j++) {
      s[j] += p;
      if (j < 3) {
        t[j] += p * y[i];
      }
      p *= u;
    }
  }
  const m = [
    [s[0], s[1], s[2], t[0]],
    [s[1], s[2], s[3], t[1]],
    [s[2], s[3], s[4], t[2]]
  ];
  for (let c = 0; c < 3; c++) {
    let piv = c;
    for (let r = c + 1; r < 3; r++) {
      if (Math.abs(m[r][c]) > Math.abs(m[piv][c])) {
        piv = r;
      }
    }
    [m[c], m[piv]] = [m[piv], m[c]];
    if (m[c][c] === 0) {
      return Number.NaN;
    }
    for (let r = c + 1; r < 3; r++) {
      const f = m[r][c] / m[c][c];
      for (let k = c; k < 4; k++) {
        m[r][k] -= f * m[c][k];
      }
    }
  }
  return m[2][3] / m[2][2];
}

/**
 * Whether the points look like a susceptibility above an ordering
 * temperature: every y > 0, falling with T (Spearman ≤ {@link SUSCEPTIBILITY_FALLING})
 * and convex (see the module comment).
 */
export function looksLikeSusceptibility(x: ArrayLike<number>, y: ArrayLike<number>): boolean {
  if (x.length < 5) {
    return false;
  }
  for (let i = 0; i < y.length; i++) {
    if (!(y[i] > 0)) {
      return false;
    }
  }
  return spearman(x, y) <= SUSCEPTIBILITY_FALLING && quadraticCurvature(x, y) > 0;
}

/** The candidates for a job on these points. */
function candidates(job: IAnalysisJob, x: ArrayLike<number>, y: ArrayLike<number>): { list: ICandidate[]; warnings: ICoreMessage[] } {
  const list: ICandidate[] = [];
  const warnings: ICoreMessage[] = [];
  const add = (kind: string, options: Record<string, OptionValue>, label?: ICoreMessage): void => {
    const entry = kindById(kind);
    if (entry) {
      list.push({ kind, options: { ...defaultOptions(kind), ...options }, label: label ?? entry.label });
    }
  };
  const proxy = job.options.proxyPower;
  const proxyPower = proxy === 1 || proxy === 2 ? proxy : defaultOptions('power-law').proxyPower;
  add('power-law', { proxyPower, background: false });
  add('power-law-corrected', { proxyPower, background: false });
  for (const J of COMPARED_SPINS) {
    add('weiss', { J, freeJ: false }, msg('compare.label.weiss', 'Weiss mean field, J = %1', spinText(J)));
  }
  const startJ = job.kind === 'weiss' && typeof job.options.J === 'number' ? job.options.J : 0.5;
  add('weiss', { J: startJ, freeJ: true }, msg('compare.label.weiss-free', 'Weiss mean field, J fitted'));
  add('landau', {});
  add('bean-rodbell', {});
  if (looksLikeSusceptibility(x, y)) {
    const units = job.options.units === 'SI' ? 'SI' : 'cgs-emu';
    add('curie-weiss', { units });
  } else if (kindById('curie-weiss')) {
    warnings.push(msg('compare.curie-weiss-left-out', 'Curie–Weiss was not compared: the data do not look like a susceptibility above an ordering temperature (every y > 0, falling and convex in T).'));
  }
  return { list, warnings };
}

/** y − model at the window points, or null when the outcome holds no such residuals. */
function windowResiduals(outcome: IAnalysisOutcome, x: readonly number[], y: readonly number[]): ArrayLike<number> | null {
  const n = y.length;
  if (outcome.used === n && outcome.fit.residuals.length === n) {
    return outcome.fit.residuals;
  }
  const k = outcome.landau;
  if (k) {
    let sum = 0;
    for (const v of y) {
      sum += v;
    }
    const sign = sum < 0 ? -1 : 1;
    return y.map((v, i) => v - sign * landauEquilibriumPsi(k, x[i]));
  }
  return null;
}

/**
 * Fit every applicable kind to the job's window points and rank them by
 * AICc (see the module comment). Returns null when cancelled.
 *
 * @throws AnalysisInputError when the window holds too few points or the
 * weights cannot be applied (e.g. relative weights with y = 0).
 */
export function compareModels(job: IAnalysisJob, hooks: ITaskHooks = {}): IModelComparison | null {
  const pts = windowedPoints(job);
  const n = pts.x.length;
  if (n < COMPARE_MIN_POINTS) {
    throw new AnalysisInputError(
      pts.skipped > 0
        ? msg('compare.too-few-points-skipped', 'Comparing models needs at least %1 points in the fit window, but it holds %2 (%3 more were left out for missing or non-finite values). Widen the window.', COMPARE_MIN_POINTS, n, pts.skipped)
        : msg('compare.too-few-points', 'Comparing models needs at least %1 points in the fit window, but it holds %2. Widen the window.', COMPARE_MIN_POINTS, n)
    );
  }
  // Every candidate has at least 2 free parameters: refuse x values that cannot tell them apart.
  requireDistinctX(pts.x, COMPARE_MIN_POINTS - 1);
  const plan = resolveWeights(job, pts);
  const known = plan.mode === 'sigma' || (plan.mode === 'relative' && plan.fraction !== null);
  // The scale each residual is divided by in S (see the module comment).
  const scale: ArrayLike<number> | null = plan.mode === 'sigma' ? pts.sigma ?? null : plan.mode === 'relative' ? plan.sigma ?? null : null;
  const { list, warnings } = candidates(job, pts.x, pts.y);
  if (pts.skipped > 0) {
    warnings.push(msg('compare.skipped', '%1 points in the window were left out of every fit for missing or non-finite values.', pts.skipped));
  }
  const stop = (): boolean => hooks.shouldStop?.() === true;
  const models: IComparedModel[] = [];
  let landauScored = false;
  for (let c = 0; c < list.length; c++) {
    if (stop()) {
      return null;
    }
    const cand = list[c];
    const base = { kind: cand.kind, options: cand.options, label: cand.label, n };
    try {
      const out = runAnalysisJob({ ...job, kind: cand.kind, options: cand.options }, { shouldStop: hooks.shouldStop }, { residualCheck: false });
      if (stop()) {
        return null;
      }
      // A fitted spin held at the classical limit (`fitWeissMT`) was still searched: it counts.
      const k = cand.kind === 'weiss' && cand.options.freeJ === true ? out.fit.parameters.length : freeCount(out.fit.fixed);
      const r = windowResiduals(out, pts.x, pts.y);
      const values: Record<string, IValueSigma> = {};
      for (const d of out.derived) {
        values[d.name] = { value: d.value, sigma: d.sigma };
      }
      out.fit.parameters.forEach((p, i) => {
        if (!(p in values)) {
          values[p] = { value: out.fit.values[i], sigma: out.fit.standardErrors[i] };
        }
      });
      if (r === null) {
        models.push({
          ...base,
          k,
          chi2: Number.NaN,
          reducedChi2: Number.NaN,
          aic: Number.NaN,
          aicc: Number.NaN,
          bic: Number.NaN,
          weight: 0,
          deltaAicc: Number.NaN,
          converged: false,
          verdict: out.verdict.state,
          values,
          note: msg('compare.not-comparable', 'Not compared: this analysis fits other quantities than y at the window points.')
        });
        continue;
      }
      let chi2 = 0;
      for (let i = 0; i < n; i++) {
        chi2 += (r[i] / (scale ? scale[i] : 1)) ** 2;
      }
      const ic = informationCriteria(chi2, n, k, known);
      const converged = out.fit.converged && Number.isFinite(chi2) && Number.isFinite(ic.aicc);
      landauScored ||= out.landau !== undefined && converged;
      models.push({
        ...base,
        k,
        chi2,
        reducedChi2: n > k ? chi2 / (n - k) : Number.NaN,
        ...ic,
        weight: 0,
        deltaAicc: Number.NaN,
        converged,
        verdict: out.verdict.state,
        values,
        note: converged ? null : out.fit.converged ? msg('compare.criteria-not-finite', 'Not ranked: its information criteria are not finite (%1 points, %2 parameters).', n, k) : out.fit.reason
      });
    } catch (e) {
      models.push({
        ...base,
        k: 0,
        chi2: Number.NaN,
        reducedChi2: Number.NaN,
        aic: Number.NaN,
        aicc: Number.NaN,
        bic: Number.NaN,
        weight: 0,
        deltaAicc: Number.NaN,
        converged: false,
        verdict: 'not-converged',
        values: {},
        note: messageOf(e)
      });
    }
    hooks.onProgress?.((c + 1) / list.length);
  }
  const ranked = models.filter(m => m.converged).sort((a, b) => a.aicc - b.aicc);
  const failed = models.filter(m => !m.converged);
  if (ranked.length > 0) {
    const best = ranked[0].aicc;
    let total = 0;
    for (const m of ranked) {
      m.deltaAicc = m.aicc - best;
      total += Math.exp(-m.deltaAicc / 2);
    }
    for (const m of ranked) {
      m.weight = Math.exp(-m.deltaAicc / 2) / total;
    }
  }
  if (landauScored) {
    warnings.push(msg('compare.landau-upper-bound', 'Landau is fitted as T against ψ: its criteria come from the y-residuals of its equilibrium ψ(T), which that fit does not minimise, so they favour it less than a fit in y would.'));
  }
  const free = ranked.find(m => m.kind === 'weiss' && m.options.freeJ === true);
  const freeJ = free && free.values.J ? { ...free.values.J } : null;
  return {
    models: [...ranked, ...failed],
    convention: conventionOf(plan.mode, known, n),
    summary: summaryOf(ranked, freeJ),
    freeJ,
    warnings
  };
}

function conventionOf(mode: 'sigma' | 'relative' | 'equal', known: boolean, n: number): ICoreMessage {
  if (known) {
    return msg(
      'compare.convention.known-sigma',
      'Every model fitted to the same %1 points with the same σ (%2): AIC = χ² + 2k, AICc = AIC + 2k(k+1)/(n−k−1), BIC = χ² + k ln n, k the free parameters; Akaike weights from AICc over the models that converged.',
      n,
      mode === 'sigma' ? 'the σ column' : 'σ = f·|y|'
    );
  }
  return mode === 'relative'
    ? msg(
        'compare.convention.profiled-relative',
        'Every model fitted to the same %1 points with relative weights, their scale f profiled: AIC = n ln(S/n) + 2k with S = Σ((y − fit)/y)², AICc = AIC + 2k(k+1)/(n−k−1), BIC = n ln(S/n) + k ln n; Akaike weights from AICc over the models that converged.',
        n
      )
    : msg(
        'compare.convention.profiled',
        'Every model fitted to the same %1 points with equal weights, the variance profiled: AIC = n ln(RSS/n) + 2k, AICc = AIC + 2k(k+1)/(n−k−1), BIC = n ln(RSS/n) + k ln n; Akaike weights from AICc over the models that converged.',
        n
      );
}

function summaryOf(ranked: IComparedModel[], freeJ: IValueSigma | null): ICoreMessage {
  if (ranked.length === 0) {
    return msg('compare.summary.none', 'No model could be fitted to these points.');
  }
  const best = ranked[0];
  const label = messageText(best.label);
  const weight = { value: best.weight, digits: 2 };
  const jText = freeJ ? (Number.isFinite(freeJ.value) ? `${freeJ.value.toPrecision(3)} ± ${freeJ.sigma.toPrecision(2)}` : '∞ (classical limit)') : '';
  if (ranked.length === 1) {
    return freeJ
      ? msg('compare.summary.one-j', 'Only %1 could be fitted (Akaike weight %2); with J fitted, J = %3.', label, weight, jText)
      : msg('compare.summary.one', 'Only %1 could be fitted.', label);
  }
  const next = ranked[1];
  return freeJ
    ? msg('compare.summary.j', 'The data prefer %1 (Akaike weight %2); next is %3 (ΔAICc = %4). With J fitted, J = %5.', label, weight, messageText(next.label), { value: next.deltaAicc, digits: 3 }, jText)
    : msg('compare.summary', 'The data prefer %1 (Akaike weight %2); next is %3 (ΔAICc = %4).', label, weight, messageText(next.label), { value: next.deltaAicc, digits: 3 });
}
