/**
 * Curie–Weiss law χ = χ0 + C/(T − θ) and the effective moment from the
 * molar Curie constant ([B2 in REFERENCES.md], prefactors [C7]):
 *   cgs-emu molar:  C_mol = N_A μB² p²/(3 kB)        (cm³ K mol⁻¹)
 *   SI molar:       C_mol = μ0 N_A μB² p²/(3 kB)     (m³ K mol⁻¹)
 */
import { fitCurve } from '../fit/index';
import type { IFitModel, IFitOptions, IFitResult } from '../fit/index';
import { msg } from '../messages';
import type { ICoreMessage } from '../messages';
import { wholeNumber } from '../numeric/messageArgs';
import { PHYS } from '../units/constants';
import { lengthsDiffer, PhysicsInputError, pointNotFinite, tooFewPoints } from './errors';

/** Unit system of a molar susceptibility. */
export type MolarUnits = 'cgs-emu' | 'SI';

/** Curie prefactor per p_eff²: N_A μB²/(3 kB) (cgs-emu, cm³ K mol⁻¹) or μ0 N_A μB²/(3 kB) (SI, m³ K mol⁻¹). */
export function curiePrefactor(units: MolarUnits): number {
  if (units === 'SI') {
    return (PHYS.mu0 * PHYS.NA * PHYS.muB * PHYS.muB) / (3 * PHYS.kB);
  }
  // Gaussian units: μB in erg/G (×1e3), kB in erg/K (×1e7)
  const muB = PHYS.muB * 1e3;
  return (PHYS.NA * muB * muB) / (3 * PHYS.kB * 1e7);
}

/** Effective moment p_eff = μ_eff/μB per magnetic ion from a molar Curie constant. */
export function effectiveMoment(
  Cmol: number,
  units: MolarUnits,
  ionsPerFormulaUnit = 1
): { pEff: number; convention: ICoreMessage } {
  if (!(Cmol > 0) || !Number.isFinite(Cmol)) {
    throw new PhysicsInputError(msg('physics.curie-constant-not-positive', 'The Curie constant must be a finite number above 0, but it is %1.', Cmol));
  }
  if (!(ionsPerFormulaUnit > 0)) {
    throw new PhysicsInputError(
      msg('physics.ions-not-positive', 'The number of magnetic ions per formula unit must be above 0, but it is %1.', ionsPerFormulaUnit)
    );
  }
  return {
    pEff: Math.sqrt(Cmol / (ionsPerFormulaUnit * curiePrefactor(units))),
    convention:
      units === 'SI'
        ? msg('physics.curie-weiss.moment-si', 'Molar SI units: C_mol = μ0·N_A·μB²·p_eff²/(3kB), with p_eff per magnetic ion.')
        : msg('physics.curie-weiss.moment-cgs', 'Molar cgs-emu units: C_mol = N_A·μB²·p_eff²/(3kB), with p_eff per magnetic ion.')
  };
}

/** Free-ion effective moment g √(J(J+1)). */
export function freeIonMoment(g: number, J: number): number {
  return g * Math.sqrt(J * (J + 1));
}

/** Result of a Curie–Weiss fit. */
export interface ICurieWeissFitResult extends IFitResult {
  /** The model, units and normalisation, for people (code `physics.curie-weiss.convention`). */
  convention: ICoreMessage;
  /** p_eff per ion with its standard error (propagated from C). */
  pEff: number;
  pEffError: number;
  units: MolarUnits;
  /** Temperature window actually used (points below `Tmin` are excluded). */
  Tmin: number;
}

/**
 * The model χ = χ0 + C/(T − θ), parameters C, theta, chi0, analytic Jacobian.
 * Parameters are read into locals once per call (the output arrays could
 * alias `p` as far as the compiler knows, so it would reload them per point).
 */
