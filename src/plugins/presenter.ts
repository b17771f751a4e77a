/**
 * The presenter view: one analysis panel fills the main area (JupyterLab's
 * single-document mode, side bars collapsed) and its charts grow with it, with
 * text, lines and points scaled by the `presenterScale` setting. It starts from
 * the "Present Analysis" command or with JupyterLab's own Presentation Mode
 * (the shell's `jp-mod-presentationMode` class), and ends the same way, or
 * when the user leaves single-document mode or closes the panel.
 *
 * Only DOM and Lumino wiring lives here, so it loads with the commands.
 */
import type { JupyterFrontEnd, LabShell } from '@jupyterlab/application';
import { Signal } from '@lumino/signaling';
import type { ISignal } from '@lumino/signaling';
import type { Widget } from '@lumino/widgets';
import { CHART_SCALE_VARIABLE } from '../ui/chart-theme';
import { PRESENTING_CLASS } from '../ui/chart-view';

/** What the presenter view needs of a panel: a widget that can draw itself anew. */
export interface IPresentable extends Widget {
  /** Draw every chart again (the theme, scale and sizes are read afresh). */
  redraw(): void;
}

/** The class JupyterLab's Presentation Mode sets on the shell. */
export const PRESENTATION_MODE_CLASS = 'jp-mod-presentationMode';

/** The part of JupyterLab's shell the presenter view uses (a LabShell; other shells lack some of it). */
type IShellParts = Partial<Pick<LabShell, 'mode' | 'modeChanged' | 'collapseLeft' | 'collapseRight' | 'expandLeft' | 'expandRight' | 'leftCollapsed' | 'rightCollapsed' | 'activateById'>>;

/** Shows one panel at a time in the presenter view. */
export class Presenter {
  constructor(options: Presenter.IOptions) {
    this._app = options.app;
    this._scale = options.scale;
    this._panels = options.panels;
    const shell = this._shell();
    shell.modeChanged?.connect(this._onModeChanged, this);
    if (typeof MutationObserver !== 'undefined') {
      this._observer = new MutationObserver(() => this._followPresentationMode());
      for (const node of this._watched()) {
        this._observer.observe(node, { attributes: true, attributeFilter: ['class'] });
      }
    }
  }

  /** The panel being presented, or null. */
  get current(): IPresentable | null {
    return this._current;
  }

  /** Emits when the panel presented changes (or the view ends). */
  get changed(): ISignal<this, IPresentable | null> {
    return this._changed;
  }

  /** Present `panel`, or end the view when it is the one presented. */
  toggle(panel: IPresentable): void {
    if (this._current === panel) {
      this.stop();
    } else {
      this.present(panel);
    }
  }

  /** Make `panel` fill the main area with its charts scaled up. */
  present(panel: IPresentable): void {
    if (panel.isDisposed) {
      return;
    }
    if (this._current && this._current !== panel) {
      this._unmark(this._current);
    }
    const shell = this._shell();
    if (!this._restore) {
      this._restore = { mode: shell.mode ?? null, left: shell.leftCollapsed ?? true, right: shell.rightCollapsed ?? true };
    }
    this._current = panel;
    panel.addClass(PRESENTING_CLASS);
    panel.node.style.setProperty(CHART_SCALE_VARIABLE, String(this._scale()));
    panel.disposed.connect(this._onDisposed, this);
    shell.activateById?.(panel.id);
    this._settingMode = true;
    try {
      if (shell.mode !== undefined) {
        shell.mode = 'single-document';
      }
      shell.collapseLeft?.();
      shell.collapseRight?.();
    } finally {
      this._settingMode = false;
    }
    shell.activateById?.(panel.id);
    this._redrawSoon(panel);
    this._changed.emit(panel);
  }

