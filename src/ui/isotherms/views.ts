/**
 * The views of an isotherm analysis as tabs: one tab list (arrow keys, Home
 * and End move between tabs, as in any tab list), one chart and one line of
 * numbers under it with whether that view agrees with the primary result.
 * Only the chosen view is drawn.
 */
import type { TranslationBundle } from '@jupyterlab/translation';
import { Panel, Widget } from '@lumino/widgets';
import type { IChartTheme } from '../../charts/theme';
import type { IIsothermReport } from '../../core/sweeps/job-types';
import { ChartView } from '../chart-view';
import { translateMessage } from '../translate';
import { ISOTHERM_VIEWS, viewChart } from './view-specs';
import type { IsothermViewId, IViewUnits } from './view-specs';

/** Tabs, chart and caption of the isotherm views. */
export class IsothermViews extends Panel {
  constructor(options: { trans: TranslationBundle; onSelect?: (id: IsothermViewId) => void }) {
    super();
    this._trans = options.trans;
    this._onSelect = options.onSelect ?? null;
    this.addClass('jp-psiscape-IsothermViews');
    const t = this._trans;
    const names: Record<IsothermViewId, string> = {
      arrott: t.__('Arrott'),
      'modified-arrott': t.__('Modified Arrott'),
      'kouvel-fisher': t.__('Kouvel–Fisher'),
      critical: t.__('Critical isotherm'),
      collapse: t.__('Scaling collapse'),
      banerjee: t.__('Banerjee'),
      window: t.__('Against the window'),
      entropy: t.__('Entropy change'),
      'entropy-map': t.__('Entropy map')
    };
    const list = document.createElement('div');
    list.className = 'jp-psiscape-IsothermViews-tabs';
    list.setAttribute('role', 'tablist');
    list.setAttribute('aria-label', t.__('Views of the isotherm analysis'));
    for (const id of ISOTHERM_VIEWS) {
      const tab = document.createElement('button');
      tab.type = 'button';
      tab.className = 'jp-psiscape-IsothermViews-tab';
      tab.setAttribute('role', 'tab');
      tab.dataset.view = id;
      tab.id = `${this.id || 'psiscape-iso'}-tab-${id}-${++tabCount}`;
      tab.textContent = names[id];
      tab.addEventListener('click', () => this.select(id, { user: true }));
      this._tabs.set(id, tab);
      list.appendChild(tab);
    }
    list.addEventListener('keydown', event => this._onKey(event));
    this._caption = document.createElement('p');
    this._caption.className = 'jp-psiscape-IsothermViews-caption';
    this._caption.setAttribute('aria-live', 'polite');
    const head = new Widget();
    head.node.append(list);
    this._chart = new ChartView();
    this._chart.node.setAttribute('role', 'tabpanel');
    const foot = new Widget();
    foot.node.append(this._caption);
    this.addWidget(head);
    this.addWidget(this._chart);
    this.addWidget(foot);
    this._markSelected();
  }

  /** The view shown. */
  get selected(): IsothermViewId {
    return this._selected;
  }

  /** The chart widget (for exports and tests). */
  get chart(): ChartView {
    return this._chart;
  }

  /** Resolves when the latest chart has been drawn. */
  get rendered(): Promise<void> {
    return this._rendered;
  }

  /** Show a report (null: nothing) with the current theme and display units. */
  setReport(report: IIsothermReport | null, theme: IChartTheme, units: IViewUnits): void {
    this._report = report;
    this._theme = theme;
    this._units = units;
    this._draw();
  }

  /** Choose a view (`user`: by the user, so it is saved). */
  select(id: string, options: { user?: boolean; focus?: boolean } = {}): void {
    if (!(ISOTHERM_VIEWS as readonly string[]).includes(id)) {
      return;
    }
    const changed = id !== this._selected;
    this._selected = id as IsothermViewId;
    this._markSelected();
    if (options.focus) {
      this._tabs.get(this._selected)?.focus();
    }
    if (changed) {
      this._draw();
      if (options.user) {
        this._onSelect?.(this._selected);
      }
    }
  }

  private _onKey(event: KeyboardEvent): void {
    const i = ISOTHERM_VIEWS.indexOf(this._selected);
    const n = ISOTHERM_VIEWS.length;
    const to = { ArrowRight: (i + 1) % n, ArrowDown: (i + 1) % n, ArrowLeft: (i - 1 + n) % n, ArrowUp: (i - 1 + n) % n, Home: 0, End: n - 1 }[event.key];
    if (to === undefined) {
      return;
    }
    event.preventDefault();
    this.select(ISOTHERM_VIEWS[to], { user: true, focus: true });
  }

  private _markSelected(): void {
    for (const [id, tab] of this._tabs) {
      const on = id === this._selected;
      tab.setAttribute('aria-selected', String(on));
      tab.tabIndex = on ? 0 : -1;
      tab.classList.toggle('jp-mod-current', on);
    }
    const tab = this._tabs.get(this._selected);
    if (tab) {
      this._chart.node.setAttribute('aria-labelledby', tab.id);
    }
  }

  private _draw(): void {
    const report = this._report;
    if (!report || !this._theme || !this._units) {
      this._chart.clear();
      this._caption.textContent = '';
      return;
    }
    const view = viewChart(this._selected, report, this._theme, this._units);
    const agreement = view.agreement ? translateMessage(this._trans, view.agreement) : '';
    this._caption.textContent = [this._trans.__(view.chart.caption), agreement].filter(s => s).join(' ');
    this._chart.node.dataset.view = this._selected;
    this._rendered = this._chart.render(view.chart.spec, this._trans.__(view.chart.title));
  }

  private readonly _trans: TranslationBundle;
  private readonly _onSelect: ((id: IsothermViewId) => void) | null;
  private readonly _tabs = new Map<IsothermViewId, HTMLButtonElement>();
  private readonly _chart: ChartView;
  private readonly _caption: HTMLParagraphElement;
  private _selected: IsothermViewId = 'arrott';
  private _report: IIsothermReport | null = null;
  private _theme: IChartTheme | null = null;
  private _units: IViewUnits | null = null;
  private _rendered: Promise<void> = Promise.resolve();
}

let tabCount = 0;
