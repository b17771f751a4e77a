/**
 * Keeps an analysis tied to the output it came from: when the cell is re-run
 * and its output changes, the analysis takes the new data (and refits); when
 * the columns it plots are gone, or the cell is deleted, it keeps its last
 * data and says why. The source cell carries a marker while analysed.
 */
import type { ICodeCellModel, ICellModel } from '@jupyterlab/cells';
import type { NotebookPanel } from '@jupyterlab/notebook';
import type { IDisposable } from '@lumino/disposable';
import type { AnalysisSession } from '../core/analysis/session';
import { msg } from '../core/messages';
import { hashBundle } from '../core/source';
import type { ITableSource } from '../core/source';
import { parseOffThread } from '../ui/parse-off-thread';

/** CSS class on a cell whose output an open analysis uses. */
export const SOURCE_CELL_CLASS = 'jp-psiscape-mod-source';

/** Time to let a re-run's clear-then-add output changes settle, in ms. */
export const SETTLE_MS = 150;

/** Follows one analysis's source output. Dispose it when the analysis closes. */
export class SourceFollower implements IDisposable {
  /**
   * @param onRefreshed - called after new data were taken from a re-run
   * (the panel reruns a fit that was shown).
   */
  constructor(notebook: NotebookPanel, session: AnalysisSession, onRefreshed: () => void = () => undefined) {
    this._notebook = notebook;
    this._session = session;
    this._source = { ...session.source! };
    this._onRefreshed = onRefreshed;
    const model = notebook.content.model;
    model?.cells.changed.connect(this._onCellsChanged, this);
    this._watchCell();
    notebook.disposed.connect(() => this.dispose());
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
        if (this._isDisposed) {
          resolve();
          return;
        }
        void this._check().then(resolve, resolve);
      }, SETTLE_MS);
    });
  }

  private async _check(): Promise<void> {
    const check = ++this._checks;
    const session = this._session;
    const cell = this._cell;
    if (!cell) {
      session.setSourceState('lost', msg('source.cell-deleted', 'The source cell was deleted; this analysis keeps its last data.'));
      return;
    }
    this._setMarker(true);
    const outputs = cell.outputs;
    if (outputs.length === 0) {
      session.setSourceState('waiting', msg('source.no-output', 'The source cell has no output now (is it running?); showing the last data.'));
      return;
    }
    if (this._source.outputIndex >= outputs.length) {
      session.setSourceState('stale', msg('source.output-missing', 'The source cell now has %1 outputs, not output %2; showing the last data.', outputs.length, this._source.outputIndex + 1));
      return;
    }
    const bundle = outputs.get(this._source.outputIndex).data as Readonly<Record<string, unknown>>;
    const hash = hashBundle(bundle);
    if (hash === this._source.contentHash) {
      session.setSourceState('live');
      return;
    }
    const hadOutcome = session.outcome !== null;
    // Large outputs are parsed in the analysis worker; a newer check (another re-run) wins.
    const parsed = await parseOffThread({ bundle });
    if (check !== this._checks || this._isDisposed) {
      return;
    }
    const problem = session.refresh(parsed);
    if (problem) {
      session.setSourceState('stale', msg('source.not-updated', 'Not updated from the re-run cell; showing the last data.'), problem);
      return;
    }
    this._source.contentHash = hash;
    session.setSourceHash(hash);
    session.setSourceState('live');
    if (hadOutcome) {
      this._onRefreshed();
    }
  }

  private _notebook: NotebookPanel;
  private _session: AnalysisSession;
  private _source: ITableSource;
  private _onRefreshed: () => void;
  private _cell: ICodeCellModel | null = null;
  private _timer: ReturnType<typeof setTimeout> | undefined = undefined;
  private _idle: Promise<void> = Promise.resolve();
  private _isDisposed = false;
  private _checks = 0;
}
