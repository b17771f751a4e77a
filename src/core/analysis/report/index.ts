/**
 * A fit's result as it leaves the panel: one record (JSON, schema
 * analysis-result.v1.json) and its Markdown, LaTeX and CSV forms.
 */
export { buildReport, REPORT_FORMAT, REPORT_VERSION } from './report';
export type { IAnalysisReport, IReportContext, IReportColumn, IReportDerived, IReportParameter } from './report';
export { formatConcise, formatPlain, formatWithError, roundWithError } from './notation';
export { dataCsv, latexSymbol, latexText, reportCsv, reportLatex, reportMarkdown } from './writers';
export type { IFittedPoints } from './writers';
export { ANALYSIS_FORMAT, ANALYSIS_MIME, VEGALITE_MIME, escapeHtml, notebookOutputs, reportHtml } from './notebook-output';
export type { IDisplayOutput, INotebookOutputParts } from './notebook-output';
