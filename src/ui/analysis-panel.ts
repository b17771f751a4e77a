/**
 * The analysis panel docked beside a notebook: it names the table's source
 * cell (with a control that selects it), lets the user choose x and y columns
 * and draws them. Anything unusable is a message in the panel.
 */
import type { ITranslator, TranslationBundle } from '@jupyterlab/translation';
import type { Message } from '@lumino/messaging';
import { Signal } from '@lumino/signaling';
import type { ISignal } from '@lumino/signaling';
import { Panel, Widget } from '@lumino/widgets';
import { buildFitOverlaySpec } from '../charts/fit-overlay';
import { buildScatterSpec } from '../charts/scatter';
import type { IAnalysisOutcome } from '../core/analysis';
import type { ISavedAnalysis } from '../core/saved';
import type { IColumn, ParseResult, ITable } from '../core/table';
import { splitHeader } from '../core/table';
import { ChartView } from './chart-view';
import { readChartTheme } from './chart-theme';
import type { IPlottableColumn } from './column-choice';
import { defaultPair, guessSigmaColumn, plottableColumns } from './column-choice';
import type { AnalysisRunner } from './analysis-runner';
import { FitSection } from './fit-section';
import type { ILandauOutcome } from './fit-section';
import { IsothermSection } from './isotherm-section';

let panelCount = 0;

/** Panel showing one table taken from a notebook output. */
export class AnalysisPanel extends Panel {
  constructor(options: AnalysisPanel.IOptions) {
    super();
    this._trans = options.translator.load('jupyterlab_psiscape');
    this._pointSize = options.pointSize;
    this._onRevealSource = options.onRevealSource ?? null;
    this._onForget = options.onForget ?? null;
    this.id = `jp-psiscape-analysis-${++panelCount}`;
    this.addClass('jp-psiscape-AnalysisPanel');
    this.node.setAttribute('role', 'region');
    this.node.dataset.sourceState = 'live';
    this.node.setAttribute('aria-label', this._trans.__('Table analysis'));
    this.title.label = this._trans.__('Analysis: %1', options.notebookName);
    this.title.caption = options.sourceLabel;
    this.title.closable = true;

    this._header = new Widget({ node: this._buildHeader(options.sourceLabel) });
    this._header.addClass('jp-psiscape-AnalysisPanel-header');
    this._notes = new Widget();
    this._notes.addClass('jp-psiscape-AnalysisPanel-notes');
    this._controls = new Widget({ node: this._buildControls() });
    this._controls.addClass('jp-psiscape-AnalysisPanel-controls');
    this._chart = new ChartView();
    this._status = new Widget();
    this._status.addClass('jp-psiscape-AnalysisPanel-status');
    this._status.node.setAttribute('aria-live', 'polite');
    this._message = new Widget();
    this._message.addClass('jp-psiscape-AnalysisPanel-message');
    this._message.node.setAttribute('role', 'alert');
    this._banner = new Widget();
    this._banner.addClass('jp-psiscape-AnalysisPanel-banner');
    this._banner.node.setAttribute('role', 'status');
    this._banner.hide();
    this._fit = new FitSection({ trans: this._trans, runner: options.runner, onExploreLandau: options.onExploreLandau });
    this._fit.outcomeChanged.connect(this._onOutcome, this);
    this._isotherms = new IsothermSection({ trans: this._trans });

    for (const w of [this._header, this._banner, this._message, this._notes, this._controls, this._chart, this._status, this._fit, this._isotherms]) {
      this.addWidget(w);
    }
    this.setParseResult(options.parse);
  }

  /** The table on display, or null when the output held none. */
  get table(): ITable | null {
    return this._table;
  }

  /** Indices (into the table's columns) of the plotted x and y columns. */
  get selection(): { x: number; y: number } | null {
    return this._selection;
  }

  /** The chart widget (for tests and for overlays). */
  get chart(): ChartView {
    return this._chart;
  }

