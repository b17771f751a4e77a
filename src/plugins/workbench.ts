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
import type { ILandauExplorerState, ILandauOverlay } from '../ui/landau/explorer';
import type { ISavedExplorer } from '../core/saved/explorers';
import { OVERLAY_LIMITS, overlayColumns, overlayRows } from '../core/saved/explorers';
import type { ILocatedOutput } from './locate';
import { outputAt, outputCount } from './locate';
import { revealCell } from './reveal';
import { SourceFollower } from './follow-source';
import { notifyProblems, removeAnalysis, removeExplorerFrom, savedAnalysesOf, savedExplorersOf, upsertAnalysis, upsertExplorerIn } from './persistence';
import type { ISavedAnalysis } from '../core/saved';
import { Clipboard, Notification } from '@jupyterlab/apputils';
import type { IExportHost } from '../ui/export-bar';
import type { IDisplayOutput } from '../core/analysis/report';
import type { ICodeCellModel } from '@jupyterlab/cells';
import { UUID } from '@lumino/coreutils';
import { Widget } from '@lumino/widgets';
import { DEFAULT_KIND, isKnownKind, kindById, optionsFromJson } from '../core/analysis';
import type { OptionValue } from '../core/analysis';
import type { ReadonlyPartialJSONObject } from '@lumino/coreutils';
import type { LandauConvention } from '../core/physics/landau/index';
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

/** How long reopening a saved analysis waits for its notebook to come back with the layout before opening it. */
export const NOTEBOOK_WAIT_MS = 5000;

/** How long explorer changes are gathered before the notebook's copy of the scenario is written. */
export const EXPLORER_SAVE_MS = 250;

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
  analyseOutput(located: ILocatedOutput | null, mode?: AnalysisPanel.Mode): Promise<void>;
  /** Analyse the first table output of the selected cell (`mode`: what the panel shows first). */
  analyseSelectedCell(mode?: AnalysisPanel.Mode): Promise<void>;
  /**
   * Analyse a CSV or TSV file; with `state` (as stored for the layout
   * restorer), with those columns, kind, options and window. Resolves with the
   * panel's widget id.
   */
  analyseFile(path: string, restore?: { id?: string; state?: Readonly<Record<string, unknown>> }): Promise<string>;
  /**
   * Open one analysis saved in a notebook (opening the notebook when it is not
   * open), or show it when it is open already. Resolves with the panel's widget
   * id; rejects when the notebook does not hold it.
   */
  reopenSaved(notebookPath: string, analysisId: string, output?: { cellId: string; outputIndex: number }): Promise<string>;
  /**
   * Open a Landau explorer, with coefficients (and convention, T, h) when
   * given; an `id` of an open explorer shows that one. Resolves with its widget id.
   */
  openExplorer(args: Readonly<Record<string, unknown>>): Promise<string>;
}

/** A file analysis's state as stored for the layout restorer. */
export interface IFileAnalysisState {
  x: { index: number; header: string };
  y: { index: number; header: string };
  sigma: { index: number; header: string } | null;
  kind: string;
  /** Options of the kind; ±∞ as the strings "inf" / "-inf". */
  options: Record<string, string | number | boolean>;
  /** Fit window as typed; null for the data's end. */
  window: { min: number | null; max: number | null };
  /** Whether a fit was shown (it runs again when the panel is first shown). */
  fitted: boolean;
}

/** The state of a file analysis's session, as JSON; null before it has columns. */
export function fileAnalysisState(session: AnalysisSession): IFileAnalysisState | null {
  const p = session.plotted();
  if (!p) {
    return null;
  }
  const ref = (c: { index: number; column: { header: string } }) => ({ index: c.index, header: c.column.header });
  const options: Record<string, string | number | boolean> = {};
  for (const [key, v] of Object.entries(session.options)) {
    options[key] = typeof v === 'number' && !Number.isFinite(v) ? (v > 0 ? 'inf' : '-inf') : v;
  }
  return {
    x: ref(p.x),
    y: ref(p.y),
    sigma: p.sigma ? ref(p.sigma) : null,
    kind: session.kind,
    options,
    window: { ...session.windowInput },
    fitted: session.outcome !== null
  };
}

/**
 * Apply a stored file-analysis state to a session holding the file's table:
 * columns found by position and header (or by a unique header), then kind,
 * options and window. What no longer fits is left at its default.
 *
 * @returns whether a fit was shown when the state was stored.
 */
