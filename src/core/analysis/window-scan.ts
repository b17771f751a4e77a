/**
 * The exponent against the fit window: β_eff(t_max) from fits of the
 * critical power law on the points with (Tc − T)/Tc ≤ t_max, where Tc is the
 * fit's own Tc. The window and the fit are iterated together until the set
 * of points stops changing, so no Tc from another fit (or another criterion)
 * decides which points a window holds: Tc stays free and self-consistent.
 * Corrections to scaling make β_eff drift with t_max [B17 in REFERENCES.md],
 * which is what the scan shows.
 *
 * Each window is fitted through {@link runAnalysisJob} with the job's own
 * weights and options, so every cell carries the verdict the panel would
 * show for that window.
 */
import { msg } from '../messages';
import type { ICoreMessage } from '../messages';
import { UNIVERSALITY_CLASSES } from '../physics/universality';
import { AnalysisInputError } from './errors';
import type { IAnalysisHooks } from './hooks';
import { valueOf } from './kinds/common';
import { runAnalysisJob } from './run';
import type { ITaskHooks, IWindowScanCell, IWindowScanResult } from './tasks-types';
import type { AnalysisOptionValue, IAnalysisJob, IAnalysisOutcome } from './types';
import { windowedPoints } from './window';

/** Settings of the scan, in one place. */
export const WINDOW_SCAN = {
  /** Fewest ordered points (T below the window's Tc) a window must hold. */
  minPoints: 6,
  /** Largest t_max of the default list (beyond ≈ 0.3 no critical law is expected to hold). */
  largestTMax: 0.3,
  /** Number of t_max values of the default list, log-spaced. */
  cells: 12,
  /** Most rounds of "fit, then move the window to the fit's Tc" per t_max. */
  maxRounds: 8,
  /** Windows (smallest t_max first) whose β make the small-window reference. */
  referenceCells: 3,
  /** Agreement with the reference: within this many combined σ. */
  agreeSigmas: 2
} as const;

/** Ids of the universality classes marked on the chart (the bootstrap-derived 3D Ising row duplicates the first). */
const MARKED_CLASSES = ['3d-ising', '3d-xy', '3d-heisenberg', 'mean-field', 'tricritical', '2d-ising'];

const POWER_LAW_KINDS = new Set(['power-law', 'power-law-corrected']);

/** Whether hooks ask to stop. */
function stopped(hooks: ITaskHooks): boolean {
  return hooks.shouldStop?.() === true;
}

/** The kind and options each window is fitted with. */
function scanSettings(job: IAnalysisJob): { kind: string; options: Record<string, AnalysisOptionValue>; note: ICoreMessage | null } {
  if (POWER_LAW_KINDS.has(job.kind)) {
    return { kind: job.kind, options: { ...job.options }, note: null };
  }
  const p = Number(job.options.proxyPower);
  const proxyPower = p === 2 ? 2 : 1;
  return {
    kind: 'power-law',
    options: { proxyPower },
    note: msg('window-scan.plain-power-law', 'The analysis chosen is not a critical power law, so each window is fitted with the plain power law A(1 − T/Tc)^β (data ∝ ψ^%1).', proxyPower)
  };
}

/** Default t_max list: log-spaced from min(0.3, largest |t|) down to the smallest |t| that leaves enough points. */
function defaultTMaxs(x: readonly number[], Tc: number): number[] {
  const t = x.filter(v => v < Tc).map(v => (Tc - v) / Tc).sort((a, b) => a - b);
  if (t.length < WINDOW_SCAN.minPoints) {
    return [];
  }
  const top = Math.min(WINDOW_SCAN.largestTMax, t[t.length - 1]);
  const bottom = t[WINDOW_SCAN.minPoints - 1];
  if (!(bottom < top)) {
    return [top];
  }
  const n = WINDOW_SCAN.cells;
  const out: number[] = [];
  for (let i = 0; i < n; i++) {
    const v = Number((top * Math.pow(bottom / top, i / (n - 1))).toPrecision(3));
    if (out.length === 0 || v < out[out.length - 1]) {
      out.push(Math.max(v, bottom));
    }
  }
  return out;
}

/** Number of the job's finite points with x ≥ min inside the job's window, and how many of them lie below Tc. */
function countFrom(x: readonly number[], min: number, Tc: number): { n: number; ordered: number } {
  let n = 0;
  let ordered = 0;
  for (const v of x) {
    if (v >= min) {
      n++;
      if (v < Tc) {
        ordered++;
      }
    }
  }
  return { n, ordered };
}

/**
 * Fit β and Tc on windows (Tc − T)/Tc ≤ t_max of one job, each window's Tc
 * its own fit's (see the file comment), mark the universality classes' β and
 * suggest a window.
 *
 * @param options.tMaxs the t_max values (default: {@link WINDOW_SCAN} list
 *   from 0.3 down to the smallest that leaves 6 ordered points).
 * @returns null when cancelled through `hooks.shouldStop`.
 * @throws AnalysisInputError (or a kind's input error) when the job's points
 *   cannot be fitted at all: too few, no ordered points, a flat column.
 */
