/**
 * Parts of the landscape workbench around the Landau explorer: the chart
 * tabs (arrow keys, Home and End move between them), the presets (each sets
 * a free energy and its sliders), the typed free energy with one slider per
 * coefficient, and the sliders of the two-order-parameter landscape.
 */
import type { TranslationBundle } from '@jupyterlab/translation';
import { Widget } from '@lumino/widgets';
import type { ILandauCoefficients, LandauConvention } from '../../core/physics/landau/index';
import type { ICoupledCoefficients } from '../../core/physics/coupled';
import { coefficientRange } from './ranges';
import { SliderField } from './slider';

/** The chart tabs, in order (the first shows the landscape and the branches side by side). */
export const WORKBENCH_VIEWS = ['landscape', 'phase-diagram', 'landscape-2d', 'loop'] as const;
export type WorkbenchView = (typeof WORKBENCH_VIEWS)[number];

let tabCount = 0;

/** A tab list over one panel per view; only the selected panel is shown. */
export class WorkbenchTabs extends Widget {
  constructor(options: { trans: TranslationBundle; panels: Record<WorkbenchView, Widget>; onSelect: (id: WorkbenchView) => void }) {
    super();
    const t = options.trans;
    this.addClass('jp-psiscape-landau-tabs');
    this._onSelect = options.onSelect;
    this._panels = options.panels;
    const names: Record<WorkbenchView, string> = {
      landscape: t.__('Landscape F(ψ) and branches ψ(T)'),
      'phase-diagram': t.__('Phase diagram (T, h)'),
      'landscape-2d': t.__('Two order parameters F(ψ, φ)'),
      loop: t.__('Field loop (P–E)')
    };
    const list = document.createElement('div');
    list.className = 'jp-psiscape-landau-tablist';
    list.setAttribute('role', 'tablist');
    list.setAttribute('aria-label', t.__('Charts of the workbench'));
    const n = ++tabCount;
    for (const id of WORKBENCH_VIEWS) {
      const tab = document.createElement('button');
      tab.type = 'button';
      tab.className = 'jp-psiscape-landau-tab';
      tab.setAttribute('role', 'tab');
      tab.dataset.view = id;
      tab.id = `jp-psiscape-landau-tab-${id}-${n}`;
      tab.textContent = names[id];
      tab.addEventListener('click', () => this.select(id, { user: true }));
      this._tabs.set(id, tab);
      list.appendChild(tab);
      const panel = options.panels[id];
      panel.node.setAttribute('role', 'tabpanel');
      panel.node.setAttribute('aria-labelledby', tab.id);
    }
    list.addEventListener('keydown', event => this._onKey(event));
    this.node.appendChild(list);
    this._mark();
  }

  /** The view shown. */
  get selected(): WorkbenchView {
    return this._selected;
  }

  /**
   * Shows a view (`user`: chosen by the user, which is told through onSelect).
   * "branches", a tab of its own in scenarios saved before, shows the first tab, which holds them.
   */
  select(id: string, options: { user?: boolean; focus?: boolean } = {}): void {
    if (id === 'branches') {
      id = 'landscape';
    }
    if (!(WORKBENCH_VIEWS as readonly string[]).includes(id)) {
      return;
    }
    const changed = id !== this._selected;
    this._selected = id as WorkbenchView;
    this._mark();
    if (options.focus) {
      this._tabs.get(this._selected)?.focus();
    }
    if (changed) {
      this._onSelect(this._selected);
    }
  }

  private _onKey(event: KeyboardEvent): void {
    const i = WORKBENCH_VIEWS.indexOf(this._selected);
    const n = WORKBENCH_VIEWS.length;
    const to = { ArrowRight: (i + 1) % n, ArrowDown: (i + 1) % n, ArrowLeft: (i - 1 + n) % n, ArrowUp: (i - 1 + n) % n, Home: 0, End: n - 1 }[event.key];
    if (to === undefined) {
      return;
    }
    event.preventDefault();
    this.select(WORKBENCH_VIEWS[to], { user: true, focus: true });
  }

