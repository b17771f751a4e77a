/**
 * The Landau free-energy explorer: sliders for the coefficients (in the
 * chosen convention), the temperature and the field; the landscape F(ψ) at
 * (T, h) and the branches ψ(T) at h; and the derived zero-field values.
 * Redraws at most once per animation frame; bad values show a message and
 * leave the last good picture in place.
 */
import { messageOf } from '../../core/messages';
import { translateMessage } from '../translate';
import type { TranslationBundle } from '@jupyterlab/translation';
import { Panel, Widget } from '@lumino/widgets';
import { Signal } from '@lumino/signaling';
import type { ISignal } from '@lumino/signaling';
import type { ILandauCoefficients, LandauConvention } from '../../core/physics/landau/index';
import { readChartTheme } from '../chart-theme';
import type { IBranchesData, IExplorerDerived } from '../../core/physics/landau/index';
import { branchesData, explorerDerived, landscapeData } from '../../core/physics/landau/index';
import { DerivedSection } from './derived-section';
import { formatValue } from './derived-table';
import { PatchableChartView } from './patchable-view';
import { explorerProblem } from './problems';
import { ExplorerControls } from './controls';
import { FrameThrottle } from './frame';
import { CONVENTIONS, coefficientsFrom, valuesIn } from './fields';
import { defaultTemperature, stateRanges } from './ranges';
import { branchesSpec, landscapeSpec } from './specs';

/** Starting coefficients (convention L) and state. */
export interface ILandauExplorerInitial {
  a: number;
  b: number;
  c: number;
  T0: number;
  d?: number;
  T?: number;
  h?: number;
}

/**
 * What an explorer shows, as JSON: the coefficients (convention L), the
 * convention they are displayed in, and the temperature and field.
 */
export interface ILandauExplorerState {
  a: number;
  T0: number;
  b: number;
  c: number;
  d: number;
  convention: LandauConvention;
  T: number;
  h: number;
}

/** First-order example of [C5 in REFERENCES.md]: a = 0.5, b = −2, c = 4, T0 = 100. */
export const DEFAULT_LANDAU_INITIAL: ILandauExplorerInitial = { a: 0.5, b: -2, c: 4, T0: 100 };

/** Interactive Landau landscape with sliders, two charts and a table. */
export class LandauExplorer extends Panel {
  constructor(options: LandauExplorer.IOptions) {
    super();
    const trans = (this._trans = options.trans);
    this.addClass('jp-psiscape-LandauExplorer');
    this.node.setAttribute('role', 'region');
    this.node.setAttribute('aria-label', trans.__('Landau free-energy explorer'));
    this.title.label = trans.__('Landau explorer');
    this.title.closable = true;
    this._controls = new ExplorerControls({
      trans,
      onCoefficient: (key, v) => this._onCoefficient(key, v),
      onState: (key, v) => this._onState(key, v),
      onInvalid: (label, text) => {
        this._badText = text === '' ? trans.__('%1: enter a finite number.', label) : trans.__('%1: “%2” is not a finite number.', label, text);
        this._schedule();
      },
      onConvention: c => this._onConvention(c)
    });
    this._message = new Widget({ node: document.createElement('p') });
    this._message.addClass('jp-psiscape-landau-message');
    this._message.node.setAttribute('role', 'alert');
    this._message.node.hidden = true;
    const charts = new Panel();
    charts.addClass('jp-psiscape-landau-charts');
    this._landscape.addClass('jp-psiscape-landau-landscape');
    this._branches.addClass('jp-psiscape-landau-branches');
    charts.addWidget(this._landscape);
    charts.addWidget(this._branches);
    this._derivedSection = new DerivedSection(trans);
    this.addWidget(this._controls);
    this.addWidget(this._message);
    this.addWidget(charts);
    this.addWidget(this._derivedSection);
    const init = options.initial ?? DEFAULT_LANDAU_INITIAL;
    this.setCoefficients({ a: init.a, b: init.b, c: init.c, T0: init.T0, d: init.d ?? 0 }, { T: init.T, h: init.h });
  }

  /** Derived zero-field values of the last coefficients drawn, or null before the first good picture. */
  get derived(): IExplorerDerived | null {
    return this._derived;
  }

  /** Coefficients (convention L) currently entered, or null when they cannot be converted. */
  get coefficients(): ILandauCoefficients | null {
    return this._k ? { ...this._k } : null;
  }

  /** Convention the coefficients are displayed in. */
  get convention(): LandauConvention {
    return this._controls.convention;
  }

  /** Temperature and field of the landscape. */
  get state(): { T: number; h: number } {
    return { T: this._T, h: this._h };
  }

