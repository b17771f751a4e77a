/**
 * ChartView's renderer choice: SVG for small data (one element per mark),
 * canvas above CANVAS_ABOVE_VALUES data values, and a switch back and forth
 * between specs of both sizes in the same widget. jsdom has no 2D canvas, so
 * the canvas tests give canvases a context that records the calls made on it.
 */
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { Widget } from '@lumino/widgets';
import { compile } from 'vega-lite';
import type { TopLevelSpec } from 'vega-lite';
import { buildFitOverlayChart } from '../../src/charts/fit-overlay';
import { buildScatterSpec } from '../../src/charts/scatter';
import type { IChartTheme } from '../../src/charts/theme';
import { CANVAS_ABOVE_VALUES, ChartView, inlineValueCount, rendererFor } from '../../src/ui/chart-view';

const theme: IChartTheme = { background: '#101010', text: '#eeeeee', grid: '#444444', accent: '#3080ff', accent2: '#ff8030', font: 'sans-serif' };

/** A scatter of n points, 400 px wide (jsdom lays nothing out, so a container-wide chart would be 0 px wide and draw nothing). */
function scatter(n: number): TopLevelSpec {
  const x = Float64Array.from({ length: n }, (_, i) => i);
  const y = Float64Array.from({ length: n }, (_, i) => Math.sin(i / 50));
  // No reduction: these tests are about the renderer, not the data.
  const { spec } = buildScatterSpec({ x, y, xTitle: 'T (K)', yTitle: 'M', pointSize: 20, theme, maxPoints: 10 * n + 8 });
  return { ...spec, width: 400 } as TopLevelSpec;
}

/** Calls made on recording 2D contexts, by method name (installed before Vega loads: it measures text on a canvas). */
const calls = vi.hoisted(() => {
  const made = new Map<string, number>();
  HTMLCanvasElement.prototype.getContext = function (this: HTMLCanvasElement) {
    const state: Record<string | symbol, unknown> = { canvas: this };
    return new Proxy(state, {
      get(target, key) {
        if (key in target) {
          return target[key];
        }
        if (key === 'measureText') {
          return (text: string) => ({ width: 6 * String(text).length });
        }
        if (typeof key === 'symbol') {
          return undefined;
        }
        return () => {
          made.set(key, (made.get(key) ?? 0) + 1);
        };
      },
      set(target, key, value) {
        target[key] = value;
        return true;
      }
    });
  } as unknown as typeof HTMLCanvasElement.prototype.getContext;
  return made;
});

interface IScene {
  marktype?: string;
  role?: string;
  items?: IScene[];
}

/** Data symbols in the current view's scenegraph (what is drawn, whatever the renderer; legend symbols left out). */
function symbolItems(view: ChartView): number {
  let count = 0;
  const visit = (node: IScene): void => {
    if (node.marktype === 'symbol' && node.role === 'mark') {
      count += node.items?.length ?? 0;
      return;
    }
    for (const item of node.items ?? []) {
      visit(item);
    }
  };
  visit((view.view!.scenegraph() as unknown as { root: IScene }).root);
  return count;
}

describe('ChartView renderer', () => {
  let view: ChartView;

  beforeEach(() => {
    calls.clear();
    view = new ChartView();
    Widget.attach(view, document.body);
  });

  afterEach(() => {
    view.dispose();
    document.body.innerHTML = '';
  });

  it('should draw small data as SVG, one path per point', async () => {
    await view.render(scatter(50), 'small');
    expect(view.renderer).toBe('svg');
    expect(view.node.querySelector('canvas')).toBeNull();
    expect(view.node.querySelectorAll('svg g.mark-symbol.role-mark path').length).toBe(50);
    expect(view.node.getAttribute('aria-label')).toBe('small');
  });

  it('should draw more than CANVAS_ABOVE_VALUES values on a canvas, with no SVG element per point', async () => {
    const n = CANVAS_ABOVE_VALUES + 500;
    await view.render(scatter(n), 'large');
    expect(view.renderer).toBe('canvas');
    expect(view.node.querySelector('svg')).toBeNull();
    expect(view.node.querySelectorAll('canvas').length).toBe(1);
    // Every point is drawn on the canvas: a filled symbol per point.
    expect(calls.get('fill') ?? 0).toBeGreaterThanOrEqual(n);
  });

  it('should switch renderer when a spec of the other size replaces the chart', async () => {
    await view.render(scatter(CANVAS_ABOVE_VALUES + 1), 'large');
    expect(view.renderer).toBe('canvas');
    await view.render(scatter(CANVAS_ABOVE_VALUES), 'small');
    expect(view.renderer).toBe('svg');
    expect(view.node.querySelector('canvas')).toBeNull();
    expect(view.node.querySelectorAll('svg g.mark-symbol.role-mark path').length).toBe(CANVAS_ABOVE_VALUES);
    view.clear();
    expect(view.renderer).toBeNull();
  });

  it('should draw exactly the points a reduced 200 000-point overlay keeps', async () => {
    const n = 200_000;
    const x = Float64Array.from({ length: n }, (_, i) => 2 + (298 * i) / n);
    const y = x.map(t => Math.sqrt(Math.max(0, 1 - t / 250)) + 0.2 * Math.sin(t * 37));
    const chart = buildFitOverlayChart({ x, y, xTitle: 'T (K)', yTitle: 'M', window: { min: 100, max: 240 }, curve: null, curveLabel: 'fit', pointSize: 20, theme });
    expect(chart.reduced?.total).toBe(n);
    await view.render({ ...chart.spec, width: 400 } as TopLevelSpec, 'overlay');
    expect(view.renderer).toBe(chart.reduced!.shown > CANVAS_ABOVE_VALUES ? 'canvas' : 'svg');
    expect(symbolItems(view)).toBe(chart.reduced!.shown);
  });
});

describe('inlineValueCount / rendererFor', () => {
  it('should count the values of every layer', () => {
    const chart = buildFitOverlayChart({
      x: [1, 2, 3, 4],
      y: [1, 4, 9, 16],
      xTitle: 'x',
      yTitle: 'y',
      window: { min: 2, max: 3 },
      curve: { x: [2, 2.5, 3], y: [4, 6.25, 9] },
      curveLabel: 'fit',
      pointSize: 10,
      theme
    });
    const compiled = compile(chart.spec).spec;
    expect(inlineValueCount(compiled)).toBe(4 + 3);
    expect(rendererFor(compiled)).toBe('svg');
    expect(rendererFor(compile(scatter(CANVAS_ABOVE_VALUES + 1)).spec)).toBe('canvas');
  });
});
