/**
 * What the temperature-sweep views share: the options every view takes, a
 * task row (run button, Cancel, progress bar, a polite status line and an
 * alert for failures) that runs one task of several fits in the analysis
 * worker and keeps what was shown when the user stops it, and small DOM
 * helpers (labelled fields, tables).
 */
import type { TranslationBundle } from '@jupyterlab/translation';
import type { IChartTheme } from '../../charts/theme';
import type { AnalysisSession } from '../../core/analysis/session';
import type { IAnalysisJob } from '../../core/analysis/types';
import type { AnalysisTask, AnalysisTaskResult } from '../../core/analysis/tasks-types';
import type { VerdictState } from '../../core/analysis/verdict';
import { messageOf } from '../../core/messages';
import type { ICoreMessage } from '../../core/messages';
import type { AnalysisRunner } from '../analysis-runner';
import { MARKS } from '../fit-result';
import { translateMessage } from '../translate';

/** Options of every temperature-sweep view. */
export interface ITemperatureViewOptions {
  trans: TranslationBundle;
  /** The analysis whose job the view's task runs, and which "Use" buttons change. */
  session: AnalysisSession;
  /**
   * Runs the view's task. A runner runs one job at a time and a new one
   * cancels the previous, so give each view a runner of its own on the
   * panel's host (`new AnalysisRunner({ host })`) to leave the fit alone.
   */
  runner: AnalysisRunner;
  /** The chart theme at the moment of drawing (e.g. `() => readChartTheme(panel.node)`). */
  theme: () => IChartTheme;
}

/** A finished task's result of one type. */
export type TaskResultOf<T extends AnalysisTask['type']> = Extract<AnalysisTaskResult, { type: T }>['result'];

/** The texts of one task row. */
export interface ITaskTexts {
  /** The run button's words. */
  run: string;
  /** Its longer description (title). */
  runTitle: string;
  /** Status while it runs; `%1` is the percentage done. */
  running: (percent: number | null) => string;
  /** Status after the user stopped it. */
  cancelled: string;
  /** Alert prefix of a failure; `%1` is the reason. */
  failed: (reason: string) => string;
  /** Accessible name of the progress bar. */
  progress: string;
}

/**
 * A run button, Cancel, a progress bar and a status line for one task. Only
 * the latest run reports back; Cancel stops it and leaves what was shown.
 */
export class TaskRow {
  constructor(trans: TranslationBundle, runner: AnalysisRunner, texts: ITaskTexts, cls: string) {
    this._trans = trans;
    this._runner = runner;
    this._texts = texts;
    this.node = document.createElement('div');
    this.node.className = `jp-psiscape-temp-row jp-psiscape-temp-task ${cls}`;
    this.runButton = button(texts.run, `jp-mod-accept ${cls}-run`, () => this.onRun?.());
    this.runButton.title = texts.runTitle;
    this.cancelButton = button(trans.__('Cancel'), `jp-mod-reject ${cls}-cancel jp-psiscape-temp-cancel`, () => this.cancel());
    this.cancelButton.hidden = true;
    this.progress = document.createElement('progress');
    this.progress.className = `jp-psiscape-temp-progress ${cls}-progress`;
    this.progress.max = 1;
    this.progress.hidden = true;
    this.progress.setAttribute('aria-label', texts.progress);
    this.status = document.createElement('span');
    this.status.className = `jp-psiscape-temp-status ${cls}-status`;
    this.status.setAttribute('role', 'status');
    this.status.setAttribute('aria-live', 'polite');
    this.error = document.createElement('p');
    this.error.className = `jp-psiscape-fit-error jp-psiscape-temp-error ${cls}-error`;
    this.error.setAttribute('role', 'alert');
    this.error.hidden = true;
    this.node.append(this.runButton, this.cancelButton, this.progress, this.status);
  }

  readonly node: HTMLDivElement;
  readonly runButton: HTMLButtonElement;
  readonly cancelButton: HTMLButtonElement;
  readonly progress: HTMLProgressElement;
  readonly status: HTMLSpanElement;
  /** The failure alert (place it under the row). */
  readonly error: HTMLParagraphElement;
  /** Called by the run button. */
  onRun: (() => void) | null = null;

  /** Whether a task of this row is waiting or running. */
  get running(): boolean {
    return this._running;
  }

  /** Resolves when the latest run has ended (never rejects). */
  get settled(): Promise<void> {
    return this._settled;
  }

  /**
   * Run `task` (or say why there is none) and hand a finished result to
   * `onDone`; a cancel keeps what was shown, a failure shows its reason.
   */
  run<T extends AnalysisTask['type']>(type: T, task: AnalysisTask | ICoreMessage, onDone: (result: TaskResultOf<T>) => void): Promise<void> {
    const trans = this._trans;
    this.error.hidden = true;
    const token = ++this._token;
    if (!('type' in task)) {
      this._fail(translateMessage(trans, task));
      this.status.textContent = '';
      this._settled = Promise.resolve();
      return this._settled;
    }
    this._setRunning(true);
    this.status.textContent = this._texts.running(null);
    this.progress.removeAttribute('value');
    const done = this._runner
      .runTask(task, fraction => {
        if (token === this._token && this._running) {
          this.progress.value = fraction;
          this.status.textContent = this._texts.running(Math.round(100 * fraction));
        }
      })
      .then(
        result => {
          if (token !== this._token) {
            return;
          }
          if (result.kind === 'cancelled') {
            this.status.textContent = this._texts.cancelled;
            return;
          }
          if (result.result.type !== type) {
            return;
          }
          this.status.textContent = '';
          try {
            onDone(result.result.result as TaskResultOf<T>);
          } catch (reason) {
            this._fail(translateMessage(trans, messageOf(reason)));
          }
        },
        (reason: unknown) => {
          if (token === this._token) {
            this.status.textContent = '';
            this._fail(translateMessage(trans, messageOf(reason)));
          }
        }
      )
      .finally(() => {
        if (token === this._token) {
          this._setRunning(false);
        }
      });
    this._settled = done;
    return done;
  }

