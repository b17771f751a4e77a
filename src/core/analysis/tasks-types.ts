/**
 * Analyses that run several fits of one x–y job: the model comparison, the
 * exponent-against-window scan, and the bootstrap. Each runs in the analysis
 * worker (request kind 'task') with progress and cancel; tests call
 * {@link runAnalysisTask} (tasks.ts) directly with the panel's defaults.
 */
import type { ICoreMessage } from '../messages';
import type { IAnalysisJob } from './types';
import type { IValueSigma } from '../sweeps/types';

/** One fitted candidate of a model comparison. */
export interface IComparedModel {
  /** Catalogue kind id. */
  kind: string;
  /** The options it was fitted with (e.g. { J: 2.5 } or { freeJ: true }). */
  options: Record<string, string | number | boolean>;
  /** Plain name for the table, e.g. "Weiss mean field, J = 5/2". */
  label: ICoreMessage;
  /** Parameters fitted (k) and points used (n); the same n for every candidate. */
  k: number;
  n: number;
  chi2: number;
  reducedChi2: number;
  aic: number;
  aicc: number;
  bic: number;
  /** Akaike weight from AICc over the candidates that converged (0 for the others). */
  weight: number;
  /** AICc − smallest AICc. */
  deltaAicc: number;
  converged: boolean;
  /** The verdict state of this fit ('fits' / 'does-not-describe' / 'not-converged'). */
  verdict: string;
  /** Fitted values with σ, by parameter name (e.g. Tc, Ms, J, beta). */
  values: Record<string, IValueSigma>;
  /** Why it was left out or failed, when it was. */
  note: ICoreMessage | null;
}

/** Result of a model comparison: candidates best first by AICc (failures last). */
export interface IModelComparison {
  models: IComparedModel[];
  /** How the criteria were computed (known σ or profiled variance) and that n is shared (code `compare.*`). */
  convention: ICoreMessage;
  /** One sentence naming the preferred model and how strongly (Akaike weight), e.g. which J the data prefer. */
  summary: ICoreMessage;
  /** For Weiss candidates with J free: J ± σ (null when no such candidate converged). */
  freeJ: IValueSigma | null;
  warnings: ICoreMessage[];
}

/** One window of the exponent scan. */
export interface IWindowScanCell {
  /** Largest |t| of the window, measured from this cell's own fitted Tc. */
  tMax: number;
  beta: IValueSigma;
  Tc: IValueSigma;
  /** Points used and the fit's verdict state. */
  n: number;
  verdict: string;
  converged: boolean;
  /** Whether the window stopped changing with its own Tc (false: the round limit was reached, the last fit is shown). */
  settled?: boolean;
  /** Rounds of fit-then-move-the-window it took. */
  rounds?: number;
}

/** Result of the window scan. */
export interface IWindowScanResult {
  cells: IWindowScanCell[];
  /** Which exponent was scanned ('beta' for the order parameter, 'twoBeta' for ψ², …) and the proxy note. */
  exponent: ICoreMessage;
  /** The universality classes' β to mark on the chart: id, label, value, citation. */
  classes: { id: string; label: string; beta: number; citation: string }[];
  /** Suggested t_max (null when none can be suggested) and why. */
  suggested: { tMax: number | null; reason: ICoreMessage };
  convention: ICoreMessage;
  warnings: ICoreMessage[];
}

/** Summary of a bootstrap of one job. */
export interface IBootstrapSummary {
  /** Parameter names in the order of the fit. */
  parameters: string[];
  /** Per parameter: the fit's value, bootstrap mean, standard deviation and the 16th/84th and 2.5th/97.5th percentiles. */
  stats: { name: string; fitted: number; mean: number; sd: number; p16: number; p84: number; p025: number; p975: number }[];
  samples: number;
  /** Samples whose fit failed or did not converge (left out). */
  failed: number;
  seed: number;
  /** How samples were drawn (residual or pair resampling) and counted (code `bootstrap.*`). */
  convention: ICoreMessage;
}

/** A request of several fits of one job. */
export type AnalysisTask =
  | { type: 'compare'; job: IAnalysisJob }
  | { type: 'window-scan'; job: IAnalysisJob; tMaxs?: number[] }
  | { type: 'bootstrap'; job: IAnalysisJob; samples: number; seed: number };

/** What a task returns. */
export type AnalysisTaskResult =
  | { type: 'compare'; result: IModelComparison }
  | { type: 'window-scan'; result: IWindowScanResult }
  | { type: 'bootstrap'; result: IBootstrapSummary }
  | { type: 'cancelled' };

/** Progress and cancel of a task. */
export interface ITaskHooks {
  /** `fraction` of the whole task done, in [0, 1]. */
  onProgress?: (fraction: number) => void;
  /** Polled between fits and inside them; true stops the task. */
  shouldStop?: () => boolean;
}
