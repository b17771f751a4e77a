/**
 * Bean–Rodbell magnetovolume model fitted to M(T) at zero field, η free
 * [B11 in REFERENCES.md]: M = Ms·σ(T/T0; η, J). η < 1 gives a second-order
 * transition at T0, η > 1 a first-order one at Tc = T0·τc(η) > T0 with a jump
 * of M; the order is stated from (η − 1)/σ_η with how sure.
 */
import { beanRodbellTransition } from '../../physics/bean-rodbell';
import { beanRodbellStart, fitBeanRodbell } from '../../physics/bean-rodbell-fit';
import { regularizedGammaQ } from '../../numeric/chi2';
import { msg } from '../../messages';
import type { ICoreMessage } from '../../messages';
import type { IDerivedValue } from '../types';
import { grid } from '../window';
import { extent, requireChangingY, requirePoints, startValue, startsOver, valueOf, windowCaution } from './common';
import { robustScatter } from './landau';
import { crossingEstimate } from './power-law';
import type { IAnalysisKind, IChoiceOption, IOptionChoice } from './types';
import { beanRodbellMagnetisation } from '../../physics/bean-rodbell';
import type { IFitModel } from '../../fit/types';

/** Names of the fitted parameters, in the order of the fit. */
const PARAMETERS = ['Ms', 'T0', 'eta'] as const;

/** The fitted M(T) = Ms·σ(T/T0; η, J) as an engine model (NaN where T0 ≤ 0 or η < 0, as in the fit). */
function beanRodbellModel(J: number): IFitModel {
  let tau = new Float64Array(0);
  return {
    parameters: PARAMETERS,
    evaluate(p, x, out) {
      if (!(p[1] > 0) || !(p[2] >= 0)) {
        out.fill(Number.NaN);
        return;
      }
      if (tau.length !== x.length) {
        tau = new Float64Array(x.length);
      }
      for (let i = 0; i < x.length; i++) {
        tau[i] = x[i] / p[1];
      }
      const s = beanRodbellMagnetisation(J, p[2], tau);
      for (let i = 0; i < x.length; i++) {
        out[i] = p[0] * s[i];
      }
    }
  };
}

const SPINS: IOptionChoice<number>[] = [0.5, 1, 1.5, 2, 2.5, 3, 3.5].map(J => ({
  value: J,
  label: msg('option.spin.value', '%1', J % 1 === 0 ? String(J) : `${2 * J}/2`)
}));

/** Spin J of the moments (the Brillouin function of the model). */
export const beanRodbellSpinOption: IChoiceOption<number> = {
  type: 'choice',
  label: msg('option.spin', 'spin J'),
  choices: [...SPINS, { value: Infinity, label: msg('option.spin.langevin', '∞ (Langevin, classical moments)') }],
  default: 0.5
};

/** |z| at or beyond which the order is stated (2σ). */
const ORDER_Z = 2;

/** η within this of 1 is called borderline whatever its σ. */
const BORDERLINE = 0.1;

/** Starts of η when the ordered-branch start fails: one on each side of the tricritical value 1; the fit with the smaller χ² is kept. */
const ETA_STARTS = [0.5, 1.6];

/**
 * Step of the numerical derivatives of τc(η) and the jump: 1e-3·σ_η (at
 * least 1e-6), central, one-sided (towards larger η) within a step of η = 1
 * where τc has a kink.
 */
const STEP = 1e-3;

/** Φ(x) of the standard normal. */
function normalCdf(x: number): number {
  const tail = 0.5 * regularizedGammaQ(0.5, (x * x) / 2);
  return x >= 0 ? 1 - tail : tail;
}