  /** Emitted when what would be saved changes: columns picked, a fit finished. */
  get stateChanged(): ISignal<this, void> {
    return this._stateChanged;
  }

  /** What a notebook saves of this analysis (null when there is no table to save). */
  savedState(): Pick<ISavedAnalysis, 'columns' | 'snapshot' | 'fit'> | null {
    const table = this._table;
    const sel = this._selection;
    if (!table || !sel) {
      return null;
    }
    const used = [sel.x, sel.y, ...(this._sigma === null ? [] : [this._sigma])].map(i => table.columns[i]);
    return {
      columns: { x: used[0].header, y: used[1].header, sigma: used[2]?.header ?? null },
      snapshot: {
        headers: used.map(c => c.header),
        units: used.map(c => c.unit),
        values: used.map(c => Array.from(c.values as Float64Array, v => (Number.isFinite(v) ? v : null)))
      },
      fit: this._fit.outcome ? this._fit.controls : null
    };
  }

  /**
   * Show a saved analysis: its columns picked again by header in `result`
   * (the live source output) or, when that is unusable, in the saved
   * snapshot; then its fit controls, and the fit run again.
   *
   * @returns null, or why the saved snapshot is shown instead of the source.
   */
  applySaved(saved: ISavedAnalysis, result: ParseResult | null): string | null {
    let reason: string | null = null;
    const live = result && result.ok ? this._findColumns(result.table, saved.columns) : null;
    if (result && live && result.ok) {
      this.setParseResult(result);
    } else {
      reason = result === null ? null : result.ok ? this._trans.__('the source output no longer has the saved columns') : result.message;
      this.setParseResult({ ok: true, table: snapshotTable(saved, this._trans.__('Data from the copy saved in the notebook (the plotted columns only).')) });
    }
    const found = this._table ? this._findColumns(this._table, saved.columns) : null;
    if (found) {
      this._fillPickers(this._columns, { x: found.x, y: found.y });
      void this.select(found.x, found.y, found.sigma);
    }
    if (saved.fit) {
      this._fit.setControls(saved.fit);
      void this._fit.runFit();
    }
    return reason;
  }

  private _findColumns(table: ITable, columns: ISavedAnalysis['columns']): { x: number; y: number; sigma: number | null } | null {
    const idx = (h: string) => table.columns.findIndex(c => c.header === h && c.kind === 'number');
    const x = idx(columns.x);
    const y = idx(columns.y);
    const sigma = columns.sigma === null ? null : idx(columns.sigma);
    return x < 0 || y < 0 || sigma === -1 ? null : { x, y, sigma };
  }

  /** The isotherm (field sweep) analysis. */
  get isothermSection(): IsothermSection {
    return this._isotherms;
  }

  /** The fit controls and results. */
  get fitSection(): FitSection {
    return this._fit;
  }

  /** Resolves when the latest chart has been drawn. */
  get rendered(): Promise<void> {
    return this._rendered;
  }

  /** Show a new parse result (a table or a message). */
  setParseResult(result: ParseResult): void {
    this._isotherms.setTable(result.ok ? result.table : null);
    if (!result.ok) {
      this._table = null;
      this._selection = null;
      this._showMessage(result.message);
      return;
    }
    const table = result.table;
    const columns = plottableColumns(table);
    const pair = defaultPair(columns);
    if (!pair) {
      this._table = table;
      this._selection = null;
      this._showMessage(
        this._trans.__('This table has fewer than two numeric columns, so there is nothing to plot.')
      );
      return;
    }
    this._table = table;
    this._columns = columns;
    this._message.node.textContent = '';
    this._message.hide();
    this._controls.show();
    this._chart.show();
    this._fit.show();
    this._renderNotes(table);
    this._fillPickers(columns, pair);
    this.select(pair.x, pair.y);
  }

