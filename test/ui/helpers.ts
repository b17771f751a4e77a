/**
 * Panels for UI tests: a real AnalysisPanel over a real AnalysisSession,
 * attached to the document, with jobs run on the main thread (jsdom has no
 * Web Worker).
 */
import { nullTranslator } from '@jupyterlab/translation';
import { Widget } from '@lumino/widgets';
import { vi } from 'vitest';
import { AnalysisSession } from '../../src/core/analysis/session';
import type { ParseResult } from '../../src/core/table';
import { AnalysisPanel } from '../../src/ui/analysis-panel';
import { AnalysisRunner } from '../../src/ui/analysis-runner';
import { weissMagnetisation } from '../../src/core/physics/weiss';
import type { IExportHost } from '../../src/ui/export-bar';

/** An attached panel showing `parse`, with a spy for "Show source cell". */
export function panelFor(parse: ParseResult, options: { onRevealSource?: () => void; workerFactory?: () => null; exports?: IExportHost } = {}) {
  const session = new AnalysisSession({ id: 't1', source: { notebookPath: 'sample.ipynb', cellId: 'c', outputIndex: 0, contentHash: 'h' } });
  session.setParse(parse);
  const onRevealSource = options.onRevealSource ?? vi.fn();
  const panel = new AnalysisPanel({
    session,
    notebookName: 'sample.ipynb',
    sourceLabel: 'sample.ipynb · cell 2 · output 1',
    pointSize: 30,
    translator: nullTranslator,
    onRevealSource,
    runner: new AnalysisRunner({ workerFactory: options.workerFactory ?? (() => null) }),
    exports: options.exports
  });
  Widget.attach(panel, document.body);
  return { panel, session, onRevealSource };
}

/** Choose an option of a <select> as the user does. */
export function choose(select: HTMLSelectElement, value: string): void {
  select.value = value;
  select.dispatchEvent(new Event('change'));
}

/** Type into a text field and leave it, as the user does. */
export function type(input: HTMLInputElement, text: string): void {
  input.value = text;
  input.dispatchEvent(new Event('change'));
}

/** A spin-½ Weiss M(T) table with σ, as CSV. */
export function weissCsv(): string {
  // Spin-½ Weiss curve (REFERENCE.md B1) with a deterministic ±0.3 wiggle standing in for noise.
  const rows = ['T (K),M (emu/g),sigma_M (emu/g)'];
  const T = Array.from({ length: 60 }, (_, i) => 20 + 5 * i);
  const m = weissMagnetisation(0.5, T.map(t => t / 250));
  T.forEach((t, i) => rows.push(`${t},${(80 * m[i] + 0.3 * Math.sin(7 * i)).toFixed(5)},0.3`));
  return rows.join('\n');
}
