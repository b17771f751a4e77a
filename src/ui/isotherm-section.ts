/**
 * Field sweeps in the analysis panel: a long-format table of M(H) isotherms
 * (temperature, field, magnetisation columns) → the isotherm analysis run in
 * the analysis worker (progress, Cancel): the global equation-of-state fit
 * as the primary result, the cross-checks with whether they agree, and every
 * view as a tab. The controls are saved with the analysis, the view shown
 * too.
 */
import type { TranslationBundle } from '@jupyterlab/translation';
import { Panel, Widget } from '@lumino/widgets';
import { convertQuantity } from '../core/units/magnetic';
import type { ISavedIsotherms } from '../core/saved/types';
import type { IIsothermReport, IsothermStage } from '../core/sweeps/job-types';
import type { ITable } from '../core/table';
import { messageOf } from '../core/messages';
import { AnalysisRunner } from './analysis-runner';
import { readChartTheme } from './chart-theme';
import { outcomeNodes } from './outcome-nodes';
import { translateMessage } from './translate';
import { IsothermControls } from './isotherms/controls';
import { summaryNodes } from './isotherms/summary';
import { IsothermViews } from './isotherms/views';
import type { IViewUnits } from './isotherms/view-specs';

/** Isotherm controls and results. */
export class IsothermSection extends Panel {
  constructor(options: IsothermSection.IOptions) {
    super();
    this._trans = options.trans;
    this._onRun = options.onRun ?? null;
    this._runner = options.runner ?? null;
    this.addClass('jp-psiscape-IsothermSection');
    this.node.setAttribute('role', 'group');
    this.node.setAttribute('aria-label', this._trans.__('Isotherms'));
    this._controls = new IsothermControls(
      this._trans,
      () => void this.run(),
      () => this.cancel()
    );
    this._views = new IsothermViews({
      trans: this._trans,
      onSelect: id => {
        this._controls.view = id;
        const settings = this._controls.settings();
        if (settings && this._report) {
          this._onRun?.(settings);
        }
      }
    });
    this._build();
  }

  /** The latest report, or null. */
  get report(): IIsothermReport | null {
    return this._report;
  }

  /** The views (tabs and chart). */
  get views(): IsothermViews {
    return this._views;
  }

  /** Resolves when the latest run has ended and its view has been drawn. */
  get rendered(): Promise<void> {
    return this._running.then(() => this._views.rendered);
  }

  /** Show the section whatever the table looks like (the panel is in its field-sweep view). */
  set forced(value: boolean) {
    this._forced = value;
    this.setHidden(!(value || this._looksLikeSweeps));
  }

  /** A new table: refill the column pickers and clear the results. */
  setTable(table: ITable | null): void {
    this.cancel();
    this._table = table;
    this._report = null;
    this._result.replaceChildren();
    this._details.replaceChildren();
    this._views.setReport(null, readChartTheme(this.node), this._viewUnits());
    this._views.hide();
    this._error.hidden = true;
    this._looksLikeSweeps = this._controls.setTable(table).looksLikeSweeps;
    this.setHidden(!(this._forced || this._looksLikeSweeps));
  }

  /** The controls as saved with the analysis, or null without a table. */
  settings(): ISavedIsotherms | null {
    return this._controls.settings();
  }

  /**
   * Set the controls from saved settings and run the analysis. Columns are
   * matched by position and header; a column that is not there any more
   * leaves the guessed one and says so.
   */
  restore(saved: ISavedIsotherms): Promise<void> {
    if (!this._table) {
      return Promise.resolve();
    }
    const missing = this._controls.restore(saved);
    if (saved.view) {
      this._views.select(saved.view);
    }
    const done = this.run({ quiet: true });
    if (missing.length > 0) {
      this._fail(this._trans.__('The saved isotherm analysis used the columns %1, which are not in the table any more.', missing.join(', ')));
    }
    return done;
  }

  /** Run the analysis with the current controls (`quiet`: a restore, not a user's change). */
  run(options: { quiet?: boolean } = {}): Promise<void> {
    this._error.hidden = true;
    const table = this._table;
    if (!table) {
      return Promise.resolve();
    }
    if (!options.quiet) {
      const settings = this._controls.settings();
      if (settings) {
        this._onRun?.(settings);
      }
    }
    const reading = this._controls.read();
    if (!reading.ok) {
      this._fail(reading.message);
      return Promise.resolve();
    }
    const column = (index: number) => {
      const c = table.columns[index];
      const values = c && c.kind === 'number' ? (c.values as Float64Array) : new Float64Array(0);
      return { name: c?.name ?? '', unit: c?.unit ?? null, values };
    };
    const job = {
      temperature: column(reading.columns.temperature),
      field: column(reading.columns.field),
      magnetisation: column(reading.columns.magnetisation),
      controls: reading.controls
    };
    this._runner ??= new AnalysisRunner();
    const runner = this._runner;
    const token = ++this._token;
    this._controls.setRunning(true);
    this._progress.hidden = false;
    this._progress.value = 0;
    this._status.textContent = this._trans.__('Analysing the isotherms…');
    const done = runner
      .runIsotherms(job, (stage, fraction) => {
        if (token === this._token) {
          this._progress.value = fraction;
          this._status.textContent = this._trans.__('Analysing the isotherms: %1 (%2 %)', this._stageName(stage), Math.round(100 * fraction));
        }
      })
      .then(
        result => {
          if (token !== this._token) {
            return;
          }
          if (result.kind === 'cancelled') {
            this._status.textContent = this._trans.__('Stopped by you: the isotherm analysis was not finished, and the results shown before are kept.');
            return;
          }
          const answer = result.answer;
          if (answer.status === 'ok') {
            this._status.textContent = '';
            this._report = answer.report;
            this._render(answer.report);
          } else if (answer.status === 'needs-unit') {
            this._fail(this._trans.__('%1 Accepted units: %2.', translateMessage(this._trans, answer.message), answer.options.join(', ')));
          } else if (answer.status === 'refused') {
            this._fail(translateMessage(this._trans, answer.message));
          }
        },
        (reason: unknown) => {
          if (token === this._token) {
            this._fail(translateMessage(this._trans, messageOf(reason)));
          }
        }
      )
      .finally(() => {
        if (token === this._token) {
          this._controls.setRunning(false);
          this._progress.hidden = true;
          if (this._status.textContent === this._trans.__('Analysing the isotherms…')) {
            this._status.textContent = '';
          }
        }
      });
    this._running = done;
    return done;
  }

