// The landscape workbench in the lab: opened from a Landau fit of the demo
// M(T) it overlays the data on the ψ(T) branches; the phase diagram and the
// two-order-parameter landscape draw; a preset and a typed free energy work;
// the scenario survives save and reload; light, dark and 400 px pictures.
import assert from 'node:assert/strict';
import { test } from 'node:test';
import { contextMenu, darkScreenshot, drawn, saveAndReload, screenshot, setWindow, useDemoLab } from './lab.mjs';

const suite = useDemoLab();

/** The chart under the tab of `view`. */
function tabChart(explorer, view) {
  return explorer.locator(`[aria-labelledby^="jp-psiscape-landau-tab-${view}-"]`);
}

test('a Landau fit of the demo M(T) opens the workbench with the data over the ψ(T) branches', async () => {
  const { page } = suite.lab;
  const output = page.locator('.jp-Notebook .jp-OutputArea-child', { has: page.locator('table.dataframe') }).first();
  await contextMenu(page, output, 'Analyse This Table with psiscape');
  const panel = page.locator('.jp-psiscape-AnalysisPanel').last();
  await panel.locator('.jp-psiscape-FitSection select.jp-psiscape-fit-kind').selectOption('landau');
  // Landau expansions hold near the transition: the window 240–300 K.
  await setWindow(panel.locator('.jp-psiscape-FitSection'), '240', '300');
  await panel.locator('.jp-psiscape-FitSection button.jp-psiscape-fit-run').click();
  await panel.locator('.jp-psiscape-FitSection .jp-psiscape-fit-table').waitFor({ timeout: 60000 });
  await panel.locator('button.jp-psiscape-fit-explore').click();
  const explorer = page.locator('.jp-psiscape-LandauExplorer').last();
  await explorer.waitFor({ state: 'visible', timeout: 30000 });
  await explorer.locator('.jp-psiscape-landau-tab[data-view="branches"]').click();
  const branches = tabChart(explorer, 'branches');
  await drawn(branches);
  // The fitted points (the demo's rows in 240–300 K, 16 of them) are drawn as points over the branch lines.
  await page.waitForFunction(
    sel => document.querySelector(sel)?.querySelectorAll('g.mark-symbol.role-mark path').length >= 10,
    '.jp-psiscape-LandauExplorer:last-of-type [aria-labelledby^="jp-psiscape-landau-tab-branches-"] svg',
    { timeout: 30000 }
  );
  await screenshot(page, 'workbench-branches-light', { guide: 'workbench-data-overlay' });
  await darkScreenshot(page, 'workbench-branches-dark', () => drawn(branches));
});

test('the phase diagram and the two-order-parameter landscape draw', async () => {
  const { page } = suite.lab;
  const explorer = page.locator('.jp-psiscape-LandauExplorer').last();
  await explorer.locator('.jp-psiscape-landau-tab[data-view="phase-diagram"]').click();
  await drawn(tabChart(explorer, 'phase-diagram'));
  await screenshot(page, 'workbench-phase-diagram-light', { guide: 'workbench-phase-diagram' });
  await explorer.locator('.jp-psiscape-landau-tab[data-view="landscape-2d"]').click();
  await drawn(tabChart(explorer, 'landscape-2d'));
  assert.doesNotMatch((await explorer.textContent()) ?? '', /NaN/);
  await screenshot(page, 'workbench-landscape-2d-light', { guide: 'workbench-landscape-2d' });
  await darkScreenshot(page, 'workbench-landscape-2d-dark', () => drawn(tabChart(explorer, 'landscape-2d')));
});

