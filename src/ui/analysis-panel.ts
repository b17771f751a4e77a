/**
 * The analysis panel docked beside a notebook. It renders one
 * {@link AnalysisSession}: the table's source cell (with a control that
 * selects it), how the data relate to it, the x / y / σ column pickers, the
 * chart, the fit section and the isotherm section. It owns no analysis state:
 * every choice goes to the session, and every change of the session is drawn
 * once (changes that arrive together are drawn together).
 */
import type { ITranslator, TranslationBundle } from '@jupyterlab/translation';
import type { Message } from '@lumino/messaging';
import { Panel, Widget } from '@lumino/widgets';
import { buildFitOverlayChart, FIT_CURVE_DATA, fitCurveRows } from '../charts/fit-overlay';
import { kindById } from '../core/analysis';
import type { AnalysisSession, SessionChange } from '../core/analysis/session';
import type { ITable } from '../core/table';
import type { IPlottableColumn } from '../core/table/roles';
import { AnalysisRunner } from './analysis-runner';
import { readChartTheme } from './chart-theme';
import { ChartView } from './chart-view';
import { ExportBar } from './export-bar';
import type { IExportHost } from './export-bar';
import { buildReport } from '../core/analysis/report';
import type { IAnalysisReport, IFittedPoints } from '../core/analysis/report';
import { windowedPoints } from '../core/analysis/window';
import { FitSection } from './fit-section';
import type { ILandauOutcome } from './fit-section';
import { IsothermSection } from './isotherm-section';
import { translateMessage } from './translate';
import { WindowBrush } from './window-brush';
import { FitChecks } from './fit-checks';
import { ModelSliders } from './model-sliders';
import type { IModelEvaluation } from '../core/analysis/model-curve';
import { BootstrapView, ComparisonView, InverseChiView, ReducedPlotView, WINDOW_SCAN_KINDS, WindowScanView } from './temperature';
import type { IChartTheme } from '../charts/theme';
import type { IAnalysisOutcome } from '../core/analysis';

let panelCount = 0;

/** Longest wait of a restored analysis's chart for its refit, in ms (it is then drawn without the curve). */
const RESTORE_HOLD_MS = 1500;

/** A fit still running after this long takes the previous curve off the chart, in ms. */
const RUNNING_REDRAW_MS = 200;

