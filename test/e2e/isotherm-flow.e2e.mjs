// Field sweeps in the browser: the demo's M(H) isotherm table opened with its
// own context-menu item, the analysis run in the worker with its defaults,
// the primary result and cross-checks shown, every view drawn as a tab
// (keyboard too), and the analysis with its controls and view surviving a
// save and reload.
import assert from 'node:assert/strict';
import { test } from 'node:test';
import { contextMenu, darkScreenshot, drawn as drawnChart, saveAndReload, screenshot, useDemoLab } from './lab.mjs';

const suite = useDemoLab();

const VIEWS = ['arrott', 'modified-arrott', 'kouvel-fisher', 'critical', 'collapse', 'banerjee', 'window', 'entropy', 'entropy-map'];

/** The Tc of the primary table as [value, sigma]. */
async function primaryTc(section) {
  const text = await section.locator('.jp-psiscape-isotherm-primary tbody tr', { hasText: /^Tc/ }).locator('td').nth(1).textContent();
  const m = /^([\d.]+) ± ([\d.]+)$/.exec(text ?? '');
  assert.ok(m, `primary Tc reads "${text}"`);
  return [Number(m[1]), Number(m[2])];
}

/** Wait until the chart of the isotherm view `view` has drawn marks. */
function drawn(section, view) {
  return drawnChart(section.locator(`.jp-psiscape-IsothermViews .jp-psiscape-ChartView[data-view="${view}"]`));
}

test('isotherms open with their own command, run with the defaults, and every view draws', async () => {
  const { page } = suite.lab;
  const output = page.locator('.jp-Notebook .jp-OutputArea-child', { has: page.locator('table.dataframe th', { hasText: 'H (Oe)' }) }).first();
  await contextMenu(page, output, 'Analyse Isotherms in This Table');
  const panel = page.locator('.jp-psiscape-AnalysisPanel[data-mode="isotherms"]').last();
  const section = panel.locator('.jp-psiscape-IsothermSection');
  await section.waitFor({ state: 'visible', timeout: 30000 });
  // The fit of y(x) is not shown in this view.
  assert.equal(await panel.locator('.jp-psiscape-FitSection').isVisible(), false);
  assert.equal(await section.locator('select.jp-psiscape-iso-field option:checked').textContent(), 'H (Oe)');
  await section.locator('button.jp-psiscape-iso-run').click();
  await section.locator('.jp-psiscape-isotherm-primary').waitFor({ timeout: 60000 });
  // The demo isotherms are exact spin-½ mean-field isotherms with Tc = 287.4 K and 0.02 K thermometer jitter
  // (demo/generate_notebooks.py): mean-field exponents β = ½, γ = 1 (REFERENCE.md B1).
  const [tc] = await primaryTc(section);
  assert.ok(Math.abs(tc - 287.4) < 0.5, `primary Tc ${tc}`);
  const text = await section.textContent();
  assert.match(text, /16 isotherms/);
  assert.match(text, /demagnetising factor N_d is not set/);
  assert.doesNotMatch(text, /NaN/);
  for (const view of VIEWS) {
    await section.locator(`.jp-psiscape-IsothermViews-tab[data-view="${view}"]`).click();
    const chart = await drawn(section, view);
    const legend = (await chart.locator('svg g.role-legend').allTextContents()).join(' ');
    assert.doesNotMatch(legend, /NaN/, `legend of ${view}`);
  }
  // Keyboard: arrow keys move between the tabs.
  await section.locator('.jp-psiscape-IsothermViews-tab[data-view="entropy-map"]').focus();
  await page.keyboard.press('Home');
  await drawn(section, 'arrott');
  await page.keyboard.press('ArrowRight');
  await page.keyboard.press('ArrowRight');
  await page.keyboard.press('ArrowRight');
  await drawn(section, 'critical');
  assert.equal(await page.evaluate(() => document.activeElement?.getAttribute('data-view')), 'critical');
  await section.scrollIntoViewIfNeeded();
  await screenshot(page, 'isotherms-critical-light', { guide: 'isotherms' });
  await section.locator('.jp-psiscape-IsothermViews-tab[data-view="collapse"]').click();
  await drawn(section, 'collapse');
  await screenshot(page, 'isotherms-collapse-light');
  await darkScreenshot(page, 'isotherms-collapse-dark', () => drawn(section, 'collapse'));
  await section.locator('.jp-psiscape-IsothermViews-tab[data-view="entropy-map"]').click();
  await drawn(section, 'entropy-map');
  await screenshot(page, 'isotherms-entropy-map-light');
  await darkScreenshot(page, 'isotherms-entropy-map-dark', () => drawn(section, 'entropy-map'));
});