  /**
   * The scenario shown: coefficients (convention L), convention, T and h.
   * While the entered coefficients cannot be converted, the last valid ones.
   */
  scenario(): ILandauExplorerState {
    const k = this._k ?? this._lastGood;
    return { a: k.a, T0: k.T0, b: k.b, c: k.c, d: k.d ?? 0, convention: this._controls.convention, T: this._T, h: this._h };
  }

  /** Show a scenario (as returned by {@link scenario}): its coefficients in its convention, at its T and h. */
  setScenario(state: Partial<ILandauExplorerState> & { a: number; T0: number; b: number; c: number }): Promise<void> {
    const known = CONVENTIONS as readonly string[];
    if (typeof state.convention === 'string' && known.includes(state.convention) && this._k) {
      try {
        const values = valuesIn({ a: state.a, T0: state.T0, b: state.b, c: state.c, d: state.d ?? 0 }, state.convention);
        this._controls.showCoefficients(state.convention, values);
      } catch {
        // the convention cannot hold them: setCoefficients shows them in L and says why
      }
    }
    return this.setCoefficients({ a: state.a, T0: state.T0, b: state.b, c: state.c, d: state.d ?? 0 }, { T: state.T, h: state.h });
  }

  /** Emitted when the user changes the scenario (coefficients, convention, T or h) or it is set. */
  get scenarioChanged(): ISignal<this, void> {
    return this._scenarioChanged;
  }

  /** Resolves when the scheduled redraw (if any) has finished. */
  get rendered(): Promise<void> {
    return this._throttle.settled;
  }

  /** Number of redraws run so far (at most one per animation frame). */
  get redraws(): number {
    return this._throttle.runs;
  }

  /**
   * Shows new coefficients (convention L), e.g. from a fit, in the current
   * convention (or in L when that form cannot hold them). T defaults to T1
   * for a first-order transition and to T0 − S/2 otherwise; h to 0.
   */
  setCoefficients(k: ILandauCoefficients, state: { T?: number; h?: number } = {}): Promise<void> {
    this._k = { a: k.a, T0: k.T0, b: k.b, c: k.c, d: k.d ?? 0 };
    this._conversionError = null;
    this._badText = null;
    this._notice = null;
    let convention = this._controls.convention;
    let values: Record<string, number>;
    try {
      values = valuesIn(this._k, convention);
    } catch (e) {
      this._notice = this._trans.__('Shown in convention L: the %1 form cannot hold these coefficients (%2).', this._controls.conventionName(convention), translateMessage(this._trans, messageOf(e)));
      convention = 'L';
      values = valuesIn(this._k, convention);
    }
    this._values = values;
    this._controls.showCoefficients(convention, values);
    this._T = Number.isFinite(state.T) ? (state.T as number) : defaultTemperature(this._k);
    this._h = Number.isFinite(state.h) ? (state.h as number) : 0;
    this._rangesKey = '';
    this._controls.setState('T', this._T);
    this._controls.setState('h', this._h);
    this._lastGood = { ...this._k };
    this._scenarioChanged.emit();
    return this._schedule();
  }

  /** Redraw with the current theme colours. */
  redraw(): Promise<void> {
    return this._schedule();
  }

  dispose(): void {
    if (this.isDisposed) {
      return;
    }
    this._throttle.cancel();
    super.dispose();
  }

  private _onCoefficient(key: string, value: number): void {
    this._badText = null;
    this._notice = null;
    this._values = { ...this._values, [key]: value };
    const before = this._k;
    try {
      this._k = coefficientsFrom(this._controls.convention, this._values);
      this._conversionError = null;
    } catch (e) {
      this._k = null;
      this._conversionError = translateMessage(this._trans, messageOf(e));
    }
    if (before && this._k && before.T0 !== this._k.T0 && Number.isFinite(this._k.T0) && Number.isFinite(before.T0)) {
      // keep T − T0: the landscape keeps its shape when T0 moves
      this._T += this._k.T0 - before.T0;
      this._controls.setState('T', this._T);
    }
    if (this._k) {
      this._lastGood = { ...this._k };
      this._scenarioChanged.emit();
    }
    this._schedule();
  }

  private _onState(key: 'T' | 'h', value: number): void {
    this._badText = null;
    this._notice = null;
    if (key === 'T') {
      this._T = value;
    } else {
      this._h = value;
    }
    this._scenarioChanged.emit();
    this._schedule();
  }

