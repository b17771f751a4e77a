/**
 * The fit part of the analysis panel. It renders an {@link AnalysisSession}
 * and sends it the user's choices: the analysis kind and its options (built
 * from the catalogue), the fit window, Fit and Cancel. The result shows the
 * verdict first (fits / converged but does not describe the data / did not
 * converge), then values with standard errors, derived values, warnings,
 * cautions and the convention used.
 */
import type { TranslationBundle } from '@jupyterlab/translation';
import { Widget } from '@lumino/widgets';
import { ANALYSIS_KINDS, formatPlain, kindById } from '../core/analysis';
import type { IAnalysisOutcome, OptionSpec, OptionValue } from '../core/analysis';
import type { AnalysisSession } from '../core/analysis/session';
import { inspectExpression, variableNamesFromHeader } from '../core/expr';
import type { AnalysisRunner } from './analysis-runner';
import { runSessionFit } from './fit-run';
import { renderOutcome } from './fit-result';
import { outcomeNodes } from './outcome-nodes';
import { translateMessage } from './translate';

/** Landau coefficients of a fit (convention L). */
export type ILandauOutcome = NonNullable<IAnalysisOutcome['landau']>;

/** Fit controls and results of one session. */
export class FitSection extends Widget {
  constructor(options: FitSection.IOptions) {
    super();
    this._trans = options.trans;
    this._session = options.session;
    this._runner = options.runner;
    this._onExploreLandau = options.onExploreLandau ?? null;
    this.addClass('jp-psiscape-FitSection');
    this.node.setAttribute('role', 'group');
    this.node.setAttribute('aria-label', this._trans.__('Fit'));
    this._build();
    // The analysis worker starts on the way to the first fit: when the pointer
    // or the keyboard focus first reaches the fit controls (or with the fit).
    const warm = (): void => {
      this.node.removeEventListener('pointerenter', warm);
      this.node.removeEventListener('focusin', warm);
      this._runner.warm();
    };
    this.node.addEventListener('pointerenter', warm);
    this.node.addEventListener('focusin', warm);
  }

  /** The session shown. */
  get session(): AnalysisSession {
    return this._session;
  }

  /** Resolves when the running fit (if any) has settled. */
  get settled(): Promise<void> {
    return this._settled;
  }

  /** Run the fit with the session's controls (as the Fit button does). */
  runFit(): Promise<void> {
    this._settled = runSessionFit(this._session, this._runner);
    return this._settled;
  }

  /** Cancel a running fit (its best values so far are kept, marked as such). */
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

  /** Show the session's current state. */
  render(): void {
    const s = this._session;
    const trans = this._trans;
    if (this._kindSelect.value !== s.kind) {
      this._kindSelect.value = s.kind;
    }
    if (this._optionsKind !== s.kind) {
      this._buildOptions();
    } else {
      this._syncOptionValues();
    }
    const kind = kindById(s.kind);
    this._description.textContent = kind ? translateMessage(trans, kind.description) : '';
    const range = s.xRange();
    const w = s.windowInput;
    for (const [input, value, fallback] of [
      [this._min, w.min, range.min],
      [this._max, w.max, range.max]
    ] as const) {
      if (document.activeElement !== input) {
        input.value = value === null ? '' : formatPlain(value);
        input.placeholder = Number.isFinite(fallback) ? formatPlain(fallback) : '';
        input.removeAttribute('aria-invalid');
      }
    }
    const weights = s.weights;
    if (document.activeElement !== this._weights) {
      this._weights.value = weights?.mode ?? '';
    }
    if (document.activeElement !== this._fraction) {
      this._fraction.value = weights?.fraction != null ? formatPlain(weights.fraction) : '';
    }
    this._fractionLabel.hidden = (weights?.mode ?? '') !== 'relative';
    const sigmaOption = this._weights.querySelector<HTMLOptionElement>('option[value="sigma"]');
    if (sigmaOption) {
      sigmaOption.disabled = !s.plotted()?.sigma;
    }
    const run = s.run;
    const running = run.phase === 'running';
    this._fitButton.disabled = running || s.plotted() === null;
    this._cancelButton.disabled = !running;
    this.node.dataset.runPhase = run.phase;
    this._status.textContent =
      run.phase === 'running'
        ? run.progress
          ? trans.__('Fitting… iteration %1, %2 evaluations, χ² %3', run.progress.iteration, run.progress.evaluations, formatPlain(run.progress.cost))
          : trans.__('Fitting…')
        : '';
    if (run.phase === 'failed') {
      this._error.textContent = trans.__('The fit could not run: %1', translateMessage(trans, run.error));
      this._error.hidden = false;
    } else if (run.phase === 'cancelled') {
      this._error.textContent = run.best
        ? trans.__('Stopped by you after %1 iterations. Best values so far (no uncertainties, not a fit result): %2; χ² %3.', run.best.iteration, run.best.parameters.map((p, i) => `${p} = ${formatPlain(run.best!.values[i])}`).join(', '), formatPlain(run.best.chi2))
        : trans.__('Stopped by you before the first iteration finished.');
      this._error.hidden = false;
    } else {
      this._error.hidden = true;
    }
    renderOutcome(this._result, {
      trans,
      outcome: s.outcome,
      current: s.outcomeIsCurrent,
      running,
      currentKind: s.kind,
      onExploreLandau: this._onExploreLandau,
      units: { x: s.plotted()?.x.column.unit ?? null, y: s.plotted()?.y.column.unit ?? null }
    });
  }

