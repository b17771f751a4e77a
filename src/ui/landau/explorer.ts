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
import type { Message } from '@lumino/messaging';
import { Signal } from '@lumino/signaling';
import type { ISignal } from '@lumino/signaling';
import type { ILandauCoefficients, LandauConvention } from '../../core/physics/landau/index';
import { readChartTheme } from '../chart-theme';
import type { IBranchesData, IExplorerDerived, ILandscapeData } from '../../core/physics/landau/index';
import type { TopLevelSpec } from 'vega-lite';
import { branchesData, explorerDerived, landscapeData } from '../../core/physics/landau/index';
import { OVERLAY_LIMITS, overlayColumns, overlayRows } from '../../core/saved/explorers';
import { DerivedSection } from './derived-section';
import { formatValue } from './derived-table';
import { PatchableChartView } from './patchable-view';
import { explorerProblem } from './problems';
import { ExplorerControls } from './controls';
import { FrameThrottle } from './frame';
import { CONVENTIONS, coefficientsFrom, valuesIn } from './fields';
import { defaultTemperature, stateRanges } from './ranges';
import { branchesSpec, landscapeSpec } from './specs';
import { branchesRows, buildLandscape2dSpec, buildLoopSpec, buildPhaseDiagramSpec, landscape2dRows, landscapeFocus, landscapeRows, loopRows, phaseDiagramRows } from '../../charts/landau/index';
import { TITLE_PARAM } from '../../charts/frame';
import type { ICoupledCoefficients } from '../../core/physics/coupled';
import { compileFreeEnergy, typedErrorText } from '../../core/expr/index';
import { ExpressionError } from '../../core/expr/index';
import type { ITypedFreeEnergy } from '../../core/physics/landau/index';
import { coupledLandscape, landauFieldLoop, landauPhaseDiagram, linspace, typedCurve, typedFieldLoop, typedLoopRange, typedPhaseDiagram, typedStationary } from '../../core/physics/landau/index';
import type { IPhaseDiagram } from '../../core/physics/landau/index';
import type { WorkbenchPreset, WorkbenchView } from './workbench-parts';
import { DEFAULT_COUPLED, SliderGroup, WORKBENCH_PRESETS, WorkbenchTabs, coupledFields, presetFormula, presetName, presetSetting } from './workbench-parts';

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
  /** Preset the free energy was set from. */
  preset?: WorkbenchPreset;
  presetValues?: Record<string, number>;
  /** A free energy typed by the user, with its coefficients' values. */
  typed?: { text: string; values: Record<string, number> };
  /** Coefficients of the two-order-parameter landscape (a1, T1, b1, a2, T2, b2, lambda). */
  coupled?: Record<string, number>;
  /** The chart tab shown ("branches", from scenarios saved before, shows the first tab). */
  view?: WorkbenchView | 'branches';
  /** Measured points and fitted curve drawn over the branches (thinned to {@link OVERLAY_LIMITS}). */
  overlay?: ILandauOverlay;
}

/** Measured points and a fitted curve drawn over the branches (e.g. from a Landau fit). */
export interface ILandauOverlay {
  data: { T: number; psi: number }[];
  fitted: { T: number; psi: number }[];
}

/** Axes of the charts, fixed while sliders move. */
export interface IWorkbenchAxes {
  T: [number, number];
  psi: [number, number];
  landscapePsi: [number, number];
  landscapeF: [number, number];
  /** Field axis of the phase diagram (set when it is first drawn). */
  h: [number, number] | null;
  /** Half-range of the loop's field (set when it is first drawn). */
  loop: number | null;
  /** Half-widths of ψ and φ of the two-order-parameter landscape (set when it is first drawn). */
  grid2d?: [number, number] | null;
}

/** The overlay with finite points only, each series thinned to its limit in {@link OVERLAY_LIMITS}. */
function thinOverlay(o: ILandauOverlay): ILandauOverlay {
  return { data: overlayRows(overlayColumns(o.data, OVERLAY_LIMITS.data)), fitted: overlayRows(overlayColumns(o.fitted, OVERLAY_LIMITS.fitted)) };
}

/** The 2-4-6 free energy with its cubic term, compiled once (its phase diagram comes from the free energy on a grid). */
let cubicLandau: ITypedFreeEnergy | null = null;
function landauWithCubic(): ITypedFreeEnergy {
  cubicLandau ??= compileFreeEnergy('a/2*(T - T0)*ψ^2 + d/3*ψ^3 + b/4*ψ^4 + c/6*ψ^6 - h*ψ');
  return cubicLandau;
}

