/**
 * The spread of the fitted parameters from refits of resampled data: the
 * number of samples and the seed (so a run can be repeated exactly), then
 * per parameter the fitted value, the bootstrap mean and standard deviation,
 * and the 68 % and 95 % percentile intervals; how many samples failed; and
 * how the samples were drawn.
 */
import type { TranslationBundle } from '@jupyterlab/translation';
import { Widget } from '@lumino/widgets';
import { formatPlain } from '../../core/analysis';
import { roundWithError } from '../../core/analysis/format';
import type { AnalysisSession } from '../../core/analysis/session';
import type { IBootstrapSummary } from '../../core/analysis/tasks-types';
import type { AnalysisRunner } from '../analysis-runner';
import { translateMessage } from '../translate';
import type { ITemperatureViewOptions } from './common';
import { dataTable, labelled, paragraph, TaskRow, textField } from './common';

/** Samples and seed: defaults and limits. */
export const BOOTSTRAP_FIELDS = {
  samples: { default: 200, min: 20, max: 5000 },
  seed: { default: 1, min: 0, max: 2 ** 31 - 1 }
} as const;

/**
 * Numbers of one row at the precision of its standard deviation: the mean
 * and sd rounded together (sd to two significant digits), the others to
 * the same decimal place; plain six-digit text when the sd is not usable or
 * the numbers need powers of ten.
 */
export function rowTexts(sd: number, mean: number, others: number[]): { mean: string; sd: string; others: string[] } {
  const r = roundWithError(mean, sd);
  if (!r || r.exponent !== null) {
    return { mean: formatPlain(mean), sd: formatPlain(sd), others: others.map(formatPlain) };
  }
  const point = r.sigma.indexOf('.');
  const decimals = point < 0 ? 0 : r.sigma.length - point - 1;
  return { mean: r.value, sd: r.sigma, others: others.map(v => (Number.isFinite(v) ? v.toFixed(decimals) : '—')) };
}

/** The bootstrap: samples and seed fields, Bootstrap and Cancel, the table of spreads. */
export class BootstrapView extends Widget {
  constructor(options: BootstrapView.IOptions) {
    super();
    this._trans = options.trans;
    this._session = options.session;
    this._runner = options.runner;
    this.addClass('jp-psiscape-BootstrapView');
    this.addClass('jp-psiscape-TemperatureView');
    const t = this._trans;
    this.node.setAttribute('role', 'group');
    this.node.setAttribute('aria-label', t.__('Bootstrap'));
    const heading = document.createElement('h3');
    heading.textContent = t.__('Bootstrap');
    this._samples = textField('jp-psiscape-bootstrap-samples', String(BOOTSTRAP_FIELDS.samples.default));
    this._samples.title = t.__('Number of resampled data sets to refit, %1 to %2', BOOTSTRAP_FIELDS.samples.min, BOOTSTRAP_FIELDS.samples.max);
    this._seed = textField('jp-psiscape-bootstrap-seed', String(BOOTSTRAP_FIELDS.seed.default));
    this._seed.title = t.__('Seed of the random resampling: the same seed gives the same samples');
    const fields = document.createElement('div');
    fields.className = 'jp-psiscape-temp-row jp-psiscape-bootstrap-fields';
    this._fieldMessage = document.createElement('span');
    this._fieldMessage.className = 'jp-psiscape-fit-window-message jp-psiscape-bootstrap-field-message';
    this._fieldMessage.setAttribute('aria-live', 'polite');
    fields.append(labelled(t.__('samples'), this._samples), labelled(t.__('seed'), this._seed), this._fieldMessage);
    this._row = new TaskRow(
      t,
      this._runner,
      {
        run: t.__('Bootstrap'),
        runTitle: t.__('Refit resampled data to see how far the parameters spread'),
        running: p => (p === null ? t.__('Bootstrapping…') : t.__('Bootstrapping… %1 %', p)),
        cancelled: t.__('Stopped by you: the bootstrap was not finished, and the results shown before are kept.'),
        failed: reason => t.__('The bootstrap could not run: %1', reason),
        progress: t.__('Progress of the bootstrap')
      },
      'jp-psiscape-bootstrap'
    );
    this._row.onRun = () => void this.run();
    this._result = document.createElement('div');
    this._result.className = 'jp-psiscape-temp-result jp-psiscape-bootstrap-result';
    this.node.append(heading, fields, this._row.node, this._row.error, this._result);
  }

