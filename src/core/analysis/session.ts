/**
 * One analysis: the single owner of its state. The panel and its sections
 * render it and send it the user's choices; the source follower gives it new
 * parses of the source output; persistence listens for its (debounced) save
 * requests. Pure TypeScript: no DOM, no JupyterLab.
 *
 * State: the source (notebook, cell, output, hash), the parsed table and
 * which of its columns play x, y and σ (identified by position and header
 * together), the kind and options of the analysis with its fit window, the
 * state of the last run and its outcome, and how the data relate to the
 * source (live, stale, lost, waiting).
 */
import { msg } from '../messages';
import type { ICoreMessage } from '../messages';
import { hashSnapshotValues, snapshotOf } from '../saved/snapshot';
import { isSnapshotOmitted } from '../saved/types';
import type { ISavedAnalysis, ISavedColumnRef, ISavedIsotherms, ISavedSettings } from '../saved/types';
import { CoreSignal } from '../signal';
import type { ITableSource } from '../source';
import { splitHeader } from '../table';
import type { IColumn, ITable, ParseResult } from '../table';
import type { IPlottableColumn } from '../table/roles';
import { defaultPair, guessSigmaColumn, plottableColumns } from '../table/roles';
import { DEFAULT_KIND, defaultOptions, kindById, optionFromJson, optionsFromJson, optionToJson } from './kinds';
import type { OptionValue } from './kinds';
import type { IAnalysisJob, IAnalysisOutcome } from './types';

/** How the shown data relate to the source output. */
export type SourceState = 'live' | 'stale' | 'lost' | 'waiting';

/** Which table columns (indices into `table.columns`) are x, y and σ of y. */
export interface IRoles {
  x: number;
  y: number;
  sigma: number | null;
}

/** Progress of a running fit. */
export interface IRunProgress {
  iteration: number;
  evaluations: number;
  cost: number;
}

/** Best values a cancelled run had reached. */
export interface IBestSoFar {
  parameters: string[];
  values: number[];
  chi2: number;
  iteration: number;
}

/** The state of the latest run. */
export type RunState =
  | { phase: 'idle' }
  | { phase: 'running'; progress: IRunProgress | null }
  | { phase: 'done' }
  | { phase: 'failed'; error: ICoreMessage }
  | { phase: 'cancelled'; best: IBestSoFar | null };

/** What changed, for renderers that redraw only part of the panel. */
export type SessionChange = 'table' | 'roles' | 'controls' | 'run' | 'source';

/** Debounce of save requests, in ms. */
export const SAVE_DEBOUNCE_MS = 250;

/** The message of a failed parse. */
function problemOf(message: ICoreMessage): ICoreMessage {
  return message;
}

/** A table made of a saved snapshot (the plotted columns only). */
export function snapshotTable(saved: Pick<ISavedAnalysis, 'snapshot'>, note: ICoreMessage): ITable | null {
  const snap = saved.snapshot;
  if (isSnapshotOmitted(snap)) {
    return null;
  }
  const columns: IColumn[] = snap.headers.map((header, i) => ({
    name: splitHeader(header).name,
    unit: snap.units[i] ?? splitHeader(header).unit,
    header,
    kind: 'number',
    isIndex: false,
    values: Float64Array.from(snap.values[i], v => (v === null ? Number.NaN : v))
  }));
  return {
    columns,
    rowCount: snap.values[0]?.length ?? 0,
    format: 'json',
    notes: [{ kind: 'info', message: note }]
  };
}

/** The state of one analysis. */
export class AnalysisSession {
  constructor(options: AnalysisSession.IOptions) {
    this.id = options.id;
    this._source = options.source ? { ...options.source } : null;
  }

  /** The analysis id (also its key in the notebook's saved analyses). */
  readonly id: string;

  /** Emitted after every change of state, saying what changed. */
  get changed(): CoreSignal<this, SessionChange> {
    return this._changed;
  }