  private _mark(): void {
    for (const [id, tab] of this._tabs) {
      const on = id === this._selected;
      tab.setAttribute('aria-selected', String(on));
      tab.tabIndex = on ? 0 : -1;
      tab.classList.toggle('jp-mod-current', on);
      this._panels[id].node.hidden = !on;
    }
  }

  private _tabs = new Map<WorkbenchView, HTMLButtonElement>();
  private _panels: Record<WorkbenchView, Widget>;
  private _selected: WorkbenchView = 'landscape';
  private _onSelect: (id: WorkbenchView) => void;
}

/** Presets of the workbench. */
export const WORKBENCH_PRESETS = ['bean-rodbell', 'devonshire', 'de-gennes'] as const;
export type WorkbenchPreset = (typeof WORKBENCH_PRESETS)[number];

/** What a preset sets: coefficients (convention L), the convention shown, its own parameters and the tab to show. */
export interface IPresetSetting {
  coefficients: ILandauCoefficients;
  convention: LandauConvention;
  /** The preset's own parameters (sliders of their own), or none. */
  values: Record<string, number>;
  view: WorkbenchView;
}

/**
 * Bean–Rodbell (J = ½) expanded about T0 to order σ⁶ [B11 in REFERENCES.md]:
 * G/(N kB T0) = (T/T0 − 1)σ²/2 + (1 − η)σ⁴/12 + σ⁶/30 − hσ (with T/T0 ≈ 1 in
 * the higher terms), i.e. convention L with a = 1/T0, b = (1 − η)/3, c = 1/5,
 * h in units of N kB T0. η < 1 second order, η = 1 tricritical, η > 1 first order.
 */
export function beanRodbellCoefficients(eta: number, T0: number): ILandauCoefficients {
  return { a: 1 / T0, T0, b: (1 - eta) / 3, c: 1 / 5, d: 0 };
}

/** The setting of a preset, from its own parameters where it has them. */
export function presetSetting(preset: WorkbenchPreset, values: Record<string, number> = {}): IPresetSetting {
  switch (preset) {
    case 'bean-rodbell': {
      const eta = Number.isFinite(values.eta) ? values.eta : 2;
      const T0 = Number.isFinite(values.T0) && values.T0 > 0 ? values.T0 : 300;
      return { coefficients: beanRodbellCoefficients(eta, T0), convention: 'L', values: { eta, T0 }, view: 'landscape' };
    }
    case 'devonshire':
      // ferroelectric of the order of BaTiO3 (illustrative): C_CW = 1.5e5 K, T0 = 381 K, α11 < 0 (first order), α111 > 0; P in C/m², E in V/m
      return { coefficients: { a: 1 / (8.8541878128e-12 * 1.5e5), T0: 381, b: 4 * -3.6e8, c: 6 * 6.6e9, d: 0 }, convention: 'devonshire', values: {}, view: 'loop' };
    case 'de-gennes':
      // Landau–de Gennes a = 0.1, B = 1, C = 2, T* = 300 [C5 in REFERENCES.md]: d = −B, b = C, c = 0
      return { coefficients: { a: 0.1, T0: 300, b: 2, c: 0, d: -1 }, convention: 'L', values: {}, view: 'landscape' };
  }
}

/** Display name of a preset. */
export function presetName(trans: TranslationBundle, preset: WorkbenchPreset | ''): string {
  switch (preset) {
    case 'bean-rodbell':
      return trans.__('Bean–Rodbell (magnetovolume, J = ½)');
    case 'devonshire':
      return trans.__('Landau–Devonshire (ferroelectric)');
    case 'de-gennes':
      return trans.__('Landau–de Gennes (nematic, cubic term)');
    default:
      return trans.__('none (coefficients as entered)');
  }
}

