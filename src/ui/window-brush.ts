/**
 * The fit window on the x–y chart: dragging the brush sets the window when
 * the pointer is released (not on every move, so the chart is not rebuilt
 * under the pointer), and the keyboard moves it too, with the chart focused:
 * ←/→ move the window, Shift+←/→ move its upper end, Alt+←/→ its lower end,
 * each by 2 % of the data range; Escape clears it back to the whole range.
 * The number fields of the fit section stay in step through the session.
 */
import type { View } from 'vega';
import { FIT_WINDOW_PARAM, fitWindowFromSignal } from '../charts/fit-overlay';
import type { ChartView } from './chart-view';

/** Step of a key press, as a fraction of the data range. */
export const KEY_STEP = 0.02;

/** What the brush needs from its panel. */
export interface IWindowBrushHost {
  /** The window the session now has (ends follow the data when open). */
  window(): { min: number; max: number };
  /** The range of the data's x. */
  range(): { min: number; max: number };
  /** Set the window (null ends: the data's ends). */
  setWindow(min: number | null, max: number | null): void;
}

/** Connects the brush of each chart drawn in `chart` to the session's window. */
export class WindowBrush {
  constructor(chart: ChartView, host: IWindowBrushHost, label: string) {
    this._chart = chart;
    this._host = host;
    const node = chart.node;
    node.tabIndex = 0;
    node.setAttribute('aria-keyshortcuts', 'ArrowLeft ArrowRight Shift+ArrowLeft Shift+ArrowRight Alt+ArrowLeft Alt+ArrowRight Escape');
    node.dataset.brushHelp = label;
    node.addEventListener('pointerup', this._commit);
    node.addEventListener('pointercancel', this._commit);
    node.addEventListener('keydown', this._onKey);
  }

  /** Follow the brush of the view just drawn. */
  attach(view: View | null): void {
    this._pending = null;
    if (!view) {
      return;
    }
    try {
      view.addSignalListener(FIT_WINDOW_PARAM, (_name: string, value: unknown) => {
        this._pending = fitWindowFromSignal(value) ?? 'cleared';
      });
    } catch {
      // A chart without the brush (e.g. drawn without one): nothing to follow.
    }
  }

  dispose(): void {
    const node = this._chart.node;
    node.removeEventListener('pointerup', this._commit);
    node.removeEventListener('pointercancel', this._commit);
    node.removeEventListener('keydown', this._onKey);
  }

  private _commit = (): void => {
    const pending = this._pending;
    this._pending = null;
    if (pending === null) {
      return;
    }
    if (pending === 'cleared') {
      this._host.setWindow(null, null);
      return;
    }
    const now = this._host.window();
    if (pending.min !== now.min || pending.max !== now.max) {
      this._host.setWindow(pending.min, pending.max);
    }
  };

  private _onKey = (event: KeyboardEvent): void => {
    const range = this._host.range();
    const span = range.max - range.min;
    if (!(span > 0)) {
      return;
    }
    if (event.key === 'Escape') {
      event.preventDefault();
      this._host.setWindow(null, null);
      return;
    }
    const sign = event.key === 'ArrowRight' ? 1 : event.key === 'ArrowLeft' ? -1 : 0;
    if (sign === 0) {
      return;
    }
    event.preventDefault();
    const step = sign * KEY_STEP * span;
    const w = this._host.window();
    let min = Math.max(range.min, w.min);
    let max = Math.min(range.max, w.max);
    if (event.shiftKey) {
      max = Math.min(range.max, Math.max(min + KEY_STEP * span, max + step));
    } else if (event.altKey) {
      min = Math.max(range.min, Math.min(max - KEY_STEP * span, min + step));
    } else {
      const width = max - min;
      min = Math.min(range.max - width, Math.max(range.min, min + step));
      max = min + width;
    }
    // An end at the data's end stays open, so it follows the data.
    this._host.setWindow(min <= range.min ? null : min, max >= range.max ? null : max);
  };

  private readonly _chart: ChartView;
  private readonly _host: IWindowBrushHost;
  private _pending: { min: number; max: number } | 'cleared' | null = null;
}
