/**
 * The panel's export toolbar, through a real panel and a real fit: nothing to
 * export before a fit; after it the Markdown, LaTeX and CSV copies carry the
 * panel's numbers, the JSON record validates against its published schema,
 * and the chart's SVG and Vega-Lite spec hold the data points.
 */
import fs from 'node:fs';
import path from 'node:path';
import Ajv from 'ajv';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { parseMime } from '../../src/core/table';
import type { IExportHost } from '../../src/ui/export-bar';
import { choose, panelFor, weissCsv } from './helpers';

const schema = JSON.parse(fs.readFileSync(path.resolve(__dirname, '../../schema/analysis-result.v1.json'), 'utf8'));

function host() {
  const copied: string[] = [];
  const saved: { name: string; content: string; format: string }[] = [];
  const h: IExportHost = {
    psiscapeVersion: '1.2.3',
    copy: vi.fn((text: string) => void copied.push(text)),
    save: vi.fn(async (name: string, content: string, format: 'text' | 'base64') => {
      saved.push({ name, content, format });
      return `runs/${name}`;
    })
  };
  return { h, copied, saved };
}

async function fitted(exports: IExportHost) {
  const { panel, session } = panelFor(parseMime('text/csv', weissCsv()), { exports });
  await panel.rendered;
  const bar = panel.exportBar!;
  const before = bar.canRun('markdown');
  choose(panel.node.querySelector<HTMLSelectElement>('select.jp-psiscape-fit-kind')!, 'weiss');
  panel.node.querySelector<HTMLButtonElement>('button.jp-psiscape-fit-run')!.click();
  await panel.fitSection.settled;
  await panel.rendered;
  return { panel, session, bar, before };
}

describe('ExportBar in the analysis panel', () => {
  afterEach(() => {
    document.body.innerHTML = '';
  });

  it('should have nothing to export before a fit, and enable the result exports after it', async () => {
    const { h } = host();
    const { bar, before, panel } = await fitted(h);
    expect(before).toBe(false);
    expect(bar.canRun('markdown')).toBe(true);
    expect(bar.canRun('json')).toBe(true);
    expect(panel.node.querySelector<HTMLButtonElement>('button.jp-psiscape-export-markdown')!.disabled).toBe(false);
  });

  it('should copy Markdown, LaTeX and CSV with the numbers the panel shows', async () => {
    const { h, copied } = host();
    const { bar, panel } = await fitted(h);
    const shown = Array.from(panel.node.querySelectorAll('.jp-psiscape-fit-table tbody tr')).map(r => [r.children[0].textContent!, r.children[1].textContent!]);
    expect(await bar.run('markdown')).toBe('Copied the result as Markdown.');
    for (const [name, text] of shown) {
      expect(copied[0]).toContain(`| ${name} | ${text} |`);
    }
    expect(copied[0]).toContain('T (K)');
    expect(copied[0]).toContain('psiscape 1.2.3');
    await bar.run('latex');
    expect(copied[1]).toContain('\\begin{tabular}');
    // 250.xx ± 0.yy in the panel is 250.xx(yy) in LaTeX.
    const [tcValue, tcSigma] = shown.find(([n]) => n === 'Tc')![1].split(' ± ');
    expect(copied[1]).toContain(`$${tcValue}(${Number(tcSigma.replace(/^0\.0*/, ''))})$`);
    await bar.run('csv');
    expect(copied[2].split('\n')[0]).toBe('name,value,standard_error,interval_low,interval_high,row');
  });

  it('should save the result as JSON that validates against schema/analysis-result.v1.json', async () => {
    const { h, saved } = host();
    const { bar, session } = await fitted(h);
    expect(await bar.run('json')).toBe('Saved runs/sample weiss result.json.');
    const record = JSON.parse(saved[0].content);
    const validate = new Ajv({ allErrors: true, strict: false }).compile(schema);
    expect(validate(record)).toBe(true);
    expect(record.fit.parameters.map((p: { value: number }) => p.value)).toEqual(session.outcome!.fit.values);
    expect(record.source).toEqual(session.source);
    expect(record.columns.sigma).toEqual({ header: 'sigma_M (emu/g)', unit: 'emu/g' });
  });

  it('should save the chart as SVG holding every data point, and copy its Vega-Lite spec', async () => {
    const { h, saved, copied } = host();
    const { bar } = await fitted(h);
    expect(await bar.run('svg')).toBe('Saved runs/sample chart.svg.');
    const svg = new DOMParser().parseFromString(saved[0].content, 'image/svg+xml');
    expect(svg.documentElement.nodeName).toBe('svg');
    expect(svg.querySelector('parsererror')).toBeNull();
    expect(svg.querySelectorAll('g.mark-symbol.role-mark path').length).toBe(60);
    await bar.run('vega-lite');
    const spec = JSON.parse(copied[0]);
    expect(spec.$schema).toMatch(/vega-lite/);
  });

  it('should save the fitted points with the model and residuals as CSV', async () => {
    const { h, saved } = host();
    const { bar, session } = await fitted(h);
    expect(await bar.run('data')).toBe('Saved runs/sample weiss data.csv.');
    const lines = saved[0].content.trim().split('\n');
    expect(lines[0]).toBe('T (K),M (emu/g),sigma_M (emu/g),model,residual,normalised_residual');
    const outcome = session.outcome!;
    expect(lines.length - 1).toBe(outcome.used);
    lines.slice(1).forEach((line, i) => {
      const [, y, sigma, model, residual, normalised] = line.split(',').map(Number);
      expect(residual).toBe(outcome.fit.residuals[i]);
      expect(model).toBeCloseTo(y - residual, 12);
      expect(normalised).toBeCloseTo(residual / sigma, 12);
    });
  });

  it('should save the chart at a chosen size, and refuse half a size', async () => {
    const { h, saved } = host();
    const { bar, panel } = await fitted(h);
    const width = panel.node.querySelector<HTMLInputElement>('input.jp-psiscape-export-width')!;
    const height = panel.node.querySelector<HTMLInputElement>('input.jp-psiscape-export-height')!;
    width.value = '640';
    expect(await bar.run('svg')).toMatch(/both a width and a height/);
    height.value = '400';
    expect(await bar.run('svg')).toBe('Saved runs/sample chart.svg.');
    const svg = new DOMParser().parseFromString(saved[0].content, 'image/svg+xml').documentElement;
    // The plotting area is 640 × 400; axes, titles and legend add a margin.
    expect(Number(svg.getAttribute('width'))).toBeGreaterThanOrEqual(640);
    expect(Number(svg.getAttribute('width'))).toBeLessThan(640 + 250);
    expect(Number(svg.getAttribute('height'))).toBeGreaterThanOrEqual(400);
    expect(svg.querySelectorAll('g.mark-symbol.role-mark path').length).toBe(60);
  });

  it('should say what went wrong when saving fails, and lose nothing', async () => {
    const { h } = host();
    h.save = async () => {
      throw new Error('disk full');
    };
    const { bar, session } = await fitted(h);
    expect(await bar.run('json')).toBe('Could not export: disk full');
    expect(session.outcome).not.toBeNull();
  });

  it('should not offer exports when the lab gives the panel nowhere to export to', async () => {
    const { panel } = panelFor(parseMime('text/csv', weissCsv()));
    await panel.rendered;
    expect(panel.exportBar).toBeNull();
    expect(panel.node.querySelector('.jp-psiscape-ExportBar')).toBeNull();
  });
});
