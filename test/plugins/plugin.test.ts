/**
 * The plugin inside a real JupyterLab application: commands registered in the
 * real CommandRegistry, settings from our schema through a real
 * SettingRegistry, tables read from real notebook models, panels added to the
 * real shell, and the source cell revealed in a real Notebook widget.
 */
import { afterEach, describe, expect, it } from 'vitest';
import plugins, { PLUGIN_ID } from '../../src/plugins';
import { AnalysisPanel } from '../../src/ui/analysis-panel';
import { disposeLabs, labWith, openInLab, readNotebook } from './harness';

const ANALYSE_OUTPUT = 'psiscape:analyse-output';
const ANALYSE_SELECTED = 'psiscape:analyse-selected-cell';

function analysisPanels(app: { shell: { widgets(area: 'main'): IterableIterator<unknown> } }): AnalysisPanel[] {
  return Array.from(app.shell.widgets('main')).filter((w): w is AnalysisPanel => w instanceof AnalysisPanel);
}

describe('jupyterlab-psiscape:plugin', () => {
  afterEach(async () => {
    await disposeLabs();
  });

  it('should register its commands with labels from the real registry', async () => {
    const lab = await labWith(plugins, PLUGIN_ID);
    expect(lab.app.commands.hasCommand(ANALYSE_OUTPUT)).toBe(true);
    expect(lab.app.commands.hasCommand(ANALYSE_SELECTED)).toBe(true);
    expect(lab.app.commands.label(ANALYSE_OUTPUT)).toBe('Analyse This Table with psiscape');
    // Nothing to analyse before a notebook is open.
    expect(lab.app.commands.isEnabled(ANALYSE_SELECTED)).toBe(false);
  });

  it('should register the export commands, disabled until an analysis panel with a result is current', async () => {
    const lab = await labWith(plugins, PLUGIN_ID);
    for (const id of ['psiscape:insert-into-notebook', 'psiscape:save-fitted-data-csv', 'psiscape:copy-result-markdown', 'psiscape:copy-result-latex', 'psiscape:copy-result-csv', 'psiscape:save-result-json', 'psiscape:save-chart-svg', 'psiscape:save-chart-png', 'psiscape:copy-chart-vega-lite']) {
      expect(lab.app.commands.hasCommand(id)).toBe(true);
      expect(lab.app.commands.label(id)).not.toBe('');
      expect(lab.app.commands.isEnabled(id)).toBe(false);
    }
  });

  it('should open a panel with the first table of the selected cell', async () => {
    const lab = await labWith(plugins, PLUGIN_ID);
    const panel = await openInLab(lab, 'fixtures/outputs.ipynb', readNotebook('test/fixtures/outputs.ipynb'));
    panel.content.activeCellIndex = 1; // the small frame: T (K), M [emu/g], flag
    await lab.app.commands.execute(ANALYSE_SELECTED);
    const [analysis] = analysisPanels(lab.app);
    expect(analysis).toBeDefined();
    expect(analysis.session.table?.columns.map(c => [c.header, c.isIndex])).toEqual([
      ['index', true],
      ['T (K)', false],
      ['M [emu/g]', false],
      ['flag', false]
    ]);
    const t = analysis.session.table!;
    const T = t.columns.find(c => c.name === 'T')!;
    const M = t.columns.find(c => c.name === 'M')!;
    expect(T.unit).toBe('K');
    expect(M.unit).toBe('emu/g');
    // Values come from the generator's DataFrame (demo/generate_notebooks.py).
    expect(Array.from(T.values as Float64Array)).toEqual([10, 20, 30]);
    expect(Array.from(M.values as Float64Array)).toEqual([1.25, 1.5, -0.75]);
    expect(analysis.session.roles).toEqual({ x: t.columns.indexOf(T), y: t.columns.indexOf(M), sigma: null });
    expect(analysis.title.caption).toBe('fixtures/outputs.ipynb · cell 2 · output 1');
  });

  it('should say so in the panel when the selected cell holds no table', async () => {
    const lab = await labWith(plugins, PLUGIN_ID);
    const panel = await openInLab(lab, 'fixtures/outputs.ipynb', readNotebook('test/fixtures/outputs.ipynb'));
    panel.content.activeCellIndex = 3; // print("no table here")
    await lab.app.commands.execute(ANALYSE_SELECTED);
    const [analysis] = analysisPanels(lab.app);
    expect(analysis.session.table).toBeNull();
    await analysis.rendered;
    const message = analysis.node.querySelector('.jp-psiscape-AnalysisPanel-message');
    expect(message?.textContent).toMatch(/no output of the selected cell holds a table/i);
    expect(message?.textContent).toMatch(/stdout/);
  });

  it('should read the dataresource output when a cell publishes one', async () => {
    const lab = await labWith(plugins, PLUGIN_ID);
    const panel = await openInLab(lab, 'fixtures/outputs.ipynb', readNotebook('test/fixtures/outputs.ipynb'));
    panel.content.activeCellIndex = 2;
    await lab.app.commands.execute(ANALYSE_SELECTED);
    const [analysis] = analysisPanels(lab.app);
    expect(analysis.session.table?.format).toBe('dataresource');
    const T = analysis.session.table!.columns.find(c => c.header === 'T_K')!;
    expect(Array.from(T.values as Float64Array)).toEqual([100.5, 200.25, 300.125]);
  });

  it('should select and scroll to the source cell from the panel', async () => {
    const lab = await labWith(plugins, PLUGIN_ID);
    const panel = await openInLab(lab, 'fixtures/outputs.ipynb', readNotebook('test/fixtures/outputs.ipynb'));
    panel.content.activeCellIndex = 1;
    await lab.app.commands.execute(ANALYSE_SELECTED);
    const [analysis] = analysisPanels(lab.app);
    panel.content.activeCellIndex = 4;
    const button = analysis.node.querySelector<HTMLButtonElement>('button.jp-psiscape-reveal')!;
    expect(button.textContent).toBe('Show source cell');
    button.click();
    await new Promise(resolve => setTimeout(resolve, 50));
    expect(panel.content.activeCellIndex).toBe(1);
    expect(lab.app.shell.currentWidget).toBe(panel);
  });

  it('should find the output under a context-menu click', async () => {
    const lab = await labWith(plugins, PLUGIN_ID);
    const panel = await openInLab(lab, 'fixtures/outputs.ipynb', readNotebook('test/fixtures/outputs.ipynb'));
    const cell = panel.content.widgets[2];
    const child = cell.node.querySelector<HTMLElement>('.jp-OutputArea-child');
    expect(child).not.toBeNull();
    // Right-click the rendered output: the application records the event for hit tests.
    child!.dispatchEvent(new MouseEvent('contextmenu', { bubbles: true, cancelable: true, clientX: 5, clientY: 5 }));
    await lab.app.commands.execute(ANALYSE_OUTPUT);
    const [analysis] = analysisPanels(lab.app);
    expect(analysis.title.caption).toBe('fixtures/outputs.ipynb · cell 3 · output 1');
    expect(analysis.session.table?.format).toBe('dataresource');
  });
});
