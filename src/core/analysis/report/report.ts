/**
 * One fit as a self-contained record that leaves the panel: everything a
 * reader needs to judge and reuse the numbers — values, standard errors,
 * intervals, covariance, the verdict with its checks, the window, the
 * convention, the cautions, the data source — with messages written out in
 * English (the record is for files and other programs; the panel shows the
 * same messages translated). JSON Schema: schema/analysis-result.v1.json.
 */
import { messageText } from '../../messages';
import type { ITableSource } from '../../source';
import { kindById } from '../kinds';
import type { IAnalysisOutcome } from '../types';
import type { VerdictState } from '../verdict';

/** Format name and version of the record (schema/analysis-result.v1.json). */
export const REPORT_FORMAT = 'psiscape-analysis-result';
export const REPORT_VERSION = 1;

/** A column as the record names it. */
export interface IReportColumn {
  header: string;
  unit: string | null;
}

/** Where the fitted data came from and which columns were used. */
export interface IReportContext {
  /** psiscape's version (package.json). */
  psiscapeVersion: string;
  /** The notebook output the table came from, or null for a file. */
  source: ITableSource | null;
  /** The file analysed, when the table came from a file. */
  file?: string;
  columns: { x: IReportColumn; y: IReportColumn; sigma: IReportColumn | null };
}

export interface IReportParameter {
  name: string;
  value: number;
  /** Standard error; null when it could not be determined. */
  sigma: number | null;
  interval: [number, number] | null;
  fixed: boolean;
}

export interface IReportDerived {
  name: string;
  value: number;
  sigma: number | null;
  note: string;
}

/** The record. Numbers that are not finite are written as null. */
export interface IAnalysisReport {
  format: typeof REPORT_FORMAT;
  version: typeof REPORT_VERSION;
  psiscapeVersion: string;
  kind: string;
  kindLabel: string;
  equation: string;
  convention: string;
  source: ITableSource | null;
  file: string | null;
  columns: IReportContext['columns'];
  window: { min: number | null; max: number | null };
  points: { used: number; skipped: number };
  verdict: { state: VerdictState; summary: string; pValue: number | null; checks: { code: string; passed: boolean; message: string; value: number | null }[] };
  fit: {
    converged: boolean;
    reason: string;
    parameters: IReportParameter[];
    covariance: (number | null)[][];
    correlation: (number | null)[][];
    confidenceLevel: number;
    errorScaling: string;
    chi2: number | null;
    reducedChi2: number | null;
    dof: number;
    aic: number | null;
    aicc: number | null;
    bic: number | null;
    evaluations: number;
    warnings: string[];
  };
  derived: IReportDerived[];
  cautions: string[];
}

const finite = (v: number): number | null => (Number.isFinite(v) ? v : null);
const usableSigma = (s: number): number | null => (Number.isFinite(s) && s > 0 ? s : null);

/** The record of one outcome, in the context it was fitted in. */
export function buildReport(outcome: IAnalysisOutcome, context: IReportContext): IAnalysisReport {
  const fit = outcome.fit;
  const kind = kindById(outcome.kind);
  return {
    format: REPORT_FORMAT,
    version: REPORT_VERSION,
    psiscapeVersion: context.psiscapeVersion,
    kind: outcome.kind,
    kindLabel: kind ? messageText(kind.label) : outcome.kind,
    equation: outcome.equation,
    convention: messageText(outcome.convention),
    source: context.source ? { ...context.source } : null,
    file: context.file ?? null,
    columns: context.columns,
    window: { min: finite(outcome.window.min), max: finite(outcome.window.max) },
    points: { used: outcome.used, skipped: outcome.skipped },
    verdict: {
      state: outcome.verdict.state,
      summary: messageText(outcome.verdict.summary),
      pValue: outcome.verdict.pValue === null ? null : finite(outcome.verdict.pValue),
      checks: outcome.verdict.checks.map(c => ({ code: c.code, passed: c.passed, message: messageText(c.message), value: c.value === undefined ? null : finite(c.value) }))
    },
    fit: {
      converged: fit.converged,
      reason: messageText(fit.reason),
      parameters: fit.parameters.map((name, i) => {
        const [lo, hi] = fit.confidenceIntervals[i] ?? [NaN, NaN];
        return {
          name,
          value: fit.values[i],
          sigma: usableSigma(fit.standardErrors[i]),
          interval: Number.isFinite(lo) && Number.isFinite(hi) ? [lo, hi] : null,
          fixed: fit.fixed[i] ?? false
        };
      }),
      covariance: fit.covariance.map(row => row.map(finite)),
      correlation: fit.correlation.map(row => row.map(finite)),
      confidenceLevel: fit.confidenceLevel,
      errorScaling: fit.errorScaling,
      chi2: finite(fit.chi2),
      reducedChi2: finite(fit.reducedChi2),
      dof: fit.dof,
      aic: finite(fit.aic),
      aicc: finite(fit.aicc),
      bic: finite(fit.bic),
      evaluations: fit.evaluations,
      warnings: fit.warnings.map(messageText)
    },
    derived: outcome.derived.filter(d => Number.isFinite(d.value)).map(d => ({ name: d.name, value: d.value, sigma: usableSigma(d.sigma), note: messageText(d.note) })),
    cautions: outcome.cautions.map(messageText)
  };
}
