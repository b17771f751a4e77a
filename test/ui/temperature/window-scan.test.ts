/**
 * The window-scan view (real Lumino widget in jsdom, the task run on the
 * main thread) on a critical power law with β = 0.3689 (3D Heisenberg):
 * shown only for the power-law kinds; the scan draws its chart, suggests a
 * t_max with its reason, and "Use this window" sets the session's window to
 * (1 − t_max)·Tc … Tc; Cancel keeps what was shown; failures in words.
 */
import { Widget } from '@lumino/widgets';
import { afterEach, describe, expect, it } from 'vitest';
import { WindowScanView, windowOfCell } from '../../../src/ui/temperature';
import { alertText, mainThreadRunner, POWER, powerLawCsv, sessionFor, statusText, theme, trans } from './helpers';

function open(kind = 'power-law') {
  const session = sessionFor(powerLawCsv(), kind);
  const view = new WindowScanView({ trans, session, runner: mainThreadRunner(), theme });
  Widget.attach(view, document.body);
  return { session, view };
}

const runButton = (view: WindowScanView) => view.node.querySelector<HTMLButtonElement>('button.jp-psiscape-scan-run')!;
const cancelButton = (view: WindowScanView) => view.node.querySelector<HTMLButtonElement>('button.jp-psiscape-scan-cancel')!;

describe('WindowScanView', () => {
  afterEach(() => {
    document.body.innerHTML = '';
  });

  it('should be shown for the power-law kinds only', () => {
    const { session, view } = open();
    expect(view.isHidden).toBe(false);
    session.setKind('power-law-corrected');
    expect(view.isHidden).toBe(false);
    session.setKind('weiss');
    expect(view.isHidden).toBe(true);
    session.setKind('power-law');
    expect(view.isHidden).toBe(false);
  });

  it('should draw β against t_max, suggest a window and set it with "Use this window"', async () => {
    const { session, view } = open();
    runButton(view).click();
    await view.settled;
    expect(alertText(view.node)).toBeNull();
    const r = view.result!;
    expect(r.cells.length).toBeGreaterThan(3);
    expect(view.chart.spec).not.toBeNull();
    expect(JSON.stringify(view.chart.spec)).not.toMatch(/NaN/);
    expect(view.chart.node.querySelector('svg, canvas')).not.toBeNull();
    // The data follow one power law with β = 0.3689 everywhere (no correction term): every window's β
    // lies within 0.02 of it (a tolerance of common practice for these generated data).
    for (const c of r.cells.filter(c => c.converged)) {
      expect(Math.abs(c.beta.value - POWER.beta), `t_max ${c.tMax}`).toBeLessThan(0.02);
    }
    expect(r.suggested.tMax).not.toBeNull();
    const suggested = view.node.querySelector('.jp-psiscape-scan-suggested')!.textContent!;
    expect(suggested).toMatch(/^Suggested window: t_max = /);
    const cell = r.cells.find(c => c.tMax === r.suggested.tMax)!;
    view.node.querySelector<HTMLButtonElement>('button.jp-psiscape-scan-use')!.click();
    // Data below Tc: the window of t = (Tc − T)/Tc ≤ t_max is (1 − t_max)·Tc ≤ T ≤ Tc, with the cell's own Tc.
    expect(session.windowInput.min).toBeCloseTo((1 - cell.tMax) * cell.Tc.value, 9);
    expect(session.windowInput.max).toBeCloseTo(cell.Tc.value, 9);
    expect(view.node.querySelector('.jp-psiscape-scan-used')!.textContent).toMatch(/fit window is now/);
    // Every window's numbers are in a table as well as the chart.
    expect(view.node.querySelectorAll('.jp-psiscape-scan-table tbody tr').length).toBe(r.cells.length);
    expect(view.node.querySelector('.jp-psiscape-scan-classes')!.textContent).toMatch(/Campostrini/);
  });

  it('should compute the window of a cell from its own Tc', () => {
    // (1 − 0.1)·300 = 270 … 300.
    expect(windowOfCell({ tMax: 0.1, Tc: { value: 300, sigma: 1 } })).toEqual({ min: 270, max: 300 });
    expect(windowOfCell({ tMax: 0.1, Tc: { value: Number.NaN, sigma: 1 } })).toBeNull();
  });

  it('should keep the chart shown when a new scan is cancelled', async () => {
    const { view } = open();
    await view.run();
    const before = view.result;
    const spec = view.chart.spec;
    runButton(view).click();
    cancelButton(view).click();
    await view.settled;
    expect(statusText(view.node)).toMatch(/^Stopped by you/);
    expect(view.result).toBe(before);
    expect(view.chart.spec).toBe(spec);
  });

  it('should say in words why it cannot run', async () => {
    const { session, view } = open();
    // 4 points (T = 200 … 203.75 K): the scan needs at least 6.
    session.setWindow(200, 204);
    await view.run();
    expect(alertText(view.node)).toMatch(/^The window scan could not run: The window scan needs at least 6 points/);
    expect(view.result).toBeNull();
  });
});