/** Panel showing one analysis. */
export class AnalysisPanel extends Panel {
  constructor(options: AnalysisPanel.IOptions) {
    super();
    this._trans = options.translator.load('jupyterlab_psiscape');
    this._session = options.session;
    this._pointSize = options.pointSize;
    this._onRevealSource = options.onRevealSource ?? null;
    this._onForget = options.onForget ?? null;
    this.id = `jp-psiscape-analysis-${++panelCount}`;
    this.addClass('jp-psiscape-AnalysisPanel');
    this.node.setAttribute('role', 'region');
    this.node.dataset.sourceState = 'live';
    this.node.setAttribute('aria-label', this._trans.__('Table analysis'));
    this._notebookName = options.notebookName;
    this._place = options.place ?? options.notebookName;
    this.title.label = this._trans.__('Analysis · %1', this._place);
    this.title.caption = options.sourceLabel;
    this.title.closable = true;

    this._header = new Widget({ node: this._buildHeader(options.sourceLabel) });
    this._header.addClass('jp-psiscape-AnalysisPanel-header');
    this._banner = new Widget();
    this._banner.addClass('jp-psiscape-AnalysisPanel-banner');
    this._banner.node.setAttribute('role', 'status');
    this._banner.hide();
    this._message = new Widget();
    this._message.addClass('jp-psiscape-AnalysisPanel-message');
    this._message.node.setAttribute('role', 'alert');
    this._notes = new Widget();
    this._notes.addClass('jp-psiscape-AnalysisPanel-notes');
    this._controls = new Widget({ node: this._buildControls() });
    this._controls.addClass('jp-psiscape-AnalysisPanel-controls');
    this._chart = new ChartView();
    this._brush = new WindowBrush(
      this._chart,
      {
        window: () => this._session.window,
        range: () => this._session.xRange(),
        setWindow: (min, max) => this._session.setWindow(min, max)
      },
      this._trans.__('Drag across the chart to set the fit window; with the chart focused, ←/→ move it, Shift+←/→ its upper end, Alt+←/→ its lower end, Escape the whole range.')
    );
    this._status = new Widget();
    this._status.addClass('jp-psiscape-AnalysisPanel-status');
    this._status.node.setAttribute('aria-live', 'polite');
    this._fit = new FitSection({ trans: this._trans, session: this._session, runner: options.runner, onExploreLandau: options.onExploreLandau });
    this._isotherms = new IsothermSection({
      trans: this._trans,
      // Its own runner (a fit and an isotherm analysis do not cancel each other) on the same worker.
      runner: new AnalysisRunner({ host: options.runner.host }),
      onRun: settings => this._session.setIsotherms(settings)
    });
    this._checks = new FitChecks({
      trans: this._trans,
      onUseRelativeWeights: () => {
        this._session.setWeights({ mode: 'relative', fraction: null });
        void this._fit.runFit();
      }
    });
    this._sliders = new ModelSliders({
      trans: this._trans,
      onPreview: (_, evaluation) => this._previewModel(evaluation),
      onFitFromHere: values => {
        // The job is taken at once, so the start applies to this fit only.
        this._session.setStart(values);
        void this._fit.runFit();
        this._session.setStart(null);
      }
    });
    // Views of several fits of the same job: each with its own runner on the shared worker,
    // so a comparison, a scan or a bootstrap never cancels the fit (or each other).
    const theme = (): IChartTheme => readChartTheme(this.node);
    const runner = (): AnalysisRunner => {
      const r = new AnalysisRunner({ host: options.runner.host });
      this._taskRunners.push(r);
      return r;
    };
    this._comparison = new ComparisonView({ trans: this._trans, session: this._session, runner: runner(), theme });
    this._scan = new WindowScanView({ trans: this._trans, session: this._session, runner: runner(), theme });
    this._bootstrap = new BootstrapView({ trans: this._trans, session: this._session, runner: runner(), theme });
    this._reduced = new ReducedPlotView({ trans: this._trans, session: this._session, theme });
    this._inverseChi = new InverseChiView({ trans: this._trans, session: this._session, theme });
    this._modes = new Widget({ node: this._buildModes() });
    this._modes.addClass('jp-psiscape-AnalysisPanel-modes');
    this._exports = options.exports
      ? new ExportBar({
          trans: this._trans,
          host: options.exports,
          source: {
            report: () => this.report(options.exports!.psiscapeVersion),
            view: () => this._chart.view,
            spec: () => this._chart.spec,
            baseName: () => this._notebookName.replace(/\.[^.]*$/, '') || 'analysis',
            analysis: () => ({ id: this._session.id, saved: this._session.toSaved() }),
            hasResult: () => this._session.outcome !== null && this._session.outcomeIsCurrent && this._session.plotted() !== null,
            fitted: () => this._fittedPoints(),
            chartSize: () => {
              const box = (this._chart.node.querySelector('svg, canvas') ?? this._chart.node).getBoundingClientRect();
              return { width: box.width, height: box.height };
            }
          }
        })
      : null;
    for (const w of [this._header, this._modes, ...(this._exports ? [this._exports] : []), this._banner, this._message, this._notes, this._controls, this._chart, this._status, this._fit, this._sliders, this._checks, this._inverseChi, this._reduced, this._comparison, this._scan, this._bootstrap, this._isotherms]) {
      this.addWidget(w);
    }
    this._session.changed.connect(this._onChanged);
    this.setMode(options.mode ?? 'fit');
    this._pending.add('table');
    this._schedule();
  }

  /** The session shown. */
  get session(): AnalysisSession {
    return this._session;
  }

  /** Area of a data point in px² (the setting); a change redraws the chart. */
  get pointSize(): number {
    return this._pointSize;
  }

  set pointSize(value: number) {
    if (value !== this._pointSize && Number.isFinite(value) && value > 0) {
      this._pointSize = value;
      this.redraw();
    }
  }

  /** The export toolbar, when the lab gave the panel somewhere to export to. */
  get exportBar(): ExportBar | null {
    return this._exports;
  }

  /**
   * The record of the fit shown, for exports: null unless a fit of the data
   * and settings now chosen is shown.
   */
  report(psiscapeVersion: string): IAnalysisReport | null {
    const s = this._session;
    const p = s.plotted();
    const outcome = s.outcome;
    if (!outcome || !s.outcomeIsCurrent || !p) {
      return null;
    }
    const col = (c: typeof p.x) => ({ header: c.column.header, unit: c.column.unit });
    return buildReport(outcome, {
      psiscapeVersion,
      source: s.source ? { ...s.source } : null,
      file: s.source ? undefined : this._notebookName,
      columns: { x: col(p.x), y: col(p.y), sigma: p.sigma ? col(p.sigma) : null }
    });
  }

