// Layouts at every width and the presenter view: an analysis panel 400 px wide
// (fit controls after a Weiss fit with its temperature views, and the isotherm
// controls) where no control is narrower than its content and no text is cut
// off or pushed past the panel's edge, in the light and the dark theme; and the
// presenter view at 1920 × 1080, the panel alone in the main area with its
// chart's axis text at least 18 px and the chart taller than in the panel.
import assert from 'node:assert/strict';
import { test } from 'node:test';
import { contextMenu, screenshot, useDemoLab } from './lab.mjs';

const suite = useDemoLab(async ({ page }) => {
  const output = page.locator('.jp-Notebook .jp-OutputArea-child', { has: page.locator('table.dataframe') }).first();
  await contextMenu(page, output, 'Analyse This Table with psiscape');
  await page.locator('.jp-psiscape-AnalysisPanel .jp-psiscape-ChartView svg').first().waitFor({ timeout: 30000 });
});

async function setTheme(page, name) {
  const light = name === 'JupyterLab Light';
  await page.evaluate(n => window.jupyterapp.commands.execute('apputils:change-theme', { theme: n }), name);
  await page.waitForFunction(l => document.body.dataset.jpThemeLight === String(l), light);
  await page.locator('#jupyterlab-splash').waitFor({ state: 'detached', timeout: 10000 });
}

/** Show `panel` alone (single-document mode, side bars collapsed) and make it `width` px wide by sizing the viewport. */
async function panelWidth(page, panel, width, height = 900) {
  const id = await panel.getAttribute('id');
  await page.evaluate(panelId => {
    const shell = window.jupyterapp.shell;
    shell.mode = 'single-document';
    shell.collapseLeft();
    shell.collapseRight();
    shell.activateById(panelId);
  }, id);
  for (let i = 0; i < 4; i++) {
    const box = await panel.boundingBox();
    const viewport = page.viewportSize();
    if (box && Math.abs(box.width - width) < 1) {
      break;
    }
    await page.setViewportSize({ width: Math.round(viewport.width + width - (box?.width ?? viewport.width)), height });
    await page.waitForTimeout(400);
  }
  return (await panel.boundingBox()).width;
}

/**
 * Every visible control of the panel and every element whose text does not fit:
 * controls whose content is wider than their box (scrollWidth, and a select's
 * chosen option measured in its font), text cut off by overflow, and elements
 * reaching past the panel's right edge outside a scrolling container.
 */
