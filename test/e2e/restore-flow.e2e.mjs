// psiscape's panels come back after a page reload like the rest of JupyterLab:
// an analysis of a demo table (its state from the notebook), a file analysis
// (columns and kind from the workspace) and a Landau explorer with moved
// sliders, once each, with tab titles that say what each panel is.
import assert from 'node:assert/strict';
import { test } from 'node:test';
import { contextMenu, saveAndReload, screenshot, setWindow, useDemoLab } from './lab.mjs';

const suite = useDemoLab();

/**
 * JupyterLab rehydrates the main area's dock layout only in "multiple-document" mode, which a
 * Jupyter server's page configuration names; the demo page does not, so reloaded pages get it
 * here, as from a server.
 */
let routed = false;
async function serveInMultipleDocumentMode(page) {
  if (routed) {
    return;
  }
  routed = true;
  await page.route(
    u => u.pathname.includes('/lab'),
    async route => {
      if (route.request().resourceType() !== 'document') {
        return route.continue();
      }
      const response = await route.fetch();
      const body = (await response.text()).replace('"labFlavour":"in-browser"', '"labFlavour":"in-browser","mode":"multiple-document"');
      return route.fulfill({ response, body });
    }
  );
}

/** The main area's tab groups (labels of each tab bar, sorted), without the notebook's. */
async function tabGroups(page) {
  const groups = await page.evaluate(() =>
    [...document.querySelectorAll('#jp-main-dock-panel .lm-TabBar')].map(bar => [...bar.querySelectorAll('.lm-TabBar-tabLabel')].map(t => t.textContent ?? '').filter(l => !l.endsWith('.ipynb')).sort())
  );
  return groups.filter(g => g.length > 0).map(g => g.join(' | ')).sort();
}

/** Labels of the main area's tabs. */
async function tabLabels(page) {
  return page.locator('#jp-main-dock-panel .lm-TabBar-tab .lm-TabBar-tabLabel').allTextContents();
}

