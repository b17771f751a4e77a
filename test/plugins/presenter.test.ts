/**
 * Settings reaching open panels at once, and the presenter view, in a real
 * JupyterLab application: the command makes the panel fill the main area
 * (single-document mode) and scales its charts by `presenterScale`; a change
 * of the setting redraws the panel presented; JupyterLab's Presentation Mode
 * starts and ends it too.
 */
import { afterEach, describe, expect, it } from 'vitest';
import type { LabShell } from '@jupyterlab/application';
import plugins, { PLUGIN_ID } from '../../src/plugins';
import { AnalysisPanel } from '../../src/ui/analysis-panel';
import { CHART_SCALE_VARIABLE, readChartTheme } from '../../src/ui/chart-theme';
import { PRESENTING_CLASS } from '../../src/ui/chart-view';
import { disposeLabs, labWith, openInLab, readNotebook } from './harness';

const PRESENT = 'psiscape:present-analysis';

async function labWithPanel() {
  const lab = await labWith(plugins, PLUGIN_ID);
  const notebook = await openInLab(lab, 'fixtures/outputs.ipynb', readNotebook('test/fixtures/outputs.ipynb'));
  notebook.content.activeCellIndex = 1;
  await lab.app.commands.execute('psiscape:analyse-selected-cell');
  const panel = Array.from(lab.app.shell.widgets('main')).find((w): w is AnalysisPanel => w instanceof AnalysisPanel)!;
  expect(panel).toBeDefined();
  await panel.rendered;
  const settings = await lab.registry.load(PLUGIN_ID);
  return { lab, panel, settings, shell: lab.app.shell as LabShell };
}

/** Let signals, timers and mutation observers run. */
async function settle(): Promise<void> {
  for (let i = 0; i < 3; i++) {
    await new Promise(resolve => setTimeout(resolve, 20));
  }
}

describe('settings in open panels', () => {
  afterEach(async () => {
    await disposeLabs();
  });

  it('should redraw an open panel with the new point size as soon as the setting changes', async () => {
    const { panel, settings } = await labWithPanel();
    expect(panel.pointSize).toBe(40);
    const before = panel.drawCount;
    await settings.set('pointSize', 90);
    await settle();
    await panel.rendered;
    expect(panel.pointSize).toBe(90);
    expect(panel.drawCount).toBeGreaterThan(before);
    const layers = (panel.chart.spec as unknown as { layer: { mark?: { type?: string; size?: number } }[] }).layer;
    expect(layers.some(l => l.mark?.type === 'point' && l.mark.size === 90)).toBe(true);
  });
});

describe('presenter view', () => {
  afterEach(async () => {
    await disposeLabs();
  });

  it('should fill the main area with the panel, scale its charts by presenterScale, follow a change of it, and end on a second run', async () => {
    const { lab, panel, settings, shell } = await labWithPanel();
    lab.app.shell.activateById(panel.id);
    expect(lab.app.commands.label(PRESENT)).toBe('Present Analysis');
    expect(lab.app.commands.isEnabled(PRESENT)).toBe(true);
    expect(lab.app.commands.isToggled(PRESENT)).toBe(false);
    expect(shell.mode).toBe('multiple-document');

    await lab.app.commands.execute(PRESENT);
    expect(shell.mode).toBe('single-document');
    expect(panel.isVisible).toBe(true);
    expect(panel.hasClass(PRESENTING_CLASS)).toBe(true);
    expect(panel.node.style.getPropertyValue(CHART_SCALE_VARIABLE)).toBe('1.6');
    expect(readChartTheme(panel.node).scale).toBe(1.6);
    expect(lab.app.commands.isToggled(PRESENT)).toBe(true);

    const before = panel.drawCount;
    await settings.set('presenterScale', 2.5);
    await settle();
    expect(panel.node.style.getPropertyValue(CHART_SCALE_VARIABLE)).toBe('2.5');
    expect(readChartTheme(panel.node).scale).toBe(2.5);
    await panel.rendered;
    expect(panel.drawCount).toBeGreaterThan(before);
    // The main chart is drawn with the scaled theme: axis labels 2.5 × 12 px.
    const config = (panel.chart.spec as unknown as { config: { axis: { labelFontSize: number } } }).config;
    expect(config.axis.labelFontSize).toBe(30);

    await lab.app.commands.execute(PRESENT);
    expect(shell.mode).toBe('multiple-document');
    expect(panel.hasClass(PRESENTING_CLASS)).toBe(false);
    expect(panel.node.style.getPropertyValue(CHART_SCALE_VARIABLE)).toBe('');
    expect(readChartTheme(panel.node).scale).toBeUndefined();
    expect(lab.app.commands.isToggled(PRESENT)).toBe(false);
  });

  it("should start and end with JupyterLab's Presentation Mode, and end when the user leaves single-document mode", async () => {
    const { panel, shell } = await labWithPanel();
    shell.activateById(panel.id);
    shell.presentationMode = true;
    await settle();
    expect(panel.hasClass(PRESENTING_CLASS)).toBe(true);
    expect(shell.mode).toBe('single-document');
    shell.presentationMode = false;
    await settle();
    expect(panel.hasClass(PRESENTING_CLASS)).toBe(false);
    expect(shell.mode).toBe('multiple-document');

    shell.presentationMode = true;
    await settle();
    expect(panel.hasClass(PRESENTING_CLASS)).toBe(true);
    shell.mode = 'multiple-document';
    await settle();
    expect(panel.hasClass(PRESENTING_CLASS)).toBe(false);
    shell.presentationMode = false;
  });

  it('should end when the panel presented is closed', async () => {
    const { lab, panel, shell } = await labWithPanel();
    shell.activateById(panel.id);
    await lab.app.commands.execute(PRESENT);
    expect(shell.mode).toBe('single-document');
    panel.close();
    panel.dispose();
    await settle();
    expect(shell.mode).toBe('multiple-document');
    expect(lab.app.commands.isToggled(PRESENT)).toBe(false);
  });
});