test('an N_d too large for the data gives one message naming the isotherms, and the analysis still runs', async () => {
  const { page } = suite.lab;
  const panel = page.locator('.jp-psiscape-AnalysisPanel[data-mode="isotherms"]').last();
  const section = panel.locator('.jp-psiscape-IsothermSection');
  // The demo's M is per gram: the correction needs the density. Its fields are small (at most about 300 Oe), so
  // N_d = 0.1 (SI) makes the internal field negative at the low-field end of many isotherms.
  await section.locator('input.jp-psiscape-iso-density').fill('7');
  await section.locator('input.jp-psiscape-iso-demag').fill('0.1');
  await section.locator('button.jp-psiscape-iso-run').click();
  await section.locator('.jp-psiscape-iso-progress').waitFor({ state: 'hidden', timeout: 60000 });
  const text = (await section.textContent()) ?? '';
  assert.doesNotMatch(text, /NaN/);
  const warnings = await section.locator('.jp-psiscape-isotherm-warnings li').allTextContents();
  const error = (await section.locator('.jp-psiscape-fit-error').isVisible()) ? await section.locator('.jp-psiscape-fit-error').textContent() : '';
  const aboutNegative = [...warnings, error].filter(w => /internal field/.test(w) && /K\b/.test(w));
  assert.equal(aboutNegative.length, 1, `one message naming the isotherms: ${[...warnings, error].join(' | ')}`);
  await screenshot(page, 'isotherms-demag-too-large');
  // Everything negative: refused in one message, the controls kept.
  await section.locator('input.jp-psiscape-iso-demag').fill('0.9');
  await section.locator('button.jp-psiscape-iso-run').click();
  await section.locator('.jp-psiscape-fit-error').waitFor({ state: 'visible', timeout: 60000 });
  assert.match(await section.locator('.jp-psiscape-fit-error').textContent(), /internal field/);
  assert.equal(await section.locator('input.jp-psiscape-iso-demag').inputValue(), '0.9');
  await section.locator('input.jp-psiscape-iso-demag').fill('');
  await section.locator('input.jp-psiscape-iso-density').fill('');
  await section.locator('button.jp-psiscape-iso-run').click();
  await section.locator('.jp-psiscape-iso-progress').waitFor({ state: 'hidden', timeout: 60000 });
  assert.equal(await section.locator('.jp-psiscape-fit-error').isVisible(), false);
});

test('the isotherm analysis is saved with its controls and view, and runs again after a reload', async () => {
  const { page } = suite.lab;
  const panel = page.locator('.jp-psiscape-AnalysisPanel[data-mode="isotherms"]').last();
  const section = panel.locator('.jp-psiscape-IsothermSection');
  await section.locator('select.jp-psiscape-iso-shape').selectOption('sphere');
  assert.equal(await section.locator('input.jp-psiscape-iso-demag').inputValue(), '0.333333');
  // A small plate edge-on: N_d typed in the cgs convention (0.05 of 4π), which resets the shape to "typed value".
  await section.locator('select.jp-psiscape-iso-demag-convention').selectOption('cgs');
  await section.locator('input.jp-psiscape-iso-demag').fill('0.05');
  assert.equal(await section.locator('select.jp-psiscape-iso-shape').inputValue(), '');
  await section.locator('input.jp-psiscape-iso-density').fill('7');
  await section.locator('input.jp-psiscape-iso-field-min').fill('5');
  await section.locator('input.jp-psiscape-iso-tmax').fill('0.08');
  await section.locator('input.jp-psiscape-iso-mass').fill('12.5');
  await section.locator('input.jp-psiscape-iso-tolerance').fill('0.4');
  await section.locator('button.jp-psiscape-iso-run').click();
  await section.locator('.jp-psiscape-iso-progress').waitFor({ state: 'hidden', timeout: 60000 });
  await section.locator('.jp-psiscape-IsothermViews-tab[data-view="kouvel-fisher"]').click();
  await drawn(section, 'kouvel-fisher');
  const before = await primaryTc(section);
  await page.waitForTimeout(800); // the session's save debounce
  await saveAndReload(page);
  const restored = page.locator('.jp-psiscape-AnalysisPanel[data-mode="isotherms"]').last();
  const again = restored.locator('.jp-psiscape-IsothermSection');
  await again.locator('.jp-psiscape-isotherm-primary').waitFor({ timeout: 60000 });
  assert.equal(await again.locator('input.jp-psiscape-iso-demag').inputValue(), '0.05');
  assert.equal(await again.locator('select.jp-psiscape-iso-demag-convention').inputValue(), 'cgs');
  assert.equal(await again.locator('input.jp-psiscape-iso-density').inputValue(), '7');
  assert.equal(await again.locator('input.jp-psiscape-iso-field-min').inputValue(), '5');
  assert.equal(await again.locator('input.jp-psiscape-iso-tmax').inputValue(), '0.08');
  assert.equal(await again.locator('input.jp-psiscape-iso-mass').inputValue(), '12.5');
  assert.equal(await again.locator('input.jp-psiscape-iso-tolerance').inputValue(), '0.4');
  assert.equal(await again.locator('.jp-psiscape-IsothermViews-tab[aria-selected="true"]').getAttribute('data-view'), 'kouvel-fisher');
  await drawn(again, 'kouvel-fisher');
  assert.deepEqual(await primaryTc(again), before, 'the reopened analysis gives the same Tc');
  await screenshot(page, 'isotherms-after-reload');
});
