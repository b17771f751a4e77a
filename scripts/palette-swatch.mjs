#!/usr/bin/env node
// Draws psiscape's chart palette (src/charts/theme.ts)
// as swatches on a light and a dark background, with each series colour's
// contrast ratio against its background, into docs/guide/palette.png.
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { launch } from '../test/e2e/browser.mjs';
import { transformSync } from 'esbuild';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const out = path.join(root, 'docs', 'guide', 'palette.png');
// theme.ts imports types only, so its JavaScript stands alone.
const source = transformSync(fs.readFileSync(path.join(root, 'src', 'charts', 'theme.ts'), 'utf8'), { loader: 'ts', format: 'esm' }).code;
const { contrastRatio, PALETTE } = await import(`data:text/javascript;base64,${Buffer.from(source).toString('base64')}`);

const ramp = colours => `<div class="ramp" style="background: linear-gradient(to right, ${colours.join(', ')})"></div>`;
const side = (name, set, bg, fg) => `
  <section style="background: ${bg}; color: ${fg}">
    <h2>${name} background</h2>
    <div class="row">${set.categorical
      .map(c => `<figure><div class="chip" style="background: ${c}"></div><svg width="64" height="22"><path d="M2 18 L22 6 L42 14 L62 4" stroke="${c}" stroke-width="3" fill="none"/></svg><figcaption>${c}<br>${contrastRatio(c, bg).toFixed(1)}:1</figcaption></figure>`)
      .join('')}</div>
    <p>sequential (low → high)</p>${ramp(set.sequential)}
    <p>diverging (−1 → 0 → +1)</p>${ramp(set.diverging)}
  </section>`;
const html = `<!doctype html><meta charset="utf-8"><style>
  body { margin: 0; font: 13px/1.3 'DejaVu Sans', sans-serif; }
  main { display: inline-flex; }
  section { padding: 14px 18px; width: 520px; }
  h2 { font-size: 15px; margin: 0 0 10px; }
  .row { display: flex; gap: 12px; }
  figure { margin: 0; text-align: center; font-family: 'DejaVu Sans Mono', monospace; font-size: 11px; }
  .chip { width: 64px; height: 28px; border-radius: 3px; }
  .ramp { height: 22px; border-radius: 3px; }
  p { margin: 12px 0 4px; }
</style><body><main>${side('light', PALETTE.light, '#ffffff', 'rgba(0, 0, 0, 0.87)')}${side('dark', PALETTE.dark, '#111111', 'rgba(255, 255, 255, 0.87)')}</main></body>`;

const browser = await launch();
try {
  const page = browser.context.pages()[0] ?? (await browser.context.newPage());
  await page.setContent(html);
  await page.locator('main').screenshot({ path: out });
  console.log(`wrote ${path.relative(root, out)}`);
} finally {
  await browser.close();
}