  /**
   * Plot column `y` against column `x` (indices into the table's columns).
   *
   * @throws RangeError when either column is not numeric.
   */
  select(x: number, y: number, sigma: number | null = guessSigmaColumn(this._columns, y), keepWindow = false): Promise<void> {
    const table = this._table;
    const cx = this._columns.find(c => c.index === x);
    const cy = this._columns.find(c => c.index === y);
    if (!table || !cx || !cy) {
      throw new RangeError(`columns ${x} and ${y} are not both numeric columns of the table`);
    }
    const cs = sigma === null ? undefined : this._columns.find(c => c.index === sigma);
    this._selection = { x, y };
    this._sigma = cs ? cs.index : null;
    this._xSelect.value = String(x);
    this._ySelect.value = String(y);
    this._sSelect.value = cs ? String(cs.index) : '';
    this._stateChanged.emit();
    this._fit.setInput({
      x: Array.from(cx.column.values as Float64Array),
      y: Array.from(cy.column.values as Float64Array),
      sigma: cs ? Array.from(cs.column.values as Float64Array) : undefined
    }, keepWindow);
    return this._draw();
  }

  /**
   * Take a new parse of the source output (the cell was re-run). The plotted
   * columns are found again by header; the fit window is kept and a previous
   * fit is run again on the new data.
   *
   * @returns null when applied, else why not (the panel keeps its last data).
   */
  refreshFromSource(result: ParseResult): string | null {
    if (!result.ok) {
      return result.message;
    }
    const old = this._table;
    const sel = this._selection;
    if (!old || !sel) {
      this.setParseResult(result);
      return null;
    }
    const header = (i: number | null) => (i === null ? null : old.columns[i].header);
    const wanted = [header(sel.x), header(sel.y), header(this._sigma)];
    const columns = plottableColumns(result.table);
    const find = (h: string | null) => (h === null ? null : (columns.find(c => c.column.header === h)?.index ?? -1));
    const [x, y, sigma] = wanted.map(find);
    const missing = wanted.filter((h, i) => h !== null && [x, y, sigma][i] === -1);
    if (missing.length) {
      return this._trans.__('the source output no longer has the column(s) %1', missing.join(', '));
    }
    const refit = this._fit.outcome !== null;
    const reanalyse = this._isotherms.analysis !== null;
    this._isotherms.setTable(result.table);
    if (reanalyse) {
      this._isotherms.run();
    }
    this._table = result.table;
    this._columns = columns;
    this._renderNotes(result.table);
    this._fillPickers(columns, { x: x!, y: y! });
    void this.select(x!, y!, sigma, true);
    if (refit) {
      void this._fit.runFit();
    }
    return null;
  }

  /**
   * Say how the panel relates to its source: live (nothing shown), or a
   * message when the data are a kept snapshot (stale or source lost).
   */
  setSourceState(state: 'live' | 'stale' | 'lost' | 'waiting', message = ''): void {
    this._sourceState = state;
    this.node.dataset.sourceState = state;
    if (state === 'live') {
      this._banner.node.textContent = '';
      this._banner.hide();
    } else {
      this._banner.node.textContent = message;
      this._banner.show();
    }
  }

  /** How the panel relates to its source. */
  get sourceState(): 'live' | 'stale' | 'lost' | 'waiting' {
    return this._sourceState;
  }

  /** Index of the column used as σ of y, or null. */
  get sigmaColumn(): number | null {
    return this._sigma;
  }

