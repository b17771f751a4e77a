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

/**
 * Plausible range of an effective moment per formula unit, in μB. Free ions
 * carry at most about 10.6 μB (Dy³⁺, Ho³⁺) and a formula unit with a few
 * of them up to about 15; below 0.5 μB no local moment is left to fit a
 * Curie law to. Both limits are common practice, no source: outside them a
 * unit or normalisation mistake is far likelier than the moment.
 */
export const PEFF_PLAUSIBLE = { low: 0.5, high: 15 } as const;

/**
 * The factor by which p_eff changes when a molar χ given in one system is
 * read in the other: 1 cm³/mol = 4π·10⁻⁶ m³/mol [C7], and p_eff ∝ √(C/prefactor),
 * so p_eff(cgs number read as SI) / p_eff(cgs) = √(prefactor_cgs/prefactor_SI)
 * = √(0.1/μ0) ≈ √(10⁶/(4π)) ≈ 282.1.
 */
export function unitMistakeFactor(): number {
  return Math.sqrt(curiePrefactor('cgs-emu') / curiePrefactor('SI'));
}

/**
 * A message naming the likely unit or normalisation mistake when p_eff is
 * outside {@link PEFF_PLAUSIBLE}, else null.
 */
export function effectiveMomentPlausibility(pEff: number, units: MolarUnits): ICoreMessage | null {
  if (!Number.isFinite(pEff) || !(pEff > 0)) {
    return null;
  }
  const factor = unitMistakeFactor();
  const inRange = (p: number): boolean => p >= PEFF_PLAUSIBLE.low && p <= PEFF_PLAUSIBLE.high;
  const digits = { value: factor, digits: 4 };
  if (pEff > PEFF_PLAUSIBLE.high) {
    if (units === 'SI' && inRange(pEff / factor)) {
      return msg(
        'physics.curie-weiss.peff-cgs-as-si',
        'p_eff = %1 μB: the data look like cgs-emu values (emu mol⁻¹ Oe⁻¹) read as SI (m³ mol⁻¹). A molar χ in SI is 4π·10⁻⁶ times its cgs number, so p_eff comes out √(0.1/μ0) = %2 times too large; read as cgs-emu it is %3 μB. Set the units to cgs-emu.',
        { value: pEff, digits: 4 },
        digits,
        { value: pEff / factor, digits: 3 }
      );
    }
    return msg(
      'physics.curie-weiss.peff-high',
      'p_eff = %1 μB is above %2 μB, more than a few magnetic ions carry: check the units option (%3), the molar mass used to normalise, whether a mass susceptibility was read as molar, and the number of magnetic ions per formula unit (p_eff per formula unit grows as √n).',
      { value: pEff, digits: 4 },
      PEFF_PLAUSIBLE.high,
      units
    );
  }
  if (pEff < PEFF_PLAUSIBLE.low) {
    if (units === 'cgs-emu' && inRange(pEff * factor)) {
      return msg(
        'physics.curie-weiss.peff-si-as-cgs',
        'p_eff = %1 μB: the data may be SI values (m³ mol⁻¹) read as cgs-emu (emu mol⁻¹ Oe⁻¹), which makes p_eff %2 times too small; read as SI it is %3 μB. Otherwise y is not per mole: a mass susceptibility (emu g⁻¹ Oe⁻¹) must be multiplied by the molar mass (p_eff grows by √M_w, ×10 for 100 g/mol), and a raw emu/Oe divided by the amount of substance in mol.',
        { value: pEff, digits: 4 },
        digits,
        { value: pEff * factor, digits: 3 }
      );
    }
    return msg(
      'physics.curie-weiss.peff-low',
      'p_eff = %1 μB is below %2 μB: y is probably not a molar susceptibility. A mass susceptibility (per gram) must be multiplied by the molar mass (p_eff grows by √M_w, ×10 for 100 g/mol); a raw emu/Oe (moment over field) must be divided by the amount of substance in mol (p_eff grows by 1/√n, ×141 for 5·10⁻⁵ mol).',
      { value: pEff, digits: 4 },
      PEFF_PLAUSIBLE.low
    );
  }
  return null;
}

/**
 * |θ| more than this many times the fitted temperature range away from the
 * lowest fitted temperature: θ is a long extrapolation of 1/χ (common
 * practice, no source).
 */
export const THETA_EXTRAPOLATION_RANGES = 5;

/**
 * Cautions on θ against the fitted temperatures: θ at (or above) the lowest
 * fitted T, the window starting below 2θ [B2: fit at T ≳ 2·max(Tc, |θ|)], and
 * θ far outside the data. `correlation` is that of θ with χ0 (NaN when χ0 is fixed).
 */
export function thetaCautions(theta: number, Tmin: number, Tmax: number, correlation: number): ICoreMessage[] {
  const out: ICoreMessage[] = [];
  if (!Number.isFinite(theta)) {
    return out;
  }
  const range = Tmax - Tmin;
  if (theta >= Tmin - 1e-6 * Math.max(1, Math.abs(Tmin))) {
    out.push(
      msg(
        'physics.curie-weiss.theta-at-lowest-t',
        'θ = %1 K reached the lowest fitted temperature (%2 K): a paramagnet has θ below every temperature it is fitted at, so the window probably reaches into the ordered state, or y is not a susceptibility. Move the window up.',
        { value: theta, digits: 5 },
        { value: Tmin, digits: 5 }
      )
    );
  } else if (theta > 0 && Tmin < 2 * theta) {
    out.push(
      msg(
        'physics.curie-weiss.window-near-theta',
        'The window starts at %1 K, below 2θ = %2 K: critical fluctuations bend 1/χ there, which biases θ and C. Start the window higher if the data allow.',
        { value: Tmin, digits: 4 },
        { value: 2 * theta, digits: 4 }
      )
    );
  }
  if (range > 0 && Tmin - theta > THETA_EXTRAPOLATION_RANGES * range) {
    out.push(
      msg(
        'physics.curie-weiss.theta-extrapolated',
        'θ = %1 K lies %2 times the fitted range (%3–%4 K) below the data: it is a long extrapolation of 1/χ and hangs on χ0 (correlation of θ with χ0: %5). Quote it with that caution, or widen the window.',
        { value: theta, digits: 4 },
        { value: (Tmin - theta) / range, digits: 2 },
        { value: Tmin, digits: 4 },
        { value: Tmax, digits: 4 },
        { value: correlation, digits: 2 }
      )
    );
  }
  return out;
}
