/**
 * Tie-back: an open analysis follows its source output through re-runs
 * (real notebook and output models), marks itself stale when its columns are
 * gone, and keeps its last data when the cell is deleted.
 */
import { afterEach, describe, expect, it } from 'vitest';
import type { ICodeCellModel } from '@jupyterlab/cells';
import plugins, { PLUGIN_ID } from '../../src/plugins';
import { AnalysisPanel } from '../../src/ui/analysis-panel';
import { SOURCE_CELL_CLASS, SETTLE_MS } from '../../src/plugins/follow-source';
import { disposeLabs, labWith, openInLab, readNotebook } from './harness';

const wait = (ms: number) => new Promise(resolve => setTimeout(resolve, ms));

function rerun(model: ICodeCellModel, csv: string | null): void {
  model.outputs.clear();
  if (csv !== null) {
    model.outputs.add({ output_type: 'execute_result', execution_count: 9, metadata: {}, data: { 'text/csv': csv } });
  }
}

async function setup() {
  const lab = await labWith(plugins, PLUGIN_ID);
  const panel = await openInLab(lab, 'fixtures/outputs.ipynb', readNotebook('test/fixtures/outputs.ipynb'));
  panel.content.activeCellIndex = 1; // T (K), M [emu/g], flag
  await lab.app.commands.execute('psiscape:analyse-selected-cell');
  const analysis = Array.from(lab.app.shell.widgets('main')).find((w): w is AnalysisPanel => w instanceof AnalysisPanel)!;
  const cellModel = panel.content.widgets[1].model as ICodeCellModel;
  return { lab, panel, analysis, cellModel };
}

describe('source tie-back', () => {
  afterEach(async () => {
    await disposeLabs();
  });

  it('should mark the source cell while the analysis is open', async () => {
    const { panel, analysis } = await setup();
    expect(panel.content.widgets[1].node.classList.contains(SOURCE_CELL_CLASS)).toBe(true);
    analysis.dispose();
    expect(panel.content.widgets[1].node.classList.contains(SOURCE_CELL_CLASS)).toBe(false);
  });

  it('should take the new data when the cell is re-run with changed output, keeping the plotted columns', async () => {
    const { analysis, cellModel } = await setup();
    rerun(cellModel, null);
    await wait(SETTLE_MS + 50);
    expect(analysis.session.sourceState).toBe('waiting');
    rerun(cellModel, ',T (K),M [emu/g],flag\n0,10,2.5,True\n1,20,2.0,False\n2,30,1.0,True\n3,40,0.5,False\n');
    await wait(SETTLE_MS + 50);
    expect(analysis.session.sourceState).toBe('live');
    const M = analysis.session.table!.columns.find(c => c.header === 'M [emu/g]')!;
    expect(Array.from(M.values as Float64Array)).toEqual([2.5, 2.0, 1.0, 0.5]);
    const sel = analysis.session.roles!;
    expect(analysis.session.table!.columns[sel.x].header).toBe('T (K)');
    expect(analysis.session.table!.columns[sel.y].header).toBe('M [emu/g]');
  });

  it('should mark itself stale, naming the missing column, and keep the last data', async () => {
    const { analysis, cellModel } = await setup();
    const before = Array.from(analysis.session.table!.columns.find(c => c.header === 'M [emu/g]')!.values as Float64Array);
    rerun(cellModel, 'T (K),chi\n10,1\n20,2\n');
    await wait(SETTLE_MS + 50);
    expect(analysis.session.sourceState).toBe('stale');
    await analysis.rendered;
    const banner = analysis.node.querySelector('.jp-psiscape-AnalysisPanel-banner')!.textContent;
    expect(banner).toBe('Not updated from the re-run cell; showing the last data. The source output no longer has a numeric column “M [emu/g]”.');
    expect(Array.from(analysis.session.table!.columns.find(c => c.header === 'M [emu/g]')!.values as Float64Array)).toEqual(before);
  });

  it('should keep its last data when the source cell is deleted', async () => {
    const { panel, analysis } = await setup();
    panel.content.model!.sharedModel.deleteCell(1);
    await wait(SETTLE_MS + 50);
    expect(analysis.session.sourceState).toBe('lost');
    await analysis.rendered;
    expect(analysis.node.querySelector('.jp-psiscape-AnalysisPanel-banner')!.textContent).toBe(
      'The source cell was deleted; this analysis keeps its last data.'
    );
    expect(analysis.session.table!.rowCount).toBe(3);
  });
});