  /** The points of the fit shown with their residuals (in the order fitted), or null. */
  private _fittedPoints(): IFittedPoints | null {
    const s = this._session;
    const outcome = s.outcome;
    const job = s.job();
    if (!outcome || !s.outcomeIsCurrent || !('kind' in job)) {
      return null;
    }
    let points: ReturnType<typeof windowedPoints>;
    try {
      points = windowedPoints({ x: job.x, y: job.y, sigma: job.sigma, window: outcome.window });
    } catch {
      return null;
    }
    return points.x.length === outcome.fit.residuals.length ? { x: points.x, y: points.y, sigma: points.sigma, residuals: outcome.fit.residuals } : null;
  }

  /** The chart widget (for tests and overlays). */
  get chart(): ChartView {
    return this._chart;
  }

  /** The fit controls and results. */
  get fitSection(): FitSection {
    return this._fit;
  }

  /** What the panel shows: the fit of y(x), or the isotherm (field-sweep) analysis. */
  get mode(): AnalysisPanel.Mode {
    return this._mode;
  }

  /** Show the fit of y(x) or the isotherm analysis (the other is kept, not shown). */
  setMode(mode: AnalysisPanel.Mode): void {
    this._mode = mode;
    this.node.dataset.mode = mode;
    this._isotherms.forced = mode === 'isotherms';
    for (const [id, button] of this._modeButtons) {
      button.setAttribute('aria-pressed', String(id === mode));
      button.classList.toggle('jp-mod-current', id === mode);
    }
    this._pending.add('controls');
    this._schedule();
  }

  /** The isotherm (field sweep) analysis. */
  get isothermSection(): IsothermSection {
    return this._isotherms;
  }

  /** How many times the chart has been drawn (for tests of "draws once"). */
  get drawCount(): number {
    return this._drawCount;
  }

  /** Resolves when the pending render (if any) and the latest chart are done. */
  get rendered(): Promise<void> {
    return this._renderDone.then(() => this._chartDone);
  }

  /**
   * Run the fit the first time the panel is shown (restored analyses: a
   * notebook with many saved analyses does not start them all at once).
   */
  runFitWhenShown(): void {
    // The chart waits for the fit, so a restored analysis is drawn once, with its curve.
    this._holdForFit = true;
    clearTimeout(this._holdTimer);
    this._holdTimer = setTimeout(() => this._releaseHold(), RESTORE_HOLD_MS);
    if (this.isVisible) {
      void this._fit.runFit();
    } else {
      this._fitOnShow = true;
    }
  }

  /** Redraw everything (after a theme change, say). */
  redraw(): void {
    this._checks.redraw();
    void this._scan.redraw();
    void this._reduced.redraw();
    void this._inverseChi.redraw();
    this._pending.add('table');
    this._schedule();
    this._isotherms.redraw();
  }

  dispose(): void {
    if (this.isDisposed) {
      return;
    }
    this._session.changed.disconnect(this._onChanged);
    this._brush.dispose();
    for (const r of this._taskRunners) {
      r.dispose();
    }
    clearTimeout(this._runningDraw);
    clearTimeout(this._holdTimer);
    super.dispose();
  }

  protected onAfterAttach(msg: Message): void {
    super.onAfterAttach(msg);
    this.redraw();
    this._runPendingFit();
  }

  protected onAfterShow(msg: Message): void {
    super.onAfterShow(msg);
    this._runPendingFit();
  }

  private _runPendingFit(): void {
    if (this._fitOnShow && this.isVisible) {
      this._fitOnShow = false;
      void this._fit.runFit();
    }
  }

  private _onChanged = (_: AnalysisSession, change: SessionChange): void => {
    this._pending.add(change);
    this._schedule();
  };

  /** Coalesce changes: one render per turn of the event loop. */
  private _schedule(): void {
    if (this._scheduled) {
      return;
    }
    this._scheduled = true;
    this._renderDone = new Promise(resolve => {
      setTimeout(() => {
        this._scheduled = false;
        if (!this.isDisposed) {
          this._render();
        }
        resolve();
      }, 0);
    });
  }

