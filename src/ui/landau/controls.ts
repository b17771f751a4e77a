/**
 * The explorer's controls: the convention picker with its formula, one
 * slider + number pair per coefficient of the chosen convention, and the
 * temperature and field sliders.
 */
import type { TranslationBundle } from '@jupyterlab/translation';
import { Widget } from '@lumino/widgets';
import type { LandauConvention } from '../../core/physics/landau/index';
import { CONVENTIONS, CONVENTION_FIELDS, CONVENTION_FORMULAS } from './fields';
import type { ISliderRange } from './ranges';
import { coefficientRange } from './ranges';
import { SliderField } from './slider';

/** Callbacks and texts of {@link ExplorerControls}. */
export interface IExplorerControlsOptions {
  trans: TranslationBundle;
  onCoefficient: (key: string, value: number) => void;
  onState: (key: 'T' | 'h', value: number) => void;
  /** A number field holds text that is not a finite number. */
  onInvalid: (label: string, text: string) => void;
  onConvention: (convention: LandauConvention) => void;
}

/** Picker, coefficient sliders and state sliders. */
export class ExplorerControls extends Widget {
  constructor(options: IExplorerControlsOptions) {
    super();
    this._options = options;
    const trans = options.trans;
    this.addClass('jp-psiscape-landau-controls');
    const heading = document.createElement('h3');
    heading.textContent = trans.__('Landau free-energy explorer');

    const pick = document.createElement('label');
    pick.className = 'jp-psiscape-picker';
    const pickText = document.createElement('span');
    pickText.textContent = trans.__('convention');
    this._select = document.createElement('select');
    this._select.className = 'jp-mod-styled jp-psiscape-landau-convention';
    for (const c of CONVENTIONS) {
      const option = document.createElement('option');
      option.value = c;
      option.textContent = this.conventionName(c);
      this._select.appendChild(option);
    }
    pick.append(pickText, this._select);
    this._pick = pick;
    this._formula = document.createElement('p');
    this._formula.className = 'jp-psiscape-landau-formula';

    this._coefficients = document.createElement('div');
    this._coefficients.className = 'jp-psiscape-landau-group jp-psiscape-landau-coefficients';
    this._coefficients.setAttribute('role', 'group');
    this._coefficients.setAttribute('aria-label', trans.__('coefficients'));

    const state = document.createElement('div');
    state.className = 'jp-psiscape-landau-group jp-psiscape-landau-state-controls';
    state.setAttribute('role', 'group');
    state.setAttribute('aria-label', trans.__('temperature and field'));
    this._T = this._field('T', 'T', trans.__('temperature at which the landscape is drawn'), v => options.onState('T', v));
    this._h = this._field('h', 'h', trans.__('conjugate field h (the term −hψ)'), v => options.onState('h', v));
    state.append(this._T.node, this._h.node);

    const groups = document.createElement('div');
    groups.className = 'jp-psiscape-landau-groups';
    groups.append(this._coefficients, state);
    this.node.append(heading, pick, this._formula, groups);
    this._select.addEventListener('change', () => options.onConvention(this._select.value as LandauConvention));
  }

  /**
   * Shows or hides the Landau form's own controls (convention, formula,
   * coefficient sliders): hidden while a typed free energy, with sliders of
   * its own, is in use. T and h stay.
   */
  setLandauShown(shown: boolean): void {
    for (const node of [this._pick, this._formula, this._coefficients]) {
      node.hidden = !shown;
    }
  }

  /** Convention whose coefficients are shown. */
  get convention(): LandauConvention {
    return this._convention;
  }

  /** Display name of a convention. */
  conventionName(c: LandauConvention): string {
    const trans = this._options.trans;
    switch (c) {
      case 'L':
        return trans.__('L: (a/2)(T − T0)ψ² + (b/4)ψ⁴ + (c/6)ψ⁶');
      case 'no-fractions':
        return trans.__('no fractions: A(T − T0)ψ² + Bψ⁴ + Cψ⁶');
      case 'devonshire':
        return trans.__('Devonshire (ferroelectrics)');
      case 'ginzburg-landau':
        return trans.__('Ginzburg–Landau');
    }
  }

  /** Puts the picker back on the shown convention. */
  revertConvention(): void {
    this._select.value = this._convention;
  }

  /** Shows `values` of `convention`, with slider ranges around them. */
  showCoefficients(convention: LandauConvention, values: Record<string, number>): void {
    const trans = this._options.trans;
    this._convention = convention;
    this._select.value = convention;
    this._formula.textContent = CONVENTION_FORMULAS[convention];
    const name = this.conventionName(convention);
    const fields = CONVENTION_FIELDS[convention].map(f => {
      const s = this._field(f.key, f.symbol, trans.__('coefficient %1 of the %2 convention', f.symbol, name), v => this._options.onCoefficient(f.key, v));
      s.setRange(coefficientRange(values[f.key], f.range));
      s.setValue(values[f.key]);
      return s;
    });
    this._coefficients.replaceChildren(...fields.map(s => s.node));
    this._fields = fields;
  }

  /** Slider pairs of the coefficients, in display order. */
  get coefficientFields(): readonly SliderField[] {
    return this._fields;
  }

  /** Shows T or h without calling back. */
  setState(key: 'T' | 'h', value: number): void {
    (key === 'T' ? this._T : this._h).setValue(value);
  }

  /** New slider bounds for T or h. */
  setStateRange(key: 'T' | 'h', range: ISliderRange): void {
    (key === 'T' ? this._T : this._h).setRange(range);
  }

  /** Current slider bounds of T or h. */
  stateBounds(key: 'T' | 'h'): ISliderRange {
    return (key === 'T' ? this._T : this._h).bounds;
  }

  private _field(key: string, label: string, description: string, onValue: (v: number) => void): SliderField {
    return new SliderField({ key, label, description, onValue, onInvalid: text => this._options.onInvalid(label, text) });
  }

  private _options: IExplorerControlsOptions;
  private _pick: HTMLLabelElement;
  private _select: HTMLSelectElement;
  private _formula: HTMLParagraphElement;
  private _coefficients: HTMLDivElement;
  private _T: SliderField;
  private _h: SliderField;
  private _fields: SliderField[] = [];
  private _convention: LandauConvention = 'L';
}
