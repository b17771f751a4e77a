/**
 * A widget that draws a Vega-Lite spec: as SVG (one element per mark, crisp
 * and inspectable) for small data, on a canvas above
 * {@link CANVAS_ABOVE_VALUES} data values, where thousands of SVG elements
 * would make drawing and every later layout slow. Vega and Vega-Lite are
 * loaded on first use, so opening JupyterLab does not pay for them.
 */
import { Widget } from '@lumino/widgets';
import type { TopLevelSpec } from 'vega-lite';
import type { Spec, View } from 'vega';

/**
 * Charts whose inline data hold more values than this are drawn on a canvas.
 * 50 000 SVG points took 3.6 s in Chromium (about 70 µs each), so this many
 * take about 0.15 s; spec builders reduce large series to at most
 * `DISPLAY_MAX_POINTS` (4000) points, so a chart of any size is drawn quickly.
 */
export const CANVAS_ABOVE_VALUES = 2000;

/**
 * Class of a panel shown in the presenter view: the charts inside it take
 * their height from the panel's (see {@link presenterHeightFactor}).
 */
export const PRESENTING_CLASS = 'jp-psiscape-mod-presenting';

/** Share of a presenting panel's height the default 300 px chart grows to. */
const PRESENTER_HEIGHT_SHARE = 0.62;

/**
 * Factor by which a chart's own height grows inside a presenting panel of
 * `panelHeight` px: a 300 px chart takes {@link PRESENTER_HEIGHT_SHARE} of
 * the panel, other heights in proportion; never below 1 nor above 4.
 */
export function presenterHeightFactor(panelHeight: number): number {
  if (!Number.isFinite(panelHeight) || panelHeight <= 0) {
    return 1;
  }
  return Math.min(4, Math.max(1, (panelHeight * PRESENTER_HEIGHT_SHARE) / 300));
}

/** The Vega renderers a ChartView uses. */
export type ChartRenderer = 'svg' | 'canvas';

/** Number of inline data values of a compiled Vega spec, nested group marks included. */
export function inlineValueCount(spec: Spec): number {
  let count = 0;
  const stack: { data?: unknown; marks?: unknown }[] = [spec];
  while (stack.length > 0) {
    const node = stack.pop() as { data?: unknown; marks?: unknown };
    if (Array.isArray(node.data)) {
      for (const d of node.data as { name?: unknown; values?: unknown }[]) {
        // A selection's store (e.g. the fit-window brush) is state, not data to draw.
        if (Array.isArray(d?.values) && !(typeof d.name === 'string' && d.name.endsWith('_store'))) {
          count += d.values.length;
        }
      }
    }
    if (Array.isArray(node.marks)) {
      for (const m of node.marks as unknown[]) {
        if (m !== null && typeof m === 'object') {
          stack.push(m as { data?: unknown; marks?: unknown });
        }
      }
    }
  }
  return count;
}

/**
 * Draw `spec` off screen at a chosen size (the chart's plotting area, in
 * CSS pixels) and return it as SVG text or as a PNG data URL drawn at
 * `scale` × that size.
 */
export async function exportChart(spec: TopLevelSpec, options: { width: number; height: number; format: 'svg' | 'png'; scale: number }): Promise<string> {
  const [vega, vegaLite] = await Promise.all([import('vega'), import('vega-lite')]);
  const sized = { ...spec, width: options.width, height: options.height } as TopLevelSpec;
  const view = new vega.View(vega.parse(vegaLite.compile(sized).spec), { renderer: 'none' });
  try {
    await view.runAsync();
    return options.format === 'svg' ? await view.toSVG() : await view.toImageURL('png', options.scale);
  } finally {
    view.finalize();
  }
}

/** Resolves in a later task (after the browser has had a chance to paint and handle input). */
function nextTask(): Promise<void> {
  return new Promise(resolve => setTimeout(resolve, 0));
}

/** The renderer for a compiled spec: canvas above {@link CANVAS_ABOVE_VALUES} inline values, else SVG. */
export function rendererFor(spec: Spec): ChartRenderer {
  return inlineValueCount(spec) > CANVAS_ABOVE_VALUES ? 'canvas' : 'svg';
}

/** Draws one chart at a time; a new spec replaces the previous view. */
export class ChartView extends Widget {
  constructor() {
    super();
    this.addClass('jp-psiscape-ChartView');
    this.node.setAttribute('role', 'img');
    if (typeof ResizeObserver !== 'undefined') {
      // Widths change without a Lumino resize message too (a scroll bar appears, the panel's CSS changes).
      this._observer = new ResizeObserver(() => this._scheduleFit());
      this._observer.observe(this.node);
    }
  }