  private _render(): void {
    const changes = this._pending;
    this._pending = new Set();
    const s = this._session;
    // Source state
    this.node.dataset.sourceState = s.sourceState;
    const sourceMessages = s.sourceMessages;
    this._banner.node.textContent = sourceMessages.map(m => translateMessage(this._trans, m)).join(' ');
    this._banner.setHidden(s.sourceState === 'live' || sourceMessages.length === 0);
    if (changes.has('table')) {
      const table = s.table;
      // A redraw (theme change) keeps the isotherm analysis; only a new table resets it.
      if (table !== this._isothermTable) {
        this._isothermTable = table;
        this._isotherms.setTable(table);
        // A saved isotherm analysis runs again on the new table (columns matched by position and header).
        const savedIsotherms = s.isotherms;
        if (table && savedIsotherms) {
          this._isotherms.restore(savedIsotherms);
        }
      }
      this._renderNotes(table);
    }
    const problem = s.problem;
    const usable = problem === null && s.plotted() !== null;
    this._message.node.textContent = problem ? [problem, ...s.problemDetails].map(m => translateMessage(this._trans, m)).join(' ') : '';
    this._message.setHidden(!problem);
    const isotherms = this._mode === 'isotherms';
    this._controls.setHidden(!usable || isotherms);
    this._chart.setHidden(!usable || isotherms);
    this._fit.setHidden(!usable || isotherms);
    this._status.setHidden(isotherms);
    this._exports?.setHidden(isotherms);
    if (!usable) {
      this._renderChecks(true);
      this._chart.clear();
      this._status.node.textContent = '';
      this._exports?.update();
      return;
    }
    if (changes.has('table') || changes.has('roles')) {
      this._fillPickers();
    }
    if (changes.has('table') || changes.has('roles') || changes.has('controls')) {
      this._updateTitle();
    }
    this._fit.render();
    this._renderChecks(isotherms);
    this._exports?.update();
    const run = s.run;
    if (this._holdForFit) {
      if (run.phase === 'done' || run.phase === 'failed' || run.phase === 'cancelled') {
        this._releaseHold();
      }
      return;
    }
    if (changes.has('table') || changes.has('roles') || changes.has('controls')) {
      this._draw();
    } else if (changes.has('run')) {
      // A running fit takes the previous curve off the chart only if it runs for a while: a fit that
      // answers at once is drawn once, with its own curve.
      clearTimeout(this._runningDraw);
      if (run.phase === 'running') {
        this._runningDraw = setTimeout(() => {
          if (!this.isDisposed && this._session.run.phase === 'running' && this._drawnWithCurve) {
            this._draw();
          }
        }, RUNNING_REDRAW_MS);
      } else {
        this._draw();
      }
    }
  }

  /** The views of several fits and the views of the current fit, shown only where they apply. */
  private _renderViews(hidden: boolean): void {
    const s = this._session;
    const outcome = !hidden && s.outcomeIsCurrent ? s.outcome : null;
    for (const w of [this._comparison, this._bootstrap]) {
      w.setHidden(hidden);
    }
    this._scan.setHidden(hidden || !(WINDOW_SCAN_KINDS as readonly string[]).includes(s.kind));
    this._inverseChi.setHidden(hidden || s.kind !== 'curie-weiss' || outcome === null);
    this._reduced.setHidden(hidden || outcome === null || s.kind === 'curie-weiss' || s.kind === 'expression');
    if (outcome !== this._viewsOutcome) {
      this._viewsOutcome = outcome;
      // In tasks of their own: on a large table each view reduces every point, and the page stays responsive between them.
      setTimeout(() => {
        if (!this.isDisposed && this._viewsOutcome === outcome) {
          void this._reduced.update(outcome);
        }
      }, 0);
      setTimeout(() => {
        if (!this.isDisposed && this._viewsOutcome === outcome) {
          void this._inverseChi.update(outcome, null);
        }
      }, 0);
    }
  }

