// Helpers shared by the end-to-end tests: serve the demo lab, open it, and
// reach JupyterLab objects through the page.
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { after, before } from 'node:test';
import { serve } from '../../demo/serve.mjs';
import { launch } from './browser.mjs';

const here = path.dirname(fileURLToPath(import.meta.url));
export const root = path.resolve(here, '..', '..');
export const shotsDir = path.join(root, 'test-results', 'screenshots');
/** The README's user guide pictures: rewritten by the tests that take them, so they stay current. */
export const guideDir = path.join(root, 'docs', 'guide');

/** Serve demo/dist on a free loopback port. */
export async function startServer() {
  const server = await serve({ root: path.join(root, 'demo', 'dist'), host: '127.0.0.1', port: 0 });
  const { port } = server.address();
  return { server, url: `http://127.0.0.1:${port}` };
}

/** Open the demo lab in a fresh browser profile and wait for the demo notebook. */
export async function openLab(baseUrl, { colorScheme = 'light' } = {}) {
  const browser = await launch({ colorScheme });
  const page = browser.context.pages()[0] ?? (await browser.context.newPage());
  const errors = [];
  page.on('pageerror', e => errors.push(String(e)));
  await page.goto(`${baseUrl}/lab/index.html`);
  await page.waitForSelector('body[data-demo-ready="true"]', { state: 'attached', timeout: 120000 });
  await page.waitForSelector('.jp-Notebook .jp-OutputArea-output table.dataframe', { timeout: 60000 });
  return { browser, page, errors };
}

/**
 * Write a screenshot to the git-ignored results folder and return its path.
 * With `guide`, the same view also becomes docs/guide/<guide>.png (without
 * notification toasts), one of the README's user-guide pictures.
 */
export async function screenshot(page, name, { guide } = {}) {
  fs.mkdirSync(shotsDir, { recursive: true });
  const file = path.join(shotsDir, `${name}.png`);
  await page.screenshot({ path: file });
  if (guide) {
    // The guide's picture without the notification toasts a test may have left.
    fs.mkdirSync(guideDir, { recursive: true });
    await page.screenshot({ path: path.join(guideDir, `${guide}.png`), style: '.Toastify { display: none !important; }' });
  }
  return file;
}

/** Switch to the dark theme, wait for `ready`, take a screenshot (as `screenshot` does), and switch back. */
export async function darkScreenshot(page, name, ready, options = {}) {
  const theme = t => page.evaluate(n => window.jupyterapp.commands.execute('apputils:change-theme', { theme: n }), t);
  await theme('JupyterLab Dark');
  await page.waitForFunction(() => document.body.dataset.jpThemeLight === 'false');
  // the theme switch shows a splash screen for a moment
  await page.locator('#jupyterlab-splash').waitFor({ state: 'detached', timeout: 10000 });
  await ready();
  await screenshot(page, name, options);
  await theme('JupyterLab Light');
  await page.waitForFunction(() => document.body.dataset.jpThemeLight === 'true');
  await page.locator('#jupyterlab-splash').waitFor({ state: 'detached', timeout: 10000 });
}

/** Wait until the chart in `chart` (a locator) has drawn marks: SVG mark elements, or a canvas. */
export async function drawn(chart) {
  await chart.waitFor({ timeout: 30000 });
  await chart.evaluate(
    node =>
      new Promise((resolve, reject) => {
        const started = Date.now();
        const check = () => {
          if (node.querySelector('canvas') || node.querySelectorAll('svg g.role-mark > *').length > 0) {
            resolve(true);
          } else if (Date.now() - started > 30000) {
            reject(new Error('no marks drawn'));
          } else {
            setTimeout(check, 50);
          }
        };
        check();
      })
  );
  return chart;
}

/** Save the demo notebook (to the browser's storage), reload the page and wait for the lab. */
export async function saveAndReload(page) {
  await page.locator('.jp-NotebookPanel').first().click({ position: { x: 200, y: 10 } });
  await page.evaluate(() => window.jupyterapp.commands.execute('docmanager:save'));
  await page.waitForFunction(() => !document.querySelector('.jp-NotebookPanel .jp-mod-dirty, .lm-TabBar-tab.jp-mod-dirty'));
  await page.reload();
  await page.waitForSelector('body[data-demo-ready="true"]', { state: 'attached', timeout: 120000 });
}

/** Set a fit section's window fields as a user does: type, then leave the field. Empty means the data's end. */
export async function setWindow(section, min, max) {
  for (const [cls, value] of [['jp-psiscape-fit-min', min], ['jp-psiscape-fit-max', max]]) {
    if (value === undefined) {
      continue;
    }
    await section.locator(`input.${cls}`).fill(value);
    await section.locator(`input.${cls}`).press('Tab');
  }
}

/** Right-click an element and choose a context-menu entry by its label. */
export async function contextMenu(page, locator, label) {
  await locator.scrollIntoViewIfNeeded();
  await locator.click({ button: 'right' });
  const item = page.locator('.lm-Menu-item', { hasText: label });
  await item.first().waitFor({ timeout: 10000 });
  await item.first().click();
}

/**
 * For a test file: serve the demo lab and open it in a fresh browser before
 * its tests (then run `afterOpen`, if given), close both after them.
 *
 * @returns {{ lab: Awaited<ReturnType<typeof openLab>> | null }} filled in once `before` has run
 */
export function useDemoLab(afterOpen) {
  const suite = { lab: null };
  let server = null;
  before(async () => {
    const started = await startServer();
    server = started.server;
    suite.lab = await openLab(started.url);
    if (afterOpen) {
      await afterOpen(suite.lab);
    }
  });
  after(async () => {
    await suite.lab?.browser.close();
    await new Promise(resolve => (server ? server.close(resolve) : resolve()));
  });
  return suite;
}
