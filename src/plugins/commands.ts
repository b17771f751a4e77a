/**
 * The commands psiscape adds: analyse the table output under the context
 * menu, the first table output of the selected cell, or a CSV/TSV file;
 * reopen a notebook's saved analyses; open a Landau explorer.
 *
 * Only labels, captions and enablement live here, so JupyterLab starts with
 * this small module alone. What the commands do (workbench.ts: panels,
 * parsers, the fit engine, mathjs, the charts) loads on the first command,
 * or when a notebook holding saved analyses opens.
 */
import type { JupyterFrontEnd } from '@jupyterlab/application';
import type { INotebookTracker } from '@jupyterlab/notebook';
import type { ITranslator } from '@jupyterlab/translation';
import { locateOutputNode } from './locate';
import type { IPsiscapeSettings } from './settings';
import type { IWorkbench } from './workbench';
import type { IRestoreHooks } from './restore';
import { Presenter } from './presenter';
import type { IPresentable } from './presenter';

/** Command ids. */
export namespace CommandIDs {
  export const analyseOutput = 'psiscape:analyse-output';
  export const analyseSelectedCell = 'psiscape:analyse-selected-cell';
  export const analyseIsothermsOutput = 'psiscape:analyse-isotherms-output';
  export const analyseIsothermsSelectedCell = 'psiscape:analyse-isotherms-selected-cell';
  export const analyseFile = 'psiscape:analyse-file';
  export const reopenSaved = 'psiscape:reopen-saved-analyses';
  export const reopenSavedAnalysis = 'psiscape:reopen-saved-analysis';
  export const openLandauExplorer = 'psiscape:open-landau-explorer';
  export const insertIntoNotebook = 'psiscape:insert-into-notebook';
  export const copyMarkdown = 'psiscape:copy-result-markdown';
  export const copyLatex = 'psiscape:copy-result-latex';
  export const copyCsv = 'psiscape:copy-result-csv';
  export const saveData = 'psiscape:save-fitted-data-csv';
  export const saveJson = 'psiscape:save-result-json';
  export const saveSvg = 'psiscape:save-chart-svg';
  export const savePng = 'psiscape:save-chart-png';
  export const copyVegaLite = 'psiscape:copy-chart-vega-lite';
  export const presentAnalysis = 'psiscape:present-analysis';
}

/** The export commands and the toolbar action each runs (src/ui/export-bar.ts). */
export const EXPORT_COMMANDS: readonly [string, 'insert' | 'markdown' | 'latex' | 'csv' | 'data' | 'json' | 'svg' | 'png' | 'vega-lite'][] = [
  [CommandIDs.insertIntoNotebook, 'insert'],
  [CommandIDs.copyMarkdown, 'markdown'],
  [CommandIDs.copyLatex, 'latex'],
  [CommandIDs.copyCsv, 'csv'],
  [CommandIDs.saveData, 'data'],
  [CommandIDs.saveJson, 'json'],
  [CommandIDs.saveSvg, 'svg'],
  [CommandIDs.savePng, 'png'],
  [CommandIDs.copyVegaLite, 'vega-lite']
];

/** What the commands need from the application. */
export interface ICommandContext {
  app: JupyterFrontEnd;
  tracker: INotebookTracker;
  translator: ITranslator;
  /** Path of the file selected in the file browser, or null. */
  selectedFile: () => string | null;
  /** Current settings (read on every use so changes apply at once). */
  settings: () => IPsiscapeSettings;
  /** psiscape's version (written into exports). */
  psiscapeVersion: string;
  /** Tracking of the widgets opened, for the layout restorer (absent: nothing is restored after a reload). */
  restore?: IRestoreHooks;
}

/** Access to the workbench behind the commands, loaded on first use. */
export interface IWorkbenchLoader {
  /** The workbench, loading its code the first time. */
  workbench(): Promise<IWorkbench>;
  /** The workbench if it has been loaded, else null (never triggers a load). */
  loaded(): IWorkbench | null;
  /** The presenter view of analysis panels. */
  presenter: Presenter;
}

