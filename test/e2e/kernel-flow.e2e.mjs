// A real Jupyter server and a real ipykernel (Debian packages): a cell builds
// a pandas DataFrame, psiscape analyses its table output, then the cell is
// edited and re-run and the open analysis follows the new output — or, when
// the plotted column is gone, keeps its last data and says which column.
import assert from 'node:assert/strict';
import fs from 'node:fs';
import path from 'node:path';
import { after, before, test } from 'node:test';
import { ensureExtensionBuilt } from '../../scripts/ensure-built.mjs';
import { buildHost } from '../../demo/build.mjs';
import { contextMenu, screenshot } from './lab.mjs';
import { editCell, missingPython, openNotebook, runCell, startJupyter, waitKernelIdle, writeNotebook } from './kernel-lab.mjs';

const MENU_LABEL = 'Analyse This Table with psiscape';
const NOTEBOOK = 'kernel-flow.ipynb';
const MARKS = '.jp-psiscape-ChartView svg g.mark-symbol.role-mark path';

/** The cell's source: a DataFrame of `rows` rows with the given columns. */
function frameSource({ rows, tMin, tMax, amplitude, yColumn = 'M (emu/g)' }) {
  return [
    'import numpy as np',
    'import pandas as pd',
    `T = np.linspace(${tMin}, ${tMax}, ${rows})`,
    `y = ${amplitude} * np.sqrt(np.clip(1.0 - T / 300.0, 0.0, None)) + 0.5`,
    `df = pd.DataFrame({"T (K)": T, ${JSON.stringify(yColumn)}: y.round(4)})`,
    'df'
  ].join('\n');
}

const skipReason = missingPython();
if (skipReason) {
  console.log(`kernel-flow: skipped, ${skipReason}`);
  test('kernel flow with a real Jupyter server', { skip: skipReason }, () => {});
} else {
  defineSuite();
}

function defineSuite() {
  let server;
  let lab;
  let notebookDir;

  before(async () => {
    ensureExtensionBuilt();
    buildHost();
    const file = writeNotebook(NOTEBOOK, [frameSource({ rows: 10, tMin: 250, tMax: 320, amplitude: 40 })]);
    notebookDir = path.dirname(file);
    const t0 = Date.now();
    server = await startJupyter({ notebooks: [file] });
    const t1 = Date.now();
    lab = await openNotebook(server.url, NOTEBOOK);
    console.log(`kernel-flow: server up in ${t1 - t0} ms, lab open with an idle kernel ${Date.now() - t1} ms later`);
  });

  after(async () => {
    await lab?.browser.close();
    await server?.stop();
    if (notebookDir) {
      fs.rmSync(notebookDir, { recursive: true, force: true });
    }
  });

  /** Wait until cell 0's table has `n` rows. */
  async function waitTableRows(page, n) {
    await page.waitForFunction(
      rows => document.querySelectorAll('.jp-Notebook .jp-Cell:first-child .jp-OutputArea-output table.dataframe tbody tr').length === rows,
      n,
      { timeout: 30000, polling: 100 }
    );
  }

  /**
   * Wait until the analysis panel draws `n` marks and reports `state`.
   * Returns the milliseconds it took (reported, not asserted).
   */
  async function waitAnalysis(page, { marks, state }) {
    const t0 = Date.now();
    await page.waitForFunction(
      ([selector, n, want]) => {
        const panels = document.querySelectorAll('.jp-psiscape-AnalysisPanel');
        const panel = panels[panels.length - 1];
        return panel && panel.dataset.sourceState === want && panel.querySelectorAll(selector).length === n;
      },
      [MARKS, marks, state],
      { timeout: 15000, polling: 100 }
    );
    return Date.now() - t0;
  }

  test('a DataFrame computed by ipykernel is analysed from its table output', async () => {
    const { page } = lab;
    const count = await runCell(page, 0);
    assert.ok(count >= 1, `the kernel ran the cell (execution count ${count})`);
    await waitTableRows(page, 10);
    const output = page.locator('.jp-Notebook .jp-OutputArea-child', { has: page.locator('table.dataframe') }).first();
    await contextMenu(page, output, MENU_LABEL);
    const panel = page.locator('.jp-psiscape-AnalysisPanel').last();
    await panel.waitFor({ state: 'visible', timeout: 30000 });
    await panel.locator(MARKS).first().waitFor({ timeout: 30000 });
    assert.equal(await panel.locator(MARKS).count(), 10, 'one mark per row of the 10-row frame');
    assert.equal(await panel.locator('select.jp-psiscape-x option:checked').textContent(), 'T (K)');
    assert.equal(await panel.locator('select.jp-psiscape-y option:checked').textContent(), 'M (emu/g)');
    assert.match(await panel.locator('.jp-psiscape-AnalysisPanel-source').textContent(), /kernel-flow\.ipynb · cell 1 · output 1/);
    const state = await panel.getAttribute('data-source-state');
    assert.ok(state === null || state === 'live', `a fresh analysis is live (data-source-state=${state})`);
  });

  test('editing the cell and re-running it: the open analysis follows (15 rows)', async t => {
    const { page } = lab;
    await editCell(page, 0, frameSource({ rows: 15, tMin: 200, tMax: 340, amplitude: 55 }));
    await runCell(page, 0);
    await waitTableRows(page, 15);
    t.diagnostic(`analysis followed ${await waitAnalysis(page, { marks: 15, state: 'live' })} ms after the new table showed`);
    const panel = page.locator('.jp-psiscape-AnalysisPanel').last();
    assert.equal(await panel.locator('.jp-psiscape-AnalysisPanel-banner').isVisible(), false, 'no banner while live');
    assert.match(await panel.locator('.jp-psiscape-AnalysisPanel-status').textContent(), /15 points plotted/);
    assert.equal(await panel.locator('select.jp-psiscape-y option:checked').textContent(), 'M (emu/g)');
  });

  test('a re-run without the plotted column leaves the analysis stale, naming the column', async t => {
    const { page } = lab;
    await editCell(page, 0, frameSource({ rows: 8, tMin: 200, tMax: 340, amplitude: 55, yColumn: 'chi (emu/g/Oe)' }));
    await runCell(page, 0);
    await waitTableRows(page, 8);
    // The last data (15 rows) stay on screen, with a banner saying why.
    t.diagnostic(`analysis turned stale ${await waitAnalysis(page, { marks: 15, state: 'stale' })} ms after the new table showed`);
    const panel = page.locator('.jp-psiscape-AnalysisPanel').last();
    const banner = panel.locator('.jp-psiscape-AnalysisPanel-banner');
    await banner.waitFor({ state: 'visible', timeout: 5000 });
    assert.match(await banner.textContent(), /M \(emu\/g\)/, 'the banner names the missing column');
    await screenshot(page, 'kernel-flow', { guide: 'with-a-jupyter-server' });
  });

  test('restoring the column makes the analysis live again', async () => {
    const { page } = lab;
    await editCell(page, 0, frameSource({ rows: 12, tMin: 260, tMax: 330, amplitude: 30 }));
    await runCell(page, 0);
    await waitTableRows(page, 12);
    await waitAnalysis(page, { marks: 12, state: 'live' });
    assert.equal(await page.locator('.jp-psiscape-AnalysisPanel').last().locator('.jp-psiscape-AnalysisPanel-banner').isVisible(), false);
    await waitKernelIdle(page);
    assert.deepEqual(lab.errors, [], 'no uncaught page errors');
    assert.match(server.log(), /Kernel started/, 'a real kernel was started by the server');
  });
}
