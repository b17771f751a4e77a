// The Landau free-energy explorer in the lab: opened from the View menu,
// the first-order example's T1 and T** shown (REFERENCE.md C5: a = 0.5,
// b = −2, c = 4, T0 = 100 give T1 = 100.375, T** = 100.5), the landscape
// redrawn as T moves by keyboard, in light and dark themes.
import assert from 'node:assert/strict';
import { after, before, test } from 'node:test';
import { openLab, screenshot, startServer } from './lab.mjs';

let server;
let lab;

before(async () => {
  const started = await startServer();
  server = started.server;
  lab = await openLab(started.url);
});

after(async () => {
  await lab?.browser.close();
  await new Promise(resolve => server?.close(resolve));
});

test('the explorer opens from the View menu with the first-order example', async () => {
  const { page } = lab;
  await page.locator('.lm-MenuBar-itemLabel', { hasText: 'View' }).click();
  await page.locator('.lm-Menu-item', { hasText: 'Open Landau Free-Energy Explorer' }).click();
  const explorer = page.locator('.jp-psiscape-LandauExplorer');
  await explorer.waitFor({ state: 'visible', timeout: 30000 });
  await explorer.locator('svg').nth(1).waitFor({ timeout: 30000 });
  const text = await explorer.textContent();
  assert.match(text, /100\.375/, 'T1 of the C5 example');
  assert.match(text, /100\.5/, 'T** of the C5 example');
  await screenshot(page, 'landau-light');
});

test('moving T with the keyboard redraws the landscape', async () => {
  const { page } = lab;
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
  const { page } = lab;
  await page.evaluate(() => window.jupyterapp.commands.execute('apputils:change-theme', { theme: 'JupyterLab Dark' }));
  await page.waitForFunction(() => document.body.dataset.jpThemeLight === 'false');
  await page.waitForTimeout(500);
  const bg = await page.evaluate(() => document.querySelector('.jp-psiscape-LandauExplorer svg')?.style.backgroundColor);
  assert.notEqual(bg, 'rgb(255, 255, 255)');
  await screenshot(page, 'landau-dark');
  assert.deepEqual(lab.errors, []);
});
