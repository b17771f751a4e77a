/**
 * Weiss mean field M(T) = Ms·m(T/Tc) with m = B_J(3J m/((J + 1)τ)) for a
 * chosen spin J, or the Langevin limit [B1 in REFERENCES.md].
 */
import { fitWeissMT, weissMTModel } from '../../physics/weiss-fit';
import { msg } from '../../messages';
import { AnalysisInputError } from '../errors';
import { conventionOf, curveOf, requireChangingY, requirePoints, valueOf, windowCaution } from './common';
import type { IAnalysisKind, IChoiceOption, IOptionChoice } from './types';

/** Half-integer spins ½ … 8, then the classical (Langevin) limit. */
const SPIN_CHOICES: IOptionChoice<number>[] = [
  ...Array.from({ length: 16 }, (_, i) => {
    const J = (i + 1) / 2;
    return { value: J, label: msg('option.spin.value', '%1', J % 1 === 0 ? String(J) : `${2 * J}/2`) };
  }),
  { value: Infinity, label: msg('option.spin.langevin', '∞ (Langevin, classical moments)') }
];

export const spinOption: IChoiceOption<number> = {
  type: 'choice',
  label: msg('option.spin', 'spin J'),
  choices: SPIN_CHOICES,
  default: 0.5
};

export const weissKind = {
  id: 'weiss',
  label: msg('kind.weiss', 'Weiss mean field M(T)'),
  description: msg('kind.weiss.description', 'The whole ordered curve with a Brillouin function of spin J; Tc and Ms.'),
  options: { J: spinOption },
  minPoints: () => 4,
  run: (job, pts, hooks) => {
    const J = Number(job.options.J ?? spinOption.default);
    // Ms and Tc: 2 free parameters.
    requirePoints(pts, 4, 2);
    for (let i = 0; i < pts.x.length; i++) {
      if (!(pts.x[i] > 0)) {
        throw new AnalysisInputError(msg('weiss.absolute-temperature', 'The Weiss fit needs absolute temperatures (K > 0) in the x column, but it holds %1; convert °C to K first.', pts.x[i]));
      }
    }
    requireChangingY(pts, 'transition');
    const fit = fitWeissMT({ T: pts.x, M: pts.y, sigma: pts.sigma }, { J, engine: { ...hooks } });
    const Tc = valueOf(fit, 'Tc');
    const Ms = valueOf(fit, 'Ms');
    const curve = curveOf(weissMTModel(J, false), fit.values, pts.x);
    return {
      outcome: {
        equation: `M = Ms·m(T/Tc), m = B_J(3J m/((J+1) τ)), J = ${J === Infinity ? '∞ (Langevin)' : J}`,
        convention: conventionOf(fit.convention),
        fit,
        used: pts.x.length,
        curve,
        derived: [
          { name: 'Tc', value: Tc.value, sigma: Tc.sigma, note: msg('derived.weiss-tc', 'mean-field Curie temperature, in K') },
          { name: 'Ms', value: Ms.value, sigma: Ms.sigma, note: msg('derived.ms', 'saturation value, in the units of the y column') }
        ],
        cautions: [
          windowCaution(),
          msg('caution.mean-field-phenomenological', 'Mean field describes the whole curve only phenomenologically: real magnets follow spin waves (Bloch T^3/2) at low T and critical laws near Tc, so β = ½ here is assumed, not measured.'),
          msg('caution.field-rounding', 'A magnetisation measured in a field is not spontaneous: the field-induced tail rounds the curve at Tc.')
        ]
      },
      fitted: { ...pts, curve: curve.y }
    };
  },
  views: ['data-and-curve']
} as const satisfies IAnalysisKind<'weiss'>;
