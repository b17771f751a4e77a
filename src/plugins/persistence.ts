/**
 * Saved analyses in notebook metadata: written whenever an analysis changes
 * (the user saves the notebook as usual), read back when a notebook opens.
 * The metadata is written only when its value actually changes, and a block
 * this psiscape cannot read (unreadable, or written by a newer psiscape) is
 * never written over or removed.
 */
import { Dialog, Notification, showDialog } from '@jupyterlab/apputils';
import type { NotebookPanel } from '@jupyterlab/notebook';
import type { TranslationBundle } from '@jupyterlab/translation';
import type { ReadonlyPartialJSONValue } from '@lumino/coreutils';
import { Widget } from '@lumino/widgets';
import type { ICoreMessage } from '../core/messages';
import { messageText } from '../core/messages';
import { readSaved, readSavedExplorers, removeExplorer, removeSaved, SAVED_KEY, upsertExplorer, upsertSaved } from '../core/saved';
import type { ISavedAnalysis, ISavedExplorer, ISavedExplorersRead, ISavedRead, SavedWriteResult } from '../core/saved';
import { translateMessage } from '../ui/translate';

/** The analyses a notebook holds, what could not be read, and whether the block may be written. */
export function savedAnalysesOf(notebook: NotebookPanel): ISavedRead {
  return readSaved(notebook.content.model?.getMetadata(SAVED_KEY));
}

/** Apply a write result: set (or, for undefined, delete) the key only when the value changed. */
function apply(notebook: NotebookPanel, result: SavedWriteResult): ICoreMessage | null {
  if ('blocked' in result) {
    return result.blocked;
  }
  const model = notebook.content.model;
  if (!model || !result.changed) {
    return null;
  }
  if (result.value === undefined) {
    model.deleteMetadata(SAVED_KEY);
  } else {
    model.setMetadata(SAVED_KEY, result.value as ReadonlyPartialJSONValue);
  }
  return null;
}

/**
 * Add or replace one analysis in the notebook's metadata. Entries and fields
 * this psiscape does not know are kept as they are.
 *
 * @returns null when saved (or nothing changed), else why nothing was written
 * (for the caller to show).
 */
export function upsertAnalysis(notebook: NotebookPanel, entry: ISavedAnalysis): ICoreMessage | null {
  const model = notebook.content.model;
  return model ? apply(notebook, upsertSaved(model.getMetadata(SAVED_KEY), entry)) : null;
}

/**
 * Remove one analysis from the notebook's metadata. Entries this psiscape
 * cannot read and fields it does not know stay; the key is deleted only when
 * nothing at all is left in it.
 *
 * @returns null when removed (or not there), else why nothing was written.
 */
export function removeAnalysis(notebook: NotebookPanel, id: string): ICoreMessage | null {
  const model = notebook.content.model;
  return model ? apply(notebook, removeSaved(model.getMetadata(SAVED_KEY), id)) : null;
}

/** The Landau explorers a notebook holds, and what could not be read. */
export function savedExplorersOf(notebook: NotebookPanel): ISavedExplorersRead {
  return readSavedExplorers(notebook.content.model?.getMetadata(SAVED_KEY));
}

/**
 * Add or replace one Landau explorer's scenario in the notebook's metadata,
 * keeping everything else.
 *
 * @returns null when saved (or nothing changed), else why nothing was written.
 */
export function upsertExplorerIn(notebook: NotebookPanel, entry: ISavedExplorer): ICoreMessage | null {
  const model = notebook.content.model;
  return model ? apply(notebook, upsertExplorer(model.getMetadata(SAVED_KEY), entry)) : null;
}

/** Remove one Landau explorer from the notebook's metadata, keeping everything else. */
export function removeExplorerFrom(notebook: NotebookPanel, id: string): ICoreMessage | null {
  const model = notebook.content.model;
  return model ? apply(notebook, removeExplorer(model.getMetadata(SAVED_KEY), id)) : null;
}

/**
 * Show problems with a notebook's saved analyses as one warning: the first
 * problem in the notification (which shows about 140 characters), all of them
 * behind its "Details" button, and in the browser console.
 */
export function notifyProblems(trans: TranslationBundle, problems: readonly ICoreMessage[], notebookPath: string): void {
  if (problems.length === 0) {
    return;
  }
  const lines = problems.map(p => translateMessage(trans, p));
  console.warn(`psiscape: ${notebookPath}: ${problems.map(messageText).join(' ')}`);
  const message =
    problems.length === 1
      ? trans.__('%1: %2', notebookPath, lines[0])
      : trans.__('%1: %2 problems with the saved psiscape analyses, the first: %3', notebookPath, problems.length, lines[0]);
  Notification.warning(message, {
    autoClose: false,
    actions: [
      {
        label: trans.__('Details'),
        caption: trans.__('Show every problem with the saved psiscape analyses of this notebook'),
        callback: () => {
          const body = document.createElement('ul');
          for (const line of lines) {
            const item = document.createElement('li');
            item.textContent = line;
            body.appendChild(item);
          }
          void showDialog({
            title: trans.__('Saved psiscape analyses in %1', notebookPath),
            body: new Widget({ node: body }),
            buttons: [Dialog.okButton({ label: trans.__('Close') })]
          });
        }
      }
    ]
  });
}