function layoutProblems(panel) {
  const problems = [];
  const controls = [];
  const panelBox = panel.getBoundingClientRect();
  const shown = el => {
    const r = el.getBoundingClientRect();
    return r.width > 0 && r.height > 0 && getComputedStyle(el).visibility !== 'hidden' && el.getClientRects().length > 0;
  };
  const name = el => `${el.tagName.toLowerCase()}.${String(el.className).trim().split(/\s+/).join('.')}${el.textContent && el.tagName !== 'SELECT' ? ` "${el.textContent.trim().slice(0, 40)}"` : ''}`;
  const scroller = el => {
    for (let p = el.parentElement; p && p !== panel; p = p.parentElement) {
      if (['auto', 'scroll'].includes(getComputedStyle(p).overflowX)) {
        return true;
      }
    }
    return false;
  };
  const ctx = document.createElement('canvas').getContext('2d');
  for (const el of panel.querySelectorAll('select, input, button, textarea')) {
    if (!shown(el) || ['checkbox', 'radio', 'range', 'hidden', 'color'].includes(el.type)) {
      continue;
    }
    const box = el.getBoundingClientRect();
    const row = { control: name(el), width: Math.round(box.width), scrollWidth: el.scrollWidth, clientWidth: el.clientWidth };
    controls.push(row);
    if (el.scrollWidth > el.clientWidth + 1) {
      problems.push({ ...row, why: 'content wider than the control' });
    }
    if (el.tagName === 'SELECT') {
      const cs = getComputedStyle(el);
      ctx.font = `${cs.fontWeight} ${cs.fontSize} ${cs.fontFamily}`;
      const text = el.selectedOptions[0]?.textContent ?? '';
      // the chosen option's text, the padding and the drop-down arrow (about 16 px)
      const need = ctx.measureText(text).width + parseFloat(cs.paddingLeft) + parseFloat(cs.paddingRight) + 16;
      if (need > box.width + 1) {
        problems.push({ ...row, need: Math.ceil(need), why: `chosen option "${text}" cut off` });
      }
    }
  }
  for (const el of panel.querySelectorAll('*')) {
    if (el.closest('.jp-psiscape-ChartView') || el.closest('svg') || !shown(el)) {
      continue;
    }
    const cs = getComputedStyle(el);
    const clips = ['hidden', 'clip'].includes(cs.overflowX) || cs.textOverflow === 'ellipsis';
    if (clips && el.scrollWidth > el.clientWidth + 1 && el.textContent.trim() !== '') {
      problems.push({ element: name(el), scrollWidth: el.scrollWidth, clientWidth: el.clientWidth, why: 'text cut off' });
    }
    const box = el.getBoundingClientRect();
    // Text squeezed into a column a few letters wide (a label shrunk to its narrowest).
    const own = [...el.childNodes].filter(n => n.nodeType === Node.TEXT_NODE).map(n => n.textContent.trim()).join(' ');
    if (own.length > 4 && !/\s/.test(own.slice(0, 6)) && box.width < parseFloat(cs.fontSize) * 2.5 && box.height > parseFloat(cs.fontSize) * 3) {
      problems.push({ element: name(el), width: Math.round(box.width), height: Math.round(box.height), why: 'text squeezed into a narrow column' });
    }
    if (box.right > panelBox.right + 1 && !scroller(el)) {
      problems.push({ element: name(el), right: Math.round(box.right), panelRight: Math.round(panelBox.right), why: 'past the panel edge' });
    }
  }
  if (panel.scrollWidth > panel.clientWidth + 1) {
    problems.push({ element: 'the panel', scrollWidth: panel.scrollWidth, clientWidth: panel.clientWidth, why: 'scrolls sideways' });
  }
  return { problems, controls };
}

async function checkLayout(panel, what) {
  const { problems, controls } = await panel.evaluate(layoutProblems);
  assert.ok(controls.length > 0, `${what}: controls found`);
  const narrowest = controls.reduce((a, b) => (a.width <= b.width ? a : b));
  console.log(`${what}: ${controls.length} controls, narrowest ${narrowest.width} px (${narrowest.control}), widest ${Math.max(...controls.map(c => c.width))} px`);
  assert.deepEqual(problems, [], `${what}: ${JSON.stringify(problems, null, 1)}`);
  return controls;
}

test('at 400 px the fit controls, the temperature views and the isotherm controls wrap instead of shrinking, in light and dark', async () => {
  const { page } = suite.lab;
  const panel = page.locator('.jp-psiscape-AnalysisPanel').last();
  const section = panel.locator('.jp-psiscape-FitSection');
  await section.locator('select.jp-psiscape-fit-kind').selectOption('weiss');
  await section.locator('button.jp-psiscape-fit-run').click();
  await section.locator('.jp-psiscape-fit-table').waitFor({ timeout: 60000 });
  const width = await panelWidth(page, panel, 400);
  assert.ok(Math.abs(width - 400) < 2, `panel is ${width} px wide`);
  await page.waitForTimeout(500);
  await checkLayout(panel, 'fit view, light, 400 px');
  await panel.evaluate(n => (n.scrollTop = 0));
  await screenshot(page, 'layout-400-fit-light');
  await setTheme(page, 'JupyterLab Dark');
  await page.waitForTimeout(500);
  await checkLayout(panel, 'fit view, dark, 400 px');
  await screenshot(page, 'layout-400-fit-dark');
  await setTheme(page, 'JupyterLab Light');

  await panel.locator('button.jp-psiscape-mode-isotherms').click();
  const iso = panel.locator('.jp-psiscape-IsothermSection');
  await iso.waitFor({ state: 'visible', timeout: 30000 });
  await page.waitForTimeout(300);
  await checkLayout(panel, 'isotherm view, light, 400 px');
  await screenshot(page, 'layout-400-isotherms-light');
  await panel.locator('button.jp-psiscape-mode-fit').click();
  await page.waitForTimeout(300);
});

