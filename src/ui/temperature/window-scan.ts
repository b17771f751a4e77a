/**
 * The exponent against the fit window, for the critical power laws: β from
 * fits over windows (Tc − T)/Tc ≤ t_max, each window measured from its own
 * fitted Tc, drawn with the universality classes' values; the suggested
 * t_max with why, and a button that sets the analysis's window to it.
 */
import type { TranslationBundle } from '@jupyterlab/translation';
import { Panel, Widget } from '@lumino/widgets';
import { formatPlain, formatWithError } from '../../core/analysis';
import type { AnalysisSession, SessionChange } from '../../core/analysis/session';
import type { IWindowScanCell, IWindowScanResult } from '../../core/analysis/tasks-types';
import type { AnalysisRunner } from '../analysis-runner';
import { ChartView } from '../chart-view';
import { translateMessage } from '../translate';
import { windowScanChart } from './charts';
import type { ITemperatureViewOptions } from './common';
import { button, dataTable, paragraph, TaskRow, verdictNode } from './common';
import type { IChartTheme } from '../../charts/theme';

/** Kinds the scan is offered for. */
export const WINDOW_SCAN_KINDS: readonly string[] = Object.freeze(['power-law', 'power-law-corrected']);

/**
 * The fit window a cell implies for data below Tc: from (1 − t_max)·Tc to
 * Tc, with the cell's own fitted Tc (t = (Tc − T)/Tc ≤ t_max).
 */
export function windowOfCell(cell: Pick<IWindowScanCell, 'tMax' | 'Tc'>): { min: number; max: number } | null {
  const Tc = cell.Tc.value;
  if (!(Number.isFinite(Tc) && Number.isFinite(cell.tMax) && cell.tMax > 0)) {
    return null;
  }
  return { min: (1 - cell.tMax) * Tc, max: Tc };
}

/** The window scan: a Scan button, the chart, the suggested t_max and "Use this window". */
export class WindowScanView extends Panel {
  constructor(options: WindowScanView.IOptions) {
    super();
    this._trans = options.trans;
    this._session = options.session;
    this._runner = options.runner;
    this._theme = options.theme;
    this.addClass('jp-psiscape-WindowScanView');
    this.addClass('jp-psiscape-TemperatureView');
    const t = this._trans;
    this.node.setAttribute('role', 'group');
    this.node.setAttribute('aria-label', t.__('Exponent against the fit window'));
    const heading = document.createElement('h3');
    heading.textContent = t.__('Exponent against the fit window');
    this._row = new TaskRow(
      t,
      this._runner,
      {
        run: t.__('Scan the window'),
        runTitle: t.__('Fit the power law over windows of growing t_max, each measured from its own Tc'),
        running: p => (p === null ? t.__('Scanning the window…') : t.__('Scanning the window… %1 %', p)),
        cancelled: t.__('Stopped by you: the scan was not finished, and the results shown before are kept.'),
        failed: reason => t.__('The window scan could not run: %1', reason),
        progress: t.__('Progress of the window scan')
      },
      'jp-psiscape-scan'
    );
    this._row.onRun = () => void this.run();
    this._suggestion = document.createElement('div');
    this._suggestion.className = 'jp-psiscape-scan-suggestion';
    this._used = document.createElement('p');
    this._used.className = 'jp-psiscape-temp-used jp-psiscape-scan-used';
    this._used.setAttribute('aria-live', 'polite');
    this._details = document.createElement('div');
    this._details.className = 'jp-psiscape-temp-result jp-psiscape-scan-details';
    const head = new Widget();
    head.node.append(heading, this._row.node, this._row.error, this._suggestion, this._used);
    this._chart = new ChartView();
    this._chart.addClass('jp-psiscape-scan-chart');
    this._chart.hide();
    this._chartCaption = document.createElement('p');
    this._chartCaption.className = 'jp-psiscape-temp-caption jp-psiscape-scan-caption';
    const foot = new Widget();
    foot.node.append(this._chartCaption, this._details);
    this.addWidget(head);
    this.addWidget(this._chart);
    this.addWidget(foot);
    this._session.changed.connect(this._onChanged);
    this._syncKind();
  }

  /** The scan shown, or null. */
  get result(): IWindowScanResult | null {
    return this._result;
  }

  /** The chart widget. */
  get chart(): ChartView {
    return this._chart;
  }

  /** Resolves when the latest run has ended (and its chart is drawn). */
  get settled(): Promise<void> {
    return this._row.settled.then(() => this._rendered);
  }

  /** Same as {@link settled}. */
  get rendered(): Promise<void> {
    return this.settled;
  }

  /** Run the scan on the session's job (as the button does). */
  run(): Promise<void> {
    const job = this._session.job();
    this._used.textContent = '';
    return this._row.run('window-scan', 'x' in job ? { type: 'window-scan', job } : job, result => this._show(result));
  }

  /** Stop a running scan (what was shown stays). */
  cancel(): void {
    this._row.cancel();
  }

  /** Redraw the chart (theme change). */
  redraw(): void {
    if (this._result) {
      this._draw(this._result, this._theme());
    }
  }