export function applyFileAnalysisState(session: AnalysisSession, raw: Readonly<Record<string, unknown>>): boolean {
  const state = raw as Partial<IFileAnalysisState>;
  const find = (r: unknown): number | null | undefined => {
    if (!r || typeof r !== 'object') {
      return r === null ? null : undefined;
    }
    const { index, header } = r as { index?: unknown; header?: unknown };
    const columns = session.columns;
    const exact = columns.find(c => c.index === index && c.column.header === header);
    if (exact) {
      return exact.index;
    }
    const named = columns.filter(c => c.column.header === header);
    return named.length === 1 ? named[0].index : undefined;
  };
  const x = find(state.x);
  const y = find(state.y);
  const sigma = find(state.sigma);
  try {
    session.setRoles({ x: x ?? undefined, y: y ?? undefined, sigma: y !== undefined || sigma !== undefined ? (sigma === undefined ? null : sigma) : undefined });
  } catch {
    // columns that are no longer numeric: keep the guessed ones
  }
  if (typeof state.kind === 'string' && kindById(state.kind)) {
    session.setKind(state.kind);
    if (state.options && typeof state.options === 'object') {
      const options: Record<string, OptionValue> = optionsFromJson(state.kind, state.options as Record<string, unknown>);
      for (const [key, value] of Object.entries(options)) {
        try {
          session.setOption(key, value);
        } catch {
          // refused by the kind: its default stays
        }
      }
    }
  }
  const w = state.window;
  if (w && typeof w === 'object') {
    const end = (v: unknown) => (typeof v === 'number' && Number.isFinite(v) ? v : null);
    session.setWindow(end(w.min), end(w.max));
  }
  return state.fitted === true;
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
  const open = (panel: NotebookPanel, located: ILocatedOutput | null, parse: ParseResult, saved?: ISavedAnalysis, at?: Widget, freshId?: string, mode?: AnalysisPanel.Mode): AnalysisPanel => {
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
    const id = saved?.id ?? freshId ?? UUID.uuid4();
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
    const cellNumber = panel.content.widgets.findIndex(c => c.model.id === cellId) + 1;
    const widget = new AnalysisPanel({
      session,
      // A saved analysis with isotherms and no fit of y(x) reopens on its isotherms.
      mode: mode ?? (saved?.isotherms && !saved.settings ? 'isotherms' : 'fit'),
      notebookName: panel.title.label || panel.context.path,
      place: cellNumber > 0 ? trans.__('cell %1', cellNumber) : trans.__('cell ?'),
      sourceLabel,
      pointSize: ctx.settings().pointSize,
      translator,
      runner: new AnalysisRunner(),
      exports: { ...exportHost(panel.context.path), insert: notebookInsert(panel, () => session.source?.cellId ?? cellId) },
      onRevealSource: async () => {
        await revealCell(app, tracker, panel.context.path, cellId);
      },
      onExploreLandau: k => {
        // The explorer keeps its scenario in this notebook and reopens with it; the fitted points and curve are drawn over its branches.
        // It opens as a tab beside the analysis (the width of its area, not a third of the window).
        void app.commands.execute(CommandIDs.openLandauExplorer, { ...k, notebook: panel.context.path, near: widget.id, overlay: landauOverlay(session) as unknown as ReadonlyPartialJSONObject });
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
    if (at && !at.isDisposed && at.isAttached) {
      app.shell.add(widget, 'main', { mode: 'tab-after', ref: at.id });
    } else {
      place(widget, panel.id);
    }
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
    if (source && ctx.restore) {
      // After a reload the layout restorer reopens it by notebook and id; its state stays in the notebook.
      // Until it is first saved there, the output it reads is reopened afresh.
      tracking.set(
        widget,
        ctx.restore.track('analysis', widget, `${source.notebookPath}:${id}`, () => ({ path: panel.context.path, id, cellId: session.source?.cellId ?? source.cellId, outputIndex: session.source?.outputIndex ?? source.outputIndex }))
      );
    }
    return widget;
  };

  /** Tracking of panels by the layout restorer, in flight or done. */
  const tracking = new WeakMap<AnalysisPanel, Promise<void>>();

  /** Open one saved analysis of a notebook: parse its source output (when still there) and show it. */
  const openSaved = async (panel: NotebookPanel, saved: ISavedAnalysis, at?: Widget): Promise<AnalysisPanel | null> => {
    const cellIndex = panel.content.widgets.findIndex(c => c.model.id === saved.source.cellId);
    const located = cellIndex >= 0 ? outputAt(panel, cellIndex, saved.source.outputIndex) : null;
    const parse: ParseResult = located
      ? await parseOffThread({ bundle: located.bundle })
      : { ok: false, message: msg('source.output-gone', 'The source output is not in the notebook.') };
    if (panel.isDisposed) {
      return null;
    }
    return open(panel, located, parse, saved, at);
  };

  /** The open notebook at `path`; after the notebooks of the last session are restored, or opened now. */
  const notebookAt = async (path: string): Promise<NotebookPanel | null> => {
    const find = (): NotebookPanel | null => tracker.find(p => !p.isDisposed && p.context.path === path) ?? null;
    let found = find();
    if (!found) {
      // The notebook may be coming back with the same layout: wait until it is added, or the
      // notebooks of the last session are restored (not forever).
      let added: ((sender: unknown, panel: NotebookPanel) => void) | null = null;
      let timer: ReturnType<typeof setTimeout> | undefined;
      await Promise.race([
        tracker.restored,
        new Promise<void>(resolve => {
          added = (_, panel) => panel.context.path === path && resolve();
          tracker.widgetAdded.connect(added);
        }),
        new Promise<void>(resolve => (timer = setTimeout(resolve, NOTEBOOK_WAIT_MS)))
      ]);
      clearTimeout(timer);
      if (added) {
        tracker.widgetAdded.disconnect(added);
      }
      found = find();
    }
    if (!found && app.commands.hasCommand('docmanager:open')) {
      await app.commands.execute('docmanager:open', { path, factory: 'Notebook', options: { mode: 'tab-before' } });
      found = find();
    }
    return found;
  };

  /**
   * Reopen the analyses a notebook holds that are not open yet: the first
   * few at once (their fits run when their tab is first shown), the rest on
   * request, so a notebook with hundreds of analyses opens at once.
   */
  const restore = async (panel: NotebookPanel, limit = RESTORE_AT_ONCE): Promise<number> => {
    const { analyses, problems } = savedAnalysesOf(panel);
    const saved = savedExplorersOf(panel);
    notify(panel.context.path, [...problems, ...saved.problems]);
    // Explorers opened from this notebook's fits, not open yet (e.g. restored with the layout).
    for (const e of saved.explorers) {
      if (!explorers.some(x => !x.isDisposed && x.id === e.id)) {
        const overlay = e.overlay ? { data: overlayRows(e.overlay.data), fitted: overlayRows(e.overlay.fitted) } : undefined;
        await openExplorer({ ...e, ...e.coefficients, convention: e.convention, T: e.T, h: e.h, id: e.id, notebook: panel.context.path, overlay: overlay as unknown as ReadonlyPartialJSONObject | undefined });
      }
    }
    const closed = analyses.filter(a => !openIds.has(a.id) && isKnownKind(a.settings?.kind ?? DEFAULT_KIND));
    const now = closed.slice(0, limit);
    // Claimed before the first await, so a second restore of the same notebook does not open them twice.
    now.forEach(saved => openIds.add(saved.id));
    for (const saved of now) {
      if (!(await openSaved(panel, saved))) {
        break;
      }
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

  /** An analysis not saved in the notebook (never changed): a fresh one of the output it read, under the same id. */
  const openUnsaved = async (panel: NotebookPanel, analysisId: string, output: { cellId: string; outputIndex: number } | undefined, at?: Widget): Promise<AnalysisPanel | null> => {
    const cellIndex = output ? panel.content.widgets.findIndex(c => c.model.id === output.cellId) : -1;
    const located = output && cellIndex >= 0 ? outputAt(panel, cellIndex, output.outputIndex) : null;
    if (!located) {
      return null;
    }
    const parse = await parseOffThread({ bundle: located.bundle });
    return panel.isDisposed || !parse.ok ? null : open(panel, located, parse, undefined, at, analysisId);
  };

  const reopenSaved = async (notebookPath: string, analysisId: string, output?: { cellId: string; outputIndex: number }): Promise<string> => {
    const shown = (): AnalysisPanel | undefined => opened.find(p => !p.isDisposed && p.session.id === analysisId && p.session.source?.notebookPath === notebookPath);
    const panel = await notebookAt(notebookPath);
    if (!panel) {
      throw new Error(`psiscape: ${notebookPath} could not be opened`);
    }
    if (!panel.context.isReady && !shown()) {
      return holdPlace(panel, notebookPath, analysisId, output);
    }
    await panel.context.ready;
    let widget = shown();
    if (!widget) {
      const saved = savedAnalysesOf(panel).analyses.find(a => a.id === analysisId);
      if ((saved && !isKnownKind(saved.settings?.kind ?? DEFAULT_KIND)) || openIds.has(analysisId) || (!saved && !output)) {
        throw new Error(`psiscape: ${notebookPath} holds no analysis ${analysisId} to reopen`);
      }
      // Claimed before the first await, so the restore that runs when the notebook opens skips it.
      openIds.add(analysisId);
      widget = (saved ? await openSaved(panel, saved) : await openUnsaved(panel, analysisId, output)) ?? undefined;
      if (!widget) {
        openIds.delete(analysisId);
        throw new Error(`psiscape: ${notebookPath} was closed`);
      }
    }
    await tracking.get(widget);
    return widget.id;
  };

  /**
   * While the layout is restored, a notebook's contents are not read yet (and
   * are not read until the layout is restored): a placeholder takes the
   * analysis's place in the dock at once, and the analysis replaces it when
   * the notebook is ready.
   */
  const holdPlace = async (panel: NotebookPanel, notebookPath: string, analysisId: string, output?: { cellId: string; outputIndex: number }): Promise<string> => {
    if (openIds.has(analysisId)) {
      throw new Error(`psiscape: analysis ${analysisId} is being opened already`);
    }
    openIds.add(analysisId);
    const holder = new Widget();
    holder.id = `jp-psiscape-reopening-${analysisId.replace(/[^\w-]/g, '_')}`;
    holder.addClass('jp-psiscape-AnalysisPlaceholder');
    holder.title.label = trans.__('Analysis · %1', notebookPath.split('/').pop() ?? notebookPath);
    holder.title.caption = notebookPath;
    holder.title.closable = true;
    holder.node.textContent = trans.__('Reopening the analysis saved in %1…', notebookPath);
    holder.node.setAttribute('role', 'status');
    app.shell.add(holder, 'main', { mode: 'split-right', ref: panel.id });
    const name = `${notebookPath}:${analysisId}`;
    const fill = async (): Promise<void> => {
      const saved = panel.isDisposed || holder.isDisposed ? undefined : savedAnalysesOf(panel).analyses.find(a => a.id === analysisId);
      if ((saved && !isKnownKind(saved.settings?.kind ?? DEFAULT_KIND)) || panel.isDisposed || holder.isDisposed) {
        openIds.delete(analysisId);
        holder.dispose();
        return;
      }
      const wasCurrent = app.shell.currentWidget === holder;
      const widget = saved ? await openSaved(panel, saved, holder) : await openUnsaved(panel, analysisId, output, holder);
      // The placeholder's restore entry goes with it; the analysis writes its own again.
      holder.dispose();
      if (!widget) {
        openIds.delete(analysisId);
        return;
      }
      await tracking.get(widget);
      ctx.restore?.save(widget);
      if (wasCurrent) {
        app.shell.activateById(widget.id);
      }
    };
    // After the layout is restored, so that the placeholder is in its place to be replaced.
    void Promise.all([panel.context.ready, app.restored]).then(fill, () => {
      openIds.delete(analysisId);
      holder.dispose();
    });
    await ctx.restore?.track('analysis', holder, name, () => ({ path: notebookPath, id: analysisId }));
    return holder.id;
  };

  const analyseOutput = async (located: ILocatedOutput | null, mode?: AnalysisPanel.Mode): Promise<void> => {
    if (!located) {
      const panel = tracker.currentWidget;
      if (panel) {
        open(panel, null, { ok: false, message: msg('command.no-output-under-pointer', 'No cell output was found under the pointer.') });
      }
      return;
    }
    open(located.panel, located, await parseOffThread({ bundle: located.bundle }), undefined, undefined, undefined, mode);
  };

  const analyseSelectedCell = async (mode?: AnalysisPanel.Mode): Promise<void> => {
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
        open(panel, located, parse, undefined, undefined, undefined, mode);
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

  const analyseFile = async (path: string, restoring: { id?: string; state?: Readonly<Record<string, unknown>> } = {}): Promise<string> => {
    const mime = /\.tsv$/i.test(path) ? 'text/tab-separated-values' : 'text/csv';
    let parse: ParseResult;
    try {
      const model = await app.serviceManager.contents.get(path, { content: true, format: 'text' });
      parse = typeof model.content === 'string' ? await parseOffThread({ mime, text: model.content }) : { ok: false, message: msg('command.not-text', '%1 is not a text file.', path) };
    } catch (reason) {
      parse = { ok: false, message: msg('command.file-unreadable', '%1 could not be read (%2).', path, reason instanceof Error ? reason.message.slice(0, 120) : String(reason).slice(0, 120)) };
    }
    const session = new AnalysisSession({ id: restoring.id ?? UUID.uuid4(), source: null });
    session.setParse(parse);
    const fitted = restoring.state ? applyFileAnalysisState(session, restoring.state) : false;
    const fileName = path.split('/').pop() ?? path;
    const widget = new AnalysisPanel({
      session,
      notebookName: fileName,
      place: fileName,
      sourceLabel: trans.__('file %1', path),
      pointSize: ctx.settings().pointSize,
      translator,
      runner: new AnalysisRunner(),
      exports: exportHost(path)
    });
    widget.disposed.connect(() => session.dispose());
    place(widget, app.shell.currentWidget?.id ?? null);
    if (!restoring.state) {
      app.shell.activateById(widget.id);
    }
    opened.push(widget);
    if (fitted) {
      widget.runFitWhenShown();
    }
    const hooks = ctx.restore;
    if (hooks) {
      session.changed.connect(() => hooks.save(widget));
      await hooks.track('file', widget, session.id, () => ({ path, id: session.id, state: (fileAnalysisState(session) ?? {}) as unknown as ReadonlyPartialJSONObject }));
    }
    return widget.id;
  };

  const openExplorer = async (args: Readonly<Record<string, unknown>>): Promise<string> => {
    const requested = typeof args.id === 'string' && args.id !== '' ? args.id : null;
    const shown = requested ? explorers.find(e => !e.isDisposed && e.id === requested) : undefined;
    if (shown) {
      app.shell.activateById(shown.id);
      return shown.id;
    }
    const num = (key: string) => (typeof args[key] === 'number' && Number.isFinite(args[key]) ? (args[key] as number) : undefined);
    const given = ['a', 'T0', 'b', 'c'].every(key => num(key) !== undefined);
    const explorer = new LandauExplorer({
      trans,
      initial: given ? { a: num('a')!, T0: num('T0')!, b: num('b')!, c: num('c')!, d: num('d') ?? 0, T: num('T'), h: num('h') } : undefined,
      overlay: overlayArg(args.overlay)
    });
    const workbenchArgs = ['preset', 'typed', 'coupled', 'view', 'presetValues'].some(key => args[key] !== undefined);
    if (given && ((typeof args.convention === 'string' && args.convention !== 'L') || workbenchArgs)) {
      void explorer.setScenario({
        a: num('a')!,
        T0: num('T0')!,
        b: num('b')!,
        c: num('c')!,
        d: num('d') ?? 0,
        T: num('T'),
        h: num('h'),
        convention: (typeof args.convention === 'string' ? args.convention : 'L') as LandauConvention,
        ...(workbenchArgs ? (args as unknown as Pick<ILandauExplorerState, 'preset' | 'presetValues' | 'typed' | 'coupled' | 'view'>) : {})
      });
    }
    explorer.id = requested ?? `jp-psiscape-landau-${UUID.uuid4()}`;
    // Explorers share one dock area: the first opens beside the analysis it came from (or splits the main area), later ones join it as tabs.
    const previous = explorers.filter(e => !e.isDisposed && e.isAttached).pop();
    const nearId = typeof args.near === 'string' ? args.near : null;
    const near = nearId !== null ? [...app.shell.widgets('main')].find(w => w.id === nearId && w.isAttached) : undefined;
    const ref = previous ?? near;
    app.shell.add(explorer, 'main', ref ? { mode: 'tab-after', ref: ref.id } : { mode: 'split-right' });
    if (!requested) {
      app.shell.activateById(explorer.id);
    }
    explorers.push(explorer);
    const notebookPath = typeof args.notebook === 'string' && args.notebook !== '' ? args.notebook : null;
    if (notebookPath) {
      keepInNotebook(explorer, notebookPath);
    }
    const hooks = ctx.restore;
    if (hooks) {
      explorer.scenarioChanged.connect(() => hooks.save(explorer));
      await hooks.track('explorer', explorer, explorer.id, () => {
        const { overlay, ...scenario } = explorer.scenario();
        return { ...scenario, ...(overlay ? { overlay: overlay as unknown as ReadonlyPartialJSONObject } : {}), id: explorer.id, ...(notebookPath ? { notebook: notebookPath } : {}) };
      });
    }
    return explorer.id;
  };

  /**
   * An explorer opened from a notebook's fit keeps its scenario in that
   * notebook (written as it changes, like analyses; the user saves the
   * notebook as usual) and reopens with it; closing the explorer removes it.
   */
  const keepInNotebook = (explorer: LandauExplorer, notebookPath: string): void => {
    const notebook = (): NotebookPanel | null => tracker.find(p => !p.isDisposed && p.context.path === notebookPath) ?? null;
    let timer: ReturnType<typeof setTimeout> | undefined;
    const write = (): void => {
      timer = undefined;
      const panel = notebook();
      if (!panel || explorer.isDisposed) {
        return;
      }
      if (!panel.context.isReady) {
        // Not read yet (e.g. while the layout is restored): write once it is.
        void panel.context.ready.then(() => (timer === undefined ? write() : undefined));
        return;
      }
      const s = explorer.scenario();
      const blocked = upsertExplorerIn(panel, {
        id: explorer.id,
        coefficients: { a: s.a, T0: s.T0, b: s.b, c: s.c, d: s.d },
        convention: s.convention,
        T: s.T,
        h: s.h,
        ...(s.preset ? { preset: s.preset, presetValues: s.presetValues } : {}),
        ...(s.typed ? { typed: s.typed } : {}),
        ...(s.coupled ? { coupled: s.coupled as unknown as NonNullable<ISavedExplorer['coupled']> } : {}),
        ...(s.view ? { view: s.view as NonNullable<ISavedExplorer['view']> } : {}),
        ...(s.overlay ? { overlay: { data: overlayColumns(s.overlay.data, OVERLAY_LIMITS.data), fitted: overlayColumns(s.overlay.fitted, OVERLAY_LIMITS.fitted) } } : {})
      });
      if (blocked) {
        notify(notebookPath, [blocked]);
      }
    };
    explorer.scenarioChanged.connect(() => {
      clearTimeout(timer);
      timer = setTimeout(write, EXPLORER_SAVE_MS);
    });
    write();
    explorer.disposed.connect(() => {
      clearTimeout(timer);
      const panel = notebook();
      if (panel) {
        removeExplorerFrom(panel, explorer.id);
      }
    });
  };

  return { panels: opened, followers, explorers, restore, reopenSaved, analyseOutput, analyseSelectedCell, analyseFile, openExplorer };
}

/** The fitted points (inside the window) and the fitted curve of a Landau fit, for the explorer's branches chart. */
function landauOverlay(session: AnalysisSession): ILandauOverlay {
  const data: ILandauOverlay['data'] = [];
  const job = session.job();
  if (!('code' in job)) {
    for (let i = 0; i < job.x.length; i++) {
      const T = job.x[i];
      const psi = job.y[i];
      if (Number.isFinite(T) && Number.isFinite(psi) && T >= job.window.min && T <= job.window.max) {
        data.push({ T, psi });
      }
    }
  }
  const curve = session.outcome?.curve;
  const fitted: ILandauOverlay['fitted'] = [];
  if (curve) {
    for (let i = 0; i < curve.x.length; i++) {
      if (Number.isFinite(curve.x[i]) && Number.isFinite(curve.y[i])) {
        fitted.push({ T: curve.x[i], psi: curve.y[i] });
      }
    }
  }
  return { data, fitted };
}

/** An overlay passed as a command argument, checked. */
function overlayArg(value: unknown): ILandauOverlay | undefined {
  if (typeof value !== 'object' || value === null) {
    return undefined;
  }
  const rows = (v: unknown): { T: number; psi: number }[] =>
    Array.isArray(v) ? v.filter((r): r is { T: number; psi: number } => typeof r === 'object' && r !== null && Number.isFinite((r as { T: unknown }).T) && Number.isFinite((r as { psi: unknown }).psi)) : [];
  const o = value as { data?: unknown; fitted?: unknown };
  return { data: rows(o.data), fitted: rows(o.fitted) };
}
