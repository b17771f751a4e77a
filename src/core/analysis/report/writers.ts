/**
 * The record of a fit (report.ts) as text for a notebook, a manuscript or a
 * spreadsheet: Markdown and LaTeX with the numbers rounded exactly as the
 * panel shows them (notation.ts), CSV at full binary64 precision.
 */
import { formatConcise, formatPlain, formatWithError } from './notation';
import type { IAnalysisReport } from './report';

/** The verdict's headline, as the panel words it. */
export const VERDICT_WORDS: Record<IAnalysisReport['verdict']['state'], string> = {
  fits: 'Describes the data',
  'does-not-describe': 'Converged, but does not describe the data',
  'not-converged': 'Did not converge'
};

/** "M (emu/g)" or "M". */
function columnText(c: { header: string }): string {
  return c.header;
}

/** "250 … 286"; an open end is "—". */
export function windowText(r: IAnalysisReport): string {
  const end = (v: number | null): string => (v === null ? '—' : formatPlain(v));
  return `${end(r.window.min)} … ${end(r.window.max)}`;
}

/** Where the data came from, in a few words. */
export function sourceText(r: IAnalysisReport): string {
  if (r.file) {
    return `file ${r.file}`;
  }
  if (r.source) {
    return `${r.source.notebookPath}, cell id ${r.source.cellId}, output ${r.source.outputIndex + 1}`;
  }
  return 'unknown source';
}

/** Derived values that repeat a parameter (same name, or the same value and error) are listed once. */
export function distinctDerived(r: IAnalysisReport): IAnalysisReport['derived'] {
  return r.derived.filter(d => !r.fit.parameters.some(p => p.name === d.name || (p.value === d.value && p.sigma === d.sigma)));
}

/** Escape text for a Markdown table cell. */
function mdCell(text: string): string {
  return text.replace(/\\/g, '\\\\').replace(/\|/g, '\\|').replace(/\n/g, ' ');
}

/** The result as a Markdown section: headline, verdict, parameter table, fit statistics, convention, cautions, source. */
export function reportMarkdown(r: IAnalysisReport): string {
  const lines: string[] = [];
  lines.push(`**${mdCell(r.kindLabel)}**: ${mdCell(columnText(r.columns.y))} against ${mdCell(columnText(r.columns.x))}, window ${windowText(r)}`);
  lines.push('');
  lines.push(`*${VERDICT_WORDS[r.verdict.state]}.* ${mdCell(r.verdict.summary)}`);
  lines.push('');
  const level = formatPlain(100 * r.fit.confidenceLevel);
  lines.push(`| parameter | value ± standard error | ${level} % interval |`);
  lines.push('|---|---|---|');
  for (const p of r.fit.parameters) {
    const interval = p.interval ? `${formatPlain(p.interval[0])} … ${formatPlain(p.interval[1])}` : '—';
    lines.push(`| ${mdCell(p.name)}${p.fixed ? ' (fixed)' : ''} | ${formatWithError(p.value, p.sigma ?? NaN)} | ${interval} |`);
  }
  for (const d of distinctDerived(r)) {
    lines.push(`| ${mdCell(d.name)} | ${formatWithError(d.value, d.sigma ?? NaN)} | ${mdCell(d.note)} |`);
  }
  lines.push('');
  const chi = r.fit.reducedChi2 === null ? '—' : formatPlain(r.fit.reducedChi2);
  lines.push(`χ²_red = ${chi} for ${r.fit.dof} degrees of freedom; ${r.points.used} points fitted. ${r.fit.errorScaling === 'from-sigma' ? 'Standard errors from the σ column (not rescaled).' : 'Standard errors scaled by √χ²_red (no σ column given).'}`);
  lines.push('');
  lines.push(`Model: \`${r.equation.replace(/`/g, "'")}\`. ${mdCell(r.convention)}`);
  if (r.cautions.length > 0) {
    lines.push('');
    for (const c of r.cautions) {
      lines.push(`- ${mdCell(c)}`);
    }
  }
  lines.push('');
  lines.push(`Data: ${mdCell(sourceText(r))}. psiscape ${r.psiscapeVersion}.`);
  return lines.join('\n') + '\n';
}