  /** Stop this row's running task (what was shown stays). */
  cancel(): void {
    if (this._running) {
      this._runner.cancel();
    }
  }

  /** Show a failure in words. */
  fail(reason: string): void {
    this._fail(reason);
  }

  /** Forget the running task (the view is going away). */
  dispose(): void {
    this.cancel();
    this._token++;
  }

  private _fail(reason: string): void {
    this.error.textContent = this._texts.failed(reason);
    this.error.hidden = false;
  }

  private _setRunning(on: boolean): void {
    this._running = on;
    this.runButton.disabled = on;
    this.cancelButton.hidden = !on;
    this.cancelButton.disabled = !on;
    this.progress.hidden = !on;
    if (!on && this.cancelButton.contains(document.activeElement)) {
      this.runButton.focus();
    }
  }

  private readonly _trans: TranslationBundle;
  private readonly _runner: AnalysisRunner;
  private readonly _texts: ITaskTexts;
  private _running = false;
  private _token = 0;
  private _settled: Promise<void> = Promise.resolve();
}

/** Whether a session job is a job (not a message). */
export function isJob(job: IAnalysisJob | ICoreMessage): job is IAnalysisJob {
  return 'x' in job && 'kind' in job;
}

/** A button of the JupyterLab style. */
export function button(text: string, cls: string, onClick: () => void): HTMLButtonElement {
  const node = document.createElement('button');
  node.type = 'button';
  node.className = `jp-Button jp-mod-styled ${cls}`;
  node.textContent = text;
  node.addEventListener('click', onClick);
  return node;
}

/** A label around a control, its text first. */
export function labelled(text: string, control: HTMLElement): HTMLLabelElement {
  const node = document.createElement('label');
  node.className = 'jp-psiscape-picker';
  const span = document.createElement('span');
  span.textContent = text;
  node.append(span, control);
  return node;
}

/** A short text field. */
export function textField(cls: string, value: string): HTMLInputElement {
  const input = document.createElement('input');
  input.type = 'text';
  input.className = `jp-mod-styled ${cls}`;
  input.inputMode = 'numeric';
  input.spellcheck = false;
  input.value = value;
  return input;
}

/** A table with column headers (scope col) and rows of text or nodes; the first cell of a row is its header. */
export function dataTable(headers: string[], rows: (string | HTMLElement)[][], cls: string, caption?: string): HTMLTableElement {
  const t = document.createElement('table');
  t.className = `jp-psiscape-fit-table jp-psiscape-temp-table ${cls}`;
  if (caption) {
    t.createCaption().textContent = caption;
  }
  const head = t.createTHead().insertRow();
  for (const text of headers) {
    const th = document.createElement('th');
    th.scope = 'col';
    th.textContent = text;
    head.appendChild(th);
  }
  const body = t.createTBody();
  for (const r of rows) {
    const row = body.insertRow();
    r.forEach((cell, i) => {
      const td = i === 0 ? document.createElement('th') : row.insertCell();
      if (i === 0) {
        (td as HTMLTableCellElement).scope = 'row';
        row.appendChild(td);
      }
      if (typeof cell === 'string') {
        td.textContent = cell;
      } else {
        td.appendChild(cell);
      }
    });
  }
  return t;
}

/** A verdict state in words with its mark (shape, not colour alone). */
export function verdictNode(trans: TranslationBundle, state: string): HTMLElement {
  const known = (['fits', 'does-not-describe', 'not-converged'] as const).find(s => s === state || (s === 'does-not-describe' && state === 'does-not-fit'));
  const span = document.createElement('span');
  span.className = `jp-psiscape-temp-verdict jp-psiscape-temp-verdict-${known ?? 'unknown'}`;
  span.dataset.verdict = known ?? state;
  const words: Record<VerdictState, string> = {
    fits: trans.__('describes the data'),
    'does-not-describe': trans.__('does not describe the data'),
    'not-converged': trans.__('did not converge')
  };
  if (known) {
    const mark = document.createElement('span');
    mark.setAttribute('aria-hidden', 'true');
    mark.className = 'jp-psiscape-temp-verdict-mark';
    mark.textContent = MARKS[known];
    span.append(mark, ' ', words[known]);
  } else {
    span.textContent = trans.__('no verdict');
  }
  return span;
}

/** A paragraph of text with a class. */
export function paragraph(text: string, cls: string): HTMLParagraphElement {
  const p = document.createElement('p');
  p.className = cls;
  p.textContent = text;
  return p;
}
