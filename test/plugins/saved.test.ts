/**
 * Saved analyses through real notebook models: written to the notebook's
 * metadata (format 2) as the user works, reopened with the notebook (columns
 * and settings again), shown from the saved copy when the source output is
 * gone, written only when something changed, and never lost: unreadable or
 * newer metadata, entries and fields this version does not know all survive.
 */
import { Notification } from '@jupyterlab/apputils';
import { nullTranslator } from '@jupyterlab/translation';
import { afterEach, describe, expect, it } from 'vitest';
import { messageText, msg } from '../../src/core/messages';
import { SAVED_KEY } from '../../src/core/saved';
import type { ISavedAnalysis } from '../../src/core/saved';
import plugins, { PLUGIN_ID } from '../../src/plugins';
import { notifyProblems, removeAnalysis, savedAnalysesOf, upsertAnalysis } from '../../src/plugins/persistence';
import { AnalysisPanel } from '../../src/ui/analysis-panel';
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

/** Analyse cell 2 and fit a power law, then send the (debounced) save at once. */
async function analyseAndFit(lab: Awaited<ReturnType<typeof labWith>>, nb: Awaited<ReturnType<typeof openInLab>>): Promise<AnalysisPanel> {
  nb.content.activeCellIndex = 1;
  await lab.app.commands.execute('psiscape:analyse-selected-cell');
  const analysis = panelsOf(lab.app).at(-1)!;
  analysis.session.setKind('power-law');
  await analysis.fitSection.runFit();
  analysis.session.flush();
  return analysis;
}

/** A saved analysis of the fixture's cell 2, as the panel writes it. */
function savedEntry(nb: Awaited<ReturnType<typeof openInLab>>, id: string): ISavedAnalysis {
  return {
    id,
    source: { notebookPath: 'curve.ipynb', cellId: nb.content.widgets[1].model.id, outputIndex: 0, contentHash: '0123456789abcdef' },
    columns: { x: { index: 0, header: 'T (K)' }, y: { index: 1, header: 'M (emu/g)' }, sigma: null },
    snapshot: { headers: ['T (K)', 'M (emu/g)'], units: ['K', 'emu/g'], values: [[100, 105], [1.5, 1.4]] },
    settings: { kind: 'power-law', options: { proxyPower: 1, background: false }, window: { min: -Infinity, max: Infinity } }
  };
}

const stored = (nb: Awaited<ReturnType<typeof openInLab>>) => JSON.stringify(nb.content.model!.getMetadata(SAVED_KEY));

