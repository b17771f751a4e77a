/**
 * AnalysisSession: one owner of an analysis's state. Default columns, roles
 * identified by position and header, one debounced save, nothing saved by
 * opening or restoring, runs that cannot overwrite each other, and the
 * catalogue's option rules.
 */
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { AnalysisSession, SAVE_DEBOUNCE_MS } from '../../../src/core/analysis/session';
import { optionsFromJson, validateKindSettings } from '../../../src/core/analysis';
import { msg } from '../../../src/core/messages';
import type { ISavedAnalysis } from '../../../src/core/saved/types';
import type { IAnalysisOutcome } from '../../../src/core/analysis';
import { parseMime } from '../../../src/core/table';

const SOURCE = { notebookPath: 'n.ipynb', cellId: 'c1', outputIndex: 0, contentHash: 'h0' };
const NOTE = msg('test.snapshot', 'from the saved copy');

function csv(rows: string[]): ReturnType<typeof parseMime> {
  return parseMime('text/csv', rows.join('\n'));
}

const MT = csv(['T (K),M (emu/g),sigma_M (emu/g)', '10,5,0.1', '20,4,0.1', '30,3,0.1', '40,2,0.1', '50,1,0.1']);
/** Duplicate headers: T, M, M, S (two columns called M). */
const DUP = csv(['T,M,M,S', '1,10,20,0.5', '2,11,21,0.5', '3,12,22,0.5']);

function session(): { s: AnalysisSession; saves: ISavedAnalysis[] } {
  const s = new AnalysisSession({ id: 'a1', source: SOURCE });
  const saves: ISavedAnalysis[] = [];
  s.saveRequested.connect((_, e) => saves.push(e));
  return { s, saves };
}

describe('AnalysisSession', () => {
  beforeEach(() => {
    vi.useFakeTimers();
  });
  afterEach(() => {
    vi.useRealTimers();
  });

  it('should pick the first two data columns and the σ column named for y', () => {
    const { s } = session();
    s.setParse(MT);
    expect(s.roles).toEqual({ x: 0, y: 1, sigma: 2 });
    expect(s.problem).toBeNull();
  });

  it('should not ask to save an analysis that was only opened', () => {
    const { s, saves } = session();
    s.setParse(MT);
    vi.advanceTimersByTime(10 * SAVE_DEBOUNCE_MS);
    s.flush();
    expect(saves).toHaveLength(0);
  });

  it('should save once, debounced, after several changes by the user', () => {
    const { s, saves } = session();
    s.setParse(MT);
    s.setRoles({ sigma: null });
    s.setRoles({ sigma: 2 });
    s.setRoles({ y: 2, sigma: null });
    expect(saves).toHaveLength(0);
    vi.advanceTimersByTime(SAVE_DEBOUNCE_MS + 1);
    expect(saves).toHaveLength(1);
    expect(saves[0].columns).toEqual({ x: { index: 0, header: 'T (K)' }, y: { index: 2, header: 'sigma_M (emu/g)' }, sigma: null });
    expect(saves[0].settings).toBeNull();
  });

  it('should save settings only once a fit was asked for, and identify columns by position and header', () => {
    const { s, saves } = session();
    s.setParse(MT);
    s.setKind('weiss');
    s.setOption('J', 3.5);
    s.setWindow(15, null);
    vi.advanceTimersByTime(SAVE_DEBOUNCE_MS + 1);
    expect(saves).toHaveLength(0);
    s.beginRun();
    vi.advanceTimersByTime(SAVE_DEBOUNCE_MS + 1);
    expect(saves).toHaveLength(1);
    expect(saves[0].settings).toEqual({ kind: 'weiss', options: { J: 3.5, freeJ: false }, window: { min: 15, max: Infinity } });
  });

  it('should restore without asking to save, then save the next change', () => {
    const first = session();
    first.s.setParse(MT);
    first.s.setKind('curie-weiss');
    first.s.beginRun();
    first.s.flush();
    const saved = first.saves[0];
    const { s, saves } = session();
    const restored = s.restore(saved, MT, NOTE);
    expect(restored).toEqual({ runFit: true, problem: null });
    expect(s.kind).toBe('curie-weiss');
    vi.advanceTimersByTime(10 * SAVE_DEBOUNCE_MS);
    s.flush();
    expect(saves).toHaveLength(0);
    s.setOption('units', 'SI');
    s.flush();
    expect(saves).toHaveLength(1);
  });

  it('should restore the second of two columns with the same header onto that column, not the first', () => {
    // A data-loss case: matching by header alone took the first "M".
    const first = session();
    first.s.setParse(DUP);
    first.s.setRoles({ x: 0, y: 2 });
    first.s.flush();
    const saved = first.saves[0];
    expect(saved.columns.y).toEqual({ index: 2, header: 'M' });
    const { s } = session();
    s.restore(saved, DUP, NOTE);
    expect(s.roles).toEqual({ x: 0, y: 2, sigma: null });
    expect(s.fromSnapshot).toBe(false);
  });

  it('should say so, and show the saved copy, when the analysed column cannot be told apart any more', () => {
    const first = session();
    first.s.setParse(DUP);
    first.s.setRoles({ x: 0, y: 2 });
    first.s.flush();
    const { s } = session();
    // The re-run moved the columns: now T, M, S, M — position 3 holds S, and "M" names two columns.
    const moved = csv(['T,M,S,M', '1,10,0.5,20', '2,11,0.5,21', '3,12,0.5,22']);
    const { problem } = s.restore(first.saves[0], moved, NOTE);
    expect(problem?.code).toBe('session.column-ambiguous');
    expect(s.fromSnapshot).toBe(true);
    const y = s.plotted()!.y.column.values as Float64Array;
    expect(Array.from(y)).toEqual([20, 21, 22]);
  });

  it('should follow a column that moved when its header is unique, and keep the window', () => {
    const { s, saves } = session();
    s.setParse(MT);
    s.setWindow(15, 45);
    s.beginRun();
    const moved = csv(['extra,T (K),M (emu/g),sigma_M (emu/g)', '0,10,5,0.1', '0,20,4,0.1', '0,30,3,0.1']);
    expect(s.refresh(moved)).toBeNull();
    expect(s.roles).toEqual({ x: 1, y: 2, sigma: 3 });
    expect(s.windowInput).toEqual({ min: 15, max: 45 });
    s.flush();
    expect(saves.at(-1)!.columns.x).toEqual({ index: 1, header: 'T (K)' });
  });

  it('should refuse a refresh that lost the plotted column and keep its data', () => {
    const { s } = session();
    s.setParse(MT);
    const gone = csv(['T (K),X', '1,2', '3,4']);
    expect(s.refresh(gone)?.code).toBe('session.column-gone');
    expect(s.table?.columns).toHaveLength(3);
  });

  it('should ignore the reply of a run that a newer run replaced, and grey a failed run’s previous result', () => {
    const { s } = session();
    s.setParse(MT);
    const outcome = { kind: 'power-law' } as IAnalysisOutcome;
    const t1 = s.beginRun();
    s.finishRun(t1, outcome);
    expect(s.outcomeIsCurrent).toBe(true);
    const t2 = s.beginRun();
    const t3 = s.beginRun();
    s.finishRun(t2, { kind: 'weiss' } as IAnalysisOutcome);
    expect(s.outcome).toBe(outcome);
    s.failRun(t3, msg('x.y', 'bad'));
    expect(s.run.phase).toBe('failed');
    expect(s.outcome).toBe(outcome);
    expect(s.outcomeIsCurrent).toBe(false);
  });

  it('should drop the result when the user picks other columns', () => {
    const { s } = session();
    s.setParse(MT);
    const t = s.beginRun();
    s.finishRun(t, { kind: 'power-law' } as IAnalysisOutcome);
    s.setRoles({ y: 2 });
    expect(s.outcome).toBeNull();
  });

  it('should build a job with copies of the columns and the x column’s own name', () => {
    const { s } = session();
    s.setParse(MT);
    const job = s.job();
    if (!('x' in job)) {
      throw new Error('no job');
    }
    expect(job.xNames).toEqual(['T']);
    (job.x as Float64Array)[0] = 999;
    expect((s.plotted()!.x.column.values as Float64Array)[0]).toBe(10);
    expect(job.window).toEqual({ min: -Infinity, max: Infinity });
  });

  it('should refuse option values outside what the kind allows', () => {
    const { s } = session();
    s.setParse(MT);
    s.setKind('weiss');
    expect(() => s.setOption('J', 7.3)).toThrow(RangeError);
    expect(() => s.setOption('nope', 1)).toThrow(RangeError);
    s.setOption('J', 7);
    expect(s.options.J).toBe(7);
  });
});