  private _build(): void {
    const trans = this._trans;
    const heading = document.createElement('h3');
    heading.textContent = trans.__('Fit');
    const row1 = document.createElement('div');
    row1.className = 'jp-psiscape-fit-row';
    this._kindSelect = document.createElement('select');
    this._kindSelect.className = 'jp-mod-styled jp-psiscape-fit-kind';
    for (const kind of ANALYSIS_KINDS) {
      const option = document.createElement('option');
      option.value = kind.id;
      option.textContent = translateMessage(trans, kind.label);
      this._kindSelect.appendChild(option);
    }
    this._kindSelect.addEventListener('change', () => this._session.setKind(this._kindSelect.value));
    row1.append(label(trans.__('analysis'), this._kindSelect));
    this._description = document.createElement('p');
    this._description.className = 'jp-psiscape-fit-description';

    this._options = document.createElement('div');
    this._options.className = 'jp-psiscape-fit-row jp-psiscape-fit-options';

    const row2 = document.createElement('div');
    row2.className = 'jp-psiscape-fit-row';
    this._min = textInput('jp-psiscape-fit-min');
    this._max = textInput('jp-psiscape-fit-max');
    this._min.inputMode = this._max.inputMode = 'decimal';
    this._windowMessage = document.createElement('span');
    this._windowMessage.className = 'jp-psiscape-fit-window-message';
    this._windowMessage.setAttribute('aria-live', 'polite');
    for (const input of [this._min, this._max]) {
      input.addEventListener('change', () => this._windowChanged());
    }
    row2.append(label(trans.__('fit window: x from'), this._min), label(trans.__('to'), this._max), this._windowMessage);

    const rowWeights = document.createElement('div');
    rowWeights.className = 'jp-psiscape-fit-row jp-psiscape-fit-weights';
    this._weights = document.createElement('select');
    this._weights.className = 'jp-mod-styled jp-psiscape-fit-weights-mode';
    for (const [value, text] of [
      ['', trans.__('default: by the σ column if chosen, else equal')],
      ['sigma', trans.__('by the σ column')],
      ['relative', trans.__('relative: σ ∝ |y|')],
      ['equal', trans.__('equal')]
    ]) {
      const option = document.createElement('option');
      option.value = value;
      option.textContent = text;
      this._weights.appendChild(option);
    }
    this._fraction = textInput('jp-psiscape-fit-weights-fraction');
    this._fraction.inputMode = 'decimal';
    this._fraction.placeholder = trans.__('estimate');
    this._fraction.setAttribute('aria-label', trans.__('relative uncertainty of y, as a fraction (e.g. 0.003); empty to estimate it'));
    this._fractionLabel = label(trans.__('σ/|y|'), this._fraction);
    this._weightsMessage = document.createElement('span');
    this._weightsMessage.className = 'jp-psiscape-fit-window-message';
    this._weightsMessage.setAttribute('aria-live', 'polite');
    this._weights.addEventListener('change', () => this._weightsChanged());
    this._fraction.addEventListener('change', () => this._weightsChanged());
    rowWeights.append(label(trans.__('weights'), this._weights), this._fractionLabel, this._weightsMessage);

    const row3 = document.createElement('div');
    row3.className = 'jp-psiscape-fit-row';
    this._fitButton = button(trans.__('Fit'), 'jp-mod-accept jp-psiscape-fit-run', () => void this.runFit());
    this._cancelButton = button(trans.__('Cancel'), 'jp-mod-reject jp-psiscape-fit-cancel', () => this.cancel());
    this._cancelButton.disabled = true;
    this._status = document.createElement('span');
    this._status.className = 'jp-psiscape-fit-status';
    this._status.setAttribute('aria-live', 'polite');
    row3.append(this._fitButton, this._cancelButton, this._status);

    ({ error: this._error, result: this._result } = outcomeNodes());
    this.node.append(heading, row1, this._description, this._options, row2, rowWeights, row3, this._error, this._result);
  }

