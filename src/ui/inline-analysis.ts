/**
 * psiscape's own output, live in the notebook: an analysis inserted into a
 * notebook (application/vnd.psiscape.analysis.v1+json) drawn as a working
 * analysis — chart, fit controls (model, window, options) and the result
 * with its verdict — refitted in the browser, without a kernel.
 *
 * The payload is untrusted (anyone can edit a notebook): the analysis is read
 * through the saved-format reader, which validates it against
 * schema/saved-analyses.v2.json, and only its numbers, headers and settings
 * are used. Nothing in it is ever inserted as HTML or run; the chart is built
 * by psiscape's own spec builders from the validated numbers.
 */
import type { ITranslator, TranslationBundle } from '@jupyterlab/translation';
import type { Panel } from '@lumino/widgets';
import { Widget } from '@lumino/widgets';
import { AnalysisSession } from '../core/analysis/session';
import { msg } from '../core/messages';
import type { ICoreMessage } from '../core/messages';
import { readSaved } from '../core/saved';
import { AnalysisPanel } from './analysis-panel';
import { AnalysisRunner } from './analysis-runner';
import { translateMessage } from './translate';

/** The payload fields psiscape reads; everything else in it is ignored. */
interface IPayload {
  format?: unknown;
  version?: unknown;
  part?: unknown;
  analysis?: unknown;
}

/** Why a payload cannot be drawn, or the analysis it holds. */
export function readPayload(data: unknown): { part: 'chart' } | { part: 'analysis'; saved: NonNullable<ReturnType<typeof readSaved>['analyses'][number]> } | { problem: ICoreMessage; details: ICoreMessage[] } {
  const p = (data !== null && typeof data === 'object' && !Array.isArray(data) ? data : {}) as IPayload;
  if (p.format !== 'psiscape-analysis' || p.version !== 1) {
    return { problem: msg('inline.unknown-format', 'This output is not a psiscape analysis this version can read (format %1, version %2).', String(p.format).slice(0, 40), String(p.version).slice(0, 20)), details: [] };
  }
  if (p.part === 'chart') {
    return { part: 'chart' };
  }
  const read = readSaved({ version: 2, analyses: [p.analysis] });
  if (read.analyses.length === 1) {
    return { part: 'analysis', saved: read.analyses[0] };
  }
  return { problem: msg('inline.unreadable', 'The analysis in this output could not be read; nothing of it was used.'), details: read.problems.slice(0, 5) };
}

/** Draw the payload into `host` (an output's renderer widget), replacing what was there. */
export function renderInlineAnalysis(host: Panel, data: unknown, translator: ITranslator): void {
  const trans: TranslationBundle = translator.load('jupyterlab_psiscape');
  for (const child of [...host.widgets]) {
    child.dispose();
  }
  const read = readPayload(data);
  if ('problem' in read) {
    host.addWidget(note(trans, [read.problem, ...read.details].map(m => translateMessage(trans, m)).join(' '), 'jp-psiscape-inline-problem'));
    return;
  }
  if (read.part === 'chart') {
    host.addWidget(note(trans, trans.__('psiscape draws this analysis live in the next output.'), 'jp-psiscape-inline-chart-note'));
    return;
  }
  const saved = read.saved;
  const session = new AnalysisSession({ id: saved.id, source: null });
  const restored = session.restore(saved, null, msg('inline.snapshot-note', 'Data saved in this output (the plotted columns).'));
  const panel = new AnalysisPanel({
    session,
    notebookName: saved.source.notebookPath.split('/').pop() ?? saved.source.notebookPath,
    sourceLabel: trans.__('psiscape analysis saved in this notebook: fits run in your browser; changes here are not saved'),
    pointSize: 30,
    translator,
    runner: new AnalysisRunner()
  });
  panel.addClass('jp-psiscape-mod-inline');
  // Outputs are not among the lab's panels: follow theme changes here (the
  // lab marks the theme on the body), once the new CSS variables apply.
  const themeWatch = new MutationObserver(() => requestAnimationFrame(() => panel.isDisposed || panel.redraw()));
  themeWatch.observe(document.body, { attributes: true, attributeFilter: ['data-jp-theme-name'] });
  panel.disposed.connect(() => {
    themeWatch.disconnect();
    session.dispose();
  });
  host.addWidget(panel);
  if (restored.runFit) {
    void panel.fitSection.runFit();
  }
}

function note(trans: TranslationBundle, text: string, cls: string): Widget {
  const w = new Widget();
  w.addClass('jp-psiscape-inline-note');
  w.addClass(cls);
  w.node.textContent = text;
  w.node.setAttribute('aria-label', trans.__('psiscape output'));
  return w;
}
