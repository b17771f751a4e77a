/**
 * A labelled slider paired with a numeric field. Both are keyboard-usable:
 * the range input steps with the arrow keys (±1 step), Page Up / Page Down
 * (±10 steps), Home and End; the number field takes any value, and a value
 * beyond the slider's bounds widens them. The number field keeps the exact
 * value; the slider shows it rounded to its step.
 */
import type { ISliderRange } from './ranges';
import { snap } from './ranges';

let counter = 0;

/** Callbacks and texts of a {@link SliderField}. */
export interface ISliderFieldOptions {
  /** Key written to `data-key` on both inputs. */
  key: string;
  /** Visible label (also the accessible name of both inputs). */
  label: string;
  /** Longer description read by assistive technology. */
  description: string;
  /** A new finite value was entered. */
  onValue: (value: number) => void;
  /** The number field holds something that is not a finite number. */
  onInvalid: (text: string) => void;
}

/** Range + number input pair. */
export class SliderField {
  constructor(options: ISliderFieldOptions) {
    this._options = options;
    const id = `jp-psiscape-landau-field-${++counter}`;
    this.node = document.createElement('div');
    this.node.className = 'jp-psiscape-landau-slider';
    this.node.setAttribute('role', 'group');
    this.node.setAttribute('aria-labelledby', `${id}-label`);
    const label = document.createElement('span');
    label.id = `${id}-label`;
    label.className = 'jp-psiscape-landau-slider-label';
    label.textContent = options.label;
    const desc = document.createElement('span');
    desc.id = `${id}-desc`;
    desc.className = 'jp-psiscape-landau-sr-only';
    desc.textContent = options.description;
    this.range = document.createElement('input');
    this.range.type = 'range';
    this.range.className = 'jp-psiscape-landau-range';
    this.number = document.createElement('input');
    this.number.type = 'number';
    this.number.step = 'any';
    this.number.className = 'jp-mod-styled jp-psiscape-landau-number';
    for (const input of [this.range, this.number]) {
      input.dataset.key = options.key;
      input.setAttribute('aria-labelledby', `${id}-label`);
      input.setAttribute('aria-describedby', `${id}-desc`);
    }
    this.node.append(label, this.range, this.number, desc);
    this.range.addEventListener('input', () => this._fromRange());
    this.range.addEventListener('keydown', e => this._onKey(e));
    this.number.addEventListener('input', () => this._fromNumber(false));
    this.number.addEventListener('change', () => this._fromNumber(true));
  }

  /** The row element. */
  readonly node: HTMLDivElement;
  /** The slider. */
  readonly range: HTMLInputElement;
  /** The exact-value field. */
  readonly number: HTMLInputElement;

  /** The last finite value entered or set. */
  get value(): number {
    return this._value;
  }

  /** Current slider bounds and step. */
  get bounds(): ISliderRange {
    return { ...this._range };
  }

  /** New bounds (widened to hold the current value). */
  setRange(range: ISliderRange): void {
    this._range = { ...range };
    this._applyRange();
  }

  /** Shows `value` in both inputs without calling back. */
  setValue(value: number): void {
    this._value = value;
    this.number.value = String(Number(value.toPrecision(10)));
    this._applyRange();
  }

  private _applyRange(): void {
    const r = this._range;
    if (Number.isFinite(this._value)) {
      if (this._value < r.min) {
        r.min = snap(this._value - r.step, r.step);
      }
      if (this._value > r.max) {
        r.max = snap(this._value + r.step, r.step);
      }
    }
    this.range.min = String(r.min);
    this.range.max = String(r.max);
    this.range.step = String(r.step);
    this.range.value = String(Number.isFinite(this._value) ? snap(this._value, r.step) : r.min);
    this.range.setAttribute('aria-valuetext', this.number.value);
  }

  private _fromRange(): void {
    const v = snap(Number(this.range.value), this._range.step);
    this._value = v;
    this.number.value = String(v);
    this.range.setAttribute('aria-valuetext', this.number.value);
    this._options.onValue(v);
  }

  private _fromNumber(committed: boolean): void {
    const text = this.number.value.trim();
    const v = text === '' ? Number.NaN : Number(text);
    if (!Number.isFinite(v)) {
      if (committed) {
        this._options.onInvalid(text);
      }
      return;
    }
    if (v === this._value && !committed) {
      return;
    }
    this._value = v;
    this._applyRange();
    this._options.onValue(v);
  }

  private _onKey(e: KeyboardEvent): void {
    const r = this._range;
    const current = Number(this.range.value);
    let next: number;
    switch (e.key) {
      case 'ArrowRight':
      case 'ArrowUp':
        next = current + r.step;
        break;
      case 'ArrowLeft':
      case 'ArrowDown':
        next = current - r.step;
        break;
      case 'PageUp':
        next = current + 10 * r.step;
        break;
      case 'PageDown':
        next = current - 10 * r.step;
        break;
      case 'Home':
        next = r.min;
        break;
      case 'End':
        next = r.max;
        break;
      default:
        return;
    }
    e.preventDefault();
    this.range.value = String(snap(Math.min(r.max, Math.max(r.min, next)), r.step));
    this.range.dispatchEvent(new Event('input', { bubbles: true }));
  }

  private _options: ISliderFieldOptions;
  private _value = Number.NaN;
  private _range: ISliderRange = { min: 0, max: 1, step: 0.01 };
}
