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
 * Every array handed out is zero-filled, as a new one would be. The pool
 * holds arrays only weakly (a garbage collection may reclaim them between
 * jobs) and at most `POOL_LIMIT` doubles; arrays below `MIN_POOLED`
 * elements come from the allocator directly.
 */

/** Smallest array (elements) worth pooling: below it allocation is cheap. */
const MIN_POOLED = 4096;
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

  /** A zero-filled array of `length` elements (a view of a pooled array, or a new one). */
  take(length: number): Float64Array {
    return this._take(length, true);
  }

  /** A copy of `source` in an array from the pool. */
  copy(source: ArrayLike<number>): Float64Array {
    const out = this._take(source.length, false);
    out.set(source);
    return out;
  }

  private _take(length: number, clear: boolean): Float64Array {
    if (length < MIN_POOLED) {
      return new Float64Array(length);
    }
    let base = reuse(length);
    if (base) {
      if (clear) {
        base.fill(0, 0, length);
      }
    } else {
      base = new Float64Array(length);
    }
    this._taken.push(base);
    return base.length === length ? base : base.subarray(0, length);
  }

  /** Gives every array taken back to the pool; none of them may be used afterwards. */
  release(): void {
    for (const array of this._taken) {
      pool.push({ capacity: array.length, ref: new WeakRef(array) });
      pooledDoubles += array.length;
    }
    this._taken.length = 0;
    while (pooledDoubles > POOL_LIMIT && pool.length > 0) {
      drop(0);
    }
  }
}
