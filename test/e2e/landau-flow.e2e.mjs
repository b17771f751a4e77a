// The Landau free-energy explorer in the lab: opened from the View menu,
// the first-order example's T1 and T** shown (REFERENCE.md C5: a = 0.5,
// b = −2, c = 4, T0 = 100 give T1 = 100.375, T** = 100.5), the landscape
// redrawn as T moves by keyboard, in light and dark themes.
import assert from 'node:assert/strict';
import { test } from 'node:test';
import { screenshot, setWindow, useDemoLab } from './lab.mjs';

const suite = useDemoLab();

test('the explorer opens from the View menu with the first-order example', async () => {
  const { page } = suite.lab;
  await page.locator('.lm-MenuBar-itemLabel', { hasText: 'View' }).click();
  await page.locator('.lm-Menu-item', { hasText: 'Open Landau Free-Energy Explorer' }).click();
  const explorer = page.locator('.jp-psiscape-LandauExplorer');
  await explorer.waitFor({ state: 'visible', timeout: 30000 });
  await explorer.locator('.jp-psiscape-landau-landscape svg').waitFor({ timeout: 30000 }); // the landscape tab is shown first
  const text = await explorer.textContent();
  assert.match(text, /100\.375/, 'T1 of the C5 example');
  assert.match(text, /100\.5/, 'T** of the C5 example');
  await screenshot(page, 'landau-light', { guide: 'landau-explorer' });
});

test('moving T with the keyboard redraws the landscape', async () => {
  const { page } = suite.lab;
  const explorer = page.locator('.jp-psiscape-LandauExplorer');
  const range = explorer.locator('input.jp-psiscape-landau-range[data-key="T"]');
  const before = await range.inputValue();
  const svgBefore = await explorer.locator('svg').first().innerHTML();
  await range.focus();
  for (let i = 0; i < 5; i++) {
    await page.keyboard.press('PageUp');
  }
  await page.waitForFunction(
    ([sel, old]) => document.querySelector(sel)?.innerHTML !== old,
    ['.jp-psiscape-LandauExplorer svg', svgBefore],
    { timeout: 10000 }
  );
  assert.notEqual(await range.inputValue(), before);
});

test('the explorer follows the dark theme', async () => {
  const { page } = suite.lab;
  await page.evaluate(() => window.jupyterapp.commands.execute('apputils:change-theme', { theme: 'JupyterLab Dark' }));
  await page.waitForFunction(() => document.body.dataset.jpThemeLight === 'false');
  await page.waitForTimeout(500);
  const bg = await page.evaluate(() => document.querySelector('.jp-psiscape-LandauExplorer svg')?.style.backgroundColor);
  assert.notEqual(bg, 'rgb(255, 255, 255)');
  await screenshot(page, 'landau-dark');
  assert.deepEqual(suite.lab.errors, []);
});

test('Landau coefficients fitted to the demo M(T) open in the explorer', async () => {
  const { page } = suite.lab;
  await page.evaluate(() => window.jupyterapp.commands.execute('apputils:change-theme', { theme: 'JupyterLab Light' }));
  await page.locator('.lm-TabBar-tab', { hasText: 'am17-demo.ipynb' }).first().click();
  const output = page.locator('.jp-Notebook .jp-OutputArea-child', { has: page.locator('table.dataframe') }).first();
  await output.scrollIntoViewIfNeeded();
  await output.click({ button: 'right' });
  await page.locator('.lm-Menu-item', { hasText: 'Analyse This Table with psiscape' }).first().click();
  const panel = page.locator('.jp-psiscape-AnalysisPanel').last();
  await panel.locator('.jp-psiscape-FitSection select.jp-psiscape-fit-kind').selectOption('landau');
  // Landau expansions hold near the transition: fit the window 240–300 K.
  await setWindow(panel.locator('.jp-psiscape-FitSection'), '240', '300');
  await panel.locator('.jp-psiscape-FitSection button.jp-psiscape-fit-run').click();
  await panel.locator('.jp-psiscape-FitSection .jp-psiscape-fit-table').waitFor({ timeout: 60000 });
  const t0 = await panel.locator('.jp-psiscape-FitSection tbody tr', { hasText: /^T0/ }).locator('td').nth(1).textContent();
  const value = Number(/^([\d.]+)/.exec(t0)?.[1]);
  // The demo M(T) is a spin-½ mean-field curve with Tc = 287.4 K: its Landau T0 lies near Tc.
  assert.ok(Math.abs(value - 287.4) < 3, `T0 reads "${t0}"`);
  const before = await page.locator('.jp-psiscape-LandauExplorer').count();
  await panel.locator('button.jp-psiscape-fit-explore').click();
  await page.waitForFunction(n => document.querySelectorAll('.jp-psiscape-LandauExplorer').length > n, before);
  const explorer = page.locator('.jp-psiscape-LandauExplorer').last();
  const t0Field = explorer.locator('input.jp-psiscape-landau-number[data-key="T0"]');
  assert.ok(Math.abs(Number(await t0Field.inputValue()) - value) < 0.01, 'the explorer starts from the fitted T0');
  await screenshot(page, 'landau-from-fit');
});
