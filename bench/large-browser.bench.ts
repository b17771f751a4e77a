/**
 * Large tables as a user meets them, measured in Debian's Chromium against
 * the built demo lab (never a test):
 *   - a notebook output holding a 200 000-row table → analysis panel with its chart drawn;
 *   - a fit of it, then the analysis saved into the notebook (metadata write and notebook save);
 *   - a 1 000 000-row CSV file → analysis panel with its chart drawn (read, parse, draw).
 * Each with the longest main-thread task seen while it ran (long-task observer).
 *
 *   npm run bench -- --only large-browser
 */
import { writeFileSync } from 'node:fs';
import { jsonPartArg, openBenchLab } from './browserLab';

/** Page source: start collecting long tasks. */
const OBSERVE = `(() => {
  window.__lt = [];
  window.__ltObserver?.disconnect();
  window.__ltObserver = new PerformanceObserver(list => { for (const e of list.getEntries()) window.__lt.push(e.duration); });
  window.__ltObserver.observe({ type: 'longtask' });
})()`;
const LONGEST = `Math.max(0, ...window.__lt)`;

/** Page source: a CSV of n rows of a mean-field-like M(T) (an invented scenario). */
const csvSource = (n: number) => `(() => {
  const rows = ['T (K),M (emu/g)'];
  for (let i = 0; i < ${n}; i++) {
    const T = 20 + (260 * i) / ${n - 1};
    const m = Math.sqrt(Math.max(0, 1 - (T / 287.4) ** 2));
    rows.push(T.toFixed(5) + ',' + (92 * m + 0.3 * Math.sin(i)).toFixed(5));
  }
  return rows.join('\\n');
})()`;

async function timed<T>(run: () => Promise<T>): Promise<{ ms: number; value: T }> {
  const t0 = Date.now();
  const value = await run();
  return { ms: Date.now() - t0, value };
}

async function main(): Promise<void> {
  const jsonPart = jsonPartArg();
  const lab = await openBenchLab();
  const { page } = lab;
  const figures: Record<string, { ms: number; longestTaskMs: number }> = {};
  const chartDrawn = (panels: number) =>
    page.waitForFunction(
      `(() => { const p = document.querySelectorAll('.jp-psiscape-AnalysisPanel'); if (p.length <= ${panels}) return false;
        const last = p[p.length - 1]; return last.querySelector('.jp-psiscape-ChartView canvas, .jp-psiscape-ChartView svg .mark-symbol') !== null; })()`,
      undefined,
      { timeout: 180000 }
    );
  try {
    // 1. A notebook whose output holds 200 000 rows.
    await page.evaluate(`(async () => {
      const text = ${csvSource(200000)};
      const nb = { nbformat: 4, nbformat_minor: 5, metadata: {}, cells: [
        { id: 'big-cell', cell_type: 'code', source: 'big_table', metadata: {}, execution_count: 1,
          outputs: [{ output_type: 'execute_result', execution_count: 1, metadata: {}, data: { 'text/csv': text, 'text/plain': '200000 rows' } }] }] };
      await window.jupyterapp.serviceManager.contents.save('large-output.ipynb', { type: 'notebook', format: 'json', content: nb });
      await window.jupyterapp.commands.execute('docmanager:open', { path: 'large-output.ipynb' });
    })()`);
    await page.waitForFunction(`Array.from(window.jupyterapp.shell.widgets('main')).some(w => w.context?.path === 'large-output.ipynb' && w.context.isReady)`, undefined, { timeout: 120000 });
    let panels = await page.locator('.jp-psiscape-AnalysisPanel').count();
    await page.evaluate(OBSERVE);
    const table = await timed(async () => {
      await page.evaluate(`(async () => {
        const nb = Array.from(window.jupyterapp.shell.widgets('main')).find(w => w.context?.path === 'large-output.ipynb');
        window.jupyterapp.shell.activateById(nb.id);
        nb.content.activeCellIndex = 0;
        await window.jupyterapp.commands.execute('psiscape:analyse-selected-cell');
      })()`);
      await chartDrawn(panels);
    });
    figures['200k-row output → chart drawn'] = { ms: table.ms, longestTaskMs: await page.evaluate<number>(LONGEST) };

    const panel = page.locator('.jp-psiscape-AnalysisPanel').last();
    await panel.locator('select.jp-psiscape-fit-kind').selectOption('power-law');
    await panel.locator('input.jp-psiscape-fit-min').fill('200');
    await panel.locator('input.jp-psiscape-fit-min').press('Tab');
    await page.evaluate(OBSERVE);
    const fit = await timed(async () => {
      await panel.locator('button.jp-psiscape-fit-run').click();
      await panel.locator('.jp-psiscape-verdict').waitFor({ timeout: 180000 });
    });
    figures['200k-row fit → verdict drawn'] = { ms: fit.ms, longestTaskMs: await page.evaluate<number>(LONGEST) };
    await page.evaluate(OBSERVE);
    const save = await timed(async () => {
      // The session's save is debounced; wait for the metadata, then save the notebook.
      await page.waitForFunction(
        `(() => { const nb = Array.from(window.jupyterapp.shell.widgets('main')).find(w => w.context?.path === 'large-output.ipynb'); return !!nb.context.model.getMetadata('psiscape'); })()`,
        undefined,
        { timeout: 30000 }
      );
      await page.evaluate(`(async () => {
        const nb = Array.from(window.jupyterapp.shell.widgets('main')).find(w => w.context?.path === 'large-output.ipynb');
        await nb.context.save();
      })()`);
    });
    const savedSize = await page.evaluate<number>(`(() => {
      const nb = Array.from(window.jupyterapp.shell.widgets('main')).find(w => w.context?.path === 'large-output.ipynb');
      return JSON.stringify(nb.context.model.getMetadata('psiscape')).length;
    })()`);
    figures['saving the 200k-row analysis (metadata + notebook save)'] = { ms: save.ms, longestTaskMs: await page.evaluate<number>(LONGEST) };

    // 2. A 1 000 000-row CSV file.
    await page.evaluate(`(async () => {
      await window.jupyterapp.serviceManager.contents.save('million.csv', { type: 'file', format: 'text', content: ${csvSource(1000000)} });
    })()`);
    panels = await page.locator('.jp-psiscape-AnalysisPanel').count();
    await page.evaluate(OBSERVE);
    const million = await timed(async () => {
      await page.evaluate(`window.jupyterapp.commands.execute('psiscape:analyse-file', { path: 'million.csv' })`);
      await chartDrawn(panels);
    });
    figures['1e6-row CSV file → read, parsed, chart drawn'] = { ms: million.ms, longestTaskMs: await page.evaluate<number>(LONGEST) };

    console.log('psiscape with large tables, in Chromium (demo lab, this machine)');
    for (const [name, f] of Object.entries(figures)) {
      console.log(`  ${name.padEnd(58)} ${String(f.ms).padStart(6)} ms   longest main-thread task ${Math.round(f.longestTaskMs)} ms`);
    }
    console.log(`  saved psiscape metadata for the 200k-row analysis: ${(savedSize / 1024).toFixed(1)} kB`);
    if (jsonPart) {
      writeFileSync(jsonPart, JSON.stringify({ figures, savedMetadataBytes: savedSize }, null, 2));
    }
  } finally {
    await lab.close();
  }
}

main().catch(error => {
  console.error(error);
  process.exit(1);
});
