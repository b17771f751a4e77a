// The landscape workbench in the lab: opened from a Landau fit of the demo
// M(T) it overlays the data on the ψ(T) branches, beside the landscape; the
// phase diagram and the two-order-parameter landscape draw, the latter taking
// slider moves in place; a preset and a typed free energy work; the scenario
// (with the data) survives save and reload; the presenter view takes an
// explorer too; light, dark, presenter and 400 px pictures.
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
  // The first tab holds the landscape and the branches side by side.
  const branches = explorer.locator('.jp-psiscape-landau-branches');
  await drawn(branches);
  await drawn(explorer.locator('.jp-psiscape-landau-landscape'));
  // The fitted points (the demo's rows in 240–300 K, 16 of them) are drawn as points over the branch lines.
  await page.waitForFunction(
    sel => document.querySelector(sel)?.querySelectorAll('g.mark-symbol.role-mark path').length >= 10,
    '.jp-psiscape-LandauExplorer:last-of-type .jp-psiscape-landau-branches svg',
    { timeout: 30000 }
  );
  await branches.scrollIntoViewIfNeeded();
  await screenshot(page, 'workbench-branches-light', { guide: 'workbench-data-overlay' });
  await darkScreenshot(page, 'workbench-branches-dark', () => drawn(branches));
});