  /** Emitted (debounced) with the saved form when it differs from what was last saved or restored. */
  get saveRequested(): CoreSignal<this, ISavedAnalysis> {
    return this._saveRequested;
  }

  // ---- source ---------------------------------------------------------------

  /** Where the table came from (null for files and unsaved tables). */
  get source(): Readonly<ITableSource> | null {
    return this._source;
  }

  /** The source output's content changed and was taken: remember its hash. */
  setSourceHash(hash: string): void {
    if (this._source && this._source.contentHash !== hash) {
      this._source = { ...this._source, contentHash: hash };
      this._scheduleSave();
    }
  }

  get sourceState(): SourceState {
    return this._sourceState;
  }

  /** Why the data are not live, then the reason behind it when there is one (empty when live). */
  get sourceMessages(): readonly ICoreMessage[] {
    return this._sourceMessages;
  }

  /** Say how the data relate to the source: a message, and optionally the reason behind it. */
  setSourceState(state: SourceState, message: ICoreMessage | null = null, reason: ICoreMessage | null = null): void {
    const messages = state === 'live' ? [] : [message, reason].filter((m): m is ICoreMessage => m !== null);
    const key = (list: readonly ICoreMessage[]) => JSON.stringify(list.map(m => [m.code, m.args]));
    if (state === this._sourceState && key(messages) === key(this._sourceMessages)) {
      return;
    }
    this._sourceState = state;
    this._sourceMessages = messages;
    this._changed.emit('source');
  }

  // ---- table and roles ------------------------------------------------------

  /** The table on display, or null. */
  get table(): ITable | null {
    return this._table;
  }

  /** Why there is no usable table (null when there is one with two numeric columns). */
  get problem(): ICoreMessage | null {
    return this._problem;
  }

  /** More about the problem (e.g. why each type of the output was refused). */
  get problemDetails(): readonly ICoreMessage[] {
    return this._problemDetails;
  }

  /** The numeric columns of the table. */
  get columns(): readonly IPlottableColumn[] {
    return this._columns;
  }

  /** The plotted columns, or null. */
  get roles(): Readonly<IRoles> | null {
    return this._roles;
  }

  /** Whether the table shown is the copy saved in the notebook rather than the source output. */
  get fromSnapshot(): boolean {
    return this._fromSnapshot;
  }

  /**
   * A first parse of the source (a new analysis): shows it with the default
   * x/y pair and the σ column guessed for y.
   */
  setParse(result: ParseResult): void {
    this._fromSnapshot = false;
    this._takeTable(result);
    const pair = defaultPair(this._columns);
    this._roles = pair ? { x: pair.x, y: pair.y, sigma: guessSigmaColumn([...this._columns], pair.y) } : null;
    this._refs = this._roles ? this._refsOf(this._roles) : null;
    this._window = { min: null, max: null };
    this._dropOutcome();
    this._revision++;
    this._changed.emit('table');
  }

  /**
   * A new parse of the source after the cell was re-run: the plotted columns
   * are found again by position and header; the window and controls are kept.
   *
   * @returns null when taken, else why not (the analysis keeps its data).
   */
  refresh(result: ParseResult): ICoreMessage | null {
    if (!result.ok) {
      return problemOf(result.message);
    }
    if (!this._refs) {
      this.setParse(result);
      return null;
    }
    const found = this._find(result.table, this._refs);
    if ('problem' in found) {
      return found.problem;
    }
    this._fromSnapshot = false;
    this._takeTable(result);
    this._roles = found.roles;
    this._refs = this._refsOf(found.roles);
    this._outcomeCurrent = false;
    this._revision++;
    this._changed.emit('table');
    this._scheduleSave();
    return null;
  }