/** Register the commands; what they do loads with the first use. */
export function registerCommands(ctx: ICommandContext): IWorkbenchLoader {
  const { app, tracker, translator } = ctx;
  const trans = translator.load('jupyterlab_psiscape');
  let instance: IWorkbench | null = null;
  let loading: Promise<IWorkbench> | null = null;
  const workbench = (): Promise<IWorkbench> => {
    loading =
      loading ??
      import(/* webpackChunkName: "psiscape-workbench" */ './workbench').then(module => {
        instance = module.createWorkbench(ctx);
        return instance;
      });
    return loading;
  };

  app.commands.addCommand(CommandIDs.analyseOutput, {
    label: trans.__('Analyse This Table with psiscape'),
    caption: trans.__('Open the table shown in this output in a psiscape analysis panel'),
    describedBy: { args: { type: 'object', properties: {} } },
    isEnabled: () => tracker.currentWidget !== null,
    execute: async () => {
      // The output under the pointer is read now, while the context menu's event is current.
      const node = app.contextMenuHitTest(n => n.classList.contains('jp-OutputArea-child'));
      const located = node ? locateOutputNode(tracker, node) : null;
      await (await workbench()).analyseOutput(located);
    }
  });

  app.commands.addCommand(CommandIDs.analyseSelectedCell, {
    label: trans.__('Analyse Table in Selected Cell'),
    caption: trans.__('Open the first table output of the selected cell in a psiscape analysis panel'),
    describedBy: { args: { type: 'object', properties: {} } },
    isEnabled: () => tracker.currentWidget !== null && tracker.activeCell !== null,
    execute: async () => {
      await (await workbench()).analyseSelectedCell();
    }
  });

  app.commands.addCommand(CommandIDs.analyseIsothermsOutput, {
    label: trans.__('Analyse Isotherms in This Table'),
    caption: trans.__('Open the M(H) isotherms in this output in a psiscape panel: Tc and the critical exponents from field sweeps'),
    describedBy: { args: { type: 'object', properties: {} } },
    isEnabled: () => tracker.currentWidget !== null,
    execute: async () => {
      const node = app.contextMenuHitTest(n => n.classList.contains('jp-OutputArea-child'));
      const located = node ? locateOutputNode(tracker, node) : null;
      await (await workbench()).analyseOutput(located, 'isotherms');
    }
  });

  app.commands.addCommand(CommandIDs.analyseIsothermsSelectedCell, {
    label: trans.__('Analyse Isotherms in Selected Cell'),
    caption: trans.__('Open the M(H) isotherms of the selected cell\'s first table output in a psiscape panel'),
    describedBy: { args: { type: 'object', properties: {} } },
    isEnabled: () => tracker.currentWidget !== null && tracker.activeCell !== null,
    execute: async () => {
      await (await workbench()).analyseSelectedCell('isotherms');
    }
  });

  app.commands.addCommand(CommandIDs.analyseFile, {
    label: trans.__('Analyse with psiscape'),
    caption: trans.__('Open this CSV or TSV file in a psiscape analysis panel, at full precision'),
    describedBy: {
      args: {
        type: 'object',
        properties: {
          path: { type: 'string', description: trans.__('File path; default: the selected file') },
          id: { type: 'string', description: trans.__('Identifier of the analysis (kept when it is restored)') },
          state: { type: 'object', description: trans.__('Columns, analysis kind, options and fit window to start with') }
        }
      }
    },
    isVisible: () => ctx.selectedFile() !== null,
    execute: async args => {
      const path = typeof args.path === 'string' ? args.path : ctx.selectedFile();
      if (path) {
        const state = args.state && typeof args.state === 'object' && !Array.isArray(args.state) ? (args.state as Record<string, unknown>) : undefined;
        await (await workbench()).analyseFile(path, { id: typeof args.id === 'string' ? args.id : undefined, state });
      }
    }
  });

  app.commands.addCommand(CommandIDs.reopenSavedAnalysis, {
    label: trans.__('Reopen Saved Analysis'),
    caption: trans.__('Open one psiscape analysis saved in a notebook, opening the notebook if needed'),
    describedBy: {
      args: {
        type: 'object',
        properties: {
          path: { type: 'string', description: trans.__('Notebook path') },
          id: { type: 'string', description: trans.__('Identifier of the saved analysis') },
          cellId: { type: 'string', description: trans.__('Cell of the output to analyse afresh when the notebook does not hold the analysis') },
          outputIndex: { type: 'number', description: trans.__('Position of that output in the cell') }
        },
        required: ['path', 'id']
      }
    },
    execute: async args => {
      if (typeof args.path !== 'string' || typeof args.id !== 'string') {
        throw new Error('psiscape:reopen-saved-analysis needs a notebook path and an analysis id');
      }
      const output = typeof args.cellId === 'string' && typeof args.outputIndex === 'number' ? { cellId: args.cellId, outputIndex: args.outputIndex } : undefined;
      return (await workbench()).reopenSaved(args.path, args.id, output);
    }
  });

  app.commands.addCommand(CommandIDs.reopenSaved, {
    label: trans.__('Reopen Saved Analyses'),
    caption: trans.__('Open the psiscape analyses saved in this notebook that are not open'),
    describedBy: { args: { type: 'object', properties: {} } },
    isEnabled: () => tracker.currentWidget !== null,
    execute: async () => {
      const panel = tracker.currentWidget;
      return panel ? (await workbench()).restore(panel, Infinity) : 0;
    }
  });

  app.commands.addCommand(CommandIDs.openLandauExplorer, {
    label: trans.__('Open Landau Free-Energy Explorer'),
    caption: trans.__('Explore the free-energy landscape and ψ(T) branches that Landau coefficients imply'),
    describedBy: {
      args: {
        type: 'object',
        properties: {
          a: { type: 'number', description: trans.__('Coefficient a (convention L)') },
          T0: { type: 'number', description: trans.__('Temperature T0') },
          b: { type: 'number', description: trans.__('Coefficient b (convention L)') },
          c: { type: 'number', description: trans.__('Coefficient c (convention L)') },
          d: { type: 'number', description: trans.__('Cubic coefficient d (convention L)') },
          convention: { type: 'string', description: trans.__('Convention the coefficients are shown in') },
          T: { type: 'number', description: trans.__('Temperature of the landscape') },
          h: { type: 'number', description: trans.__('Conjugate field h') },
          id: { type: 'string', description: trans.__('Identifier of the explorer (kept when it is restored)') },
          near: { type: 'string', description: trans.__('Identifier of the widget the explorer opens beside, as a tab') }
        }
      }
    },
    execute: async args => (await workbench()).openExplorer(args)
  });

  // Exports of the analysis panel in focus; they need its code, so they are
  // enabled only once a panel is open (the workbench is then loaded).
  const exportLabels: Record<string, string> = {
    insert: trans.__('Insert Analysis into Notebook'),
    data: trans.__('Save Fitted Data with Model as CSV'),
    markdown: trans.__('Copy Fit Result as Markdown'),
    latex: trans.__('Copy Fit Result as LaTeX'),
    csv: trans.__('Copy Fit Parameters as CSV'),
    json: trans.__('Save Fit Result as JSON'),
    svg: trans.__('Save Analysis Chart as SVG'),
    png: trans.__('Save Analysis Chart as PNG'),
    'vega-lite': trans.__('Copy Analysis Chart as Vega-Lite')
  };
  // The panel under the context menu, else the one in focus.
  const currentBar = () => {
    const hit = app.contextMenuHitTest(n => n.classList.contains('jp-psiscape-AnalysisPanel'));
    const current = app.shell.currentWidget;
    const open = instance?.panels.filter(p => !p.isDisposed) ?? [];
    return (open.find(p => hit !== undefined && p.node === hit) ?? open.find(p => p === current))?.exportBar ?? null;
  };
  // Analysis panels and Landau explorers, open ones only.
  const presentable = (): IPresentable[] => [...(instance?.panels ?? []), ...(instance?.explorers ?? [])].filter(p => !p.isDisposed);
  const presenter = new Presenter({
    app,
    scale: () => ctx.settings().presenterScale,
    panels: () => presentable()
  });
  // The panel under the context menu, else the one in focus, else the one presented, else the last one shown.
  const panelToPresent = () => {
    const hit = app.contextMenuHitTest(n => n.classList.contains('jp-psiscape-AnalysisPanel') || n.classList.contains('jp-psiscape-LandauExplorer'));
    const current = app.shell.currentWidget;
    const open = presentable();
    const visible = open.filter(p => p.isVisible);
    return open.find(p => hit !== undefined && p.node === hit) ?? open.find(p => p === current) ?? presenter.current ?? visible[visible.length - 1] ?? null;
  };
  app.commands.addCommand(CommandIDs.presentAnalysis, {
    label: trans.__('Present Analysis'),
    caption: trans.__('Show this analysis or Landau explorer alone in the main area, its charts filling it with larger text, lines and points; again to return'),
    describedBy: { args: { type: 'object', properties: {} } },
    isEnabled: () => panelToPresent() !== null,
    isToggled: () => presenter.current !== null && presenter.current === panelToPresent(),
    execute: () => {
      const panel = panelToPresent();
      if (panel) {
        presenter.toggle(panel);
      }
    }
  });
  presenter.changed.connect(() => app.commands.notifyCommandChanged(CommandIDs.presentAnalysis));

  for (const [id, action] of EXPORT_COMMANDS) {
    app.commands.addCommand(id, {
      label: exportLabels[action],
      describedBy: { args: { type: 'object', properties: {} } },
      isEnabled: () => currentBar()?.canRun(action) ?? false,
      execute: async () => {
        const bar = currentBar();
        return bar ? bar.run(action) : '';
      }
    });
  }

  return { workbench, loaded: () => instance, presenter };
}
