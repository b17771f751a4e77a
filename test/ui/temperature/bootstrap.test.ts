/**
 * The bootstrap view (real Lumino widget in jsdom, the task run on the main
 * thread) on a spin-½ Weiss M(T): a table per parameter with the fitted
 * value, mean, sd and the 68 % and 95 % percentile intervals; the same seed
 * repeats a run exactly; bad fields and failing jobs are refused in words;
 * Cancel keeps the table shown.
 */
import { Widget } from '@lumino/widgets';
import { afterEach, describe, expect, it } from 'vitest';
import { BootstrapView } from '../../../src/ui/temperature';
import { alertText, mainThreadRunner, sessionFor, statusText, theme, trans, WEISS, weissCsv } from './helpers';

function open() {
  const session = sessionFor(weissCsv(), 'weiss');
  const view = new BootstrapView({ trans, session, runner: mainThreadRunner(), theme });
  Widget.attach(view, document.body);
  return { session, view };
}

const runButton = (view: BootstrapView) => view.node.querySelector<HTMLButtonElement>('button.jp-psiscape-bootstrap-run')!;
const cancelButton = (view: BootstrapView) => view.node.querySelector<HTMLButtonElement>('button.jp-psiscape-bootstrap-cancel')!;
const tableRows = (view: BootstrapView) => [...view.node.querySelectorAll<HTMLTableRowElement>('.jp-psiscape-bootstrap-table tbody tr')];

describe('BootstrapView', () => {
  afterEach(() => {
    document.body.innerHTML = '';
  });

  it('should start with 200 samples and seed 1, each field labelled', () => {
    const { view } = open();
    expect(view.fields.samples.value).toBe('200');
    expect(view.fields.seed.value).toBe('1');
    expect(view.fields.samples.closest('label')!.textContent).toMatch(/samples/);
    expect(view.fields.seed.closest('label')!.textContent).toMatch(/seed/);
  });

  it('should give a row per parameter with ordered percentiles around the fitted values', async () => {
    const { view } = open();
    view.fields.samples.value = '40';
    runButton(view).click();
    const progress = view.node.querySelector<HTMLProgressElement>('progress.jp-psiscape-bootstrap-progress')!;
    expect(progress.hidden).toBe(false);
    await view.settled;
    // The task reported the fraction done while it ran, and the bar goes away with it.
    expect(progress.value).toBeGreaterThan(0);
    expect(progress.hidden).toBe(true);
    expect(alertText(view.node)).toBeNull();
    const b = view.summary!;
    expect(b.samples).toBe(40);
    expect(b.seed).toBe(1);
    expect(tableRows(view).map(r => r.cells[0].textContent)).toEqual(['Ms', 'Tc']);
    for (const s of b.stats) {
      // Percentiles of one sample are ordered: p2.5 ≤ p16 ≤ p84 ≤ p97.5, and the mean lies inside the 95 % interval.
      expect(s.p025).toBeLessThanOrEqual(s.p16);
      expect(s.p16).toBeLessThanOrEqual(s.p84);
      expect(s.p84).toBeLessThanOrEqual(s.p975);
      expect(s.mean).toBeGreaterThanOrEqual(s.p025);
      expect(s.mean).toBeLessThanOrEqual(s.p975);
    }
    // The generated curve has Tc = 250 K, Ms = 80 (REFERENCE.md B1) and a ±0.3 wiggle: the fitted values
    // are within 0.5 % of them, and the residual bootstrap's spread is of the order of the wiggle's effect (sd < 1 %).
    const Tc = b.stats.find(s => s.name === 'Tc')!;
    const Ms = b.stats.find(s => s.name === 'Ms')!;
    expect(Math.abs(Tc.fitted - WEISS.Tc) / WEISS.Tc).toBeLessThan(0.005);
    expect(Math.abs(Ms.fitted - WEISS.Ms) / WEISS.Ms).toBeLessThan(0.005);
    expect(Tc.sd / Tc.fitted).toBeLessThan(0.01);
    const heads = [...view.node.querySelectorAll('.jp-psiscape-bootstrap-table thead th')].map(th => th.textContent);
    expect(heads).toEqual(['parameter', 'fitted', 'bootstrap mean', 'standard deviation', '68 % interval', '95 % interval']);
    expect(tableRows(view)[1].cells[4].textContent).toMatch(/^[\d.]+ … [\d.]+$/);
    expect(view.node.querySelector('.jp-psiscape-bootstrap-failed')!.textContent).toMatch(/refitted|failed/);
    expect(view.node.querySelector('.jp-psiscape-bootstrap-convention')!.textContent!.length).toBeGreaterThan(20);
    expect(view.node.textContent).not.toMatch(/NaN|undefined/);
  });

  it('should repeat a run exactly with the same seed and differ with another', async () => {
    const { view } = open();
    view.fields.samples.value = '20';
    await view.run();
    const first = view.summary!.stats;
    await view.run();
    expect(view.summary!.stats).toEqual(first);
    view.fields.seed.value = '7';
    await view.run();
    expect(view.summary!.seed).toBe(7);
    expect(view.summary!.stats.find(s => s.name === 'Tc')!.mean).not.toBe(first.find(s => s.name === 'Tc')!.mean);
  });

  it('should refuse samples outside 20–5000 and a bad seed in words, without running', async () => {
    const { view } = open();
    for (const [samples, seed, words] of [
      ['10', '1', /samples as a whole number from 20 to 5000/],
      ['6000', '1', /samples as a whole number from 20 to 5000/],
      ['2.5e2', '1', /samples as a whole number/],
      ['200', '-1', /seed as a whole number/]
    ] as const) {
      view.fields.samples.value = samples;
      view.fields.seed.value = seed;
      await view.run();
      expect(view.node.querySelector('.jp-psiscape-bootstrap-field-message')!.textContent, `${samples}, ${seed}`).toMatch(words);
      expect(view.summary).toBeNull();
    }
    expect(view.fields.seed.getAttribute('aria-invalid')).not.toBeNull();
  });

  it('should keep the table shown when a new bootstrap is cancelled', async () => {
    const { view } = open();
    view.fields.samples.value = '20';
    await view.run();
    const before = view.summary;
    runButton(view).click();
    expect(cancelButton(view).hidden).toBe(false);
    cancelButton(view).click();
    await view.settled;
    expect(statusText(view.node)).toMatch(/^Stopped by you/);
    expect(view.summary).toBe(before);
    expect(tableRows(view).length).toBe(2);
  });

  it('should say in words why it cannot run', async () => {
    const { session, view } = open();
    // 3 points (T = 20, 24, 28 K) for Ms and Tc: the bootstrap needs 2 more points than parameters, so 4.
    session.setWindow(20, 28);
    view.fields.samples.value = '20';
    await view.run();
    expect(alertText(view.node)).toMatch(/^The bootstrap could not run: /);
    expect(alertText(view.node)).not.toMatch(/undefined|NaN/);
  });
});