test('analyses, a file analysis and an explorer reopen once each after a reload, with their state and titles', async () => {
  const { page } = suite.lab;

  // An analysis of the demo notebook's first table, as a Weiss fit.
  const output = page.locator('.jp-Notebook .jp-OutputArea-child', { has: page.locator('table.dataframe') }).first();
  await contextMenu(page, output, 'Analyse This Table with psiscape');
  const analysis = page.locator('.jp-psiscape-AnalysisPanel').last();
  await analysis.locator('select.jp-psiscape-fit-kind').selectOption('weiss');
  // A run saves the analysis in the notebook (its state's one home).
  await analysis.locator('button.jp-psiscape-fit-run').click();
  await analysis.locator('.jp-psiscape-FitSection .jp-psiscape-fit-table').waitFor({ timeout: 60000 });
  await page.waitForFunction(() => [...document.querySelectorAll('.lm-TabBar-tabLabel')].some(t => / · cell \d+ · Weiss$/.test(t.textContent ?? '')));
  const notebookTitle = (await tabLabels(page)).find(l => / · cell \d+ · Weiss$/.test(l));
  assert.ok(notebookTitle, 'the analysis tab names its cell and kind');

  // A file analysis of am17_MT.csv from the file browser, as a critical power law.
  const item = page.locator('.jp-DirListing-item[data-file-type="csv"]', { hasText: 'am17_MT.csv' });
  await item.click();
  await contextMenu(page, item, 'Analyse with psiscape');
  const file = page.locator('.jp-psiscape-AnalysisPanel', { has: page.locator('.jp-psiscape-AnalysisPanel-source', { hasText: 'file am17_MT.csv' }) });
  await file.locator('.jp-psiscape-ChartView svg').first().waitFor({ timeout: 30000 });
  await file.locator('select.jp-psiscape-fit-kind').selectOption('power-law');
  await page.waitForFunction(() => [...document.querySelectorAll('.lm-TabBar-tabLabel')].some(t => / · am17_MT\.csv · power law$/.test(t.textContent ?? '')));
  const fileTitle = (await tabLabels(page)).find(l => / · am17_MT\.csv · power law$/.test(l));
  assert.ok(fileTitle, 'the file analysis tab names its file and kind');

  // A Landau explorer with T and h moved by keyboard.
  await page.evaluate(() => window.jupyterapp.commands.execute('psiscape:open-landau-explorer'));
  const explorer = page.locator('.jp-psiscape-LandauExplorer');
  await explorer.locator('.jp-psiscape-landau-landscape svg').waitFor({ timeout: 30000 }); // the landscape tab is shown first
  for (const [key, presses] of [['T', 4], ['h', 3]]) {
    await explorer.locator(`input.jp-psiscape-landau-range[data-key="${key}"]`).focus();
    for (let i = 0; i < presses; i++) {
      await page.keyboard.press('PageUp');
    }
  }
  const T = await explorer.locator('input.jp-psiscape-landau-range[data-key="T"]').inputValue();
  const h = await explorer.locator('input.jp-psiscape-landau-range[data-key="h"]').inputValue();
  assert.notEqual(Number(h), 0, 'h was moved');
  await screenshot(page, 'restore-before-reload');
  const before = (await tabLabels(page)).filter(l => l !== 'Launcher').sort();
  const groupsBefore = await tabGroups(page);
  // Let the trackers and the workspace write what they hold (both are debounced).
  await page.waitForTimeout(1500);

  await serveInMultipleDocumentMode(page);
  await saveAndReload(page);
  await page.waitForFunction(() => document.querySelectorAll('.jp-psiscape-AnalysisPanel').length >= 2 && document.querySelector('.jp-psiscape-LandauExplorer svg'), null, { timeout: 60000 });
  // Whatever else restores (the notebook's own saved analyses) has had its chance to duplicate a panel.
  await page.waitForTimeout(2000);
  assert.equal(await page.locator('.jp-psiscape-AnalysisPanel').count(), 2, 'each analysis once');
  assert.equal(await page.locator('.jp-psiscape-LandauExplorer').count(), 1, 'the explorer once');

  const after = (await tabLabels(page)).filter(l => l !== 'Launcher').sort();
  assert.deepEqual(after, before, 'the same tabs, with the same titles');
  assert.deepEqual(await tabGroups(page), groupsBefore, 'in the same dock places');

  const analysisAgain = page.locator('.jp-psiscape-AnalysisPanel', { has: page.locator('.jp-psiscape-AnalysisPanel-source', { hasText: 'cell' }) });
  assert.equal(await analysisAgain.locator('select.jp-psiscape-fit-kind').inputValue(), 'weiss');
  const fileAgain = page.locator('.jp-psiscape-AnalysisPanel', { has: page.locator('.jp-psiscape-AnalysisPanel-source', { hasText: 'file am17_MT.csv' }) });
  assert.equal(await fileAgain.locator('select.jp-psiscape-fit-kind').inputValue(), 'power-law');
  const explorerAgain = page.locator('.jp-psiscape-LandauExplorer');
  assert.equal(await explorerAgain.locator('input.jp-psiscape-landau-range[data-key="T"]').inputValue(), T);
  assert.equal(await explorerAgain.locator('input.jp-psiscape-landau-range[data-key="h"]').inputValue(), h);

  // A panel's tab shows the full source as its caption.
  const caption = await page.evaluate(title => {
    const tab = [...document.querySelectorAll('#jp-main-dock-panel .lm-TabBar-tab')].find(t => t.querySelector('.lm-TabBar-tabLabel')?.textContent === title);
    return tab?.getAttribute('title') ?? null;
  }, fileTitle);
  assert.equal(caption, 'file am17_MT.csv');

  // The explorer's tab, then the file analysis's, for the pictures.
  await page.locator('.lm-TabBar-tab', { hasText: 'Landau explorer' }).click();
  await screenshot(page, 'restore-after-reload');
  await page.locator('.lm-TabBar-tab', { hasText: fileTitle }).click();
  await screenshot(page, 'restore-after-reload-file');
  assert.deepEqual(suite.lab.errors, [], 'no uncaught page errors');
});

