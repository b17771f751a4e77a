/**
 * Landau coefficients from an order-parameter curve ψ(T) at zero field
 * [B3 in REFERENCES.md].
 *
 * On the ordered branch the equilibrium condition F′(ψ) = 0 of
 * F = (a/2)(T − T0)ψ² + (b/4)ψ⁴ + (c/6)ψ⁶ reads
 *     T = T0 − (b/a)ψ² − (c/a)ψ⁴,
 * which is linear in T0, b/a and c/a. Fitting T against ψ on the ordered
 * points is therefore a linear least-squares problem with a unique answer,
 * for continuous and first-order transitions alike (the jump at T1 does not
 * enter), whereas fitting ψ(T) directly meets the √(T0 − T) kink and the jump.
 * ψ(T) alone cannot fix the overall scale a, so a = 1 is reported.
 *
 * With a 1/χ(T) column or a specific-heat jump ΔC the coefficients are then
 * fitted jointly, starting from the ψ-only result: ψ(T) = ψ_eq, 1/χ(T) =
 * F″(ψ_eq) = a(T − T0) above T0 (disordered) and a(T − T0) + 3bψ² + 5cψ⁴ on
 * the ordered branch, and ΔC = T0a²/(2b) (second order) [B3 (i), (ii)], all
 * sharing a, T0, b, c, which fixes the scale a. Relative weighting: each
 * data set is weighted by its own σ — the σ column for ψ when given, the
 * quoted σ for ΔC, and otherwise the set's point-to-point scatter
 * ({@link robustScatter}) — so each set counts by its number of points and
 * its noise, and no set dominates by its units.
 */
import { fitCurve } from '../../fit';
import type { IFitModel, IFitResult } from '../../fit/types';
import { fitLandau, landauDerivedWithErrors, landauEquilibriumPsi } from '../../physics/landau';
import { landauFitModel } from '../../physics/landau/fit-model';
import type { ILandauFitData, ILandauParameters } from '../../physics/landau';
import { messageOf, msg } from '../../messages';
import type { ICoreMessage } from '../../messages';
import type { IAnalysisJob, IAnalysisOutcome, IDerivedValue } from '../types';
import { AnalysisInputError } from '../errors';
import type { IWindowedPoints } from '../window';
import { grid, windowedPoints } from '../window';
import { distinctCount, extent, requireChangingY, requireDistinctX, requirePoints, startsOver, windowCaution } from './common';
import type { IAnalysisKind, IColumnOption, IKindModel, ITextOption } from './types';

/** Points with ψ below this fraction of the largest |ψ| count as disordered and are not fitted. */
export const ORDERED_FRACTION = 0.05;

/** T(ψ) = T0 − B ψ² − C ψ⁴ with parameters T0, B = b/a, C = c/a; x holds ψ. */
const inverseLandau: IFitModel = {
  parameters: ['T0', 'b/a', 'c/a'],
  evaluate(p, x, out) {
    for (let i = 0; i < x.length; i++) {
      const q = x[i] * x[i];
      out[i] = p[0] - p[1] * q - p[2] * q * q;
    }
  },
  jacobian(_p, x, out) {
    for (let i = 0; i < x.length; i++) {
      const q = x[i] * x[i];
      out[i * 3] = 1;
      out[i * 3 + 1] = -q;
      out[i * 3 + 2] = -q * q;
    }
  }
};

/** The points with |ψ| above {@link ORDERED_FRACTION} of its largest, as ψ = |y| and T, and their largest T. */
function orderedBranch(pts: IWindowedPoints): { psi: number[]; T: number[]; Tmax: number } {
  let ymax = 0;
  for (let i = 0; i < pts.y.length; i++) {
    ymax = Math.max(ymax, Math.abs(pts.y[i]));
  }
  const psi: number[] = [];
  const T: number[] = [];
  let Tmax = -Infinity;
  for (let i = 0; i < pts.x.length; i++) {
    if (Math.abs(pts.y[i]) > ORDERED_FRACTION * ymax) {
      psi.push(Math.abs(pts.y[i]));
      T.push(pts.x[i]);
      Tmax = Math.max(Tmax, pts.x[i]);
    }
  }
  return { psi, T, Tmax };
}

/**
 * ψ(T) of a joint fit: every windowed point, with the sign of the largest
 * value taken off (kept on every point: folding |y| would bias the
 * disordered points' noise upwards), weighted by the σ column or else by the
 * set's point-to-point scatter.
 */
