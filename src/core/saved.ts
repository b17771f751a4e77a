/**
 * Analyses saved in a notebook's metadata (key `psiscape`), so that whoever
 * opens the notebook sees them again without a kernel. Notebook metadata is
 * untrusted input: it is validated here, entry by entry, and a bad entry is
 * reported and skipped without losing the others.
 */
import type { AnalysisModel, IAnalysisModelOptions } from './analysis/types';
import type { ITableSource } from './source';

/** Metadata key. */
export const SAVED_KEY = 'psiscape';
/** Format version written. */
export const SAVED_VERSION = 1;

/** The fit controls of a saved analysis. */
export interface ISavedFit {
  model: AnalysisModel;
  options: IAnalysisModelOptions;
  window: { min: number; max: number };
  starts: string;
}

/** One saved analysis. */
export interface ISavedAnalysis {
  id: string;
  source: ITableSource;
  /** Headers of the plotted columns. */
  columns: { x: string; y: string; sigma: string | null };
  /** The plotted columns as last seen (missing values as null), used when the source output is gone. */
  snapshot: { headers: string[]; units: (string | null)[]; values: (number | null)[][] };
  /** Fit controls when a fit was run, else null. */
  fit: ISavedFit | null;
}

/** What a notebook holds under {@link SAVED_KEY}. */
export interface ISavedAnalyses {
  version: number;
  analyses: ISavedAnalysis[];
}

const MODELS: readonly AnalysisModel[] = ['power-law', 'weiss', 'curie-weiss', 'landau', 'expression'];

function isRecord(v: unknown): v is Record<string, unknown> {
  return typeof v === 'object' && v !== null && !Array.isArray(v);
}

function num(v: unknown): number | null {
  return typeof v === 'number' && Number.isFinite(v) ? v : null;
}

/** JSON cannot hold ±∞ or NaN; windows store ±∞ as null. */
function windowOf(v: unknown): { min: number; max: number } | null {
  if (!isRecord(v)) {
    return null;
  }
  const min = v.min === null ? -Infinity : num(v.min);
  const max = v.max === null ? Infinity : num(v.max);
  return min === null || max === null ? null : { min, max };
}

function checkEntry(v: unknown, i: number): ISavedAnalysis | string {
  const where = `saved analysis ${i + 1}`;
  if (!isRecord(v)) {
    return `${where} is not an object`;
  }
  const { id, source, columns, snapshot, fit } = v;
  if (typeof id !== 'string' || !id) {
    return `${where} has no id`;
  }
  if (!isRecord(source) || typeof source.notebookPath !== 'string' || typeof source.cellId !== 'string' || typeof source.contentHash !== 'string' || !Number.isInteger(source.outputIndex) || (source.outputIndex as number) < 0) {
    return `${where} has an unreadable source (notebook path, cell id, output index, content hash)`;
  }
  if (!isRecord(columns) || typeof columns.x !== 'string' || typeof columns.y !== 'string' || !(columns.sigma === null || typeof columns.sigma === 'string')) {
    return `${where} does not name its x and y columns`;
  }
  if (!isRecord(snapshot) || !Array.isArray(snapshot.headers) || !Array.isArray(snapshot.values) || !Array.isArray(snapshot.units)) {
    return `${where} has no data snapshot`;
  }
  const headers = snapshot.headers;
  if (!headers.every(h => typeof h === 'string') || snapshot.units.length !== headers.length || snapshot.values.length !== headers.length) {
    return `${where} has a snapshot whose headers, units and columns do not match`;
  }
  const rows = Array.isArray(snapshot.values[0]) ? (snapshot.values[0] as unknown[]).length : 0;
  for (let c = 0; c < snapshot.values.length; c++) {
    const col = snapshot.values[c];
    if (!Array.isArray(col) || col.length !== rows || !col.every(x => x === null || num(x) !== null)) {
      return `${where}: snapshot column "${String(headers[c])}" is not a list of ${rows} numbers`;
    }
  }
  let savedFit: ISavedFit | null = null;
  if (fit !== null && fit !== undefined) {
    if (!isRecord(fit) || !MODELS.includes(fit.model as AnalysisModel) || !isRecord(fit.options) || typeof fit.starts !== 'string') {
      return `${where} has unreadable fit settings`;
    }
    const window = windowOf(fit.window);
    if (!window) {
      return `${where} has an unreadable fit window`;
    }
    const o = fit.options;
    savedFit = {
      model: fit.model as AnalysisModel,
      window,
      starts: fit.starts,
      options: {
        proxyPower: num(o.proxyPower) ?? undefined,
        background: typeof o.background === 'boolean' ? o.background : undefined,
        J: o.J === null ? Infinity : (num(o.J) ?? undefined),
        units: o.units === 'SI' || o.units === 'cgs-emu' ? o.units : undefined,
        expression: typeof o.expression === 'string' ? o.expression : undefined
      }
    };
  }
  return {
    id,
    source: { notebookPath: source.notebookPath, cellId: source.cellId, outputIndex: source.outputIndex as number, contentHash: source.contentHash },
    columns: { x: columns.x, y: columns.y, sigma: columns.sigma as string | null },
    snapshot: {
      headers: headers as string[],
      units: (snapshot.units as unknown[]).map(u => (typeof u === 'string' ? u : null)),
      values: snapshot.values as (number | null)[][]
    },
    fit: savedFit
  };
}

/**
 * Read what a notebook holds. Never throws: unreadable entries are skipped and
 * described in `problems`.
 */
export function readSavedAnalyses(value: unknown): { analyses: ISavedAnalysis[]; problems: string[] } {
  if (value === undefined || value === null) {
    return { analyses: [], problems: [] };
  }
  if (!isRecord(value) || !Array.isArray(value.analyses)) {
    return { analyses: [], problems: ['the psiscape metadata of this notebook is not readable; it was left as it is'] };
  }
  if (typeof value.version !== 'number' || value.version > SAVED_VERSION) {
    return { analyses: [], problems: [`the psiscape metadata has version ${String(value.version)}, newer than this psiscape reads (${SAVED_VERSION}); it was left as it is`] };
  }
  const analyses: ISavedAnalysis[] = [];
  const problems: string[] = [];
  value.analyses.forEach((entry, i) => {
    const checked = checkEntry(entry, i);
    if (typeof checked === 'string') {
      problems.push(checked);
    } else {
      analyses.push(checked);
    }
  });
  return { analyses, problems };
}

/** JSON-ready form: ±∞ in windows and J become null (JSON has no infinities). */
export function toJsonSafe(saved: ISavedAnalyses): unknown {
  return JSON.parse(
    JSON.stringify(saved, (_key, v) => (typeof v === 'number' && !Number.isFinite(v) ? null : v))
  );
}
