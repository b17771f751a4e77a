// Results leave the panel: after a fit of the demo's M(T) table, the export
// toolbar saves the result as JSON (valid against the published schema), the
// chart as SVG (parsed as SVG, with every data point) and as PNG (twice the
// screen resolution), beside the notebook; the copies carry the panel's numbers.
import assert from 'node:assert/strict';
import fs from 'node:fs';
import path from 'node:path';
import { test } from 'node:test';
import { createRequire } from 'node:module';
import { execFileSync } from 'node:child_process';
import os from 'node:os';
import { contextMenu, root, screenshot, setWindow, useDemoLab } from './lab.mjs';
import { openNotebook, startJupyter } from './kernel-lab.mjs';

const require = createRequire(import.meta.url);
const Ajv = require('ajv');
const suite = useDemoLab();
/** The demo notebook as saved after the insertion (for the lab without psiscape). */
let savedNotebook = null;

/** A file of the lab's contents, as text or base64. */
const read = (page, file, format) => page.evaluate(([p, f]) => window.jupyterapp.serviceManager.contents.get(p, { content: true, format: f }).then(m => m.content), [file, format]);

test('the export toolbar saves the fit result as JSON and the chart as SVG and PNG beside the notebook', async () => {
  const { page } = suite.lab;
  const output = page.locator('.jp-Notebook .jp-OutputArea-child', { has: page.locator('table.dataframe') }).first();
  await contextMenu(page, output, 'Analyse This Table with psiscape');
  const panel = page.locator('.jp-psiscape-AnalysisPanel').last();
  await panel.locator('.jp-psiscape-ChartView svg').first().waitFor({ timeout: 60000 });
  assert.equal(await panel.locator('button.jp-psiscape-export-json').isDisabled(), true, 'nothing to save before a fit');
  await setWindow(panel, '250', '286');
  await panel.locator('button.jp-psiscape-fit-run').click();
  await panel.locator('.jp-psiscape-verdict').waitFor({ timeout: 60000 });
  await page.waitForFunction(() => !document.querySelector('button.jp-psiscape-export-json')?.disabled);

  const status = panel.locator('.jp-psiscape-ExportBar-status');
  await panel.locator('button.jp-psiscape-export-json').click();
  await status.filter({ hasText: 'Saved am17-demo power-law result.json.' }).waitFor({ timeout: 10000 });
  const record = JSON.parse(await read(page, 'am17-demo power-law result.json', 'text'));
  const schema = JSON.parse(fs.readFileSync(path.join(root, 'schema', 'analysis-result.v1.json'), 'utf8'));
  const validate = new Ajv({ allErrors: true, strict: false }).compile(schema);
  assert.ok(validate(record), JSON.stringify(validate.errors));
  assert.equal(record.verdict.state, 'fits');
  assert.deepEqual(record.window, { min: 250, max: 286 });
  // The panel's Tc row and the record's Tc agree to the panel's rounding.
  const tcText = await panel.locator('.jp-psiscape-fit-table tbody tr', { hasText: /^Tc/ }).first().locator('td').nth(1).textContent();
  const tc = record.fit.parameters.find(p => p.name === 'Tc');
  const [value, sigma] = tcText.split(' ± ');
  assert.equal(tc.value.toFixed(value.split('.')[1]?.length ?? 0), value);
  assert.equal(tc.sigma.toFixed(sigma.split('.')[1]?.length ?? 0), sigma);

  await panel.locator('button.jp-psiscape-export-svg').click();
  await status.filter({ hasText: 'Saved am17-demo chart.svg.' }).waitFor({ timeout: 10000 });
  const svgText = await read(page, 'am17-demo chart.svg', 'text');
  const points = await page.evaluate(text => {
    const doc = new DOMParser().parseFromString(text, 'image/svg+xml');
    return doc.querySelector('parsererror') ? -1 : doc.documentElement.nodeName === 'svg' ? doc.querySelectorAll('g.mark-symbol.role-mark path').length : -2;
  }, svgText);
  assert.equal(points, 81, 'the SVG parses and holds the 81 data points of the M(T) table');

  await panel.locator('button.jp-psiscape-export-png').click();
  await status.filter({ hasText: 'Saved am17-demo chart.png.' }).waitFor({ timeout: 10000 });
  const png = Buffer.from(await read(page, 'am17-demo chart.png', 'base64'), 'base64');
  assert.deepEqual([...png.subarray(0, 8)], [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a], 'a PNG file');
  const width = png.readUInt32BE(16);
  const chartWidth = await panel.locator('.jp-psiscape-ChartView canvas, .jp-psiscape-ChartView svg').first().evaluate(n => n.getBoundingClientRect().width);
  assert.ok(Math.abs(width - 2 * chartWidth) <= 4, `PNG ${width} px wide for a ${chartWidth} px chart`);

  // The same actions as commands, on the panel in focus.
  await panel.click({ position: { x: 20, y: 20 } });
  const copied = await page.evaluate(() => window.jupyterapp.commands.execute('psiscape:copy-result-markdown'));
  assert.equal(copied, 'Copied the result as Markdown.');
  await panel.locator('.jp-psiscape-ExportBar').scrollIntoViewIfNeeded();
  await screenshot(page, 'export-light', { guide: 'export' });
});

