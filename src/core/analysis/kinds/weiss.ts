/**
 * Weiss mean field M(T) = Ms·m(T/Tc) with m = B_J(3J m/((J + 1)τ)) for a
 * chosen spin J, or the Langevin limit [B1 in REFERENCES.md]; or with J
 * fitted as a continuous effective parameter.
 *
 * J free: the fit varies u = 1/J over [0, 2], so J ≥ ½ and the classical
 * limit J = ∞ (u = 0) is reachable rather than capped. J and its standard
 * error are reported as a derived value, σ_J = σ_u/u² (first-order
 * propagation); at u = 0 the data prefer classical moments and J = ∞ is
 * reported without σ.
 */
import { estimateWeissStart, fitWeissMT, spinFromInverse, weissMTModel } from '../../physics/weiss-fit';
import { msg } from '../../messages';
import { AnalysisInputError } from '../errors';
import { conventionOf, curveOf, requireChangingY, requirePoints, startValue, startsOver, valueOf, windowCaution } from './common';
import type { IDerivedValue } from '../types';
import type { ICoreMessage } from '../../messages';
import type { IAnalysisKind, IBooleanOption, IChoiceOption, IOptionChoice } from './types';

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

/** Fit J as well (as a continuous effective parameter); the chosen J is then the start. */
export const freeJOption: IBooleanOption = { type: 'boolean', label: msg('option.free-j', 'fit J'), default: false };

/** The start of u = 1/J for a J-free fit from the chosen J (kept off the bounds u = 0 and u = 2). */
function inverseStart(J: number): number {
  return Math.min(1.8, Math.max(0.05, J === Infinity ? 0 : 1 / J));
}

export const weissKind = {
  id: 'weiss',
  label: msg('kind.weiss', 'Weiss mean field M(T)'),
  description: msg('kind.weiss.description', 'The whole ordered curve with a Brillouin function of spin J; Tc and Ms.'),
  options: { J: spinOption, freeJ: freeJOption },
  minPoints: o => (o.freeJ === true ? 5 : 4),
  run: (job, pts, hooks) => {
    const J = Number(job.options.J ?? spinOption.default);
    const free = job.options.freeJ === true;
    // Ms and Tc (and J): 2 or 3 free parameters.
    requirePoints(pts, free ? 5 : 4, free ? 3 : 2);
    for (let i = 0; i < pts.x.length; i++) {
      if (!(pts.x[i] > 0)) {
        throw new AnalysisInputError(msg('weiss.absolute-temperature', 'The Weiss fit needs absolute temperatures (K > 0) in the x column, but it holds %1; convert °C to K first.', pts.x[i]));
      }
    }
    requireChangingY(pts, 'transition');
    // A start given for Ms or Tc replaces that part of the estimate; one for 1/J is kept off its bounds like the chosen J.
    const start = startValue(job, 'Ms') !== undefined || startValue(job, 'Tc') !== undefined ? (startsOver(job, ['Ms', 'Tc'], estimateWeissStart(pts.x, pts.y)) as [number, number]) : undefined;
    const u0 = startValue(job, '1/J');
    const uStart = u0 !== undefined ? Math.min(1.8, Math.max(0.05, u0)) : inverseStart(J);
    const fit = free
      ? fitWeissMT({ T: pts.x, M: pts.y, sigma: pts.sigma }, { J: 1 / uStart, fitInverseJ: true, start, engine: { ...hooks } })
      : fitWeissMT({ T: pts.x, M: pts.y, sigma: pts.sigma }, { J, start, engine: { ...hooks } });
    const Tc = valueOf(fit, 'Tc');
    const Ms = valueOf(fit, 'Ms');
    const curve = curveOf(weissMTModel(J, free ? 'inverse' : false), fit.values, pts.x);
    const spin: IDerivedValue[] = [];
    const extra: ICoreMessage[] = [];
    if (free) {
      const u = valueOf(fit, '1/J');
      // 1/J at 0, or held there by `fitWeissMT` because χ² cannot tell it from 0 (at 1/J = 0, Ms and
      // 1/J move together): J = ∞, with no σ.
      const classical = fit.fixed[fit.parameters.indexOf('1/J')] === true || !(u.value > 0);
      spin.push({
        name: 'J',
        value: classical ? Infinity : spinFromInverse(u.value),
        sigma: classical ? Number.NaN : u.sigma / (u.value * u.value),
        note: msg('derived.weiss-j', 'effective spin J, fitted as u = 1/J over [0, 2] (σ_J = σ_u/u²); J = ∞ is the classical limit')
      });
      if (classical) {
        extra.push(
          msg(
            'caution.weiss-j-classical',
            'J went to the classical limit J = ∞, or the data do not tell it from there (then 1/J is held at 0, see the notes): the data prefer classical moments, and Tc and Ms are those of the J = ∞ fit.'
          )
        );
      } else if (u.value >= 2) {
        extra.push(msg('caution.weiss-j-half', 'J went to its smallest value ½: the curve is squarer than any Brillouin function allows.'));
      }
      extra.push(msg('caution.weiss-j-effective', 'A fitted J is an effective shape parameter of the mean-field curve, not the spin of the ion: compare it with the fixed-J fits before quoting it.'));
    }
    return {
      outcome: {
        equation: free ? 'M = Ms·m(T/Tc), m = B_J(3J m/((J+1) τ)), J fitted (as 1/J)' : `M = Ms·m(T/Tc), m = B_J(3J m/((J+1) τ)), J = ${J === Infinity ? '∞ (Langevin)' : J}`,
        convention: conventionOf(fit.convention),
        fit,
        used: pts.x.length,
        curve,
        derived: [
          { name: 'Tc', value: Tc.value, sigma: Tc.sigma, note: msg('derived.weiss-tc', 'mean-field Curie temperature, in K') },
          { name: 'Ms', value: Ms.value, sigma: Ms.sigma, note: msg('derived.ms', 'saturation value, in the units of the y column') },
          ...spin
        ],
        cautions: [
          windowCaution(),
          msg('caution.mean-field-phenomenological', 'Mean field describes the whole curve only phenomenologically: real magnets follow spin waves (Bloch T^3/2) at low T and critical laws near Tc, so β = ½ here is assumed, not measured.'),
          msg('caution.field-rounding', 'A magnetisation measured in a field is not spontaneous: the field-induced tail rounds the curve at Tc.'),
          ...extra
        ]
      },
      fitted: { ...pts, curve: curve.y }
    };
  },
  views: ['data-and-curve'],
  model: job => ({ curve: weissMTModel(Number(job.options.J ?? spinOption.default), job.options.freeJ === true ? 'inverse' : false) })
} as const satisfies IAnalysisKind<'weiss'>;
