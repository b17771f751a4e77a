/**
 * Under the fit in the analysis panel (real Lumino widgets in jsdom): the
 * residuals and the correlation heat map are drawn for the current fit; the
 * residual check suggests relative weights for data whose scatter grows with
 * |y| and its button refits with them; the fit window follows the keyboard
 * on the focused chart. Data: spin-½ Weiss M(T) with σ (test helpers), and a
 * Curie–Weiss χ = C/(T − θ) + χ0 with 2 % relative noise (formula in
 * REFERENCE.md; invented C = 1.2 emu K/mol/Oe, θ = 15 K, χ0 = 2e-4).
 */
import { afterEach, describe, expect, it } from 'vitest';
import { parseMime } from '../../src/core/table';
import { mulberry32 } from '../../src/core/numeric/random';
import { choose, panelFor, weissCsv } from './helpers';

afterEach(() => {
  document.body.innerHTML = '';
});

function curieWeissCsv(): string {
  const uniform = mulberry32(11);
  const normal = (): number => Math.sqrt(-2 * Math.log(1 - uniform())) * Math.cos(2 * Math.PI * uniform());
  const rows = ['T (K),chi (emu/mol/Oe)'];
  for (let i = 0; i < 60; i++) {
    const T = 30 + 4.5 * i;
    const chi = 1.2 / (T - 15) + 2e-4;
    rows.push(`${T},${(chi * (1 + 0.02 * normal())).toPrecision(10)}`);
  }
  return rows.join('\n');
}

describe('fit checks in the panel', () => {
  it('should draw the residuals and the correlation matrix of the current fit', async () => {
    const { panel } = panelFor(parseMime('text/csv', weissCsv()));
    await panel.rendered;
    choose(panel.node.querySelector<HTMLSelectElement>('select.jp-psiscape-fit-kind')!, 'weiss');
    await panel.fitSection.runFit();
    await panel.rendered;
    const checks = panel.node.querySelector<HTMLElement>('.jp-psiscape-FitChecks')!;
    expect(checks.classList.contains('lm-mod-hidden')).toBe(false);
    await new Promise(resolve => setTimeout(resolve, 0));
    const residuals = panel.node.querySelector('.jp-psiscape-FitChecks-residuals')!;
    const correlation = panel.node.querySelector('.jp-psiscape-FitChecks-correlation')!;
    await new Promise(resolve => setTimeout(resolve, 200));
    // One point per fitted row, normalised by the σ column.
    expect(residuals.querySelectorAll('svg g.mark-symbol.role-mark path').length).toBe(60);
    expect(residuals.getAttribute('aria-label')).toMatch(/Residuals/);
    // Two parameters (Ms, Tc): a 2 × 2 matrix.
    expect(correlation.querySelectorAll('svg g.mark-rect.role-mark path').length).toBe(4);
  });

  it('should suggest relative weights for scatter that grows with |y|, and refit with them on request', async () => {
    const { panel, session } = panelFor(parseMime('text/csv', curieWeissCsv()));
    await panel.rendered;
    choose(panel.node.querySelector<HTMLSelectElement>('select.jp-psiscape-fit-kind')!, 'curie-weiss');
    await panel.fitSection.runFit();
    await panel.rendered;
    const check = session.outcome!.weighting!.check!;
    expect(check.relativeBetter).toBe(true);
    const button = panel.node.querySelector<HTMLButtonElement>('button.jp-psiscape-use-relative')!;
    expect(button.isConnected).toBe(true);
    button.click();
    await panel.fitSection.settled;
    await panel.rendered;
    expect(session.weights).toEqual({ mode: 'relative', fraction: null });
    expect(session.outcome!.weighting!.mode).toBe('relative');
    expect(panel.node.querySelector<HTMLSelectElement>('select.jp-psiscape-fit-weights-mode')!.value).toBe('relative');
  });

  it('should move the fit window with the arrow keys on the focused chart, and clear it with Escape', async () => {
    const { panel, session } = panelFor(parseMime('text/csv', weissCsv()));
    await panel.rendered;
    const range = session.xRange();
    session.setWindow(range.min + 0.2 * (range.max - range.min), range.min + 0.6 * (range.max - range.min));
    const before = session.window;
    const key = (init: KeyboardEventInit): void => {
      panel.chart.node.dispatchEvent(new KeyboardEvent('keydown', { bubbles: true, ...init }));
    };
    key({ key: 'ArrowRight' });
    const step = 0.02 * (range.max - range.min);
    expect(session.window.min).toBeCloseTo(before.min + step, 9);
    expect(session.window.max).toBeCloseTo(before.max + step, 9);
    key({ key: 'ArrowLeft', shiftKey: true });
    expect(session.window.max).toBeCloseTo(before.max, 9);
    key({ key: 'ArrowRight', altKey: true });
    expect(session.window.min).toBeCloseTo(before.min + 2 * step, 9);
    key({ key: 'Escape' });
    expect(session.windowInput).toEqual({ min: null, max: null });
    expect(panel.chart.node.tabIndex).toBe(0);
  });
});
