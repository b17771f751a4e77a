/**
 * Keeps an analysis tied to the output it came from: when the cell is re-run
 * and its output changes, the analysis takes the new data (and refits); when
 * the columns it plots are gone, or the cell is deleted, it keeps its last
 * data and says why. The source cell carries a marker while analysed.
 */
import type { ICodeCellModel, ICellModel } from '@jupyterlab/cells';
import type { NotebookPanel } from '@jupyterlab/notebook';
import type { TranslationBundle } from '@jupyterlab/translation';
import type { IDisposable } from '@lumino/disposable';
import { hashBundle } from '../core/source';
import type { ITableSource } from '../core/source';
import { parseOutput } from '../core/table';
import type { AnalysisPanel } from '../ui/analysis-panel';

/** CSS class on a cell whose output an open analysis uses. */
export const SOURCE_CELL_CLASS = 'jp-psiscape-mod-source';

/** Time to let a re-run's clear-then-add output changes settle, in ms. */
export const SETTLE_MS = 150;

/** Follows one analysis's source output. Dispose it when the analysis closes. */
export class SourceFollower implements IDisposable {
  constructor(notebook: NotebookPanel, analysis: AnalysisPanel, source: ITableSource, trans: TranslationBundle) {
    this._notebook = notebook;
    this._analysis = analysis;
    this._source = { ...source };
    this._trans = trans;
    const model = notebook.content.model;
    model?.cells.changed.connect(this._onCellsChanged, this);
    this._watchCell();
    analysis.disposed.connect(() => this.dispose());
    notebook.disposed.connect(() => this.dispose());
  }

  /** The source as last seen (its hash follows the output). */
  get source(): Readonly<ITableSource> {
    return this._source;
  }

  /** Resolves after the pending check (if any) has run. */
  get idle(): Promise<void> {
    return this._idle;
  }

  get isDisposed(): boolean {
    return this._isDisposed;
  }

  dispose(): void {
    if (this._isDisposed) {
      return;
    }
    this._isDisposed = true;
    clearTimeout(this._timer);
    this._notebook.content.model?.cells.changed.disconnect(this._onCellsChanged, this);
    this._unwatchCell();
    this._setMarker(false);
  }

  private _findCell(): ICodeCellModel | null {
    const cells = this._notebook.content.model?.cells;
    if (!cells) {
      return null;
    }
    for (let i = 0; i < cells.length; i++) {
      const cell: ICellModel = cells.get(i);
      if (cell.id === this._source.cellId) {
        return cell.type === 'code' ? (cell as ICodeCellModel) : null;
      }
    }
    return null;
  }

  private _watchCell(): void {
    const cell = this._findCell();
    if (cell === this._cell) {
      return;
    }
    this._unwatchCell();
    this._cell = cell;
    cell?.outputs.changed.connect(this._schedule, this);
    this._setMarker(cell !== null);
  }

  private _unwatchCell(): void {
    // A deleted cell's model is disposed and has no outputs any more.
    if (this._cell && !this._cell.isDisposed) {
      this._cell.outputs.changed.disconnect(this._schedule, this);
    }
    this._cell = null;
  }

  private _setMarker(on: boolean): void {
    const widget = this._notebook.content.widgets.find(w => w.model.id === this._source.cellId);
    widget?.node.classList.toggle(SOURCE_CELL_CLASS, on);
  }

  private _onCellsChanged(): void {
    this._watchCell();
    this._schedule();
  }

  private _schedule(): void {
    clearTimeout(this._timer);
    this._idle = new Promise(resolve => {
      this._timer = setTimeout(() => {
        if (!this._isDisposed) {
          this._check();
        }
        resolve();
      }, SETTLE_MS);
    });
  }

  private _check(): void {
    const analysis = this._analysis;
    const trans = this._trans;
    const cell = this._cell;
    if (!cell) {
      analysis.setSourceState('lost', trans.__('The source cell was deleted; this analysis keeps its last data.'));
      return;
    }
    this._setMarker(true);
    const outputs = cell.outputs;
    if (outputs.length === 0) {
      analysis.setSourceState('waiting', trans.__('The source cell has no output now (is it running?); showing the last data.'));
      return;
    }
    if (this._source.outputIndex >= outputs.length) {
      analysis.setSourceState(
        'stale',
        trans.__('The source cell now has %1 outputs, not output %2; showing the last data.', outputs.length, this._source.outputIndex + 1)
      );
      return;
    }
    const bundle = outputs.get(this._source.outputIndex).data as Readonly<Record<string, unknown>>;
    const hash = hashBundle(bundle);
    if (hash === this._source.contentHash) {
      analysis.setSourceState('live');
      return;
    }
    const problem = analysis.refreshFromSource(parseOutput(bundle));
    if (problem) {
      analysis.setSourceState('stale', trans.__('Not updated: %1. Showing the last data.', problem));
      return;
    }
    this._source.contentHash = hash;
    analysis.setSourceState('live');
  }

  private _notebook: NotebookPanel;
  private _analysis: AnalysisPanel;
  private _source: ITableSource;
  private _trans: TranslationBundle;
  private _cell: ICodeCellModel | null = null;
  private _timer: ReturnType<typeof setTimeout> | undefined = undefined;
  private _idle: Promise<void> = Promise.resolve();
  private _isDisposed = false;
}
