/**
 * psiscape's JupyterLab plugin: wiring only. Commands live in commands.ts,
 * widgets in src/ui, numerics in src/core. At start-up only this wiring
 * loads; the rest comes with the first analysis (see commands.ts).
 *
 * @packageDocumentation
 */
import { ILayoutRestorer } from '@jupyterlab/application';
import type { JupyterFrontEnd, JupyterFrontEndPlugin } from '@jupyterlab/application';
import { ICommandPalette, IThemeManager } from '@jupyterlab/apputils';
import { IDefaultFileBrowser } from '@jupyterlab/filebrowser';
import { INotebookTracker } from '@jupyterlab/notebook';
import type { NotebookPanel } from '@jupyterlab/notebook';
import { ISettingRegistry } from '@jupyterlab/settingregistry';
import { ITranslator, nullTranslator } from '@jupyterlab/translation';
import { CommandIDs, EXPORT_COMMANDS, registerCommands } from './commands';
import { readSettings } from './settings';
import { createRestoreHooks } from './restore';
import { SAVED_KEY } from '../core/saved/types';

/** Plugin id; also the settings schema id (schema/settings/plugin.json). */
export const PLUGIN_ID = 'jupyterlab-psiscape:plugin';

const plugin: JupyterFrontEndPlugin<void> = {
  id: PLUGIN_ID,
  description: 'Analyse tables from notebook outputs: order-parameter charts and phase-transition fits.',
  autoStart: true,
  requires: [INotebookTracker, ISettingRegistry],
  optional: [ITranslator, ICommandPalette, IThemeManager, IDefaultFileBrowser, ILayoutRestorer],
  activate: async (
    app: JupyterFrontEnd,
    tracker: INotebookTracker,
    settingRegistry: ISettingRegistry,
    translator: ITranslator | null,
    palette: ICommandPalette | null,
    themeManager: IThemeManager | null,
    fileBrowser: IDefaultFileBrowser | null,
    restorer: ILayoutRestorer | null
  ): Promise<void> => {
    const trans = (translator ?? nullTranslator).load('jupyterlab_psiscape');
    // Registered with the layout restorer before anything is awaited (it must know its trackers
    // before the application has started); the commands they run load the workbench only when
    // something is actually restored.
    const restore = createRestoreHooks(restorer, {
      analysis: CommandIDs.reopenSavedAnalysis,
      file: CommandIDs.analyseFile,
      explorer: CommandIDs.openLandauExplorer
    });
    const settings = await settingRegistry.load(PLUGIN_ID);
    let current = readSettings(settings.composite);
    const loader = registerCommands({
      app,
      tracker,
      translator: translator ?? nullTranslator,
      settings: () => current,
      psiscapeVersion: settings.version,
      restore,
      selectedFile: () => {
        const item = fileBrowser ? fileBrowser.selectedItems().next() : null;
        return item && !item.done && item.value.type !== 'directory' ? item.value.path : null;
      }
    });
    // A change in the settings editor shows at once in every open panel.
    settings.changed.connect(() => {
      const previous = current;
      current = readSettings(settings.composite);
      const panels = loader.loaded()?.panels.filter(p => !p.isDisposed) ?? [];
      if (current.pointSize !== previous.pointSize) {
        for (const p of [...panels, ...(loader.loaded()?.explorers.filter(e => !e.isDisposed) ?? [])]) {
          p.pointSize = current.pointSize;
        }
      }
      if (current.presenterScale !== previous.presenterScale) {
        loader.presenter.updateScale();
      }
    });
    if (palette) {
      for (const command of [CommandIDs.presentAnalysis, CommandIDs.analyseSelectedCell, CommandIDs.analyseIsothermsSelectedCell, CommandIDs.reopenSaved, CommandIDs.openLandauExplorer, ...EXPORT_COMMANDS.map(([id]) => id)]) {
        palette.addItem({ command, category: trans.__('psiscape') });
      }
    }
    // Analyses saved in a notebook reopen with it (the only time psiscape's
    // analysis code loads without a command: when a notebook holds analyses).
    const restoreWhenReady = (notebook: NotebookPanel): void => {
      void Promise.all([notebook.context.ready, app.restored]).then(async () => {
        if (!notebook.isDisposed && notebook.model?.getMetadata(SAVED_KEY) !== undefined) {
          await (await loader.workbench()).restore(notebook);
        }
      });
    };
    tracker.forEach(restoreWhenReady);
    tracker.widgetAdded.connect((_, notebook) => restoreWhenReady(notebook));
    if (themeManager) {
      themeManager.themeChanged.connect(() => {
        // Let the new theme's CSS variables apply before reading them.
        requestAnimationFrame(() => {
          const bench = loader.loaded();
          bench?.panels.filter(p => !p.isDisposed).forEach(p => p.redraw());
          bench?.explorers.filter(e => !e.isDisposed).forEach(e => e.redraw());
        });
      });
    }
  }
};

export default [plugin];
