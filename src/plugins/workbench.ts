/**
 * What psiscape's commands do once the first analysis is asked for: open
 * analysis panels for notebook outputs and files, restore the analyses a
 * notebook holds, open Landau explorers. Loaded on demand by commands.ts, so
 * the parsers, the engine, mathjs and the charts stay out of JupyterLab's
 * start-up.
 */
import type { NotebookPanel } from '@jupyterlab/notebook';
import { parseOffThread } from '../ui/parse-off-thread';
import type { ParseResult } from '../core/table';
import { hashBundle } from '../core/source';
import type { ITableSource } from '../core/source';
import { AnalysisPanel } from '../ui/analysis-panel';
import { LandauExplorer } from '../ui/landau';
import type { ILocatedOutput } from './locate';
import { outputAt, outputCount } from './locate';
import { revealCell } from './reveal';
import { SourceFollower } from './follow-source';
import { notifyProblems, removeAnalysis, savedAnalysesOf, upsertAnalysis } from './persistence';
import type { ISavedAnalysis } from '../core/saved';
import { Clipboard, Notification } from '@jupyterlab/apputils';
import type { IExportHost } from '../ui/export-bar';
import type { IDisplayOutput } from '../core/analysis/report';
import type { ICodeCellModel } from '@jupyterlab/cells';
import { UUID } from '@lumino/coreutils';
import { DEFAULT_KIND, isKnownKind } from '../core/analysis';
import { AnalysisSession } from '../core/analysis/session';
import { msg } from '../core/messages';
import type { ICoreMessage } from '../core/messages';
import { AnalysisRunner } from '../ui/analysis-runner';
import { CommandIDs } from './commands';
import type { ICommandContext } from './commands';

/** Resolves at the next animation frame (or soon, where there are no frames). */
function nextFrame(): Promise<void> {
  return new Promise(resolve => (typeof requestAnimationFrame === 'function' ? requestAnimationFrame(() => setTimeout(resolve, 0)) : setTimeout(resolve, 0)));
}

/** Saved analyses opened at once when a notebook opens; the rest wait for the reopen command. */
export const RESTORE_AT_ONCE = 4;

/** Cell metadata key marking the cells that hold an analysis's inserted outputs. */
export const CELL_KEY = 'psiscape';

/** The panels, explorers and actions behind psiscape's commands. */
export interface IWorkbench {
  /** Analysis panels opened so far (disposed ones included until pruned by their users). */
  panels: AnalysisPanel[];
  /** Source followers of the open analyses of notebook outputs. */
  followers: Map<AnalysisPanel, SourceFollower>;
  /** Landau explorers opened so far. */
  explorers: LandauExplorer[];
  /** Reopen the saved analyses of a notebook that are not open (at most `limit`); resolves with how many opened. */
  restore(panel: NotebookPanel, limit?: number): Promise<number>;
  /** Analyse the output located under the context menu, or say that none was found. */
  analyseOutput(located: ILocatedOutput | null): Promise<void>;
  /** Analyse the first table output of the selected cell. */
  analyseSelectedCell(): Promise<void>;
  /** Analyse a CSV or TSV file. */
  analyseFile(path: string): Promise<void>;
  /** Open a Landau explorer, with coefficients when given; returns its widget id. */
  openExplorer(args: Readonly<Record<string, unknown>>): string;
}

