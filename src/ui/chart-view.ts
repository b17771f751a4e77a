/**
 * A widget that draws a Vega-Lite spec as SVG. Vega and Vega-Lite are loaded
 * on first use, so opening JupyterLab does not pay for them.
 */
import { Widget } from '@lumino/widgets';
import type { TopLevelSpec } from 'vega-lite';
import type { View } from 'vega';

/** Draws one chart at a time; a new spec replaces the previous view. */
export class ChartView extends Widget {
  constructor() {
    super();
    this.addClass('jp-psiscape-ChartView');
    this.node.setAttribute('role', 'img');
  }

  /** The current Vega view, once a spec has been rendered. */
  get view(): View | null {
    return this._view;
  }

  /**
   * Render a spec, replacing any previous chart.
   *
   * @param spec - Vega-Lite specification.
   * @param label - Accessible label of the chart.
   */
  async render(spec: TopLevelSpec, label: string): Promise<void> {
    const token = ++this._renderToken;
    const [vega, vegaLite] = await Promise.all([import('vega'), import('vega-lite')]);
    if (this.isDisposed || token !== this._renderToken) {
      return;
    }
    this._finalize();
    const compiled = vegaLite.compile(spec).spec;
    const view = new vega.View(vega.parse(compiled), {
      renderer: 'svg',
      container: this.node,
      hover: true
    });
    this._view = view;
    this.node.setAttribute('aria-label', label);
    await view.runAsync();
  }

  /** Remove the chart. */
  clear(): void {
    this._renderToken++;
    this._finalize();
    this.node.textContent = '';
  }

  dispose(): void {
    if (this.isDisposed) {
      return;
    }
    this._finalize();
    super.dispose();
  }

  protected onResize(): void {
    if (this._view) {
      void this._view.resize().runAsync();
    }
  }

  private _finalize(): void {
    if (this._view) {
      this._view.finalize();
      this._view = null;
    }
  }

  private _view: View | null = null;
  private _renderToken = 0;
}
