/**
 * The fit controls of the analysis panel: model, model options, fit window,
 * Fit / Cancel with progress, and the result (values with standard errors,
 * convergence, warnings and cautions).
 */
import type { TranslationBundle } from '@jupyterlab/translation';
import { Signal } from '@lumino/signaling';
import type { ISignal } from '@lumino/signaling';
import { Widget } from '@lumino/widgets';
import type { AnalysisModel, IAnalysisJob, IAnalysisOutcome } from '../core/analysis';
import { formatPlain, formatWithError, parseStarts } from '../core/analysis';
import type { ISavedFit } from '../core/saved';
import { AnalysisCancelled, AnalysisRunner } from './analysis-runner';
import { outcomeNodes } from './outcome-nodes';

/** Landau coefficients of a fit (convention L). */
export type ILandauOutcome = NonNullable<IAnalysisOutcome['landau']>;

/** The data a fit runs on. */
export interface IFitInput {
  x: number[];
  y: number[];
  sigma?: number[];
}

const SPINS: [string, number][] = [
  ['½', 0.5],
  ['1', 1],
  ['3/2', 1.5],
  ['2', 2],
  ['5/2', 2.5],
  ['7/2', 3.5],
  ['∞ (Langevin)', Infinity]
];

/** Fit controls and results. */
export class FitSection extends Widget {
  constructor(options: FitSection.IOptions) {
    super();
    this._trans = options.trans;
    this._runner = options.runner ?? new AnalysisRunner();
    this._onExploreLandau = options.onExploreLandau ?? null;
    this.addClass('jp-psiscape-FitSection');
    this.node.setAttribute('role', 'group');
    this.node.setAttribute('aria-label', this._trans.__('Fit'));
    this._build();
  }

  /** Emitted when a fit finishes (outcome) or the data change (null). */
  get outcomeChanged(): ISignal<this, IAnalysisOutcome | null> {
    return this._outcomeChanged;
  }

  /** The latest outcome, or null. */
  get outcome(): IAnalysisOutcome | null {
    return this._outcome;
  }

  /** The fit window currently entered (falls back to the data range). */
  get window(): { min: number; max: number } {
    const min = Number(this._min.value);
    const max = Number(this._max.value);
    return {
      min: this._min.value.trim() === '' || !Number.isFinite(min) ? this._range.min : min,
      max: this._max.value.trim() === '' || !Number.isFinite(max) ? this._range.max : max
    };
  }

  /** Resolves when the running fit (if any) has settled. */
  get settled(): Promise<void> {
    return this._settled;
  }

  /**
   * New data: clears the result and, unless `keepWindow`, resets the window
   * to the data range (new columns) — a refreshed source keeps the user's window.
   */
  setInput(input: IFitInput | null, keepWindow = false): void {
    this._runner.cancel();
    this._input = input;
    let min = Infinity;
    let max = -Infinity;
    for (const v of input?.x ?? []) {
      if (Number.isFinite(v)) {
        min = Math.min(min, v);
        max = Math.max(max, v);
      }
    }
    this._range = { min, max };
    if (!keepWindow) {
      this._min.value = Number.isFinite(min) ? formatPlain(min) : '';
      this._max.value = Number.isFinite(max) ? formatPlain(max) : '';
    }
    this._setOutcome(null);
    this._status.textContent = '';
  }

  /** Choose a model programmatically (as the picker does). */
  setModel(model: AnalysisModel): void {
    this._model.value = model;
    this._syncOptions();
  }

  /** Run the fit with the current controls. */
  runFit(): Promise<void> {
    if (!this._input) {
      this._status.textContent = this._trans.__('Choose x and y columns first.');
      return Promise.resolve();
    }
    let job: IAnalysisJob;
    let starts: Record<string, number> = {};
    try {
      job = this._job(this._input);
      if (job.model === 'expression') {
        starts = parseStarts(this._starts.value);
      }
    } catch (e) {
      this._fail((e as Error).message);
      return Promise.resolve();
    }
    this._fitButton.disabled = true;
    this._cancelButton.disabled = false;
    this._status.textContent = this._trans.__('Fitting…');
    this._settled = this._runner
      .run(job, starts, p => {
        this._status.textContent = this._trans.__('Fitting… iteration %1, %2 evaluations, χ² %3', p.iteration, p.evaluations, formatPlain(2 * p.cost));
      })
      .then(
        outcome => {
          this._status.textContent = '';
          this._setOutcome(outcome);
        },
        reason => {
          if (reason instanceof AnalysisCancelled) {
            this._status.textContent = this._trans.__('Fit cancelled; the previous result is kept.');
          } else {
            this._fail((reason as Error).message);
          }
        }
      )
      .finally(() => {
        this._fitButton.disabled = false;
        this._cancelButton.disabled = true;
      });
    return this._settled;
  }

