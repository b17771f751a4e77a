/**
 * The isotherm (field-sweep) analysis as the panel runs it: its input (three
 * columns and the controls as numbers), its stages for progress, and its
 * report — the global equation-of-state fit as the primary result, the other
 * methods as cross-checks that say whether they agree with it, and the data
 * every view draws. The worker runs it (request kind 'isotherms'); tests
 * call {@link runIsothermJob} directly with the same defaults.
 */
import type { ICoreMessage } from '../messages';
import type { IArrottResult } from './arrott';
import type { IBanerjeeEvidence } from './banerjee';
import type { IBootstrapResult } from './bootstrap';
import type { ICollapseResult } from './collapse';
import type { ICriticalIsothermResult, IScalingChecks } from './critical';
import type { IGlobalResult } from './eos';
import type { IEntropyResult } from './entropy';
import type { IKouvelFisherResult } from './kouvel';
import type { IModifiedArrottResult } from './map';
import type { IIsothermSet, IValueSigma } from './types';
import type { IExponentWindowScan } from './window';

/** A column of the table as the job receives it (numbers; NaN where a cell was not a number). */
export interface IIsothermJobColumn {
  /** Column name (key for unit overrides). */
  name: string;
  /** Unit read from the header, or null. */
  unit: string | null;
  values: Float64Array | readonly number[];
}

/** Sample shapes offered as demagnetising-factor presets (SI values, 0–1). */
export type SampleShape = 'sphere' | 'thin-plate-perpendicular' | 'thin-plate-in-plane' | 'long-needle-along' | 'cube' | 'custom';

/** The controls of the analysis, already read as numbers (null: left blank, the default applies). */
export interface IIsothermControls {
  /** Units typed over the headers' own. */
  units: { temperature: string | null; field: string | null; magnetisation: string | null };
  /** Demagnetising factor in the convention named (SI: 0–1; cgs: 0–4π), or null when unset. */
  demag: { value: number; convention: 'SI' | 'cgs' } | null;
  /** Readings within this many kelvin form one isotherm (default 0.5). */
  temperatureToleranceK: number | null;
  sampleMassMg: number | null;
  densityGPerCm3: number | null;
  /** Field range used, in the field column's own unit (after any override); null: open. */
  fieldMin: number | null;
  fieldMax: number | null;
  /** Largest |t| = |T − Tc|/Tc of isotherms used by the exponent fits (default 0.1). */
  tMax: number | null;
  /** Bootstrap resamples over isotherms (0 or null: none). */
  bootstrapSamples: number | null;
}

/** The controls every field is blank in: the panel's defaults. */
export const DEFAULT_ISOTHERM_CONTROLS: Readonly<IIsothermControls> = Object.freeze({
  units: { temperature: null, field: null, magnetisation: null },
  demag: null,
  temperatureToleranceK: null,
  sampleMassMg: null,
  densityGPerCm3: null,
  fieldMin: null,
  fieldMax: null,
  tMax: null,
  bootstrapSamples: null
});

/** Input of one isotherm analysis. */
export interface IIsothermJob {
  temperature: IIsothermJobColumn;
  field: IIsothermJobColumn;
  magnetisation: IIsothermJobColumn;
  controls: IIsothermControls;
}

/** Stages reported as progress, in order. */
export type IsothermStage = 'grouping' | 'global' | 'cross-checks' | 'collapse' | 'window' | 'entropy' | 'bootstrap';

/** Progress and cancel of a running job. */
export interface IIsothermJobHooks {
  /** `fraction` in [0, 1] of the whole job. */
  onProgress?: (stage: IsothermStage, fraction: number) => void;
  /** Polled between stages and inside the long ones; true stops the job. */
  shouldStop?: () => boolean;
}

/** Whether a cross-check agrees with the primary result. */
export interface IAgreement {
  /**
   * 'agrees': every compared value within 2σ (combined); 'close': beyond 2σ but within the method's usual
   * systematic error (see CLOSE_RELATIVE in agreement.ts); 'disagrees': neither; 'no-result': the method gave none.
   */
  state: 'agrees' | 'close' | 'disagrees' | 'no-result';
  /** One sentence naming the values compared and how far apart they are (codes `sweeps.agree.*`). */
  message: ICoreMessage;
  /** How the method ended when that explains the state (its own reason, e.g. why it gave no result). */
  detail?: ICoreMessage;
}

/** The primary result with its σ and covariance. */
export interface IIsothermPrimary {
  /** The global equation-of-state fit (Tc, β, γ, T1, M1 and δ = 1 + γ/β). */
  fit: IGlobalResult;
  /** Covariance of (Tc, β, γ, T1, M1), in that order; null without a fit. */
  covariance: number[][] | null;
  /** 'fits' / 'does-not-fit' / 'not-converged' with one sentence saying why (codes `sweeps.verdict.*`). */
  verdict: { state: 'fits' | 'does-not-fit' | 'not-converged'; message: ICoreMessage };
  /** How the start was found (code `sweeps.start.*`): which trial exponents and Tc won. */
  start: ICoreMessage;
}

/** A cross-check method started from the primary result. */
export interface ICrossCheck<T> {
  result: T | null;
  agreement: IAgreement;
}

/** Field points beyond the controls' range or dropped by the demagnetisation correction. */
export interface IFieldUse {
  /** Points used / points in the table. */
  used: number;
  total: number;
  /** Field range used, A/m. */
  hMin: number;
  hMax: number;
}

/** Everything the isotherm analysis produced. */
export interface IIsothermReport {
  /** The isotherms as analysed (SI inside; field range applied). */
  set: IIsothermSet;
  fieldUse: IFieldUse;
  /** |t| window used. */
  tMax: number;
  primary: IIsothermPrimary;
  /** Started from the primary exponents and Tc. */
  modifiedArrott: ICrossCheck<IModifiedArrottResult>;
  kouvelFisher: ICrossCheck<IKouvelFisherResult>;
  /** δ at the primary Tc; its σ includes the σ of Tc. */
  criticalIsotherm: ICrossCheck<ICriticalIsothermResult>;
  /** Collapse minimised from the primary result, with its cost. */
  collapse: ICrossCheck<ICollapseResult>;
  /** The plain Arrott plot (mean-field lines): Tc from the intercepts' crossing. */
  arrott: IArrottResult;
  banerjee: IBanerjeeEvidence;
  /** Widom and Rushbrooke checks on the primary exponents and the critical-isotherm δ. */
  checks: IScalingChecks;
  /** Exponents of the global fit against t_max and H_min. */
  window: IExponentWindowScan | null;
  /** ΔS_M(T) for several field changes. */
  entropy: IEntropyResult | null;
  bootstrap: IBootstrapResult | null;
  /** The primary numbers again, flat, for tables and reports. */
  summary: { Tc: IValueSigma; beta: IValueSigma; gamma: IValueSigma; delta: IValueSigma };
  /** Every warning once (one message per problem, never one per isotherm). */
  warnings: ICoreMessage[];
  conventions: ICoreMessage[];
}

/** Outcome of {@link runIsothermJob}. */
export type IsothermJobAnswer =
  | { status: 'ok'; report: IIsothermReport }
  /** A column needs a unit: the message says which, `options` lists accepted units. */
  | { status: 'needs-unit'; message: ICoreMessage; options: string[] }
  /** Input refused (bad control, bad unit, missing sample data, N_d making fields negative …). */
  | { status: 'refused'; message: ICoreMessage }
  | { status: 'cancelled' };