test('the phase diagram and the two-order-parameter landscape draw', async () => {
  const { page } = suite.lab;
  const explorer = page.locator('.jp-psiscape-LandauExplorer').last();
  await explorer.locator('.jp-psiscape-landau-tab[data-view="phase-diagram"]').click();
  await drawn(tabChart(explorer, 'phase-diagram'));
  await explorer.locator('.jp-psiscape-landau-phase-diagram').scrollIntoViewIfNeeded();
  await screenshot(page, 'workbench-phase-diagram-light', { guide: 'workbench-phase-diagram' });
  await explorer.locator('.jp-psiscape-landau-tab[data-view="landscape-2d"]').click();
  await drawn(tabChart(explorer, 'landscape-2d'));
  assert.doesNotMatch((await explorer.textContent()) ?? '', /NaN/);
  // A T move redraws the 2-D landscape in place: the same canvas takes the new grid, the note and the label follow.
  const grid = explorer.locator('.jp-psiscape-landau-landscape-2d');
  await grid.evaluate(node => {
    window.__psiscapeGrid = node.querySelector('canvas, svg');
  });
  const labelBefore = await grid.getAttribute('aria-label');
  await explorer.locator('input.jp-psiscape-landau-range[data-key="T"]').evaluate(range => {
    range.value = String(Number(range.min) + 0.2 * (Number(range.max) - Number(range.min)));
    range.dispatchEvent(new Event('input', { bubbles: true }));
  });
  await page.waitForFunction(([sel, before]) => document.querySelector(sel)?.getAttribute('aria-label') !== before, ['.jp-psiscape-LandauExplorer:last-of-type .jp-psiscape-landau-landscape-2d', labelBefore], { timeout: 15000 });
  assert.ok(await grid.evaluate(node => node.querySelector('canvas, svg') === window.__psiscapeGrid), 'the drawn 2-D view took the new rows in place');
  // the picture with both order parameters set near this fit's temperatures: an ordered landscape
  for (const [key, value] of [['T1', '300'], ['T2', '280']]) {
    const field = explorer.locator(`.jp-psiscape-landau-coupled input.jp-psiscape-landau-number[data-key="${key}"]`);
    await field.fill(value);
    await field.dispatchEvent('change');
  }
  await page.waitForFunction(sel => document.querySelector(sel)?.dataset.phase !== 'disordered', '.jp-psiscape-LandauExplorer .jp-psiscape-landau-landscape-2d', { timeout: 15000 });
  await grid.scrollIntoViewIfNeeded();
  await page.waitForTimeout(300);
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
  // the typed free energy has its own phase diagram and loop, found from it on a grid
  await explorer.locator('.jp-psiscape-landau-tab[data-view="phase-diagram"]').click();
  await explorer.locator('.jp-psiscape-landau-phase-diagram').waitFor({ state: 'visible', timeout: 15000 });
  await drawn(tabChart(explorer, 'phase-diagram'));
  assert.match((await explorer.locator('.jp-psiscape-landau-phase-diagram').getAttribute('aria-label')) ?? '', /[1-9]\d* lines, [1-9]\d* special points/);
  assert.match((await tabChart(explorer, 'phase-diagram').locator('.jp-psiscape-landau-note').textContent()) ?? '', /on a grid/);
  await screenshot(page, 'workbench-typed-phase-diagram-light');
  await explorer.locator('.jp-psiscape-landau-tab[data-view="loop"]').click();
  await explorer.locator('.jp-psiscape-landau-loop').waitFor({ state: 'visible', timeout: 15000 });
  await drawn(tabChart(explorer, 'loop'));
  assert.match((await explorer.locator('.jp-psiscape-landau-loop').getAttribute('aria-label')) ?? '', /with [1-9]\d* jumps/);
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
  // the data of the fit come back with the scenario, over the branches
  await again.locator('.jp-psiscape-landau-tab[data-view="landscape"]').click();
  await again.locator('.jp-psiscape-landau-branches svg g.mark-symbol.role-mark path').nth(9).waitFor({ state: 'attached', timeout: 30000 });
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

test('the presenter view takes an explorer: both charts side by side, text at least 18 px', async () => {
  const { page } = suite.lab;
  const explorer = page.locator('.jp-psiscape-LandauExplorer').last();
  await page.setViewportSize({ width: 1920, height: 1080 });
  await page.evaluate(id => window.jupyterapp.shell.activateById(id), await explorer.getAttribute('id'));
  await page.evaluate(() => window.jupyterapp.commands.execute('psiscape:present-analysis'));
  await page.waitForFunction(() => document.querySelector('.jp-psiscape-LandauExplorer.jp-psiscape-mod-presenting') !== null, null, { timeout: 15000 });
  await page.waitForFunction(() => {
    const t = document.querySelector('.jp-psiscape-mod-presenting .jp-psiscape-landau-branches svg .role-axis-label text');
    return t && parseFloat(getComputedStyle(t).fontSize) >= 18;
  }, null, { timeout: 15000 });
  await page.waitForTimeout(500);
  const boxes = await explorer.evaluate(node => {
    const box = el => node.querySelector(el).getBoundingClientRect();
    const texts = [...node.querySelectorAll('.jp-psiscape-landau-pair svg .role-axis-label text, .jp-psiscape-landau-pair svg .role-axis-title text')];
    return { landscape: box('.jp-psiscape-landau-landscape svg').toJSON(), branches: box('.jp-psiscape-landau-branches svg').toJSON(), min: Math.min(...texts.map(t => parseFloat(getComputedStyle(t).fontSize))), panel: node.getBoundingClientRect().width };
  });
  console.log(`explorer presented: panel ${Math.round(boxes.panel)} px, charts ${Math.round(boxes.landscape.width)}×${Math.round(boxes.landscape.height)} and ${Math.round(boxes.branches.width)}×${Math.round(boxes.branches.height)}, axis text ≥ ${boxes.min} px`);
  assert.ok(boxes.min >= 18, `axis text ${boxes.min} px`);
  assert.ok(boxes.panel > 1800, 'the explorer fills the main area');
  assert.ok(Math.abs(boxes.landscape.top - boxes.branches.top) < 2 && boxes.landscape.right <= boxes.branches.left + 1, 'the two charts side by side');
  // no field runs past the box of its slider group (or the explorer) at this width
  const spill = await explorer.evaluate(node =>
    [...node.querySelectorAll('.jp-psiscape-landau-group, .jp-psiscape-landau-fields > *')]
      .filter(g => g.offsetParent !== null)
      .flatMap(g => {
        const right = Math.min(g.getBoundingClientRect().right, node.getBoundingClientRect().right);
        return [...g.querySelectorAll('input, select')].filter(c => c.offsetParent !== null && c.getBoundingClientRect().right > right + 1).map(c => `${c.className} ${c.dataset.key ?? ''}`);
      })
  );
  assert.deepEqual(spill, [], 'fields running past their slider group in the presenter view');
  await screenshot(page, 'workbench-presenter-light');
  await darkScreenshot(page, 'workbench-presenter-dark', () => drawn(explorer.locator('.jp-psiscape-landau-branches')));
  await page.evaluate(() => window.jupyterapp.commands.execute('psiscape:present-analysis'));
  await page.waitForFunction(() => document.querySelector('.jp-psiscape-mod-presenting') === null);
  await page.setViewportSize({ width: 1400, height: 900 });
});
