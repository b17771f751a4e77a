/**
 * Curie–Weiss susceptibility χ = χ0 + C/(T − θ) and the effective moment
 * [B2 in REFERENCES.md]. y must be a molar susceptibility in the units the
 * option names; the effective moment is checked for plausibility (a value
 * outside 0.5–15 μB names the likely unit or normalisation mistake) and θ
 * against the fitted temperatures (see physics/curie-weiss.ts).
 */
import { curieWeissModel, effectiveMomentPlausibility, fitCurieWeiss, thetaCautions } from '../../physics/curie-weiss';
import { msg } from '../../messages';
import type { ICoreMessage } from '../../messages';
import { conventionOf, correlation, curveOf, extent, requireChangingY, requirePoints, startValue, startsOver, valueOf } from './common';
import type { IAnalysisKind, IChoiceOption } from './types';

export const unitsOption: IChoiceOption<string> = {
  type: 'choice',
  label: msg('option.units', 'χ units'),
  choices: [
    { value: 'cgs-emu', label: msg('option.units.cgs', 'cgs molar (emu mol⁻¹ Oe⁻¹)') },
    { value: 'SI', label: msg('option.units.si', 'SI molar (m³ mol⁻¹)') }
  ],
  default: 'cgs-emu'
};

export const curieWeissKind = {
  id: 'curie-weiss',
  label: msg('kind.curie-weiss', 'Curie–Weiss χ0 + C/(T − θ)'),
  description: msg(
    'kind.curie-weiss.description',
    'Paramagnetic susceptibility well above the ordering: θ, C and the effective moment. y must be a molar susceptibility, in emu mol⁻¹ Oe⁻¹ (cgs-emu) or m³ mol⁻¹ (SI) as the units option says.'
  ),
  options: { units: unitsOption },
  minPoints: () => 5,
  run: (job, pts, hooks) => {
    const units = job.options.units === 'SI' ? 'SI' : 'cgs-emu';
    // C, θ and χ0: 3 free parameters.
    requirePoints(pts, 5, 3);
    requireChangingY(pts, 'curie-weiss');
    const given = ['C', 'theta', 'chi0'].some(name => startValue(job, name) !== undefined);
    const start = given ? (startsOver(job, ['C', 'theta', 'chi0'], defaultStart(pts.x, pts.y)) as [number, number, number]) : undefined;
    const fit = fitCurieWeiss({ T: pts.x, chi: pts.y, sigma: pts.sigma }, { units, start, engine: { ...hooks } });
    const C = valueOf(fit, 'C');
    const theta = valueOf(fit, 'theta');
    const chi0 = valueOf(fit, 'chi0');
    const curve = curveOf(curieWeissModel, fit.values, pts.x);
    const { min: Tmin, max: Tmax } = extent(pts.x);
    const checks: ICoreMessage[] = [];
    const plausibility = effectiveMomentPlausibility(fit.pEff, units);
    if (plausibility) {
      checks.push(plausibility);
    }
    checks.push(...thetaCautions(theta.value, Tmin, Tmax, correlation(fit, 'theta', 'chi0')));
    return {
      outcome: {
        equation: 'χ = χ0 + C/(T − θ)',
        convention: conventionOf(fit.convention),
        fit,
        used: pts.x.length,
        curve,
        derived: [
          { name: 'C', value: C.value, sigma: C.sigma, note: units === 'SI' ? msg('derived.curie-si', 'Curie constant, m³ K mol⁻¹') : msg('derived.curie-cgs', 'Curie constant, emu K mol⁻¹ Oe⁻¹') },
          { name: 'θ', value: theta.value, sigma: theta.sigma, note: msg('derived.theta', 'Weiss temperature, K (> 0: net ferromagnetic)') },
          { name: 'χ0', value: chi0.value, sigma: chi0.sigma, note: msg('derived.chi0', 'temperature-independent term') },
          {
            name: 'p_eff',
            value: fit.pEff,
            sigma: fit.pEffError,
            note: units === 'SI' ? msg('derived.peff-si', 'effective moment in μB per formula unit (SI molar χ assumed)') : msg('derived.peff-cgs', 'effective moment in μB per formula unit (cgs molar χ assumed)')
          }
        ],
        cautions: [
          ...checks,
          msg('caution.curie-weiss-range', 'Fit only well above the ordering temperature (T ≳ 2·max(Tc, |θ|)): critical fluctuations bend 1/χ near Tc.'),
          units === 'SI'
            ? msg('caution.peff-units.si', 'y must be a molar susceptibility in m³ mol⁻¹ (SI): multiply a mass susceptibility (m³ kg⁻¹) by the molar mass in kg/mol. p_eff is per formula unit, not per magnetic ion.')
            : msg('caution.peff-units.cgs', 'y must be a molar susceptibility in emu mol⁻¹ Oe⁻¹ (= cm³ mol⁻¹, cgs-emu): multiply a mass susceptibility (emu g⁻¹ Oe⁻¹) by the molar mass, divide a raw emu/Oe by the amount of substance in mol. p_eff is per formula unit, not per magnetic ion.'),
          msg('caution.remanent-field', 'A nominal zero field in a superconducting magnet can be 0.1–3 mT of remanent field.')
        ]
      },
      fitted: { ...pts, curve: curve.y }
    };
  },
  views: ['data-and-curve'],
  model: () => ({ curve: curieWeissModel })
} as const satisfies IAnalysisKind<'curie-weiss'>;

/** The start fitCurieWeiss takes by itself: 1/χ ≈ (T − θ)/C through the first and last points, χ0 = 0. */
function defaultStart(T: readonly number[], chi: readonly number[]): [number, number, number] {
  const last = T.length - 1;
  const C0 = (T[last] - T[0]) / (1 / chi[last] - 1 / chi[0]);
  return [C0, T[0] - C0 / chi[0], 0];
}
