// A notebook edited by hand to hold malformed and hostile saved analyses —
// script in strings, wrong types, a million-entry array — opens without
// running anything, says what it skipped, opens the one good analysis, and
// keeps every bad entry exactly as it was, in place, when psiscape saves.
import assert from 'node:assert/strict';
import { test } from 'node:test';
import { screenshot, useDemoLab } from './lab.mjs';

const suite = useDemoLab();
const NAME = 'edited-by-hand.ipynb';

const good = {
  id: 'good',
  source: { notebookPath: NAME, cellId: 'cell-3', outputIndex: 0, contentHash: 'unknown' },
  columns: { x: { index: 1, header: 'T (K)' }, y: { index: 2, header: 'M (emu/g)' }, sigma: null },
  snapshot: { headers: ['T (K)', 'M (emu/g)'], units: ['K', 'emu/g'], values: [[20, 100, 200, 280], [92, 91, 76, 30]] },
  settings: { kind: 'weiss', options: { J: 0.5 }, window: { min: null, max: null } }
};
const hostile = [
  // Script in every string the entry has.
  {
    id: '<img src=x onerror="window.__pwned=1">',
    source: { notebookPath: '<script>window.__pwned=2</script>', cellId: 'javascript:window.__pwned=3', outputIndex: 0, contentHash: '"><svg onload=window.__pwned=4>' },
    columns: { x: { index: 1, header: '<b onmouseover=window.__pwned=5>T</b>' }, y: { index: 2, header: 'M' }, sigma: null },
    snapshot: { headers: ['<script>window.__pwned=6</script>', 'M'], units: [null, null], values: [[1, 2], [3, 4]] },
    settings: { kind: '<script>window.__pwned=7</script>', options: {}, window: { min: null, max: null } }
  },
  // Wrong types.
  { id: 42, source: 'cell 3', columns: [], snapshot: null, settings: { kind: 'weiss', options: 'J=1/2', window: 7 } },
  // A million entries where four are expected.
  { ...good, id: 'huge', snapshot: { headers: ['T (K)', 'M (emu/g)'], units: ['K', 'emu/g'], values: [new Array(1_000_000).fill(1), [1]] } }
];

test('hostile saved analyses are skipped with a message, run nothing, and survive a save unchanged', async () => {
  const { page } = suite.lab;
  const block = { version: 2, analyses: [hostile[0], good, hostile[1], hostile[2]], comment: '<script>window.__pwned=8</script>' };
  await page.evaluate(
    async ({ name, block }) => {
      const contents = window.jupyterapp.serviceManager.contents;
      const demo = await contents.get('am17-demo.ipynb', { content: true });
      const nb = JSON.parse(JSON.stringify(demo.content));
      nb.metadata.psiscape = block;
      await contents.save(name, { type: 'notebook', format: 'json', content: nb });
    },
    { name: NAME, block }
  );
  await page.evaluate(name => window.jupyterapp.commands.execute('docmanager:open', { path: name }).then(() => null), NAME);
  // The good analysis opens; the user is told which entries were skipped and why.
  const panel = page.locator('.jp-psiscape-AnalysisPanel', { has: page.locator('select.jp-psiscape-fit-kind') }).last();
  await panel.locator('.jp-psiscape-verdict').waitFor({ timeout: 60000 });
  const toast = page.locator('.Toastify__toast', { hasText: NAME }).first();
  await toast.waitFor({ timeout: 15000 });
  assert.match(await toast.textContent(), /3 problems with the saved psiscape analyses/);
  assert.equal(await page.evaluate(() => window.__pwned ?? null), null, 'nothing from the notebook ran');
  assert.equal(await page.locator('.jp-psiscape-AnalysisPanel img, .jp-psiscape-AnalysisPanel script').count(), 0);
  await screenshot(page, 'hostile-metadata-light');

  // Fit the good analysis again (a change psiscape saves), then save the notebook.
  await panel.locator('button.jp-psiscape-fit-run').click();
  await page.waitForTimeout(1000);
  await page.evaluate(name => {
    const nb = Array.from(window.jupyterapp.shell.widgets('main')).find(w => w.context?.path === name);
    return nb.context.save();
  }, NAME);
  const stored = await page.evaluate(async name => {
    const model = await window.jupyterapp.serviceManager.contents.get(name, { content: true });
    return model.content.metadata.psiscape;
  }, NAME);
  assert.equal(stored.analyses.length, 4, 'no entry added or removed');
  assert.equal(JSON.stringify(stored.analyses[0]), JSON.stringify(hostile[0]), 'the script-laden entry is unchanged, in place');
  assert.equal(JSON.stringify(stored.analyses[2]), JSON.stringify(hostile[1]), 'the wrongly typed entry is unchanged, in place');
  assert.equal(stored.analyses[3].snapshot.values[0].length, 1_000_000, 'the million-entry array is kept whole');
  assert.equal(JSON.stringify(stored.analyses[3]), JSON.stringify(hostile[2]));
  assert.equal(stored.comment, block.comment, 'unknown fields are kept');
  assert.equal(stored.analyses[1].id, 'good');
  assert.equal(await page.evaluate(() => window.__pwned ?? null), null);
});