function jointPsi(pts: IWindowedPoints): { T: number[]; y: number[]; sigma: number[] } {
  let peak = 0;
  for (const v of pts.y) {
    peak = Math.abs(v) > Math.abs(peak) ? v : peak;
  }
  const T = pts.x.slice();
  const y = pts.y.map(v => (peak < 0 ? -v : v));
  const scatter = pts.sigma ? 0 : robustScatter(T, y);
  return { T, y, sigma: pts.sigma ?? T.map(() => scatter) };
}

/** ψ_eq(T) at h = 0 as an engine model: over (a, T0, b, c) for a joint fit, else over (T0, b/a, c/a) with a = 1. */
function equilibriumModel(joint: boolean): IFitModel {
  const k = { a: 1, T0: 0, b: 0, c: 0, d: 0 };
  return {
    parameters: joint ? ['a', 'T0', 'b', 'c'] : ['T0', 'b/a', 'c/a'],
    evaluate(p, x, out) {
      const o = joint ? 1 : 0;
      k.a = joint ? p[0] : 1;
      k.T0 = p[o];
      k.b = p[o + 1];
      k.c = p[o + 2];
      for (let i = 0; i < x.length; i++) {
        out[i] = landauEquilibriumPsi(k, x[i]);
      }
    }
  };
}

/** The model of a Landau outcome: ψ_eq(T) drawn, and the points fitted (T against ψ, or the joint data sets). */
function landauModel(job: IAnalysisJob, pts: IWindowedPoints, outcome: IAnalysisOutcome): IKindModel {
  const joint = outcome.fit.parameters[0] === 'a';
  if (!joint) {
    const { psi, T } = orderedBranch(pts);
    return { curve: equilibriumModel(false), fitted: { model: inverseLandau, x: psi, y: T } };
  }
  const psi = jointPsi(pts);
  const chi = inverseChiPoints(job, pts);
  const chiScatter = chi !== null ? robustScatter(chi.T, chi.y) : 0;
  const chiSigma = chi !== null ? chi.T.map(() => chiScatter) : [];
  // ΔC entered the fit unless the ψ-only fit found b < 0: then the fit has one point fewer.
  const dcGiven = parseValueSigma(String(job.options.specificHeatJump ?? ''));
  const dc = dcGiven !== null && outcome.fit.residuals.length === psi.T.length + (chi?.T.length ?? 0) + 1 ? dcGiven : null;
  const kinds = [...psi.T.map(() => 0), ...(chi?.T.map(() => 1) ?? []), ...(dc !== null ? [2] : [])];
  const Ts = [...psi.T, ...(chi?.T ?? []), ...(dc !== null ? [0] : [])];
  return {
    curve: equilibriumModel(true),
    fitted: {
      model: landauFitModel(kinds, Ts),
      x: kinds.map((_, i) => i),
      y: [...psi.y, ...(chi?.y ?? []), ...(dc !== null ? [dc.value] : [])],
      sigma: [...psi.sigma, ...chiSigma, ...(dc !== null ? [dc.sigma] : [])]
    }
  };
}

/** Option of the 1/χ column. */
const inverseChiOption: IColumnOption = { type: 'column', label: msg('option.landau-inverse-chi', '1/χ(T) column (joint fit)'), default: '' };

/** Option of the specific-heat jump, typed as "ΔC ± σ". */
const specificHeatJumpOption: ITextOption = {
  type: 'text',
  label: msg('option.landau-dc', 'specific-heat jump ΔC ± σ (joint fit)'),
  default: '',
  placeholder: '6.25 ± 0.3'
};

/**
 * Noise of a column from the pseudo-residuals of each point against the
 * straight line through its neighbours in T (Gasser, Sroka & Jennen-Steinmetz
 * 1986, as in `common.ts`), taken as 1.4826 × their median absolute value so
 * that a jump (first order) or a kink at T0 does not inflate it. Never below
 * 1e-9 of the largest |value| (noise-free data).
 */
export function robustScatter(T: readonly number[], y: readonly number[]): number {
  const order = T.map((_, i) => i).sort((a, b) => T[a] - T[b] || a - b);
  const r: number[] = [];
  for (let k = 1; k + 1 < order.length; k++) {
    const [a, i, b] = [order[k - 1], order[k], order[k + 1]];
    const width = T[b] - T[a];
    const w = width > 0 ? (T[b] - T[i]) / width : 0.5;
    r.push(Math.abs(y[i] - (w * y[a] + (1 - w) * y[b])) / Math.sqrt(1 + w * w + (1 - w) * (1 - w)));
  }
  r.sort((a, b) => a - b);
  const median = r.length === 0 ? 0 : r.length % 2 === 1 ? r[(r.length - 1) / 2] : 0.5 * (r[r.length / 2 - 1] + r[r.length / 2]);
  let scale = 0;
  for (const v of y) {
    scale = Math.max(scale, Math.abs(v));
  }
  return Math.max(1.4826 * median, 1e-9 * scale, Number.MIN_VALUE);
}

