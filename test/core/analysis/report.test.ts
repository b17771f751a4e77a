/**
 * A fit's result as it leaves the panel: the uncertainty notation (worked
 * examples of the GUM), the JSON record against its published schema, and the
 * Markdown, LaTeX and CSV forms carrying the same numbers as the panel.
 */
import fs from 'node:fs';
import path from 'node:path';
import Ajv from 'ajv';
import { describe, expect, it } from 'vitest';
import { formatWithError, runAnalysisJob } from '../../../src/core/analysis';
import { ANALYSIS_MIME, buildReport, escapeHtml, formatConcise, latexSymbol, notebookOutputs, reportCsv, reportHtml, reportLatex, reportMarkdown, roundWithError } from '../../../src/core/analysis/report';
import type { IReportContext } from '../../../src/core/analysis/report';
import { weissMagnetisation } from '../../../src/core/physics/weiss';
import { normal } from '../physics/prng';

const schema = JSON.parse(fs.readFileSync(path.resolve(__dirname, '../../../schema/analysis-result.v1.json'), 'utf8'));
const validate = new Ajv({ allErrors: true, strict: false }).compile(schema);

function weissOutcome(withSigma: boolean) {
  // Spin-½ Weiss curve (REFERENCE.md B1) with seeded noise: an invented sample, for the export only.
  const rnd = normal(21);
  const T = Array.from({ length: 80 }, (_, i) => 20 + 4 * i);
  const m = weissMagnetisation(0.5, T.map(t => t / 287.4));
  const M = T.map((_, i) => 92.3 * m[i] + 0.4 * rnd());
  return runAnalysisJob({ kind: 'weiss', x: T, y: M, sigma: withSigma ? T.map(() => 0.4) : undefined, window: { min: 0, max: 1000 }, options: { J: 0.5 } });
}

const context: IReportContext = {
  psiscapeVersion: '9.9.9',
  source: { notebookPath: 'runs/am17.ipynb', cellId: 'c-3', outputIndex: 0, contentHash: '0123456789abcdef' },
  columns: { x: { header: 'T (K)', unit: 'K' }, y: { header: 'M (emu/g)', unit: 'emu/g' }, sigma: { header: 'sigma_M (emu/g)', unit: 'emu/g' } }
};

describe('uncertainty notation', () => {
  it('writes the GUM §7.2.2 example in the concise form', () => {
    // JCGM 100:2008 §7.2.2: m_s = 100.02147(35) g with u_c = 0.35 mg [REFERENCES.md N16].
    expect(formatConcise(100.02147, 0.00035)).toBe('100.02147(35)');
    expect(formatWithError(100.02147, 0.00035)).toBe('100.02147 ± 0.00035');
  });

  it('rounds σ to two significant digits and the value to the same place', () => {
    // Common practice (GUM §7.2.6 allows at most two digits), no other source.
    expect(roundWithError(287.3012, 0.4049)).toEqual({ value: '287.30', sigma: '0.40', exponent: null });
    expect(formatConcise(287.3012, 0.4049)).toBe('287.30(40)');
    expect(formatConcise(0.46612, 0.01712)).toBe('0.466(17)');
    expect(formatConcise(141.93, 4.87)).toBe('141.9(4.9)');
    expect(formatConcise(1234.4, 56.2)).toBe('1234(56)');
    expect(formatConcise(1.234e-5, 4.5e-7)).toBe('1.234(45)e-5');
    expect(formatWithError(1.234e-5, 4.5e-7)).toBe('1.234e-5 ± 0.045e-5');
  });

  it('says so when there is no value or no usable σ', () => {
    expect(roundWithError(NaN, 1)).toBeNull();
    expect(roundWithError(1, 0)).toBeNull();
    expect(roundWithError(1, Infinity)).toBeNull();
    expect(formatConcise(NaN, 1)).toBe('—');
    expect(formatConcise(2.5, NaN)).toBe('2.5(?)');
    expect(formatWithError(2.5, -1)).toBe('2.5 ± ?');
  });
});

