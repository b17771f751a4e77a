// Temperature sweeps in the browser, on the demo's M(T) table: the brush on
// the chart sets the fit window (and the keyboard moves it), the checks under
// a fit (residuals, correlations), the model comparison run in the worker,
// the reduced plot with the exact 2D Ising curve, and the window scan of a
// power law; light and dark screenshots.
import assert from 'node:assert/strict';
import { test } from 'node:test';
import { contextMenu, darkScreenshot, drawn, screenshot, useDemoLab } from './lab.mjs';

const suite = useDemoLab(async ({ page }) => {
  const output = page.locator('.jp-Notebook .jp-OutputArea-child', { has: page.locator('table.dataframe') }).first();
  await contextMenu(page, output, 'Analyse This Table with psiscape');
  await page.locator('.jp-psiscape-AnalysisPanel .jp-psiscape-ChartView svg').first().waitFor({ timeout: 30000 });
});

test('dragging across the chart sets the fit window, and the arrow keys move it', async () => {
  const { page } = suite.lab;
  const panel = page.locator('.jp-psiscape-AnalysisPanel').last();
  const chart = panel.locator('.jp-psiscape-ChartView').first();
  const plot = chart.locator('svg g.mark-symbol.role-mark').first();
  await plot.waitFor({ timeout: 30000 });
  const box = await chart.locator('svg').boundingBox();
  const min = panel.locator('input.jp-psiscape-fit-min');
  const max = panel.locator('input.jp-psiscape-fit-max');
  assert.equal(await min.inputValue(), '');
  // Drag over the middle of the plot (the plot area starts about 60 px in from the left edge).
  const y = box.y + box.height * 0.5;
  await page.mouse.move(box.x + box.width * 0.45, y);
  await page.mouse.down();
  await page.mouse.move(box.x + box.width * 0.6, y, { steps: 8 });
  await page.mouse.move(box.x + box.width * 0.75, y, { steps: 8 });
  await page.mouse.up();
  await page.waitForFunction(() => document.querySelector('input.jp-psiscape-fit-min')?.value !== '', null, { timeout: 10000 });
  const from = Number(await min.inputValue());
  const to = Number(await max.inputValue());
  // The demo's T runs from 20 K to 340 K (demo/generate_notebooks.py).
  assert.ok(from > 20 && to < 340 && from < to, `brushed window ${from} … ${to}`);
  await screenshot(page, 'temperature-brush-light', { guide: 'fit-window-brush' });
  // With the chart focused, → moves the whole window by 2 % of the range (6.4 K).
  await chart.focus();
  await page.keyboard.press('ArrowRight');
  await page.waitForFunction(f => Number(document.querySelector('input.jp-psiscape-fit-min')?.value) > f, from, { timeout: 10000 });
  assert.ok(Math.abs(Number(await min.inputValue()) - (from + 6.4)) < 0.01, `moved to ${await min.inputValue()}`);
  await page.keyboard.press('Escape');
  await page.waitForFunction(() => document.querySelector('input.jp-psiscape-fit-min')?.value === '', null, { timeout: 10000 });
});

test('under a Weiss fit: residuals, correlations and the reduced plot with the exact 2D Ising curve', async () => {
  const { page } = suite.lab;
  const panel = page.locator('.jp-psiscape-AnalysisPanel').last();
  await panel.locator('.jp-psiscape-FitSection select.jp-psiscape-fit-kind').selectOption('weiss');
  await panel.locator('.jp-psiscape-FitSection button.jp-psiscape-fit-run').click();
  await panel.locator('.jp-psiscape-FitSection .jp-psiscape-fit-table').waitFor({ timeout: 60000 });
  await drawn(panel.locator('.jp-psiscape-FitChecks-residuals'));
  await drawn(panel.locator('.jp-psiscape-FitChecks-correlation'));
  const reduced = panel.locator('.jp-psiscape-ReducedPlotView');
  await reduced.waitFor({ state: 'visible', timeout: 30000 });
  const ising = reduced.locator('input[data-curve="ising-2d"]');
  assert.equal(await ising.isChecked(), true, 'the 2D Ising curve is shown');
  await drawn(reduced.locator('.jp-psiscape-reduced-chart'));
  const legend = (await reduced.locator('.jp-psiscape-reduced-chart svg g.role-legend').allTextContents()).join(' ');
  assert.match(legend, /2D Ising/);
  assert.ok((await reduced.locator('.jp-psiscape-reduced-chart svg g.mark-line path').count()) >= 2, 'reference curves drawn as lines');
  await reduced.scrollIntoViewIfNeeded();
  await screenshot(page, 'temperature-reduced-light', { guide: 'reduced-plot' });
  await darkScreenshot(page, 'temperature-reduced-dark', () => drawn(reduced.locator('.jp-psiscape-reduced-chart')));
});

test('the model comparison lists at least four kinds for the demo M(T), best first', async () => {
  const { page } = suite.lab;
  const panel = page.locator('.jp-psiscape-AnalysisPanel').last();
  const view = panel.locator('.jp-psiscape-ComparisonView');
  await view.locator('button.jp-psiscape-compare-run').click();
  const rows = view.locator('.jp-psiscape-compare-table tbody tr');
  await rows.first().waitFor({ timeout: 120000 });
  const fitted = view.locator('.jp-psiscape-compare-table tbody tr:not(.jp-psiscape-compare-failed)');
  assert.ok((await fitted.count()) >= 4, `${await fitted.count()} models fitted`);
  const names = (await rows.allTextContents()).join(' | ');
  assert.match(names, /Weiss/);
  assert.match(names, /power law/i);
  assert.doesNotMatch((await view.textContent()) ?? '', /NaN/);
  await view.scrollIntoViewIfNeeded();
  await screenshot(page, 'temperature-compare-light', { guide: 'model-comparison' });
  await darkScreenshot(page, 'temperature-compare-dark', () => rows.first().waitFor({ timeout: 30000 }));
});

test('a power law: the window scan draws β against t_max with the classes marked', async () => {
  const { page } = suite.lab;
  const panel = page.locator('.jp-psiscape-AnalysisPanel').last();
  await panel.locator('.jp-psiscape-FitSection select.jp-psiscape-fit-kind').selectOption('power-law');
  const view = panel.locator('.jp-psiscape-WindowScanView');
  await view.waitFor({ state: 'visible', timeout: 10000 });
  await view.locator('button.jp-psiscape-scan-run').click();
  await drawn(view.locator('.jp-psiscape-scan-chart'));
  assert.doesNotMatch((await view.textContent()) ?? '', /NaN/);
  await view.scrollIntoViewIfNeeded();
  await screenshot(page, 'temperature-scan-light', { guide: 'window-scan' });
});
