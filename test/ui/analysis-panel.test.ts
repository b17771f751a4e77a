/**
 * The analysis panel as a real Lumino widget attached to the document, over a
 * real session: column pickers, the chart drawn by Vega as SVG, messages
 * instead of blank panels, the source control, and one draw per change.
 */
import { afterEach, describe, expect, it } from 'vitest';
import { parseMime } from '../../src/core/table';
import { choose, panelFor } from './helpers';

const CSV = 'T (K),M (emu/g),sigma\n10,5.0,0.1\n20,4.5,0.1\n30,NaN,0.1\n40,3.0,0.1\n';

describe('AnalysisPanel', () => {
  afterEach(() => {
    document.body.innerHTML = '';
  });

  it('should pick the first two numeric data columns and draw one mark per finite row', async () => {
    const { panel, session } = panelFor(parseMime('text/csv', CSV));
    await panel.rendered;
    expect(session.roles).toEqual({ x: 0, y: 1, sigma: 2 });
    const x = panel.node.querySelector<HTMLSelectElement>('select.jp-psiscape-x')!;
    expect(Array.from(x.options).map(o => o.textContent)).toEqual(['T (K)', 'M (emu/g)', 'sigma']);
    expect(panel.node.querySelectorAll('.jp-psiscape-ChartView svg g.mark-symbol.role-mark path').length).toBe(3);
    expect(panel.node.querySelector('.jp-psiscape-AnalysisPanel-status')!.textContent).toBe('3 points plotted; 1 rows left out (missing or infinite values).');
    expect(panel.node.getAttribute('role')).toBe('region');
    expect(panel.title.label).toBe('M vs T · sample.ipynb · power law');
  });

  it('should draw once for a burst of changes', async () => {
    const { panel, session } = panelFor(parseMime('text/csv', CSV));
    await panel.rendered;
    const before = panel.drawCount;
    session.setRoles({ sigma: null });
    session.setRoles({ y: 2 });
    session.setWindow(15, 35);
    await panel.rendered;
    expect(panel.drawCount).toBe(before + 1);
  });

  it('should send the user’s column choice to the session and redraw', async () => {
    const { panel, session } = panelFor(parseMime('text/csv', CSV));
    await panel.rendered;
    choose(panel.node.querySelector<HTMLSelectElement>('select.jp-psiscape-y')!, '2');
    await panel.rendered;
    expect(session.roles).toMatchObject({ x: 0, y: 2 });
    expect(panel.node.querySelectorAll('.jp-psiscape-ChartView svg g.mark-symbol.role-mark path').length).toBe(4);
  });

  it('should tell two columns with the same header apart in the pickers', async () => {
    const { panel } = panelFor(parseMime('text/csv', 'T,M,M,S\n1,10,20,0.5\n2,11,21,0.5\n3,12,22,0.5\n'));
    await panel.rendered;
    const y = panel.node.querySelector<HTMLSelectElement>('select.jp-psiscape-y')!;
    expect(Array.from(y.options).map(o => o.textContent)).toEqual(['T', 'M (column 2)', 'M (column 3)', 'S']);
  });

  it('should show the parser message, and no chart, for an output without a table', async () => {
    const { panel, session } = panelFor({ ok: false, message: { code: 'table.no-table', text: 'This output holds no table: it has only %1.', args: ['image/png'] } });
    await panel.rendered;
    const message = panel.node.querySelector('.jp-psiscape-AnalysisPanel-message')!;
    expect(message.textContent).toBe('This output holds no table: it has only image/png.');
    expect(message.getAttribute('role')).toBe('alert');
    expect(panel.node.querySelector('.jp-psiscape-ChartView svg')).toBeNull();
    expect(session.table).toBeNull();
  });

  it('should explain when a table has fewer than two numeric columns', async () => {
    const { panel } = panelFor(parseMime('text/csv', 'sample,T (K)\nA,10\nB,20\n'));
    await panel.rendered;
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

  it('should show why the data are not live', async () => {
    const { panel, session } = panelFor(parseMime('text/csv', CSV));
    session.setSourceState('lost', { code: 'source.cell-deleted', text: 'The source cell was deleted; this analysis keeps its last data.', args: [] });
    await panel.rendered;
    expect(panel.node.dataset.sourceState).toBe('lost');
    expect(panel.node.querySelector('.jp-psiscape-AnalysisPanel-banner')!.textContent).toMatch(/deleted/);
  });
});

describe('a restored analysis', () => {
  afterEach(() => {
    document.body.innerHTML = '';
  });

  it('should be drawn once, with the curve of its refit', async () => {
    // Spin-½ Weiss-like M(T) (REFERENCE.md B1 shape), saved with a Weiss fit, then restored into a new panel.
    const rows = ['T (K),M (emu/g)'];
    for (let i = 0; i < 40; i++) {
      const T = 20 + 6 * i;
      rows.push(`${T},${(80 * Math.sqrt(Math.max(0, 1 - (T / 250) ** 2)) + 0.2 * Math.sin(5 * i)).toFixed(4)}`);
    }
    const parse = parseMime('text/csv', rows.join('\n'));
    const first = panelFor(parse);
    first.session.setKind('weiss');
    first.session.beginRun();
    const saved = first.session.toSaved()!;
    first.panel.dispose();

    const { panel, session } = panelFor({ ok: false, message: { code: 'test.wait', text: 'restoring', args: [] } });
    session.restore(saved, parse, { code: 'test.note', text: 'saved copy', args: [] });
    panel.runFitWhenShown();
    await panel.fitSection.settled;
    await panel.rendered;
    await new Promise(resolve => setTimeout(resolve, 50));
    await panel.rendered;
    expect(session.run.phase).toBe('done');
    expect(panel.drawCount).toBe(1);
    expect(panel.chart.node.querySelectorAll('svg .mark-line path').length).toBe(1);
  });
});