  /** End the presenter view: the panel and the shell's layout as they were. */
  stop(): void {
    const panel = this._current;
    if (!panel) {
      return;
    }
    this._unmark(panel);
    this._current = null;
    const restore = this._restore;
    this._restore = null;
    const shell = this._shell();
    if (restore) {
      this._settingMode = true;
      try {
        if (restore.mode && shell.mode !== undefined && shell.mode !== restore.mode) {
          shell.mode = restore.mode;
        }
        if (!restore.left) {
          shell.expandLeft?.();
        }
        if (!restore.right) {
          shell.expandRight?.();
        }
      } finally {
        this._settingMode = false;
      }
    }
    if (!panel.isDisposed) {
      shell.activateById?.(panel.id);
      this._redrawSoon(panel);
    }
    this._changed.emit(null);
  }

  /** Follow a new `presenterScale`: the panel presented is drawn again at once. */
  updateScale(): void {
    const panel = this._current;
    if (panel && !panel.isDisposed) {
      panel.node.style.setProperty(CHART_SCALE_VARIABLE, String(this._scale()));
      panel.redraw();
    }
  }

  /** Stop observing the shell. */
  dispose(): void {
    this._observer?.disconnect();
    this._shell().modeChanged?.disconnect(this._onModeChanged, this);
    this.stop();
  }

  private _shell(): IShellParts {
    return this._app.shell as unknown as IShellParts;
  }

  /** The nodes whose class says Presentation Mode: the shell's (JupyterLab 4) and the body. */
  private _watched(): HTMLElement[] {
    const shellNode = (this._app.shell as unknown as Widget).node;
    return shellNode && shellNode !== document.body ? [document.body, shellNode] : [document.body];
  }

  private _inPresentationMode(): boolean {
    return this._watched().some(n => n.classList.contains(PRESENTATION_MODE_CLASS));
  }

  private _followPresentationMode(): void {
    const on = this._inPresentationMode();
    if (on === this._presentationMode) {
      return;
    }
    this._presentationMode = on;
    if (on && !this._current) {
      const panel = this._candidate();
      if (panel) {
        this._byPresentationMode = true;
        this.present(panel);
      }
    } else if (!on && this._current && this._byPresentationMode) {
      this._byPresentationMode = false;
      this.stop();
    }
  }

  /** The panel to present: the current widget when it is a panel, else a visible one, else the last opened. */
  private _candidate(): IPresentable | null {
    const open = this._panels().filter(p => !p.isDisposed);
    const current = this._app.shell.currentWidget;
    return open.find(p => p === current) ?? open.find(p => p.isVisible) ?? open[open.length - 1] ?? null;
  }

  private _onModeChanged(_: unknown, mode: string): void {
    // The user left single-document mode: the presenter view ends, the layout stays as they made it.
    if (!this._settingMode && this._current && mode !== 'single-document') {
      this._restore = null;
      this.stop();
    }
  }

  private _onDisposed(panel: Widget): void {
    if (panel === this._current) {
      this.stop();
    }
  }

  private _unmark(panel: IPresentable): void {
    panel.disposed.disconnect(this._onDisposed, this);
    if (!panel.isDisposed) {
      panel.removeClass(PRESENTING_CLASS);
      panel.node.style.removeProperty(CHART_SCALE_VARIABLE);
    }
  }

  /** Redraw once the shell has laid the panel out at its new size. */
  private _redrawSoon(panel: IPresentable): void {
    const draw = (): void => {
      if (!panel.isDisposed) {
        panel.redraw();
      }
    };
    if (typeof requestAnimationFrame === 'function') {
      requestAnimationFrame(draw);
    } else {
      setTimeout(draw, 0);
    }
  }

  private _app: JupyterFrontEnd;
  private _scale: () => number;
  private _panels: () => readonly IPresentable[];
  private _current: IPresentable | null = null;
  private _restore: { mode: LabShell['mode'] | null; left: boolean; right: boolean } | null = null;
  private _observer: MutationObserver | null = null;
  private _presentationMode = false;
  private _byPresentationMode = false;
  private _settingMode = false;
  private _changed = new Signal<this, IPresentable | null>(this);
}

/** Options of {@link Presenter}. */
export namespace Presenter {
  export interface IOptions {
    app: JupyterFrontEnd;
    /** The `presenterScale` setting, read on every use. */
    scale: () => number;
    /** The analysis panels open (a panel to present when Presentation Mode starts). */
    panels: () => readonly IPresentable[];
  }
}