  /** The weighting chosen: the mode, and for relative weights a fraction (empty: estimated). */
  private _weightsChanged(): void {
    const mode = this._weights.value;
    this._fractionLabel.hidden = mode !== 'relative';
    if (mode === '') {
      this._weightsMessage.textContent = '';
      this._session.setWeights(null);
      return;
    }
    let fraction: number | null = null;
    if (mode === 'relative' && this._fraction.value.trim()) {
      const v = Number(this._fraction.value.trim());
      if (!(Number.isFinite(v) && v > 0 && v < 1)) {
        this._fraction.setAttribute('aria-invalid', 'true');
        this._weightsMessage.textContent = this._trans.__('Write the relative uncertainty as a fraction between 0 and 1 (0.003 for 0.3 %), or leave it empty to estimate it.');
        return;
      }
      fraction = v;
    }
    this._fraction.removeAttribute('aria-invalid');
    this._weightsMessage.textContent = '';
    this._session.setWeights({ mode: mode as 'sigma' | 'relative' | 'equal', fraction });
  }

  /** A window end typed by the user: a number, or empty for the data's end. Anything else is refused and not applied. */
  private _windowChanged(): void {
    const read = (input: HTMLInputElement): number | null | undefined => {
      const text = input.value.trim().replace(/\u2212/g, '-');
      if (text === '') {
        return null;
      }
      const v = Number(text);
      return Number.isFinite(v) ? v : undefined;
    };
    const min = read(this._min);
    const max = read(this._max);
    this._min.toggleAttribute('aria-invalid', min === undefined);
    this._max.toggleAttribute('aria-invalid', max === undefined);
    if (min === undefined || max === undefined) {
      this._windowMessage.textContent = this._trans.__('Write a number, or leave the field empty for the end of the data.');
      return;
    }
    if (min !== null && max !== null && min > max) {
      this._windowMessage.textContent = this._trans.__('The lower end of the window is above the upper end.');
      return;
    }
    this._windowMessage.textContent = '';
    this._session.setWindow(min, max);
  }

  /** Build the controls of the chosen kind's options from its catalogue entry. */
  private _buildOptions(): void {
    const s = this._session;
    const kind = kindById(s.kind);
    this._optionsKind = s.kind;
    this._controls = new Map();
    const items: HTMLElement[] = [];
    for (const [key, spec] of Object.entries(kind?.options ?? {})) {
      const control = this._control(key, spec);
      this._controls.set(key, control);
      items.push(label(translateMessage(this._trans, spec.label), control));
    }
    this._inspection = null;
    if ('expression' in (kind?.options ?? {})) {
      this._inspection = document.createElement('div');
      this._inspection.className = 'jp-psiscape-fit-inspection';
      this._inspection.setAttribute('aria-live', 'polite');
      items.push(this._inspection);
    }
    this._options.replaceChildren(...items);
    this._options.hidden = items.length === 0;
    this._syncOptionValues();
    if (this._inspection) {
      this._inspect(String(s.options.expression ?? ''));
    }
  }

  /** Before fitting: the parameters found in the expression, names that look wrong, or where it cannot be read. */
  private _inspect(text: string): void {
    const box = this._inspection;
    if (!box) {
      return;
    }
    const trans = this._trans;
    if (!text.trim()) {
      box.replaceChildren();
      return;
    }
    const p = this._session.plotted();
    const result = inspectExpression(text, {
      xNames: p ? variableNamesFromHeader(p.x.column.header) : [],
      columnNames: this._session.columns.map(c => c.column.header)
    });
    const nodes: HTMLElement[] = [];
    if (!result.ok && result.error) {
      const message = document.createElement('p');
      message.className = 'jp-psiscape-fit-inspection-error';
      message.textContent = translateMessage(trans, result.error);
      nodes.push(message);
      if (result.caret) {
        const caret = document.createElement('pre');
        caret.className = 'jp-psiscape-fit-caret';
        caret.textContent = result.caret;
        nodes.push(caret);
      }
    } else {
      const found = document.createElement('p');
      found.className = 'jp-psiscape-fit-parameters';
      found.textContent = result.parameters.length
        ? trans.__('Parameters to fit: %1', result.parameters.join(', '))
        : trans.__('This expression has no free parameters.');
      nodes.push(found);
    }
    for (const flag of result.flags) {
      const li = document.createElement('p');
      li.className = 'jp-psiscape-fit-warning';
      li.textContent = translateMessage(trans, flag);
      nodes.push(li);
    }
    box.replaceChildren(...nodes);
  }

