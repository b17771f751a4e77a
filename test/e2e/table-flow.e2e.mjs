// The first user flow: a table output → context menu → analysis panel with a
// chart → "Show source cell" selects the cell. Also the palette command, the
// no-table message, and the dark theme.
import assert from 'node:assert/strict';
import { test } from 'node:test';
import { contextMenu, screenshot, useDemoLab } from './lab.mjs';

const MENU_LABEL = 'Analyse This Table with psiscape';
const suite = useDemoLab();

test('context menu on a pandas table opens a panel with a drawn chart', async () => {
  const { page } = suite.lab;
  const output = page.locator('.jp-Notebook .jp-OutputArea-child', { has: page.locator('table.dataframe') }).first();
  await contextMenu(page, output, MENU_LABEL);
  const panel = page.locator('.jp-psiscape-AnalysisPanel').last();
  await panel.waitFor({ state: 'visible', timeout: 20000 });
  await panel.locator('.jp-psiscape-ChartView svg g.mark-symbol.role-mark path').first().waitFor({ timeout: 30000 });
  const marks = await panel.locator('.jp-psiscape-ChartView svg g.mark-symbol.role-mark path').count();
  assert.equal(marks, 81, 'one mark per row of the 81-row M(T) table');
  const source = await panel.locator('.jp-psiscape-AnalysisPanel-source').textContent();
  assert.match(source, /am17-demo\.ipynb · cell 3 · output 1/);
  assert.equal(await panel.locator('select.jp-psiscape-x option:checked').textContent(), 'T (K)');
  assert.equal(await panel.locator('select.jp-psiscape-y option:checked').textContent(), 'M (emu/g)');
  const box = await panel.boundingBox();
  const nb = await page.locator('.jp-NotebookPanel').first().boundingBox();
  assert.ok(box.x > nb.x, 'the panel is docked to the right of the notebook');
  await screenshot(page, 'table-flow-light', { guide: 'analyse-a-table' });
});

test('changing the y column redraws the chart', async () => {
  const { page } = suite.lab;
  const panel = page.locator('.jp-psiscape-AnalysisPanel').last();
  await panel.locator('select.jp-psiscape-y').selectOption({ label: 'sigma_M (emu/g)' });
  await page.waitForFunction(() => {
    const title = document.querySelector('.jp-psiscape-AnalysisPanel:last-of-type .jp-psiscape-ChartView svg');
    return title && title.textContent.includes('sigma_M');
  });
});

test('"Show source cell" selects and scrolls to the source cell', async () => {
  const { page } = suite.lab;
  // Move the selection elsewhere first.
  await page.locator('.jp-Notebook .jp-Cell').first().click();
  const before = await page.evaluate(() => window.jupyterapp.shell.currentWidget?.content?.activeCellIndex ?? null);
  assert.notEqual(before, 2);
  const panel = page.locator('.jp-psiscape-AnalysisPanel').last();
  await panel.locator('button.jp-psiscape-reveal').click();
  await page.waitForFunction(() => {
    const nb = window.jupyterapp.shell.currentWidget;
    return nb && nb.content && nb.content.activeCellIndex === 2;
  });
  const active = page.locator('.jp-Notebook .jp-Cell.jp-mod-active');
  assert.equal(await active.locator('table.dataframe').count(), 1, 'the active cell is the one holding the table');
  assert.ok(await active.isVisible());
});

test('an output without a table gives a message, not a blank panel', async () => {
  const { page } = suite.lab;
  const printed = page.locator('.jp-Notebook .jp-OutputArea-child', { hasText: 'Sample AM-17' }).first();
  await contextMenu(page, printed, MENU_LABEL);
  const panel = page.locator('.jp-psiscape-AnalysisPanel').last();
  const message = panel.locator('.jp-psiscape-AnalysisPanel-message');
  await message.waitFor({ state: 'visible', timeout: 10000 });
  assert.match(await message.textContent(), /no table/i);
  assert.equal(await panel.locator('.jp-psiscape-ChartView svg').count(), 0);
});

test('palette command analyses the selected cell (dataresource output)', async () => {
  const { page } = suite.lab;
  // Select the cell with the dataresource table (5th cell) and run the command from the palette.
  await page.locator('.jp-Notebook .jp-Cell').nth(4).locator('.jp-InputPrompt').click();
  await page.keyboard.press('Control+Shift+C');
  const input = page.locator('.lm-CommandPalette-input').first();
  await input.waitFor({ state: 'visible' });
  await input.fill('Analyse Table in Selected Cell');
  await page.keyboard.press('Enter');
  const panel = page.locator('.jp-psiscape-AnalysisPanel').last();
  await panel.locator('.jp-psiscape-ChartView svg g.mark-symbol.role-mark path').first().waitFor({ timeout: 30000 });
  assert.equal(await panel.locator('.jp-psiscape-ChartView svg g.mark-symbol.role-mark path').count(), 41);
  assert.match(await panel.locator('.jp-psiscape-AnalysisPanel-source').textContent(), /cell 5/);
});

test('dark theme: the chart follows the theme colours', async () => {
  const { page } = suite.lab;
  await page.evaluate(() => window.jupyterapp.commands.execute('apputils:change-theme', { theme: 'JupyterLab Dark' }));
  await page.waitForFunction(() => document.body.dataset.jpThemeLight === 'false');
  const panelTab = page.locator('.lm-TabBar-tab', { hasText: 'Analysis' }).first();
  await panelTab.click();
  await page.waitForTimeout(500);
  const { bg, themeBg } = await page.evaluate(() => {
    const svg = document.querySelector('.jp-psiscape-AnalysisPanel .jp-psiscape-ChartView svg');
    const probe = document.createElement('div');
    probe.style.backgroundColor = getComputedStyle(document.body).getPropertyValue('--jp-layout-color0').trim();
    document.body.appendChild(probe);
    const themeBg = getComputedStyle(probe).backgroundColor;
    probe.remove();
    return { bg: svg ? svg.style.backgroundColor : null, themeBg };
  });
  assert.equal(bg, themeBg, 'chart background is the dark theme layout colour');
  assert.notEqual(bg, 'rgb(255, 255, 255)');
  await screenshot(page, 'table-flow-dark');
  assert.deepEqual(suite.lab.errors, [], 'no uncaught page errors');
});

test('a CSV file in the file browser opens at full precision', async () => {
  const { page } = suite.lab;
  await page.evaluate(() => window.jupyterapp.commands.execute('apputils:change-theme', { theme: 'JupyterLab Light' }));
  const item = page.locator('.jp-DirListing-item[data-file-type="csv"]', { hasText: 'am17_MT.csv' });
  await item.click();
  await contextMenu(page, item, 'Analyse with psiscape');
  const panel = page.locator('.jp-psiscape-AnalysisPanel').last();
  await panel.locator('.jp-psiscape-ChartView svg g.mark-symbol.role-mark path').first().waitFor({ timeout: 30000 });
  assert.equal(await panel.locator('.jp-psiscape-ChartView svg g.mark-symbol.role-mark path').count(), 81);
  assert.equal(await panel.locator('.jp-psiscape-AnalysisPanel-source').textContent(), 'file am17_MT.csv');
  assert.equal(await panel.locator('button.jp-psiscape-reveal').count(), 0, 'a file has no source cell to show');
  assert.equal(await panel.locator('.jp-psiscape-note-rounded').count(), 0, 'the CSV holds full precision');
});
