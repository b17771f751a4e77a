/**
 * Finds notebook outputs: the one under a context-menu click, or the first
 * table-bearing output of the active cell, as (panel, cell, output index).
 */
import type { Cell, ICodeCellModel } from '@jupyterlab/cells';
import type { INotebookTracker, NotebookPanel } from '@jupyterlab/notebook';

/** One output of one cell of an open notebook. */
export interface ILocatedOutput {
  panel: NotebookPanel;
  cell: Cell;
  /** 0-based position of the cell in the notebook. */
  cellIndex: number;
  /** 0-based position of the output among the cell's outputs. */
  outputIndex: number;
  /** The output's MIME bundle (empty for stream and error outputs). */
  bundle: Readonly<Record<string, unknown>>;
}

/** The output whose area contains `node` (an element inside a rendered output). */
export function locateOutputNode(tracker: INotebookTracker, node: HTMLElement): ILocatedOutput | null {
  const panel = tracker.find(p => p.node.contains(node));
  if (!panel) {
    return null;
  }
  const cellIndex = panel.content.widgets.findIndex(c => c.node.contains(node));
  if (cellIndex < 0) {
    return null;
  }
  const cell = panel.content.widgets[cellIndex];
  const child = node.closest('.jp-OutputArea-child');
  const area = cell.node.querySelector('.jp-OutputArea');
  if (!child || !area) {
    return null;
  }
  const children = Array.from(area.children).filter(el => el.classList.contains('jp-OutputArea-child'));
  const outputIndex = children.indexOf(child);
  return outputIndex < 0 ? null : outputAt(panel, cellIndex, outputIndex);
}

/** The output at a given cell and output index, or null when it does not exist. */
export function outputAt(panel: NotebookPanel, cellIndex: number, outputIndex: number): ILocatedOutput | null {
  const cell = panel.content.widgets[cellIndex];
  if (!cell || cell.model.type !== 'code') {
    return null;
  }
  const outputs = (cell.model as ICodeCellModel).outputs;
  if (outputIndex < 0 || outputIndex >= outputs.length) {
    return null;
  }
  const bundle: Readonly<Record<string, unknown>> = outputs.get(outputIndex).data;
  return { panel, cell, cellIndex, outputIndex, bundle };
}

/** Number of outputs of a cell (0 for markdown and raw cells). */
export function outputCount(cell: Cell): number {
  if (cell.model.type !== 'code') {
    return 0;
  }
  return (cell.model as ICodeCellModel).outputs.length;
}