describe('saved analyses', () => {
  afterEach(async () => {
    await disposeLabs();
  });

  // Case: format 2 is written (columns by position and header, settings with the kind) and reopens with its fit.
  it('should save the analysis in the notebook metadata and reopen it with its fit', async () => {
    const lab = await labWith(plugins, PLUGIN_ID);
    const nb = await openInLab(lab, 'curve.ipynb', notebookWithCurve());
    const analysis = await analyseAndFit(lab, nb);
    expect(analysis.session.outcome?.fit.converged).toBe(true);
    const meta = nb.content.model!.getMetadata(SAVED_KEY) as { version: number; analyses: { columns: unknown; settings: { kind: string } }[] };
    expect(meta.version).toBe(2);
    expect(meta.analyses).toHaveLength(1);
    expect(meta.analyses[0].columns).toEqual({ x: { index: 0, header: 'T (K)' }, y: { index: 1, header: 'M (emu/g)' }, sigma: null });
    expect(meta.analyses[0].settings.kind).toBe('power-law');

    // Close the panel: the saved analysis stays; reopening restores columns and fit.
    analysis.dispose();
    const saved = nb.content.model!.toJSON();
    await openInLab(lab, 'curve-copy.ipynb', saved as INotebookContent);
    await lab.app.commands.execute('psiscape:reopen-saved-analyses');
    const restored = panelsOf(lab.app).at(-1)!;
    expect(restored.session.sourceState).toBe('live');
    await restored.fitSection.settled;
    expect(restored.session.kind).toBe('power-law');
    expect(restored.session.outcome?.fit.converged).toBe(true);
  });

  it('should show the saved copy of the data when the source output is gone', async () => {
    const lab = await labWith(plugins, PLUGIN_ID);
    const nb = await openInLab(lab, 'curve.ipynb', notebookWithCurve());
    (await analyseAndFit(lab, nb)).dispose();
    const json = nb.content.model!.toJSON() as INotebookContent;
    (json.cells[1] as { outputs: unknown[] }).outputs = [];
    await openInLab(lab, 'cleared.ipynb', json);
    await lab.app.commands.execute('psiscape:reopen-saved-analyses');
    const restored = panelsOf(lab.app).at(-1)!;
    await restored.rendered;
    expect(restored.session.sourceState).toBe('lost');
    expect(restored.session.table?.rowCount).toBe(30);
    expect(restored.node.querySelector('.jp-psiscape-AnalysisPanel-notes')!.textContent).toMatch(/saved in the notebook/);
  });

  it('should skip unreadable entries and never overwrite unreadable metadata', async () => {
    const lab = await labWith(plugins, PLUGIN_ID);
    const json = notebookWithCurve();
    json.metadata[SAVED_KEY] = 'written by hand';
    const nb = await openInLab(lab, 'odd.ipynb', json);
    await analyseAndFit(lab, nb);
    expect(nb.content.model!.getMetadata(SAVED_KEY)).toBe('written by hand');
  });

  it('should delete the analysis from the notebook with its remove button', async () => {
    const lab = await labWith(plugins, PLUGIN_ID);
    const nb = await openInLab(lab, 'curve.ipynb', notebookWithCurve());
    const analysis = await analyseAndFit(lab, nb);
    expect(nb.content.model!.getMetadata(SAVED_KEY)).toBeDefined();
    analysis.node.querySelector<HTMLButtonElement>('button.jp-psiscape-forget')!.click();
    expect(analysis.isDisposed).toBe(true);
    expect(nb.content.model!.getMetadata(SAVED_KEY)).toBeUndefined();
  });

  // Case: the remove button on an analysis of a notebook whose block is newer leaves the block byte for byte.
  // Fails on the format 1 code: removeAnalysis wrote what it could read (nothing) and so deleted the block.
  it('should leave a newer block untouched when an analysis is saved or removed', async () => {
    const lab = await labWith(plugins, PLUGIN_ID);
    const json = notebookWithCurve();
    json.metadata[SAVED_KEY] = { version: 3, analyses: [{ id: 'from-the-future', shape: 'unknown' }], extra: { a: [1, 2] } };
    const nb = await openInLab(lab, 'newer.ipynb', json);
    const before = stored(nb);
    const analysis = await analyseAndFit(lab, nb);
    expect(stored(nb)).toBe(before);
    analysis.node.querySelector<HTMLButtonElement>('button.jp-psiscape-forget')!.click();
    expect(stored(nb)).toBe(before);
  });

  // Case: persistence on its own — blocks it must not touch survive upsert and remove byte for byte, and the caller gets the reason.
  // Fails on the format 1 code (removeAnalysis deleted unreadable metadata and returned nothing).
  it.each([['written by hand'], [{ version: '1', analyses: [] }], [{ version: 9, analyses: 'elsewhere' }]])('should return why %j was not written, and leave it', async value => {
    const lab = await labWith(plugins, PLUGIN_ID);
    const json = notebookWithCurve();
    json.metadata[SAVED_KEY] = value as never;
    const nb = await openInLab(lab, 'kept.ipynb', json);
    const before = stored(nb);
    const problem = savedAnalysesOf(nb).problems[0];
    expect(removeAnalysis(nb, 'a')).toEqual(problem);
    expect(upsertAnalysis(nb, savedEntry(nb, 'a'))).toEqual(problem);
    expect(stored(nb)).toBe(before);
    expect(savedAnalysesOf(nb).writable).toBe(false);
  });

  // Case: removing the last readable analysis keeps unknown entries and top-level keys; the key goes only when nothing is left.
  // Fails on the format 1 code, which wrote only the analyses it could read and deleted the key when none were left.
  it('should keep unknown entries and keys when the last readable analysis is removed', async () => {
    const lab = await labWith(plugins, PLUGIN_ID);
    const nb = await openInLab(lab, 'curve.ipynb', notebookWithCurve());
    expect(upsertAnalysis(nb, savedEntry(nb, 'a'))).toBeNull();
    const withUnknown = { ...(nb.content.model!.getMetadata(SAVED_KEY) as object), reviewer: 'B. K.' } as unknown as { analyses: unknown[] };
    withUnknown.analyses.push({ id: 'future', settings: { kind: 'hysteresis-loop' } });
    nb.content.model!.setMetadata(SAVED_KEY, withUnknown as never);
    expect(removeAnalysis(nb, 'a')).toBeNull();
    expect(nb.content.model!.getMetadata(SAVED_KEY)).toEqual({ version: 2, analyses: [{ id: 'future', settings: { kind: 'hysteresis-loop' } }], reviewer: 'B. K.' });
    nb.content.model!.setMetadata(SAVED_KEY, { version: 2, analyses: [] });
    expect(upsertAnalysis(nb, savedEntry(nb, 'b'))).toBeNull();
    expect(removeAnalysis(nb, 'b')).toBeNull();
    expect(nb.content.model!.getMetadata(SAVED_KEY)).toBeUndefined();
  });

  // Case: nothing is written when nothing changed, so an unchanged analysis leaves the notebook clean.
  it('should write the metadata only when it changes', async () => {
    const lab = await labWith(plugins, PLUGIN_ID);
    const nb = await openInLab(lab, 'curve.ipynb', notebookWithCurve());
    const model = nb.content.model!;
    let writes = 0;
    model.metadataChanged.connect(() => writes++);
    expect(upsertAnalysis(nb, savedEntry(nb, 'a'))).toBeNull();
    expect(writes).toBe(1);
    model.dirty = false;
    expect(upsertAnalysis(nb, savedEntry(nb, 'a'))).toBeNull();
    expect(removeAnalysis(nb, 'not-there')).toBeNull();
    expect(writes).toBe(1);
    expect(model.dirty).toBe(false);
    expect(upsertAnalysis(nb, { ...savedEntry(nb, 'a'), settings: null })).toBeNull();
    expect(writes).toBe(2);
  });

  // Case: problems are shown as one warning naming the notebook, all of them behind "Details".
  it('should show problems as one warning with the first one and a details action', () => {
    const trans = nullTranslator.load('jupyterlab');
    const before = Notification.manager.count;
    const problems = [msg('test.one', 'saved analysis %1 is odd', '2'), msg('test.two', 'saved analysis %1 is odder', '3')];
    notifyProblems(trans, problems, 'n.ipynb');
    notifyProblems(trans, [], 'n.ipynb');
    expect(Notification.manager.count).toBe(before + 1);
    const shown = Notification.manager.notifications[0];
    expect(shown.type).toBe('warning');
    expect(shown.message).toBe(`n.ipynb: 2 problems with the saved psiscape analyses, the first: ${messageText(problems[0])}`);
    expect(shown.options.actions?.map(a => a.label)).toEqual(['Details']);
  });
});