  /** The current Vega view, once a spec has been rendered. */
  get view(): View | null {
    return this._view;
  }

  /** The Vega-Lite spec of the chart drawn (or being drawn), or null. */
  get spec(): TopLevelSpec | null {
    return this._spec;
  }

  /** The renderer of the current view ({@link rendererFor}); null when nothing is drawn. */
  get renderer(): ChartRenderer | null {
    return this._view ? this._renderer : null;
  }

  /**
   * Render a spec, replacing any previous chart.
   *
   * @param spec - Vega-Lite specification.
   * @param label - Accessible label of the chart.
   */
  async render(spec: TopLevelSpec, label: string): Promise<void> {
    const token = ++this._renderToken;
    this._spec = spec;
    const [vega, vegaLite] = await Promise.all([import('vega'), import('vega-lite')]);
    if (this.isDisposed || token !== this._renderToken) {
      return;
    }
    // Compiling, parsing and drawing each run in their own task, so that a
    // large chart never holds the page for one long task; the previous chart
    // stays until the new one is ready to draw.
    const sized = this._sized(spec);
    const compiled = vegaLite.compile(sized).spec;
    await nextTask();
    if (this.isDisposed || token !== this._renderToken) {
      return;
    }
    const runtime = vega.parse(compiled);
    await nextTask();
    if (this.isDisposed || token !== this._renderToken) {
      return;
    }
    this._finalize();
    const renderer = rendererFor(compiled);
    const view = new vega.View(runtime, {
      renderer,
      container: this.node,
      hover: true
    });
    this._view = view;
    this._renderer = renderer;
    const drawnHeight = (sized as { height?: unknown }).height;
    this._applied = { width: null, height: typeof drawnHeight === 'number' ? drawnHeight : null };
    this.node.setAttribute('aria-label', label);
    await view.runAsync();
  }

  /**
   * The height the spec is drawn at here: its own, or grown with the panel
   * in the presenter view; null when the spec sets none.
   */
  heightFor(spec: TopLevelSpec): number | null {
    const own = (spec as { height?: unknown }).height;
    if (typeof own !== 'number') {
      return null;
    }
    const panel = this.node.closest(`.${PRESENTING_CLASS}`);
    return panel ? Math.round(own * presenterHeightFactor((panel as HTMLElement).clientHeight)) : own;
  }

  /** Follow the container's width and the presenting panel's height without drawing the chart anew. */
  fit(): void {
    const view = this._view;
    const spec = this._spec;
    if (!view || !spec || this.isDisposed) {
      return;
    }
    let changed = false;
    const width = this.node.clientWidth;
    if ((spec as { width?: unknown }).width === 'container' && width > 0 && width !== this._applied.width) {
      view.width(width);
      this._applied.width = width;
      changed = true;
    }
    const height = this.heightFor(spec);
    if (height !== null && height !== this._applied.height) {
      view.height(height);
      this._applied.height = height;
      changed = true;
    }
    if (changed) {
      void view.resize().runAsync();
    }
  }

  private _sized(spec: TopLevelSpec): TopLevelSpec {
    const height = this.heightFor(spec);
    return height === null || height === (spec as { height?: unknown }).height ? spec : ({ ...spec, height } as TopLevelSpec);
  }

  private _scheduleFit(): void {
    if (this._fitPending) {
      return;
    }
    this._fitPending = true;
    setTimeout(() => {
      this._fitPending = false;
      this.fit();
    }, 0);
  }

  /** Remove the chart. */
  clear(): void {
    this._renderToken++;
    this._spec = null;
    this._finalize();
    this.node.textContent = '';
  }

  dispose(): void {
    if (this.isDisposed) {
      return;
    }
    this._observer?.disconnect();
    this._observer = null;
    this._finalize();
    super.dispose();
  }

  protected onResize(): void {
    this.fit();
  }

  private _finalize(): void {
    if (this._view) {
      this._view.finalize();
      this._view = null;
    }
  }

  private _view: View | null = null;
  private _spec: TopLevelSpec | null = null;
  private _renderer: ChartRenderer = 'svg';
  private _renderToken = 0;
  private _applied: { width: number | null; height: number | null } = { width: null, height: null };
  private _observer: ResizeObserver | null = null;
  private _fitPending = false;
}