describe('the result record', () => {
  it('validates against schema/analysis-result.v1.json, with and without a σ column', () => {
    for (const withSigma of [true, false]) {
      const report = buildReport(weissOutcome(withSigma), { ...context, columns: { ...context.columns, sigma: withSigma ? context.columns.sigma : null } });
      const ok = validate(JSON.parse(JSON.stringify(report)));
      expect(validate.errors ?? []).toEqual([]);
      expect(ok).toBe(true);
    }
  });

  it('carries values, σ, covariance, verdict, window, convention, source and version', () => {
    const outcome = weissOutcome(true);
    const r = buildReport(outcome, context);
    expect(r.kind).toBe('weiss');
    expect(r.fit.parameters.map(p => p.name)).toEqual(outcome.fit.parameters);
    expect(r.fit.parameters.map(p => p.value)).toEqual(outcome.fit.values);
    expect(r.fit.parameters.map(p => p.sigma)).toEqual(outcome.fit.standardErrors);
    expect(r.fit.covariance).toEqual(outcome.fit.covariance);
    expect(r.verdict.state).toBe(outcome.verdict.state);
    expect(r.verdict.checks.length).toBe(outcome.verdict.checks.length);
    expect(r.window).toEqual({ min: 0, max: 1000 });
    expect(r.convention.length).toBeGreaterThan(10);
    expect(r.source).toEqual(context.source);
    expect(r.psiscapeVersion).toBe('9.9.9');
  });

  it('writes numbers that are not finite as null, never as invalid JSON', () => {
    const outcome = weissOutcome(false);
    const broken = { ...outcome, window: { min: -Infinity, max: Infinity }, fit: { ...outcome.fit, standardErrors: outcome.fit.standardErrors.map(() => NaN), reducedChi2: NaN } };
    const r = buildReport(broken, context);
    expect(r.window).toEqual({ min: null, max: null });
    expect(r.fit.parameters.every(p => p.sigma === null)).toBe(true);
    expect(r.fit.reducedChi2).toBeNull();
    expect(validate(JSON.parse(JSON.stringify(r)))).toBe(true);
  });
});

describe('Markdown, LaTeX and CSV', () => {
  const outcome = weissOutcome(true);
  const r = buildReport(outcome, context);

  it('puts the panel’s rounded numbers in the Markdown table', () => {
    const md = reportMarkdown(r);
    outcome.fit.parameters.forEach((name, i) => {
      expect(md).toContain(`| ${name} | ${formatWithError(outcome.fit.values[i], outcome.fit.standardErrors[i])} |`);
    });
    expect(md).toContain('Describes the data');
    expect(md).toContain('χ²_red = ');
    expect(md).toContain('runs/am17.ipynb, cell id c-3, output 1');
    expect(md).toContain('psiscape 9.9.9');
  });

  it('writes the same rounding in value(uncertainty) form in the LaTeX tabular', () => {
    const tex = reportLatex(r);
    expect(tex).toMatch(/\\begin\{tabular\}\{lr\}[\s\S]*\\end\{tabular\}/);
    outcome.fit.parameters.forEach((name, i) => {
      const concise = formatConcise(outcome.fit.values[i], outcome.fit.standardErrors[i]);
      expect(tex).toContain(`$${latexSymbol(name)}$ & $${concise}$`);
      // Same digits as the panel: the value part is the panel's value text.
      expect(concise.startsWith(formatWithError(outcome.fit.values[i], outcome.fit.standardErrors[i]).split(' ± ')[0])).toBe(true);
    });
  });

  it('names symbols as physicists write them', () => {
    expect(latexSymbol('Tc')).toBe('T_{\\mathrm{c}}');
    expect(latexSymbol('beta')).toBe('\\beta');
    expect(latexSymbol('β')).toBe('\\beta');
    expect(latexSymbol('chi0')).toBe('\\chi_{0}');
    expect(latexSymbol('p_eff')).toBe('p_{\\mathrm{eff}}');
    expect(latexSymbol('Ms')).toBe('M_{\\mathrm{s}}');
    expect(latexSymbol('A')).toBe('A');
  });

  it('writes the CSV at full precision, one row per parameter', () => {
    const csv = reportCsv(r).trim().split('\n');
    expect(csv[0]).toBe('name,value,standard_error,interval_low,interval_high,row');
    outcome.fit.parameters.forEach((name, i) => {
      const cells = csv[i + 1].split(',');
      expect(cells[0]).toBe(name);
      expect(Number(cells[1])).toBe(outcome.fit.values[i]);
      expect(Number(cells[2])).toBe(outcome.fit.standardErrors[i]);
    });
  });

  it('keeps hostile text inert: table cells and LaTeX specials are escaped', () => {
    const hostile = buildReport(outcome, { ...context, columns: { ...context.columns, y: { header: 'M | $x$ & 50% _', unit: null } } });
    const md = reportMarkdown(hostile);
    expect(md).toContain('M \\| $x$ & 50% _');
    const tex = reportLatex(hostile);
    expect(tex.split('\n')[0]).toContain('M | $x$ & 50% _'); // a comment line: LaTeX ignores it
  });
});

