/**
 * A fit as cell outputs a notebook keeps: two display outputs that any
 * Jupyter front end or converter shows without a kernel or psiscape, each
 * carrying several representations so every reader picks the best it knows.
 *
 * 1. The chart: PNG (safe, shown in untrusted notebooks and by every
 *    converter), SVG, and the Vega-Lite spec under the MIME type JupyterLab's
 *    Vega renderer reads.
 * 2. The results: HTML and Markdown tables (values ± σ as the panel shows
 *    them, χ²_red and the verdict, window, convention, cautions, data source,
 *    psiscape's version), plain text, and the whole analysis (the result
 *    record, the plotted data and the settings) under psiscape's own
 *    versioned MIME type.
 */
import { formatPlain, formatWithError } from './notation';
import type { IAnalysisReport } from './report';
import { distinctDerived, reportMarkdown, sourceText, VERDICT_WORDS, windowText } from './writers';

/** psiscape's own MIME type for a whole analysis (version 1). */
export const ANALYSIS_MIME = 'application/vnd.psiscape.analysis.v1+json';
/** The `format` field of psiscape's MIME payload. */
export const ANALYSIS_FORMAT = 'psiscape-analysis';
/** The MIME type JupyterLab's Vega renderer reads for Vega-Lite 5 specs. */
export const VEGALITE_MIME = 'application/vnd.vegalite.v5+json';

/** A display output as nbformat stores it. */
export interface IDisplayOutput {
  output_type: 'display_data';
  data: Record<string, unknown>;
  metadata: Record<string, unknown>;
}

/** What goes into the outputs besides the result record. */
export interface INotebookOutputParts {
  report: IAnalysisReport;
  /** PNG bytes, base64 (no data: prefix), drawn at `pngScale` × the chart's size. */
  png: string;
  pngScale: number;
  /** The chart's size on screen, in CSS pixels. */
  width: number;
  height: number;
  svg: string;
  /** The chart's Vega-Lite spec. */
  spec: unknown;
  /** The plotted data and the analysis settings (the saved form of the analysis). */
  analysis: unknown;
}

const ESCAPES: Record<string, string> = { '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' };

/** Text made safe for HTML element content and attribute values. */
export function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, c => ESCAPES[c]);
}


/** The result as an HTML fragment: headline, verdict, table, statistics, convention, cautions, source. Every text is escaped. */
export function reportHtml(r: IAnalysisReport): string {
  const e = escapeHtml;
  const rows = r.fit.parameters
    .map(p => {
      const interval = p.interval ? `${formatPlain(p.interval[0])} … ${formatPlain(p.interval[1])}` : '—';
      return `<tr><td>${e(p.name)}${p.fixed ? ' (fixed)' : ''}</td><td>${e(formatWithError(p.value, p.sigma ?? NaN))}</td><td>${e(interval)}</td></tr>`;
    })
    .concat(distinctDerived(r).map(d => `<tr><td>${e(d.name)}</td><td>${e(formatWithError(d.value, d.sigma ?? NaN))}</td><td>${e(d.note)}</td></tr>`))
    .join('');
  const cautions = r.cautions.length > 0 ? `<ul>${r.cautions.map(c => `<li>${e(c)}</li>`).join('')}</ul>` : '';
  return (
    `<div class="psiscape-result">` +
    `<p><strong>${e(r.kindLabel)}</strong>: ${e(r.columns.y.header)} against ${e(r.columns.x.header)}, window ${e(windowText(r))}</p>` +
    `<p><em>${e(VERDICT_WORDS[r.verdict.state])}.</em> ${e(r.verdict.summary)}</p>` +
    `<table><thead><tr><th>parameter</th><th>value ± standard error</th><th>${e(formatPlain(100 * r.fit.confidenceLevel))} % interval</th></tr></thead><tbody>${rows}</tbody></table>` +
    `<p>χ²_red = ${e(r.fit.reducedChi2 === null ? '—' : formatPlain(r.fit.reducedChi2))} for ${r.fit.dof} degrees of freedom; ${r.points.used} points fitted.</p>` +
    `<p>Model: <code>${e(r.equation)}</code>. ${e(r.convention)}</p>` +
    cautions +
    `<p>Data: ${e(sourceText(r))}. psiscape ${e(r.psiscapeVersion)}.</p>` +
    `</div>`
  );
}

/** The two display outputs of an analysis (chart, then results). */
export function notebookOutputs(parts: INotebookOutputParts): IDisplayOutput[] {
  const r = parts.report;
  const chart: IDisplayOutput = {
    output_type: 'display_data',
    data: {
      'image/png': parts.png,
      'image/svg+xml': parts.svg,
      [VEGALITE_MIME]: parts.spec,
      // With psiscape installed, the next output draws the chart live; this one only says so.
      [ANALYSIS_MIME]: { format: ANALYSIS_FORMAT, version: 1, part: 'chart' },
      'text/plain': `<psiscape chart: ${r.columns.y.header} against ${r.columns.x.header}>`
    },
    // Drawn at pngScale × for sharpness; shown at the chart's own size.
    metadata: { 'image/png': { width: Math.round(parts.width), height: Math.round(parts.height) } }
  };
  const results: IDisplayOutput = {
    output_type: 'display_data',
    data: {
      [ANALYSIS_MIME]: { format: ANALYSIS_FORMAT, version: 1, part: 'analysis', result: r, analysis: parts.analysis },
      'text/html': reportHtml(r),
      'text/markdown': reportMarkdown(r),
      'text/plain': reportMarkdown(r)
    },
    metadata: {}
  };
  return [chart, results];
}
