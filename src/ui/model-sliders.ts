/**
 * Sliders on a fitted model: one per fitted parameter, from the fitted value
 * a few standard errors either way (within the parameter's bounds; on a log
 * scale when the range spans more than a decade of positive values), each
 * with a field for the exact value, and the χ² of the model at the values
 * set beside χ²_red and the fit's own. The model is evaluated in the page
 * (see core/analysis/model-curve.ts) at most once per animation frame, and
 * the owner draws it from `onPreview` by patching its charts in place;
 * "Fit from here" refits starting at the values set, "Back to the fit"
 * restores the fitted ones (Escape on a slider does the same).
 *
 * After each preview is drawn (the promise `onPreview` returns has settled)
 * the node dispatches {@link MODEL_PREVIEW_EVENT}.
 */
import type { TranslationBundle } from '@jupyterlab/translation';
import { Widget } from '@lumino/widgets';
import type { IAnalysisJob, IAnalysisOutcome } from '../core/analysis';
import { modelCurve } from '../core/analysis/model-curve';
import type { IModelCurve, IModelEvaluation } from '../core/analysis/model-curve';

/** Standard errors either way of the fitted value a slider spans. */
export const SLIDER_SIGMAS = 3;

/** Positions of a slider (its steps from one end to the other). */
export const SLIDER_POSITIONS = 1000;

/** Dispatched on the widget's node after a preview is drawn; `detail` holds χ² and the values. */
export const MODEL_PREVIEW_EVENT = 'jp-psiscape-model-preview';

/** What a slider spans: [min, max], on a log scale or not. */
export interface ISliderScale {
  min: number;
  max: number;
  log: boolean;
}

/**
 * The span of a slider: value ± {@link SLIDER_SIGMAS}·σ (± half the value,
 * or ± 1 at 0, without a usable σ), clipped to [lower, upper]; log scale
 * when the span is positive and more than a decade wide.
 */
export function sliderScale(value: number, sigma: number, lower = -Infinity, upper = Infinity): ISliderScale {
  const half = Number.isFinite(sigma) && sigma > 0 ? SLIDER_SIGMAS * sigma : value !== 0 ? 0.5 * Math.abs(value) : 1;
  let min = Math.max(lower, value - half);
  let max = Math.min(upper, value + half);
  if (!(min < max)) {
    // No room within the bounds (σ = 0 at a bound): half the value either way, clipped.
    const d = value !== 0 ? 0.5 * Math.abs(value) : 1;
    min = Math.max(lower, value - d);
    max = Math.min(upper, value + d);
  }
  return { min, max, log: min > 0 && max / min > 10 };
}

/** Slider position (0 … {@link SLIDER_POSITIONS}) of a value. */
export function positionOf(scale: ISliderScale, value: number): number {
  const f = scale.log ? Math.log(value / scale.min) / Math.log(scale.max / scale.min) : (value - scale.min) / (scale.max - scale.min);
  return Math.round(Math.min(1, Math.max(0, Number.isFinite(f) ? f : 0)) * SLIDER_POSITIONS);
}

/** The value at a slider position. */
export function valueAt(scale: ISliderScale, position: number): number {
  const f = position / SLIDER_POSITIONS;
  return scale.log ? scale.min * Math.pow(scale.max / scale.min, f) : scale.min + f * (scale.max - scale.min);
}

/** A number for people: 6 significant digits. */
function show(v: number): string {
  return Number.isFinite(v) ? String(Number(v.toPrecision(6))) : String(v);
}

let counter = 0;

/** One parameter's row. */
interface IRow {
  index: number;
  name: string;
  scale: ISliderScale;
  range: HTMLInputElement;
  number: HTMLInputElement;
}

