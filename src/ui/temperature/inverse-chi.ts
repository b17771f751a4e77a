/**
 * A Curie–Weiss fit as the straight line it is: 1/χ against T with the
 * fitted 1/(χ0 + C/(T − θ)) (a line when χ0 = 0) crossing zero at θ, and
 * θ, C and χ0 in words under it.
 */
import type { TranslationBundle } from '@jupyterlab/translation';
import { Panel, Widget } from '@lumino/widgets';
import type { IChartTheme } from '../../charts/theme';
import { formatWithError } from '../../core/analysis';
import type { IAnalysisOutcome } from '../../core/analysis';
import { ChartView } from '../chart-view';
import { inverseChiChart } from './charts';
import type { ISweepPoints } from './charts';
import type { AnalysisSession } from '../../core/analysis/session';
import type { ITemperatureViewOptions } from './common';

/** A parameter's value and standard error by name (NaN when missing). */
function valueOf(outcome: IAnalysisOutcome, name: string): { value: number; sigma: number } {
  const i = outcome.fit.parameters.indexOf(name);
  return i >= 0 ? { value: outcome.fit.values[i], sigma: outcome.fit.standardErrors[i] } : { value: Number.NaN, sigma: Number.NaN };
}

/** 1/χ against T with the fitted Curie–Weiss law. */
export class InverseChiView extends Panel {
  constructor(options: InverseChiView.IOptions) {
    super();
    this._trans = options.trans;
    this._theme = options.theme;
    this._session = options.session ?? null;
    this.addClass('jp-psiscape-InverseChiView');
    this.addClass('jp-psiscape-TemperatureView');
    const t = this._trans;
    this.node.setAttribute('role', 'group');
    this.node.setAttribute('aria-label', t.__('Inverse susceptibility 1/χ against T'));
    const heading = document.createElement('h3');
    heading.textContent = t.__('Inverse susceptibility 1/χ against T');
    this._status = document.createElement('p');
    this._status.className = 'jp-psiscape-temp-status jp-psiscape-inverse-chi-status';
    this._status.setAttribute('role', 'status');
    this._status.setAttribute('aria-live', 'polite');
    const head = new Widget();
    head.node.append(heading, this._status);
    this._chart = new ChartView();
    this._chart.addClass('jp-psiscape-inverse-chi-chart');
    this._chart.hide();
    this._caption = document.createElement('p');
    this._caption.className = 'jp-psiscape-fit-convention jp-psiscape-inverse-chi-caption';
    this._chartCaption = document.createElement('p');
    this._chartCaption.className = 'jp-psiscape-temp-caption jp-psiscape-inverse-chi-chart-caption';
    const foot = new Widget();
    foot.node.append(this._chartCaption, this._caption);
    this.addWidget(head);
    this.addWidget(this._chart);
    this.addWidget(foot);
    this._status.textContent = t.__('Fit a Curie–Weiss law to see 1/χ against T.');
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

  /**
   * Show a Curie–Weiss outcome with the points it was fitted to (T in x, χ
   * in y, σ of χ when known); without points, the session's plotted columns
   * are drawn. Any other outcome (or null) clears the view. Without
   * arguments it is Lumino's `update()` (an update request), as for any widget.
   */
  update(outcome?: IAnalysisOutcome | null, points?: ISweepPoints | null): Promise<void> {
    if (outcome === undefined) {
      super.update();
      return this._rendered;
    }
    const t = this._trans;
    this._outcome = outcome;
    this._points = points ?? this._sessionPoints();
    if (!outcome || outcome.kind !== 'curie-weiss' || !this._points) {
      this._chart.clear();
      this._chart.hide();
      this._caption.textContent = '';
      this._chartCaption.textContent = '';
      this._status.textContent = t.__('Fit a Curie–Weiss law to see 1/χ against T.');
      return this._rendered;
    }
    const theta = valueOf(outcome, 'theta');
    const C = valueOf(outcome, 'C');
    const chi0 = valueOf(outcome, 'chi0');
    this._status.textContent = t.__('θ = %1 K, where the fitted line crosses 1/χ = 0.', formatWithError(theta.value, theta.sigma));
    this._caption.textContent = [
      t.__('1/χ = 1/(χ0 + C/(T − θ)) with C = %1 and χ0 = %2;', formatWithError(C.value, C.sigma), formatWithError(chi0.value, chi0.sigma)),
      t.__('with χ0 = 0 this is the straight line (T − θ)/C.')
    ].join(' ');
    return this.redraw();
  }

  /** Redraw (theme change). */
  redraw(): Promise<void> {
    const outcome = this._outcome;
    const points = this._points;
    if (!outcome || outcome.kind !== 'curie-weiss' || !points) {
      return this._rendered;
    }
    const chart = inverseChiChart(outcome, points, this._yUnit(), this._theme());
    this._chart.show();
    this._chartCaption.textContent = chart.caption ? this._trans.__(chart.caption) : '';
    this._rendered = this._chart.render(chart.spec, this._trans.__('Inverse susceptibility 1/χ against T with the fitted Curie–Weiss law'));
    return this._rendered;
  }

  /** The session's plotted T, χ and σ, or null. */
  private _sessionPoints(): ISweepPoints | null {
    const p = this._session?.plotted();
    if (!p) {
      return null;
    }
    const sigma = p.sigma ? (p.sigma.column.values as Float64Array) : undefined;
    return { x: p.x.column.values as Float64Array, y: p.y.column.values as Float64Array, ...(sigma ? { sigma } : {}) };
  }

  /** The unit of χ: the session's y column's, when it has one. */
  private _yUnit(): string {
    return this._session?.plotted()?.y.column.unit ?? '';
  }

  private readonly _trans: TranslationBundle;
  private readonly _theme: () => IChartTheme;
  private readonly _chart: ChartView;
  private readonly _status: HTMLParagraphElement;
  private readonly _caption: HTMLParagraphElement;
  private _outcome: IAnalysisOutcome | null = null;
  private _points: ISweepPoints | null = null;
  private readonly _session: AnalysisSession | null;
  private readonly _chartCaption: HTMLParagraphElement;
  private _rendered: Promise<void> = Promise.resolve();
}

export namespace InverseChiView {
  /** Nothing runs in the worker and the points come with each update: session and runner are optional. */
  export type IOptions = Pick<ITemperatureViewOptions, 'trans' | 'theme'> & Partial<Pick<ITemperatureViewOptions, 'session' | 'runner'>>;
}
