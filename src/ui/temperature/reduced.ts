/**
 * The fitted points in reduced units, M/M0 against T/Tc, with the Tc and the
 * saturation scale M0 of the fit, beside reference curves of known models
 * (mean field for several J, the exact 2D Ising magnetisation, the 3D
 * classes' asymptotic laws), each with a check box and its citation in a
 * footnote list. Shown for fits that give a Tc and a scale.
 */
import type { TranslationBundle } from '@jupyterlab/translation';
import { Panel, Widget } from '@lumino/widgets';
import type { IChartTheme } from '../../charts/theme';
import { formatPlain } from '../../core/analysis';
import type { IAnalysisOutcome } from '../../core/analysis';
import type { AnalysisSession } from '../../core/analysis/session';
import { landauEquilibriumPsi } from '../../core/physics/landau/fit-model';
import { ChartView } from '../chart-view';
import { translateMessage } from '../translate';
import { reducedChart } from './charts';
import type { IReducedSeries } from './charts';
import type { ITemperatureViewOptions } from './common';
import type { IReducedReferenceCurve } from '../../core/physics/reference-curves';
import { defaultCurves, referenceCurves } from './reference';

/** How an outcome's points are reduced: m = ((y − offset)/M0)^(1/power), τ = T/Tc. */
export interface IReduction {
  Tc: number;
  M0: number;
  /** 2 when y goes as ψ² (so m = √(y/M0)), else 1. */
  power: number;
  /** Constant background subtracted first (0 without one). */
  offset: number;
  /** The fitted β, or ½ for the mean-field fits (which assume it). */
  beta: number;
  /** Names of the two numbers, for the caption (e.g. "Tc", "Ms"). */
  names: { Tc: string; M0: string };
}

/** A fit value by parameter name, or NaN. */
function param(outcome: IAnalysisOutcome, name: string): number {
  const i = outcome.fit.parameters.indexOf(name);
  return i >= 0 ? outcome.fit.values[i] : Number.NaN;
}

/** A derived value by name, or NaN. */
function derived(outcome: IAnalysisOutcome, name: string): number {
  return outcome.derived.find(d => d.name === name)?.value ?? Number.NaN;
}

/**
 * The Tc and saturation scale of an outcome, or null when it has none:
 * Weiss (Tc, Ms), power law (Tc, A; y0 subtracted; √ for data ∝ ψ²),
 * Landau (T1 or T0, and ψ at T = 0 of the fitted coefficients),
 * Bean–Rodbell and others with Tc or T0 and Ms, M0 or A.
 */
export function reductionOf(outcome: IAnalysisOutcome, proxyPower = 1): IReduction | null {
  const ok = (r: IReduction): IReduction | null => (Number.isFinite(r.Tc) && r.Tc > 0 && Number.isFinite(r.M0) && r.M0 !== 0 && Number.isFinite(r.beta) ? r : null);
  const fittedBeta = param(outcome, 'beta');
  if (outcome.kind === 'power-law' || outcome.kind === 'power-law-corrected') {
    const y0 = param(outcome, 'y0');
    return ok({
      Tc: param(outcome, 'Tc'),
      M0: param(outcome, 'A'),
      power: proxyPower === 2 ? 2 : 1,
      offset: Number.isFinite(y0) ? y0 : 0,
      beta: fittedBeta,
      names: { Tc: 'Tc', M0: 'A' }
    });
  }
  if (outcome.kind === 'landau' && outcome.landau) {
    const T1 = derived(outcome, 'T1');
    const Tc = Number.isFinite(T1) ? T1 : outcome.landau.T0;
    return ok({ Tc, M0: landauEquilibriumPsi(outcome.landau, 0), power: 1, offset: 0, beta: 0.5, names: { Tc: Number.isFinite(T1) ? 'T1' : 'T0', M0: 'ψ(0)' } });
  }
  const tcName = ['Tc', 'T1', 'T0'].find(n => Number.isFinite(param(outcome, n)) || Number.isFinite(derived(outcome, n)));
  const mName = ['Ms', 'M0', 'A'].find(n => Number.isFinite(param(outcome, n)));
  if (!tcName || !mName) {
    return null;
  }
  const derivedTc = derived(outcome, 'Tc');
  const Tc = Number.isFinite(derivedTc) ? derivedTc : Number.isFinite(param(outcome, tcName)) ? param(outcome, tcName) : derived(outcome, tcName);
  return ok({
    Tc,
    M0: param(outcome, mName),
    power: 1,
    offset: 0,
    beta: Number.isFinite(fittedBeta) ? fittedBeta : 0.5,
    names: { Tc: Number.isFinite(derivedTc) ? 'Tc' : tcName, M0: mName }
  });
}