/** Sliders on the parameters of the fit shown. */
export class ModelSliders extends Widget {
  constructor(options: ModelSliders.IOptions) {
    super();
    this._trans = options.trans;
    this._onPreview = options.onPreview;
    this._onFitFromHere = options.onFitFromHere;
    const trans = this._trans;
    this.addClass('jp-psiscape-ModelSliders');
    this.node.setAttribute('role', 'group');
    this.node.setAttribute('aria-label', trans.__('Move the fitted parameters'));
    const heading = document.createElement('h4');
    heading.textContent = trans.__('Move the fitted parameters');
    const hint = document.createElement('p');
    hint.className = 'jp-psiscape-ModelSliders-hint';
    hint.textContent = trans.__('Each slider spans the fitted value ± %1 standard errors; the chart and the residuals follow. Escape on a slider goes back to the fit.', SLIDER_SIGMAS);
    this._rowsNode = document.createElement('div');
    this._rowsNode.className = 'jp-psiscape-ModelSliders-rows';
    this._readout = document.createElement('p');
    this._readout.className = 'jp-psiscape-ModelSliders-chi2';
    this._readout.setAttribute('role', 'status');
    this._readout.setAttribute('aria-live', 'polite');
    const buttons = document.createElement('div');
    buttons.className = 'jp-psiscape-ModelSliders-buttons';
    this._fitButton = document.createElement('button');
    this._fitButton.type = 'button';
    this._fitButton.className = 'jp-Button jp-mod-styled jp-mod-accept jp-psiscape-ModelSliders-fit';
    this._fitButton.textContent = trans.__('Fit from here');
    this._fitButton.title = trans.__('Run the fit again, starting at the values the sliders show');
    this._fitButton.addEventListener('click', () => this._onFitFromHere(this.values));
    this._backButton = document.createElement('button');
    this._backButton.type = 'button';
    this._backButton.className = 'jp-Button jp-mod-styled jp-mod-reject jp-psiscape-ModelSliders-back';
    this._backButton.textContent = trans.__('Back to the fit');
    this._backButton.title = trans.__('Set every slider to its fitted value again');
    this._backButton.addEventListener('click', () => this.reset());
    buttons.append(this._fitButton, this._backButton);
    this.node.append(heading, hint, this._rowsNode, this._readout, buttons);
    this.hide();
  }

  /** The model of the fit shown, or null. */
  get model(): IModelCurve | null {
    return this._model;
  }

  /** The values set, by parameter name (fixed parameters at their fitted values). */
  get values(): Record<string, number> {
    const out: Record<string, number> = {};
    this._model?.parameters.forEach((name, i) => (out[name] = this._values[i]));
    return out;
  }

  /** Whether every value is the fitted one. */
  get atFit(): boolean {
    const m = this._model;
    return m === null || m.fitted.every((v, i) => Object.is(v, this._values[i]));
  }

  /** Resolves when the latest preview asked for is drawn. */
  get settled(): Promise<void> {
    return this._settled?.promise ?? Promise.resolve();
  }

  /**
   * Show sliders on the parameters of `outcome` (the fit of `job`); null, or
   * an outcome whose model cannot be rebuilt, hides them. The same outcome
   * again keeps the values set.
   */
  setOutcome(outcome: IAnalysisOutcome | null, job: IAnalysisJob | null): void {
    if (outcome === this._outcome && (outcome === null || this._model !== null)) {
      return;
    }
    this._outcome = outcome;
    this._model = outcome && job ? modelCurve(job, outcome) : null;
    this._rows = [];
    this._rowsNode.replaceChildren();
    const m = this._model;
    if (!m || !outcome) {
      this._values = new Float64Array(0);
      this.hide();
      return;
    }
    this._values = Float64Array.from(m.fitted);
    const fit = outcome.fit;
    for (let i = 0; i < m.parameters.length; i++) {
      if (fit.fixed[i] || !Number.isFinite(m.fitted[i])) {
        continue;
      }
      const scale = sliderScale(m.fitted[i], fit.standardErrors[i], fit.bounds?.lower[i], fit.bounds?.upper[i]);
      this._rows.push(this._buildRow(i, m.parameters[i], fit.standardErrors[i], scale));
    }
    this.setHidden(this._rows.length === 0);
    this._sync();
    this._showChi2(m.evaluate(this._values));
  }

