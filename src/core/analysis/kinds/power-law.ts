/**
 * Critical power law y = A(1 − T/Tc)^(pβ) [+ y0] with Tc free, for an order
 * parameter (p = 1) or a quantity that goes as its square (p = 2), and the
 * same law with Wegner's first correction to scaling [B17 in REFERENCES.md].
 */
import { fitPowerLaw, powerLawModel } from '../../physics/critical';
import type { IPowerLawOptions } from '../../physics/critical';
import { msg } from '../../messages';
import type { ICoreMessage } from '../../messages';
import type { IAnalysisJob, IDerivedValue } from '../types';
import type { IWindowedPoints } from '../window';
import type { IAnalysisHooks } from '../hooks';
import { conventionOf, correlation, curveOf, requireChangingY, requirePoints, startValue, valueOf, windowCaution } from './common';
import type { IAnalysisKind, IChoiceOption, IKindResult, IBooleanOption } from './types';

/** Tc estimate for data that run through the transition: where |y| last exceeds 10 % of its largest value. */
export function crossingEstimate(pts: IWindowedPoints): { Tc: number; spansTc: boolean } {
  let ymax = 0;
  let Tmax = -Infinity;
  for (let i = 0; i < pts.x.length; i++) {
    ymax = Math.max(ymax, Math.abs(pts.y[i]));
    Tmax = Math.max(Tmax, pts.x[i]);
  }
  let last = -Infinity;
  let above = 0;
  for (let i = 0; i < pts.x.length; i++) {
    if (Math.abs(pts.y[i]) > 0.1 * ymax) {
      last = Math.max(last, pts.x[i]);
    } else {
      above++;
    }
  }
  const spansTc = above >= 2 && last < Tmax;
  return { Tc: spansTc ? last : Tmax, spansTc };
}

export const proxyOption: IChoiceOption<number> = {
  type: 'choice',
  label: msg('option.proxy', 'data'),
  choices: [
    { value: 1, label: msg('option.proxy.psi', 'y ∝ ψ (magnetisation, polarisation)') },
    { value: 2, label: msg('option.proxy.psi2', 'y ∝ ψ² (intensity, SHG, superfluid density)') }
  ],
  default: 1
};

export const backgroundOption: IBooleanOption = { type: 'boolean', label: msg('option.background', 'constant background'), default: false };

/**
 * Value of {@link deltaOption} meaning "Δ fitted": Δ = ων > 0 always, so 0
 * cannot be a class value, and saved files of versions without it stay valid.
 */
export const FREE_DELTA = 0;

/** Correction-to-scaling exponents Δ by universality class [B17], or Δ fitted. */
export const deltaOption: IChoiceOption<number> = {
  type: 'choice',
  label: msg('option.wegner-delta', 'correction exponent Δ'),
  choices: [
    { value: 0.52, label: msg('option.wegner-delta.ising', '0.52 (3D Ising)') },
    { value: 0.53, label: msg('option.wegner-delta.xy', '0.53 (3D XY)') },
    { value: 0.55, label: msg('option.wegner-delta.heisenberg', '0.55 (3D Heisenberg)') },
    { value: FREE_DELTA, label: msg('option.wegner-delta.free', 'free (fitted)') }
  ],
  default: 0.52
};

/** The physics options of a power-law job on its points (`wegnerDelta` undefined: no correction term). */
function powerLawOptions(job: IAnalysisJob, pts: IWindowedPoints, wegnerDelta: number | undefined): IPowerLawOptions {
  const { spansTc } = crossingEstimate(pts);
  const freeDelta = wegnerDelta === FREE_DELTA;
  return {
    proxyPower: Number(job.options.proxyPower ?? 1),
    background: job.options.background === true,
    allowTcInsideData: spansTc,
    aboveTc: 'zero',
    wegnerDelta: freeDelta ? undefined : wegnerDelta,
    freeDelta
  };
}

/** The correction exponent a power-law kind's job asks for (undefined: none). */
function deltaOf(job: IAnalysisJob): number | undefined {
  return job.kind === 'power-law-corrected' ? Number(job.options.wegnerDelta ?? deltaOption.default) : undefined;
}

/** Start values given with the job, by the physics module's names. */
const START_NAMES = ['A', 'Tc', 'beta', 'y0', 'aW', 'Delta'] as const;