  private _control(key: string, spec: OptionSpec): HTMLInputElement | HTMLSelectElement {
    const s = this._session;
    if (spec.type === 'boolean') {
      const box = document.createElement('input');
      box.type = 'checkbox';
      box.className = `jp-psiscape-option jp-psiscape-option-${key}`;
      box.addEventListener('change', () => s.setOption(key, box.checked));
      return box;
    }
    if (spec.type === 'column') {
      // A column of the same table (by header), or none.
      const select = document.createElement('select');
      select.className = `jp-mod-styled jp-psiscape-option jp-psiscape-option-${key}`;
      const none = document.createElement('option');
      none.value = '';
      none.textContent = this._trans.__('none');
      select.appendChild(none);
      for (const c of s.columns) {
        const option = document.createElement('option');
        option.value = c.column.header;
        option.textContent = c.label;
        select.appendChild(option);
      }
      select.addEventListener('change', () => s.setOption(key, select.value));
      return select;
    }
    if (spec.type === 'text') {
      const input = textInput(`jp-psiscape-option jp-psiscape-option-${key}`);
      input.placeholder = spec.placeholder;
      input.addEventListener('change', () => s.setOption(key, input.value));
      if (key === 'expression') {
        input.addEventListener('input', () => this._inspect(input.value));
      }
      return input;
    }
    const select = document.createElement('select');
    select.className = `jp-mod-styled jp-psiscape-option jp-psiscape-option-${key}`;
    spec.choices.forEach((choice, i) => {
      const option = document.createElement('option');
      option.value = String(i);
      option.textContent = translateMessage(this._trans, choice.label);
      select.appendChild(option);
    });
    select.addEventListener('change', () => s.setOption(key, spec.choices[Number(select.value)].value));
    return select;
  }

  private _syncOptionValues(): void {
    const kind = kindById(this._session.kind);
    const values = this._session.options;
    for (const [key, control] of this._controls) {
      const spec = kind?.options[key];
      const value: OptionValue | undefined = values[key];
      if (!spec || value === undefined || document.activeElement === control) {
        continue;
      }
      if (spec.type === 'boolean') {
        (control as HTMLInputElement).checked = value === true;
      } else if (spec.type === 'text' || spec.type === 'column') {
        control.value = String(value);
      } else {
        control.value = String(spec.choices.findIndex(c => c.value === value));
      }
    }
  }

  private _trans: TranslationBundle;
  private _session: AnalysisSession;
  private _runner: AnalysisRunner;
  private _onExploreLandau: ((k: ILandauOutcome) => void) | null;
  private _settled: Promise<void> = Promise.resolve();
  private _optionsKind: string | null = null;
  private _inspection: HTMLDivElement | null = null;
  private _controls = new Map<string, HTMLInputElement | HTMLSelectElement>();
  private _kindSelect!: HTMLSelectElement;
  private _description!: HTMLParagraphElement;
  private _options!: HTMLDivElement;
  private _min!: HTMLInputElement;
  private _max!: HTMLInputElement;
  private _windowMessage!: HTMLSpanElement;
  private _weights!: HTMLSelectElement;
  private _fraction!: HTMLInputElement;
  private _fractionLabel!: HTMLLabelElement;
  private _weightsMessage!: HTMLSpanElement;
  private _fitButton!: HTMLButtonElement;
  private _cancelButton!: HTMLButtonElement;
  private _status!: HTMLSpanElement;
  private _error!: HTMLParagraphElement;
  private _result!: HTMLDivElement;
}

function label(text: string, control: HTMLElement): HTMLLabelElement {
  const node = document.createElement('label');
  node.className = 'jp-psiscape-picker';
  const span = document.createElement('span');
  span.textContent = text;
  node.append(span, control);
  return node;
}

function textInput(cls: string): HTMLInputElement {
  const input = document.createElement('input');
  input.type = 'text';
  input.className = `jp-mod-styled ${cls}`;
  input.spellcheck = false;
  return input;
}

function button(text: string, cls: string, onClick: () => void): HTMLButtonElement {
  const node = document.createElement('button');
  node.type = 'button';
  node.className = `jp-Button jp-mod-styled ${cls}`;
  node.textContent = text;
  node.addEventListener('click', onClick);
  return node;
}

/** Options of {@link FitSection}. */
export namespace FitSection {
  export interface IOptions {
    trans: TranslationBundle;
    session: AnalysisSession;
    /** Job runner (the shared worker-backed one in the lab). */
    runner: AnalysisRunner;
    /** Open the Landau explorer with fitted coefficients (a button shows when given). */
    onExploreLandau?: (k: ILandauOutcome) => void;
  }
}