const GREEK = new Set(['alpha', 'beta', 'gamma', 'delta', 'epsilon', 'zeta', 'eta', 'theta', 'kappa', 'lambda', 'mu', 'nu', 'xi', 'pi', 'rho', 'sigma', 'tau', 'phi', 'chi', 'psi', 'omega', 'Delta', 'Gamma', 'Theta', 'Lambda', 'Phi', 'Psi', 'Omega']);
const GREEK_LETTERS: Record<string, string> = { β: 'beta', γ: 'gamma', δ: 'delta', θ: 'theta', χ: 'chi', ψ: 'psi', Δ: 'Delta', η: 'eta', μ: 'mu', α: 'alpha' };

/** Escape text for LaTeX outside math mode. */
export function latexText(text: string): string {
  return text.replace(/[\\{}$&#^_%~]/g, c => (c === '\\' ? '\\textbackslash{}' : c === '^' ? '\\^{}' : c === '~' ? '\\~{}' : `\\${c}`));
}

/** A parameter name in math mode: Greek names as letters, one subscript (Tc → T_{\mathrm{c}}, chi0 → \chi_{0}, p_eff → p_{\mathrm{eff}}). */
export function latexSymbol(name: string): string {
  const plain = name.replace(/[βγδθχψΔημα]/g, c => GREEK_LETTERS[c]);
  const base = (s: string): string => (GREEK.has(s) ? `\\${s}` : /^[A-Za-z]$/.test(s) ? s : `\\mathrm{${latexText(s)}}`);
  const sub = (s: string): string => (/^\d+$/.test(s) ? s : GREEK.has(s) ? `\\${s}` : `\\mathrm{${latexText(s)}}`);
  if (GREEK.has(plain) || /^[A-Za-z]$/.test(plain)) {
    return base(plain);
  }
  const underscore = plain.indexOf('_');
  if (underscore > 0 && underscore < plain.length - 1) {
    return `${base(plain.slice(0, underscore))}_{${sub(plain.slice(underscore + 1))}}`;
  }
  // A Greek name followed by its subscript (chi0, theta1), longest name first.
  const greek = [...GREEK].sort((a, b) => b.length - a.length).find(g => plain.startsWith(g) && /^[A-Za-z0-9]+$/.test(plain.slice(g.length)));
  if (greek) {
    return `\\${greek}_{${sub(plain.slice(greek.length))}}`;
  }
  // One letter then digits, or a capital then a short lower-case subscript (T0, y0, Tc, Ms).
  const m = /^([A-Za-z])(\d+)$/.exec(plain) ?? /^([A-Z])([a-z]{1,3})$/.exec(plain);
  if (m) {
    return `${m[1]}_{${sub(m[2])}}`;
  }
  return base(plain);
}

/** A concise value(σ) in math mode: "1.23(45)e-5" becomes 1.23(45)\times 10^{-5}. */
function latexConcise(value: number, sigma: number | null): string {
  const text = formatConcise(value, sigma ?? NaN).replace('(?)', '');
  const m = /^(.*)e(-?\d+)$/.exec(text);
  const body = m ? `${m[1]}\\times 10^{${m[2]}}` : text;
  return `$${body.replace(/^-/, '-')}$`;
}

/** The result as a LaTeX tabular (booktabs-free, value(uncertainty) notation), with a comment line naming the analysis and the verdict. */
export function reportLatex(r: IAnalysisReport): string {
  const lines: string[] = [];
  lines.push(`% ${r.kindLabel}: ${r.columns.y.header} against ${r.columns.x.header}, window ${windowText(r)}; ${VERDICT_WORDS[r.verdict.state].toLowerCase()}; psiscape ${r.psiscapeVersion}`);
  lines.push('\\begin{tabular}{lr}');
  lines.push('\\hline');
  lines.push('Parameter & Value \\\\');
  lines.push('\\hline');
  for (const p of r.fit.parameters) {
    lines.push(`$${latexSymbol(p.name)}$ & ${latexConcise(p.value, p.sigma)}${p.fixed ? ' (fixed)' : ''} \\\\`);
  }
  for (const d of distinctDerived(r)) {
    lines.push(`$${latexSymbol(d.name)}$ & ${latexConcise(d.value, d.sigma)} \\\\`);
  }
  lines.push('\\hline');
  if (r.fit.reducedChi2 !== null) {
    lines.push(`$\\chi^2_\\nu$ & $${formatPlain(r.fit.reducedChi2)}$ \\\\`);
    lines.push('\\hline');
  }
  lines.push('\\end{tabular}');
  return lines.join('\n') + '\n';
}

/** A CSV field: quoted when it holds a comma, quote or line break. */
function csvField(text: string): string {
  return /[",\n\r]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

/** Shortest text that reads back as the same binary64 number; empty for null. */
function fullPrecision(v: number | null): string {
  return v === null || !Number.isFinite(v) ? '' : String(v);
}

/** Parameters and derived values as CSV at full precision: name, value, standard error, interval, kind of row. */
export function reportCsv(r: IAnalysisReport): string {
  const rows = [['name', 'value', 'standard_error', 'interval_low', 'interval_high', 'row']];
  for (const p of r.fit.parameters) {
    rows.push([p.name, fullPrecision(p.value), fullPrecision(p.sigma), fullPrecision(p.interval?.[0] ?? null), fullPrecision(p.interval?.[1] ?? null), p.fixed ? 'fixed parameter' : 'parameter']);
  }
  for (const d of distinctDerived(r)) {
    rows.push([d.name, fullPrecision(d.value), fullPrecision(d.sigma), '', '', 'derived']);
  }
  rows.push(['reduced_chi2', fullPrecision(r.fit.reducedChi2), '', '', '', 'statistic']);
  return rows.map(row => row.map(csvField).join(',')).join('\n') + '\n';
}

/** The fitted points with the model and residuals, for {@link dataCsv}. */
export interface IFittedPoints {
  x: ArrayLike<number>;
  y: ArrayLike<number>;
  sigma?: ArrayLike<number>;
  /** yᵢ − f(xᵢ), one per point. */
  residuals: ArrayLike<number>;
}

/**
 * The fitted points as CSV at full precision: x, y, σ (when given), the
 * model f(x) = y − residual, the residual y − f(x) and, with σ, the
 * normalised residual (y − f(x))/σ. Headers are the columns' own.
 */
export function dataCsv(r: IAnalysisReport, points: IFittedPoints): string {
  const n = points.x.length;
  if (points.y.length !== n || points.residuals.length !== n || (points.sigma && points.sigma.length !== n)) {
    throw new RangeError(`the fitted points and their residuals differ in length (${n}, ${points.y.length}, ${points.residuals.length})`);
  }
  const sigmaHeader = r.columns.sigma ? r.columns.sigma.header : 'sigma';
  const header = [r.columns.x.header, r.columns.y.header, ...(points.sigma ? [sigmaHeader] : []), 'model', 'residual', ...(points.sigma ? ['normalised_residual'] : [])];
  const rows = [header.map(csvField).join(',')];
  for (let i = 0; i < n; i++) {
    const res = points.residuals[i];
    const cells = [points.x[i], points.y[i], ...(points.sigma ? [points.sigma[i]] : []), points.y[i] - res, res, ...(points.sigma ? [res / points.sigma[i]] : [])];
    rows.push(cells.map(v => fullPrecision(v)).join(','));
  }
  return rows.join('\n') + '\n';
}
