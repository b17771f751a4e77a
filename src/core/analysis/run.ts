/**
 * Runs an analysis job: picks the points in the fit window, fits the chosen
 * model with the engine, and returns values with standard errors, the model
 * curve for drawing, derived numbers and the cautions that go with them.
 */
import { fitCurve } from '../fit';
import type { IFitModel, IFitOptions, IFitResult } from '../fit/types';
import { parseExpressionModel } from '../expr';
import { fitPowerLaw, powerLawModel } from '../physics/critical';
import { curieWeissModel, fitCurieWeiss } from '../physics/curie-weiss';
import { fitWeissMT, weissMTModel } from '../physics/weiss-fit';
import type { IAnalysisJob, IAnalysisOutcome, IDerivedValue } from './types';
import { AnalysisInputError } from './types';
import type { IWindowedPoints } from './window';
import { grid, windowedPoints } from './window';
import { runLandau } from './landau';

/** Points drawn on a model curve. */
export const CURVE_POINTS = 300;

/** Progress and cancellation passed through to the engine. */
export interface IAnalysisHooks {
  onProgress?: IFitOptions['onProgress'];
  shouldStop?: IFitOptions['shouldStop'];
}

const WINDOW_CAUTION =
  'Fitted values depend on the fit window: compare several windows before quoting them (exponents especially).';

function valueOf(fit: IFitResult, name: string): { value: number; sigma: number } {
  const i = fit.parameters.indexOf(name);
  return i < 0 ? { value: Number.NaN, sigma: Number.NaN } : { value: fit.values[i], sigma: fit.standardErrors[i] };
}

function correlation(fit: IFitResult, a: string, b: string): number {
  const i = fit.parameters.indexOf(a);
  const j = fit.parameters.indexOf(b);
  return i < 0 || j < 0 ? Number.NaN : fit.correlation[i][j];
}

function curveOf(model: IFitModel, values: number[], pts: IWindowedPoints): { x: number[]; y: number[] } {
  let min = Infinity;
  let max = -Infinity;
  for (const v of pts.x) {
    min = Math.min(min, v);
    max = Math.max(max, v);
  }
  const x = grid(min, max, CURVE_POINTS);
  const out = new Float64Array(x.length);
  model.evaluate(Float64Array.from(values), Float64Array.from(x), out);
  return { x, y: Array.from(out) };
}

function requirePoints(pts: IWindowedPoints, needed: number, what: string): void {
  if (pts.x.length < needed) {
    throw new AnalysisInputError(
      `${what} needs at least ${needed} points in the fit window, but the window holds ${pts.x.length}` +
        (pts.skipped > 0 ? ` (${pts.skipped} more left out for missing values)` : '') +
        '. Widen the window.'
    );
  }
}