  /** The user chose columns. A new y takes its guessed σ column unless σ is given. */
  setRoles(roles: { x?: number; y?: number; sigma?: number | null }): void {
    const old = this._roles;
    if (!old) {
      return;
    }
    const numeric = (i: number | null | undefined) => i === null || i === undefined || this._columns.some(c => c.index === i);
    if (!numeric(roles.x) || !numeric(roles.y) || !numeric(roles.sigma)) {
      throw new RangeError(`columns ${String(roles.x)}, ${String(roles.y)}, ${String(roles.sigma)} are not all numeric columns of the table`);
    }
    const y = roles.y ?? old.y;
    const next: IRoles = {
      x: roles.x ?? old.x,
      y,
      sigma: roles.sigma !== undefined ? roles.sigma : y !== old.y ? guessSigmaColumn([...this._columns], y) : old.sigma
    };
    if (next.x === old.x && next.y === old.y && next.sigma === old.sigma) {
      return;
    }
    if (next.x !== old.x) {
      this._window = { min: null, max: null };
    }
    this._roles = next;
    this._refs = this._refsOf(next);
    this._touched = true;
    this._dropOutcome();
    this._revision++;
    this._changed.emit('roles');
    this._scheduleSave();
  }

  /** The plotted columns. */
  plotted(): { x: IPlottableColumn; y: IPlottableColumn; sigma: IPlottableColumn | null } | null {
    const r = this._roles;
    if (!r) {
      return null;
    }
    const find = (i: number) => this._columns.find(c => c.index === i) ?? null;
    const x = find(r.x);
    const y = find(r.y);
    return x && y ? { x, y, sigma: r.sigma === null ? null : find(r.sigma) } : null;
  }

  // ---- controls ---------------------------------------------------------------

  /** The chosen analysis kind. */
  get kind(): string {
    return this._kind;
  }

  /** The options of the chosen kind (each kind keeps its own while another is chosen). */
  get options(): Readonly<Record<string, OptionValue>> {
    return this._optionsOf(this._kind);
  }

  setKind(id: string): void {
    if (!kindById(id)) {
      throw new RangeError(`unknown analysis kind ${id}`);
    }
    if (id === this._kind) {
      return;
    }
    this._kind = id;
    this._controlsChanged();
  }

  /** Set one option of the chosen kind; values outside the option's allowed set are refused. */
  setOption(key: string, value: OptionValue): void {
    const spec = kindById(this._kind)?.options[key];
    if (!spec || optionFromJson(spec, value) === undefined) {
      throw new RangeError(`option ${key} of ${this._kind} cannot be ${String(value)}`);
    }
    const options = { ...this._optionsOf(this._kind) };
    if (options[key] === value) {
      return;
    }
    options[key] = value;
    this._options.set(this._kind, options);
    this._controlsChanged();
  }

  /** How points are weighted; null: the default (the σ column when there is one, else equal). */
  get weights(): Readonly<{ mode: 'sigma' | 'relative' | 'equal'; fraction: number | null }> | null {
    return this._weights;
  }

  /** Set the weighting (null: the default). A relative fraction must be positive (null: estimated). */
  setWeights(weights: { mode: 'sigma' | 'relative' | 'equal'; fraction: number | null } | null): void {
    if (weights && weights.fraction !== null && !(Number.isFinite(weights.fraction) && weights.fraction > 0)) {
      throw new RangeError(`relative weight fraction must be positive, got ${weights.fraction}`);
    }
    const next = weights ? { mode: weights.mode, fraction: weights.mode === 'relative' ? weights.fraction : null } : null;
    if (JSON.stringify(next) === JSON.stringify(this._weights)) {
      return;
    }
    this._weights = next;
    this._controlsChanged();
  }

  /** The window as entered (null ends follow the data range). */
  get windowInput(): { min: number | null; max: number | null } {
    return this._window;
  }

  /** The window the next fit uses: entered ends, or the data range. */
  get window(): { min: number; max: number } {
    const range = this.xRange();
    return { min: this._window.min ?? range.min, max: this._window.max ?? range.max };
  }

  /** Range of the finite x values. */
  xRange(): { min: number; max: number } {
    const x = this.plotted()?.x.column.values as Float64Array | undefined;
    let min = Infinity;
    let max = -Infinity;
    for (let i = 0; x && i < x.length; i++) {
      const v = x[i];
      if (Number.isFinite(v)) {
        min = v < min ? v : min;
        max = v > max ? v : max;
      }
    }
    return { min, max };
  }