/** Reduce points (only finite results, τ > 0). */
export function reducePoints(x: ArrayLike<number>, y: ArrayLike<number>, r: IReduction): IReducedSeries {
  const tau: number[] = [];
  const m: number[] = [];
  for (let i = 0; i < x.length; i++) {
    const t = x[i] / r.Tc;
    const q = (y[i] - r.offset) / r.M0;
    const v = r.power === 2 ? Math.sign(q) * Math.sqrt(Math.abs(q)) : q;
    if (Number.isFinite(t) && t > 0 && Number.isFinite(v)) {
      tau.push(t);
      m.push(v);
    }
  }
  return { tau, m };
}

/** The reduced plot with reference curves. */
export class ReducedPlotView extends Panel {
  constructor(options: ReducedPlotView.IOptions) {
    super();
    this._trans = options.trans;
    this._session = options.session;
    this._theme = options.theme;
    this.addClass('jp-psiscape-ReducedPlotView');
    this.addClass('jp-psiscape-TemperatureView');
    const t = this._trans;
    this.node.setAttribute('role', 'group');
    this.node.setAttribute('aria-label', t.__('Reduced plot M/M0 against T/Tc'));
    const heading = document.createElement('h3');
    heading.textContent = t.__('Reduced plot M/M0 against T/Tc');
    this._status = document.createElement('p');
    this._status.className = 'jp-psiscape-temp-status jp-psiscape-reduced-status';
    this._status.setAttribute('role', 'status');
    this._status.setAttribute('aria-live', 'polite');
    this._curves = document.createElement('fieldset');
    this._curves.className = 'jp-psiscape-reduced-curves';
    const legend = document.createElement('legend');
    legend.textContent = t.__('Reference curves');
    this._curves.appendChild(legend);
    this._footnotes = document.createElement('ol');
    this._footnotes.className = 'jp-psiscape-temp-citations jp-psiscape-reduced-citations';
    this._footnotes.setAttribute('aria-label', t.__('Sources of the reference curves'));
    this._caption = document.createElement('p');
    this._caption.className = 'jp-psiscape-fit-convention jp-psiscape-reduced-caption';
    const head = new Widget();
    head.node.append(heading, this._status);
    this._chart = new ChartView();
    this._chart.addClass('jp-psiscape-reduced-chart');
    this._chart.hide();
    const foot = new Widget();
    foot.node.append(this._caption, this._curves, this._footnotes);
    this.addWidget(head);
    this.addWidget(this._chart);
    this.addWidget(foot);
    this._setMessage(t.__('Fit the data first: the reduced plot needs a fit with a Tc and a saturation scale.'));
  }

  /** The chart widget. */
  get chart(): ChartView {
    return this._chart;
  }

  /** Resolves when the latest chart has been drawn. */
  get rendered(): Promise<void> {
    return this._rendered;
  }

  /** Same as {@link rendered}. */
  get settled(): Promise<void> {
    return this._rendered;
  }

  /** The reduction shown (Tc, M0, …), or null. */
  get reduction(): IReduction | null {
    return this._reduction;
  }

  /** Ids of the reference curves shown. */
  get shown(): string[] {
    return [...this._boxes].filter(([, box]) => box.checked).map(([id]) => id);
  }

  /**
   * Show an outcome (null: nothing). The points are the session's plotted
   * columns inside the outcome's window unless given. Without arguments it
   * is Lumino's `update()` (an update request), as for any widget.
   */
  update(outcome?: IAnalysisOutcome | null, points?: { x: ArrayLike<number>; y: ArrayLike<number> }): Promise<void> {
    if (outcome === undefined) {
      super.update();
      return this._rendered;
    }
    const t = this._trans;
    this._outcome = outcome;
    if (!outcome) {
      this._reduction = null;
      this._setMessage(t.__('Fit the data first: the reduced plot needs a fit with a Tc and a saturation scale.'));
      return this._rendered;
    }
    const proxy = this._session.kind === outcome.kind ? Number(this._session.options.proxyPower ?? 1) : 1;
    const r = reductionOf(outcome, proxy);
    this._reduction = r;
    if (!r) {
      this._setMessage(t.__('This fit gives no Tc and saturation scale to reduce the data by.'));
      return this._rendered;
    }
    this._points = points ? { x: Array.from(points.x), y: Array.from(points.y) } : this._sessionPoints(outcome.window);
    this._reduced = reducePoints(this._points.x, this._points.y, r);
    let tauMax = 0;
    for (const v of this._reduced.tau) {
      tauMax = Math.max(tauMax, v);
    }
    this._buildBoxes(referenceCurves(tauMax), r.beta);
    this._status.textContent = t.__('Reduced by %1 = %2 and %3 = %4.', r.names.Tc, formatPlain(r.Tc), r.names.M0, formatPlain(r.M0));
    this._caption.textContent = [
      r.power === 2 ? t.__('m = √(y/%1) for data ∝ ψ², τ = T/%2.', r.names.M0, r.names.Tc) : t.__('m = y/%1, τ = T/%2.', r.names.M0, r.names.Tc),
      r.offset !== 0 ? t.__('The fitted background y0 = %1 is subtracted from y first.', formatPlain(r.offset)) : '',
      t.__('Each reference curve is m(τ) of the model named, with its source in the list below.')
    ]
      .filter(s => s)
      .join(' ');
    this._curves.hidden = false;
    this._footnotes.hidden = false;
    return this._draw();
  }