test('an explorer opened from a Landau fit keeps its scenario in the notebook and comes back once', async () => {
  const { page } = suite.lab;
  // Close the previous test's panels: the notebook alone brings this explorer back.
  await page.evaluate(() => {
    for (const w of [...window.jupyterapp.shell.widgets('main')]) {
      if (w.hasClass('jp-psiscape-LandauExplorer')) {
        w.close();
      }
    }
  });
  await page.locator('#jp-main-dock-panel .lm-TabBar-tab', { hasText: / · cell \d+ · / }).first().click();
  const panel = page.locator('.jp-psiscape-AnalysisPanel', { has: page.locator('.jp-psiscape-AnalysisPanel-source', { hasText: 'cell' }) });
  await panel.locator('.jp-psiscape-FitSection select.jp-psiscape-fit-kind').selectOption('landau');
  await setWindow(panel.locator('.jp-psiscape-FitSection'), '240', '300');
  await panel.locator('.jp-psiscape-FitSection button.jp-psiscape-fit-run').click();
  await panel.locator('button.jp-psiscape-fit-explore').waitFor({ timeout: 60000 });
  await panel.locator('button.jp-psiscape-fit-explore').click();
  const explorer = page.locator('.jp-psiscape-LandauExplorer');
  await explorer.locator('.jp-psiscape-landau-landscape svg').waitFor({ timeout: 30000 }); // the landscape tab is shown first
  await explorer.locator('select.jp-psiscape-landau-convention').selectOption('no-fractions');
  await explorer.locator('input.jp-psiscape-landau-range[data-key="h"]').focus();
  for (let i = 0; i < 2; i++) {
    await page.keyboard.press('PageUp');
  }
  const T0 = await explorer.locator('input.jp-psiscape-landau-number[data-key="T0"]').inputValue();
  const h = await explorer.locator('input.jp-psiscape-landau-range[data-key="h"]').inputValue();
  // The scenario is in the notebook's metadata, beside the analyses.
  await page.waitForFunction(
    hv => {
      const nb = window.jupyterapp.shell.currentWidget?.context ? null : [...window.jupyterapp.shell.widgets('main')].find(w => w.context?.path === 'am17-demo.ipynb');
      const meta = nb?.context.model.getMetadata('psiscape');
      return meta?.explorers?.length === 1 && Math.abs(meta.explorers[0].h - Number(hv)) < 1e-9 && meta.explorers[0].convention === 'no-fractions';
    },
    h,
    { timeout: 10000 }
  );
  await page.waitForTimeout(1000);

  await serveInMultipleDocumentMode(page);
  await saveAndReload(page);
  await page.waitForFunction(() => document.querySelector('.jp-psiscape-LandauExplorer svg'), null, { timeout: 60000 });
  await page.waitForTimeout(2000);
  assert.equal(await page.locator('.jp-psiscape-LandauExplorer').count(), 1, 'the explorer once');
  const again = page.locator('.jp-psiscape-LandauExplorer');
  assert.equal(await again.locator('select.jp-psiscape-landau-convention').inputValue(), 'no-fractions');
  assert.equal(await again.locator('input.jp-psiscape-landau-range[data-key="h"]').inputValue(), h);
  // T0 is shown in the no-fractions form too (same T0 in every convention).
  assert.equal(await again.locator('input.jp-psiscape-landau-number[data-key="T0"]').inputValue(), T0);
  // the explorer is a tab beside the analysis it came from
  await page.locator('.lm-TabBar-tab', { hasText: 'Landau explorer' }).click();
  await again.locator('.jp-psiscape-landau-landscape svg').waitFor({ timeout: 30000 }); // the landscape tab is shown first
  await screenshot(page, 'restore-explorer-from-fit');
  assert.deepEqual(suite.lab.errors, [], 'no uncaught page errors');
});
