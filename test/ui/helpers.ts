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
