/**
 * Sliders on the fitted parameters (real Lumino widgets in jsdom): spans of
 * a few σ within the bounds, log scale over more than a decade, at most one
 * preview per animation frame however many inputs arrive, the χ² readout, "Back to
 * the fit" and "Fit from here"; in the panel the chart's curve and the
 * residuals change in place (same Vega view, new rows), the sliders hide in
 * the isotherm mode, and the live notebook output has them too.
 */
import { nullTranslator } from '@jupyterlab/translation';
import { Panel, Widget } from '@lumino/widgets';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { runAnalysisJob } from '../../src/core/analysis';
import type { IAnalysisJob } from '../../src/core/analysis';
import { parseMime } from '../../src/core/table';
import { weissMagnetisation } from '../../src/core/physics/weiss';
import { FIT_CURVE_DATA } from '../../src/charts/fit-overlay';
import { RESIDUAL_DATA } from '../../src/charts/temperature/residuals';
import { MODEL_PREVIEW_EVENT, ModelSliders, positionOf, SLIDER_POSITIONS, sliderScale, valueAt } from '../../src/ui/model-sliders';
import { renderInlineAnalysis } from '../../src/ui/inline-analysis';
import { choose, panelFor, weissCsv } from './helpers';
import { buildReport, notebookOutputs, runAnalysisJobForTest } from './inline-fixtures';

afterEach(() => {
  document.body.innerHTML = '';
});

const trans = nullTranslator.load('jupyterlab_psiscape');

function weissJob(): IAnalysisJob {
  const T = Array.from({ length: 60 }, (_, i) => 20 + 5 * i);
  const m = weissMagnetisation(0.5, T.map(t => t / 250));
  return { kind: 'weiss', x: T, y: T.map((_, i) => 80 * m[i] + 0.3 * Math.sin(7 * i)), sigma: T.map(() => 0.3), window: { min: 0, max: 1000 }, options: { J: 0.5 } };
}

const frame = (): Promise<void> => new Promise(resolve => requestAnimationFrame(() => resolve()));

function slider(root: HTMLElement, name: string): { range: HTMLInputElement; number: HTMLInputElement } {
  return {
    range: root.querySelector<HTMLInputElement>(`input.jp-psiscape-ModelSliders-range[data-parameter="${name}"]`)!,
    number: root.querySelector<HTMLInputElement>(`input.jp-psiscape-ModelSliders-number[data-parameter="${name}"]`)!
  };
}

function move(range: HTMLInputElement, position: number): void {
  range.value = String(position);
  range.dispatchEvent(new Event('input', { bubbles: true }));
}

describe('slider spans', () => {
  it('span the value ± 3σ, clipped to the bounds, log over more than a decade of positive values', () => {
    expect(sliderScale(10, 1)).toEqual({ min: 7, max: 13, log: false });
    expect(sliderScale(1, 0.5, 0, Infinity)).toEqual({ min: 0, max: 2.5, log: false });
    expect(sliderScale(1, 0.5, 1e-9, Infinity)).toEqual({ min: 1e-9, max: 2.5, log: true });
    expect(sliderScale(0.4, 1, 0, 2)).toEqual({ min: 0, max: 2, log: false });
    // No σ: half the value either way (± 1 at 0).
    expect(sliderScale(8, Number.NaN)).toEqual({ min: 4, max: 12, log: false });
    expect(sliderScale(0, 0)).toEqual({ min: -1, max: 1, log: false });
    // At a bound with σ = 0 the span opens on the side that has room.
    expect(sliderScale(0, 0, 0, 2)).toEqual({ min: 0, max: 1, log: false });
  });

  it('map positions to values and back, on either scale', () => {
    for (const scale of [sliderScale(10, 1), sliderScale(1, 0.5, 1e-3, Infinity)]) {
      expect(valueAt(scale, 0)).toBeCloseTo(scale.min, 12);
      expect(valueAt(scale, SLIDER_POSITIONS)).toBeCloseTo(scale.max, 9);
      expect(positionOf(scale, valueAt(scale, 377))).toBe(377);
      expect(positionOf(scale, scale.max * 10)).toBe(SLIDER_POSITIONS);
      expect(positionOf(scale, Number.NaN)).toBe(0);
    }
  });
});

