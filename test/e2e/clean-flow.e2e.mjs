// Opening is not editing: opening the demo notebook, opening an analysis of
// one of its tables, and reloading a notebook with a saved analysis (which
// reopens and refits it) leave the notebook unmodified. Running a fit is an
// edit: it is saved once, after a short debounce.
import assert from 'node:assert/strict';
import { test } from 'node:test';
import { contextMenu, saveAndReload, useDemoLab } from './lab.mjs';

const suite = useDemoLab();

/** The demo notebook's dirty flag and its psiscape metadata as JSON. */
const state = page =>
  page.evaluate(() => {
    const nb = Array.from(window.jupyterapp.shell.widgets('main')).find(w => w.context?.path?.endsWith('am17-demo.ipynb'));
    return { dirty: nb.context.model.dirty, meta: JSON.stringify(nb.context.model.getMetadata('psiscape') ?? null) };
  });
const settle = page => page.waitForTimeout(1200); // several times the session's save debounce

test('opening the notebook and an analysis leaves the notebook unmodified', async () => {
  const { page } = suite.lab;
  await settle(page);
  assert.deepEqual(await state(page), { dirty: false, meta: 'null' }, 'the demo opens clean');
  const output = page.locator('.jp-Notebook .jp-OutputArea-child', { has: page.locator('table.dataframe') }).first();
  await contextMenu(page, output, 'Analyse This Table with psiscape');
  await page.locator('.jp-psiscape-AnalysisPanel .jp-psiscape-ChartView svg').first().waitFor({ timeout: 30000 });
  await settle(page);
  assert.deepEqual(await state(page), { dirty: false, meta: 'null' }, 'opening an analysis writes nothing');
});

test('a fit is saved once; a reload with the saved analysis leaves the notebook unmodified', async () => {
  const { page } = suite.lab;
  const panel = page.locator('.jp-psiscape-AnalysisPanel').last();
  await panel.locator('select.jp-psiscape-fit-kind').selectOption('weiss');
  await panel.locator('button.jp-psiscape-fit-run').click();
  await panel.locator('.jp-psiscape-FitSection .jp-psiscape-verdict').waitFor({ timeout: 60000 });
  await settle(page);
  const afterFit = await state(page);
  assert.equal(afterFit.dirty, true, 'the fit was written to the notebook');
  const saved = JSON.parse(afterFit.meta);
  assert.equal(saved.version, 2);
  assert.equal(saved.analyses.length, 1);
  assert.equal(saved.analyses[0].settings.kind, 'weiss');
  assert.deepEqual(saved.analyses[0].columns.x, { index: 1, header: 'T (K)' });

  await saveAndReload(page);
  const restored = page.locator('.jp-psiscape-AnalysisPanel').last();
  await restored.locator('.jp-psiscape-FitSection .jp-psiscape-verdict').waitFor({ timeout: 60000 });
  await settle(page);
  const afterReload = await state(page);
  assert.equal(afterReload.dirty, false, 'restoring and refitting wrote nothing');
  assert.equal(afterReload.meta, afterFit.meta, 'the metadata is byte for byte what was saved');
});
