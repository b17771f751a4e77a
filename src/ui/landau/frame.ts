/**
 * Runs an asynchronous redraw at most once per animation frame. The first
 * request after a quiet spell runs at once (in a microtask, so every request
 * of the same task shares it): a slider move is drawn in the frame it
 * arrives in rather than one frame later. Requests made while a run is in
 * flight, or in the frame a run started in, share one run at the next frame.
 */

/** Coalesces redraw requests into one run per animation frame. */
export class FrameThrottle {
  /**
   * @param run - The redraw; a rejection is passed to `onError`.
   * @param onError - Told about a failed run.
   */
  constructor(run: () => Promise<void>, onError: (e: unknown) => void) {
    this._run = run;
    this._onError = onError;
  }

  /** Resolves when the latest requested run has finished. */
  get settled(): Promise<void> {
    return this._settled;
  }

  /** Number of runs started so far. */
  get runs(): number {
    return this._runs;
  }

  /** Requests a run: now when idle, else at the next frame (shared with other requests before it). */
  request(): Promise<void> {
    if (!this._pending) {
      let resolve!: () => void;
      const promise = new Promise<void>(r => (resolve = r));
      this._pending = { promise, resolve };
    }
    const promise = this._pending.promise;
    this._settled = promise;
    if (!this._busy && !this._frame && !this._queued) {
      this._queued = true;
      queueMicrotask(() => {
        if (this._queued) {
          this._queued = false;
          this._start();
        }
      });
    }
    return promise;
  }

  /** Drops a pending run (its promise resolves); a run in flight finishes. */
  cancel(): void {
    this._queued = false;
    this._pending?.resolve();
    this._pending = null;
  }

  /** Starts the pending run, and guards the rest of this frame. */
  private _start(): void {
    const pending = this._pending;
    if (!pending || this._busy) {
      return;
    }
    this._pending = null;
    this._busy = true;
    this._runs++;
    if (!this._frame) {
      this._frame = requestFrame(() => {
        this._frame = 0;
        if (!this._busy && this._pending) {
          this._start();
        }
      });
    }
    let result: Promise<void>;
    try {
      result = this._run();
    } catch (e) {
      result = Promise.reject(e);
    }
    result.then(
      () => this._finish(pending),
      (e: unknown) => {
        this._onError(e);
        this._finish(pending);
      }
    );
  }

  private _finish(done: { resolve: () => void }): void {
    this._busy = false;
    done.resolve();
    // The frame the run started in has passed: a request made meanwhile runs now.
    if (!this._frame && this._pending) {
      this._start();
    }
  }

  private _run: () => Promise<void>;
  private _onError: (e: unknown) => void;
  private _frame = 0;
  private _runs = 0;
  private _busy = false;
  private _queued = false;
  private _pending: { promise: Promise<void>; resolve: () => void } | null = null;
  private _settled: Promise<void> = Promise.resolve();
}

function requestFrame(callback: () => void): number {
  return typeof requestAnimationFrame === 'function' ? requestAnimationFrame(callback) : (setTimeout(callback, 16) as unknown as number);
}
