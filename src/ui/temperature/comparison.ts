/**
 * Which model the data prefer: every candidate fitted over the same window
 * to the same points, ranked by AICc, with χ²_red, AIC, AICc, BIC, ΔAICc,
 * the Akaike weight and each fit's verdict; candidates that failed are
 * listed last with why. A "Use" button per row puts that model (kind and
 * options) into the analysis so the user can refit it.
 */
import type { TranslationBundle } from '@jupyterlab/translation';
import { Widget } from '@lumino/widgets';
import { formatPlain, formatWithError, kindById } from '../../core/analysis';
import type { AnalysisSession } from '../../core/analysis/session';
import type { IComparedModel, IModelComparison } from '../../core/analysis/tasks-types';
import type { OptionValue } from '../../core/analysis';
import type { AnalysisRunner } from '../analysis-runner';
import { translateMessage } from '../translate';
import type { ITemperatureViewOptions } from './common';
import { button, dataTable, paragraph, TaskRow, verdictNode } from './common';

/** An information criterion as text: two decimals (differences of a few units decide), "—" when missing. */
export function criterionText(v: number): string {
  return Number.isFinite(v) ? v.toFixed(2) : '—';
}

/** An Akaike weight as a percentage: one decimal, "< 0.1 %" for smaller non-zero weights. */
export function weightText(w: number): string {
  if (!Number.isFinite(w)) {
    return '—';
  }
  if (w > 0 && w < 0.0005) {
    return '< 0.1 %';
  }
  return `${(100 * w).toFixed(1)} %`;
}

/** The model comparison: a Compare button, the summary, the ranked table and the convention. */
export class ComparisonView extends Widget {
  constructor(options: ComparisonView.IOptions) {
    super();
    this._trans = options.trans;
    this._session = options.session;
    this._runner = options.runner;
    this.addClass('jp-psiscape-ComparisonView');
    this.addClass('jp-psiscape-TemperatureView');
    const t = this._trans;
    this.node.setAttribute('role', 'group');
    this.node.setAttribute('aria-label', t.__('Model comparison'));
    const heading = document.createElement('h3');
    heading.textContent = t.__('Model comparison');
    this._row = new TaskRow(
      t,
      this._runner,
      {
        run: t.__('Compare models'),
        runTitle: t.__('Fit every candidate model over the same window and rank them by AICc'),
        running: p => (p === null ? t.__('Comparing models…') : t.__('Comparing models… %1 %', p)),
        cancelled: t.__('Stopped by you: the comparison was not finished, and the results shown before are kept.'),
        failed: reason => t.__('The comparison could not run: %1', reason),
        progress: t.__('Progress of the model comparison')
      },
      'jp-psiscape-compare'
    );
    this._row.onRun = () => void this.run();
    this._used = document.createElement('p');
    this._used.className = 'jp-psiscape-temp-used jp-psiscape-compare-used';
    this._used.setAttribute('aria-live', 'polite');
    this._result = document.createElement('div');
    this._result.className = 'jp-psiscape-temp-result jp-psiscape-compare-result';
    this.node.append(heading, this._row.node, this._row.error, this._used, this._result);
  }

  /** The comparison shown, or null. */
  get comparison(): IModelComparison | null {
    return this._comparison;
  }

  /** Resolves when the latest run has ended and its result is shown. */
  get settled(): Promise<void> {
    return this._row.settled;
  }

  /** Same as {@link settled}. */
  get rendered(): Promise<void> {
    return this._row.settled;
  }

  /** Run the comparison on the session's job (as the button does). */
  run(): Promise<void> {
    const job = this._session.job();
    this._used.textContent = '';
    return this._row.run('compare', 'x' in job ? { type: 'compare', job } : job, result => this._show(result));
  }

  /** Stop a running comparison (the table shown stays). */
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

  /** Put a candidate's kind and options into the analysis. */
  use(model: IComparedModel): void {
    const t = this._trans;
    const s = this._session;
    try {
      s.setKind(model.kind);
      for (const [key, value] of Object.entries(model.options)) {
        if (kindById(model.kind)?.options[key]) {
          s.setOption(key, value as OptionValue);
        }
      }
      this._used.textContent = t.__('The analysis is now set to %1: press Fit to refit it.', translateMessage(t, model.label));
    } catch {
      this._row.fail(t.__('this version cannot set the analysis to %1.', translateMessage(t, model.label)));
    }
  }

