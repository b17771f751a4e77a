/**
 * Fit of convention-L coefficients (a, T0, b, c; no cubic term) to the
 * equilibrium order parameter ψ(T) at h = 0, optionally jointly with
 * 1/χ(T) (= F″ at the minimum) and the specific-heat jump ΔC = T0 a²/(2b).
 * ψ(T) alone fixes only T0, b/a and c/a (F can be rescaled), so without
 * 1/χ or ΔC the scale `a` is held at its start value and a warning says so.
 * Joint fits need per-point σ in every data set so that the weights are
 * meaningful.
 */
import { fitCurve } from '../../fit/index';
import type { IFitModel, IFitOptions, IFitResult } from '../../fit/index';
import { messageOf, msg } from '../../messages';
import { wholeNumber } from '../../numeric/messageArgs';
import { lengthsDiffer, PhysicsInputError, tooFewPoints } from '../errors';
import type { AnyLandauCoefficients, ILandauCoefficients, LandauConvention } from './conventions';
import { fromConventionL } from './conventions';
import { landauFitModel } from './fit-model';

export { landauEquilibriumPsi } from './fit-model';

/** The data sets of a Landau fit, by kind, as named in messages. */
const DATA_SETS = [
  { name: 'ψ(T)', value: 'ψ' },
  { name: '1/χ(T)', value: '1/χ' },
  { name: 'ΔC', value: 'ΔC' }
];

/** Data for a Landau fit. */
export interface ILandauFitData {
  psi: { T: ArrayLike<number>; y: ArrayLike<number>; sigma?: ArrayLike<number> };
  inverseChi?: { T: ArrayLike<number>; y: ArrayLike<number>; sigma: ArrayLike<number> };
  specificHeatJump?: { value: number; sigma: number };
}

/** Result of a Landau fit in convention L. */
export interface ILandauFitResult extends IFitResult {
  convention: 'L';
  coefficients: ILandauCoefficients;
  /** True when only ψ(T) was given and `a` was held fixed. */
  scaleFixed: boolean;
  /** The fitted coefficients re-expressed in `reportIn` (when requested and representable). */
  converted: AnyLandauCoefficients | null;
}

/**
 * Fits (a, T0, b, c). `sextic: false` (default true) fixes c = 0 (2-4 model,
 * then b > 0 is enforced).
 */
export function fitLandau(
  data: ILandauFitData,
  options: {
    start: ILandauCoefficients;
    sextic?: boolean;
    /** Also report the result in this convention (the fit itself is always done in L). */
    reportIn?: LandauConvention;
    engine?: Partial<IFitOptions>;
  }
): ILandauFitResult {
  const kinds: number[] = [];
  const Ts: number[] = [];
  const ys: number[] = [];
  const ss: number[] = [];
  const joint = data.inverseChi !== undefined || data.specificHeatJump !== undefined;
  const add = (kind: number, T: ArrayLike<number>, y: ArrayLike<number>, s?: ArrayLike<number>): void => {
    const set = DATA_SETS[kind];
    if (T.length !== y.length || (s !== undefined && s.length !== T.length)) {
      throw new PhysicsInputError(lengthsDiffer(s !== undefined ? { T: T.length, [set.value]: y.length, σ: s.length } : { T: T.length, [set.value]: y.length }));
    }
    for (let i = 0; i < T.length; i++) {
      if (!Number.isFinite(T[i]) || !Number.isFinite(y[i])) {
        throw new PhysicsInputError(
          msg('physics.landau.point-not-finite', 'Point %1 of the %2 data is not finite (T = %3, %4 = %5).', wholeNumber(i + 1), set.name, T[i], set.value, y[i])
        );
      }
      kinds.push(kind);
      Ts.push(T[i]);
      ys.push(y[i]);
      ss.push(s ? s[i] : 1);
    }
  };
  if (joint && data.psi.sigma === undefined) {
    throw new PhysicsInputError(
      msg('physics.landau.joint-needs-sigma', 'A joint fit needs σ for ψ(T) as well, so that the data sets are weighted consistently.')
    );
  }
  add(0, data.psi.T, data.psi.y, data.psi.sigma);
  if (data.inverseChi) {
    add(1, data.inverseChi.T, data.inverseChi.y, data.inverseChi.sigma);
  }
  if (data.specificHeatJump) {
    add(2, [0], [data.specificHeatJump.value], [data.specificHeatJump.sigma]);
  }
  if (Ts.length < 4) {
    throw new PhysicsInputError(tooFewPoints(4, Ts.length));
  }
  const sextic = options.sextic !== false;
  const model: IFitModel = landauFitModel(kinds, Ts);
  const s = options.start;
  const res = fitCurve(
    model,
    { x: Ts.map((_, i) => i), y: ys, sigma: joint || data.psi.sigma ? ss : undefined },
    {
      lower: [1e-300, -Infinity, sextic ? -Infinity : 1e-300, 0],
      upper: [Infinity, Infinity, Infinity, Infinity],
      fixed: [!joint, false, false, !sextic],
      ...options.engine,
      start: [s.a, s.T0, s.b, sextic ? s.c : 0]
    }
  );
  const warnings = res.warnings.slice();
  if (!joint) {
    warnings.push(
      msg('physics.landau.scale-fixed', 'Only ψ(T) was given, so a is held at its start value: T0, b/a and c/a are determined, the overall scale is not.')
    );
  }
  const coefficients: ILandauCoefficients = { a: res.values[0], T0: res.values[1], b: res.values[2], c: res.values[3], d: 0 };
  let converted: AnyLandauCoefficients | null = null;
  if (options.reportIn !== undefined) {
    try {
      converted = fromConventionL(coefficients, options.reportIn);
    } catch (e) {
      warnings.push(msg('physics.landau.cannot-convert', 'The result cannot be written in convention %1.', options.reportIn));
      warnings.push(messageOf(e));
    }
  }
  return { ...res, warnings, convention: 'L', coefficients, scaleFixed: !joint, converted };
}