  /** The controls as saved in a notebook. */
  get controls(): ISavedFit {
    const job = this._job({ x: [], y: [] });
    return { model: job.model, options: job.options, window: job.window, starts: this._starts.value };
  }

  /** Set the controls from a saved analysis (does not run the fit). */
  setControls(c: ISavedFit): void {
    this.setModel(c.model);
    this._min.value = Number.isFinite(c.window.min) ? formatPlain(c.window.min) : '';
    this._max.value = Number.isFinite(c.window.max) ? formatPlain(c.window.max) : '';
    if (c.options.J !== undefined) {
      this._spin.value = String(c.options.J);
    }
    if (c.options.proxyPower !== undefined) {
      this._proxy.value = String(c.options.proxyPower);
    }
    this._background.checked = c.options.background === true;
    if (c.options.units) {
      this._units.value = c.options.units;
    }
    this._expression.value = c.options.expression ?? '';
    this._starts.value = c.starts;
  }

  /** Cancel a running fit. */
  cancel(): void {
    this._runner.cancel();
  }

  dispose(): void {
    if (this.isDisposed) {
      return;
    }
    this._runner.dispose();
    super.dispose();
  }

  private _job(input: IFitInput): IAnalysisJob {
    const model = this._model.value as AnalysisModel;
    return {
      model,
      x: input.x,
      y: input.y,
      sigma: input.sigma,
      window: this.window,
      options: {
        J: Number(this._spin.value),
        proxyPower: Number(this._proxy.value),
        background: this._background.checked,
        units: this._units.value === 'SI' ? 'SI' : 'cgs-emu',
        expression: this._expression.value
      }
    };
  }

  private _fail(message: string): void {
    this._status.textContent = '';
    this._error.textContent = this._trans.__('The fit could not run: %1', message);
    this._error.hidden = false;
  }

  private _setOutcome(outcome: IAnalysisOutcome | null): void {
    this._outcome = outcome;
    this._error.hidden = true;
    this._renderResult(outcome);
    this._outcomeChanged.emit(outcome);
  }