test('Insert into notebook adds the chart and the results as saved outputs that nbconvert shows without psiscape', async () => {
  const { page } = suite.lab;
  const panel = page.locator('.jp-psiscape-AnalysisPanel').last();
  const cellCount = () => page.evaluate(() => Array.from(window.jupyterapp.shell.widgets('main')).find(w => w.context?.path === 'am17-demo.ipynb').content.widgets.length);
  const before = await cellCount();
  const status = panel.locator('.jp-psiscape-ExportBar-status');
  await panel.locator('button.jp-psiscape-export-insert').click();
  await status.filter({ hasText: /Inserted into the notebook \(cell 4\)/ }).waitFor({ timeout: 15000 });
  assert.equal(await cellCount(), before + 1, 'one cell added, below the source cell (cell 3)');
  // Again: the same cell is updated in place.
  await panel.locator('button.jp-psiscape-export-insert').click();
  await status.filter({ hasText: /cell 4, updated/ }).waitFor({ timeout: 15000 });
  assert.equal(await cellCount(), before + 1, 'no second cell');
  const inserted = page.locator('.jp-Notebook .jp-Cell').nth(3);
  // With psiscape installed the outputs are drawn live (next test); the saved bundle is checked by nbconvert below.
  await inserted.locator('.jp-psiscape-AnalysisOutput').first().waitFor({ timeout: 10000 });

  // Save, then convert the saved notebook with Debian's nbconvert: no kernel, no psiscape.
  await page.locator('.jp-NotebookPanel').first().click({ position: { x: 200, y: 10 } });
  await page.evaluate(() => window.jupyterapp.commands.execute('docmanager:save'));
  const nb = await page.evaluate(() => window.jupyterapp.serviceManager.contents.get('am17-demo.ipynb', { content: true }).then(m => m.content));
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'psiscape-nbconvert-'));
  const file = path.join(dir, 'am17-demo.ipynb');
  fs.writeFileSync(file, JSON.stringify(nb));
  savedNotebook = JSON.stringify(nb);
  const html = execFileSync('/usr/bin/python3', ['-m', 'nbconvert', '--to', 'html', '--stdout', file], { encoding: 'utf8', stdio: ['ignore', 'pipe', 'pipe'] });
  fs.rmSync(dir, { recursive: true, force: true });
  const tcText = await panel.locator('.jp-psiscape-fit-table tbody tr', { hasText: /^Tc/ }).first().locator('td').nth(1).textContent();
  assert.ok(/<svg[\s\S]*mark-symbol|data:image\/png;base64,/.test(html), 'the HTML holds the chart');
  assert.ok(html.includes('value ± standard error'), 'the HTML holds the results table');
  assert.ok(html.includes(tcText), `the HTML holds Tc as the panel shows it (${tcText})`);
  assert.ok(html.includes('Describes the data'), 'and the verdict');
});