  /** Show or hide one reference curve by id (as its check box does). */
  setCurve(id: string, shown: boolean): Promise<void> {
    const box = this._boxes.get(id);
    if (box && box.checked !== shown) {
      box.checked = shown;
      return this._draw();
    }
    return this._rendered;
  }

  /** Redraw (theme change). */
  redraw(): Promise<void> {
    return this._outcome && this._reduction ? this._draw() : this._rendered;
  }

  private _sessionPoints(window: { min: number; max: number }): { x: number[]; y: number[] } {
    const p = this._session.plotted();
    const x: number[] = [];
    const y: number[] = [];
    if (!p) {
      return { x, y };
    }
    const xs = p.x.column.values as ArrayLike<number>;
    const ys = p.y.column.values as ArrayLike<number>;
    for (let i = 0; i < xs.length; i++) {
      if (xs[i] >= window.min && xs[i] <= window.max && Number.isFinite(ys[i])) {
        x.push(xs[i]);
        y.push(ys[i]);
      }
    }
    return { x, y };
  }

  /** Check boxes and footnotes of the curves; defaults chosen for the fitted β, the user's choices kept. */
  private _buildBoxes(curves: IReducedReferenceCurve[], beta: number): void {
    const t = this._trans;
    const before = this._boxes.size > 0 ? new Set(this.shown) : null;
    const shownByDefault = new Set(defaultCurves(beta));
    this._sampled = curves.map(c => ({ id: c.id, label: translateMessage(t, c.label), tau: c.tau, m: c.m }));
    this._boxes = new Map();
    const items: HTMLElement[] = [];
    const notes: HTMLElement[] = [];
    const citations: string[] = [];
    curves.forEach((e, k) => {
      const box = document.createElement('input');
      box.type = 'checkbox';
      box.className = 'jp-psiscape-reduced-curve';
      box.dataset.curve = e.id;
      box.checked = before ? before.has(e.id) : shownByDefault.has(e.id);
      box.addEventListener('change', () => void this._draw());
      this._boxes.set(e.id, box);
      let n = citations.indexOf(e.citation);
      if (n < 0) {
        citations.push(e.citation);
        n = citations.length - 1;
        const li = document.createElement('li');
        li.textContent = e.citation;
        notes.push(li);
      }
      const label = document.createElement('label');
      label.className = 'jp-psiscape-reduced-curve-label';
      const text = document.createElement('span');
      text.textContent = this._sampled[k].label;
      const ref = document.createElement('sup');
      ref.textContent = `[${n + 1}]`;
      ref.title = e.citation;
      label.append(box, text, ref);
      items.push(label);
    });
    this._curves.replaceChildren(this._curves.querySelector('legend')!, ...items);
    this._footnotes.replaceChildren(...notes);
  }

  private _draw(): Promise<void> {
    const r = this._reduction;
    const outcome = this._outcome;
    if (!r || !outcome) {
      return this._rendered;
    }
    const t = this._trans;
    const chart = reducedChart({ points: this._reduced, curves: this._sampled, shown: this.shown }, this._theme());
    this._chart.show();
    this._rendered = this._chart.render(chart.spec, t.__('Reduced plot M/M0 against T/Tc with reference curves'));
    return this._rendered;
  }

  private _setMessage(text: string): void {
    this._status.textContent = text;
    this._caption.textContent = '';
    this._curves.hidden = true;
    this._footnotes.hidden = true;
    this._chart.clear();
    this._chart.hide();
  }

  private readonly _trans: TranslationBundle;
  private readonly _session: AnalysisSession;
  private readonly _theme: () => IChartTheme;
  private readonly _chart: ChartView;
  private readonly _status: HTMLParagraphElement;
  private readonly _caption: HTMLParagraphElement;
  private readonly _curves: HTMLFieldSetElement;
  private readonly _footnotes: HTMLOListElement;
  private _outcome: IAnalysisOutcome | null = null;
  private _reduction: IReduction | null = null;
  private _points: { x: number[]; y: number[] } = { x: [], y: [] };
  private _reduced: IReducedSeries = { tau: [], m: [] };
  private _sampled: (IReducedSeries & { id: string; label: string })[] = [];
  private _boxes = new Map<string, HTMLInputElement>();
  private _rendered: Promise<void> = Promise.resolve();
}


export namespace ReducedPlotView {
  /** The runner is not used (nothing runs in the worker); the session gives the points. */
  export type IOptions = Pick<ITemperatureViewOptions, 'trans' | 'session' | 'theme'> & Partial<Pick<ITemperatureViewOptions, 'runner'>>;
}