export const beanRodbellKind = {
  id: 'bean-rodbell',
  label: msg('kind.bean-rodbell', 'Bean–Rodbell magnetovolume model M(T)'),
  description: msg('kind.bean-rodbell.description', 'T0, η and Ms from M(T) at zero field; η > 1 means a first-order transition at Tc > T0.'),
  options: { J: beanRodbellSpinOption },
  minPoints: () => 4,
  run: (job, pts, hooks) => {
    // Ms, T0, η: 3 free parameters.
    requirePoints(pts, 4, 3);
    requireChangingY(pts, 'transition');
    const J = Number(job.options.J ?? beanRodbellSpinOption.default);
    let ymax = 0;
    let peak = 0;
    for (const v of pts.y) {
      if (Math.abs(v) > ymax) {
        ymax = Math.abs(v);
        peak = v;
      }
    }
    const { Tc: Tcross, spansTc } = crossingEstimate(pts);
    const { max: Tmax } = extent(pts.x);
    const T0start = spansTc ? Tcross : Tmax * 1.01;
    let best: ReturnType<typeof fitBeanRodbell> | null = null;
    // Start from the ordered branch fitted as T(M), smooth across the jump; else one start on each side of η = 1.
    let start: [number, number, number] | null = null;
    try {
      start = beanRodbellStart({ T: pts.x, M: pts.y, sigma: pts.sigma }, { J, sigmaM: robustScatter(pts.x, pts.y), T0: T0start, engine: { shouldStop: hooks.shouldStop } });
    } catch {
      start = null;
    }
    let starts: [number, number, number][] = start !== null && start.every(Number.isFinite) ? [start] : ETA_STARTS.map(eta => [peak * 1.02, T0start, eta]);
    if (PARAMETERS.some(name => startValue(job, name) !== undefined)) {
      // Starts given with the job: one fit from there (missing names from the first automatic start).
      starts = [startsOver(job, PARAMETERS, starts[0]) as [number, number, number]];
    }
    for (const s of starts) {
      const r = fitBeanRodbell({ T: pts.x, M: pts.y, sigma: pts.sigma }, { J, start: s, engine: { shouldStop: hooks.shouldStop } });
      if (best === null || (r.converged && !best.converged) || (r.converged === best.converged && r.chi2 < best.chi2)) {
        best = r;
      }
      if (hooks.shouldStop?.() === true) {
        break;
      }
    }
    const fit = best!;
    const Ms = valueOf(fit, 'Ms');
    const T0 = valueOf(fit, 'T0');
    const eta = valueOf(fit, 'eta');
    const iT = fit.parameters.indexOf('T0');
    const iE = fit.parameters.indexOf('eta');
    const iM = fit.parameters.indexOf('Ms');
    const cov = fit.covariance;
    const covOk = [iT, iE, iM].every(i => Number.isFinite(cov[i]?.[i]));
    // τc(η) and the jump with their derivatives in η.
    const at = (e: number): { tauC: number; jump: number } => {
      const t = beanRodbellTransition(J, Math.max(0, e));
      return { tauC: t.tauC, jump: t.sigmaJump };
    };
    const here = at(eta.value);
    const h = Math.max(STEP * (eta.sigma > 0 ? eta.sigma : 1), 1e-6);
    const oneSided = Math.abs(eta.value - 1) < h;
    const up = at(eta.value + h);
    const down = oneSided ? here : at(eta.value - h);
    const span = oneSided ? h : 2 * h;
    const dTau = (up.tauC - down.tauC) / span;
    const dJump = (up.jump - down.jump) / span;
    const propagate = (g: [number, number, number]): number => {
      // g over (Ms, T0, η)
      const idx = [iM, iT, iE];
      let v = 0;
      for (let a = 0; a < 3; a++) {
        for (let b = 0; b < 3; b++) {
          v += g[a] * cov[idx[a]][idx[b]] * g[b];
        }
      }
      return Math.sqrt(Math.max(0, v));
    };
    const noCov = msg('derived.no-covariance', 'The fit gave no finite covariance, so no uncertainty can be propagated.');
    const withSigma = (name: string, value: number, g: [number, number, number], note: ICoreMessage): IDerivedValue =>
      covOk && Number.isFinite(dTau) && Number.isFinite(dJump) ? { name, value, sigma: propagate(g), note } : { name, value, sigma: Number.NaN, note, sigmaReason: noCov };
    const first = eta.value > 1;
    const derived: IDerivedValue[] = [
      { name: 'T0', value: T0.value, sigma: T0.sigma, note: msg('derived.bean-rodbell-t0', 'Curie temperature of the undeformed lattice, in the units of the x column'), ...(Number.isFinite(T0.sigma) ? {} : { sigmaReason: noCov }) },
      { name: 'η', value: eta.value, sigma: eta.sigma, note: msg('derived.bean-rodbell-eta', 'magnetovolume parameter: above 1 first order'), ...(Number.isFinite(eta.sigma) ? {} : { sigmaReason: noCov }) },
      withSigma('Tc/T0', here.tauC, [0, 0, dTau], first ? msg('derived.bean-rodbell-tauc', 'ratio of the first-order transition to T0') : msg('derived.bean-rodbell-tauc-one', 'ratio of the transition to T0: exactly 1 for η ≤ 1 (second order)')),
      withSigma('Tc', T0.value * here.tauC, [0, here.tauC, T0.value * dTau], msg('derived.bean-rodbell-tc', 'transition temperature T0·τc(η), in the units of the x column')),
      { name: 'Ms', value: Ms.value, sigma: Ms.sigma, note: msg('derived.ms', 'saturation value, in the units of the y column'), ...(Number.isFinite(Ms.sigma) ? {} : { sigmaReason: noCov }) }
    ];
    if (first) {
      derived.push(withSigma('ΔM', Ms.value * here.jump, [here.jump, 0, Ms.value * dJump], msg('derived.bean-rodbell-jump', 'jump of M at Tc, in the units of the y column')));
    }
    // Order from (η − 1)/σ_η.
    const z = eta.sigma > 0 ? (eta.value - 1) / eta.sigma : Number.NaN;
    const pFirst = Number.isFinite(z) ? normalCdf(z) : eta.value > 1 ? 1 : 0;
    const order: 'first' | 'second' | 'undecided' = !Number.isFinite(z) ? (first ? 'first' : 'second') : z >= ORDER_Z ? 'first' : z <= -ORDER_Z ? 'second' : 'undecided';
    const probability = { value: pFirst, digits: 3 };
    const statement = !Number.isFinite(z)
      ? msg('bean-rodbell.order.unknown-sigma', 'Order from η alone (η = %1): its uncertainty is not known, so how sure this is cannot be said.', eta.value)
      : order === 'first'
        ? msg('bean-rodbell.order.first', 'First order: η = %1 ± %2 lies %3σ above 1 (probability %4 that η > 1, normal approximation).', eta.value, eta.sigma, { value: z, digits: 3 }, probability)
        : order === 'second'
          ? msg('bean-rodbell.order.second', 'Second order: η = %1 ± %2 lies %3σ below 1 (probability %4 that η > 1, normal approximation).', eta.value, eta.sigma, { value: -z, digits: 3 }, probability)
          : msg('bean-rodbell.order.undecided', 'Order undecided: η = %1 ± %2 is within %3σ of 1 (probability %4 that η > 1, normal approximation).', eta.value, eta.sigma, ORDER_Z, probability);
    const cautions: ICoreMessage[] = [
      statement,
      windowCaution(),
      msg(
        'caution.bean-rodbell-assumptions',
        'The Bean–Rodbell model assumes exchange linear in the volume, a constant compressibility and mean-field (Brillouin) moments; η lumps compressibility, magnetoelastic coupling and T0 together, so it measures how strongly the volume drives the transition, not a material constant by itself.'
      )
    ];
    if (Math.abs(eta.value - 1) < BORDERLINE || order === 'undecided') {
      cautions.push(
        msg('caution.bean-rodbell-borderline', 'η ≈ 1 is the tricritical borderline: M(T) alone cannot tell the order here. Look for thermal hysteresis, latent heat or a volume jump.')
      );
    }
    if (first) {
      cautions.push(
        msg('caution.bean-rodbell-first', 'η > 1 predicts thermal hysteresis and a field-induced transition above Tc; a jump fitted on a few points near Tc is sensitive to the sweep rate and to sample inhomogeneity.')
      );
    }
    cautions.push(msg('caution.field-tail', 'A magnetisation measured in a field is not spontaneous: the field-induced tail near Tc biases Tc and β.'));
    const { min, max } = extent(pts.x);
    const xs = grid(min, max, 300).filter(t => t > 0);
    const T0v = T0.value;
    const curveY = T0v > 0 && eta.value >= 0 ? Array.from(beanRodbellMagnetisation(J, eta.value, xs.map(t => t / T0v))).map(s => Ms.value * s) : xs.map(() => Number.NaN);
    return {
      outcome: {
        equation: 'M = Ms·σ(T/T0) with σ = B_J((3J/(J + 1))(T0/T)(σ + κ_J·η·σ³)), the global minimum of the Bean–Rodbell Gibbs energy',
        convention: fit.convention,
        fit,
        used: pts.x.length,
        curve: { x: xs, y: curveY },
        derived,
        cautions,
        transitionOrder: { order, z, probabilityFirst: pFirst, statement }
      },
      fitted: { ...pts, curve: curveY }
    };
  },
  views: ['data-and-curve'],
  model: job => ({ curve: beanRodbellModel(Number(job.options.J ?? beanRodbellSpinOption.default)) })
} as const satisfies IAnalysisKind<'bean-rodbell'>;