  /** Residuals, correlations and the weights check of the current fit. */
  private _renderChecks(hidden: boolean): void {
    this._renderViews(hidden);
    const s = this._session;
    const p = s.plotted();
    const job = s.job();
    const token = ++this._checksToken;
    if (hidden || !p || !('kind' in job) || !this.isAttached) {
      this._checks.setOutcome(null, null, readChartTheme(this.node), { x: '', yUnit: '' });
      this._sliders.setOutcome(null, null);
      return;
    }
    this._sliders.setOutcome(s.outcomeIsCurrent ? s.outcome : null, job);
    const outcome = s.outcomeIsCurrent ? s.outcome : null;
    const theme = readChartTheme(this.node);
    const titles = { x: p.x.label, yUnit: p.y.column.unit ?? '' };
    setTimeout(() => {
      if (!this.isDisposed && token === this._checksToken) {
        this._checks.setOutcome(outcome, job, theme, titles);
      }
    }, 0);
  }

  /** Stop waiting for a restored analysis's fit and draw what there is. */
  private _releaseHold(): void {
    clearTimeout(this._holdTimer);
    if (!this._holdForFit || this.isDisposed) {
      return;
    }
    this._holdForFit = false;
    this._draw();
  }

  private _draw(): void {
    const p = this._session.plotted();
    if (!p || !this.isAttached) {
      // Theme colours are read from the attached node; drawn in onAfterAttach.
      return;
    }
    const s = this._session;
    const xs = p.x.column.values as Float64Array;
    const ys = p.y.column.values as Float64Array;
    const outcome = s.outcomeIsCurrent ? s.outcome : null;
    const chart = buildFitOverlayChart({
      x: xs,
      y: ys,
      sigma: p.sigma ? (p.sigma.column.values as Float64Array) : null,
      xTitle: p.x.label,
      yTitle: p.y.label,
      window: outcome ? outcome.window : s.window,
      // The whole range is drawn with no brush, so that a drag draws a new one (inside a brush, a drag moves it).
      emptyBrush: s.windowInput.min === null && s.windowInput.max === null,
      curve: outcome ? outcome.curve : null,
      curveLabel: this._trans.__('fitted model'),
      pointSize: this._pointSize,
      theme: readChartTheme(this.node)
    });
    const { spec, plotted, skipped, reduced } = chart;
    const counts =
      skipped > 0
        ? this._trans.__('%1 points plotted; %2 rows left out (missing or infinite values).', plotted, skipped)
        : this._trans._n('%1 point plotted.', '%1 points plotted.', plotted);
    this._status.node.textContent = reduced
      ? `${counts} ${this._trans.__('%1 of %2 points drawn, keeping the shape; every point is fitted.', reduced.shown, reduced.total)}`
      : counts;
    this._drawCount++;
    this._drawnWithCurve = outcome !== null;
    this._chartDone = this._chart
      .render(spec, this._trans.__('Scatter of %1 against %2. Drag across the chart, or use the arrow keys, to set the fit window.', p.y.label, p.x.label))
      .then(() => this._brush.attach(this._chart.view))
      .then(() => this._sliders.replay())
      .catch(reason => {
        this._status.node.textContent = this._trans.__('The chart could not be drawn: %1', reason instanceof Error ? reason.message : String(reason));
      })
      .then(() => this._exports?.update());
  }

  /** The model at the sliders' values, patched into the drawn chart and residuals (no new spec). */
  private async _previewModel(evaluation: IModelEvaluation): Promise<void> {
    const model = this._sliders.model;
    const view = this._chart.view;
    const drawn: Promise<unknown>[] = [this._checks.previewResiduals(evaluation.residuals)];
    if (view && model) {
      let named = true;
      try {
        view.data(FIT_CURVE_DATA);
      } catch {
        named = false;
      }
      if (named) {
        view.data(FIT_CURVE_DATA, fitCurveRows({ x: model.curveX, y: evaluation.curveY }, this._trans.__('fitted model')));
        drawn.push(view.runAsync());
      }
    }
    await Promise.all(drawn);
  }

  private _renderNotes(table: ITable | null): void {
    const notes = table?.notes ?? [];
    const list = document.createElement('ul');
    for (const note of notes) {
      const item = document.createElement('li');
      item.className = `jp-psiscape-note jp-psiscape-note-${note.kind}`;
      item.textContent = translateMessage(this._trans, note.message);
      list.appendChild(item);
    }
    this._notes.node.replaceChildren(...(notes.length ? [list] : []));
  }