  private _draw(): Promise<void> {
    const cx = this._columns.find(c => c.index === this._selection?.x);
    const cy = this._columns.find(c => c.index === this._selection?.y);
    if (!cx || !cy || !this.isAttached) {
      // Theme colours are read from the attached node; drawn in onAfterAttach.
      return this._rendered;
    }
    const xs = cx.column.values as Float64Array;
    const ys = cy.column.values as Float64Array;
    const theme = readChartTheme(this.node);
    const outcome = this._fit.outcome;
    let plotted = 0;
    let skipped = 0;
    let spec;
    if (outcome) {
      spec = buildFitOverlaySpec({
        x: xs,
        y: ys,
        xTitle: cx.label,
        yTitle: cy.label,
        window: outcome.window,
        curve: outcome.curve,
        curveLabel: this._trans.__('fitted model'),
        pointSize: this._pointSize,
        theme
      });
      for (let i = 0; i < xs.length; i++) {
        if (Number.isFinite(xs[i]) && Number.isFinite(ys[i])) {
          plotted++;
        } else {
          skipped++;
        }
      }
    } else {
      ({ spec, plotted, skipped } = buildScatterSpec({
        x: xs,
        y: ys,
        xTitle: cx.label,
        yTitle: cy.label,
        pointSize: this._pointSize,
        theme
      }));
    }
    this._status.node.textContent =
      skipped > 0
        ? this._trans.__('%1 points plotted; %2 rows left out (missing or infinite values).', plotted, skipped)
        : this._trans._n('%1 point plotted.', '%1 points plotted.', plotted);
    this._rendered = this._chart
      .render(spec, this._trans.__('Scatter of %1 against %2', cy.label, cx.label))
      .catch(reason => {
        this._showMessage(this._trans.__('The chart could not be drawn: %1', String(reason)));
      });
    return this._rendered;
  }

  private _onOutcome(_sender: FitSection, _outcome: IAnalysisOutcome | null): void {
    void this._draw();
    this._stateChanged.emit();
  }

  /** Redraw with the current selection (after a theme change, say). */
  redraw(): void {
    void this._draw();
    this._isotherms.redraw();
  }

  dispose(): void {
    if (this.isDisposed) {
      return;
    }
    this._fit.outcomeChanged.disconnect(this._onOutcome, this);
    super.dispose();
  }

  protected onAfterAttach(msg: Message): void {
    super.onAfterAttach(msg);
    this.redraw();
  }

  private _showMessage(text: string): void {
    this._message.node.textContent = text;
    this._message.show();
    this._controls.hide();
    this._chart.clear();
    this._chart.hide();
    this._fit.setInput(null);
    this._fit.hide();
    this._status.node.textContent = '';
    this._notes.node.textContent = '';
  }

  private _renderNotes(table: ITable): void {
    const list = document.createElement('ul');
    for (const note of table.notes) {
      const item = document.createElement('li');
      item.className = `jp-psiscape-note jp-psiscape-note-${note.kind}`;
      item.textContent = note.message;
      list.appendChild(item);
    }
    this._notes.node.replaceChildren(...(table.notes.length ? [list] : []));
  }

  private _buildHeader(sourceLabel: string): HTMLElement {
    const node = document.createElement('div');
    const label = document.createElement('span');
    label.className = 'jp-psiscape-AnalysisPanel-source';
    label.textContent = sourceLabel;
    node.append(label);
    if (this._onForget) {
      const forget = document.createElement('button');
      forget.type = 'button';
      forget.className = 'jp-Button jp-mod-styled jp-mod-reject jp-psiscape-forget';
      forget.textContent = this._trans.__('Remove from notebook');
      forget.title = this._trans.__('Delete this analysis from the notebook and close it');
      forget.addEventListener('click', () => this._onForget?.());
      node.append(forget);
    }
    if (!this._onRevealSource) {
      return node;
    }
    const button = document.createElement('button');
    button.type = 'button';
    button.className = 'jp-Button jp-mod-styled jp-mod-reject jp-psiscape-reveal';
    button.textContent = this._trans.__('Show source cell');
    button.title = this._trans.__('Select the notebook cell this table came from and scroll to it');
    button.addEventListener('click', () => {
      void this._onRevealSource?.();
    });
    node.append(button);
    return node;
  }