describe('notebook outputs', () => {
  const outcome = weissOutcome(true);
  const r = buildReport(outcome, context);
  const outputs = notebookOutputs({ report: r, png: 'iVBORw0KGgo=', pngScale: 2, width: 480.4, height: 300, svg: '<svg xmlns="http://www.w3.org/2000/svg"></svg>', spec: { $schema: 'https://vega.github.io/schema/vega-lite/v5.json' }, analysis: { id: 'a1' } });

  it('puts the chart and the results in two display outputs with several representations each', () => {
    expect(outputs.map(o => o.output_type)).toEqual(['display_data', 'display_data']);
    expect(Object.keys(outputs[0].data).sort()).toEqual(['application/vnd.psiscape.analysis.v1+json', 'application/vnd.vegalite.v5+json', 'image/png', 'image/svg+xml', 'text/plain']);
    expect(outputs[0].data[ANALYSIS_MIME]).toEqual({ format: 'psiscape-analysis', version: 1, part: 'chart' });
    expect(outputs[0].metadata).toEqual({ 'image/png': { width: 480, height: 300 } });
    expect(Object.keys(outputs[1].data).sort()).toEqual([ANALYSIS_MIME, 'text/html', 'text/markdown', 'text/plain']);
    const own = outputs[1].data[ANALYSIS_MIME] as { format: string; version: number; part: string; result: unknown; analysis: unknown };
    expect(own.format).toBe('psiscape-analysis');
    expect(own.part).toBe('analysis');
    expect(own.version).toBe(1);
    expect(own.result).toEqual(r);
    expect(own.analysis).toEqual({ id: 'a1' });
  });

  it('writes the panel’s numbers into the HTML table', () => {
    const html = outputs[1].data['text/html'] as string;
    outcome.fit.parameters.forEach((name, i) => {
      expect(html).toContain(`<tr><td>${name}</td><td>${formatWithError(outcome.fit.values[i], outcome.fit.standardErrors[i])}</td>`);
    });
    expect(html).toContain('psiscape 9.9.9');
  });

  it('escapes every text that reaches the HTML', () => {
    const hostile = buildReport(outcome, { ...context, columns: { ...context.columns, y: { header: '<img src=x onerror=alert(1)>', unit: null } } });
    const html = reportHtml(hostile);
    expect(html).not.toContain('<img');
    expect(html).toContain('&lt;img src=x onerror=alert(1)&gt;');
    expect(escapeHtml(`a&b<c>"d'`)).toBe('a&amp;b&lt;c&gt;&quot;d&#39;');
  });
});
