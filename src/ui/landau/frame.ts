/**
 * Runs an asynchronous redraw at most once per animation frame: any number
 * of requests before the frame share one run and one promise.
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

  /** Requests a run in the next frame (shared with other requests before it). */
  request(): Promise<void> {
    if (!this._pending) {
      let resolve!: () => void;
      const promise = new Promise<void>(r => (resolve = r));
      const pending = { promise, resolve };
      this._pending = pending;
      this._frame = requestAnimationFrame(() => {
        this._pending = null;
        this._frame = 0;
        this._runs++;
        this._run().then(
          () => pending.resolve(),
          (e: unknown) => {
            this._onError(e);
            pending.resolve();
          }
        );
      });
    }
    this._settled = this._pending.promise;
    return this._pending.promise;
  }

  /** Drops a pending run (its promise resolves). */
  cancel(): void {
    if (this._frame) {
      cancelAnimationFrame(this._frame);
      this._frame = 0;
    }
    this._pending?.resolve();
    this._pending = null;
  }

  private _run: () => Promise<void>;
  private _onError: (e: unknown) => void;
  private _frame = 0;
  private _runs = 0;
  private _pending: { promise: Promise<void>; resolve: () => void } | null = null;
  private _settled: Promise<void> = Promise.resolve();
}
