/**
 * Restoring psiscape's panels after a reload through real JupyterLab
 * objects: a LayoutRestorer over a StateDB (the workspace), the trackers the
 * plugin registers with it, and a second application started from a copy of
 * that state, as a page reload does. Analyses of notebook outputs come back
 * once each (the restorer and the notebook's own restore agree), file
 * analyses with their columns, kind, options and window, Landau explorers
 * with their scenario; tab titles say what each panel is.
 */
import type { LabShell } from '@jupyterlab/application';
import type { INotebookContent } from '@jupyterlab/nbformat';
import { ContentsManager } from '@jupyterlab/services';
import type { Contents } from '@jupyterlab/services';
import { StateDB } from '@jupyterlab/statedb';
import type { DockLayout } from '@lumino/widgets';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { SAVED_KEY } from '../../src/core/saved';
import plugins, { PLUGIN_ID } from '../../src/plugins';
import { TRACKER_NAMESPACES, SAVE_DELAY_MS } from '../../src/plugins/restore';
import { AnalysisPanel } from '../../src/ui/analysis-panel';
import { LandauExplorer } from '../../src/ui/landau';
import { disposeLabs, labWith, openInLab, readNotebook } from './harness';

type Lab = Awaited<ReturnType<typeof labWith>>;

const wait = (ms: number) => new Promise(resolve => setTimeout(resolve, ms));

function mainWidgets(lab: Lab) {
  return Array.from(lab.app.shell.widgets('main'));
}
const analysisPanels = (lab: Lab) => mainWidgets(lab).filter((w): w is AnalysisPanel => w instanceof AnalysisPanel);
const explorersOf = (lab: Lab) => mainWidgets(lab).filter((w): w is LandauExplorer => w instanceof LandauExplorer);

/** The fixture notebook with a longer table in cell 2. */
function notebookWithCurve(): INotebookContent {
  const nb = readNotebook('test/fixtures/outputs.ipynb');
  const rows = ['T (K),M (emu/g)'];
  for (let i = 0; i < 30; i++) {
    const T = 100 + 5 * i;
    rows.push(`${T},${((T < 232.3 ? 2 * Math.pow(1 - T / 232.3, 0.5) : 0) + 0.002 * Math.sin(3 * i)).toFixed(6)}`);
  }
  (nb.cells[1] as { outputs: unknown[] }).outputs = [{ output_type: 'execute_result', execution_count: 1, metadata: {}, data: { 'text/csv': rows.join('\n') } }];
  return nb;
}

/** A CSV file served by the (otherwise offline) contents manager. */
const FILE_CSV = ['T (K),M (emu/g),dM (emu/g),chi (emu/mol/Oe)', ...Array.from({ length: 40 }, (_, i) => `${100 + 4 * i},${Math.max(0, 1 - (100 + 4 * i) / 240).toFixed(5)},0.01,${(1 / (100 + 4 * i)).toFixed(6)}`)].join('\n');

/** Wait until `check` holds (or fail after `ms`). */
async function until(check: () => boolean, ms = 4000): Promise<void> {
  const end = Date.now() + ms;
  while (!check()) {
    if (Date.now() > end) {
      throw new Error('timed out');
    }
    await wait(20);
  }
}

/** The labels of the main area's tab groups, each sorted, in a canonical order. */
function tabGroups(lab: Lab): string[][] {
  const groups: string[][] = [];
  const walk = (area: DockLayout.AreaConfig | null | undefined): void => {
    if (!area) {
      return;
    }
    if (area.type === 'tab-area') {
      groups.push(area.widgets.map(w => w.title.label).sort());
    } else {
      area.children.forEach(walk);
    }
  };
  walk((lab.app.shell as LabShell).saveLayout().mainArea?.dock?.main);
  return groups.sort((a, b) => a.join().localeCompare(b.join()));
}

/** A state database holding a copy of `db`'s contents: the workspace as a new page reads it. */
async function reloadedState(db: StateDB): Promise<StateDB> {
  const contents = await db.toJSON();
  return new StateDB({ transform: Promise.resolve({ type: 'overwrite' as const, contents }) });
}