export function windowScan(job: IAnalysisJob, options: { tMaxs?: number[] } = {}, hooks: ITaskHooks = {}): IWindowScanResult | null {
  const warnings: ICoreMessage[] = [];
  const pts = windowedPoints(job);
  if (pts.x.length < WINDOW_SCAN.minPoints) {
    throw new AnalysisInputError(
      msg('window-scan.too-few-points', 'The window scan needs at least %1 points with finite values in the fit window, but there are %2.', WINDOW_SCAN.minPoints, pts.x.length)
    );
  }
  if (pts.skipped > 0) {
    warnings.push(msg('window-scan.skipped', '%1 points in the fit window were left out for missing or non-finite values.', pts.skipped));
  }
  const { kind, options: kindOptions, note } = scanSettings(job);
  if (note) {
    warnings.push(note);
  }
  const proxyPower = Number(kindOptions.proxyPower ?? 1) === 2 ? 2 : 1;
  const fitHooks: IAnalysisHooks = { shouldStop: hooks.shouldStop };
  const fitWindow = (min: number): IAnalysisOutcome =>
    runAnalysisJob({ ...job, kind, options: kindOptions, window: { min: Math.max(job.window.min, min), max: job.window.max } }, fitHooks);

  // Tc of the fit over the whole window starts every iteration.
  if (stopped(hooks)) {
    return null;
  }
  const full = fitWindow(-Infinity);
  if (stopped(hooks)) {
    return null;
  }
  const TcFull = valueOf(full.fit, 'Tc').value;
  if (!Number.isFinite(TcFull) || !full.fit.converged) {
    throw new AnalysisInputError(
      msg('window-scan.no-tc', 'The power-law fit over the whole fit window did not converge, so there is no Tc to measure the windows from. Check the window and the data first.')
    );
  }
  const orderedFull = pts.x.filter(v => v < TcFull).length;
  if (orderedFull < WINDOW_SCAN.minPoints) {
    throw new AnalysisInputError(
      msg('window-scan.too-few-ordered', 'Only %1 points lie below the fitted Tc (%2); the window scan needs at least %3 on the ordered side.', orderedFull, { value: TcFull, digits: 6 }, WINDOW_SCAN.minPoints)
    );
  }
  let tMaxs: number[];
  if (options.tMaxs !== undefined) {
    const good = options.tMaxs.filter(t => Number.isFinite(t) && t > 0 && t < 1);
    if (good.length < options.tMaxs.length) {
      warnings.push(msg('window-scan.bad-tmax', '%1 of the t_max values asked for were not numbers between 0 and 1 and were left out.', options.tMaxs.length - good.length));
    }
    tMaxs = [...new Set(good)].sort((a, b) => b - a);
  } else {
    tMaxs = defaultTMaxs(pts.x, TcFull);
  }

  const cells: IWindowScanCell[] = [];
  const tooFew: number[] = [];
  const unsettled: number[] = [];
  let Tc = TcFull;
  hooks.onProgress?.(1 / (tMaxs.length + 1));
  for (let c = 0; c < tMaxs.length; c++) {
    const tMax = tMaxs[c];
    let cellTc = Tc;
    let last: IAnalysisOutcome | null = null;
    let settled = false;
    let rounds = 0;
    let count = countFrom(pts.x, cellTc * (1 - tMax), cellTc);
    while (rounds < WINDOW_SCAN.maxRounds && count.ordered >= WINDOW_SCAN.minPoints) {
      rounds++;
      const min = cellTc * (1 - tMax);
      try {
        last = fitWindow(min);
      } catch {
        last = null;
        break;
      }
      if (stopped(hooks)) {
        return null;
      }
      const nextTc = valueOf(last.fit, 'Tc').value;
      if (!Number.isFinite(nextTc) || !last.fit.converged) {
        break;
      }
      const next = countFrom(pts.x, nextTc * (1 - tMax), nextTc);
      cellTc = nextTc;
      if (next.n === count.n) {
        settled = true;
        break;
      }
      count = next;
    }
    hooks.onProgress?.((c + 2) / (tMaxs.length + 1));
    if (last === null || count.ordered < WINDOW_SCAN.minPoints) {
      tooFew.push(tMax);
      continue;
    }
    if (!settled) {
      unsettled.push(tMax);
    }
    const beta = valueOf(last.fit, 'beta');
    const tc = valueOf(last.fit, 'Tc');
    cells.push({ tMax, beta, Tc: tc, n: last.used, verdict: last.verdict.state, converged: last.fit.converged, settled, rounds });
    if (last.fit.converged && Number.isFinite(tc.value)) {
      Tc = tc.value;
    }
  }
  if (tooFew.length > 0) {
    warnings.push(
      msg('window-scan.cells-too-few', 'No result for t_max = %1: those windows hold fewer than %2 ordered points, or their fit failed.', tooFew.map(t => String(Number(t.toPrecision(3)))).join(', '), WINDOW_SCAN.minPoints)
    );
  }
  if (unsettled.length > 0) {
    warnings.push(
      msg('window-scan.unsettled', 'For t_max = %1 the window did not settle within %2 rounds (its Tc moved points in and out); the last fit is shown.', unsettled.map(t => String(Number(t.toPrecision(3)))).join(', '), WINDOW_SCAN.maxRounds)
    );
  }
  hooks.onProgress?.(1);
  return {
    cells,
    exponent:
      proxyPower === 1
        ? msg('window-scan.exponent.beta', 'β of the order parameter: the data fall as (−t)^β.')
        : msg('window-scan.exponent.proxy', 'β of the order parameter: the data go as ψ^%1, so they fall as (−t)^(%1β); β itself is shown.', proxyPower),
    classes: UNIVERSALITY_CLASSES.filter(k => MARKED_CLASSES.includes(k.id)).map(k => ({ id: k.id, label: k.name, beta: k.beta.value, citation: k.citation })),
    suggested: suggestWindow(cells),
    convention: msg(
      'window-scan.convention',
      't = (T − Tc)/Tc with each window’s own fitted Tc: a window holds the points with (Tc − T)/Tc ≤ t_max, refitted until its points stop changing (at most %1 rounds). Nested windows share points, so neighbouring cells are correlated.',
      WINDOW_SCAN.maxRounds
    ),
    warnings
  };
}