test('the presenter view at 1920 × 1080: the panel alone, chart text at least 18 px, the chart grown with the panel', async () => {
  const { page } = suite.lab;
  const panel = page.locator('.jp-psiscape-AnalysisPanel').last();
  const axisText = () =>
    panel.locator('.jp-psiscape-ChartView').first().evaluate(node => {
      const texts = [...node.querySelectorAll('svg .role-axis-label text, svg .role-axis-title text')];
      const sizes = texts.map(t => ({ css: parseFloat(getComputedStyle(t).fontSize), box: t.getBoundingClientRect().height }));
      const svg = node.querySelector('svg').getBoundingClientRect();
      return { count: texts.length, min: Math.min(...sizes.map(s => s.css)), minBox: Math.min(...sizes.map(s => s.box)), width: svg.width, height: svg.height };
    });
  await page.evaluate(() => (window.jupyterapp.shell.mode = 'multiple-document'));
  await page.setViewportSize({ width: 1920, height: 1080 });
  await page.waitForTimeout(500);
  const before = await axisText();
  await page.evaluate(id => window.jupyterapp.shell.activateById(id), await panel.getAttribute('id'));
  await page.evaluate(() => window.jupyterapp.commands.execute('psiscape:present-analysis'));
  await page.waitForFunction(() => document.querySelector('.jp-psiscape-mod-presenting') !== null);
  assert.equal(await page.evaluate(() => window.jupyterapp.shell.mode), 'single-document');
  await page.waitForFunction(() => {
    const t = document.querySelector('.jp-psiscape-mod-presenting .jp-psiscape-ChartView svg .role-axis-label text');
    return t && parseFloat(getComputedStyle(t).fontSize) >= 18;
  }, null, { timeout: 15000 });
  await page.waitForTimeout(500);
  const presented = await axisText();
  const panelBox = await panel.boundingBox();
  console.log(`axis text ${before.min} px (box ${before.minBox.toFixed(1)} px) in the panel, ${presented.min} px (box ${presented.minBox.toFixed(1)} px) presented; chart ${Math.round(before.width)}×${Math.round(before.height)} → ${Math.round(presented.width)}×${Math.round(presented.height)}; panel ${Math.round(panelBox.width)}×${Math.round(panelBox.height)}`);
  assert.ok(presented.count > 0, 'axis labels drawn');
  assert.ok(presented.min >= 18, `axis text ${presented.min} px`);
  assert.ok(presented.minBox >= 18, `axis text boxes ${presented.minBox} px high`);
  assert.ok(panelBox.width > 1800, `the panel fills the main area (${panelBox.width} px)`);
  assert.ok(presented.height > before.height * 1.5, `chart grew from ${before.height} to ${presented.height} px`);
  assert.ok(presented.width > panelBox.width * 0.9, 'the chart takes the panel width');
  // Every picker's control stays inside its own label (nothing runs over the next label).
  const overlaps = await panel.evaluate(node =>
    [...node.querySelectorAll('.jp-psiscape-picker')]
      .filter(l => l.offsetParent !== null)
      .flatMap(l => {
        const box = l.getBoundingClientRect();
        return [...l.querySelectorAll('select, input')].filter(c => c.getBoundingClientRect().right > box.right + 1).map(c => c.className);
      })
  );
  assert.deepEqual(overlaps, [], 'controls running past their labels in the presenter view');
  await panel.evaluate(n => (n.scrollTop = 0));
  await screenshot(page, 'presenter-light');
  await setTheme(page, 'JupyterLab Dark');
  await page.waitForFunction(() => {
    const t = document.querySelector('.jp-psiscape-mod-presenting .jp-psiscape-ChartView svg .role-axis-label text');
    return t && parseFloat(getComputedStyle(t).fontSize) >= 18;
  }, null, { timeout: 15000 });
  await page.waitForTimeout(500);
  await screenshot(page, 'presenter-dark');
  await setTheme(page, 'JupyterLab Light');
  // JupyterLab's Presentation Mode ends nothing it did not start; the command ends the view.
  await page.evaluate(() => window.jupyterapp.commands.execute('psiscape:present-analysis'));
  await page.waitForFunction(() => document.querySelector('.jp-psiscape-mod-presenting') === null);
  assert.equal(await page.evaluate(() => window.jupyterapp.shell.mode), 'multiple-document');
});