  /** Set the fit window; null ends follow the data range. */
  setWindow(min: number | null, max: number | null): void {
    const clean = (v: number | null) => (v === null || !Number.isFinite(v) ? null : v);
    const next = { min: clean(min), max: clean(max) };
    if (next.min === this._window.min && next.max === this._window.max) {
      return;
    }
    this._window = next;
    this._controlsChanged();
  }

  // ---- runs -------------------------------------------------------------------

  /** The latest outcome, or null. */
  get outcome(): IAnalysisOutcome | null {
    return this._outcome;
  }

  /** False when the outcome is from other data or controls than those now chosen (shown greyed). */
  get outcomeIsCurrent(): boolean {
    return this._outcome !== null && this._outcomeCurrent;
  }

  get run(): RunState {
    return this._run;
  }

  /**
   * The job for the current state, with fresh copies of the columns (the
   * runner may transfer them to a worker), or why there is none.
   */
  job(): IAnalysisJob | ICoreMessage {
    const p = this.plotted();
    if (!p) {
      return msg('session.no-columns', 'Choose x and y columns first.');
    }
    const x = Float64Array.from(p.x.column.values as Float64Array);
    const y = Float64Array.from(p.y.column.values as Float64Array);
    const sigma = p.sigma ? Float64Array.from(p.sigma.column.values as Float64Array) : undefined;
    const w = this._window;
    const columns = this._optionColumns();
    return {
      kind: this._kind,
      x,
      y,
      sigma,
      window: { min: w.min ?? -Infinity, max: w.max ?? Infinity },
      options: { ...this.options },
      xNames: [p.x.column.name],
      ...(this._weights ? { weights: { ...this._weights } } : {}),
      ...(columns ? { columns } : {}),
      ...(this._start ? { start: { ...this._start } } : {})
    };
  }

  /**
   * Where the next fits start, by parameter name (null: each kind's own
   * start). Not saved, and no change of the controls: a start moves where
   * the fit begins, not what it fits.
   */
  setStart(values: Readonly<Record<string, number>> | null): void {
    this._start = values ? { ...values } : null;
  }

  /** Values of the chosen kind's column options (a header chosen, number columns only), by option key; null when none. */
  private _optionColumns(): Record<string, Float64Array> | null {
    const kind = kindById(this._kind);
    const table = this._table;
    if (!kind || !table) {
      return null;
    }
    const out: Record<string, Float64Array> = {};
    for (const [key, spec] of Object.entries(kind.options)) {
      const header = this.options[key];
      if ((spec as { type: string }).type !== 'column' || typeof header !== 'string' || header === '') {
        continue;
      }
      const column = table.columns.find(c => c.header === header && c.kind === 'number');
      if (column) {
        out[key] = Float64Array.from(column.values as Float64Array);
      }
    }
    return Object.keys(out).length > 0 ? out : null;
  }

  /** A run starts; returns its token (later reports with an older token are ignored). */
  beginRun(): number {
    this._touched = true;
    this._hasRun = true;
    this._runToken++;
    this._run = { phase: 'running', progress: null };
    this._outcomeCurrent = false;
    this._changed.emit('run');
    this._scheduleSave();
    return this._runToken;
  }

  reportProgress(token: number, progress: IRunProgress): void {
    if (token === this._runToken && this._run.phase === 'running') {
      this._run = { phase: 'running', progress };
      this._changed.emit('run');
    }
  }

  finishRun(token: number, outcome: IAnalysisOutcome): void {
    if (token !== this._runToken) {
      return;
    }
    this._outcome = outcome;
    this._outcomeCurrent = true;
    this._run = { phase: 'done' };
    this._changed.emit('run');
  }