  private _buildControls(): HTMLElement {
    const node = document.createElement('div');
    const make = (text: string, cls: string): HTMLSelectElement => {
      const label = document.createElement('label');
      label.className = 'jp-psiscape-picker';
      const span = document.createElement('span');
      span.textContent = text;
      const select = document.createElement('select');
      select.className = `jp-mod-styled ${cls}`;
      select.addEventListener('change', () => {
        const s = this._sSelect.value;
        const ySelectChanged = select === this._ySelect;
        void this.select(
          Number(this._xSelect.value),
          Number(this._ySelect.value),
          ySelectChanged ? guessSigmaColumn(this._columns, Number(this._ySelect.value)) : s === '' ? null : Number(s)
        );
      });
      label.append(span, select);
      node.appendChild(label);
      return select;
    };
    this._xSelect = make(this._trans.__('x axis'), 'jp-psiscape-x');
    this._ySelect = make(this._trans.__('y axis'), 'jp-psiscape-y');
    this._sSelect = make(this._trans.__('σ of y'), 'jp-psiscape-sigma');
    return node;
  }

  private _fillPickers(columns: IPlottableColumn[], pair: { x: number; y: number }): void {
    for (const select of [this._xSelect, this._ySelect]) {
      select.replaceChildren(
        ...columns.map(c => {
          const option = document.createElement('option');
          option.value = String(c.index);
          option.textContent = c.column.isIndex ? this._trans.__('%1 (index)', c.label) : c.label;
          return option;
        })
      );
    }
    const none = document.createElement('option');
    none.value = '';
    none.textContent = this._trans.__('none (errors from the scatter)');
    this._sSelect.replaceChildren(
      none,
      ...columns.map(c => {
        const option = document.createElement('option');
        option.value = String(c.index);
        option.textContent = c.label;
        return option;
      })
    );
    this._xSelect.value = String(pair.x);
    this._ySelect.value = String(pair.y);
  }

  private _trans: TranslationBundle;
  private _pointSize: number;
  private _onRevealSource: (() => void | Promise<void>) | null;
  private _onForget: (() => void) | null;
  private _header: Widget;
  private _notes: Widget;
  private _controls: Widget;
  private _chart: ChartView;
  private _status: Widget;
  private _message: Widget;
  private _xSelect!: HTMLSelectElement;
  private _ySelect!: HTMLSelectElement;
  private _sSelect!: HTMLSelectElement;
  private _sigma: number | null = null;
  private _banner: Widget;
  private _stateChanged = new Signal<this, void>(this);
  private _sourceState: 'live' | 'stale' | 'lost' | 'waiting' = 'live';
  private _fit: FitSection;
  private _isotherms: IsothermSection;
  private _table: ITable | null = null;
  private _columns: IPlottableColumn[] = [];
  private _selection: { x: number; y: number } | null = null;
  private _rendered: Promise<void> = Promise.resolve();
}

/** Options of {@link AnalysisPanel}. */
export namespace AnalysisPanel {
  export interface IOptions {
    /** Result of parsing the source output. */
    parse: ParseResult;
    /** Short name of the notebook (or file) for the tab title. */
    notebookName: string;
    /** Human-readable origin, e.g. "am17-demo.ipynb · cell 3 · output 1". */
    sourceLabel: string;
    /** Point area in px² (from settings). */
    pointSize: number;
    translator: ITranslator;
    /** Select and scroll to the source cell; omitted when the table did not come from a cell (a file). */
    onRevealSource?: () => void | Promise<void>;
    /** Delete the analysis from its notebook (a button shows when given). */
    onForget?: () => void;
    /** Runs fits (a worker-backed runner by default). */
    runner?: AnalysisRunner;
    /** Open the Landau explorer with fitted coefficients. */
    onExploreLandau?: (k: ILandauOutcome) => void;
  }
}

/** A table made from a saved snapshot (the plotted columns as last seen). */
export function snapshotTable(saved: ISavedAnalysis, note: string): ITable {
  const { headers, values } = saved.snapshot;
  const columns: IColumn[] = headers.map((header, i) => {
    const { name, unit } = splitHeader(header);
    return {
      name,
      unit: saved.snapshot.units[i] ?? unit,
      header,
      kind: 'number',
      isIndex: false,
      values: Float64Array.from(values[i], v => (v === null ? Number.NaN : v))
    };
  });
  return {
    columns,
    rowCount: values[0]?.length ?? 0,
    format: 'json',
    notes: [{ kind: 'info', message: note }]
  };
}