  /** Tab title "M vs T · cell 3 · Weiss": the plotted columns, where the table is, and the analysis kind. */
  private _updateTitle(): void {
    const p = this._session.plotted();
    if (this._mode === 'isotherms') {
      this.title.label = this._trans.__('Isotherms · %1', this._place);
    } else if (p) {
      this.title.label = this._trans.__('%1 vs %2 · %3 · %4', p.y.column.name, p.x.column.name, this._place, this._kindName(this._session.kind));
    }
  }

  /** Short name of an analysis kind for the tab title. */
  private _kindName(kind: string): string {
    const trans = this._trans;
    switch (kind) {
      case 'weiss':
        return trans.__('Weiss');
      case 'power-law':
        return trans.__('power law');
      case 'power-law-corrected':
        return trans.__('power law + correction');
      case 'curie-weiss':
        return trans.__('Curie–Weiss');
      case 'landau':
        return trans.__('Landau');
      case 'expression':
        return trans.__('expression');
      default: {
        const known = kindById(kind);
        return known ? translateMessage(trans, known.label) : kind;
      }
    }
  }

  private _buildHeader(sourceLabel: string): HTMLElement {
    const node = document.createElement('div');
    const label = document.createElement('span');
    label.className = 'jp-psiscape-AnalysisPanel-source';
    label.textContent = sourceLabel;
    node.append(label);
    if (this._onRevealSource) {
      node.append(
        this._button(this._trans.__('Show source cell'), 'jp-mod-reject jp-psiscape-reveal', this._trans.__('Select the notebook cell this table came from and scroll to it'), () => {
          void this._onRevealSource?.();
        })
      );
    }
    if (this._onForget) {
      node.append(
        this._button(this._trans.__('Remove from notebook'), 'jp-mod-reject jp-psiscape-forget', this._trans.__('Delete this analysis from the notebook and close it'), () => this._onForget?.())
      );
    }
    return node;
  }

  private _button(text: string, cls: string, title: string, onClick: () => void): HTMLButtonElement {
    const button = document.createElement('button');
    button.type = 'button';
    button.className = `jp-Button jp-mod-styled ${cls}`;
    button.textContent = text;
    button.title = title;
    button.addEventListener('click', onClick);
    return button;
  }

  /** The two views of the panel as a pair of toggle buttons. */
  private _buildModes(): HTMLElement {
    const node = document.createElement('div');
    node.setAttribute('role', 'group');
    node.setAttribute('aria-label', this._trans.__('What to analyse'));
    const modes: [AnalysisPanel.Mode, string, string][] = [
      ['fit', this._trans.__('Fit y(x)'), this._trans.__('Fit one column against another: temperature sweeps, susceptibility, order parameter')],
      ['isotherms', this._trans.__('Isotherms M(H, T)'), this._trans.__('Analyse field sweeps at several temperatures: Tc and the critical exponents')]
    ];
    for (const [id, text, title] of modes) {
      const button = this._button(text, `jp-psiscape-mode jp-psiscape-mode-${id}`, title, () => this.setMode(id));
      this._modeButtons.set(id, button);
      node.appendChild(button);
    }
    return node;
  }

  private _buildControls(): HTMLElement {
    const node = document.createElement('div');
    const make = (text: string, cls: string, onChange: (value: string) => void): HTMLSelectElement => {
      const label = document.createElement('label');
      label.className = 'jp-psiscape-picker';
      const span = document.createElement('span');
      span.textContent = text;
      const select = document.createElement('select');
      select.className = `jp-mod-styled ${cls}`;
      select.addEventListener('change', () => onChange(select.value));
      label.append(span, select);
      node.appendChild(label);
      return select;
    };
    this._xSelect = make(this._trans.__('x axis'), 'jp-psiscape-x', v => this._session.setRoles({ x: Number(v) }));
    this._ySelect = make(this._trans.__('y axis'), 'jp-psiscape-y', v => this._session.setRoles({ y: Number(v) }));
    this._sSelect = make(this._trans.__('σ of y'), 'jp-psiscape-sigma', v => this._session.setRoles({ sigma: v === '' ? null : Number(v) }));
    return node;
  }

