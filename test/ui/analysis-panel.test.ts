/**
 * The analysis panel as a real Lumino widget attached to the document: column
 * pickers, the chart drawn by Vega as SVG, messages instead of blank panels,
 * and the source control.
 */
import { afterEach, describe, expect, it, vi } from 'vitest';
import { nullTranslator } from '@jupyterlab/translation';
import { Widget } from '@lumino/widgets';
import { parseMime } from '../../src/core/table';
import { AnalysisPanel } from '../../src/ui/analysis-panel';

const CSV = 'T (K),M (emu/g),sigma\n10,5.0,0.1\n20,4.5,0.1\n30,NaN,0.1\n40,3.0,0.1\n';

function panelFor(parse: ReturnType<typeof parseMime>, onRevealSource = vi.fn()) {
  const panel = new AnalysisPanel({
    parse,
    notebookName: 'sample.ipynb',
    sourceLabel: 'sample.ipynb · cell 2 · output 1',
    pointSize: 30,
    translator: nullTranslator,
    onRevealSource
  });
  Widget.attach(panel, document.body);
  return { panel, onRevealSource };
}

describe('AnalysisPanel', () => {
  afterEach(() => {
    document.body.innerHTML = '';
  });

  it('should pick the first two numeric data columns and draw one mark per finite row', async () => {
    const { panel } = panelFor(parseMime('text/csv', CSV));
    await panel.rendered;
    expect(panel.selection).toEqual({ x: 0, y: 1 });
    const x = panel.node.querySelector<HTMLSelectElement>('select.jp-psiscape-x')!;
    expect(Array.from(x.options).map(o => o.textContent)).toEqual(['T (K)', 'M (emu/g)', 'sigma']);
    const marks = panel.node.querySelectorAll('.jp-psiscape-ChartView svg .mark-symbol path');
    expect(marks.length).toBe(3);
    const status = panel.node.querySelector('.jp-psiscape-AnalysisPanel-status')!.textContent;
    expect(status).toBe('3 points plotted; 1 rows left out (missing or infinite values).');
    expect(panel.node.getAttribute('role')).toBe('region');
  });

  it('should redraw when the user picks another y column', async () => {
    const { panel } = panelFor(parseMime('text/csv', CSV));
    await panel.rendered;
    const y = panel.node.querySelector<HTMLSelectElement>('select.jp-psiscape-y')!;
    y.value = '2';
    y.dispatchEvent(new Event('change'));
    await panel.rendered;
    expect(panel.selection).toEqual({ x: 0, y: 2 });
    expect(panel.node.querySelectorAll('.jp-psiscape-ChartView svg .mark-symbol path').length).toBe(4);
  });

  it('should show the parser message, and no chart, for an output without a table', async () => {
    const { panel } = panelFor({ ok: false, message: 'This output holds no table: it has only image/png.' });
    const message = panel.node.querySelector('.jp-psiscape-AnalysisPanel-message')!;
    expect(message.textContent).toBe('This output holds no table: it has only image/png.');
    expect(message.getAttribute('role')).toBe('alert');
    expect(panel.node.querySelector('.jp-psiscape-ChartView svg')).toBeNull();
    expect(panel.table).toBeNull();
  });

  it('should explain when a table has fewer than two numeric columns', () => {
    const { panel } = panelFor(parseMime('text/csv', 'sample,T (K)\nA,10\nB,20\n'));
    expect(panel.node.querySelector('.jp-psiscape-AnalysisPanel-message')!.textContent).toMatch(/fewer than two numeric columns/);
  });

  it('should call back to reveal the source cell from a keyboard-reachable button', () => {
    const { panel, onRevealSource } = panelFor(parseMime('text/csv', CSV));
    const button = panel.node.querySelector<HTMLButtonElement>('button.jp-psiscape-reveal')!;
    expect(button.type).toBe('button');
    expect(panel.node.querySelector('.jp-psiscape-AnalysisPanel-source')!.textContent).toBe('sample.ipynb · cell 2 · output 1');
    button.click();
    expect(onRevealSource).toHaveBeenCalledTimes(1);
  });

  it('should refuse to plot a non-numeric column', () => {
    const { panel } = panelFor(parseMime('text/csv', 'name,T,M\na,1,2\nb,2,3\n'));
    expect(() => panel.select(0, 1)).toThrow(RangeError);
  });
});