test('with psiscape, the inserted output is a live analysis: changing its window refits without a kernel', async () => {
  const { page } = suite.lab;
  const inserted = page.locator('.jp-Notebook .jp-Cell').nth(3);
  const live = inserted.locator('.jp-psiscape-AnalysisOutput .jp-psiscape-AnalysisPanel');
  await live.waitFor({ timeout: 30000 });
  // The chart output only points to the live one; the static picture is for readers without psiscape.
  assert.match(await inserted.locator('.jp-psiscape-inline-chart-note').textContent(), /live in the next output/);
  const verdict = live.locator('.jp-psiscape-verdict');
  await verdict.waitFor({ timeout: 60000 });
  assert.equal(await verdict.getAttribute('data-verdict'), 'fits', 'the saved fit (250–286 K) is refitted from the data in the output');
  assert.equal(await live.locator('input.jp-psiscape-fit-min').inputValue(), '250');
  // The data chart (the residual chart under the fit draws the window's points too).
  const dataPoints = live.locator(':scope > .jp-psiscape-ChartView').locator('svg g.mark-symbol.role-mark path');
  await dataPoints.first().waitFor({ timeout: 30000 });
  assert.equal(await dataPoints.count(), 81);
  // A wider window, refitted in the browser: the whole ordered range is not a pure power law.
  await setWindow(live, '20', '');
  await live.locator('button.jp-psiscape-fit-run').click();
  await page.waitForFunction(() => document.querySelector('.jp-psiscape-AnalysisOutput .jp-psiscape-verdict')?.getAttribute('data-verdict') === 'does-not-describe', undefined, { timeout: 60000 });
  assert.equal(await page.evaluate(() => window.jupyterapp.serviceManager.sessions.running().next().done ?? true), true, 'no kernel session was started');
  await live.scrollIntoViewIfNeeded();
  await screenshot(page, 'inline-analysis-light', { guide: 'live-output' });
});

test('a collaborator without psiscape (a Jupyter server lab, no psiscape) sees the chart image and the results table', async () => {
  assert.ok(savedNotebook, 'the notebook was saved with the inserted outputs');
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'psiscape-shared-'));
  const file = path.join(dir, 'shared-am17.ipynb');
  fs.writeFileSync(file, savedNotebook);
  const server = await startJupyter({ notebooks: [file], withPsiscape: false });
  let lab = null;
  try {
    lab = await openNotebook(server.url, 'shared-am17.ipynb');
    const { page } = lab;
    assert.equal(await page.evaluate(() => window.jupyterapp.commands.hasCommand('psiscape:analyse-output')), false, 'psiscape is not installed in this lab');
    const inserted = page.locator('.jp-Notebook .jp-Cell').nth(3);
    // An untrusted notebook: the PNG (safe) is shown, not the SVG; the HTML table is sanitised and shown.
    await inserted.locator('.jp-OutputArea-output img').first().waitFor({ timeout: 30000 });
    const size = await inserted.locator('.jp-OutputArea-output img').first().evaluate(img => [img.naturalWidth, img.complete]);
    assert.ok(size[1] && size[0] > 100, `the chart image loaded (${size[0]} px wide)`);
    const text = await inserted.locator('.jp-OutputArea').textContent();
    assert.ok(text.includes('value ± standard error'), 'the results table shows');
    assert.ok(text.includes('Describes the data'), 'with the verdict');
    await inserted.scrollIntoViewIfNeeded();
    await screenshot(page, 'shared-without-psiscape', { guide: 'shared-without-psiscape' });
  } finally {
    await lab?.browser.close();
    await server.stop();
    fs.rmSync(dir, { recursive: true, force: true });
  }
});
