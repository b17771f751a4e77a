/**
 * Fitting from the analysis panel (real widgets in jsdom; jobs run on the main
 * thread here because jsdom has no Web Worker): the verdict in three states,
 * the results table, the overlay curve, σ column, refusals as messages that
 * grey the previous result, cancel, and window fields that refuse bad text.
 */
import { afterEach, describe, expect, it, vi } from 'vitest';
import { MessageLoop } from '@lumino/messaging';
import { parseMime } from '../../src/core/table';
import { choose, panelFor, type, weissCsv } from './helpers';

function open() {
  return panelFor(parseMime('text/csv', weissCsv()));
}

const q = <T extends Element>(root: Element, selector: string) => root.querySelector<T & HTMLElement>(selector)!;

describe('FitSection in the analysis panel', () => {
  afterEach(() => {
    document.body.innerHTML = '';
  });

  it('should start the analysis worker only on the way to a fit, not when the panel opens', async () => {
    const workerFactory = vi.fn(() => null);
    const { panel } = panelFor(parseMime('text/csv', weissCsv()), { workerFactory });
    await panel.rendered;
    expect(workerFactory).not.toHaveBeenCalled();
    panel.fitSection.node.dispatchEvent(new Event('pointerenter'));
    expect(workerFactory).toHaveBeenCalledTimes(1);
    panel.fitSection.node.dispatchEvent(new Event('focusin'));
    expect(workerFactory).toHaveBeenCalledTimes(1);
  });

  it('should offer every catalogued kind and build the chosen kind’s options', async () => {
    const { panel } = open();
    await panel.rendered;
    const kinds = Array.from(q<HTMLSelectElement>(panel.node, 'select.jp-psiscape-fit-kind').options).map(o => o.value);
    expect(kinds).toEqual(['power-law', 'power-law-corrected', 'weiss', 'curie-weiss', 'landau', 'bean-rodbell', 'expression']);
    choose(q(panel.node, 'select.jp-psiscape-fit-kind'), 'weiss');
    await panel.rendered;
    const spins = Array.from(q<HTMLSelectElement>(panel.node, 'select.jp-psiscape-option-J').options).map(o => o.textContent);
    expect(spins).toContain('7');
    expect(spins.at(-1)).toMatch(/Langevin/);
  });

  it('should fit the Weiss model, show the verdict first and draw the curve over the points', async () => {
    const { panel, session } = open();
    await panel.rendered;
    choose(q(panel.node, 'select.jp-psiscape-fit-kind'), 'weiss');
    q<HTMLButtonElement>(panel.node, 'button.jp-psiscape-fit-run').click();
    await panel.fitSection.settled;
    await panel.rendered;
    const outcome = session.outcome!;
    expect(outcome.fit.converged).toBe(true);
    expect(outcome.fit.errorScaling).toBe('from-sigma');
    const verdict = q(panel.node, '.jp-psiscape-verdict');
    expect(verdict.dataset.verdict).toBe(outcome.verdict.state);
    const rows = Array.from(panel.node.querySelectorAll('.jp-psiscape-fit-table tbody tr')).map(r => r.children[0].textContent);
    expect(rows).toEqual(['Ms', 'Tc']);
    expect(panel.node.querySelectorAll('.jp-psiscape-fit-table tbody tr')[1].children[1].textContent).toMatch(/^250\.\d+ ± 0\.\d+$/);
    expect(q(panel.node, '.jp-psiscape-fit-table caption').textContent).toBe('Standard errors from the σ column (not rescaled).');
    expect(panel.chart.node.querySelectorAll('svg .mark-line path').length).toBe(1);
    // The data chart (the residual chart under the fit draws its own 60 points).
    expect(panel.chart.node.querySelectorAll('svg g.mark-symbol.role-mark path').length).toBe(60);
  });

  it('should never show the success style for a power law over the whole ordered range of mean-field data', async () => {
    // A mis-specified model: Weiss (β = ½ only near Tc) data fitted by a pure power law from 20 K to Tc.
    const { panel, session } = open();
    await panel.rendered;
    session.setWindow(20, 245);
    await panel.fitSection.runFit();
    await panel.rendered;
    expect(session.outcome!.verdict.state).toBe('does-not-describe');
    expect(q(panel.node, '.jp-psiscape-verdict').className).toContain('jp-psiscape-verdict-does-not-describe');
    expect(q(panel.node, '.jp-psiscape-verdict').textContent).toMatch(/does not describe the data/);
  });

  it('should show a refusal as a message, grey the previous result and keep the controls', async () => {
    const { panel, session } = open();
    await panel.rendered;
    choose(q(panel.node, 'select.jp-psiscape-fit-kind'), 'weiss');
    await panel.fitSection.runFit();
    const first = session.outcome;
    type(q(panel.node, 'input.jp-psiscape-fit-min'), '30');
    type(q(panel.node, 'input.jp-psiscape-fit-max'), '36');
    await panel.fitSection.runFit();
    await panel.rendered;
    const error = q(panel.node, '.jp-psiscape-fit-error');
    expect(error.hidden).toBe(false);
    expect(error.textContent).toBe('The fit could not run: This analysis needs at least 4 points in the fit window, but the window holds 2. Widen the window.');
    expect(session.outcome).toBe(first);
    const result = q(panel.node, '.jp-psiscape-fit-result');
    expect(result.classList.contains('jp-psiscape-mod-previous')).toBe(true);
    expect(q(result, '.jp-psiscape-fit-previous-label').textContent).toMatch(/^Previous result \(Weiss mean field M\(T\)\)/);
    // The chart drops the curve of a result that is not current.
    expect(panel.node.querySelectorAll('.jp-psiscape-ChartView svg .mark-line path').length).toBe(0);
    expect(q<HTMLButtonElement>(panel.node, 'button.jp-psiscape-fit-run').disabled).toBe(false);
  });

  it('should refuse a window end that is not a number and lose nothing', async () => {
    const { panel, session } = open();
    await panel.rendered;
    session.setWindow(30, 200);
    await panel.rendered;
    type(q(panel.node, 'input.jp-psiscape-fit-min'), '4..5');
    expect(q(panel.node, 'input.jp-psiscape-fit-min').hasAttribute('aria-invalid')).toBe(true);
    expect(q(panel.node, '.jp-psiscape-fit-window-message').textContent).toMatch(/Write a number/);
    expect(session.windowInput).toEqual({ min: 30, max: 200 });
    type(q(panel.node, 'input.jp-psiscape-fit-min'), '−10');
    expect(session.windowInput).toEqual({ min: -10, max: 200 });
  });

  it('should stop a running fit on Cancel and say what it kept', async () => {
    const { panel, session } = open();
    await panel.rendered;
    choose(q(panel.node, 'select.jp-psiscape-fit-kind'), 'weiss');
    await panel.fitSection.runFit();
    const first = session.outcome;
    const running = panel.fitSection.runFit();
    q<HTMLButtonElement>(panel.node, 'button.jp-psiscape-fit-cancel').click();
    await running;
    await panel.rendered;
    expect(session.run.phase).toBe('cancelled');
    expect(session.outcome).toBe(first);
    expect(q(panel.node, '.jp-psiscape-fit-error').textContent).toMatch(/^Stopped by you/);
  });

  it('should not refit on a layout fit request (theme changes send one to every widget)', async () => {
    const { panel, session } = open();
    await panel.rendered;
    await panel.fitSection.runFit();
    const first = session.outcome;
    panel.fit();
    panel.fitSection.fit();
    MessageLoop.flush();
    await new Promise(resolve => setTimeout(resolve, 50));
    expect(session.outcome).toBe(first);
    expect(q(panel.node, '.jp-psiscape-fit-status').textContent).toBe('');
  });

  it('should clear the result when other columns are chosen', async () => {
    const { panel, session } = open();
    await panel.fitSection.runFit();
    session.setRoles({ y: 2 });
    await panel.rendered;
    expect(session.outcome).toBeNull();
    expect(panel.node.querySelector('.jp-psiscape-fit-table')).toBeNull();
  });
});