  /** Set the values of some parameters (by name; others keep theirs) and preview them. */
  setValues(values: Readonly<Record<string, number>>): void {
    const m = this._model;
    if (!m) {
      return;
    }
    for (const [name, v] of Object.entries(values)) {
      const i = m.parameters.indexOf(name);
      if (i >= 0 && Number.isFinite(v)) {
        this._values[i] = v;
      }
    }
    this._sync();
    this._schedule();
  }

  /** Every parameter back to its fitted value, drawn so. */
  reset(): void {
    const m = this._model;
    if (!m) {
      return;
    }
    this._values = Float64Array.from(m.fitted);
    this._sync();
    this._schedule();
  }

  /** Draw the values set again (the owner redrew its charts with the fit): nothing to do at the fit. */
  replay(): void {
    if (!this.atFit) {
      this._schedule();
    }
  }

  dispose(): void {
    if (this.isDisposed) {
      return;
    }
    this._cancelFrame();
    this._settle();
    super.dispose();
  }

  private _buildRow(index: number, name: string, sigma: number, scale: ISliderScale): IRow {
    const trans = this._trans;
    const id = `jp-psiscape-model-slider-${++counter}`;
    const row = document.createElement('div');
    row.className = 'jp-psiscape-ModelSliders-row';
    row.dataset.parameter = name;
    const label = document.createElement('label');
    label.id = `${id}-label`;
    label.htmlFor = id;
    label.className = 'jp-psiscape-ModelSliders-name';
    label.textContent = name;
    const range = document.createElement('input');
    range.type = 'range';
    range.id = id;
    range.className = 'jp-psiscape-ModelSliders-range';
    range.min = '0';
    range.max = String(SLIDER_POSITIONS);
    range.step = '1';
    range.dataset.parameter = name;
    range.dataset.scale = scale.log ? 'log' : 'linear';
    range.setAttribute('aria-describedby', `${id}-span`);
    const number = document.createElement('input');
    number.type = 'number';
    number.step = 'any';
    number.className = 'jp-mod-styled jp-psiscape-ModelSliders-number';
    number.dataset.parameter = name;
    number.setAttribute('aria-label', trans.__('%1, exact value', name));
    const span = document.createElement('span');
    span.id = `${id}-span`;
    span.className = 'jp-psiscape-ModelSliders-span';
    span.textContent = Number.isFinite(sigma) && sigma > 0
      ? scale.log
        ? trans.__('σ %1; %2 to %3, log scale', show(sigma), show(scale.min), show(scale.max))
        : trans.__('σ %1; %2 to %3', show(sigma), show(scale.min), show(scale.max))
      : scale.log
        ? trans.__('no σ; %1 to %2, log scale', show(scale.min), show(scale.max))
        : trans.__('no σ; %1 to %2', show(scale.min), show(scale.max));
    row.append(label, range, number, span);
    this._rowsNode.appendChild(row);
    const r: IRow = { index, name, scale, range, number };
    range.addEventListener('input', () => {
      this._values[index] = valueAt(scale, Number(range.value));
      number.value = show(this._values[index]);
      range.setAttribute('aria-valuetext', number.value);
      this._schedule();
    });
    range.addEventListener('keydown', event => {
      if (event.key === 'Escape' && !this.atFit) {
        event.preventDefault();
        event.stopPropagation();
        this.reset();
      }
    });
    number.addEventListener('input', () => {
      const text = number.value.trim();
      const v = text === '' ? Number.NaN : Number(text);
      if (!Number.isFinite(v)) {
        number.setAttribute('aria-invalid', 'true');
        return;
      }
      number.removeAttribute('aria-invalid');
      this._values[index] = v;
      range.value = String(positionOf(scale, v));
      range.setAttribute('aria-valuetext', show(v));
      this._schedule();
    });
    number.addEventListener('change', () => {
      // A field left holding no number shows the value in use again.
      if (number.getAttribute('aria-invalid') === 'true') {
        number.removeAttribute('aria-invalid');
        number.value = show(this._values[index]);
      }
    });
    return r;
  }

  /** Both inputs of every row show the values set. */
  private _sync(): void {
    for (const row of this._rows) {
      const v = this._values[row.index];
      row.range.value = String(positionOf(row.scale, v));
      row.number.value = show(v);
      row.number.removeAttribute('aria-invalid');
      row.range.setAttribute('aria-valuetext', row.number.value);
    }
    this._backButton.disabled = this.atFit;
  }

