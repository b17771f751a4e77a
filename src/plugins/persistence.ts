/**
 * Saved analyses in notebook metadata: written whenever an analysis changes
 * (the user saves the notebook as usual), read back when a notebook opens.
 */
import type { NotebookPanel } from '@jupyterlab/notebook';
import type { ReadonlyPartialJSONValue } from '@lumino/coreutils';
import { readSavedAnalyses, SAVED_KEY, SAVED_VERSION, toJsonSafe } from '../core/saved';
import type { ISavedAnalysis } from '../core/saved';

/** The analyses a notebook holds, and descriptions of entries that could not be read. */
export function savedAnalysesOf(notebook: NotebookPanel): { analyses: ISavedAnalysis[]; problems: string[] } {
  return readSavedAnalyses(notebook.content.model?.getMetadata(SAVED_KEY));
}

function write(notebook: NotebookPanel, analyses: ISavedAnalysis[]): void {
  const model = notebook.content.model;
  if (!model) {
    return;
  }
  if (analyses.length === 0) {
    model.deleteMetadata(SAVED_KEY);
    return;
  }
  model.setMetadata(SAVED_KEY, toJsonSafe({ version: SAVED_VERSION, analyses }) as ReadonlyPartialJSONValue);
}

/**
 * Add or replace one analysis. Entries this psiscape could not read are left
 * untouched only when the metadata as a whole was unreadable (then nothing is
 * written, so nothing is lost); unreadable single entries are dropped once a
 * readable analysis is saved next to them.
 *
 * @returns false when the notebook's metadata is unreadable and was left alone.
 */
export function upsertAnalysis(notebook: NotebookPanel, entry: ISavedAnalysis): boolean {
  const raw = notebook.content.model?.getMetadata(SAVED_KEY);
  const { analyses, problems } = readSavedAnalyses(raw);
  if (raw !== undefined && analyses.length === 0 && problems.length > 0) {
    return false;
  }
  const i = analyses.findIndex(a => a.id === entry.id);
  const same = (a: ISavedAnalysis) =>
    JSON.stringify(toJsonSafe({ version: SAVED_VERSION, analyses: [a] })) === JSON.stringify(toJsonSafe({ version: SAVED_VERSION, analyses: [entry] }));
  if (i >= 0 && same(analyses[i])) {
    // Unchanged: leave the notebook clean.
    return true;
  }
  if (i >= 0) {
    analyses[i] = entry;
  } else {
    analyses.push(entry);
  }
  write(notebook, analyses);
  return true;
}

/** Remove one analysis from the notebook. */
export function removeAnalysis(notebook: NotebookPanel, id: string): void {
  const { analyses } = savedAnalysesOf(notebook);
  write(notebook, analyses.filter(a => a.id !== id));
}
