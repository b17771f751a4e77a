/**
 * Landau coefficients from an order-parameter curve ψ(T) at zero field.
 *
 * On the ordered branch the equilibrium condition F′(ψ) = 0 of
 * F = (a/2)(T − T0)ψ² + (b/4)ψ⁴ + (c/6)ψ⁶ reads
 *     T = T0 − (b/a)ψ² − (c/a)ψ⁴,
 * which is linear in T0, b/a and c/a. Fitting T against ψ on the ordered
 * points is therefore a linear least-squares problem with a unique answer,
 * for continuous and first-order transitions alike (the jump at T1 does not
 * enter), whereas fitting ψ(T) directly meets the √(T0 − T) kink and the jump.
 * ψ(T) alone cannot fix the overall scale a, so a = 1 is reported.
 */
import { fitCurve } from '../fit';
import type { IFitModel } from '../fit/types';
import { landauDerived, landauEquilibriumPsi } from '../physics/landau';
import type { IAnalysisJob, IAnalysisOutcome, IDerivedValue } from './types';
import { AnalysisInputError } from './types';
import type { IWindowedPoints } from './window';
import { grid } from './window';

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

/** Fit Landau coefficients to the ordered points of ψ(T). */
export function runLandau(job: IAnalysisJob, pts: IWindowedPoints, caution: string): IAnalysisOutcome {
  let ymax = 0;
  for (const y of pts.y) {
    ymax = Math.max(ymax, Math.abs(y));
  }
  const psi: number[] = [];
  const T: number[] = [];
  for (let i = 0; i < pts.x.length; i++) {
    if (Math.abs(pts.y[i]) > ORDERED_FRACTION * ymax) {
      psi.push(Math.abs(pts.y[i]));
      T.push(pts.x[i]);
    }
  }
  if (psi.length < 4) {
    throw new AnalysisInputError(`The Landau fit needs at least 4 ordered points (ψ above 5 % of its largest value) in the fit window, but there are ${psi.length}. Widen the window.`);
  }
  const fit = fitCurve(inverseLandau, { x: psi, y: T }, { start: [Math.max(...T), 0, 0] });
  const [T0, B, C] = fit.values;
  const k = { a: 1, T0, b: B, c: C, d: 0 };
  const derived: IDerivedValue[] = [];
  const first = B < 0;
  try {
    const d = landauDerived(k);
    derived.push({ name: 'T1', value: d.Ttransition, sigma: Number.NaN, note: first ? 'first-order transition temperature' : 'transition temperature (= T0, continuous)' });
    if (first) {
      derived.push({ name: 'T**', value: d.Tsuperheat, sigma: Number.NaN, note: 'superheating limit of the ordered phase' });
      derived.push({ name: 'Δψ', value: d.psiJump, sigma: Number.NaN, note: 'jump of the order parameter at T1' });
    }
  } catch (e) {
    derived.push({ name: 'T1', value: Number.NaN, sigma: Number.NaN, note: (e as Error).message });
  }
  let min = Infinity;
  let max = -Infinity;
  for (const t of pts.x) {
    min = Math.min(min, t);
    max = Math.max(max, t);
  }
  const x = grid(min, max, 300);
  return {
    model: 'landau',
    window: { ...job.window },
    equation: 'T = T0 − (b/a)ψ² − (c/a)ψ⁴ on the ordered branch (F′ = 0 for F = (a/2)(T − T0)ψ² + (b/4)ψ⁴ + (c/6)ψ⁶)',
    convention: 'Landau convention L (a/2, b/4, c/6), a = 1; fitted as T against ψ on the ordered points, so scatter in ψ is treated as scatter in T',
    fit,
    used: psi.length,
    skipped: pts.skipped,
    curve: { x, y: x.map(t => landauEquilibriumPsi(k, t)) },
    derived,
    cautions: [
      caution,
      'ψ(T) alone determines T0, b/a and c/a; the overall scale a is arbitrary (shown as 1). Fit 1/χ(T) or the specific-heat jump as well to fix it.',
      'Landau theory is mean-field: close to Tc real exponents differ (β ≈ 0.33–0.37 in 3D), so these coefficients describe the data over the window, not the critical region.',
      `Points with ψ below ${100 * ORDERED_FRACTION} % of its largest value were taken as disordered and not fitted.`
    ],
    landau: k
  };
}
