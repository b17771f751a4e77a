// Saved analyses survive a reload: the analysis (columns and fit) is written
// to the notebook, the notebook is saved to the browser's storage, and after
// a reload the analysis reopens by itself with its fit.
import assert from 'node:assert/strict';
import { test } from 'node:test';
import { contextMenu, saveAndReload, screenshot, useDemoLab } from './lab.mjs';

const suite = useDemoLab();

test('an analysis saved with the notebook reopens, with its fit, after a reload', async () => {
  const { page } = suite.lab;
  const output = page.locator('.jp-Notebook .jp-OutputArea-child', { has: page.locator('table.dataframe') }).first();
  await contextMenu(page, output, 'Analyse This Table with psiscape');
  const panel = page.locator('.jp-psiscape-AnalysisPanel').last();
  await panel.locator('select.jp-psiscape-fit-kind').selectOption('weiss');
  await panel.locator('button.jp-psiscape-fit-run').click();
  await panel.locator('.jp-psiscape-FitSection .jp-psiscape-fit-table').waitFor({ timeout: 60000 });
  const before = await panel.locator('.jp-psiscape-FitSection .jp-psiscape-fit-table tbody tr', { hasText: /^Tc/ }).locator('td').nth(1).textContent();

  // Save the notebook (to the browser's storage) and reload the page.
  await saveAndReload(page);
  const restored = page.locator('.jp-psiscape-AnalysisPanel').last();
  await restored.locator('.jp-psiscape-FitSection .jp-psiscape-fit-table').waitFor({ timeout: 60000 });
  const after = await restored.locator('.jp-psiscape-FitSection .jp-psiscape-fit-table tbody tr', { hasText: /^Tc/ }).locator('td').nth(1).textContent();
  assert.equal(after, before, 'the reopened analysis reruns the same fit');
  assert.equal(await restored.getAttribute('data-source-state'), 'live');
  assert.equal(await restored.locator('select.jp-psiscape-fit-kind').inputValue(), 'weiss');
  await screenshot(page, 'saved-after-reload', { guide: 'saved-analysis-reopened' });
});