/** The free energy a preset stands for, written out. */
export function presetFormula(trans: TranslationBundle, preset: WorkbenchPreset): string {
  switch (preset) {
    case 'bean-rodbell':
      return trans.__('G/(N kB T0) ≈ (T/T0 − 1)σ²/2 + (1 − η)σ⁴/12 + σ⁶/30 − hσ (expanded about T0; first order for η > 1)');
    case 'devonshire':
      return trans.__('G = α1 P² + α11 P⁴ + α111 P⁶ − EP, α1 = (T − T0)/(2 ε0 C_CW); the P–E loop follows the occupied minimum');
    case 'de-gennes':
      return trans.__('F = (a/2)(T − T*)S² − (B/3)S³ + (C/4)S⁴ (here d = −B, b = C, c = 0)');
  }
}

/** Default coupled coefficients: ψ orders at 100, φ at 90, weak biquadratic coupling. */
export const DEFAULT_COUPLED: ICoupledCoefficients = { a1: 1, T1: 100, b1: 1, a2: 1, T2: 90, b2: 1, lambda: 0.5 };

const COUPLED_FIELDS: readonly { key: keyof ICoupledCoefficients; symbol: string; range: 'positive' | 'temperature' | 'signed' }[] = [
  { key: 'a1', symbol: 'a1', range: 'positive' },
  { key: 'T1', symbol: 'T1', range: 'temperature' },
  { key: 'b1', symbol: 'b1', range: 'positive' },
  { key: 'a2', symbol: 'a2', range: 'positive' },
  { key: 'T2', symbol: 'T2', range: 'temperature' },
  { key: 'b2', symbol: 'b2', range: 'positive' },
  { key: 'lambda', symbol: 'λ', range: 'signed' }
];

/** A titled group of slider fields. */
export class SliderGroup extends Widget {
  constructor(options: { trans: TranslationBundle; title: string; className: string; onInvalid: (label: string, text: string) => void }) {
    super();
    this.addClass('jp-psiscape-landau-group');
    this.addClass(options.className);
    this.node.setAttribute('role', 'group');
    this.node.setAttribute('aria-label', options.title);
    this._onInvalid = options.onInvalid;
    this._formula = document.createElement('p');
    this._formula.className = 'jp-psiscape-landau-group-formula';
    this._fields = document.createElement('div');
    this._fields.className = 'jp-psiscape-landau-fields';
    this.node.append(this._formula, this._fields);
  }

  /** Replaces the fields. */
  setFields(formula: string, fields: readonly { key: string; symbol: string; description: string; value: number; range: 'positive' | 'non-negative' | 'signed' | 'temperature' }[], onValue: (key: string, v: number) => void): void {
    this._formula.textContent = formula;
    this._sliders = fields.map(f => {
      const s = new SliderField({ key: f.key, label: f.symbol, description: f.description, onValue: v => onValue(f.key, v), onInvalid: text => this._onInvalid(f.symbol, text) });
      s.setRange(coefficientRange(f.value, f.range));
      s.setValue(f.value);
      return s;
    });
    this._fields.replaceChildren(...this._sliders.map(s => s.node));
  }

  /** The slider fields shown. */
  get sliders(): readonly SliderField[] {
    return this._sliders;
  }

  private _formula: HTMLParagraphElement;
  private _fields: HTMLDivElement;
  private _sliders: SliderField[] = [];
  private _onInvalid: (label: string, text: string) => void;
}

/** Slider fields of the coupled landscape. */
export function coupledFields(trans: TranslationBundle, k: ICoupledCoefficients): { key: string; symbol: string; description: string; value: number; range: 'positive' | 'temperature' | 'signed' }[] {
  return COUPLED_FIELDS.map(f => ({ key: f.key, symbol: f.symbol, description: trans.__('coefficient %1 of the two-order-parameter landscape', f.symbol), value: k[f.key], range: f.range }));
}
