/**
 * Models of the synthetic benchmark workloads (/work/shared/bench/README.md),
 * taken from the product so the bench measures what users run:
 * - critical power law with the odd continuation above Tc
 *   (A·sign(1−T/Tc)·|1−T/Tc|^β, `powerLawModel({ aboveTc: 'signed' })`);
 * - Weiss mean field, spin ½, zero field: M = Ms·m(T/Tc)
 *   (`weissMTModel(0.5, false)`);
 * - Curie–Weiss χ = C/(T − θ) + χ0 (`curieWeissModel`).
 * Each comes with its analytic Jacobian and, for comparison with SciPy's
 * finite differences, as the bare `evaluate` (the engine then differences).
 */
import type { IFitModel } from '../src/core/fit/index';
import { powerLawModel } from '../src/core/physics/critical/index';
import { curieWeissModel } from '../src/core/physics/curie-weiss';
import { weissMTModel } from '../src/core/physics/weiss-fit';

function withoutJacobian(m: IFitModel): IFitModel {
  return { parameters: m.parameters, pointwise: m.pointwise, evaluate: (p, x, out) => m.evaluate(p, x, out) };
}

export const powerLawAnalytic: IFitModel = powerLawModel({ aboveTc: 'signed' });
export const powerLaw: IFitModel = withoutJacobian(powerLawModel({ aboveTc: 'signed' }));
export const curieWeissAnalytic: IFitModel = curieWeissModel;
export const curieWeiss: IFitModel = withoutJacobian(curieWeissModel);
export const weissAnalytic: IFitModel = weissMTModel(0.5, false);
export const weiss: IFitModel = withoutJacobian(weissMTModel(0.5, false));
