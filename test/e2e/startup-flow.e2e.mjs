// Light at start-up: until the first analysis, JupyterLab fetches only
// psiscape's plugin wiring (commands, menus, settings) and its stylesheet;
// the parsers, the engine, mathjs and the charts come with the first analysis
// and work then.
import assert from 'node:assert/strict';
import zlib from 'node:zlib';
import { after, before, test } from 'node:test';
import { launch } from './browser.mjs';
import { contextMenu, setWindow, startServer } from './lab.mjs';

/** Budget for psiscape's own files fetched at start-up, gzip-compressed. */
const START_BUDGET_GZIP_BYTES = 40 * 1024;
const EXTENSION_PATH = '/extensions/jupyterlab-psiscape/';

let server;
let browser;
let page;
/** Every psiscape file fetched, in order: { name, bytes, gzipBytes, phase }. */
const fetched = [];
let phase = 'start-up';

before(async () => {
  const started = await startServer();
  server = started.server;
  browser = await launch({ colorScheme: 'light' });
  page = browser.context.pages()[0] ?? (await browser.context.newPage());
  page.on('response', async response => {
    const url = new URL(response.url());
    if (!url.pathname.startsWith(EXTENSION_PATH) || response.status() !== 200) {
      return;
    }
    const at = phase;
    const body = await response.body().catch(() => null);
    if (body) {
      fetched.push({ name: url.pathname.slice(EXTENSION_PATH.length), bytes: body.length, gzipBytes: zlib.gzipSync(body, { level: 9 }).length, phase: at });
    }
  });
  await page.goto(`${started.url}/lab/index.html`);
  await page.waitForSelector('body[data-demo-ready="true"]', { state: 'attached', timeout: 120000 });
  await page.waitForSelector('.jp-Notebook .jp-OutputArea-output table.dataframe', { timeout: 60000 });
  // Let anything started at load finish arriving.
  await page.waitForLoadState('networkidle');
});

after(async () => {
  await browser?.close();
  await new Promise(resolve => (server ? server.close(resolve) : resolve()));
});

test(`at start-up psiscape fetches at most ${START_BUDGET_GZIP_BYTES / 1024} kB (gzip) of its own files`, async () => {
  const atStart = fetched.filter(f => f.phase === 'start-up');
  const total = atStart.reduce((sum, f) => sum + f.gzipBytes, 0);
  console.log(`startup-flow: ${atStart.length} psiscape files at start-up, ${(total / 1024).toFixed(1)} kB gzip: ${atStart.map(f => `${f.name} ${(f.gzipBytes / 1024).toFixed(1)} kB`).join(', ')}`);
  assert.ok(atStart.some(f => f.name.includes('remoteEntry')), 'the extension itself loaded');
  assert.ok(total <= START_BUDGET_GZIP_BYTES, `start-up fetched ${total} bytes gzip (budget ${START_BUDGET_GZIP_BYTES})`);
  assert.ok(!atStart.some(f => f.name.includes('psiscape-workbench')), 'the analysis code waits for the first analysis');
  // The commands are there all the same.
  assert.equal(await page.evaluate(() => window.jupyterapp.commands.label('psiscape:analyse-output')), 'Analyse This Table with psiscape');
});

test('the first analysis loads the analysis code, and a fit runs', async () => {
  phase = 'first analysis';
  const output = page.locator('.jp-Notebook .jp-OutputArea-child', { has: page.locator('table.dataframe') }).first();
  await contextMenu(page, output, 'Analyse This Table with psiscape');
  const panel = page.locator('.jp-psiscape-AnalysisPanel').last();
  await panel.locator('.jp-psiscape-ChartView svg').first().waitFor({ timeout: 60000 });
  await setWindow(panel, '250', '286');
  await panel.locator('button.jp-psiscape-fit-run').click();
  const verdict = panel.locator('.jp-psiscape-FitSection .jp-psiscape-verdict');
  await verdict.waitFor({ timeout: 60000 });
  const later = fetched.filter(f => f.phase === 'first analysis');
  const total = later.reduce((sum, f) => sum + f.gzipBytes, 0);
  console.log(`startup-flow: the first analysis fetched ${later.length} more files, ${(total / 1024).toFixed(0)} kB gzip`);
  assert.ok(later.some(f => f.name.includes('psiscape-workbench')), 'the analysis code loaded with the first analysis');
  assert.match(await verdict.textContent(), /Describes the data/);
});
