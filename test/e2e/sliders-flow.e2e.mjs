// Moving a fitted parameter by hand: after a Weiss fit of the demo's M(T)
// table, the Tc slider moves the model curve on the chart (its path changes
// in place) and the χ² readout; "Back to the fit" restores both. Screenshots
// in the light and the dark theme.
import assert from 'node:assert/strict';
import { test } from 'node:test';
import { contextMenu, screenshot, useDemoLab } from './lab.mjs';

const suite = useDemoLab(async ({ page }) => {
  const output = page.locator('.jp-Notebook .jp-OutputArea-child', { has: page.locator('table.dataframe') }).first();
  await contextMenu(page, output, 'Analyse This Table with psiscape');
  await page.locator('.jp-psiscape-AnalysisPanel .jp-psiscape-ChartView svg').first().waitFor({ timeout: 30000 });
});

/** Set the slider to a position (0–1000) as a drag does, and wait for the preview to be drawn. */
async function moveSlider(page, position) {
  await page.evaluate(p => {
    const panels = document.querySelectorAll('.jp-psiscape-AnalysisPanel');
    const node = panels[panels.length - 1];
    const sliders = node.querySelector('.jp-psiscape-ModelSliders');
    const range = sliders.querySelector('input.jp-psiscape-ModelSliders-range[data-parameter="Tc"]');
    return new Promise((resolve, reject) => {
      const timer = setTimeout(() => reject(new Error('no preview within 10 s')), 10000);
      sliders.addEventListener('jp-psiscape-model-preview', () => {
        clearTimeout(timer);
        requestAnimationFrame(() => resolve());
      }, { once: true });
      range.value = String(p);
      range.dispatchEvent(new Event('input', { bubbles: true }));
    });
  }, position);
}

test('the Tc slider moves the model curve and χ², and "Back to the fit" restores them', async () => {
  const { page } = suite.lab;
  const panel = page.locator('.jp-psiscape-AnalysisPanel').last();
  await panel.locator('.jp-psiscape-FitSection select.jp-psiscape-fit-kind').selectOption('weiss');
  await panel.locator('.jp-psiscape-FitSection button.jp-psiscape-fit-run').click();
  await panel.locator('.jp-psiscape-FitSection .jp-psiscape-fit-table').waitFor({ timeout: 60000 });
  const sliders = panel.locator('.jp-psiscape-ModelSliders');
  const tc = sliders.locator('input.jp-psiscape-ModelSliders-range[data-parameter="Tc"]');
  await tc.waitFor({ timeout: 30000 });
  assert.equal(await sliders.locator('.jp-psiscape-ModelSliders-row').count(), 2, 'one slider each for Ms and Tc');
  const curve = panel.locator('.jp-psiscape-ChartView svg .mark-line path').first();
  await curve.waitFor({ timeout: 10000 });
  const readout = sliders.locator('.jp-psiscape-ModelSliders-chi2');
  const fittedPath = await curve.getAttribute('d');
  const fittedChi2 = Number(await readout.getAttribute('data-chi2'));
  const fittedText = await readout.textContent();
  const svgsBefore = await panel.locator('.jp-psiscape-ChartView svg').count();

  await moveSlider(page, 850);
  const movedPath = await curve.getAttribute('d');
  assert.notEqual(movedPath, fittedPath, 'the curve moved with the slider');
  assert.ok(Number(await readout.getAttribute('data-chi2')) > fittedChi2, 'χ² grew away from the fit');
  assert.notEqual(await readout.textContent(), fittedText, 'the χ² readout changed');
  assert.equal(await panel.locator('.jp-psiscape-ChartView svg').count(), svgsBefore, 'the charts were patched, not rebuilt');
  await sliders.scrollIntoViewIfNeeded();
  await screenshot(page, 'sliders-moved-light');

  await sliders.locator('button.jp-psiscape-ModelSliders-back').click();
  await page.waitForFunction(
    ([path]) => {
      const panels = document.querySelectorAll('.jp-psiscape-AnalysisPanel');
      return panels[panels.length - 1].querySelector('.jp-psiscape-ChartView svg .mark-line path')?.getAttribute('d') === path;
    },
    [fittedPath],
    { timeout: 10000 }
  );
  assert.equal(await curve.getAttribute('d'), fittedPath, 'the fitted curve is back');
  assert.ok(Math.abs(Number(await readout.getAttribute('data-chi2')) - fittedChi2) <= 1e-9 * fittedChi2, 'χ² is the fit’s again');
  assert.ok(await sliders.locator('button.jp-psiscape-ModelSliders-back').isDisabled(), 'nothing to go back to');

  // Keyboard: the slider takes the arrow keys, and Escape goes back to the fit.
  await tc.focus();
  await page.keyboard.press('PageUp');
  await page.waitForFunction(() => {
    const panels = document.querySelectorAll('.jp-psiscape-AnalysisPanel');
    return !panels[panels.length - 1].querySelector('button.jp-psiscape-ModelSliders-back').disabled;
  });
  await page.keyboard.press('Escape');
  await page.waitForFunction(() => {
    const panels = document.querySelectorAll('.jp-psiscape-AnalysisPanel');
    return panels[panels.length - 1].querySelector('button.jp-psiscape-ModelSliders-back').disabled;
  });
});

test('the sliders in the dark theme', async () => {
  const { page } = suite.lab;
  const panel = page.locator('.jp-psiscape-AnalysisPanel').last();
  const theme = t => page.evaluate(n => window.jupyterapp.commands.execute('apputils:change-theme', { theme: n }), t);
  await theme('JupyterLab Dark');
  await page.waitForFunction(() => document.body.dataset.jpThemeLight === 'false');
  await page.locator('#jupyterlab-splash').waitFor({ state: 'detached', timeout: 10000 });
  const sliders = panel.locator('.jp-psiscape-ModelSliders');
  await sliders.locator('input.jp-psiscape-ModelSliders-range[data-parameter="Tc"]').waitFor({ timeout: 30000 });
  await panel.locator('.jp-psiscape-ChartView svg .mark-line path').first().waitFor({ timeout: 30000 });
  await moveSlider(page, 200);
  await sliders.scrollIntoViewIfNeeded();
  await screenshot(page, 'sliders-moved-dark');
  await theme('JupyterLab Light');
  await page.waitForFunction(() => document.body.dataset.jpThemeLight === 'true');
});
