/**
 * The result of a fit as the panel shows it: the verdict first (with its own
 * mark, colour and words for each of the three states), then the equation,
 * the parameter table with standard errors and intervals, derived values,
 * the checks that failed, warnings, cautions and the convention.
 *
 * A result that is not for the current data and controls (a new fit is
 * running, the last one failed or was stopped, or the user changed a
 * setting) is greyed and labelled as the previous result.
 */
import type { TranslationBundle } from '@jupyterlab/translation';
import { formatPlain, formatWithError, kindById } from '../core/analysis';
import type { IAnalysisOutcome } from '../core/analysis';
import type { VerdictState } from '../core/analysis/verdict';
import { translateMessage } from './translate';
import { parameterUnit } from '../core/analysis/parameter-units';

/** What {@link renderOutcome} needs. */
export interface IOutcomeView {
  trans: TranslationBundle;
  outcome: IAnalysisOutcome | null;
  /** Whether the outcome belongs to the data and controls now chosen. */
  current: boolean;
  running: boolean;
  /** The kind now chosen: a previous result of another kind is not shown at all. */
  currentKind: string;
  onExploreLandau: ((k: NonNullable<IAnalysisOutcome['landau']>) => void) | null;
  /** Units of the x and y columns, for the parameters' units (null: none given). */
  units?: { x: string | null; y: string | null };
}

/** Marks of the three verdict states (shapes differ, so colour is never the only cue). */
/** The mark of each verdict state (shape tells them apart as well as colour). */
export const MARKS: Record<VerdictState, string> = {
  fits: '◆',
  'does-not-describe': '▲',
  'not-converged': '■'
};

/** The headline of each verdict state. */
export function headline(trans: TranslationBundle, state: VerdictState): string {
  switch (state) {
    case 'fits':
      return trans.__('Describes the data');
    case 'does-not-describe':
      return trans.__('Converged, but does not describe the data');
    case 'not-converged':
      return trans.__('Did not converge');
  }
}

/** Fill `box` with the outcome (or empty it). */
export function renderOutcome(box: HTMLElement, view: IOutcomeView): void {
  const { trans, outcome } = view;
  box.replaceChildren();
  // Another kind's numbers are never left under a new error or a running fit.
  const shown = outcome !== null && (view.current || outcome.kind === view.currentKind) ? outcome : null;
  box.classList.toggle('jp-psiscape-mod-previous', shown !== null && !view.current);
  if (!shown || !outcome) {
    return;
  }
  const fit = outcome.fit;
  const verdict = outcome.verdict;
  const nodes: HTMLElement[] = [];
  if (!view.current) {
    const label = document.createElement('p');
    label.className = 'jp-psiscape-fit-previous-label';
    const kind = kindById(outcome.kind);
    const name = kind ? translateMessage(trans, kind.label) : outcome.kind;
    label.textContent = view.running
      ? trans.__('Previous result (%1), shown greyed until the new fit finishes:', name)
      : trans.__('Previous result (%1), not for the data and settings now chosen:', name);
    nodes.push(label);
  }

  const head = document.createElement('div');
  head.className = `jp-psiscape-verdict jp-psiscape-verdict-${verdict.state}`;
  head.dataset.verdict = verdict.state;
  head.setAttribute('role', 'status');
  const mark = document.createElement('span');
  mark.className = 'jp-psiscape-verdict-mark';
  mark.setAttribute('aria-hidden', 'true');
  mark.textContent = MARKS[verdict.state];
  const title = document.createElement('strong');
  title.textContent = headline(trans, verdict.state);
  const summary = document.createElement('span');
  summary.className = 'jp-psiscape-verdict-summary';
  summary.textContent = translateMessage(trans, verdict.summary);
  const detail = document.createElement('span');
  detail.className = 'jp-psiscape-verdict-detail';
  detail.textContent = trans.__('%1 points fitted, χ²_red = %2. Optimiser: %3', outcome.used, formatPlain(fit.reducedChi2), translateMessage(trans, fit.reason));
  head.append(mark, title, summary, detail);
  nodes.push(head);

  // The headline already gives the first failed check; list the others.
  const failed = verdict.checks.filter(c => !c.passed && c.message.code !== verdict.summary.code);
  if (failed.length) {
    const list = document.createElement('ul');
    list.className = 'jp-psiscape-verdict-checks';
    for (const check of failed) {
      const li = document.createElement('li');
      li.dataset.check = check.code;
      li.textContent = translateMessage(trans, check.message);
      list.appendChild(li);
    }
    nodes.push(list);
  }

  const equation = document.createElement('p');
  equation.className = 'jp-psiscape-fit-equation';
  equation.textContent = outcome.equation;
  nodes.push(equation, parameterTable(trans, outcome, view.units ?? { x: null, y: null }));

  const notes = document.createElement('ul');
  notes.className = 'jp-psiscape-fit-notes';
  for (const w of fit.warnings) {
    const li = document.createElement('li');
    li.className = 'jp-psiscape-fit-warning';
    li.textContent = translateMessage(trans, w);
    notes.appendChild(li);
  }
  for (const n of fit.notes ?? []) {
    const li = document.createElement('li');
    li.className = 'jp-psiscape-fit-note';
    li.textContent = translateMessage(trans, n);
    notes.appendChild(li);
  }
  for (const c of outcome.cautions) {
    const li = document.createElement('li');
    li.textContent = translateMessage(trans, c);
    notes.appendChild(li);
  }
  if (outcome.skipped > 0) {
    const li = document.createElement('li');
    li.textContent = trans._n('%1 row in the window was left out for a missing value.', '%1 rows in the window were left out for missing values.', outcome.skipped);
    notes.appendChild(li);
  }
  const convention = document.createElement('p');
  convention.className = 'jp-psiscape-fit-convention';
  convention.textContent = translateMessage(trans, outcome.convention);
  nodes.push(notes, convention);

  const landau = outcome.landau;
  const onExplore = view.onExploreLandau;
  if (landau && onExplore && kindById(outcome.kind)?.views.includes('landau-explorer')) {
    const explore = document.createElement('button');
    explore.type = 'button';
    explore.className = 'jp-Button jp-mod-styled jp-mod-accept jp-psiscape-fit-explore';
    explore.textContent = trans.__('Explore these coefficients');
    explore.title = trans.__('Open the Landau free-energy explorer with the fitted coefficients');
    explore.addEventListener('click', () => onExplore(landau));
    nodes.push(explore);
  }
  box.append(...nodes);
}