  private _show(c: IModelComparison): void {
    const t = this._trans;
    this._comparison = c;
    const summary = paragraph(translateMessage(t, c.summary), 'jp-psiscape-compare-summary');
    summary.setAttribute('role', 'status');
    const nodes: HTMLElement[] = [summary];
    if (c.freeJ && Number.isFinite(c.freeJ.value)) {
      nodes.push(paragraph(t.__('J fitted as a free parameter: %1', formatWithError(c.freeJ.value, c.freeJ.sigma)), 'jp-psiscape-compare-free-j'));
    }
    // Best first by AICc; failures (not converged, or left out) last, in the order given.
    const ok = c.models.filter(m => m.converged && Number.isFinite(m.aicc));
    const failed = c.models.filter(m => !ok.includes(m));
    ok.sort((a, b) => a.aicc - b.aicc);
    const rows = [...ok, ...failed].map(m => this._rowOf(m, failed.includes(m)));
    const table = dataTable(
      [t.__('model'), 'k', 'χ²_red', 'AIC', 'AICc', 'BIC', 'ΔAICc', t.__('Akaike weight'), t.__('verdict'), t.__('refit')],
      rows.map(r => r.cells),
      'jp-psiscape-compare-table'
    );
    rows.forEach((r, i) => {
      const tr = table.tBodies[0].rows[i];
      tr.dataset.kind = r.model.kind;
      tr.classList.toggle('jp-psiscape-compare-failed', r.failed);
    });
    const n = c.models.find(m => m.n > 0)?.n;
    const caption = table.createCaption();
    caption.textContent = [
      translateMessage(t, c.convention),
      n !== undefined ? t.__('Every candidate is fitted to the same %1 points, so the criteria compare directly; smaller is better.', n) : ''
    ]
      .filter(s => s)
      .join(' ');
    nodes.push(table);
    if (failed.length > 0) {
      const list = document.createElement('ul');
      list.className = 'jp-psiscape-fit-notes jp-psiscape-compare-failures';
      for (const m of failed) {
        const li = document.createElement('li');
        li.textContent = m.note
          ? t.__('%1: %2', translateMessage(t, m.label), translateMessage(t, m.note))
          : t.__('%1: did not converge.', translateMessage(t, m.label));
        list.appendChild(li);
      }
      nodes.push(list);
    }
    if (c.warnings.length > 0) {
      const list = document.createElement('ul');
      list.className = 'jp-psiscape-fit-notes jp-psiscape-compare-warnings';
      for (const w of c.warnings) {
        const li = document.createElement('li');
        li.className = 'jp-psiscape-fit-warning';
        li.textContent = translateMessage(t, w);
        list.appendChild(li);
      }
      nodes.push(list);
    }
    this._result.replaceChildren(...nodes);
  }

  /** One table row of a candidate. */
  private _rowOf(m: IComparedModel, failed: boolean): { model: IComparedModel; failed: boolean; cells: (string | HTMLElement)[] } {
    const t = this._trans;
    const name = document.createElement('span');
    name.textContent = translateMessage(t, m.label);
    const J = m.values.J;
    if (m.kind === 'weiss' && m.options.freeJ === true && J && Number.isFinite(J.value)) {
      const j = document.createElement('span');
      j.className = 'jp-psiscape-compare-j';
      j.textContent = ` (J = ${formatWithError(J.value, J.sigma)})`;
      name.append(j);
    }
    const label = translateMessage(t, m.label);
    const use = button(t.__('Use'), 'jp-psiscape-compare-use', () => this.use(m));
    use.setAttribute('aria-label', t.__('Use %1 for the fit', label));
    use.disabled = kindById(m.kind) === null;
    const num = (v: number): string => (failed && !Number.isFinite(v) ? '—' : criterionText(v));
    return {
      model: m,
      failed,
      cells: [
        name,
        String(m.k),
        Number.isFinite(m.reducedChi2) ? formatPlain(Number(m.reducedChi2.toPrecision(4))) : '—',
        num(m.aic),
        num(m.aicc),
        num(m.bic),
        failed ? '—' : criterionText(m.deltaAicc),
        failed ? '—' : weightText(m.weight),
        verdictNode(t, m.verdict),
        use
      ]
    };
  }

  private readonly _trans: TranslationBundle;
  private readonly _session: AnalysisSession;
  private readonly _runner: AnalysisRunner;
  private readonly _row: TaskRow;
  private readonly _used: HTMLParagraphElement;
  private readonly _result: HTMLDivElement;
  private _comparison: IModelComparison | null = null;
}

export namespace ComparisonView {
  export type IOptions = ITemperatureViewOptions;
}
