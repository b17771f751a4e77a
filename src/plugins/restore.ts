/**
 * Layout restoration: psiscape's panels are kept in WidgetTrackers that
 * JupyterLab's layout restorer saves with the workspace, so a reload brings
 * them back in the same dock places. Each tracked widget stores the arguments
 * of the command that reopens it:
 *
 * - analyses of notebook outputs: `psiscape:reopen-saved-analysis` with the
 *   notebook path and the analysis id (their state stays in the notebook's
 *   metadata, the one source of truth);
 * - file analyses: `psiscape:analyse-file` with the path, the columns, the
 *   kind, its options and the fit window;
 * - Landau explorers: `psiscape:open-landau-explorer` with the scenario.
 *
 * This module loads at start-up: it holds no widget code (the widgets come
 * from the workbench, loaded only when something is restored or opened).
 */
import type { ILayoutRestorer } from '@jupyterlab/application';
import { WidgetTracker } from '@jupyterlab/apputils';
import type { ReadonlyPartialJSONObject } from '@lumino/coreutils';
import type { Widget } from '@lumino/widgets';

/** What kind of psiscape widget is tracked. */
export type TrackedKind = 'analysis' | 'file' | 'explorer';

/** Tracker namespaces (the keys of their entries in the state database). */
export const TRACKER_NAMESPACES: Readonly<Record<TrackedKind, string>> = {
  analysis: 'psiscape-analysis',
  file: 'psiscape-file-analysis',
  explorer: 'psiscape-landau-explorer'
};

/** What the workbench needs to have its widgets restored after a reload. */
export interface IRestoreHooks {
  /**
   * Track a widget for restoration. `name` is stable across reloads (the
   * restored widget gets the same one); `args` are the arguments of the
   * command that reopens it, read whenever they are saved.
   * Resolves once the widget is tracked (and known to the layout restorer).
   */
  track(kind: TrackedKind, widget: Widget, name: string, args: () => ReadonlyPartialJSONObject): Promise<void>;
  /** The widget's arguments changed: store them again (debounced). */
  save(widget: Widget): void;
}

/** How long state changes are gathered before a tracked widget's arguments are stored again. */
export const SAVE_DELAY_MS = 300;

/** The trackers of psiscape's widgets, registered with the layout restorer when there is one. */
export function createRestoreHooks(restorer: ILayoutRestorer | null, commands: Readonly<Record<TrackedKind, string>>): IRestoreHooks & { trackers: Record<TrackedKind, WidgetTracker<Widget>> } {
  const names = new WeakMap<Widget, string>();
  const argsOf = new WeakMap<Widget, () => ReadonlyPartialJSONObject>();
  const kindOf = new WeakMap<Widget, TrackedKind>();
  const timers = new Map<Widget, ReturnType<typeof setTimeout>>();
  const trackers = {} as Record<TrackedKind, WidgetTracker<Widget>>;
  for (const kind of Object.keys(TRACKER_NAMESPACES) as TrackedKind[]) {
    const tracker = new WidgetTracker<Widget>({ namespace: TRACKER_NAMESPACES[kind] });
    trackers[kind] = tracker;
    if (restorer) {
      void restorer.restore(tracker, {
        command: commands[kind],
        args: widget => argsOf.get(widget)?.() ?? {},
        name: widget => names.get(widget) ?? ''
      });
    }
  }
  return {
    trackers,
    async track(kind, widget, name, args) {
      names.set(widget, name);
      argsOf.set(widget, args);
      kindOf.set(widget, kind);
      widget.disposed.connect(() => {
        clearTimeout(timers.get(widget));
        timers.delete(widget);
      });
      if (!trackers[kind].has(widget)) {
        await trackers[kind].add(widget);
      }
    },
    save(widget) {
      const kind = kindOf.get(widget);
      if (!kind || widget.isDisposed) {
        return;
      }
      clearTimeout(timers.get(widget));
      timers.set(
        widget,
        setTimeout(() => {
          timers.delete(widget);
          if (!widget.isDisposed && trackers[kind].has(widget)) {
            void trackers[kind].save(widget);
          }
        }, SAVE_DELAY_MS)
      );
    }
  };
}