/** Area in px² of the measured points when no setting is given. */
const DEFAULT_POINT_SIZE = 30;

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
    // a field that does not hold a finite number: said once, the last good picture stays
    const onInvalid = (label: string, text: string): void => {
      this._badText = text === '' ? trans.__('%1: enter a finite number.', label) : trans.__('%1: “%2” is not a finite number.', label, text);
      this._schedule();
    };
    this._controls = new ExplorerControls({
      trans,
      onCoefficient: (key, v) => this._onCoefficient(key, v),
      onState: (key, v) => this._onState(key, v),
      onInvalid,
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
    this._phase.addClass('jp-psiscape-landau-phase-diagram');
    this._grid2d.addClass('jp-psiscape-landau-landscape-2d');
    this._loop.addClass('jp-psiscape-landau-loop');
    this._overlay = options.overlay ? thinOverlay(options.overlay) : null;
    this._pointSize = options.pointSize ?? DEFAULT_POINT_SIZE;
    // the two-order-parameter sliders live in their tab
    this._coupledGroup = new SliderGroup({ trans, title: trans.__('two order parameters'), className: 'jp-psiscape-landau-coupled', onInvalid });
    const grid2dPanel = new Panel();
    grid2dPanel.addWidget(this._coupledGroup);
    this._grid2dNote.addClass('jp-psiscape-landau-note');
    this._grid2dNote.node.setAttribute('aria-live', 'polite');
    grid2dPanel.addWidget(this._grid2dNote);
    grid2dPanel.addWidget(this._grid2d);
    this._phaseNote.addClass('jp-psiscape-landau-note');
    const phasePanel = new Panel();
    phasePanel.addWidget(this._phaseNote);
    phasePanel.addWidget(this._phase);
    this._loopNote.addClass('jp-psiscape-landau-note');
    const loopPanel = new Panel();
    loopPanel.addWidget(this._loopNote);
    loopPanel.addWidget(this._loop);
    // the landscape and the branches side by side (stacked when narrow): what a slider move changes at once
    const pair = new Panel();
    pair.addClass('jp-psiscape-landau-pair');
    pair.addWidget(this._landscape);
    pair.addWidget(this._branches);
    const panels = { landscape: pair as Widget, 'phase-diagram': phasePanel as Widget, 'landscape-2d': grid2dPanel as Widget, loop: loopPanel as Widget };
    this._tabs = new WorkbenchTabs({
      trans,
      panels,
      onSelect: () => {
        this._scenarioChanged.emit();
        this._schedule();
      }
    });
    charts.addWidget(this._tabs);
    for (const w of Object.values(panels)) {
      charts.addWidget(w);
    }
    this._workbench = this._buildWorkbenchBar(onInvalid);
    this._showCoupled();
    this._derivedSection = new DerivedSection(trans);
    this.addWidget(this._workbench);
    this.addWidget(this._controls);
    this.addWidget(this._typedGroup);
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
    return {
      a: k.a,
      T0: k.T0,
      b: k.b,
      c: k.c,
      d: k.d ?? 0,
      convention: this._controls.convention,
      T: this._T,
      h: this._h,
      ...(this._preset ? { preset: this._preset, presetValues: { ...this._presetValues } } : {}),
      ...(this._typed ? { typed: { text: this._typed.f.text, values: { ...this._typed.values } } } : {}),
      // the two-order-parameter coefficients and the tab only when they differ from the defaults (older scenarios keep their shape)
      ...(JSON.stringify(this._coupled) !== JSON.stringify(DEFAULT_COUPLED) ? { coupled: { ...this._coupled } as unknown as Record<string, number> } : {}),
      ...(this._tabs.selected !== 'landscape' ? { view: this._tabs.selected } : {}),
      ...(this._overlay ? { overlay: { data: this._overlay.data.slice(), fitted: this._overlay.fitted.slice() } } : {})
    };
  }

  /** The chart tab shown. */
  get view(): WorkbenchView {
    return this._tabs.selected;
  }

  /** Shows a chart tab. */
  selectView(view: string): void {
    this._tabs.select(view);
  }

  /** Area in px² of the measured points drawn over the branches (the point-size setting). */
  get pointSize(): number {
    return this._pointSize;
  }

  set pointSize(value: number) {
    if (value !== this._pointSize && Number.isFinite(value) && value > 0) {
      this._pointSize = value;
      void this._schedule();
    }
  }

  /** The measured points and fitted curve drawn over the branches, or null. */
  get overlay(): ILandauOverlay | null {
    return this._overlay;
  }

  /** The typed free energy in use, or null. */
  get typed(): { text: string; coefficients: readonly string[]; values: Record<string, number> } | null {
    return this._typed ? { text: this._typed.f.text, coefficients: this._typed.f.coefficients, values: { ...this._typed.values } } : null;
  }

  /** The preset the free energy was set from, or null. */
  get preset(): WorkbenchPreset | null {
    return this._preset;
  }

  /** Fixed axes of the charts (set with the view; moved only by {@link fitView}). */
  get axes(): IWorkbenchAxes | null {
    return this._axes ? { ...this._axes } : null;
  }

  /** Recomputes the axes of every chart from what is shown now. */
  fitView(): Promise<void> {
    this._axes = null;
    return this._schedule();
  }

  /**
   * Sets the free energy from a preset (its coefficients, convention and
   * own sliders) and shows its chart.
   */
  applyPreset(preset: WorkbenchPreset | null, values: Record<string, number> = {}): Promise<void> {
    this._preset = preset;
    this._presetSelect.value = preset ?? '';
    if (!preset) {
      this._presetValues = {};
      this._presetGroup.node.hidden = true;
      this._scenarioChanged.emit();
      return this._schedule();
    }
    const setting = presetSetting(preset, values);
    this._presetValues = { ...setting.values };
    this._showPresetSliders();
    this._clearTyped();
    const done = this.setScenario({ ...setting.coefficients, convention: setting.convention, preset, presetValues: setting.values });
    this._tabs.select(setting.view);
    return done;
  }

  /**
   * Uses a free energy typed by the user (null: back to the Landau form).
   * Resolves with the error text (with a caret line) when it cannot be read.
   */
  async setTypedFreeEnergy(text: string | null, values: Record<string, number> = {}): Promise<string | null> {
    if (text === null || text.trim() === '') {
      this._clearTyped();
      this._axes = null;
      this._scenarioChanged.emit();
      await this._schedule();
      return null;
    }
    this._typedInput.value = text;
    let f: ITypedFreeEnergy;
    try {
      f = compileFreeEnergy(text);
    } catch (e) {
      const words = translateMessage(this._trans, messageOf(e));
      const shown = typedErrorText(text, words, e instanceof ExpressionError ? e.position : null);
      this._typedError.textContent = shown;
      this._typedError.hidden = false;
      return shown;
    }
    this._typedError.hidden = true;
    this._typedError.textContent = '';
    const k = this._k ?? this._lastGood;
    const guess: Record<string, number> = { a: k.a, T0: k.T0, b: k.b, c: k.c, d: k.d ?? 0 };
    const next: Record<string, number> = {};
    for (const name of f.coefficients) {
      next[name] = Number.isFinite(values[name]) ? values[name] : Number.isFinite(guess[name]) ? guess[name] : 1;
    }
    this._typed = { f, values: next };
    this._preset = null;
    this._presetSelect.value = '';
    this._presetGroup.node.hidden = true;
    this._typedGroup.setFields(
      this._trans.__('F = %1', text),
      f.coefficients.map(name => ({ key: name, symbol: name, description: this._trans.__('coefficient %1 of the typed free energy', name), value: next[name], range: name.startsWith('T') ? 'temperature' : 'signed' })),
      (key, v) => {
        if (this._typed) {
          this._typed.values = { ...this._typed.values, [key]: v };
          this._badText = null;
          this._scenarioChanged.emit();
          this._schedule();
        }
      }
    );
    this._typedGroup.node.hidden = false;
    this._controls.setLandauShown(false);
    this._axes = null;
    this._scenarioChanged.emit();
    await this._schedule();
    return null;
  }

  private _clearTyped(): void {
    this._typed = null;
    this._controls.setLandauShown(true);
    this._typedGroup.node.hidden = true;
    this._typedError.hidden = true;
  }

  private _showPresetSliders(): void {
    const preset = this._preset;
    const trans = this._trans;
    if (!preset) {
      this._presetGroup.node.hidden = true;
      return;
    }
    const own = preset === 'bean-rodbell'
      ? [
          { key: 'eta', symbol: 'η', description: trans.__('magnetovolume coupling η (first order above 1)'), value: this._presetValues.eta, range: 'non-negative' as const },
          { key: 'T0', symbol: 'T0', description: trans.__('Curie temperature T0 of the rigid lattice'), value: this._presetValues.T0, range: 'temperature' as const }
        ]
      : [];
    this._presetGroup.setFields(presetFormula(trans, preset), own, (key, v) => {
      this._presetValues = { ...this._presetValues, [key]: v };
      if (this._preset === 'bean-rodbell') {
        const s = presetSetting('bean-rodbell', this._presetValues);
        this._replaceCoefficients(s.coefficients);
      }
    });
    this._presetGroup.node.hidden = false;
  }

  /** New coefficients from a preset's own slider, keeping T − T0, h and the axes. */
  private _replaceCoefficients(k: ILandauCoefficients): void {
    const before = this._k ?? this._lastGood;
    this._k = { ...k, d: k.d ?? 0 };
    this._lastGood = { ...this._k };
    this._T += this._k.T0 - before.T0;
    this._controls.setState('T', this._T);
    try {
      this._values = valuesIn(this._k, this._controls.convention);
      this._controls.showCoefficients(this._controls.convention, this._values);
    } catch {
      // shown in L by the next setCoefficients
    }
    this._scenarioChanged.emit();
    this._schedule();
  }

  private _showCoupled(): void {
    this._coupledGroup.setFields(this._trans.__('F(ψ, φ) = (a1/2)(T − T1)ψ² + (b1/4)ψ⁴ + (a2/2)(T − T2)φ² + (b2/4)φ⁴ + (λ/2)ψ²φ²'), coupledFields(this._trans, this._coupled), (key, v) => {
      this._coupled = { ...this._coupled, [key]: v };
      this._badText = null;
      this._scenarioChanged.emit();
      this._schedule();
    });
  }

  private _buildWorkbenchBar(onInvalid: (label: string, text: string) => void): Widget {
    const trans = this._trans;
    const bar = new Panel();
    bar.addClass('jp-psiscape-landau-workbench');
    const row = new Widget();
    row.addClass('jp-psiscape-landau-workbench-row');
    const pick = document.createElement('label');
    pick.className = 'jp-psiscape-picker';
    const pickText = document.createElement('span');
    pickText.textContent = trans.__('preset');
    this._presetSelect.className = 'jp-mod-styled jp-psiscape-landau-preset';
    for (const p of ['', ...WORKBENCH_PRESETS] as const) {
      const option = document.createElement('option');
      option.value = p;
      option.textContent = presetName(trans, p);
      this._presetSelect.appendChild(option);
    }
    pick.append(pickText, this._presetSelect);
    this._presetSelect.addEventListener('change', () => {
      const v = this._presetSelect.value;
      void this.applyPreset(v === '' ? null : (v as WorkbenchPreset));
    });
    const fit = document.createElement('button');
    fit.type = 'button';
    fit.className = 'jp-mod-styled jp-psiscape-landau-fit-view';
    fit.textContent = trans.__('Fit the view');
    fit.title = trans.__('Recompute the axes of the charts from what they show now (the axes stay put while sliders move)');
    fit.addEventListener('click', () => void this.fitView());
    row.node.append(pick, fit);
    const typed = new Widget();
    typed.addClass('jp-psiscape-landau-typed');
    const label = document.createElement('label');
    label.className = 'jp-psiscape-landau-typed-label';
    const labelText = document.createElement('span');
    labelText.textContent = trans.__('free energy F(ψ; T, h) of your own (ψ or psi, T, h and named coefficients)');
    this._typedInput.type = 'text';
    this._typedInput.className = 'jp-mod-styled jp-psiscape-landau-typed-input';
    this._typedInput.placeholder = 'a/2*(T - T0)*ψ^2 + b/4*ψ^4 + c/6*ψ^6 - h*ψ';
    this._typedInput.spellcheck = false;
    label.append(labelText, this._typedInput);
    const use = document.createElement('button');
    use.type = 'button';
    use.className = 'jp-mod-styled jp-psiscape-landau-typed-use';
    use.textContent = trans.__('Use');
    use.addEventListener('click', () => void this.setTypedFreeEnergy(this._typedInput.value));
    const clear = document.createElement('button');
    clear.type = 'button';
    clear.className = 'jp-mod-styled jp-psiscape-landau-typed-clear';
    clear.textContent = trans.__('Back to the Landau form');
    clear.addEventListener('click', () => {
      this._typedInput.value = '';
      void this.setTypedFreeEnergy(null);
    });
    this._typedInput.addEventListener('keydown', e => {
      if (e.key === 'Enter') {
        e.preventDefault();
        void this.setTypedFreeEnergy(this._typedInput.value);
      }
    });
    this._typedError.className = 'jp-psiscape-landau-typed-error';
    this._typedError.setAttribute('role', 'alert');
    this._typedError.hidden = true;
    typed.node.append(label, use, clear, this._typedError);
    this._presetGroup = new SliderGroup({ trans, title: trans.__('preset parameters'), className: 'jp-psiscape-landau-preset-values', onInvalid });
    this._presetGroup.node.hidden = true;
    this._typedGroup = new SliderGroup({ trans, title: trans.__('coefficients of the typed free energy'), className: 'jp-psiscape-landau-typed-coefficients', onInvalid });
    this._typedGroup.node.hidden = true;
    bar.addWidget(row);
    bar.addWidget(this._presetGroup);
    bar.addWidget(typed);
    return bar;
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
    if (state.overlay && Array.isArray(state.overlay.data) && Array.isArray(state.overlay.fitted)) {
      this._overlay = thinOverlay(state.overlay);
    }
    if (state.coupled) {
      this._coupled = { ...DEFAULT_COUPLED, ...(state.coupled as Partial<ICoupledCoefficients>) };
      this._showCoupled();
    }
    if (state.preset && (WORKBENCH_PRESETS as readonly string[]).includes(state.preset)) {
      this._preset = state.preset;
      this._presetSelect.value = state.preset;
      this._presetValues = presetSetting(state.preset, state.presetValues ?? {}).values;
      this._showPresetSliders();
    }
    const done = this.setCoefficients({ a: state.a, T0: state.T0, b: state.b, c: state.c, d: state.d ?? 0 }, { T: state.T, h: state.h });
    if (state.view) {
      this._tabs.select(state.view);
    }
    if (state.typed && typeof state.typed.text === 'string') {
      return this.setTypedFreeEnergy(state.typed.text, state.typed.values).then(() => undefined);
    }
    return done;
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
    this._axes = null;
    this._controls.setState('T', this._T);
    this._controls.setState('h', this._h);
    this._lastGood = { ...this._k };
    this._scenarioChanged.emit();
    return this._schedule();
  }

  /** Redraw with the current theme colours (and chart scale). */
  redraw(): Promise<void> {
    this._theme = null;
    return this._schedule();
  }

  protected onAfterAttach(msg: Message): void {
    super.onAfterAttach(msg);
    this._theme = null;
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
    const typed = this._typed;
    const bkey = JSON.stringify([k, h, bounds.min, bounds.max, typed ? [typed.f.text, typed.values] : null]);
    if (bkey !== this._branchesKey || !this._branchesData) {
      this._branchesData = typed ? this._typedBranches(typed, bounds.min, bounds.max, h) : branchesData(k, bounds.min, bounds.max, h);
      this._branchesKey = bkey;
    }
    let land: ILandscapeData;
    if (typed) {
      const st = typedStationary(typed.f, T, h, typed.values, { psiMax: this._typedReach() });
      let reach = 0;
      for (const p of st.points) {
        reach = Math.max(reach, Math.abs(p.psi));
      }
      const psiMax = this._axes ? Math.max(Math.abs(this._axes.landscapePsi[0]), Math.abs(this._axes.landscapePsi[1])) : 1.25 * Math.max(reach, this._branchesData.psiMax, 1e-3);
      const c = typedCurve(typed.f, T, h, typed.values, psiMax);
      land = { psi: c.psi, F: c.F, points: st.points, global: st.global };
    } else {
      const psiMax = this._axes ? Math.max(Math.abs(this._axes.landscapePsi[0]), Math.abs(this._axes.landscapePsi[1])) : 1.25 * this._branchesData.psiMax;
      land = landscapeData(k, T, h, psiMax);
    }
    if (!this._axes) {
      this._axes = this._fitAxes(land, bounds);
    }
    const axes = this._axes;
    // the theme is read once until redraw() (a theme change, the presenter view) asks again: reading it forces a style pass
    if (!this._theme) {
      const read = readChartTheme(this.node);
      this._theme = { theme: read, key: JSON.stringify(read) };
    }
    const { theme, key: themeKey } = this._theme;
    // kept only once attached (before, the CSS variables are not known here)
    if (!this.isAttached) {
      this._theme = null;
    }
    const trans = this._trans;
    const ls = landscapeSpec(land, T, h, theme, trans, { xDomain: axes.landscapePsi, yDomain: axes.landscapeF });
    const overlay = this._overlay;
    const branchOptions = { xDomain: axes.T, yDomain: axes.psi, data: overlay?.data, fitted: overlay?.fitted, pointSize: this._pointSize, markers: typed === null };
    const bs = branchesSpec(this._branchesData, derived, T, h, theme, trans, branchOptions);
    this._derived = derived;
    this._derivedSection.present(derived, this._controls.conventionName(this._controls.convention), T, h, land);
    this._derivedSection.node.hidden = typed !== null;
    this._showMessage(this._notice);
    // Only the charts of the tab shown are drawn; the others catch up when their tab is chosen.
    const pairShown = this._tabs.selected === 'landscape';
    let landscape: Promise<void> = Promise.resolve();
    let branches: Promise<void> = Promise.resolve();
    if (pairShown) {
      // the landscape: rows and title in place while its frame (theme, axes) stays
      const landRows = landscapeRows(ls.options);
      const landFrame = JSON.stringify([themeKey, axes.landscapePsi, axes.landscapeF]);
      const landTitle = { [TITLE_PARAM]: ls.options.labels?.title ?? '' };
      landscape =
        landFrame === this._landscapeDrawn && this._landscapeBusy === 0
          ? this._landscape.patchMany(landRows, ls.label, landTitle).then(ok => (ok ? undefined : this._full(this._landscape, ls.spec, ls.label, 'landscape')))
          : this._full(this._landscape, ls.spec, ls.label, 'landscape');
      this._landscapeDrawn = landFrame;
      // the branches: only the current-T rule moves when nothing else changed; otherwise every dataset and the title in place
      const drawnKey = JSON.stringify([bkey, themeKey, derived.T1, derived.Tsuperheat, this._controls.convention, axes]);
      const frameKey = JSON.stringify([themeKey, axes, this._controls.convention, overlay !== null, this._pointSize]);
      const current = [{ T, label: trans.__('T = %1', formatValue(T)) }];
      if (drawnKey === this._branchesDrawn && this._branchesBusy === 0) {
        branches = this._branches.patch('current', current, bs.label).then(ok => (ok ? undefined : this._full(this._branches, bs.spec, bs.label, 'branches')));
      } else if (frameKey === this._branchesFrame && this._branchesBusy === 0) {
        branches = this._branches
          .patchMany(branchesRows(bs.options), bs.label, { [TITLE_PARAM]: bs.options.labels?.title ?? '' })
          .then(ok => (ok ? undefined : this._full(this._branches, bs.spec, bs.label, 'branches')));
      } else {
        branches = this._full(this._branches, bs.spec, bs.label, 'branches');
      }
      this._branchesDrawn = drawnKey;
      this._branchesFrame = frameKey;
    }
    const heavy = this._drawSelected(k, T, h, theme, themeKey, axes, typed !== null);
    await Promise.all([landscape, branches, heavy]);
  }

  /** A full render, counted so in-place updates wait for it. */
  private _full(view: PatchableChartView, spec: TopLevelSpec, label: string, which: 'landscape' | 'branches' | 'heavy'): Promise<void> {
    if (which === 'landscape') {
      this._landscapeBusy++;
      return view.render(spec, label).finally(() => this._landscapeBusy--);
    }
    if (which === 'branches') {
      this._branchesBusy++;
      return view.render(spec, label).finally(() => this._branchesBusy--);
    }
    return view.render(spec, label);
  }

  /** Draws the phase diagram, the two-order-parameter landscape or the loop when its tab is shown. */
  private async _drawSelected(k: ILandauCoefficients, T: number, h: number, theme: ReturnType<typeof readChartTheme>, themeKey: string, axes: IWorkbenchAxes, typed: boolean): Promise<void> {
    const trans = this._trans;
    const view = this._tabs.selected;
    if (view === 'phase-diagram') {
      // the closed form for the 2-4-6 free energy; a typed one, or one with a cubic term, from its convex hull
      let pd: IPhaseDiagram;
      try {
        pd = this._phaseDiagram(k, axes);
      } catch (e) {
        this._phaseNote.node.textContent = translateMessage(trans, messageOf(e));
        this._phase.node.hidden = true;
        return;
      }
      this._phase.node.hidden = false;
      const numeric = typed !== null || (k.d ?? 0) !== 0;
      this._phaseNote.node.textContent =
        (pd.regime === 'first-order' ? trans.__('First-order lines end at critical end points; dashed: limits of metastability (spinodals).') : trans.__('The line h = 0 ends at the critical point Tc; dashed: limits of metastability (spinodals).')) +
        (numeric ? ' ' + trans.__('Found from the free energy on a grid (common tangents and F″ = 0), to about one grid step.') : '');
      const hSpan = axes.h ?? [-1.15 * pd.hMax, 1.15 * pd.hMax];
      if (!axes.h) {
        axes.h = hSpan;
      }
      const options = {
        lines: pd.lines,
        points: pd.points,
        current: { T, h },
        xDomain: axes.T,
        yDomain: hSpan,
        theme,
        labels: {
          title: trans.__('Phase diagram in (T, h)'),
          T: trans.__('temperature T'),
          h: trans.__('field h'),
          line: trans.__('line'),
          current: trans.__('T and h of the sliders'),
          lines: { 'first-order': trans.__('first order (equal minima)'), 'second-order': trans.__('h = 0 up to Tc'), spinodal: trans.__('limit of metastability') },
          points: { 'critical-end': trans.__('critical end point'), critical: trans.__('critical point'), tricritical: trans.__('tricritical point'), triple: trans.__('three equal minima') }
        }
      };
      const label = trans.__('Phase diagram in (T, h): %1 lines, %2 special points', pd.lines.length, pd.points.length);
      const frame = JSON.stringify([themeKey, axes.T, hSpan, pd.regime, pd.lines.map(l => l.id)]);
      if (frame === this._phaseDrawn && !(await this._phase.patchMany(phaseDiagramRows(options), label)) === false) {
        return;
      }
      this._phaseDrawn = frame;
      await this._phase.render(buildPhaseDiagramSpec(options).spec, label);
      return;
    }
    if (view === 'landscape-2d') {
      let L;
      try {
        L = coupledLandscape(this._coupled, T, axes.grid2d ? { psiMax: axes.grid2d[0], phiMax: axes.grid2d[1] } : {});
        if (!axes.grid2d) {
          axes.grid2d = [L.psi[L.n - 1], L.phi[L.n - 1]];
        }
      } catch (e) {
        this._showMessage(translateMessage(trans, messageOf(e)));
        return;
      }
      const phaseNames = { disordered: trans.__('neither (disordered)'), psi: trans.__('ψ only'), phi: trans.__('φ only'), mixed: trans.__('both ψ and φ') };
      const title = trans.__('F(ψ, φ) at T = %1: phase %2', formatValue(T), phaseNames[L.phase]);
      const options = {
        ...L,
        minima: L.minima.map(m => ({ ...m, label: `${m.global ? trans.__('global minimum') : trans.__('minimum')}: ${phaseNames[m.phase]}` })),
        theme,
        patchable: true,
        labels: { title, psi: trans.__('order parameter ψ'), phi: trans.__('order parameter φ'), F: 'F', minimum: trans.__('minimum'), global: trans.__('global minimum') }
      };
      const label = trans.__('Landscape of two order parameters at T = %1: phase %2, %3 minima', formatValue(T), phaseNames[L.phase], L.minima.length);
      this._grid2d.node.dataset.phase = L.phase;
      this._grid2dNote.node.textContent = trans._n('At T = %2 the stable phase has %3; %1 minimum in view.', 'At T = %2 the stable phase has %3; %1 minima in view.', L.minima.length, formatValue(T), phaseNames[L.phase]);
      // the grid's extent and the theme make the frame; new rows and title go into a drawn view in place
      const frame = JSON.stringify([themeKey, L.n, axes.grid2d]);
      if (frame === this._grid2dDrawn && (await this._grid2d.patchMany(landscape2dRows(options), label, { [TITLE_PARAM]: title }))) {
        return;
      }
      this._grid2dDrawn = frame;
      await this._grid2d.render(buildLandscape2dSpec(options).spec, label);
      return;
    }
    if (view === 'loop') {
      this._loop.node.hidden = false;
      const typedNow = this._typed;
      const hMax = axes.loop ?? (typedNow ? this._typedLoopRange(typedNow, T) : this._loopRange(k, T));
      if (!axes.loop) {
        axes.loop = hMax;
      }
      const n = 161;
      let path;
      try {
        path = typedNow ? typedFieldLoop(typedNow.f, typedNow.values, T, hMax, n, this._typedReach()) : landauFieldLoop(k, T, hMax, n);
      } catch (e) {
        this._loopNote.node.textContent = translateMessage(trans, messageOf(e));
        this._loop.node.hidden = true;
        return;
      }
      this._loopNote.node.textContent = trans._n('The loop follows the occupied minimum and jumps where it ends (%1 jump). The intrinsic coercive field exceeds measured ones by orders of magnitude.', 'The loop follows the occupied minimum and jumps where it ends (%1 jumps). The intrinsic coercive field exceeds measured ones by orders of magnitude.', path.jumps.length);
      const options = { points: path.points, turn: n, theme, labels: { title: trans.__('Field loop at T = %1', formatValue(T)), h: trans.__('field h (E)'), psi: trans.__('order parameter ψ (P)'), leg: trans.__('field'), up: trans.__('rising'), down: trans.__('falling') } };
      const label = trans.__('Field loop at T = %1 with %2 jumps', formatValue(T), path.jumps.length);
      const loopFrame = JSON.stringify([themeKey, hMax]);
      if (this._loopDrawn === loopFrame && (await this._loop.patchMany(loopRows(options), label))) {
        return;
      }
      this._loopDrawn = loopFrame;
      await this._loop.render(buildLoopSpec(options).spec, label);
    }
  }

  /** The phase diagram over the T axis, kept while the coefficients and the axes stay (a typed one costs a few ms). */
  private _phaseDiagram(k: ILandauCoefficients, axes: IWorkbenchAxes): IPhaseDiagram {
    const typed = this._typed;
    const key = JSON.stringify([typed ? [typed.f.text, typed.values] : k, axes.T, axes.psi]);
    if (this._phaseCache?.key === key) {
      return this._phaseCache.value;
    }
    let value: IPhaseDiagram;
    if (typed) {
      value = typedPhaseDiagram(typed.f, typed.values, { Tmin: axes.T[0], Tmax: axes.T[1], psiMax: this._typedReach() });
    } else if ((k.d ?? 0) !== 0) {
      const reach = 1.5 * Math.max(Math.abs(axes.psi[0]), Math.abs(axes.psi[1]), 1e-9);
      value = typedPhaseDiagram(landauWithCubic(), { a: k.a, T0: k.T0, b: k.b, c: k.c, d: k.d ?? 0 }, { Tmin: axes.T[0], Tmax: axes.T[1], psiMax: reach });
    } else {
      value = landauPhaseDiagram(k, { Tmin: axes.T[0], Tmax: axes.T[1] });
    }
    this._phaseCache = { key, value };
    return value;
  }

  /** Field range of a typed free energy's loop ({@link typedLoopRange}), or the h slider's range. */
  private _typedLoopRange(typed: { f: ITypedFreeEnergy; values: Record<string, number> }, T: number): number {
    const end = typedLoopRange(typed.f, typed.values, T, this._typedReach());
    const hb = this._controls.stateBounds('h');
    return end > 0 ? end : Math.max(Math.abs(hb.min), Math.abs(hb.max), 1e-9);
  }

  /** Field range of the loop: past the coercive field (end of the ordered branch), or the h slider's range. */
  private _loopRange(k: ILandauCoefficients, T: number): number {
    let end = 0;
    for (const p of linspace(0, 3 * this._branchesPsiMax(), 400)) {
      const d2 = k.a * (T - k.T0) + 2 * (k.d ?? 0) * p + 3 * k.b * p * p + 5 * k.c * p ** 4;
      if (d2 < 0) {
        end = Math.max(end, Math.abs(k.a * (T - k.T0) * p + (k.d ?? 0) * p * p + k.b * p ** 3 + k.c * p ** 5));
      }
    }
    const hb = this._controls.stateBounds('h');
    return end > 0 ? 1.5 * end : Math.max(Math.abs(hb.min), Math.abs(hb.max), 1e-9);
  }

  private _branchesPsiMax(): number {
    return this._branchesData?.psiMax ?? 1;
  }

  /** ψ range searched for the stationary points of a typed free energy. */
  private _typedReach(): number {
    return this._axes ? 1.5 * Math.max(Math.abs(this._axes.landscapePsi[0]), Math.abs(this._axes.landscapePsi[1])) : 10;
  }

  /** Stationary branches of a typed free energy over a T grid (no hysteresis paths). */
  private _typedBranches(typed: { f: ITypedFreeEnergy; values: Record<string, number> }, Tmin: number, Tmax: number, h: number): IBranchesData {
    const branches: IBranchesData['branches'] = [];
    let psiMax = 0;
    const reach = this._typedReach();
    for (const t of linspace(Tmin, Tmax, 121)) {
      for (const p of typedStationary(typed.f, t, h, typed.values, { psiMax: reach, n: 400 }).points) {
        branches.push({ T: t, psi: p.psi, kind: p.kind });
        psiMax = Math.max(psiMax, Math.abs(p.psi));
      }
    }
    const empty = { points: [], jumps: [], convention: 'L' as const };
    return { branches, heating: empty, cooling: empty, psiMax: psiMax > 0 ? psiMax : 1 };
  }

  /** Axes of every chart from what is shown now. */
  private _fitAxes(land: ILandscapeData, bounds: { min: number; max: number }): IWorkbenchAxes {
    let psiMax = this._branchesPsiMax();
    let psiMin = -psiMax;
    for (const p of this._branchesData?.branches ?? []) {
      psiMin = Math.min(psiMin, p.psi);
    }
    let Tlo = bounds.min;
    let Thi = bounds.max;
    for (const r of [...(this._overlay?.data ?? []), ...(this._overlay?.fitted ?? [])]) {
      if (Number.isFinite(r.T) && Number.isFinite(r.psi)) {
        psiMax = Math.max(psiMax, r.psi);
        psiMin = Math.min(psiMin, r.psi);
        Tlo = Math.min(Tlo, r.T);
        Thi = Math.max(Thi, r.T);
      }
    }
    const pad = 0.06 * (psiMax - psiMin || 1);
    const lp = Math.max(Math.abs(land.psi[0]), Math.abs(land.psi[land.psi.length - 1]));
    let F = landscapeFocus(land.points);
    if (!F) {
      let lo = Infinity;
      let hi = -Infinity;
      for (const f of land.F) {
        if (Number.isFinite(f)) {
          lo = Math.min(lo, f);
          hi = Math.max(hi, f);
        }
      }
      F = Number.isFinite(lo) && hi > lo ? [lo - 0.05 * (hi - lo), hi + 0.05 * (hi - lo)] : [-1, 1];
    }
    return { T: [Tlo, Thi], psi: [psiMin - pad, psiMax + pad], landscapePsi: [-lp, lp], landscapeF: F, h: null, loop: null, grid2d: null };
  }

  private _trans: TranslationBundle;
  private _controls: ExplorerControls;
  private _message: Widget;
  private _landscape = new PatchableChartView();
  private _branches = new PatchableChartView();
  private _phase = new PatchableChartView();
  private _grid2d = new PatchableChartView();
  private _loop = new PatchableChartView();
  private _phaseNote = new Widget({ node: document.createElement('p') });
  private _loopNote = new Widget({ node: document.createElement('p') });
  private _grid2dNote = new Widget({ node: document.createElement('p') });
  private _grid2dDrawn = '';
  private _phaseCache: { key: string; value: IPhaseDiagram } | null = null;
  private _theme: { theme: ReturnType<typeof readChartTheme>; key: string } | null = null;
  private _tabs: WorkbenchTabs;
  private _workbench: Widget;
  private _presetSelect = document.createElement('select');
  private _presetGroup!: SliderGroup;
  private _typedGroup!: SliderGroup;
  private _coupledGroup: SliderGroup;
  private _typedInput = document.createElement('input');
  private _typedError = document.createElement('pre');
  private _preset: WorkbenchPreset | null = null;
  private _presetValues: Record<string, number> = {};
  private _typed: { f: ITypedFreeEnergy; values: Record<string, number> } | null = null;
  private _coupled: ICoupledCoefficients = { ...DEFAULT_COUPLED };
  private _overlay: ILandauOverlay | null;
  private _pointSize: number;
  private _axes: IWorkbenchAxes | null = null;
  private _landscapeDrawn = '';
  private _landscapeBusy = 0;
  private _branchesFrame = '';
  private _phaseDrawn = '';
  private _loopDrawn = '';
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
    /** Measured points and a fitted curve drawn over the branches. */
    overlay?: ILandauOverlay;
    /** Area in px² of those points (default 30). */
    pointSize?: number;
  }
}