describe('restoring psiscape panels after a reload', () => {
  beforeEach(() => {
    vi.spyOn(ContentsManager.prototype, 'get').mockImplementation(async (path: string) => ({ path, content: FILE_CSV, type: 'file', format: 'text' }) as unknown as Contents.IModel);
  });
  afterEach(async () => {
    vi.restoreAllMocks();
    await disposeLabs();
  });

  // Case: an analysis of a notebook output, a file analysis and an explorer come back once each, with their state and titles.
  it('should reopen every panel once, with its state, in the same dock places', async () => {
    const db = new StateDB();
    const lab = await labWith(plugins, PLUGIN_ID, { state: db });
    const nb = await openInLab(lab, 'curve.ipynb', notebookWithCurve());
    await lab.layoutRestored;

    nb.content.activeCellIndex = 1;
    await lab.app.commands.execute('psiscape:analyse-selected-cell');
    const analysis = analysisPanels(lab)[0];
    analysis.session.setKind('power-law');
    analysis.session.flush();
    await until(() => analysis.title.label.includes('power law'));
    expect(analysis.title.label).toBe('M vs T · cell 2 · power law');
    expect(analysis.title.caption).toBe('curve.ipynb · cell 2 · output 1');
    analysis.session.setKind('weiss');
    await until(() => analysis.title.label.endsWith('Weiss'));
    await analysis.fitSection.runFit();
    analysis.session.flush();

    await lab.app.commands.execute('psiscape:analyse-file', { path: 'data/big.csv' });
    const file = analysisPanels(lab).find(p => p !== analysis)!;
    const chi = file.session.columns.find(c => c.column.name === 'chi')!;
    file.session.setRoles({ y: chi.index, sigma: null });
    file.session.setKind('curie-weiss');
    file.session.setWindow(120, 200);
    await until(() => file.title.label === 'chi vs T · big.csv · Curie–Weiss');
    expect(file.title.caption).toBe('file data/big.csv');

    const explorerId = (await lab.app.commands.execute('psiscape:open-landau-explorer', { a: 0.5, T0: 100, b: -2, c: 4 })) as string;
    const explorer = explorersOf(lab)[0];
    expect(explorer.id).toBe(explorerId);
    await explorer.setScenario({ a: 0.5, T0: 100, b: -2, c: 4, d: 0, convention: 'no-fractions', T: 97.5, h: 0.02 });
    const scenario = explorer.scenario();
    expect(scenario).toMatchObject({ convention: 'no-fractions', T: 97.5, h: 0.02 });

    // What the lab writes as it goes: the trackers' entries (debounced) and the layout.
    await wait(SAVE_DELAY_MS + 100);
    const shell = lab.app.shell as LabShell;
    await lab.restorer.save(shell.saveLayout());
    const state = await db.list(TRACKER_NAMESPACES.file);
    expect(state.ids).toHaveLength(1);
    const fileArgs = (state.values[0] as { data: { path: string; state: { kind: string; window: unknown } } }).data;
    expect(fileArgs.path).toBe('data/big.csv');
    expect(fileArgs.state.kind).toBe('curie-weiss');
    expect(fileArgs.state.window).toEqual({ min: 120, max: 200 });
    const saved = nb.content.model!.toJSON() as INotebookContent;
    expect((saved.metadata[SAVED_KEY] as { analyses: unknown[] }).analyses).toHaveLength(1);
    const tabsBefore = Array.from(shell.widgets('main')).map(w => w.title.label);
    const tabGroupsBefore = tabGroups(lab);

    // The reload: a new application over the saved workspace; the notebook comes back as JupyterLab restores it.
    const again = await labWith(plugins, PLUGIN_ID, { state: await reloadedState(db) });
    const nb2 = await openInLab(again, 'curve.ipynb', saved, { ready: true });
    await again.layoutRestored;
    await again.app.restored;
    await wait(300); // the notebook's own restore of its saved analyses has run

    const panels = analysisPanels(again);
    expect(panels).toHaveLength(2);
    const analysis2 = panels.find(p => p.session.id === analysis.session.id)!;
    expect(analysis2).toBeDefined();
    expect(analysis2.session.kind).toBe('weiss');
    await until(() => analysis2.title.label === 'M vs T · cell 2 · Weiss');

    const file2 = panels.find(p => p !== analysis2)!;
    expect(file2.session.id).toBe(file.session.id);
    expect(file2.session.kind).toBe('curie-weiss');
    expect(file2.session.plotted()?.y.column.name).toBe('chi');
    expect(file2.session.plotted()?.sigma).toBeNull();
    expect(file2.session.windowInput).toEqual({ min: 120, max: 200 });
    await until(() => file2.title.label === 'chi vs T · big.csv · Curie–Weiss');

    const explorers = explorersOf(again);
    expect(explorers).toHaveLength(1);
    expect(explorers[0].id).toBe(explorerId);
    expect(explorers[0].scenario()).toEqual(scenario);
    expect(explorers[0].convention).toBe('no-fractions');

    // The same psiscape tabs, grouped in the dock as before (the test notebook is not tracked by the restorer).
    const tabsAfter = Array.from(again.app.shell.widgets('main')).map(w => w.title.label);
    const ours = (labels: string[]) => labels.filter(l => l !== 'curve.ipynb').sort();
    expect(ours(tabsAfter)).toEqual(ours(tabsBefore));
    expect(tabGroups(again)).toEqual(tabGroupsBefore.map(g => g.filter(l => l !== 'curve.ipynb')).filter(g => g.length > 0));

    // A notebook whose contents are read only after the layout is restored (as JupyterLab does with
    // restored documents): a placeholder holds the place, then the analysis takes it, once.
    let readNotebook: () => void = () => undefined;
    const late = await labWith(plugins, PLUGIN_ID, { state: await reloadedState(db) });
    await openInLab(late, 'curve.ipynb', saved, { ready: new Promise<void>(resolve => (readNotebook = resolve)) });
    await late.layoutRestored;
    expect(mainWidgets(late).filter(w => w.hasClass('jp-psiscape-AnalysisPlaceholder'))).toHaveLength(1);
    expect(analysisPanels(late)).toHaveLength(1); // the file analysis
    readNotebook();
    await until(() => analysisPanels(late).length === 2);
    await wait(SAVE_DELAY_MS + 300);
    expect(mainWidgets(late).filter(w => w.hasClass('jp-psiscape-AnalysisPlaceholder'))).toHaveLength(0);
    expect(analysisPanels(late).filter(p => p.session.id === analysis.session.id)).toHaveLength(1);
    expect(tabGroups(late)).toEqual(tabGroupsBefore.map(g => g.filter(l => l !== 'curve.ipynb')).filter(g => g.length > 0));
    // The restore entry is the analysis's again (the placeholder's went with it).
    expect((await late.restorer['_connector'].list(TRACKER_NAMESPACES.analysis)).ids).toEqual([`${TRACKER_NAMESPACES.analysis}:curve.ipynb:${analysis.session.id}`]);

    // Reopening by hand does not duplicate the restored analysis.
    nb2.content.activeCellIndex = 0;
    expect(await again.app.commands.execute('psiscape:reopen-saved-analyses')).toBe(0);
    expect(analysisPanels(again)).toHaveLength(2);
  });

  // Case: an entry naming an analysis the notebook no longer holds is dropped, not shown empty.
  it('should drop a restore entry whose analysis is gone from the notebook', async () => {
    const db = new StateDB();
    await db.save(`${TRACKER_NAMESPACES.analysis}:curve.ipynb:gone`, { data: { path: 'curve.ipynb', id: 'gone' } });
    const lab = await labWith(plugins, PLUGIN_ID, { state: db });
    await openInLab(lab, 'curve.ipynb', notebookWithCurve(), { ready: true });
    await lab.layoutRestored;
    expect(analysisPanels(lab)).toHaveLength(0);
    expect((await db.list(TRACKER_NAMESPACES.analysis)).ids).toHaveLength(0);
  });

  // Case: an explorer opened from a notebook's fit keeps its scenario in the notebook, reopens with it once, and leaves when closed.
  it('should keep a notebook explorer in the notebook metadata and reopen it once with the notebook', async () => {
    const db = new StateDB();
    const lab = await labWith(plugins, PLUGIN_ID, { state: db });
    const nb = await openInLab(lab, 'curve.ipynb', notebookWithCurve(), { ready: true });
    await lab.layoutRestored;
    // What "Explore these coefficients" of a Landau fit runs.
    const id = (await lab.app.commands.execute('psiscape:open-landau-explorer', { a: 0.5, T0: 100, b: -2, c: 4, d: 0, notebook: 'curve.ipynb' })) as string;
    const explorer = explorersOf(lab).find(e => e.id === id)!;
    const metaExplorers = () => ((nb.content.model!.getMetadata(SAVED_KEY) as { explorers?: { id: string; T: number; h: number; convention: string }[] } | undefined)?.explorers ?? []);
    expect(metaExplorers().map(e => e.id)).toEqual([id]);
    await explorer.setScenario({ ...explorer.scenario(), convention: 'devonshire', T: 101.5, h: 0.03 });
    await until(() => metaExplorers()[0]?.T === 101.5);
    expect(metaExplorers()[0]).toMatchObject({ convention: 'devonshire', h: 0.03 });
    const scenario = explorer.scenario();
    await wait(SAVE_DELAY_MS + 100);
    await lab.restorer.save((lab.app.shell as LabShell).saveLayout());
    const saved = nb.content.model!.toJSON() as INotebookContent;

    // A new page without the workspace: the notebook alone brings the explorer back.
    const fresh = await labWith(plugins, PLUGIN_ID, { state: new StateDB() });
    await openInLab(fresh, 'curve.ipynb', saved, { ready: true });
    await fresh.layoutRestored;
    await until(() => explorersOf(fresh).length === 1);
    expect(explorersOf(fresh)[0].scenario()).toEqual(scenario);

    // With the workspace as well: the layout restorer and the notebook together open it once.
    const again = await labWith(plugins, PLUGIN_ID, { state: await reloadedState(db) });
    const nb2 = await openInLab(again, 'curve.ipynb', saved, { ready: true });
    await again.layoutRestored;
    await again.app.restored;
    await wait(300);
    expect(explorersOf(again)).toHaveLength(1);
    expect(explorersOf(again)[0].id).toBe(id);
    expect(explorersOf(again)[0].scenario()).toEqual(scenario);
    // Nothing changed, so the notebook's copy is as it was.
    expect(nb2.content.model!.getMetadata(SAVED_KEY)).toEqual(saved.metadata[SAVED_KEY]);

    // Closing the explorer removes it from the notebook.
    explorersOf(again)[0].dispose();
    expect(nb2.content.model!.getMetadata(SAVED_KEY)).toBeUndefined();
  });

  // Case: an analysis never changed (so not in the notebook) reopens afresh on the output it read, under its id.
  it('should reopen an analysis the notebook does not hold on the output it read', async () => {
    const content = notebookWithCurve();
    const db = new StateDB();
    const cellId = (content.cells[1] as { id?: string }).id ?? '';
    expect(cellId).not.toBe('');
    await db.save(`${TRACKER_NAMESPACES.analysis}:curve.ipynb:fresh`, { data: { path: 'curve.ipynb', id: 'fresh', cellId, outputIndex: 0 } });
    const lab = await labWith(plugins, PLUGIN_ID, { state: db });
    await openInLab(lab, 'curve.ipynb', content, { ready: true });
    await lab.layoutRestored;
    const panels = analysisPanels(lab);
    expect(panels.map(p => p.session.id)).toEqual(['fresh']);
    await until(() => panels[0].title.label.startsWith('M vs T · cell 2 · '));
  });

  // Case: the explorer reports its scenario and takes one back, convention included.
  it('should give an explorer scenario that sets the same explorer again', async () => {
    const lab = await labWith(plugins, PLUGIN_ID);
    const id = (await lab.app.commands.execute('psiscape:open-landau-explorer', { a: 1, T0: 300, b: 1, c: 0, convention: 'ginzburg-landau', T: 290, h: 0 })) as string;
    const explorer = explorersOf(lab).find(e => e.id === id)!;
    expect(explorer.scenario()).toEqual({ a: 1, T0: 300, b: 1, c: 0, d: 0, convention: 'ginzburg-landau', T: 290, h: 0 });
    expect(explorer.title.label).toBe('Landau explorer');
  });
});