  /** Set the analysis's window to the one a cell implies ("Use this window"). */
  useCell(cell: IWindowScanCell): void {
    const t = this._trans;
    const w = windowOfCell(cell);
    if (!w) {
      this._row.fail(t.__('the window of t_max = %1 has no usable Tc.', formatPlain(cell.tMax)));
      return;
    }
    this._session.setWindow(w.min, w.max);
    this._used.textContent = t.__('The fit window is now %1 to %2 (t_max = %3 below Tc = %4): press Fit to refit.', formatPlain(w.min), formatPlain(w.max), formatPlain(cell.tMax), formatPlain(cell.Tc.value));
  }

  dispose(): void {
    if (this.isDisposed) {
      return;
    }
    this._session.changed.disconnect(this._onChanged);
    this._row.dispose();
    super.dispose();
  }

  private _onChanged = (_: AnalysisSession, change: SessionChange): void => {
    if (change === 'controls' || change === 'table' || change === 'roles') {
      this._syncKind();
    }
  };

  /** Shown for the power-law kinds only. */
  private _syncKind(): void {
    const on = WINDOW_SCAN_KINDS.includes(this._session.kind);
    this.setHidden(!on);
    if (!on) {
      this._row.cancel();
    }
  }

  private _show(r: IWindowScanResult): void {
    const t = this._trans;
    this._result = r;
    const suggested = r.suggested.tMax;
    const cell = suggested === null ? null : (r.cells.find(c => c.tMax === suggested) ?? null);
    const nodes: HTMLElement[] = [];
    const line = paragraph(
      suggested === null
        ? translateMessage(t, r.suggested.reason)
        : t.__('Suggested window: %1', translateMessage(t, r.suggested.reason)),
      'jp-psiscape-scan-suggested'
    );
    line.setAttribute('role', 'status');
    nodes.push(line);
    const w = cell ? windowOfCell(cell) : null;
    if (cell && w) {
      const use = button(t.__('Use this window'), 'jp-mod-accept jp-psiscape-scan-use', () => this.useCell(cell));
      use.title = t.__('Set the fit window to %1 … %2, i.e. (1 − t_max)·Tc to Tc with this window’s Tc', formatPlain(w.min), formatPlain(w.max));
      const row = document.createElement('div');
      row.className = 'jp-psiscape-temp-row';
      row.append(use, paragraph(t.__('%1 to %2 (β = %3)', formatPlain(w.min), formatPlain(w.max), formatWithError(cell.beta.value, cell.beta.sigma)), 'jp-psiscape-scan-window'));
      nodes.push(row);
    }
    this._suggestion.replaceChildren(...nodes);

    const exponent = paragraph(translateMessage(t, r.exponent), 'jp-psiscape-scan-exponent');
    const cells = r.cells.slice().sort((a, b) => a.tMax - b.tMax);
    const table = dataTable(
      ['t_max', t.__('points'), 'β', 'Tc', t.__('verdict')],
      cells.map(c => [formatPlain(c.tMax), String(c.n), formatWithError(c.beta.value, c.beta.sigma), formatWithError(c.Tc.value, c.Tc.sigma), verdictNode(t, c.converged ? c.verdict : 'not-converged')]),
      'jp-psiscape-scan-table'
    );
    cells.forEach((c, i) => table.tBodies[0].rows[i].classList.toggle('jp-psiscape-scan-suggested-row', c.tMax === suggested));
    const numbers = document.createElement('details');
    numbers.className = 'jp-psiscape-scan-numbers';
    const summary = document.createElement('summary');
    summary.textContent = t.__('Numbers of every window');
    numbers.append(summary, table);
    const notes = document.createElement('ul');
    notes.className = 'jp-psiscape-fit-notes jp-psiscape-scan-warnings';
    for (const m of r.warnings) {
      const li = document.createElement('li');
      li.className = 'jp-psiscape-fit-warning';
      li.textContent = translateMessage(t, m);
      notes.appendChild(li);
    }
    const classes = document.createElement('ul');
    classes.className = 'jp-psiscape-temp-citations jp-psiscape-scan-classes';
    for (const c of r.classes) {
      const li = document.createElement('li');
      li.textContent = `${c.label}: β = ${formatPlain(c.beta)} (${c.citation})`;
      classes.appendChild(li);
    }
    const convention = paragraph(translateMessage(t, r.convention), 'jp-psiscape-fit-convention jp-psiscape-scan-convention');
    this._details.replaceChildren(exponent, numbers, ...(r.warnings.length ? [notes] : []), convention, classes);
    this._draw(r, this._theme());
  }

  private _draw(r: IWindowScanResult, theme: IChartTheme): void {
    const chart = windowScanChart(r, theme);
    this._chart.show();
    this._chartCaption.textContent = chart.caption ? this._trans.__(chart.caption) : '';
    this._rendered = this._chart.render(chart.spec, this._trans.__(chart.title));
  }

  private readonly _trans: TranslationBundle;
  private readonly _session: AnalysisSession;
  private readonly _runner: AnalysisRunner;
  private readonly _theme: () => IChartTheme;
  private readonly _row: TaskRow;
  private readonly _chart: ChartView;
  private readonly _suggestion: HTMLDivElement;
  private readonly _used: HTMLParagraphElement;
  private readonly _details: HTMLDivElement;
  private readonly _chartCaption: HTMLParagraphElement;
  private _result: IWindowScanResult | null = null;
  private _rendered: Promise<void> = Promise.resolve();
}

export namespace WindowScanView {
  export type IOptions = ITemperatureViewOptions;
}