  private _onConvention(next: LandauConvention): void {
    const trans = this._trans;
    if (!this._k) {
      this._controls.revertConvention();
      this._showMessage(trans.__('Enter valid coefficients before changing the convention.'));
      return;
    }
    let values: Record<string, number>;
    try {
      values = valuesIn(this._k, next);
    } catch (e) {
      this._controls.revertConvention();
      this._notice = trans.__('The %1 form cannot hold these coefficients: %2.', this._controls.conventionName(next), translateMessage(this._trans, messageOf(e)));
      this._showMessage(this._notice);
      return;
    }
    this._notice = null;
    this._values = values;
    this._controls.showCoefficients(next, values);
    this._scenarioChanged.emit();
    this._schedule();
  }

  private _showMessage(text: string | null): void {
    this._message.node.textContent = text ?? '';
    this._message.node.hidden = text === null;
  }

  private _schedule(): Promise<void> {
    return this._throttle.request();
  }

  private async _draw(): Promise<void> {
    if (this.isDisposed) {
      return;
    }
    const problem = explorerProblem({ badText: this._badText, conversionError: this._conversionError, k: this._k, T: this._T, h: this._h }, this._trans);
    if (problem !== null) {
      this._showMessage(problem);
      return;
    }
    const k = { ...(this._k as ILandauCoefficients) };
    const T = this._T;
    const h = this._h;
    const derived = explorerDerived(k);
    const key = JSON.stringify(k);
    if (key !== this._rangesKey) {
      const r = stateRanges(k, derived.Tsuperheat ?? k.T0, derived.criticalEndPoint?.h ?? Number.NaN);
      this._controls.setStateRange('T', r.T);
      this._controls.setStateRange('h', r.h);
      this._rangesKey = key;
    }
    const bounds = this._controls.stateBounds('T');
    const bkey = JSON.stringify([k, h, bounds.min, bounds.max]);
    if (bkey !== this._branchesKey || !this._branchesData) {
      this._branchesData = branchesData(k, bounds.min, bounds.max, h);
      this._branchesKey = bkey;
    }
    const land = landscapeData(k, T, h, 1.25 * this._branchesData.psiMax);
    const theme = readChartTheme(this.node);
    const trans = this._trans;
    const ls = landscapeSpec(land, T, h, theme, trans);
    const bs = branchesSpec(this._branchesData, derived, T, h, theme, trans);
    this._derived = derived;
    this._derivedSection.present(derived, this._controls.conventionName(this._controls.convention), T, h, land);
    this._showMessage(this._notice);
    // Only the current-T rule of the branches chart follows T: move it in place when nothing else changed.
    const drawnKey = JSON.stringify([bkey, theme, derived.T1, derived.Tsuperheat, this._controls.convention]);
    const current = [{ T, label: trans.__('T = %1', formatValue(T)) }];
    const full = (): Promise<void> => {
      this._branchesBusy++;
      return this._branches.render(bs.spec, bs.label).finally(() => this._branchesBusy--);
    };
    const branches =
      drawnKey === this._branchesDrawn && this._branchesBusy === 0
        ? this._branches.patch('current', current, bs.label).then(ok => (ok ? undefined : full()))
        : full();
    this._branchesDrawn = drawnKey;
    await Promise.all([this._landscape.render(ls.spec, ls.label), branches]);
  }

  private _trans: TranslationBundle;
  private _controls: ExplorerControls;
  private _message: Widget;
  private _landscape = new PatchableChartView();
  private _branches = new PatchableChartView();
  /** What the branches chart was last fully drawn from (all but T). */
  private _branchesDrawn = '';
  /** Full renders of the branches chart in flight (no in-place moves meanwhile). */
  private _branchesBusy = 0;
  private _derivedSection: DerivedSection;
  private _k: ILandauCoefficients | null = null;
  private _lastGood: ILandauCoefficients = { ...DEFAULT_LANDAU_INITIAL, d: 0 };
  private _scenarioChanged = new Signal<this, void>(this);
  private _values: Record<string, number> = {};
  private _T = Number.NaN;
  private _h = 0;
  private _derived: IExplorerDerived | null = null;
  private _conversionError: string | null = null;
  private _badText: string | null = null;
  private _notice: string | null = null;
  private _rangesKey = '';
  private _branchesKey = '';
  private _branchesData: IBranchesData | null = null;
  private _throttle = new FrameThrottle(
    () => this._draw(),
    e => this._showMessage(this._trans.__('The charts could not be drawn: %1', translateMessage(this._trans, messageOf(e))))
  );
}

/** Options of {@link LandauExplorer}. */
export namespace LandauExplorer {
  export interface IOptions {
    trans: TranslationBundle;
    /** Starting values; default the first-order example a = 0.5, b = −2, c = 4, T0 = 100. */
    initial?: ILandauExplorerInitial;
  }
}
