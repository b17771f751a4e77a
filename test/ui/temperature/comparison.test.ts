/**
 * The model comparison view (real Lumino widget in jsdom, the task run on
 * the main thread): on spin-½ Weiss data the spin-½ model ranks first, the
 * table is ordered by AICc with weights as percentages, failures come last,
 * the J-free row shows J ± σ, "Use" sets the session's kind and options,
 * Cancel keeps the table shown, and failures are told in words.
 */
import { Widget } from '@lumino/widgets';
import { afterEach, describe, expect, it } from 'vitest';
import { ComparisonView } from '../../../src/ui/temperature';
import { alertText, mainThreadRunner, sessionFor, statusText, theme, trans, weissCsv } from './helpers';

function open(kind = 'weiss') {
  const session = sessionFor(weissCsv(), kind);
  const view = new ComparisonView({ trans, session, runner: mainThreadRunner(), theme });
  Widget.attach(view, document.body);
  return { session, view };
}

const runButton = (view: ComparisonView) => view.node.querySelector<HTMLButtonElement>('button.jp-psiscape-compare-run')!;
const cancelButton = (view: ComparisonView) => view.node.querySelector<HTMLButtonElement>('button.jp-psiscape-compare-cancel')!;
const bodyRows = (view: ComparisonView) => [...view.node.querySelectorAll<HTMLTableRowElement>('.jp-psiscape-compare-table tbody tr')];

describe('ComparisonView', () => {
  afterEach(() => {
    document.body.innerHTML = '';
  });

  it('should rank Weiss J = ½ first on spin-½ Weiss data, best first by AICc, weights as percentages', async () => {
    const { view } = open();
    runButton(view).click();
    expect(cancelButton(view).hidden).toBe(false);
    await view.settled;
    expect(alertText(view.node)).toBeNull();
    const c = view.comparison!;
    const rows = bodyRows(view);
    expect(rows.length).toBe(c.models.length);
    // The data are a spin-½ Weiss curve (REFERENCE.md B1, m = tanh(m/τ)): J = ½ must win.
    expect(rows[0].cells[0].textContent).toMatch(/J = 1\/2/);
    expect(rows[0].dataset.kind).toBe('weiss');
    // ΔAICc_i = AICc_i − min AICc: 0 on the first row, growing down the ranked rows.
    expect(rows[0].cells[6].textContent).toBe('0.00');
    const ranked = rows.filter(r => !r.classList.contains('jp-psiscape-compare-failed'));
    const aicc = ranked.map(r => Number(r.cells[4].textContent));
    expect(aicc).toEqual([...aicc].sort((a, b) => a - b));
    // Akaike weights w_i = exp(−Δ_i/2)/Σ_j exp(−Δ_j/2) (Burnham & Anderson 2002, §2.9) sum to 100 %
    // (each shown to 0.1 %, so the rounded sum is within 0.05 % per row).
    const weights = ranked.map(r => r.cells[7].textContent!).map(s => (s.startsWith('<') ? 0 : Number(s.replace(' %', ''))));
    expect(Math.abs(weights.reduce((a, b) => a + b, 0) - 100)).toBeLessThanOrEqual(0.05 * weights.length + 0.1);
    // Failures (not converged or left out) come after every ranked row.
    const firstFailed = rows.findIndex(r => r.classList.contains('jp-psiscape-compare-failed'));
    if (firstFailed >= 0) {
      expect(rows.slice(firstFailed).every(r => r.classList.contains('jp-psiscape-compare-failed'))).toBe(true);
    }
    // Columns: model, k, χ²_red, AIC, AICc, BIC, ΔAICc, weight, verdict, refit.
    const heads = [...view.node.querySelectorAll('.jp-psiscape-compare-table thead th')].map(th => th.textContent);
    expect(heads).toEqual(['model', 'k', 'χ²_red', 'AIC', 'AICc', 'BIC', 'ΔAICc', 'Akaike weight', 'verdict', 'refit']);
    expect(view.node.querySelector('.jp-psiscape-compare-summary')!.textContent).toMatch(/prefer/);
    expect(view.node.querySelector('.jp-psiscape-compare-table caption')!.textContent).toMatch(/same 60 points/);
    expect(view.node.textContent).not.toMatch(/NaN|undefined/);
  });

  it('should show J ± σ on the J-free row, near ½ for spin-½ data', async () => {
    const { view } = open();
    await view.run();
    const free = view.comparison!.models.find(m => m.kind === 'weiss' && m.options.freeJ === true)!;
    expect(free).toBeDefined();
    const row = bodyRows(view).find(r => r.cells[0].textContent!.includes('J fitted'))!;
    expect(row.querySelector('.jp-psiscape-compare-j')!.textContent).toMatch(/J = [\d.]+ ± [\d.]+/);
    // The data are spin ½ (REFERENCE.md B1); J fitted as 1/J over [0, 2] reaches ½ at its bound, within 0.15 of it here.
    expect(Math.abs(free.values.J.value - 0.5)).toBeLessThan(0.15);
  });

  it('should set the session to a candidate with its Use button', async () => {
    const { session, view } = open('power-law');
    await view.run();
    const row = bodyRows(view).find(r => r.cells[0].textContent!.includes('J = 5/2'))!;
    row.querySelector<HTMLButtonElement>('button.jp-psiscape-compare-use')!.click();
    expect(session.kind).toBe('weiss');
    expect(session.options).toMatchObject({ J: 2.5, freeJ: false });
    expect(view.node.querySelector('.jp-psiscape-compare-used')!.textContent).toMatch(/J = 5\/2.*Fit/);
    const free = bodyRows(view).find(r => r.cells[0].textContent!.includes('J fitted'))!;
    free.querySelector<HTMLButtonElement>('button.jp-psiscape-compare-use')!.click();
    expect(session.options.freeJ).toBe(true);
  });

  it('should keep the table shown when a new comparison is cancelled', async () => {
    const { view } = open();
    await view.run();
    const before = view.comparison;
    const html = view.node.querySelector('.jp-psiscape-compare-table')!.outerHTML;
    runButton(view).click();
    expect(runButton(view).disabled).toBe(true);
    cancelButton(view).click();
    await view.settled;
    expect(statusText(view.node)).toMatch(/^Stopped by you/);
    expect(view.comparison).toBe(before);
    expect(view.node.querySelector('.jp-psiscape-compare-table')!.outerHTML).toBe(html);
    expect(runButton(view).disabled).toBe(false);
    expect(cancelButton(view).hidden).toBe(true);
  });

  it('should say in words why it cannot run', async () => {
    const { session, view } = open();
    // 3 points (T = 20, 24, 28 K) in the window: fewer than any candidate can be ranked with.
    session.setWindow(20, 28);
    await view.run();
    expect(alertText(view.node)).toMatch(/^The comparison could not run: Comparing models needs at least 4 points in the fit window, but it holds 3/);
    expect(view.comparison).toBeNull();
  });
});
