/**
 * The numbers of an isotherm analysis: the primary result (the global
 * equation-of-state fit) with its verdict, the cross-checks each with
 * whether it agrees, the bootstrap spread when asked for, every warning once
 * and the conventions used.
 */
import type { TranslationBundle } from '@jupyterlab/translation';
import { formatWithError } from '../../core/analysis';
import type { ICoreMessage } from '../../core/messages';
import type { IAgreement, IIsothermReport } from '../../core/sweeps/job-types';
import type { IValueSigma } from '../../core/sweeps/types';
import { translateMessage } from '../translate';
import { headline, MARKS } from '../fit-result';

/** A value ± σ as text; a missing value reads "none". */
export function valueText(trans: TranslationBundle, v: IValueSigma | undefined): string {
  if (!v || !Number.isFinite(v.value)) {
    return trans.__('none');
  }
  return formatWithError(v.value, Number.isFinite(v.sigma) ? v.sigma : NaN);
}

function table(headers: string[], rows: (string | HTMLElement)[][], cls: string): HTMLTableElement {
  const t = document.createElement('table');
  t.className = `jp-psiscape-fit-table ${cls}`;
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
    for (const cell of r) {
      const td = row.insertCell();
      if (typeof cell === 'string') {
        td.textContent = cell;
      } else {
        td.appendChild(cell);
      }
    }
  }
  return t;
}

/** The agreement of a cross-check as a short badge with its sentence as title. */
export function agreementNode(trans: TranslationBundle, a: IAgreement): HTMLElement {
  const span = document.createElement('span');
  span.className = `jp-psiscape-agreement jp-psiscape-agreement-${a.state}`;
  const words = { agrees: trans.__('agrees'), close: trans.__('close'), disagrees: trans.__('disagrees'), 'no-result': trans.__('no result') };
  span.textContent = words[a.state];
  span.title = translateMessage(trans, a.message);
  return span;
}