  private _fillPickers(): void {
    const columns: readonly IPlottableColumn[] = this._session.columns;
    const roles = this._session.roles;
    const option = (c: IPlottableColumn, withIndex: boolean): HTMLOptionElement => {
      const o = document.createElement('option');
      o.value = String(c.index);
      o.textContent = withIndex && c.column.isIndex ? this._trans.__('%1 (index)', c.label) : c.label;
      return o;
    };
    // Duplicate headers are told apart by their column number.
    const counts = new Map<string, number>();
    for (const c of columns) {
      counts.set(c.label, (counts.get(c.label) ?? 0) + 1);
    }
    const labelled = (c: IPlottableColumn, withIndex: boolean): HTMLOptionElement => {
      const o = option(c, withIndex);
      if ((counts.get(c.label) ?? 0) > 1) {
        o.textContent = this._trans.__('%1 (column %2)', o.textContent ?? '', c.index + 1);
      }
      return o;
    };
    this._xSelect.replaceChildren(...columns.map(c => labelled(c, true)));
    this._ySelect.replaceChildren(...columns.map(c => labelled(c, true)));
    const none = document.createElement('option');
    none.value = '';
    none.textContent = this._trans.__('none (errors from the scatter)');
    this._sSelect.replaceChildren(none, ...columns.map(c => labelled(c, false)));
    if (roles) {
      this._xSelect.value = String(roles.x);
      this._ySelect.value = String(roles.y);
      this._sSelect.value = roles.sigma === null ? '' : String(roles.sigma);
    }
  }

  private _trans: TranslationBundle;
  private _session: AnalysisSession;
  private _pointSize: number;
  private _notebookName: string;
  private _place: string;
  private _onRevealSource: (() => void | Promise<void>) | null;
  private _onForget: (() => void) | null;
  private _header: Widget;
  private _banner: Widget;
  private _message: Widget;
  private _notes: Widget;
  private _controls: Widget;
  private _chart: ChartView;
  private _brush: WindowBrush;
  private _checks: FitChecks;
  private _sliders: ModelSliders;
  private _comparison: ComparisonView;
  private _scan: WindowScanView;
  private _bootstrap: BootstrapView;
  private _reduced: ReducedPlotView;
  private _inverseChi: InverseChiView;
  private _taskRunners: AnalysisRunner[] = [];
  private _viewsOutcome: IAnalysisOutcome | null = null;
  private _checksToken = 0;
  private _status: Widget;
  private _fit: FitSection;
  private _exports: ExportBar | null;
  private _isotherms: IsothermSection;
  private _modes: Widget;
  private _mode: AnalysisPanel.Mode = 'fit';
  private _modeButtons = new Map<AnalysisPanel.Mode, HTMLButtonElement>();
  private _xSelect!: HTMLSelectElement;
  private _ySelect!: HTMLSelectElement;
  private _sSelect!: HTMLSelectElement;
  private _pending = new Set<SessionChange>();
  private _scheduled = false;
  private _renderDone: Promise<void> = Promise.resolve();
  private _chartDone: Promise<void> = Promise.resolve();
  private _drawCount = 0;
  private _drawnWithCurve = false;
  private _runningDraw: ReturnType<typeof setTimeout> | undefined = undefined;
  private _fitOnShow = false;
  private _holdForFit = false;
  private _isothermTable: ITable | null | undefined = undefined;
  private _holdTimer: ReturnType<typeof setTimeout> | undefined = undefined;
}

/** Options of {@link AnalysisPanel}. */
export namespace AnalysisPanel {
  /** What the panel shows. */
  export type Mode = 'fit' | 'isotherms';

  export interface IOptions {
    /** What to show first (default 'fit'). */
    mode?: Mode;
    session: AnalysisSession;
    /** Short name of the notebook (or file), for the tab title "M vs T · name". */
    notebookName: string;
    /** Where the table is, short, for the tab title: "cell 3", or a file's name; default `notebookName`. */
    place?: string;
    /** Human-readable origin, e.g. "am17-demo.ipynb · cell 3 · output 1" (the tab's caption). */
    sourceLabel: string;
    /** Point area in px² (from settings). */
    pointSize: number;
    translator: ITranslator;
    /** Runs fits (the shared worker-backed runner). */
    runner: AnalysisRunner;
    /** Where exports go (clipboard, files beside the notebook); without it the panel has no export toolbar. */
    exports?: IExportHost;
    /** Select and scroll to the source cell; omitted when the table did not come from a cell (a file). */
    onRevealSource?: () => void | Promise<void>;
    /** Delete the analysis from its notebook (a button shows when given). */
    onForget?: () => void;
    /** Open the Landau explorer with fitted coefficients. */
    onExploreLandau?: (k: ILandauOutcome) => void;
  }
}