  private _renderResult(outcome: IAnalysisOutcome | null): void {
    const box = this._result;
    box.replaceChildren();
    if (!outcome) {
      return;
    }
    const fit = outcome.fit;
    const head = document.createElement('p');
    head.className = fit.converged ? 'jp-psiscape-fit-ok' : 'jp-psiscape-fit-warn';
    head.textContent = fit.converged
      ? this._trans.__('Converged (%1). %2 points fitted, χ²_red = %3.', fit.reason, outcome.used, formatPlain(fit.reducedChi2))
      : this._trans.__('Not converged: %1. The values below are the best found so far; do not quote them.', fit.reason);
    const equation = document.createElement('p');
    equation.className = 'jp-psiscape-fit-equation';
    equation.textContent = outcome.equation;

    const table = document.createElement('table');
    table.className = 'jp-psiscape-fit-table';
    const caption = document.createElement('caption');
    caption.textContent =
      fit.errorScaling === 'from-sigma'
        ? this._trans.__('Standard errors from the σ column (not rescaled).')
        : this._trans.__('Standard errors scaled by √χ²_red (no σ column given).');
    table.appendChild(caption);
    const header = table.createTHead().insertRow();
    for (const text of [this._trans.__('parameter'), this._trans.__('value ± standard error'), this._trans.__('%1 % interval', formatPlain(100 * fit.confidenceLevel))]) {
      const th = document.createElement('th');
      th.scope = 'col';
      th.textContent = text;
      header.appendChild(th);
    }
    const body = table.createTBody();
    fit.parameters.forEach((name, i) => {
      const row = body.insertRow();
      const [lo, hi] = fit.confidenceIntervals[i];
      for (const text of [name, formatWithError(fit.values[i], fit.standardErrors[i]), `${formatPlain(lo)} … ${formatPlain(hi)}`]) {
        row.insertCell().textContent = text;
      }
    });
    // Derived values that repeat a parameter (same name, or the same value and error) are not shown twice.
    const repeats = (d: { name: string; value: number; sigma: number }): boolean =>
      fit.parameters.some((name, i) => name === d.name || (fit.values[i] === d.value && fit.standardErrors[i] === d.sigma));
    for (const d of outcome.derived.filter(d => !repeats(d))) {
      const row = body.insertRow();
      row.className = 'jp-psiscape-fit-derived';
      for (const text of [d.name, formatWithError(d.value, d.sigma), d.note]) {
        row.insertCell().textContent = text;
      }
    }
    const notes = document.createElement('ul');
    notes.className = 'jp-psiscape-fit-notes';
    for (const w of fit.warnings) {
      const li = document.createElement('li');
      li.className = 'jp-psiscape-fit-warning';
      li.textContent = w;
      notes.appendChild(li);
    }
    for (const c of outcome.cautions) {
      const li = document.createElement('li');
      li.textContent = c;
      notes.appendChild(li);
    }
    if (outcome.skipped > 0) {
      const li = document.createElement('li');
      li.textContent = this._trans._n('%1 row in the window was left out for a missing value.', '%1 rows in the window were left out for missing values.', outcome.skipped);
      notes.appendChild(li);
    }
    const convention = document.createElement('p');
    convention.className = 'jp-psiscape-fit-convention';
    convention.textContent = this._trans.__('Convention: %1', outcome.convention);
    box.append(head, equation, table, notes, convention);
    const landau = outcome.landau;
    if (landau && this._onExploreLandau) {
      const explore = document.createElement('button');
      explore.type = 'button';
      explore.className = 'jp-Button jp-mod-styled jp-mod-accept jp-psiscape-fit-explore';
      explore.textContent = this._trans.__('Explore these coefficients');
      explore.title = this._trans.__('Open the Landau free-energy explorer with the fitted coefficients');
      explore.addEventListener('click', () => this._onExploreLandau?.(landau));
      box.append(explore);
    }
  }

  private _build(): void {
    const node = this.node;
    const heading = document.createElement('h3');
    heading.textContent = this._trans.__('Fit');
    const row1 = document.createElement('div');
    row1.className = 'jp-psiscape-fit-row';
    this._model = this._select('jp-psiscape-fit-model', [
      ['power-law', this._trans.__('Critical power law A(1 − T/Tc)^β')],
      ['weiss', this._trans.__('Weiss mean field M(T)')],
      ['curie-weiss', this._trans.__('Curie–Weiss χ0 + C/(T − θ)')],
      ['landau', this._trans.__('Landau 2-4-6 coefficients from ψ(T)')],
      ['expression', this._trans.__('Your expression in x')]
    ]);
    row1.append(this._label(this._trans.__('model'), this._model));

    this._proxy = this._select('jp-psiscape-fit-proxy', [
      ['1', this._trans.__('y ∝ ψ (magnetisation, polarisation)')],
      ['2', this._trans.__('y ∝ ψ² (intensity, SHG, superfluid density)')]
    ]);
    this._background = document.createElement('input');
    this._background.type = 'checkbox';
    this._background.className = 'jp-psiscape-fit-background';
    this._spin = this._select('jp-psiscape-fit-spin', SPINS.map(([label, J]) => [String(J), label]));
    this._units = this._select('jp-psiscape-fit-units', [
      ['cgs-emu', this._trans.__('cgs molar (emu mol⁻¹ Oe⁻¹)')],
      ['SI', this._trans.__('SI molar (m³ mol⁻¹)')]
    ]);
    this._expression = this._text('jp-psiscape-fit-expression', 'A*exp(-x/T0) + c');
    this._starts = this._text('jp-psiscape-fit-starts', 'A = 1, T0 = 100');
    this._optionRows = {
      'power-law': [this._label(this._trans.__('data'), this._proxy), this._label(this._trans.__('constant background'), this._background)],
      weiss: [this._label(this._trans.__('spin J'), this._spin)],
      'curie-weiss': [this._label(this._trans.__('χ units'), this._units)],
      landau: [],
      expression: [this._label(this._trans.__('y ='), this._expression), this._label(this._trans.__('start values'), this._starts)]
    };
    const options = document.createElement('div');
    options.className = 'jp-psiscape-fit-row jp-psiscape-fit-options';
    for (const rows of Object.values(this._optionRows)) {
      options.append(...rows);
    }

    const row2 = document.createElement('div');
    row2.className = 'jp-psiscape-fit-row';
    this._min = this._text('jp-psiscape-fit-min', '');
    this._max = this._text('jp-psiscape-fit-max', '');
    this._min.inputMode = this._max.inputMode = 'decimal';
    this._windowLabel = this._label(this._trans.__('fit window: x from'), this._min);
    row2.append(this._windowLabel, this._label(this._trans.__('to'), this._max));

    const row3 = document.createElement('div');
    row3.className = 'jp-psiscape-fit-row';
    this._fitButton = this._button(this._trans.__('Fit'), 'jp-mod-accept jp-psiscape-fit-run', () => void this.runFit());
    this._cancelButton = this._button(this._trans.__('Cancel'), 'jp-mod-reject jp-psiscape-fit-cancel', () => this.cancel());
    this._cancelButton.disabled = true;
    this._status = document.createElement('span');
    this._status.className = 'jp-psiscape-fit-status';
    this._status.setAttribute('aria-live', 'polite');
    row3.append(this._fitButton, this._cancelButton, this._status);

    ({ error: this._error, result: this._result } = outcomeNodes());
    node.append(heading, row1, options, row2, row3, this._error, this._result);
    this._model.addEventListener('change', () => this._syncOptions());
    this._syncOptions();
  }