function parameterTable(trans: TranslationBundle, outcome: IAnalysisOutcome, units: { x: string | null; y: string | null }): HTMLTableElement {
  const fit = outcome.fit;
  const table = document.createElement('table');
  table.className = 'jp-psiscape-fit-table';
  const caption = document.createElement('caption');
  caption.textContent =
    fit.errorScaling === 'from-sigma'
      ? trans.__('Standard errors from the σ column (not rescaled).')
      : trans.__('Standard errors scaled by √χ²_red (no σ column given).');
  table.appendChild(caption);
  const header = table.createTHead().insertRow();
  for (const text of [trans.__('parameter'), trans.__('value ± standard error'), trans.__('unit'), trans.__('%1 % interval', formatPlain(100 * fit.confidenceLevel))]) {
    const th = document.createElement('th');
    th.scope = 'col';
    th.textContent = text;
    header.appendChild(th);
  }
  const body = table.createTBody();
  fit.parameters.forEach((name, i) => {
    const row = body.insertRow();
    const [lo, hi] = fit.confidenceIntervals[i];
    const unit = parameterUnit(name, units.x, units.y);
    for (const text of [name, formatWithError(fit.values[i], fit.standardErrors[i]), unit === '1' ? '' : (unit ?? ''), `${formatPlain(lo)} … ${formatPlain(hi)}`]) {
      row.insertCell().textContent = text;
    }
  });
  // Derived values that repeat a parameter (same name, or the same value and error) are not shown twice.
  const repeats = (d: { name: string; value: number; sigma: number }): boolean =>
    fit.parameters.some((name, i) => name === d.name || (fit.values[i] === d.value && fit.standardErrors[i] === d.sigma));
  for (const d of outcome.derived.filter(d => !repeats(d))) {
    const row = body.insertRow();
    row.className = 'jp-psiscape-fit-derived';
    const sigmaText = Number.isFinite(d.sigma)
      ? formatWithError(d.value, d.sigma)
      : Number.isFinite(d.value)
        ? d.sigmaReason
          ? trans.__('%1 (no σ: %2)', formatPlain(d.value), translateMessage(trans, d.sigmaReason))
          : trans.__('%1 (from the fitted values; no error propagated)', formatPlain(d.value))
        : '—';
    const unit = parameterUnit(d.name, units.x, units.y);
    for (const text of [d.name, sigmaText, unit === '1' ? '' : (unit ?? ''), translateMessage(trans, d.note)]) {
      row.insertCell().textContent = text;
    }
  }
  return table;
}