  /**
   * At most one preview per animation frame, and none while the previous
   * one is being drawn: the first input of a frame is drawn at once, later
   * ones of the same frame together at the next.
   */
  private _schedule(): void {
    this._dirty = true;
    this._backButton.disabled = this.atFit;
    if (!this._settled) {
      let resolve!: () => void;
      const promise = new Promise<void>(r => (resolve = r));
      this._settled = { promise, resolve };
    }
    if (this._busy || this._frame !== null) {
      // The preview being drawn, or the next frame, takes this input.
      return;
    }
    this._frame = requestFrame(() => {
      this._frame = null;
      if (this._dirty && !this._busy) {
        this._schedule();
      }
    });
    void this._flush();
  }

  private async _flush(): Promise<void> {
    const m = this._model;
    if (!m || !this._dirty || this.isDisposed) {
      this._settle();
      return;
    }
    this._dirty = false;
    const values = this.values;
    const evaluation = m.evaluate(this._values);
    this._showChi2(evaluation);
    this._busy = true;
    try {
      await this._onPreview(values, evaluation);
    } catch {
      // A chart that could not take the preview keeps what it shows; the readout is still right.
    } finally {
      this._busy = false;
    }
    if (!this.isDisposed) {
      this.node.dispatchEvent(new CustomEvent(MODEL_PREVIEW_EVENT, { detail: { chi2: evaluation.chi2, values } }));
    }
    if (this._dirty) {
      this._schedule();
    } else {
      this._settle();
    }
  }

  private _settle(): void {
    const s = this._settled;
    this._settled = null;
    s?.resolve();
  }

  private _showChi2(ev: IModelEvaluation): void {
    const fit = this._outcome?.fit;
    const trans = this._trans;
    this._readout.dataset.chi2 = String(ev.chi2);
    this._readout.textContent = fit
      ? trans.__('χ² = %1, χ²_red = %2 (at the fit: χ² = %3, χ²_red = %4)', show(ev.chi2), show(ev.reducedChi2), show(fit.chi2), show(fit.reducedChi2))
      : '';
  }

  private _cancelFrame(): void {
    if (this._frame !== null) {
      cancelFrame(this._frame);
      this._frame = null;
    }
  }

  private readonly _trans: TranslationBundle;
  private readonly _onPreview: ModelSliders.IOptions['onPreview'];
  private readonly _onFitFromHere: ModelSliders.IOptions['onFitFromHere'];
  private readonly _rowsNode: HTMLDivElement;
  private readonly _readout: HTMLParagraphElement;
  private readonly _fitButton: HTMLButtonElement;
  private readonly _backButton: HTMLButtonElement;
  private _rows: IRow[] = [];
  private _outcome: IAnalysisOutcome | null = null;
  private _model: IModelCurve | null = null;
  private _values = new Float64Array(0);
  private _frame: number | null = null;
  private _dirty = false;
  private _busy = false;
  private _settled: { promise: Promise<void>; resolve: () => void } | null = null;
}

function requestFrame(callback: () => void): number {
  return typeof requestAnimationFrame === 'function' ? requestAnimationFrame(callback) : (setTimeout(callback, 16) as unknown as number);
}

function cancelFrame(handle: number): void {
  if (typeof cancelAnimationFrame === 'function') {
    cancelAnimationFrame(handle);
  } else {
    clearTimeout(handle);
  }
}

/** Options of {@link ModelSliders}. */
export namespace ModelSliders {
  export interface IOptions {
    trans: TranslationBundle;
    /**
     * Draw the model at `values` (all parameters, by name); `evaluation`
     * holds its curve over the outcome's curve x, its residuals and χ² (its
     * arrays are reused by the next evaluation). The next preview waits for
     * the returned promise.
     */
    onPreview: (values: Record<string, number>, evaluation: IModelEvaluation) => void | Promise<void>;
    /** Refit starting at `values` (all parameters, by name). */
    onFitFromHere: (values: Record<string, number>) => void;
  }
}