  failRun(token: number, error: ICoreMessage): void {
    if (token !== this._runToken) {
      return;
    }
    this._run = { phase: 'failed', error };
    this._outcomeCurrent = false;
    this._changed.emit('run');
  }

  cancelRun(token: number, best: IBestSoFar | null): void {
    if (token !== this._runToken) {
      return;
    }
    this._run = { phase: 'cancelled', best };
    this._changed.emit('run');
  }

  // ---- saving -----------------------------------------------------------------

  /** The saved form, or null when there is nothing to save (no source or no columns). */
  toSaved(): ISavedAnalysis | null {
    const source = this._source;
    const refs = this._refs;
    if (!source || !refs || !this._roles) {
      return null;
    }
    const settings = this._settings();
    const entry: ISavedAnalysis = { id: this.id, source: { ...source }, columns: { ...refs }, snapshot: this._snapshot(), settings };
    if (this._isotherms) {
      entry.isotherms = structuredClone(this._isotherms);
    }
    return entry;
  }

  /** The isotherm analysis's saved settings, or null when none was run. */
  get isotherms(): Readonly<ISavedIsotherms> | null {
    return this._isotherms;
  }

  /** The user ran the isotherm analysis with these settings: saved with the analysis. */
  setIsotherms(settings: ISavedIsotherms): void {
    if (JSON.stringify(settings) === JSON.stringify(this._isotherms)) {
      return;
    }
    this._isotherms = structuredClone(settings);
    this._touched = true;
    this._scheduleSave();
  }

  /**
   * Restore a saved analysis. `live` is the parse of the source output when it
   * is still in the notebook; the saved columns are looked up in it by
   * position and header, else the saved snapshot is shown and the reason
   * given. Nothing is saved by restoring: the baseline is what was read.
   *
   * @returns whether the saved settings ask for a fit to be run.
   */
  restore(saved: ISavedAnalysis, live: ParseResult | null, snapshotNote: ICoreMessage): { runFit: boolean; problem: ICoreMessage | null } {
    let problem: ICoreMessage | null = null;
    let roles: IRoles | null = null;
    if (live && live.ok) {
      const found = this._find(live.table, saved.columns);
      if ('roles' in found) {
        this._takeTable(live);
        this._fromSnapshot = false;
        roles = found.roles;
      } else {
        problem = found.problem;
      }
    } else if (live && !live.ok) {
      problem = problemOf(live.message);
    }
    if (!roles) {
      const table = snapshotTable(saved, snapshotNote);
      if (table) {
        this._takeTable({ ok: true, table });
        this._fromSnapshot = true;
        roles = { x: 0, y: 1, sigma: saved.columns.sigma ? 2 : null };
      } else {
        this._takeTable({ ok: false, message: msg('session.snapshot-omitted', 'The notebook keeps only a reference to this large table, and its source output is gone: re-run the source cell.') });
      }
    }
    this._roles = roles;
    this._refs = { ...saved.columns };
    this._source = { ...saved.source };
    if (saved.settings && kindById(saved.settings.kind)) {
      this._kind = saved.settings.kind;
      this._options.set(this._kind, optionsFromJson(this._kind, saved.settings.options));
      const w = saved.settings.window;
      this._window = { min: Number.isFinite(w.min) ? w.min : null, max: Number.isFinite(w.max) ? w.max : null };
      this._weights = saved.settings.weights ? { ...saved.settings.weights } : null;
      this._hasRun = true;
    }
    this._isotherms = saved.isotherms ? structuredClone(saved.isotherms) : null;
    this._dropOutcome();
    this._revision++;
    const savedHash = isSnapshotOmitted(saved.snapshot) ? saved.snapshot.hash : hashSnapshotValues(saved.snapshot.values);
    this._baselineKey = this._keyOf({ source: saved.source, columns: saved.columns, settings: this._settings(), isotherms: saved.isotherms }, savedHash);
    this._touched = true;
    this._changed.emit('table');
    return { runFit: this._hasRun && roles !== null, problem };
  }