/**
 * The suggested window: the largest t_max whose fit describes the data
 * (verdict 'fits') and whose β agrees within {@link WINDOW_SCAN}.agreeSigmas
 * combined σ with the small-window reference — the inverse-variance mean of
 * the β of the (up to) three smallest windows that converged, its σ the
 * larger of the mean's σ and their spread (nested windows share points, so
 * the mean's own σ is too small).
 */
export function suggestWindow(cells: readonly IWindowScanCell[]): { tMax: number | null; reason: ICoreMessage } {
  const usable = cells.filter(c => c.converged && Number.isFinite(c.beta.value) && c.beta.sigma > 0).sort((a, b) => a.tMax - b.tMax);
  if (usable.length < 2) {
    return {
      tMax: null,
      reason: msg('window-scan.suggest.too-few', 'No window can be suggested: fewer than two windows gave β with an uncertainty, so there is nothing to compare.')
    };
  }
  const ref = usable.slice(0, Math.min(WINDOW_SCAN.referenceCells, usable.length));
  let sw = 0;
  let swb = 0;
  for (const c of ref) {
    const w = 1 / (c.beta.sigma * c.beta.sigma);
    sw += w;
    swb += w * c.beta.value;
  }
  const mean = swb / sw;
  let spread = 0;
  for (const c of ref) {
    spread += (c.beta.value - mean) ** 2;
  }
  spread = ref.length > 1 ? Math.sqrt(spread / (ref.length - 1)) : 0;
  const refSigma = Math.max(Math.sqrt(1 / sw), spread);
  const largestRef = ref[ref.length - 1].tMax;
  const byWidth = usable.slice().sort((a, b) => b.tMax - a.tMax);
  const fits = byWidth.filter(c => c.verdict === 'fits');
  if (fits.length === 0) {
    return {
      tMax: null,
      reason: msg('window-scan.suggest.none-fits', 'No window can be suggested: no window’s fit describes its data (check the verdicts, the background and the points near Tc).')
    };
  }
  for (const c of fits) {
    const z = Math.abs(c.beta.value - mean) / Math.sqrt(c.beta.sigma ** 2 + refSigma ** 2);
    if (z <= WINDOW_SCAN.agreeSigmas) {
      return {
        tMax: c.tMax,
        reason: msg(
          'window-scan.suggest.chosen',
          't_max = %1: the widest window whose fit describes the data and whose β = %2 ± %3 agrees within %4σ with the small windows (t_max ≤ %5: β = %6 ± %7). Wider windows drift (corrections to scaling) or fail the verdict.',
          { value: c.tMax, digits: 3 },
          { value: c.beta.value, digits: 4 },
          { value: c.beta.sigma, digits: 2 },
          WINDOW_SCAN.agreeSigmas,
          { value: largestRef, digits: 3 },
          { value: mean, digits: 4 },
          { value: refSigma, digits: 2 }
        )
      };
    }
  }
  return {
    tMax: null,
    reason: msg(
      'window-scan.suggest.none-agree',
      'No window can be suggested: the windows whose fit describes the data give β differing by more than %1σ from the small windows (t_max ≤ %2: β = %3 ± %4).',
      WINDOW_SCAN.agreeSigmas,
      { value: largestRef, digits: 3 },
      { value: mean, digits: 4 },
      { value: refSigma, digits: 2 }
    )
  };
}