/** "6.25 ± 0.3" (or "6.25 +- 0.3", "6.25 0.3") → value and σ; null for ''. */
export function parseValueSigma(text: string): { value: number; sigma: number } | null {
  const t = text.trim();
  if (t === '') {
    return null;
  }
  const parts = t.split(/\s*(?:±|\+\/?-|\s)\s*/).filter(s => s !== '');
  const value = Number(parts[0]);
  const sigma = Number(parts[1]);
  if (parts.length !== 2 || !Number.isFinite(value) || !(sigma > 0) || !Number.isFinite(sigma)) {
    throw new AnalysisInputError(
      msg('landau.bad-dc', 'The specific-heat jump should be written as a value and its σ, e.g. "6.25 ± 0.3", but it is "%1".', t.slice(0, 40))
    );
  }
  return { value, sigma };
}

/** The 1/χ points of the job aligned with the windowed ψ points (finite ones only). */
function inverseChiPoints(job: IAnalysisJob, pts: IWindowedPoints): { T: number[]; y: number[] } | null {
  const key = 'inverseChi';
  const column = job.columns?.[key];
  if (job.options[key] === '' || job.options[key] === undefined || column === undefined) {
    return null;
  }
  if (column.length !== job.x.length) {
    throw new AnalysisInputError(msg('landau.chi-length', 'The 1/χ column has %1 values but the x column has %2.', column.length, job.x.length));
  }
  const rows = pts.rows ?? windowedPoints(job).rows ?? [];
  const T: number[] = [];
  const y: number[] = [];
  for (let i = 0; i < rows.length; i++) {
    const v = column[rows[i]];
    if (Number.isFinite(v)) {
      T.push(pts.x[i]);
      y.push(v);
    }
  }
  if (T.length < 3) {
    throw new AnalysisInputError(msg('landau.chi-too-few', 'The 1/χ column has only %1 finite values in the fit window; a joint fit needs at least 3.', T.length));
  }
  return { T, y };
}

/** Slope of 1/χ against T on the points above T0 (the Curie–Weiss side, slope a), or NaN with fewer than 2. */
function slopeAbove(chi: { T: number[]; y: number[] }, T0: number): number {
  const idx = chi.T.map((_, i) => i).filter(i => chi.T[i] > T0);
  if (idx.length < 2) {
    return Number.NaN;
  }
  const mx = idx.reduce((s, i) => s + chi.T[i], 0) / idx.length;
  const my = idx.reduce((s, i) => s + chi.y[i], 0) / idx.length;
  let sxy = 0;
  let sxx = 0;
  for (const i of idx) {
    sxy += (chi.T[i] - mx) * (chi.y[i] - my);
    sxx += (chi.T[i] - mx) ** 2;
  }
  return sxx > 0 ? sxy / sxx : Number.NaN;
}

/** Derived values (σ always with a reason when not finite) and the order statement. */
function derivedOf(p: ILandauParameters, covariance: number[][], scaleFixed: boolean): { derived: IDerivedValue[]; order: ReturnType<typeof landauDerivedWithErrors>['order'] } {
  const { values, order } = landauDerivedWithErrors(p, covariance);
  const notes: Record<string, ICoreMessage> = {
    T0: msg('derived.t0', 'supercooling limit T0 (stability limit of the disordered state)'),
    T1: p.b < 0 ? msg('derived.t1-first', 'first-order transition temperature') : msg('derived.t1-continuous', 'transition temperature (= T0, continuous)'),
    'T**': msg('derived.tsuperheat', 'superheating limit of the ordered phase'),
    Δψ: msg('derived.psi-jump', 'jump of the order parameter at T1'),
    L: scaleFixed ? msg('derived.latent-heat-per-a', 'latent heat T1·aψ1²/2 per unit of F, divided by the scale a') : msg('derived.latent-heat', 'latent heat T1·aψ1²/2, per unit of F'),
    ψb: msg('derived.barrier-psi', 'order parameter at the barrier between the phases at T1'),
    Fb: scaleFixed ? msg('derived.barrier-per-a', 'barrier height |b|³/(96c²) at T1, divided by the scale a') : msg('derived.barrier', 'barrier height |b|³/(96c²) at T1, per unit of F'),
    ΔC: scaleFixed ? msg('derived.dc-per-a', 'specific-heat jump T0·a²/(2b) at T0, divided by a²') : msg('derived.dc', 'specific-heat jump T0·a²/(2b) at T0, per unit of F and kelvin')
  };
  const derived: IDerivedValue[] = values.map(v => ({
    name: v.name,
    value: v.value,
    sigma: v.sigma,
    note: notes[v.name] ?? msg('derived.landau', 'derived from the Landau coefficients'),
    ...(v.sigmaReason ? { sigmaReason: v.sigmaReason } : {})
  }));
  return { derived, order };
}