  private _syncOptions(): void {
    const model = this._model.value as AnalysisModel;
    for (const [key, rows] of Object.entries(this._optionRows)) {
      for (const row of rows) {
        row.hidden = key !== model;
      }
    }
  }

  private _label(text: string, control: HTMLElement): HTMLLabelElement {
    const label = document.createElement('label');
    label.className = 'jp-psiscape-picker';
    const span = document.createElement('span');
    span.textContent = text;
    label.append(span, control);
    return label;
  }

  private _select(cls: string, options: [string, string][]): HTMLSelectElement {
    const select = document.createElement('select');
    select.className = `jp-mod-styled ${cls}`;
    for (const [value, text] of options) {
      const option = document.createElement('option');
      option.value = value;
      option.textContent = text;
      select.appendChild(option);
    }
    return select;
  }

  private _text(cls: string, placeholder: string): HTMLInputElement {
    const input = document.createElement('input');
    input.type = 'text';
    input.className = `jp-mod-styled ${cls}`;
    input.placeholder = placeholder;
    input.spellcheck = false;
    return input;
  }

  private _button(text: string, cls: string, onClick: () => void): HTMLButtonElement {
    const button = document.createElement('button');
    button.type = 'button';
    button.className = `jp-Button jp-mod-styled ${cls}`;
    button.textContent = text;
    button.addEventListener('click', onClick);
    return button;
  }

  private _trans: TranslationBundle;
  private _runner: AnalysisRunner;
  private _onExploreLandau: ((k: ILandauOutcome) => void) | null;
  private _outcomeChanged = new Signal<this, IAnalysisOutcome | null>(this);
  private _outcome: IAnalysisOutcome | null = null;
  private _input: IFitInput | null = null;
  private _range = { min: Number.NaN, max: Number.NaN };
  private _settled: Promise<void> = Promise.resolve();
  private _model!: HTMLSelectElement;
  private _proxy!: HTMLSelectElement;
  private _background!: HTMLInputElement;
  private _spin!: HTMLSelectElement;
  private _units!: HTMLSelectElement;
  private _expression!: HTMLInputElement;
  private _starts!: HTMLInputElement;
  private _optionRows!: Record<AnalysisModel, HTMLElement[]>;
  private _min!: HTMLInputElement;
  private _max!: HTMLInputElement;
  private _windowLabel!: HTMLLabelElement;
  private _fitButton!: HTMLButtonElement;
  private _cancelButton!: HTMLButtonElement;
  private _status!: HTMLSpanElement;
  private _error!: HTMLParagraphElement;
  private _result!: HTMLDivElement;
}

/** Options of {@link FitSection}. */
export namespace FitSection {
  export interface IOptions {
    trans: TranslationBundle;
    /** Job runner (a worker-backed one by default). */
    runner?: AnalysisRunner;
    /** Open the Landau explorer with fitted coefficients (a button shows when given). */
    onExploreLandau?: (k: ILandauOutcome) => void;
  }
}