describe('ModelSliders', () => {
  function make() {
    const onPreview = vi.fn(() => Promise.resolve());
    const onFitFromHere = vi.fn();
    const widget = new ModelSliders({ trans, onPreview, onFitFromHere });
    Widget.attach(widget, document.body);
    const job = weissJob();
    const outcome = runAnalysisJob(job);
    widget.setOutcome(outcome, job);
    return { widget, onPreview, onFitFromHere, outcome, job };
  }

  it('shows one labelled, keyboard-usable slider and field per fitted parameter, at the fitted values', () => {
    const { widget, outcome } = make();
    expect(widget.isHidden).toBe(false);
    const rows = widget.node.querySelectorAll('.jp-psiscape-ModelSliders-row');
    expect([...rows].map(r => (r as HTMLElement).dataset.parameter)).toEqual(['Ms', 'Tc']);
    const { range, number } = slider(widget.node, 'Tc');
    expect(range.type).toBe('range');
    expect(range.labels?.[0]?.textContent).toBe('Tc');
    expect(number.getAttribute('aria-label')).toMatch(/Tc/);
    expect(Number(number.value)).toBeCloseTo(outcome.fit.values[1], 3);
    expect(Number(range.value)).toBe(SLIDER_POSITIONS / 2);
    expect(range.getAttribute('aria-valuetext')).toBe(number.value);
    expect(widget.node.querySelector<HTMLButtonElement>('.jp-psiscape-ModelSliders-back')!.disabled).toBe(true);
    expect(widget.node.querySelector('.jp-psiscape-ModelSliders-chi2')!.textContent).toMatch(/χ² = /);
  });

  it('previews once per animation frame however many inputs arrive, and updates χ²', async () => {
    const { widget, onPreview, outcome } = make();
    const readout = widget.node.querySelector<HTMLElement>('.jp-psiscape-ModelSliders-chi2')!;
    const before = Number(readout.dataset.chi2);
    expect(before).toBeCloseTo(outcome.fit.chi2, 6);
    const events: number[] = [];
    widget.node.addEventListener(MODEL_PREVIEW_EVENT, e => events.push((e as CustomEvent).detail.chi2));
    const { range } = slider(widget.node, 'Tc');
    for (let p = 510; p <= 600; p += 10) {
      move(range, p);
    }
    // The first input of a frame is drawn at once; the nine after it in the same frame together, at the next.
    expect(onPreview).toHaveBeenCalledTimes(1);
    await frame();
    await widget.settled;
    expect(onPreview).toHaveBeenCalledTimes(2);
    const [values, evaluation] = onPreview.mock.calls[1] as unknown as [Record<string, number>, { chi2: number; curveY: Float64Array }];
    expect(values.Tc).toBe(widget.values.Tc);
    expect(Number(range.value)).toBe(600);
    expect(values.Tc).toBeGreaterThan(outcome.fit.values[1]);
    expect(values.Ms).toBe(outcome.fit.values[0]);
    expect(evaluation.curveY.length).toBe(outcome.curve.y.length);
    expect(Number(readout.dataset.chi2)).toBeGreaterThan(before + 1);
    expect(events).toHaveLength(2);
    expect(widget.node.querySelector<HTMLButtonElement>('.jp-psiscape-ModelSliders-back')!.disabled).toBe(false);
  });

  it('takes an exact value typed in the field and keeps the last good value for text that is no number', async () => {
    const { widget, onPreview } = make();
    const { range, number } = slider(widget.node, 'Tc');
    number.value = '251.5';
    number.dispatchEvent(new Event('input'));
    await frame();
    await widget.settled;
    expect(widget.values.Tc).toBe(251.5);
    // Above the fitted Tc (≈ 250 K): the slider moved up.
    expect(Number(range.value)).toBeGreaterThan(SLIDER_POSITIONS / 2);
    number.value = '';
    number.dispatchEvent(new Event('input'));
    expect(number.getAttribute('aria-invalid')).toBe('true');
    number.dispatchEvent(new Event('change'));
    expect(number.value).toBe('251.5');
    await frame();
    expect(onPreview).toHaveBeenCalledTimes(1);
  });

  it('goes back to the fit with the button or Escape, and fits from the values set', async () => {
    const { widget, onPreview, onFitFromHere, outcome } = make();
    const { range } = slider(widget.node, 'Tc');
    move(range, 800);
    await frame();
    await widget.settled;
    widget.node.querySelector<HTMLButtonElement>('.jp-psiscape-ModelSliders-fit')!.click();
    expect(onFitFromHere).toHaveBeenCalledWith({ Ms: outcome.fit.values[0], Tc: widget.values.Tc });
    expect(widget.values.Tc).not.toBe(outcome.fit.values[1]);
    widget.node.querySelector<HTMLButtonElement>('.jp-psiscape-ModelSliders-back')!.click();
    await frame();
    await widget.settled;
    expect(widget.atFit).toBe(true);
    expect(Number(range.value)).toBe(SLIDER_POSITIONS / 2);
    const last = onPreview.mock.calls.at(-1) as unknown as [Record<string, number>, { chi2: number }];
    expect(last[1].chi2).toBeCloseTo(outcome.fit.chi2, 6);
    move(range, 100);
    range.dispatchEvent(new KeyboardEvent('keydown', { key: 'Escape', bubbles: true }));
    await frame();
    await widget.settled;
    expect(widget.atFit).toBe(true);
  });

  it('hides without an outcome, and for an outcome whose model cannot be rebuilt', () => {
    const { widget, job, outcome } = make();
    widget.setOutcome(null, null);
    expect(widget.isHidden).toBe(true);
    widget.setOutcome({ ...outcome, kind: 'no-such-kind' }, job);
    expect(widget.isHidden).toBe(true);
    expect(widget.model).toBeNull();
    widget.setOutcome(outcome, job);
    expect(widget.isHidden).toBe(false);
  });
});