test('a preset and a typed free energy set the landscape; a bad one is refused in words', async () => {
  const { page } = suite.lab;
  const explorer = page.locator('.jp-psiscape-LandauExplorer').last();
  await explorer.locator('select.jp-psiscape-landau-preset').selectOption('devonshire');
  await explorer.locator('.jp-psiscape-landau-tab[data-view="loop"]').click();
  await drawn(tabChart(explorer, 'loop'));
  await screenshot(page, 'workbench-loop-light');
  const typed = explorer.locator('input.jp-psiscape-landau-typed-input');
  await typed.fill('a/2*(T - T0)*ψ^2 + b/4*ψ^4 + c/6*ψ^6 - h*ψ +');
  await explorer.locator('button.jp-psiscape-landau-typed-use').click();
  await explorer.locator('.jp-psiscape-landau-typed-error').waitFor({ state: 'visible', timeout: 10000 });
  await typed.fill('a/2*(T - T0)*ψ^2 + b/4*ψ^4 + c/6*ψ^6 - h*ψ');
  await explorer.locator('button.jp-psiscape-landau-typed-use').click();
  await explorer.locator('.jp-psiscape-landau-typed-error').waitFor({ state: 'hidden', timeout: 10000 });
  await explorer.locator('.jp-psiscape-landau-tab[data-view="landscape"]').click();
  await drawn(explorer.locator('[aria-labelledby^="jp-psiscape-landau-tab-landscape-"]:not([aria-labelledby*="landscape-2d"])'));
  assert.ok((await explorer.locator('.jp-psiscape-landau-typed-coefficients input').count()) >= 4, 'a slider per coefficient of the typed free energy');
});

test('the scenario survives save and reload; the workbench holds at 400 px', async () => {
  const { page } = suite.lab;
  const explorer = page.locator('.jp-psiscape-LandauExplorer').last();
  const typedBefore = await explorer.locator('input.jp-psiscape-landau-typed-input').inputValue();
  await page.locator('.lm-TabBar-tab', { hasText: 'am17-demo.ipynb' }).first().click();
  await page.waitForTimeout(1500); // the explorer's save debounce
  await saveAndReload(page);
  const again = page.locator('.jp-psiscape-LandauExplorer').last();
  await again.waitFor({ state: 'attached', timeout: 60000 });
  await page.locator('.lm-TabBar-tab', { hasText: /Landau/ }).last().click();
  await again.waitFor({ state: 'visible', timeout: 30000 });
  await page
    .waitForFunction(text => document.querySelector('.jp-psiscape-LandauExplorer input.jp-psiscape-landau-typed-input')?.value === text, typedBefore, { timeout: 15000 })
    .catch(() => undefined);
  assert.equal(await again.locator('input.jp-psiscape-landau-typed-input').inputValue(), typedBefore, 'the typed free energy is restored');
  // 400 px wide (single-document mode, side bars collapsed, the viewport sized to it): no control narrower than its content.
  const id = await again.getAttribute('id');
  await page.evaluate(explorerId => {
    const shell = window.jupyterapp.shell;
    shell.mode = 'single-document';
    shell.collapseLeft();
    shell.collapseRight();
    shell.activateById(explorerId);
  }, id);
  for (let i = 0; i < 4; i++) {
    const box = await again.boundingBox();
    const viewport = page.viewportSize();
    if (box && Math.abs(box.width - 400) < 1) {
      break;
    }
    await page.setViewportSize({ width: Math.round(viewport.width + 400 - (box?.width ?? viewport.width)), height: 900 });
    await page.waitForTimeout(400);
  }
  assert.ok(Math.abs((await again.boundingBox()).width - 400) < 2, 'the workbench is 400 px wide');
  const narrow = await again.evaluate(node =>
    [...node.querySelectorAll('select, input:not([type="range"]), button')]
      .filter(e => e.offsetParent !== null)
      .filter(e => e.scrollWidth > e.clientWidth + 1)
      .map(e => `${e.tagName.toLowerCase()}.${e.className} (${e.scrollWidth} > ${e.clientWidth}, "${e.value ?? ''}")`)
  );
  assert.deepEqual(narrow, [], 'controls narrower than their content at 400 px');
  await screenshot(page, 'workbench-400px');
  await page.evaluate(() => {
    window.jupyterapp.shell.mode = 'multiple-document';
  });
  await page.setViewportSize({ width: 1400, height: 900 });
});