describe('expressions in the fit section', () => {
  afterEach(() => {
    document.body.innerHTML = '';
  });

  it('should list the parameters found before fitting, with the x column’s own name as the variable', async () => {
    const { panel } = panelFor(parseMime('text/csv', weissCsv()));
    await panel.rendered;
    choose(q(panel.node, 'select.jp-psiscape-fit-kind'), 'expression');
    await panel.rendered;
    const input = q<HTMLInputElement>(panel.node, 'input.jp-psiscape-option-expression');
    input.value = 'A*exp(-T/T0) + c';
    input.dispatchEvent(new Event('input'));
    expect(q(panel.node, '.jp-psiscape-fit-parameters').textContent).toBe('Parameters to fit: A, T0, c');
  });

  it('should show where an expression cannot be read, with a caret under the place', async () => {
    const { panel } = panelFor(parseMime('text/csv', weissCsv()));
    await panel.rendered;
    choose(q(panel.node, 'select.jp-psiscape-fit-kind'), 'expression');
    await panel.rendered;
    const input = q<HTMLInputElement>(panel.node, 'input.jp-psiscape-option-expression');
    input.value = 'A*(1 - T/Tc';
    input.dispatchEvent(new Event('input'));
    expect(q(panel.node, '.jp-psiscape-fit-inspection-error').textContent).not.toMatch(/mathjs|SyntaxError|Parenthesis \) expected/);
    const caret = q(panel.node, '.jp-psiscape-fit-caret').textContent!.split('\n');
    expect(caret[0]).toContain('A*(1 - T/Tc');
    expect(caret[1]).toMatch(/^ *\^$/);
  });
});