  /** The summary shown, or null. */
  get summary(): IBootstrapSummary | null {
    return this._summary;
  }

  /** Resolves when the latest run has ended and its result is shown. */
  get settled(): Promise<void> {
    return this._row.settled;
  }

  /** Same as {@link settled}. */
  get rendered(): Promise<void> {
    return this._row.settled;
  }

  /** The samples and seed fields (for tests and restoring). */
  get fields(): { samples: HTMLInputElement; seed: HTMLInputElement } {
    return { samples: this._samples, seed: this._seed };
  }

  /** Run the bootstrap with the fields' samples and seed (as the button does); bad fields are refused in words. */
  run(): Promise<void> {
    const t = this._trans;
    const samples = readInteger(this._samples.value, BOOTSTRAP_FIELDS.samples.min, BOOTSTRAP_FIELDS.samples.max);
    const seed = readInteger(this._seed.value, BOOTSTRAP_FIELDS.seed.min, BOOTSTRAP_FIELDS.seed.max);
    this._samples.toggleAttribute('aria-invalid', samples === null);
    this._seed.toggleAttribute('aria-invalid', seed === null);
    if (samples === null || seed === null) {
      this._fieldMessage.textContent =
        samples === null
          ? t.__('Write the number of samples as a whole number from %1 to %2.', BOOTSTRAP_FIELDS.samples.min, BOOTSTRAP_FIELDS.samples.max)
          : t.__('Write the seed as a whole number from 0 to %1.', BOOTSTRAP_FIELDS.seed.max);
      (samples === null ? this._samples : this._seed).focus();
      return Promise.resolve();
    }
    this._fieldMessage.textContent = '';
    const job = this._session.job();
    return this._row.run('bootstrap', 'x' in job ? { type: 'bootstrap', job, samples, seed } : job, result => this._show(result));
  }

  /** Stop a running bootstrap (the table shown stays). */
  cancel(): void {
    this._row.cancel();
  }

  dispose(): void {
    if (this.isDisposed) {
      return;
    }
    this._row.dispose();
    super.dispose();
  }

  private _show(b: IBootstrapSummary): void {
    const t = this._trans;
    this._summary = b;
    const rows = b.stats.map(s => {
      const { mean, sd, others } = rowTexts(s.sd, s.mean, [s.fitted, s.p16, s.p84, s.p025, s.p975]);
      const [fitted, p16, p84, p025, p975] = others;
      return [s.name, fitted, mean, sd, `${p16} … ${p84}`, `${p025} … ${p975}`];
    });
    const table = dataTable(
      [t.__('parameter'), t.__('fitted'), t.__('bootstrap mean'), t.__('standard deviation'), t.__('68 % interval'), t.__('95 % interval')],
      rows,
      'jp-psiscape-bootstrap-table',
      t.__('%1 samples, seed %2; intervals are the 16th–84th and 2.5th–97.5th percentiles of the refitted values.', b.samples, b.seed)
    );
    const used = b.samples - b.failed;
    const failed = paragraph(
      b.failed > 0
        ? t._n('%1 sample of %2 failed to fit and was left out; the spread is over the other %3.', '%1 samples of %2 failed to fit and were left out; the spread is over the other %3.', b.failed, b.samples, used)
        : t.__('Every sample was refitted.'),
      'jp-psiscape-bootstrap-failed'
    );
    failed.setAttribute('role', 'status');
    const convention = paragraph(translateMessage(t, b.convention), 'jp-psiscape-fit-convention jp-psiscape-bootstrap-convention');
    this._result.replaceChildren(failed, table, convention);
  }

  private readonly _trans: TranslationBundle;
  private readonly _session: AnalysisSession;
  private readonly _runner: AnalysisRunner;
  private readonly _row: TaskRow;
  private readonly _samples: HTMLInputElement;
  private readonly _seed: HTMLInputElement;
  private readonly _fieldMessage: HTMLSpanElement;
  private readonly _result: HTMLDivElement;
  private _summary: IBootstrapSummary | null = null;
}

/** A whole number in [min, max] from text, or null. */
function readInteger(text: string, min: number, max: number): number | null {
  const s = text.trim();
  if (!/^\d+$/.test(s)) {
    return null;
  }
  const v = Number(s);
  return Number.isSafeInteger(v) && v >= min && v <= max ? v : null;
}

export namespace BootstrapView {
  export type IOptions = ITemperatureViewOptions;
}