  /** Send a pending save now (e.g. before the notebook is saved or the panel closes). */
  flush(): void {
    if (this._saveTimer !== undefined) {
      clearTimeout(this._saveTimer);
      this._saveTimer = undefined;
      this._emitSave();
    }
  }

  get isDisposed(): boolean {
    return this._isDisposed;
  }

  dispose(): void {
    if (this._isDisposed) {
      return;
    }
    this.flush();
    this._isDisposed = true;
    this._changed.clear();
    this._saveRequested.clear();
  }

  // ---- private ------------------------------------------------------------------

  private _optionsOf(kind: string): Record<string, OptionValue> {
    let options = this._options.get(kind);
    if (!options) {
      options = defaultOptions(kind);
      this._options.set(kind, options);
    }
    return options;
  }

  private _controlsChanged(): void {
    this._outcomeCurrent = false;
    this._changed.emit('controls');
    if (this._hasRun) {
      this._scheduleSave();
    }
  }

  private _dropOutcome(): void {
    this._runToken++;
    this._outcome = null;
    this._outcomeCurrent = false;
    this._run = { phase: 'idle' };
  }

  private _takeTable(result: ParseResult): void {
    if (!result.ok) {
      this._table = null;
      this._columns = [];
      this._problem = problemOf(result.message);
      this._problemDetails = result.details ?? [];
      return;
    }
    this._problemDetails = [];
    this._table = result.table;
    this._columns = plottableColumns(result.table);
    this._problem = this._columns.length < 2 ? msg('session.too-few-numeric', 'This table has fewer than two numeric columns, so there is nothing to plot.') : null;
  }

  private _refsOf(roles: IRoles): ISavedAnalysis['columns'] {
    const ref = (i: number): ISavedColumnRef => ({ index: i, header: this._table!.columns[i].header });
    return { x: ref(roles.x), y: ref(roles.y), sigma: roles.sigma === null ? null : ref(roles.sigma) };
  }

  /**
   * Find saved columns in a table: the same position with the same header; or,
   * when the table's layout changed, the one numeric column with that header.
   * A header that now names several columns, or none, is reported.
   */
  private _find(table: ITable, refs: ISavedAnalysis['columns']): { roles: IRoles } | { problem: ICoreMessage } {
    const one = (ref: ISavedColumnRef): number | ICoreMessage => {
      const at = table.columns[ref.index];
      if (ref.index >= 0 && at && at.header === ref.header && at.kind === 'number') {
        return ref.index;
      }
      const same: number[] = [];
      table.columns.forEach((c, i) => {
        if (c.header === ref.header && c.kind === 'number') {
          same.push(i);
        }
      });
      if (same.length === 1) {
        return same[0];
      }
      return same.length === 0
        ? msg('session.column-gone', 'The source output no longer has a numeric column “%1”.', ref.header)
        : msg('session.column-ambiguous', 'The source output now has %1 columns called “%2”, and the one analysed (column %3) cannot be told apart from the others.', same.length, ref.header, ref.index + 1);
    };
    const x = one(refs.x);
    const y = one(refs.y);
    const sigma = refs.sigma === null ? null : one(refs.sigma);
    for (const r of [x, y, sigma]) {
      if (r !== null && typeof r !== 'number') {
        return { problem: r };
      }
    }
    return { roles: { x: x as number, y: y as number, sigma: sigma as number | null } };
  }

  /** The saved snapshot of the plotted columns, built once per revision (its hash is cached by identity). */
  private _snapshot(): ISavedAnalysis['snapshot'] {
    if (this._snapshotRevision !== this._revision || !this._snapshotCache) {
      const p = this.plotted();
      const cols = p ? [p.x, p.y, ...(p.sigma ? [p.sigma] : [])] : [];
      this._snapshotCache = snapshotOf(
        cols.map(c => c.column.header),
        cols.map(c => c.column.unit),
        cols.map(c => c.column.values as Float64Array)
      );
      this._snapshotRevision = this._revision;
    }
    return this._snapshotCache;
  }