function runPowerLaw(job: IAnalysisJob, pts: IWindowedPoints, hooks: IAnalysisHooks, wegnerDelta: number | undefined): IKindResult {
  const proxyPower = Number(job.options.proxyPower ?? 1);
  const background = job.options.background === true;
  requireChangingY(pts, 'transition');
  const { Tc, spansTc } = crossingEstimate(pts);
  const freeDelta = wegnerDelta === FREE_DELTA;
  const options = powerLawOptions(job, pts, wegnerDelta);
  const start: NonNullable<IPowerLawOptions['start']> = spansTc ? { Tc } : {};
  for (const name of START_NAMES) {
    const v = startValue(job, name);
    if (v !== undefined) {
      start[name] = v;
    }
  }
  const fit = fitPowerLaw(
    { T: pts.x, y: pts.y, sigma: pts.sigma },
    { ...options, start: Object.keys(start).length > 0 ? start : undefined, engine: { ...hooks } }
  );
  const Tcv = valueOf(fit, 'Tc');
  const beta = valueOf(fit, 'beta');
  const r = correlation(fit, 'Tc', 'beta');
  const cautions: ICoreMessage[] = [
    windowCaution(),
    msg('caution.tc-beta-correlated', 'Tc and β are correlated (r = %1): quote them together, and do not fix Tc from another criterion before fitting β.', { value: r, digits: 2 })
  ];
  if (spansTc) {
    cautions.push(msg('caution.window-through-tc', 'The window runs through Tc: points above Tc are fitted as zero order parameter. Asymptotic exponents need a window close to Tc.'));
  }
  if (wegnerDelta !== undefined && !freeDelta) {
    cautions.push(msg('caution.wegner', 'With the correction term, β is the asymptotic exponent only if Δ is that of the right universality class; compare with the fit without it.'));
  }
  if (freeDelta) {
    cautions.push(
      msg('caution.wegner-free', 'With Δ fitted, β, aW and Δ are strongly correlated (r(β, Δ) = %1): a window far wider than the correction needs is required to fix Δ; prefer Δ fixed to a class value unless the data say otherwise.', {
        value: correlation(fit, 'beta', 'Delta'),
        digits: 2
      })
    );
  }
  cautions.push(msg('caution.field-tail', 'A magnetisation measured in a field is not spontaneous: the field-induced tail near Tc biases Tc and β.'));
  const derived: IDerivedValue[] = [
    { name: 'Tc', value: Tcv.value, sigma: Tcv.sigma, note: msg('derived.tc', 'transition temperature, in the units of the x column') },
    {
      name: 'β',
      value: beta.value,
      sigma: beta.sigma,
      note: proxyPower === 1 ? msg('derived.beta', 'order-parameter exponent') : msg('derived.beta-proxy', 'order-parameter exponent (the data go as ψ^%1, so they fall as (−t)^(%1β))', proxyPower)
    }
  ];
  if (freeDelta) {
    const d = valueOf(fit, 'Delta');
    derived.push({ name: 'Δ', value: d.value, sigma: d.sigma, note: msg('derived.wegner-delta', 'correction-to-scaling exponent, fitted') });
  }
  const p = proxyPower === 1 ? '' : `${proxyPower}·`;
  const correction = wegnerDelta === undefined ? '' : `·[1 + aW·(1 − T/Tc)^${freeDelta ? 'Δ' : wegnerDelta}]`;
  const curve = curveOf(powerLawModel(options), fit.values, pts.x);
  for (const d of derived) {
    if (!Number.isFinite(d.sigma)) {
      d.sigmaReason = fit.converged
        ? msg('derived.no-covariance', 'The fit gave no finite covariance, so no uncertainty can be propagated.')
        : msg('derived.not-converged', 'The fit did not converge, so its values carry no uncertainty.');
    }
  }
  return {
    outcome: {
      equation: `y = A·(1 − T/Tc)^(${p}β)${correction}${background ? ' + y0' : ''} below Tc, ${background ? 'y0' : '0'} above`,
      convention: conventionOf(fit.convention),
      fit,
      used: pts.x.length,
      curve,
      derived,
      cautions
    },
    fitted: { ...pts, curve: curve.y }
  };
}

/** The critical power law with Tc free. */
export const powerLawKind = {
  id: 'power-law',
  label: msg('kind.power-law', 'Critical power law A(1 − T/Tc)^β'),
  description: msg('kind.power-law.description', 'Tc and β from the ordered side, close to the transition.'),
  options: { proxyPower: proxyOption, background: backgroundOption },
  minPoints: o => (o.background === true ? 6 : 5),
  run: (job, pts, hooks) => {
    // A, Tc, β [, y0].
    requirePoints(pts, job.options.background === true ? 6 : 5, job.options.background === true ? 4 : 3);
    return runPowerLaw(job, pts, hooks, undefined);
  },
  views: ['data-and-curve'],
  model: (job, pts) => ({ curve: powerLawModel(powerLawOptions(job, pts, deltaOf(job))) })
} as const satisfies IAnalysisKind<'power-law'>;

/** The critical power law with Wegner's first correction to scaling, Δ fixed to a class value or fitted. */
export const powerLawCorrectedKind = {
  id: 'power-law-corrected',
  label: msg('kind.power-law-corrected', 'Critical power law with correction to scaling'),
  description: msg('kind.power-law-corrected.description', 'Asymptotic β from a wider window: A(1 − T/Tc)^β·[1 + aW(1 − T/Tc)^Δ], Δ fixed to a class value or fitted.'),
  options: { proxyPower: proxyOption, background: backgroundOption, wegnerDelta: deltaOption },
  minPoints: o => (o.background === true ? 7 : 6) + (Number(o.wegnerDelta) === FREE_DELTA ? 1 : 0),
  run: (job, pts, hooks) => {
    // A, Tc, β, aW [, y0] [, Δ].
    const extra = (job.options.background === true ? 1 : 0) + (Number(job.options.wegnerDelta) === FREE_DELTA ? 1 : 0);
    requirePoints(pts, 6 + extra, 4 + extra);
    return runPowerLaw(job, pts, hooks, Number(job.options.wegnerDelta ?? deltaOption.default));
  },
  views: ['data-and-curve'],
  model: (job, pts) => ({ curve: powerLawModel(powerLawOptions(job, pts, deltaOf(job))) })
} as const satisfies IAnalysisKind<'power-law-corrected'>;