describe('sliders in the analysis panel', () => {
  async function fitted() {
    const { panel, session } = panelFor(parseMime('text/csv', weissCsv()));
    await panel.rendered;
    choose(panel.node.querySelector<HTMLSelectElement>('select.jp-psiscape-fit-kind')!, 'weiss');
    await panel.fitSection.runFit();
    await panel.rendered;
    await new Promise(resolve => setTimeout(resolve, 200));
    return { panel, session };
  }

  it('moves the chart’s curve and the residuals in place when a slider moves, and back', async () => {
    const { panel } = await fitted();
    const sliders = panel.node.querySelector<HTMLElement>('.jp-psiscape-ModelSliders')!;
    expect(sliders.classList.contains('lm-mod-hidden')).toBe(false);
    const view = panel.chart.view!;
    const residualView = panel.node.querySelector('.jp-psiscape-FitChecks-residuals') as HTMLElement;
    expect(residualView).not.toBeNull();
    const curveBefore = (view.data(FIT_CURVE_DATA) as { y: number }[]).map(r => r.y);
    const drawsBefore = panel.drawCount;
    const events: number[] = [];
    sliders.addEventListener(MODEL_PREVIEW_EVENT, e => events.push((e as CustomEvent).detail.chi2));
    const { range } = slider(panel.node, 'Tc');
    move(range, 900);
    await frame();
    await new Promise(resolve => setTimeout(resolve, 50));
    expect(events).toHaveLength(1);
    // Same view, new rows: no new spec was built.
    expect(panel.chart.view).toBe(view);
    expect(panel.drawCount).toBe(drawsBefore);
    const curveAfter = (view.data(FIT_CURVE_DATA) as { y: number }[]).map(r => r.y);
    expect(curveAfter).not.toEqual(curveBefore);
    const readout = panel.node.querySelector<HTMLElement>('.jp-psiscape-ModelSliders-chi2')!;
    expect(Number(readout.dataset.chi2)).toBeGreaterThan(panel.session.outcome!.fit.chi2);
    panel.node.querySelector<HTMLButtonElement>('.jp-psiscape-ModelSliders-back')!.click();
    await frame();
    await new Promise(resolve => setTimeout(resolve, 50));
    const curveBack = (view.data(FIT_CURVE_DATA) as { y: number }[]).map(r => r.y);
    curveBack.forEach((y, i) => expect(y).toBeCloseTo(curveBefore[i], 9));
  });

  it('patches the residual chart’s named dataset', async () => {
    const { panel } = await fitted();
    const checks = (panel as unknown as { _checks: { residualChart: { view: { data(name: string): { r: number }[] } | null } } })._checks;
    const rv = checks.residualChart.view!;
    const before = rv.data(RESIDUAL_DATA).map(r => r.r);
    move(slider(panel.node, 'Tc').range, 50);
    await frame();
    await new Promise(resolve => setTimeout(resolve, 50));
    const after = rv.data(RESIDUAL_DATA).map(r => r.r);
    expect(after).toHaveLength(before.length);
    expect(after).not.toEqual(before);
  });

  it('refits from the values set with "Fit from here", the start used for that fit only', async () => {
    const { panel, session } = await fitted();
    const first = session.outcome!;
    const setStart = vi.spyOn(session, 'setStart');
    const job = vi.spyOn(session, 'job');
    move(slider(panel.node, 'Tc').range, 700);
    await frame();
    panel.node.querySelector<HTMLButtonElement>('.jp-psiscape-ModelSliders-fit')!.click();
    const taken = job.mock.results.at(-1)!.value as IAnalysisJob;
    expect(taken.start?.Tc).toBeGreaterThan(first.fit.values[1]);
    expect(setStart).toHaveBeenLastCalledWith(null);
    await panel.fitSection.runFit();
    await panel.rendered;
    expect(session.outcome).not.toBe(first);
    expect(session.outcome!.fit.values[1]).toBeCloseTo(first.fit.values[1], 3);
    expect('start' in (session.job() as IAnalysisJob)).toBe(false);
  });

  it('hides the sliders in the isotherm mode and before a fit', async () => {
    const { panel } = panelFor(parseMime('text/csv', weissCsv()));
    await panel.rendered;
    const sliders = panel.node.querySelector<HTMLElement>('.jp-psiscape-ModelSliders')!;
    expect(sliders.classList.contains('lm-mod-hidden')).toBe(true);
    choose(panel.node.querySelector<HTMLSelectElement>('select.jp-psiscape-fit-kind')!, 'weiss');
    await panel.fitSection.runFit();
    await panel.rendered;
    expect(sliders.classList.contains('lm-mod-hidden')).toBe(false);
    panel.setMode('isotherms');
    await panel.rendered;
    expect(sliders.classList.contains('lm-mod-hidden')).toBe(true);
  });
});