  private _snapshotHash(): string {
    if (this._hashRevision !== this._revision) {
      const p = this.plotted();
      const cols = p ? [p.x, p.y, ...(p.sigma ? [p.sigma] : [])].map(c => c.column.values as Float64Array) : [];
      this._hash = hashSnapshotValues(cols);
      this._hashRevision = this._revision;
    }
    return this._hash;
  }

  private _keyOf(entry: Pick<ISavedAnalysis, 'source' | 'columns' | 'settings' | 'isotherms'>, snapshotHash: string): string {
    const s = entry.settings;
    return JSON.stringify([
      entry.source.notebookPath,
      entry.source.cellId,
      entry.source.outputIndex,
      entry.source.contentHash,
      entry.columns,
      s ? [s.kind, Object.entries(s.options).map(([k, v]) => [k, optionToJson(v)]).sort(), optionToJson(s.window.min), optionToJson(s.window.max), s.weights ?? null] : null,
      snapshotHash,
      entry.isotherms ?? null
    ]);
  }

  private _scheduleSave(): void {
    if (this._isDisposed || !this._touched) {
      return;
    }
    clearTimeout(this._saveTimer);
    this._saveTimer = setTimeout(() => {
      this._saveTimer = undefined;
      this._emitSave();
    }, SAVE_DEBOUNCE_MS);
  }

  private _emitSave(): void {
    if (!this._source || !this._refs || !this._roles) {
      return;
    }
    const key = this._keyOf({ source: this._source, columns: this._refs, settings: this._settings(), isotherms: this._isotherms ?? undefined }, this._snapshotHash());
    if (key === this._baselineKey) {
      return;
    }
    const entry = this.toSaved();
    if (entry) {
      this._baselineKey = key;
      this._saveRequested.emit(entry);
    }
  }

  private _settings(): ISavedSettings | null {
    return this._hasRun
      ? {
          kind: this._kind,
          options: { ...this.options },
          window: { min: this._window.min ?? -Infinity, max: this._window.max ?? Infinity },
          ...(this._weights ? { weights: { ...this._weights } } : {})
        }
      : null;
  }

  private _source: ITableSource | null;
  private _isotherms: ISavedIsotherms | null = null;
  private _weights: { mode: 'sigma' | 'relative' | 'equal'; fraction: number | null } | null = null;
  private _start: Record<string, number> | null = null;
  private _sourceState: SourceState = 'live';
  private _sourceMessages: readonly ICoreMessage[] = [];
  private _table: ITable | null = null;
  private _problem: ICoreMessage | null = null;
  private _problemDetails: readonly ICoreMessage[] = [];
  private _columns: IPlottableColumn[] = [];
  private _roles: IRoles | null = null;
  private _refs: ISavedAnalysis['columns'] | null = null;
  private _fromSnapshot = false;
  private _kind: string = DEFAULT_KIND;
  private _options = new Map<string, Record<string, OptionValue>>();
  private _window: { min: number | null; max: number | null } = { min: null, max: null };
  private _outcome: IAnalysisOutcome | null = null;
  private _outcomeCurrent = false;
  private _run: RunState = { phase: 'idle' };
  private _runToken = 0;
  private _hasRun = false;
  /** Whether the user (or a restore) has made this analysis something worth saving. */
  private _touched = false;
  private _revision = 0;
  private _hash = '';
  private _hashRevision = -1;
  private _snapshotCache: ISavedAnalysis['snapshot'] | null = null;
  private _snapshotRevision = -1;
  private _baselineKey: string | null = null;
  private _saveTimer: ReturnType<typeof setTimeout> | undefined = undefined;
  private _isDisposed = false;
  private _changed = new CoreSignal<this, SessionChange>(this);
  private _saveRequested = new CoreSignal<this, ISavedAnalysis>(this);
}

/** Options of {@link AnalysisSession}. */
export namespace AnalysisSession {
  export interface IOptions {
    id: string;
    source: ITableSource | null;
  }
}
