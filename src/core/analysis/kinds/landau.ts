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
 */
import { fitCurve } from '../../fit';
import type { IFitModel } from '../../fit/types';
import { landauDerived, landauEquilibriumPsi } from '../../physics/landau';
import { messageOf, msg } from '../../messages';
import type { IDerivedValue } from '../types';
import { AnalysisInputError } from '../errors';
import { grid } from '../window';
import { distinctCount, extent, requireChangingY, requireDistinctX, requirePoints, windowCaution } from './common';
import type { IAnalysisKind } from './types';

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

export const landauKind = {
  id: 'landau',
  label: msg('kind.landau', 'Landau 2-4-6 coefficients from ψ(T)'),
  description: msg('kind.landau.description', 'T0, b/a and c/a from the ordered branch; first or second order from the sign of b.'),
  options: {},
  minPoints: () => 4,
  run: (_job, pts) => {
    // T0, b/a and c/a: 3 free parameters.
    requirePoints(pts, 4, 3);
    requireChangingY(pts, 'transition');
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
    const fit = fitCurve(inverseLandau, { x: psi, y: T }, { start: [Tmax, 0, 0] });
    const [T0, B, C] = fit.values;
    const k = { a: 1, T0, b: B, c: C, d: 0 };
    const derived: IDerivedValue[] = [];
    const first = B < 0;
    try {
      const d = landauDerived(k);
      derived.push({ name: 'T1', value: d.Ttransition, sigma: Number.NaN, note: first ? msg('derived.t1-first', 'first-order transition temperature') : msg('derived.t1-continuous', 'transition temperature (= T0, continuous)') });
      if (first) {
        derived.push({ name: 'T**', value: d.Tsuperheat, sigma: Number.NaN, note: msg('derived.tsuperheat', 'superheating limit of the ordered phase') });
        derived.push({ name: 'Δψ', value: d.psiJump, sigma: Number.NaN, note: msg('derived.psi-jump', 'jump of the order parameter at T1') });
      }
    } catch (e) {
      derived.push({ name: 'T1', value: Number.NaN, sigma: Number.NaN, note: messageOf(e) });
    }
    const { min, max } = extent(pts.x);
    const x = grid(min, max, 300);
    const curve = { x, y: x.map(t => landauEquilibriumPsi(k, t)) };
    return {
      outcome: {
        equation: 'T = T0 − (b/a)ψ² − (c/a)ψ⁴ on the ordered branch (F′ = 0 for F = (a/2)(T − T0)ψ² + (b/4)ψ⁴ + (c/6)ψ⁶)',
        convention: msg('convention.landau-inverse', 'Landau convention L (a/2, b/4, c/6), a = 1; fitted as T against ψ on the ordered points, so scatter in ψ is treated as scatter in T'),
        fit,
        used: psi.length,
        curve,
        derived,
        cautions: [
          windowCaution(),
          msg('caution.landau-scale', 'ψ(T) alone determines T0, b/a and c/a; the overall scale a is arbitrary (shown as 1). Fit 1/χ(T) or the specific-heat jump as well to fix it.'),
          msg('caution.landau-mean-field', 'Landau theory is mean-field: close to Tc real exponents differ (β ≈ 0.33–0.37 in 3D), so these coefficients describe the data over the window, not the critical region.'),
          msg('caution.landau-ordered', 'Points with ψ below %1 % of its largest value were taken as disordered and not fitted.', 100 * ORDERED_FRACTION)
        ],
        landau: k
      },
      fitted: { x: psi, y: T, curve: curve.y }
    };
  },
  views: ['data-and-curve', 'landau-explorer']
} as const satisfies IAnalysisKind<'landau'>;