/** Tc estimate for data that run through the transition: where |y| last exceeds 10 % of its largest value. */
function crossingEstimate(pts: IWindowedPoints): { Tc: number; spansTc: boolean } {
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

function runPowerLaw(job: IAnalysisJob, pts: IWindowedPoints, hooks: IAnalysisHooks): IAnalysisOutcome {
  const proxyPower = job.options.proxyPower ?? 1;
  const background = job.options.background === true;
  requirePoints(pts, background ? 6 : 5, 'The critical power law');
  const { Tc, spansTc } = crossingEstimate(pts);
  const options = { proxyPower, background, allowTcInsideData: spansTc, aboveTc: 'zero' as const };
  const fit = fitPowerLaw(
    { T: pts.x, y: pts.y, sigma: pts.sigma },
    { ...options, start: spansTc ? { Tc } : undefined, engine: { ...hooks } }
  );
  const Tcv = valueOf(fit, 'Tc');
  const beta = valueOf(fit, 'beta');
  const r = correlation(fit, 'Tc', 'beta');
  const cautions = [WINDOW_CAUTION];
  cautions.push(
    `Tc and β are correlated (r = ${r.toFixed(2)}): quote them together, and do not fix Tc from another criterion before fitting β.`
  );
  if (spansTc) {
    cautions.push('The window runs through Tc: points above Tc are fitted as zero order parameter. Asymptotic exponents need a window close to Tc.');
  }
  cautions.push('A magnetisation measured in a field is not spontaneous: the field-induced tail near Tc biases Tc and β.');
  const derived: IDerivedValue[] = [
    { name: 'Tc', value: Tcv.value, sigma: Tcv.sigma, note: 'transition temperature, in the units of the x column' },
    { name: 'β', value: beta.value, sigma: beta.sigma, note: proxyPower === 1 ? 'order-parameter exponent' : `order-parameter exponent (the data go as ψ^${proxyPower}, so they fall as (−t)^(${proxyPower}β))` }
  ];
  return {
    model: 'power-law',
    window: { ...job.window },
    equation: `y = A·(1 − T/Tc)^(${proxyPower === 1 ? '' : `${proxyPower}·`}β)${background ? ' + y0' : ''} below Tc, ${background ? 'y0' : '0'} above`,
    convention: fit.convention,
    fit,
    used: pts.x.length,
    skipped: pts.skipped,
    curve: curveOf(powerLawModel(options), fit.values, pts),
    derived,
    cautions
  };
}

function runWeiss(job: IAnalysisJob, pts: IWindowedPoints, hooks: IAnalysisHooks): IAnalysisOutcome {
  const J = job.options.J ?? 0.5;
  requirePoints(pts, 4, 'The Weiss mean-field fit');
  if (pts.x.some(T => !(T > 0))) {
    throw new AnalysisInputError('The Weiss fit needs absolute temperatures (K > 0) in the x column; convert °C to K first.');
  }
  const fit = fitWeissMT({ T: pts.x, M: pts.y, sigma: pts.sigma }, { J, engine: { ...hooks } });
  const Tc = valueOf(fit, 'Tc');
  const Ms = valueOf(fit, 'Ms');
  return {
    model: 'weiss',
    window: { ...job.window },
    equation: `M = Ms·m(T/Tc), m = B_J(3J m/((J+1) τ)), J = ${J === Infinity ? '∞ (Langevin)' : J}`,
    convention: fit.convention,
    fit,
    used: pts.x.length,
    skipped: pts.skipped,
    curve: curveOf(weissMTModel(J, false), fit.values, pts),
    derived: [
      { name: 'Tc', value: Tc.value, sigma: Tc.sigma, note: 'mean-field Curie temperature, in K' },
      { name: 'Ms', value: Ms.value, sigma: Ms.sigma, note: 'saturation value, in the units of the y column' }
    ],
    cautions: [
      WINDOW_CAUTION,
      'Mean field describes the whole curve only phenomenologically: real magnets follow spin waves (Bloch T^3/2) at low T and critical laws near Tc, so β = ½ here is assumed, not measured.',
      'A magnetisation measured in a field is not spontaneous: the field-induced tail rounds the curve at Tc.'
    ]
  };
}

function runCurieWeiss(job: IAnalysisJob, pts: IWindowedPoints, hooks: IAnalysisHooks): IAnalysisOutcome {
  const units = job.options.units ?? 'cgs-emu';
  requirePoints(pts, 5, 'The Curie–Weiss fit');
  const fit = fitCurieWeiss({ T: pts.x, chi: pts.y, sigma: pts.sigma }, { units, engine: { ...hooks } });
  const C = valueOf(fit, 'C');
  const theta = valueOf(fit, 'theta');
  const chi0 = valueOf(fit, 'chi0');
  return {
    model: 'curie-weiss',
    window: { ...job.window },
    equation: 'χ = χ0 + C/(T − θ)',
    convention: fit.convention,
    fit,
    used: pts.x.length,
    skipped: pts.skipped,
    curve: curveOf(curieWeissModel, fit.values, pts),
    derived: [
      { name: 'C', value: C.value, sigma: C.sigma, note: units === 'SI' ? 'Curie constant, m³ K mol⁻¹' : 'Curie constant, emu K mol⁻¹ Oe⁻¹' },
      { name: 'θ', value: theta.value, sigma: theta.sigma, note: 'Weiss temperature, K (> 0: net ferromagnetic)' },
      { name: 'χ0', value: chi0.value, sigma: chi0.sigma, note: 'temperature-independent term' },
      {
        name: 'p_eff',
        value: fit.pEff,
        sigma: fit.pEffError,
        note: `effective moment in μB per formula unit (${units === 'SI' ? 'SI' : 'cgs'} molar χ assumed)`
      }
    ],
    cautions: [
      'Fit only well above the ordering temperature (T ≳ 2·max(Tc, |θ|)): critical fluctuations bend 1/χ near Tc.',
      'p_eff assumes a molar susceptibility in the stated units; per formula unit, not per magnetic ion.',
      'A nominal zero field in a superconducting magnet can be 0.1–3 mT of remanent field.'
    ]
  };
}

/** Parses "A=1, T0=300" into start values. */
export function parseStarts(text: string): Record<string, number> {
  const out: Record<string, number> = {};
  for (const part of text.split(/[,;\n]/)) {
    const item = part.trim();
    if (!item) {
      continue;
    }
    const m = /^([A-Za-z_][A-Za-z0-9_]*)\s*=\s*(\S+)$/.exec(item);
    const value = m ? Number(m[2]) : Number.NaN;
    if (!m || !Number.isFinite(value)) {
      throw new AnalysisInputError(`cannot read the start value "${item}": write name = number, e.g. T0 = 300`);
    }
    out[m[1]] = value;
  }
  return out;
}

function runExpression(job: IAnalysisJob, pts: IWindowedPoints, hooks: IAnalysisHooks, starts: Record<string, number>): IAnalysisOutcome {
  const text = (job.options.expression ?? '').trim();
  if (!text) {
    throw new AnalysisInputError('Write a model expression in x, e.g. A*exp(-x/T0) + c.');
  }
  let model;
  try {
    model = parseExpressionModel(text, { variables: ['x'] });
  } catch (e) {
    throw new AnalysisInputError(`The expression cannot be used: ${(e as Error).message}`);
  }
  requirePoints(pts, model.parameters.length + 1, 'This expression');
  const unknown = Object.keys(starts).filter(k => !model.parameters.includes(k));
  if (unknown.length) {
    throw new AnalysisInputError(`start values name ${unknown.join(', ')}, which the expression does not use (its parameters: ${model.parameters.join(', ')})`);
  }
  const start = model.parameters.map(p => starts[p] ?? 1);
  const fit = fitCurve(model, { x: pts.x, y: pts.y, sigma: pts.sigma }, { start, ...hooks });
  return {
    model: 'expression',
    window: { ...job.window },
    equation: `y = ${model.expression}`,
    convention: 'user expression; parameters without a start value start at 1',
    fit,
    used: pts.x.length,
    skipped: pts.skipped,
    curve: curveOf(model, fit.values, pts),
    derived: [],
    cautions: [WINDOW_CAUTION, 'A fit from poor start values can stop in a local minimum: check the curve against the data.']
  };
}

/**
 * Run a job. Bad inputs throw {@link AnalysisInputError} (or the physics
 * module's input error) with a message naming the input; a fit that does not
 * converge returns normally with `fit.converged = false` and its reason.
 */
export function runAnalysisJob(job: IAnalysisJob, hooks: IAnalysisHooks = {}, starts: Record<string, number> = {}): IAnalysisOutcome {
  const outcome = runModel(job, hooks, starts);
  const warm = outcome.fit.warmStart;
  if (warm?.used) {
    outcome.cautions.push(
      `Large table: the iteration started from a fit to one point in ${warm.stride} (${warm.points} points); the values are those of the fit to all ${outcome.used} points.`
    );
  }
  return outcome;
}

function runModel(job: IAnalysisJob, hooks: IAnalysisHooks, starts: Record<string, number>): IAnalysisOutcome {
  const pts = windowedPoints(job);
  switch (job.model) {
    case 'power-law':
      return runPowerLaw(job, pts, hooks);
    case 'weiss':
      return runWeiss(job, pts, hooks);
    case 'curie-weiss':
      return runCurieWeiss(job, pts, hooks);
    case 'landau':
      return runLandau(job, pts, WINDOW_CAUTION);
    case 'expression':
      return runExpression(job, pts, hooks, starts);
    default: {
      const never: never = job.model;
      throw new AnalysisInputError(`unknown model ${String(never)}`);
    }
  }
}
