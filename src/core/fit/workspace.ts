/**
 * Work arrays of one fit, drawn from a pool shared by all fits and given
 * back when the fit ends.
 *
 * Why: the arrays of a fit of 10⁵–10⁶ points (residuals, model values,
 * trial copies, the n×k Jacobian, input copies) are tens of megabytes.
 * Fresh memory costs a page fault per 4 kB on first touch (measured
 * ≈ 0.4 ms per MB on the benchmark machine, more than one pass of a cheap
 * model) and garbage collection afterwards; clearing memory that is
 * already mapped costs about a hundredth of that. Back-to-back fits (fit
 * window scans, bootstrap refits, repeated fits of one table) therefore
 * reuse the arrays of the previous fit.
 *
 * Arrays from `take` are zero-filled, as a new one would be; arrays from
 * `scratch` are not (their contents are left from an earlier fit) and are
 * only for buffers that are written in full before they are read (trial
 * residuals and model values, Jacobians): clearing megabytes that are
 * overwritten anyway is a pass over memory for nothing. The pool
 * holds arrays only weakly (a garbage collection may reclaim them between
 * jobs) and at most `POOL_LIMIT` doubles; small arrays are carved from
 * pooled chunks.
 */

/**
 * Arrays below this many elements are carved from shared chunks of
 * `CHUNK` elements: a fit of a few hundred points needs dozens of small
 * arrays, and each new typed array of its own costs an allocation of its
 * backing store (microseconds, a noticeable part of such a fit).
 */
const CHUNK = 1 << 16;
/** Most doubles the pool keeps (128 MB). */
const POOL_LIMIT = 1 << 24;

interface IPooled {
  capacity: number;
  ref: WeakRef<Float64Array>;
}

/** Released arrays, oldest first. */
const pool: IPooled[] = [];
let pooledDoubles = 0;

/** Removes entry `i` from the pool. */
function drop(i: number): void {
  pooledDoubles -= pool[i].capacity;
  pool.splice(i, 1);
}

/** The pooled array with the smallest capacity in [length, 2·length], removed from the pool; null if none. */
function reuse(length: number): Float64Array | null {
  for (;;) {
    let best = -1;
    for (let i = 0; i < pool.length; i++) {
      const c = pool[i].capacity;
      if (c >= length && c <= 2 * length && (best < 0 || c < pool[best].capacity)) {
        best = i;
      }
    }
    if (best < 0) {
      return null;
    }
    const array = pool[best].ref.deref();
    drop(best);
    if (array) {
      return array;
    }
  }
}

/** The arrays one fit has taken; `release` gives them back when the fit ends. */
export class Workspace {
  private readonly _taken: Float64Array[] = [];
  /** The chunk small arrays are carved from, and its first free element. */
  private _chunk: Float64Array | null = null;
  private _used = 0;

  /** A zero-filled array of `length` elements (a view of a pooled array, or a new one). */
  take(length: number): Float64Array {
    return this._take(length, true);
  }

  /**
   * An array of `length` elements whose contents are undefined (left from
   * an earlier fit): only for buffers written in full before any read.
   */
  scratch(length: number): Float64Array {
    return this._take(length, false);
  }

  /** A copy of `source` in an array from the pool. */
  copy(source: ArrayLike<number>): Float64Array {
    const out = this._take(source.length, false);
    out.set(source);
    return out;
  }

  private _take(length: number, clear: boolean): Float64Array {
    if (length < CHUNK / 4) {
      if (this._chunk === null || this._used + length > CHUNK) {
        this._chunk = this._pooled(CHUNK);
        this._used = 0;
      }
      const out = this._chunk.subarray(this._used, this._used + length);
      this._used += length;
      if (clear) {
        out.fill(0);
      }
      return out;
    }
    const base = this._pooled(length);
    if (clear) {
      base.fill(0, 0, length);
    }
    return base.length === length ? base : base.subarray(0, length);
  }

  /** An array of at least `length` elements (contents undefined), recorded as taken. */
  private _pooled(length: number): Float64Array {
    const base = reuse(length) ?? new Float64Array(length);
    this._taken.push(base);
    return base;
  }

  /** Gives every array taken back to the pool; none of them may be used afterwards. */
  release(): void {
    for (const array of this._taken) {
      pool.push({ capacity: array.length, ref: new WeakRef(array) });
      pooledDoubles += array.length;
    }
    this._taken.length = 0;
    this._chunk = null;
    this._used = 0;
    while (pooledDoubles > POOL_LIMIT && pool.length > 0) {
      drop(0);
    }
  }
}
