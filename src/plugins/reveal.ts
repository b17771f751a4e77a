/**
 * Brings a notebook cell into view: activates the notebook tab, selects the
 * cell and scrolls to it.
 */
import type { JupyterFrontEnd } from '@jupyterlab/application';
import type { INotebookTracker } from '@jupyterlab/notebook';

/**
 * Select and scroll to the cell with id `cellId` in the notebook at `path`.
 *
 * @returns true when the cell was found.
 */
export async function revealCell(app: JupyterFrontEnd, tracker: INotebookTracker, path: string, cellId: string): Promise<boolean> {
  const panel = tracker.find(p => p.context.path === path);
  if (!panel) {
    return false;
  }
  app.shell.activateById(panel.id);
  const notebook = panel.content;
  const index = notebook.widgets.findIndex(c => c.model.id === cellId);
  if (index < 0) {
    return false;
  }
  notebook.deselectAll();
  notebook.activeCellIndex = index;
  await notebook.scrollToCell(notebook.widgets[index], 'center');
  notebook.activeCell?.node.focus();
  return true;
}