/** Build the workbench behind the commands (once per application). */
export function createWorkbench(ctx: ICommandContext): IWorkbench {
  const { app, tracker, translator } = ctx;
  const trans = translator.load('jupyterlab_psiscape');
  const opened: AnalysisPanel[] = [];
  const followers = new Map<AnalysisPanel, SourceFollower>();
  const openIds = new Set<string>();
  const explorers: LandauExplorer[] = [];

  /**
   * Dock a new analysis: the first one splits the main area beside `refId`
   * (the notebook, or the file browser's current document); later ones join
   * it as tabs, unless the user prefers plain tabs everywhere.
   */
  const place = (widget: AnalysisPanel, refId: string | null): void => {
    const previous = opened.filter(p => !p.isDisposed && p.isAttached).pop();
    const ref = refId ?? undefined;
    if (ctx.settings().placement === 'tab') {
      app.shell.add(widget, 'main', { mode: 'tab-after', ref });
    } else if (previous) {
      app.shell.add(widget, 'main', { mode: 'tab-after', ref: previous.id });
    } else {
      app.shell.add(widget, 'main', { mode: 'split-right', ref });
    }
  };

  /** Where a panel's exports go: the clipboard, and files beside `basePath` (a notebook or a data file). */
  const exportHost = (basePath: string): IExportHost => ({
    psiscapeVersion: ctx.psiscapeVersion,
    copy: text => Clipboard.copyToSystem(text),
    save: async (name, content, format) => {
      const slash = basePath.lastIndexOf('/');
      const path = slash >= 0 ? `${basePath.slice(0, slash)}/${name}` : name;
      await app.serviceManager.contents.save(path, { type: 'file', format, content });
      return path;
    }
  });

  /**
   * Saved outputs of an analysis in its notebook: a code cell below the
   * source cell (or the one inserted before for the same analysis, updated in
   * place), its input collapsed, holding the outputs.
   */
  const notebookInsert =
    (panel: NotebookPanel, sourceCellId: () => string) =>
    async (outputs: IDisplayOutput[], analysisId: string, caption: string): Promise<string> => {
      const model = panel.content.model;
      if (!model || panel.isDisposed) {
        throw new Error(trans.__('the notebook is closed'));
      }
      const cells = panel.content.widgets;
      const mine = (c: (typeof cells)[number]) => (c.model.getMetadata(CELL_KEY) as { analysis?: unknown } | undefined)?.analysis === analysisId;
      const existing = cells.findIndex(mine);
      if (existing >= 0) {
        const cell = cells[existing].model as ICodeCellModel;
        cell.sharedModel.transact(() => {
          cell.outputs.clear();
          outputs.forEach(o => cell.outputs.add(o as unknown as Parameters<typeof cell.outputs.add>[0]));
        });
        return trans.__('cell %1, updated', existing + 1);
      }
      const sourceIndex = cells.findIndex(c => c.model.id === sourceCellId());
      const at = sourceIndex >= 0 ? sourceIndex + 1 : cells.length;
      model.sharedModel.insertCell(at, {
        cell_type: 'code',
        source: `# psiscape: ${caption.replace(/\n/g, ' ')}.\n# The outputs below were written by psiscape and need no kernel. Running this cell clears them;\n# insert them again from the analysis panel.`,
        metadata: { [CELL_KEY]: { analysis: analysisId }, jupyter: { source_hidden: true }, editable: false },
        outputs: outputs as unknown as NonNullable<Parameters<typeof model.sharedModel.insertCell>[1]['outputs']>,
        execution_count: null
      });
      return trans.__('cell %1', at + 1);
    };

  /** Tell the user about problems with saved analyses, through JupyterLab's notifications. */
  const notify = (path: string, problems: readonly ICoreMessage[]): void => notifyProblems(trans, problems, path);

  /**
   * Open an analysis of a notebook output. With `saved`, the analysis is one
   * the notebook holds: same id, columns and settings, and its snapshot stands
   * in for the output when that is gone.
   */
  const open = (panel: NotebookPanel, located: ILocatedOutput | null, parse: ParseResult, saved?: ISavedAnalysis): AnalysisPanel => {
    const source: ITableSource | null = saved
      ? { ...saved.source }
      : located
        ? {
            notebookPath: panel.context.path,
            cellId: located.cell.model.id,
            outputIndex: located.outputIndex,
            contentHash: hashBundle(located.bundle)
          }
        : null;
    const cellIndex = located ? located.cellIndex : panel.content.activeCellIndex;
    const outputNumber = located ? located.outputIndex + 1 : (saved?.source.outputIndex ?? 0) + 1;
    const sourceLabel =
      located || saved
        ? trans.__('%1 · cell %2 · output %3', panel.context.path, located ? cellIndex + 1 : '?', outputNumber)
        : trans.__('%1 · cell %2', panel.context.path, cellIndex + 1);
    const cellId = source?.cellId ?? panel.content.widgets[cellIndex]?.model.id ?? '';
    const id = saved?.id ?? UUID.uuid4();
    const session = new AnalysisSession({ id, source });
    let restoreFit = false;
    if (saved) {
      const restored = session.restore(saved, located ? parse : null, msg('session.snapshot-note', 'Data from the copy saved in the notebook (the plotted columns only).'));
      restoreFit = restored.runFit;
      if (!located) {
        session.setSourceState('lost', msg('source.saved-copy', 'The source output of this saved analysis is not in the notebook; showing the saved copy of its data.'));
      } else if (restored.problem) {
        session.setSourceState('stale', msg('source.saved-copy-because', 'Showing the copy of the data saved in the notebook.'), restored.problem);
      } else {
        session.setSourceHash(hashBundle(located.bundle));
      }
    } else {
      session.setParse(parse);
    }
    const widget = new AnalysisPanel({
      session,
      notebookName: panel.title.label || panel.context.path,
      sourceLabel,
      pointSize: ctx.settings().pointSize,
      translator,
      runner: new AnalysisRunner(),
      exports: { ...exportHost(panel.context.path), insert: notebookInsert(panel, () => session.source?.cellId ?? cellId) },
      onRevealSource: async () => {
        await revealCell(app, tracker, panel.context.path, cellId);
      },
      onExploreLandau: k => {
        void app.commands.execute(CommandIDs.openLandauExplorer, { ...k });
      },
      onForget: source
        ? () => {
            session.dispose();
            const blocked = removeAnalysis(panel, id);
            if (blocked) {
              notify(panel.context.path, [blocked]);
            }
            widget.dispose();
          }
        : undefined
    });
    place(widget, panel.id);
    // A restored analysis joins the dock without taking the focus from the notebook being opened.
    if (!saved) {
      app.shell.activateById(widget.id);
    }
    opened.push(widget);
    openIds.add(id);
    widget.disposed.connect(() => {
      openIds.delete(id);
      session.dispose();
    });
    if (source) {
      const follower = new SourceFollower(panel, session, () => void widget.fitSection.runFit());
      followers.set(widget, follower);
      session.saveRequested.connect((_, entry) => {
        if (!panel.isDisposed) {
          const blocked = upsertAnalysis(panel, entry);
          if (blocked) {
            notify(panel.context.path, [blocked]);
          }
        }
      });
      widget.disposed.connect(() => {
        follower.dispose();
        followers.delete(widget);
      });
    }
    if (restoreFit) {
      widget.runFitWhenShown();
    }
    return widget;
  };

  /**
   * Reopen the analyses a notebook holds that are not open yet: the first
   * few at once (their fits run when their tab is first shown), the rest on
   * request, so a notebook with hundreds of analyses opens at once.
   */
  const restore = async (panel: NotebookPanel, limit = RESTORE_AT_ONCE): Promise<number> => {
    const { analyses, problems } = savedAnalysesOf(panel);
    notify(panel.context.path, problems);
    const closed = analyses.filter(a => !openIds.has(a.id) && isKnownKind(a.settings?.kind ?? DEFAULT_KIND));
    const now = closed.slice(0, limit);
    // Claimed before the first await, so a second restore of the same notebook does not open them twice.
    now.forEach(saved => openIds.add(saved.id));
    for (const saved of now) {
      const cellIndex = panel.content.widgets.findIndex(c => c.model.id === saved.source.cellId);
      const located = cellIndex >= 0 ? outputAt(panel, cellIndex, saved.source.outputIndex) : null;
      const parse: ParseResult = located
        ? await parseOffThread({ bundle: located.bundle })
        : { ok: false, message: msg('source.output-gone', 'The source output is not in the notebook.') };
      if (panel.isDisposed) {
        break;
      }
      open(panel, located, parse, saved);
      // One panel per frame: the page stays responsive while they come.
      await nextFrame();
    }
    if (closed.length > now.length) {
      Notification.info(
        trans.__('%1 holds %2 more saved analyses. Open them with “Reopen Saved Analyses” in the command palette.', panel.context.path, closed.length - now.length),
        { autoClose: 8000 }
      );
    }
    return now.length;
  };

  const analyseOutput = async (located: ILocatedOutput | null): Promise<void> => {
    if (!located) {
      const panel = tracker.currentWidget;
      if (panel) {
        open(panel, null, { ok: false, message: msg('command.no-output-under-pointer', 'No cell output was found under the pointer.') });
      }
      return;
    }
    open(located.panel, located, await parseOffThread({ bundle: located.bundle }));
  };

  const analyseSelectedCell = async (): Promise<void> => {
    const panel = tracker.currentWidget;
    if (!panel) {
      return;
    }
    const cellIndex = panel.content.activeCellIndex;
    const cell = panel.content.widgets[cellIndex];
    const count = cell ? outputCount(cell) : 0;
    let firstFailure: ParseResult | null = null;
    for (let i = 0; i < count; i++) {
      const located = outputAt(panel, cellIndex, i);
      if (!located) {
        continue;
      }
      const parse = await parseOffThread({ bundle: located.bundle });
      if (parse.ok) {
        open(panel, located, parse);
        return;
      }
      firstFailure = firstFailure ?? parse;
    }
    const message =
      count === 0
        ? msg('command.no-output', 'The selected cell has no output, so it holds no table. Run the cell first.')
        : msg('command.no-table', 'No output of the selected cell holds a table.');
    // The first output's own reasons follow as details.
    const details = firstFailure && !firstFailure.ok ? [firstFailure.message, ...(firstFailure.details ?? [])] : undefined;
    open(panel, null, { ok: false, message, details });
  };

  const analyseFile = async (path: string): Promise<void> => {
    const mime = /\.tsv$/i.test(path) ? 'text/tab-separated-values' : 'text/csv';
    let parse: ParseResult;
    try {
      const model = await app.serviceManager.contents.get(path, { content: true, format: 'text' });
      parse = typeof model.content === 'string' ? await parseOffThread({ mime, text: model.content }) : { ok: false, message: msg('command.not-text', '%1 is not a text file.', path) };
    } catch (reason) {
      parse = { ok: false, message: msg('command.file-unreadable', '%1 could not be read (%2).', path, reason instanceof Error ? reason.message.slice(0, 120) : String(reason).slice(0, 120)) };
    }
    const session = new AnalysisSession({ id: UUID.uuid4(), source: null });
    session.setParse(parse);
    const widget = new AnalysisPanel({
      session,
      notebookName: path.split('/').pop() ?? path,
      sourceLabel: trans.__('file %1', path),
      pointSize: ctx.settings().pointSize,
      translator,
      runner: new AnalysisRunner(),
      exports: exportHost(path)
    });
    widget.disposed.connect(() => session.dispose());
    place(widget, app.shell.currentWidget?.id ?? null);
    app.shell.activateById(widget.id);
    opened.push(widget);
  };

  let explorerCount = 0;
  const openExplorer = (args: Readonly<Record<string, unknown>>): string => {
    const given = ['a', 'T0', 'b', 'c'].every(key => typeof args[key] === 'number' && Number.isFinite(args[key]));
    const explorer = new LandauExplorer({
      trans,
      initial: given
        ? { a: args.a as number, T0: args.T0 as number, b: args.b as number, c: args.c as number, d: typeof args.d === 'number' ? args.d : 0 }
        : undefined
    });
    explorer.id = `jp-psiscape-landau-${++explorerCount}`;
    // Explorers share one dock area: the first splits the main area, later ones join it as tabs.
    const previous = explorers.filter(e => !e.isDisposed && e.isAttached).pop();
    app.shell.add(explorer, 'main', previous ? { mode: 'tab-after', ref: previous.id } : { mode: 'split-right' });
    app.shell.activateById(explorer.id);
    explorers.push(explorer);
    return explorer.id;
  };

  return { panels: opened, followers, explorers, restore, analyseOutput, analyseSelectedCell, analyseFile, openExplorer };
}