/** The ψ-only fit's (T0, b/a, c/a) as convention-L coefficients with a = 1 and their 4×4 covariance (a, T0, b, c). */
function inverseParameters(fit: IFitResult): { p: ILandauParameters; covariance: number[][] } {
  const [T0, B, C] = fit.values;
  const cov = fit.covariance;
  const m = [
    [0, 0, 0, 0],
    [0, cov[0][0], cov[0][1], cov[0][2]],
    [0, cov[1][0], cov[1][1], cov[1][2]],
    [0, cov[2][0], cov[2][1], cov[2][2]]
  ];
  return { p: { a: 1, T0, b: B, c: C }, covariance: m };
}

export const landauKind = {
  id: 'landau',
  label: msg('kind.landau', 'Landau 2-4-6 coefficients from ψ(T)'),
  description: msg('kind.landau.description', 'T0, b/a and c/a from the ordered branch; first or second order from the sign of b; with 1/χ(T) or ΔC also the scale a.'),
  options: { inverseChi: inverseChiOption, specificHeatJump: specificHeatJumpOption },
  minPoints: () => 4,
  run: (job, pts, hooks) => {
    // T0, b/a and c/a: 3 free parameters.
    requirePoints(pts, 4, 3);
    requireChangingY(pts, 'transition');
    const { psi, T, Tmax } = orderedBranch(pts);
    if (psi.length < 4) {
      throw new AnalysisInputError(
        msg('landau.too-few-ordered', 'The Landau fit needs at least 4 ordered points (ψ above %1 % of its largest value) in the fit window, but there are %2. Widen the window.', 100 * ORDERED_FRACTION, psi.length)
      );
    }
    // T is fitted against ψ on the ordered points: both need 4 different values there.
    requireDistinctX(T, 3);
    const distinctPsi = distinctCount(psi);
    if (distinctPsi < 4) {
      throw new AnalysisInputError(
        msg('landau.too-few-distinct-psi', 'The %1 ordered points in the fit window have only %2 different values of ψ, but the Landau fit of T against ψ needs at least 4. Widen the window or choose another y column.', psi.length, distinctPsi)
      );
    }
    const inverse = fitCurve(inverseLandau, { x: psi, y: T }, { start: startsOver(job, ['T0', 'b/a', 'c/a'], [Tmax, 0, 0]), shouldStop: hooks.shouldStop });
    const chi = inverseChiPoints(job, pts);
    let dc = parseValueSigma(String(job.options.specificHeatJump ?? ''));
    const cautions: ICoreMessage[] = [windowCaution()];
    if (dc !== null && inverse.values[1] < 0) {
      cautions.push(msg('caution.landau-dc-first-order', 'The specific-heat jump ΔC = T0·a²/(2b) holds for a second-order transition; ψ(T) gives b < 0 (first order), so ΔC was not used.'));
      dc = null;
    }
    const joint = chi !== null || dc !== null;
    let fit: IFitResult = inverse;
    let params: { p: ILandauParameters; covariance: number[][] };
    let fitted: { x: number[]; y: number[]; sigma?: number[] };
    let equation = 'T = T0 − (b/a)ψ² − (c/a)ψ⁴ on the ordered branch (F′ = 0 for F = (a/2)(T − T0)ψ² + (b/4)ψ⁴ + (c/6)ψ⁶)';
    let convention = msg('convention.landau-inverse', 'Landau convention L (a/2, b/4, c/6), a = 1; fitted as T against ψ on the ordered points, so scatter in ψ is treated as scatter in T');
    if (joint) {
      const [T0i, B, C] = inverse.values;
      const a0 = chi !== null ? slopeAbove(chi, T0i) : Number.NaN;
      const a = a0 > 0 ? a0 : dc !== null && B > 0 ? Math.sqrt((2 * B * dc.value) / Math.max(T0i, 1e-300)) : 1;
      const { T: psiT, y: psiY, sigma: psiSigma } = jointPsi(pts);
      const data: ILandauFitData = { psi: { T: psiT, y: psiY, sigma: psiSigma } };
      const chiScatter = chi !== null ? robustScatter(chi.T, chi.y) : 0;
      const chiSigma = chi !== null ? chi.T.map(() => chiScatter) : [];
      if (chi !== null) {
        data.inverseChi = { T: chi.T, y: chi.y, sigma: chiSigma };
      }
      if (dc !== null) {
        data.specificHeatJump = dc;
      }
      const [sa, sT0, sb, sc] = startsOver(job, ['a', 'T0', 'b', 'c'], [a, T0i, a * B, Math.max(a * C, 0)]);
      const res = fitLandau(data, { start: { a: sa, T0: sT0, b: sb, c: sc }, engine: { shouldStop: hooks.shouldStop } });
      fit = res;
      params = { p: { a: res.values[0], T0: res.values[1], b: res.values[2], c: res.values[3] }, covariance: res.covariance };
      fitted = {
        // ΔC has no temperature of its own: it is placed at T0 of the ψ-only fit.
        x: [...psiT, ...(chi?.T ?? []), ...(dc !== null ? [T0i] : [])],
        y: [...psiY, ...(chi?.y ?? []), ...(dc !== null ? [dc.value] : [])],
        sigma: [...psiSigma, ...chiSigma, ...(dc !== null ? [dc.sigma] : [])]
      };
      equation = `ψ(T) = ψ_eq minimising F = (a/2)(T − T0)ψ² + (b/4)ψ⁴ + (c/6)ψ⁶${chi !== null ? ', with 1/χ(T) = F″(ψ_eq) [= a(T − T0) above T0]' : ''}${dc !== null ? ', with ΔC = T0·a²/(2b)' : ''}, a, T0, b, c shared`;
      convention = msg(
        'convention.landau-joint',
        'Landau convention L (a/2, b/4, c/6), fitted jointly to %1; each data set weighted by its own σ (the σ column, the quoted σ of ΔC, or else the set’s point-to-point scatter), so no set dominates by its units.',
        [pts.sigma ? 'ψ(T) with its σ column' : 'ψ(T)', chi !== null ? '1/χ(T)' : '', dc !== null ? 'ΔC' : ''].filter(s => s !== '').join(', ')
      );
    } else {
      params = inverseParameters(inverse);
      fitted = { x: psi, y: T };
    }
    const { p } = params;
    const k = { a: p.a, T0: p.T0, b: p.b, c: p.c, d: 0 };
    let derived: IDerivedValue[];
    let order: ReturnType<typeof landauDerivedWithErrors>['order'] | null = null;
    try {
      const r = derivedOf(p, params.covariance, !joint);
      derived = r.derived;
      order = r.order;
    } catch (e) {
      derived = [{ name: 'T1', value: Number.NaN, sigma: Number.NaN, note: messageOf(e), sigmaReason: messageOf(e) }];
    }
    if (order !== null) {
      cautions.unshift(order.statement);
    }
    const { min, max } = extent(pts.x);
    const x = grid(min, max, 300);
    const curve = { x, y: x.map(t => landauEquilibriumPsi(k, t)) };
    if (!joint) {
      cautions.push(msg('caution.landau-scale', 'ψ(T) alone determines T0, b/a and c/a; the overall scale a is arbitrary (shown as 1). Fit 1/χ(T) or the specific-heat jump as well to fix it.'));
    }
    cautions.push(
      msg('caution.landau-mean-field', 'Landau theory is mean-field: close to Tc real exponents differ (β ≈ 0.33–0.37 in 3D), so these coefficients describe the data over the window, not the critical region.'),
      msg('caution.landau-order-evidence', 'The sign of b is one piece of evidence on the order; corroborate a first-order transition with thermal hysteresis, latent heat or a volume jump.')
    );
    if (!joint) {
      cautions.push(msg('caution.landau-ordered', 'Points with ψ below %1 % of its largest value were taken as disordered and not fitted.', 100 * ORDERED_FRACTION));
    }
    return {
      outcome: {
        equation,
        convention,
        fit,
        used: joint ? fitted.x.length : psi.length,
        curve,
        derived,
        cautions,
        landau: k,
        ...(order !== null ? { transitionOrder: { order: order.order, z: order.z, probabilityFirst: order.probabilityFirst, statement: order.statement } } : {})
      },
      fitted: joint ? { ...fitted } : { x: psi, y: T, curve: curve.y }
    };
  },
  views: ['data-and-curve', 'landau-explorer'],
  model: landauModel
} as const satisfies IAnalysisKind<'landau'>;
