/**
 * A chart view that can also replace the rows of a named dataset in the view
 * it already shows, which is much cheaper than compiling and building a new
 * view (used to move the current-T rule while the temperature slider moves).
 */
import { ChartView } from '../chart-view';

/** ChartView with in-place dataset updates. */
export class PatchableChartView extends ChartView {
  /**
   * Replaces the rows of `name` in the current view and re-runs it.
   *
   * @returns false, changing nothing, when there is no view or no such dataset.
   */
  patch(name: string, rows: object[], label: string): Promise<boolean> {
    return this.patchMany({ [name]: rows }, label);
  }

  /**
   * Replaces the rows of several datasets at once, sets the given signals
   * (e.g. a live title, `chart_title` of charts/frame.ts) and re-runs the view once.
   *
   * @returns false, changing nothing, when there is no view or one of the datasets or signals is missing.
   */
  async patchMany(datasets: Readonly<Record<string, readonly object[]>>, label: string, signals: Readonly<Record<string, unknown>> = {}): Promise<boolean> {
    const view = this.view;
    if (!view) {
      return false;
    }
    const names = Object.keys(datasets);
    try {
      for (const name of names) {
        view.data(name);
      }
      for (const name of Object.keys(signals)) {
        view.signal(name);
      }
    } catch {
      return false;
    }
    for (const name of names) {
      view.data(name, datasets[name] as object[]);
    }
    for (const [name, value] of Object.entries(signals)) {
      view.signal(name, value);
    }
    this.node.setAttribute('aria-label', label);
    await view.runAsync();
    return true;
  }
}
