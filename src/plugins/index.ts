/**
 * psiscape's JupyterLab plugin: wiring only. Commands live in commands.ts,
 * widgets in src/ui, numerics in src/core.
 *
 * @packageDocumentation
 */
import type { JupyterFrontEnd, JupyterFrontEndPlugin } from '@jupyterlab/application';
import { ICommandPalette, IThemeManager } from '@jupyterlab/apputils';
import { IDefaultFileBrowser } from '@jupyterlab/filebrowser';
import { INotebookTracker } from '@jupyterlab/notebook';
import type { NotebookPanel } from '@jupyterlab/notebook';
import { ISettingRegistry } from '@jupyterlab/settingregistry';
import { ITranslator, nullTranslator } from '@jupyterlab/translation';
import { CommandIDs, registerCommands } from './commands';
import { readSettings } from './settings';

/** Plugin id; also the settings schema id (schema/settings/plugin.json). */
export const PLUGIN_ID = 'jupyterlab-psiscape:plugin';

const plugin: JupyterFrontEndPlugin<void> = {
  id: PLUGIN_ID,
  description: 'Analyse tables from notebook outputs: order-parameter charts and phase-transition fits.',
  autoStart: true,
  requires: [INotebookTracker, ISettingRegistry],
  optional: [ITranslator, ICommandPalette, IThemeManager, IDefaultFileBrowser],
  activate: async (
    app: JupyterFrontEnd,
    tracker: INotebookTracker,
    settingRegistry: ISettingRegistry,
    translator: ITranslator | null,
    palette: ICommandPalette | null,
    themeManager: IThemeManager | null,
    fileBrowser: IDefaultFileBrowser | null
  ): Promise<void> => {
    const trans = (translator ?? nullTranslator).load('jupyterlab_psiscape');
    const settings = await settingRegistry.load(PLUGIN_ID);
    let current = readSettings(settings.composite);
    settings.changed.connect(() => {
      current = readSettings(settings.composite);
    });
    const { panels, restore, explorers } = registerCommands({
      app,
      tracker,
      translator: translator ?? nullTranslator,
      settings: () => current,
      selectedFile: () => {
        const item = fileBrowser ? fileBrowser.selectedItems().next() : null;
        return item && !item.done && item.value.type !== 'directory' ? item.value.path : null;
      }
    });
    if (palette) {
      for (const command of [CommandIDs.analyseSelectedCell, CommandIDs.reopenSaved, CommandIDs.openLandauExplorer]) {
        palette.addItem({ command, category: trans.__('psiscape') });
      }
    }
    // Analyses saved in a notebook reopen with it.
    const restoreWhenReady = (notebook: NotebookPanel): void => {
      void Promise.all([notebook.context.ready, app.restored]).then(() => {
        if (!notebook.isDisposed) {
          restore(notebook);
        }
      });
    };
    tracker.forEach(restoreWhenReady);
    tracker.widgetAdded.connect((_, notebook) => restoreWhenReady(notebook));
    if (themeManager) {
      themeManager.themeChanged.connect(() => {
        // Let the new theme's CSS variables apply before reading them.
        requestAnimationFrame(() => {
          panels.filter(p => !p.isDisposed).forEach(p => p.redraw());
          explorers.filter(e => !e.isDisposed).forEach(e => e.redraw());
        });
      });
    }
  }
};

export default [plugin];