describe('catalogue rules for saved settings', () => {
  it('should accept a saved spin J = 7 and restore it as 7 (a data-loss case: it restored as an error)', () => {
    expect(validateKindSettings({ kind: 'weiss', options: { J: 7 } })).toBeNull();
    expect(optionsFromJson('weiss', { J: 7 })).toEqual({ J: 7, freeJ: false });
  });

  it('should read the Langevin limit written as "inf"', () => {
    expect(optionsFromJson('weiss', { J: 'inf' })).toEqual({ J: Infinity, freeJ: false });
  });

  it('should name an option value the kind does not allow, and an unknown kind', () => {
    expect(validateKindSettings({ kind: 'weiss', options: { J: 7.3 } })?.code).toBe('saved.bad-choice');
    expect(validateKindSettings({ kind: 'future-kind', options: {} })?.code).toBe('saved.unknown-kind');
  });

  it('should leave options it does not know alone', () => {
    expect(validateKindSettings({ kind: 'power-law', options: { proxyPower: 2, futureOption: 'x' } })).toBeNull();
  });
});

describe('AnalysisSession weights', () => {
  it('should carry a chosen weighting into the job and the saved settings, and restore it', () => {
    const s = new AnalysisSession({ id: 'w1', source: SOURCE });
    s.setParse(MT);
    expect('weights' in (s.job() as object)).toBe(false);
    s.setWeights({ mode: 'relative', fraction: null });
    expect((s.job() as { weights?: unknown }).weights).toEqual({ mode: 'relative', fraction: null });
    s.setWeights({ mode: 'equal', fraction: 0.5 });
    // A fraction only means something for relative weights.
    expect(s.weights).toEqual({ mode: 'equal', fraction: null });
    expect(() => s.setWeights({ mode: 'relative', fraction: -1 })).toThrow(RangeError);
    s.setWeights({ mode: 'relative', fraction: 0.003 });
    const token = s.beginRun();
    s.cancelRun(token, null);
    const saved = s.toSaved()!;
    expect(saved.settings?.weights).toEqual({ mode: 'relative', fraction: 0.003 });
    const again = new AnalysisSession({ id: 'w1', source: null });
    again.restore(saved, MT, NOTE);
    expect(again.weights).toEqual({ mode: 'relative', fraction: 0.003 });
    s.dispose();
    again.dispose();
  });
});
