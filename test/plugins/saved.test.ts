/**
 * Saved analyses through real notebook models: written to the notebook's
 * metadata as the user works, reopened with the notebook (columns and fit
 * again), shown from the saved copy when the source output is gone, and never
 * lost to unreadable metadata.
 */
import { afterEach, describe, expect, it } from 'vitest';
import plugins, { PLUGIN_ID } from '../../src/plugins';
import { AnalysisPanel } from '../../src/ui/analysis-panel';
import { SAVED_KEY } from '../../src/core/saved';
import { disposeLabs, labWith, openInLab, readNotebook } from './harness';
import type { INotebookContent } from '@jupyterlab/nbformat';

function panelsOf(app: { shell: { widgets(area: 'main'): IterableIterator<unknown> } }): AnalysisPanel[] {
  return Array.from(app.shell.widgets('main')).filter((w): w is AnalysisPanel => w instanceof AnalysisPanel);
}

/** The fixture notebook with a longer table in cell 2, to fit. */
function notebookWithCurve(): INotebookContent {
  const nb = readNotebook('test/fixtures/outputs.ipynb');
  const rows = ['T (K),M (emu/g)'];
  for (let i = 0; i < 30; i++) {
    const T = 100 + 5 * i;
    rows.push(`${T},${((T < 232.3 ? 2 * Math.pow(1 - T / 232.3, 0.5) : 0) + 0.002 * Math.sin(3 * i)).toFixed(6)}`);
  }
  const cell = nb.cells[1] as { outputs: unknown[] };
  cell.outputs = [{ output_type: 'execute_result', execution_count: 1, metadata: {}, data: { 'text/csv': rows.join('\n') } }];
  return nb;
}

describe('saved analyses', () => {
  afterEach(async () => {
    await disposeLabs();
  });

  it('should save the analysis in the notebook metadata and reopen it with its fit', async () => {
    const lab = await labWith(plugins, PLUGIN_ID);
    const nb = await openInLab(lab, 'curve.ipynb', notebookWithCurve());
    nb.content.activeCellIndex = 1;
    await lab.app.commands.execute('psiscape:analyse-selected-cell');
    const [analysis] = panelsOf(lab.app);
    analysis.fitSection.setModel('power-law');
    await analysis.fitSection.runFit();
    expect(analysis.fitSection.outcome?.fit.converged).toBe(true);
    const meta = nb.content.model!.getMetadata(SAVED_KEY) as { analyses: { columns: unknown; fit: { model: string } }[] };
    expect(meta.analyses).toHaveLength(1);
    expect(meta.analyses[0].columns).toEqual({ x: 'T (K)', y: 'M (emu/g)', sigma: null });
    expect(meta.analyses[0].fit.model).toBe('power-law');

    // Close the panel: the saved analysis stays; reopening restores columns and fit.
    analysis.dispose();
    const saved = nb.content.model!.toJSON();
    const reopened = await openInLab(lab, 'curve-copy.ipynb', saved as INotebookContent);
    await lab.app.commands.execute('psiscape:reopen-saved-analyses');
    const restored = panelsOf(lab.app).at(-1)!;
    expect(restored.sourceState).toBe('live');
    await restored.fitSection.settled;
    expect(restored.fitSection.outcome?.model).toBe('power-law');
    expect(restored.fitSection.outcome?.fit.converged).toBe(true);
    void reopened;
  });

  it('should show the saved copy of the data when the source output is gone', async () => {
    const lab = await labWith(plugins, PLUGIN_ID);
    const nb = await openInLab(lab, 'curve.ipynb', notebookWithCurve());
    nb.content.activeCellIndex = 1;
    await lab.app.commands.execute('psiscape:analyse-selected-cell');
    panelsOf(lab.app)[0].dispose();
    const json = nb.content.model!.toJSON() as INotebookContent;
    (json.cells[1] as { outputs: unknown[] }).outputs = [];
    await openInLab(lab, 'cleared.ipynb', json);
    await lab.app.commands.execute('psiscape:reopen-saved-analyses');
    const restored = panelsOf(lab.app).at(-1)!;
    expect(restored.sourceState).toBe('lost');
    expect(restored.table?.rowCount).toBe(30);
    expect(restored.node.querySelector('.jp-psiscape-AnalysisPanel-notes')!.textContent).toMatch(/saved in the notebook/);
  });

  it('should skip unreadable entries and never overwrite unreadable metadata', async () => {
    const lab = await labWith(plugins, PLUGIN_ID);
    const json = notebookWithCurve();
    json.metadata[SAVED_KEY] = 'written by hand';
    const nb = await openInLab(lab, 'odd.ipynb', json);
    nb.content.activeCellIndex = 1;
    await lab.app.commands.execute('psiscape:analyse-selected-cell');
    expect(nb.content.model!.getMetadata(SAVED_KEY)).toBe('written by hand');
  });

  it('should delete the analysis from the notebook with its remove button', async () => {
    const lab = await labWith(plugins, PLUGIN_ID);
    const nb = await openInLab(lab, 'curve.ipynb', notebookWithCurve());
    nb.content.activeCellIndex = 1;
    await lab.app.commands.execute('psiscape:analyse-selected-cell');
    const [analysis] = panelsOf(lab.app);
    analysis.node.querySelector<HTMLButtonElement>('button.jp-psiscape-forget')!.click();
    expect(analysis.isDisposed).toBe(true);
    expect(nb.content.model!.getMetadata(SAVED_KEY)).toBeUndefined();
  });
});
