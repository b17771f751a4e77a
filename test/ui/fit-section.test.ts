/**
 * Fitting from the analysis panel (real widgets in jsdom; jobs run on the main
 * thread here because jsdom has no Web Worker): results table, overlay curve,
 * σ column, refusals as messages, cancel.
 */
import { afterEach, describe, expect, it, vi } from 'vitest';
import { nullTranslator } from '@jupyterlab/translation';
import { MessageLoop } from '@lumino/messaging';
import { Widget } from '@lumino/widgets';
import { parseMime } from '../../src/core/table';
import { weissMagnetisation } from '../../src/core/physics/weiss';
import { AnalysisPanel } from '../../src/ui/analysis-panel';
import { AnalysisRunner } from '../../src/ui/analysis-runner';

function weissCsv(): string {
  // Spin-½ Weiss curve (REFERENCE.md B1) with a deterministic ±0.3 wiggle standing in for noise.
  const rows = ['T (K),M (emu/g),sigma_M (emu/g)'];
  const T = Array.from({ length: 60 }, (_, i) => 20 + 5 * i);
  const m = weissMagnetisation(0.5, T.map(t => t / 250));
  T.forEach((t, i) => rows.push(`${t},${(80 * m[i] + 0.3 * Math.sin(7 * i)).toFixed(5)},0.3`));
  return rows.join('\n');
}

function open(csv: string) {
  const panel = new AnalysisPanel({
    parse: parseMime('text/csv', csv),
    notebookName: 'n.ipynb',
    sourceLabel: 'n.ipynb · cell 1 · output 1',
    pointSize: 20,
    translator: nullTranslator,
    onRevealSource: vi.fn(),
    runner: new AnalysisRunner({ workerFactory: () => null })
  });
  Widget.attach(panel, document.body);
  return panel;
}

describe('FitSection in the analysis panel', () => {
  afterEach(() => {
    document.body.innerHTML = '';
  });

  it('should pick the σ column that belongs to y', () => {
    const panel = open(weissCsv());
    expect(panel.sigmaColumn).toBe(2);
    expect(panel.node.querySelector<HTMLSelectElement>('select.jp-psiscape-sigma')!.selectedOptions[0].textContent).toBe('sigma_M (emu/g)');
  });

  it('should fit the Weiss model, list values with errors and draw the curve over the points', async () => {
    const panel = open(weissCsv());
    await panel.rendered;
    panel.fitSection.setModel('weiss');
    panel.node.querySelector<HTMLButtonElement>('button.jp-psiscape-fit-run')!.click();
    await panel.fitSection.settled;
    await panel.rendered;
    const outcome = panel.fitSection.outcome!;
    expect(outcome.fit.converged).toBe(true);
    expect(outcome.fit.errorScaling).toBe('from-sigma');
    const rows = Array.from(panel.node.querySelectorAll('.jp-psiscape-fit-table tbody tr')).map(r => r.children[0].textContent);
    expect(rows).toEqual(['Ms', 'Tc']);
    const tcCell = panel.node.querySelectorAll('.jp-psiscape-fit-table tbody tr')[1].children[1].textContent!;
    expect(tcCell).toMatch(/^250\.\d+ ± 0\.\d+$/);
    expect(panel.node.querySelector('.jp-psiscape-fit-ok')!.textContent).toMatch(/^Converged/);
    expect(panel.node.querySelector('.jp-psiscape-fit-table caption')!.textContent).toBe('Standard errors from the σ column (not rescaled).');
    expect(panel.node.querySelectorAll('.jp-psiscape-ChartView svg .mark-line path').length).toBe(1);
    expect(panel.node.querySelectorAll('.jp-psiscape-ChartView svg g.mark-symbol.role-mark path').length).toBe(60);
  });

  it('should show a refusal as a message in the panel and keep the controls', async () => {
    const panel = open(weissCsv());
    panel.fitSection.setModel('weiss');
    panel.node.querySelector<HTMLInputElement>('input.jp-psiscape-fit-min')!.value = '30';
    panel.node.querySelector<HTMLInputElement>('input.jp-psiscape-fit-max')!.value = '36';
    await panel.fitSection.runFit();
    const error = panel.node.querySelector<HTMLElement>('.jp-psiscape-fit-error')!;
    expect(error.hidden).toBe(false);
    expect(error.textContent).toBe('The fit could not run: The Weiss mean-field fit needs at least 4 points in the fit window, but the window holds 2. Widen the window.');
    expect(panel.fitSection.outcome).toBeNull();
  });

  it('should cancel a running fit and keep the previous result', async () => {
    const panel = open(weissCsv());
    panel.fitSection.setModel('weiss');
    await panel.fitSection.runFit();
    const first = panel.fitSection.outcome;
    expect(first).not.toBeNull();
    const running = panel.fitSection.runFit();
    panel.node.querySelector<HTMLButtonElement>('button.jp-psiscape-fit-cancel')!.click();
    await running;
    expect(panel.fitSection.outcome).toBe(first);
    expect(panel.node.querySelector('.jp-psiscape-fit-status')!.textContent).toBe('Fit cancelled; the previous result is kept.');
  });

  it('should not refit on a layout fit request (theme changes send one to every widget)', async () => {
    const panel = open(weissCsv());
    panel.fitSection.setModel('weiss');
    await panel.fitSection.runFit();
    const first = panel.fitSection.outcome;
    // Lumino's Widget.fit() posts a fit-request; JupyterLab calls it on all widgets when the theme changes.
    panel.fit();
    panel.fitSection.fit();
    MessageLoop.flush();
    await new Promise(resolve => setTimeout(resolve, 50));
    expect(panel.fitSection.outcome).toBe(first);
    expect(panel.node.querySelector('.jp-psiscape-fit-status')!.textContent).toBe('');
  });

  it('should clear the result when other columns are chosen', async () => {
    const panel = open(weissCsv());
    panel.fitSection.setModel('weiss');
    await panel.fitSection.runFit();
    await panel.select(0, 2);
    expect(panel.fitSection.outcome).toBeNull();
    expect(panel.node.querySelector('.jp-psiscape-fit-table')).toBeNull();
  });
});