describe('sliders in the live notebook output', () => {
  it('shows them once the output’s fit is there, and none for the chart part', async () => {
    const { outcome, saved } = runAnalysisJobForTest('M (emu/g)');
    const report = buildReport(outcome, { psiscapeVersion: '1.0.0', source: saved.source, columns: { x: { header: 'T (K)', unit: 'K' }, y: { header: 'M (emu/g)', unit: null }, sigma: null } });
    const outputs = notebookOutputs({ report, png: 'iVBORw0KGgo=', pngScale: 2, width: 400, height: 300, svg: '<svg/>', spec: {}, analysis: saved });
    const MIME = 'application/vnd.psiscape.analysis.v1+json';
    const host = new Panel();
    Widget.attach(host, document.body);
    renderInlineAnalysis(host, outputs[0].data[MIME], nullTranslator);
    expect(host.node.querySelector('.jp-psiscape-ModelSliders')).toBeNull();
    renderInlineAnalysis(host, outputs[1].data[MIME], nullTranslator);
    const deadline = Date.now() + 5000;
    let sliders: HTMLElement | null = null;
    while (Date.now() < deadline) {
      await new Promise(resolve => setTimeout(resolve, 50));
      sliders = host.node.querySelector<HTMLElement>('.jp-psiscape-ModelSliders');
      if (sliders && !sliders.classList.contains('lm-mod-hidden')) {
        break;
      }
    }
    expect(sliders).not.toBeNull();
    expect(sliders!.classList.contains('lm-mod-hidden')).toBe(false);
    expect(sliders!.querySelectorAll('input[type="range"]').length).toBeGreaterThan(0);
    host.dispose();
  });
});