  /** Stop a running analysis (the results shown before stay). */
  cancel(): void {
    this._runner?.cancel();
  }

  /** Redraw the views (theme change). */
  redraw(): void {
    if (this._report) {
      this._views.setReport(this._report, readChartTheme(this.node), this._viewUnits());
    }
  }

  dispose(): void {
    if (this.isDisposed) {
      return;
    }
    this._token++;
    this._runner?.dispose();
    super.dispose();
  }

  private _stageName(stage: IsothermStage): string {
    const t = this._trans;
    const names: Record<IsothermStage, string> = {
      grouping: t.__('grouping the readings'),
      global: t.__('fitting the equation of state'),
      'cross-checks': t.__('cross-checks'),
      collapse: t.__('scaling collapse'),
      window: t.__('exponents against the window'),
      entropy: t.__('entropy change'),
      bootstrap: t.__('bootstrap')
    };
    return names[stage] ?? stage;
  }

  /** Display units of the charts: the table's own field and magnetisation units where they convert. */
  private _viewUnits(): IViewUnits {
    const report = this._report;
    const fieldKind = report?.set.fieldKind ?? 'applied';
    const unit = (name: string | undefined, si: string): string | { unit: string; perSI: number } => {
      if (!name || name === si) {
        return si;
      }
      try {
        const perSI = convertQuantity(1, si, name);
        return Number.isFinite(perSI) && perSI > 0 ? { unit: name, perSI } : si;
      } catch {
        return si;
      }
    };
    const display = report?.set.display;
    const mUnit = report?.set.magnetisationUnit ?? 'A/m';
    return { field: unit(display?.field, 'A/m'), magnetisation: mUnit === 'A/m' ? unit(display?.magnetisation, 'A/m') : mUnit, fieldKind };
  }

  private _fail(message: string): void {
    this._error.textContent = this._trans.__('The isotherm analysis could not run: %1', message);
    this._error.hidden = false;
  }

  private _render(report: IIsothermReport): void {
    this._views.show();
    this._views.setReport(report, readChartTheme(this.node), this._viewUnits());
    const { head, rest } = summaryNodes(this._trans, report);
    this._result.replaceChildren(...head);
    this._details.replaceChildren(...rest);
  }

  private _build(): void {
    ({ error: this._error, result: this._result } = outcomeNodes());
    this._progress = document.createElement('progress');
    this._progress.className = 'jp-psiscape-iso-progress';
    this._progress.max = 1;
    this._progress.hidden = true;
    this._progress.setAttribute('aria-label', this._trans.__('Progress of the isotherm analysis'));
    this._status = document.createElement('p');
    this._status.className = 'jp-psiscape-iso-status';
    this._status.setAttribute('role', 'status');
    const controls = new Widget();
    controls.node.append(this._controls.node, this._progress, this._status, this._error);
    const results = new Widget();
    results.node.appendChild(this._result);
    const details = new Widget();
    this._details = document.createElement('div');
    this._details.className = 'jp-psiscape-isotherm-details';
    details.node.appendChild(this._details);
    this.addWidget(controls);
    this.addWidget(results);
    this.addWidget(this._views);
    this.addWidget(details);
    this._views.hide();
  }

  private readonly _trans: TranslationBundle;
  private readonly _onRun: ((settings: ISavedIsotherms) => void) | null;
  private _runner: AnalysisRunner | null;
  private readonly _controls: IsothermControls;
  private readonly _views: IsothermViews;
  private _table: ITable | null = null;
  private _report: IIsothermReport | null = null;
  private _forced = false;
  private _looksLikeSweeps = false;
  private _token = 0;
  private _running: Promise<void> = Promise.resolve();
  private _progress!: HTMLProgressElement;
  private _status!: HTMLParagraphElement;
  private _error!: HTMLParagraphElement;
  private _result!: HTMLDivElement;
  private _details!: HTMLDivElement;
}

export namespace IsothermSection {
  export interface IOptions {
    trans: TranslationBundle;
    /** Runs the analysis in the worker (default: a runner of its own on the shared worker). */
    runner?: AnalysisRunner;
    /** Called with the controls when the user runs the analysis or picks a view (to save them). */
    onRun?: (settings: ISavedIsotherms) => void;
  }
}