/** The nodes of a report: `head` (verdict and primary result) goes above the views, `rest` below them. */
export function summaryNodes(trans: TranslationBundle, r: IIsothermReport): { head: HTMLElement[]; rest: HTMLElement[] } {
  const p = r.primary;
  const g = p.fit;
  const state = p.verdict.state === 'does-not-fit' ? 'does-not-describe' : p.verdict.state;
  const verdict = document.createElement('div');
  verdict.className = `jp-psiscape-verdict jp-psiscape-verdict-${state} jp-psiscape-isotherm-verdict`;
  verdict.dataset.verdict = state;
  verdict.setAttribute('role', 'status');
  const mark = document.createElement('span');
  mark.className = 'jp-psiscape-verdict-mark';
  mark.setAttribute('aria-hidden', 'true');
  mark.textContent = MARKS[state];
  const title = document.createElement('strong');
  title.textContent = headline(trans, state);
  const summary = document.createElement('span');
  summary.className = 'jp-psiscape-verdict-summary';
  summary.textContent = translateMessage(trans, p.verdict.message);
  const detail = document.createElement('span');
  detail.className = 'jp-psiscape-verdict-detail';
  detail.textContent = trans.__('Global fit of the equation of state, %1 points. Optimiser: %2', g.n, translateMessage(trans, g.reason));
  verdict.append(mark, title, summary, detail);

  const count = document.createElement('p');
  count.className = 'jp-psiscape-isotherm-count';
  count.textContent = [
    trans._n('%1 isotherm', '%1 isotherms', r.set.isotherms.length),
    trans.__('%1 of %2 points in the field range', r.fieldUse.used, r.fieldUse.total),
    r.set.fieldKind === 'internal' ? trans.__('internal field') : trans.__('applied field (no demagnetisation correction)'),
    trans.__('|t| ≤ %1', r.tMax)
  ].join(' · ');

  const primary = table(
    [trans.__('quantity'), trans.__('value ± standard error'), trans.__('unit')],
    [
      ['Tc', valueText(trans, g.Tc), 'K'],
      ['β', valueText(trans, g.beta), ''],
      ['γ', valueText(trans, g.gamma), ''],
      ['δ = 1 + γ/β', valueText(trans, g.delta), ''],
      ['T1', valueText(trans, g.T1), 'K'],
      ['M1', valueText(trans, g.M1), r.set.magnetisationUnit],
      [trans.__('points fitted'), String(g.n), '']
    ],
    'jp-psiscape-isotherm-primary'
  );
  const caption = primary.createCaption();
  caption.textContent = trans.__('Primary result: one fit of every point to the equation of state');

  const cross = (name: string, tc: IValueSigma | undefined, beta: IValueSigma | undefined, gamma: IValueSigma | undefined, delta: IValueSigma | undefined, a: IAgreement): (string | HTMLElement)[] => [
    name,
    valueText(trans, tc),
    valueText(trans, beta),
    valueText(trans, gamma),
    valueText(trans, delta),
    agreementNode(trans, a)
  ];
  const map = r.modifiedArrott.result;
  const kf = r.kouvelFisher.result;
  const crit = r.criticalIsotherm.result;
  const col = r.collapse.result;
  const rows = [
    cross(trans.__('modified Arrott iteration'), map?.Tc, map?.beta, map?.gamma, map?.deltaWidom, r.modifiedArrott.agreement),
    cross(trans.__('Kouvel–Fisher'), kf?.Tc, kf?.below.exponent, kf?.above.exponent, undefined, r.kouvelFisher.agreement),
    cross(trans.__('critical isotherm at the primary Tc'), undefined, undefined, undefined, crit?.delta, r.criticalIsotherm.agreement),
    cross(trans.__('scaling collapse'), col?.Tc, col?.beta, col?.gamma, undefined, r.collapse.agreement)
  ];
  if (r.bootstrap) {
    const b = r.bootstrap;
    const stat = (s: { mean: number; sd: number }): IValueSigma => ({ value: s.mean, sigma: s.sd });
    rows.push([
      trans.__('bootstrap over isotherms (%1 resamples, %2 failed)', b.samples, b.failed),
      valueText(trans, stat(b.Tc)),
      valueText(trans, stat(b.beta)),
      valueText(trans, stat(b.gamma)),
      '',
      ''
    ]);
  }
  rows.push([trans.__('Arrott plot (mean-field lines)'), valueText(trans, r.arrott.Tc), '', '', '', '']);
  const crossTable = table([trans.__('cross-check'), 'Tc (K)', 'β', 'γ', 'δ', trans.__('with the primary')], rows, 'jp-psiscape-isotherm-cross');
  const crossCaption = crossTable.createCaption();
  crossCaption.textContent = trans.__('Cross-checks, each started from the primary result');
  const reasons = document.createElement('ul');
  reasons.className = 'jp-psiscape-isotherm-agreements';
  for (const a of [r.modifiedArrott.agreement, r.kouvelFisher.agreement, r.criticalIsotherm.agreement, r.collapse.agreement]) {
    const li = document.createElement('li');
    li.textContent = translateMessage(trans, a.message);
    reasons.appendChild(li);
  }

  const start = document.createElement('p');
  start.className = 'jp-psiscape-fit-convention';
  start.textContent = translateMessage(trans, p.start);

  const notes = document.createElement('ul');
  notes.className = 'jp-psiscape-fit-notes jp-psiscape-isotherm-warnings';
  const seen = new Set<string>();
  const add = (m: ICoreMessage): void => {
    const text = translateMessage(trans, m);
    if (!seen.has(text)) {
      seen.add(text);
      const li = document.createElement('li');
      li.className = 'jp-psiscape-fit-warning';
      li.textContent = text;
      notes.appendChild(li);
    }
  };
  r.warnings.forEach(add);
  const conventions = document.createElement('details');
  conventions.className = 'jp-psiscape-isotherm-conventions';
  const conventionsTitle = document.createElement('summary');
  conventionsTitle.textContent = trans.__('Conventions and methods used');
  const list = document.createElement('ul');
  list.className = 'jp-psiscape-fit-convention';
  for (const m of r.conventions) {
    const li = document.createElement('li');
    li.textContent = translateMessage(trans, m);
    list.appendChild(li);
  }
  conventions.append(conventionsTitle, start, list);
  return { head: [verdict, count, primary], rest: [notes, crossTable, reasons, conventions] };
}