export const curieWeissModel: IFitModel = {
  parameters: ['C', 'theta', 'chi0'],
  pointwise: true,
  evaluate(p, x, out) {
    const C = p[0];
    const theta = p[1];
    const chi0 = p[2];
    const n = x.length;
    for (let i = 0; i < n; i++) {
      out[i] = chi0 + C / (x[i] - theta);
    }
  },
  jacobian(p, x, out) {
    const C = p[0];
    const theta = p[1];
    const n = x.length;
    for (let i = 0; i < n; i++) {
      const d = 1 / (x[i] - theta);
      out[i * 3] = d;
      out[i * 3 + 1] = C * d * d;
      out[i * 3 + 2] = 1;
    }
  },
  evaluateWithJacobian(p, x, out, jac) {
    const C = p[0];
    const theta = p[1];
    const chi0 = p[2];
    const n = x.length;
    for (let i = 0; i < n; i++) {
      const dx = x[i] - theta;
      const d = 1 / dx;
      out[i] = chi0 + C / dx; // exactly as evaluate()
      const o = i * 3;
      jac[o] = d;
      jac[o + 1] = C * d * d;
      jac[o + 2] = 1;
    }
  }
};

/**
 * Fits χ(T) = χ0 + C/(T − θ) on T ≥ Tmin (default: all points; near Tc critical
 * fluctuations bend 1/χ, so T ≳ 2 max(Tc, |θ|) is advisable). `fixChi0` pins χ0 (default free).
 */
export function fitCurieWeiss(
  data: { T: ArrayLike<number>; chi: ArrayLike<number>; sigma?: ArrayLike<number> },
  options: { units: MolarUnits; Tmin?: number; ionsPerFormulaUnit?: number; start?: [number, number, number]; fixChi0?: boolean; engine?: Partial<IFitOptions> }
): ICurieWeissFitResult {
  const Tmin = options.Tmin ?? -Infinity;
  const T: number[] = [];
  const y: number[] = [];
  const s: number[] = [];
  if (data.T.length !== data.chi.length) {
    throw new PhysicsInputError(lengthsDiffer({ T: data.T.length, chi: data.chi.length }));
  }
  for (let i = 0; i < data.T.length; i++) {
    if (!Number.isFinite(data.T[i]) || !Number.isFinite(data.chi[i])) {
      throw new PhysicsInputError(Number.isFinite(data.T[i]) ? pointNotFinite(i, 'chi', data.chi[i]) : pointNotFinite(i, 'T', data.T[i]));
    }
    if (data.T[i] >= Tmin) {
      T.push(data.T[i]);
      y.push(data.chi[i]);
      if (data.sigma) {
        s.push(data.sigma[i]);
      }
    }
  }
  if (T.length < 4) {
    throw new PhysicsInputError(
      Tmin === -Infinity
        ? tooFewPoints(4, T.length)
        : msg('physics.curie-weiss.too-few-above', 'The Curie–Weiss fit needs at least 4 points at T ≥ %1 K, but there are %2: lower the lowest temperature of the fit.', Tmin, wholeNumber(T.length))
    );
  }
  let start = options.start;
  if (!start) {
    // 1/χ ≈ (T − θ)/C from the two ends, χ0 = 0
    const i0 = 0;
    const i1 = T.length - 1;
    const C0 = (T[i1] - T[i0]) / (1 / y[i1] - 1 / y[i0]);
    start = [C0, T[i0] - C0 / y[i0], 0];
  }
  let minT = Infinity;
  for (const t of T) {
    minT = Math.min(minT, t);
  }
  const res = fitCurve(
    curieWeissModel,
    { x: T, y, sigma: data.sigma ? s : undefined },
    { upper: [Infinity, minT - 1e-9 * Math.abs(minT), Infinity], fixed: [false, false, options.fixChi0 === true], ...options.engine, start }
  );
  const n = options.ionsPerFormulaUnit ?? 1;
  const C = res.values[0];
  const sC = res.standardErrors[0];
  const pEff = C > 0 ? effectiveMoment(C, options.units, n).pEff : NaN;
  return {
    ...res,
    convention: msg('physics.curie-weiss.convention', 'χ = χ0 + C/(T − θ) in molar %1 units; p_eff per magnetic ion.', options.units),
    pEff,
    pEffError: C > 0 ? (pEff * sC) / (2 * C) : NaN,
    units: options.units,
    Tmin
  };
}
