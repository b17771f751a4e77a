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

const require = createRequire(import.meta.url);
const Ajv = require('ajv');
const suite = useDemoLab();

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
  await inserted.locator('.jp-OutputArea-output img').first().waitFor({ timeout: 10000 });
  await inserted.scrollIntoViewIfNeeded();
  await screenshot(page, 'inserted-into-notebook-light', { guide: 'insert-into-notebook' });

  // Save, then convert the saved notebook with Debian's nbconvert: no kernel, no psiscape.
  await page.locator('.jp-NotebookPanel').first().click({ position: { x: 200, y: 10 } });
  await page.evaluate(() => window.jupyterapp.commands.execute('docmanager:save'));
  const nb = await page.evaluate(() => window.jupyterapp.serviceManager.contents.get('am17-demo.ipynb', { content: true }).then(m => m.content));
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'psiscape-nbconvert-'));
  const file = path.join(dir, 'am17-demo.ipynb');
  fs.writeFileSync(file, JSON.stringify(nb));
  const html = execFileSync('/usr/bin/python3', ['-m', 'nbconvert', '--to', 'html', '--stdout', file], { encoding: 'utf8', stdio: ['ignore', 'pipe', 'pipe'] });
  fs.rmSync(dir, { recursive: true, force: true });
  const tcText = await panel.locator('.jp-psiscape-fit-table tbody tr', { hasText: /^Tc/ }).first().locator('td').nth(1).textContent();
  assert.ok(/<svg[\s\S]*mark-symbol|data:image\/png;base64,/.test(html), 'the HTML holds the chart');
  assert.ok(html.includes('value ± standard error'), 'the HTML holds the results table');
  assert.ok(html.includes(tcText), `the HTML holds Tc as the panel shows it (${tcText})`);
  assert.ok(html.includes('Describes the data'), 'and the verdict');
});
