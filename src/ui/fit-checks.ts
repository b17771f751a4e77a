/**
 * Under every fit: the residuals (normalised by σ when the fit had σ, from
 * the σ column or from relative weights), the correlation matrix of the
 * parameters as a small heat map, and the check of the residuals against
 * |y| with its advice on relative weights (a button applies it).
 */
import type { TranslationBundle } from '@jupyterlab/translation';
import { Panel, Widget } from '@lumino/widgets';
import { buildCorrelationSpec, buildResidualSpec } from '../charts/temperature';
import { RESIDUAL_DATA, residualRows } from '../charts/temperature/residuals';
import type { IChartTheme } from '../charts/theme';
import type { IAnalysisJob, IAnalysisOutcome } from '../core/analysis';
import { windowedPoints } from '../core/analysis/window';
import { ChartView } from './chart-view';
import { translateMessage } from './translate';

/** Residuals, correlations and the weights check of the fit shown. */
export class FitChecks extends Panel {
  constructor(options: { trans: TranslationBundle; onUseRelativeWeights: () => void }) {
    super();
    this._trans = options.trans;
    this.addClass('jp-psiscape-FitChecks');
    this.node.setAttribute('role', 'group');
    this.node.setAttribute('aria-label', this._trans.__('Checks of the fit'));
    const head = new Widget();
    const heading = document.createElement('h4');
    heading.textContent = this._trans.__('Checks of the fit');
    this._weights = document.createElement('div');
    this._weights.className = 'jp-psiscape-fit-weights-check';
    this._weights.setAttribute('aria-live', 'polite');
    this._useRelative = document.createElement('button');
    this._useRelative.type = 'button';
    this._useRelative.className = 'jp-Button jp-mod-styled jp-mod-accept jp-psiscape-use-relative';
    this._useRelative.textContent = this._trans.__('Refit with relative weights');
    this._useRelative.addEventListener('click', options.onUseRelativeWeights);
    head.node.append(heading, this._weights);
    this._residuals = new ChartView();
    this._residuals.addClass('jp-psiscape-FitChecks-residuals');
    this._correlation = new ChartView();
    this._correlation.addClass('jp-psiscape-FitChecks-correlation');
    const charts = new Panel();
    charts.addClass('jp-psiscape-FitChecks-charts');
    charts.addWidget(this._residuals);
    charts.addWidget(this._correlation);
    this.addWidget(head);
    this.addWidget(charts);
    this.hide();
  }

  /** The residual chart (for tests). */
  get residualChart(): ChartView {
    return this._residuals;
  }

  /** The correlation chart (for tests). */
  get correlationChart(): ChartView {
    return this._correlation;
  }

  /** Resolves when both charts are drawn. */
  get rendered(): Promise<void> {
    return this._rendered;
  }

  /** Show the checks of a current outcome (null: hide them). */
  setOutcome(outcome: IAnalysisOutcome | null, job: IAnalysisJob | null, theme: IChartTheme, titles: { x: string; yUnit: string }): void {
    if (!outcome || !job || outcome.fit.residuals.length === 0) {
      this._shown = null;
      this.hide();
      return;
    }
    if (this._shown === outcome) {
      return;
    }
    this._shown = outcome;
    let points: ReturnType<typeof windowedPoints>;
    try {
      points = windowedPoints({ x: job.x, y: job.y, sigma: job.sigma, window: outcome.window });
    } catch {
      this.hide();
      return;
    }
    if (points.x.length !== outcome.fit.residuals.length) {
      this.hide();
      return;
    }
    this.show();
    // σ of each point as the fit weighted it: the σ column, or f·|y| for relative weights.
    const w = outcome.weighting;
    let sigma: ArrayLike<number> | undefined;
    if (w?.mode === 'relative' && w.fraction !== null) {
      const f = w.fraction;
      sigma = Array.from(points.y, y => f * Math.abs(y));
    } else if ((!w || w.mode === 'sigma') && points.sigma) {
      sigma = points.sigma;
    }
    this._points = { x: points.x, sigma };
    const residuals = buildResidualSpec({ x: points.x, residuals: outcome.fit.residuals, sigma, xTitle: titles.x }, theme, { yUnit: titles.yUnit });
    const correlation = buildCorrelationSpec({ parameters: [...outcome.fit.parameters], correlation: outcome.fit.correlation.map(r => [...r]) }, theme);
    this._rendered = Promise.all([
      this._residuals.render(residuals.spec, this._trans.__('Residuals of the fit against %1', titles.x)),
      this._correlation.render(correlation.spec, this._trans.__('Correlation matrix of the fitted parameters'))
    ]).then(() => undefined);
    const check = w?.check ?? null;
    const nodes: HTMLElement[] = [];
    if (w) {
      const note = document.createElement('p');
      note.className = 'jp-psiscape-fit-convention';
      note.textContent = translateMessage(this._trans, w.note);
      nodes.push(note);
    }
    if (check) {
      const found = document.createElement('p');
      found.textContent = translateMessage(this._trans, check.message);
      nodes.push(found);
      if (check.suggestion) {
        const advice = document.createElement('p');
        advice.className = 'jp-psiscape-fit-warning';
        advice.textContent = translateMessage(this._trans, check.suggestion);
        nodes.push(advice, this._useRelative);
      }
    }
    this._weights.replaceChildren(...nodes);
  }

  /**
   * Show other residuals of the points shown (e.g. of the model at other
   * parameter values), in the order fitted, in the drawn chart without a new
   * spec; null shows the fit's own again. Does nothing while no residual
   * chart is shown or for a count that is not the points'.
   */
  async previewResiduals(residuals: ArrayLike<number> | null): Promise<void> {
    const view = this._residuals.view;
    const shown = this._shown;
    const points = this._points;
    if (!view || !shown || !points || this.isHidden) {
      return;
    }
    const values = residuals ?? shown.fit.residuals;
    if (values.length !== points.x.length) {
      return;
    }
    view.data(RESIDUAL_DATA, residualRows({ x: points.x, residuals: values, sigma: points.sigma }));
    await view.runAsync();
  }

  /** Redraw (theme change). */
  redraw(): void {
    this._shown = null;
  }

  private readonly _trans: TranslationBundle;
  private readonly _weights: HTMLDivElement;
  private readonly _useRelative: HTMLButtonElement;
  private readonly _residuals: ChartView;
  private readonly _correlation: ChartView;
  private _shown: IAnalysisOutcome | null = null;
  private _points: { x: number[]; sigma: ArrayLike<number> | undefined } | null = null;
  private _rendered: Promise<void> = Promise.resolve();
}
