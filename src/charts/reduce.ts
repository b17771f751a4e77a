/**
 * Display reduction of large point series: which rows a chart draws when a
 * series has more points than the screen can show one by one. Display only:
 * fits, statistics and exports always use every row.
 *
 * The plot area is cut into a grid of columns (x) and rows (y) over the data
 * bounds. Kept are
 *  - in every column, the points with the smallest and largest x and the
 *    smallest and largest y: the per-pixel-column extremes of M4
 *    (Jugel et al. 2014, [N15] in REFERENCES.md), so every column's vertical
 *    extent, the first and last x and the global minimum and maximum of y are
 *    drawn exactly and the axes' domains do not change;
 *  - in every occupied grid cell, its first point in row order, so a band or
 *    cloud of noisy points stays a filled band or cloud and is not drawn as
 *    its outline only (M4's extremes alone would draw a wide band hollow).
 * The grid starts at about 1.5 px cells on a typical panel (budget / 8
 * columns, 0.4 × as many rows) and is coarsened by halves until the kept
 * points fit the budget; M4's extremes alone take at most 4 per column, so a
 * coarse enough grid always fits. Each pass is linear in the number of points.
 *
 * Ties (equal extremes) go to the earlier row, and the kept rows are returned
 * in row order, so the same data always gives the same drawing.
 */

/** Series with more points than this are reduced for display (per chart, over all its point groups). */
export const DISPLAY_MAX_POINTS = 4000;

/** How many points a chart draws of how many it plots (both count finite pairs only). */
export interface IDisplayReduction {
  /** Points drawn. */
  shown: number;
  /** Finite points of the series, all of them fitted and exported. */
  total: number;
}

/** Data bounds of a series: the range the grid is laid over. */
export interface IPointBounds {
  xMin: number;
  xMax: number;
  yMin: number;
  yMax: number;
}

/** Bounds of the points at `rows` (finite pairs only); null when there are none. */
export function pointBounds(x: ArrayLike<number>, y: ArrayLike<number>, rows: ArrayLike<number>): IPointBounds | null {
  let xMin = Infinity;
  let xMax = -Infinity;
  let yMin = Infinity;
  let yMax = -Infinity;
  for (let k = 0; k < rows.length; k++) {
    const xi = x[rows[k]];
    const yi = y[rows[k]];
    if (!Number.isFinite(xi) || !Number.isFinite(yi)) {
      continue;
    }
    if (xi < xMin) {
      xMin = xi;
    }
    if (xi > xMax) {
      xMax = xi;
    }
    if (yi < yMin) {
      yMin = yi;
    }
    if (yi > yMax) {
      yMax = yi;
    }
  }
  return xMin <= xMax ? { xMin, xMax, yMin, yMax } : null;
}

/** Rows of the finite pairs of x and y. */
export function finiteRows(x: ArrayLike<number>, y: ArrayLike<number>): Int32Array {
  const n = Math.min(x.length, y.length);
  const rows = new Int32Array(n);
  let m = 0;
  for (let i = 0; i < n; i++) {
    if (Number.isFinite(x[i]) && Number.isFinite(y[i])) {
      rows[m++] = i;
    }
  }
  return rows.subarray(0, m);
}

/**
 * Position in [0, 1] of every value over [min, max] (0 when the range is a
 * single value). Halves first, so a range wider than the largest double does
 * not overflow.
 */
function unitPositions(v: ArrayLike<number>, rows: ArrayLike<number>, min: number, max: number): Float64Array {
  const out = new Float64Array(rows.length);
  const lo = min / 2;
  const span = max / 2 - lo;
  if (!(span > 0)) {
    return out;
  }
  for (let k = 0; k < rows.length; k++) {
    const t = (v[rows[k]] / 2 - lo) / span;
    out[k] = t > 0 ? (t < 1 ? t : 1) : 0;
  }
  return out;
}

/** Smallest budget the grid can always meet (one column: 4 extremes and one cell). */
const MIN_BUDGET = 8;

/**
 * The rows to draw of `rows` (finite pairs, in row order): all of them when
 * there are at most `budget`, else a subset of at most `budget` rows chosen as
 * the module header describes, in row order.
 *
 * @param bounds - Grid bounds; pass the bounds of everything drawn on the same
 *   axes so groups reduced separately share one grid.
 * @throws RangeError when the budget is below 8 points.
 */
export function reduceForDisplay(
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  rows: Int32Array,
  budget: number = DISPLAY_MAX_POINTS,
  bounds: IPointBounds | null = pointBounds(x, y, rows)
): Int32Array {
  if (!(budget >= MIN_BUDGET)) {
    throw new RangeError(`the display budget must be at least ${MIN_BUDGET} points, got ${budget}`);
  }
  const n = rows.length;
  if (n <= budget || bounds === null) {
    return rows;
  }
  const tx = unitPositions(x, rows, bounds.xMin, bounds.xMax);
  const ty = unitPositions(y, rows, bounds.yMin, bounds.yMax);
  const keep = new Uint8Array(n);
  const firstColumns = Math.max(1, Math.floor(budget / 8));
  const firstRows = Math.max(1, Math.floor(firstColumns * 0.4));
  for (let level = 0; ; level++) {
    const columns = Math.max(1, Math.ceil(firstColumns / 2 ** level));
    const gridRows = Math.max(1, Math.ceil(firstRows / 2 ** level));
    const kept = markKept(x, y, rows, tx, ty, columns, gridRows, keep);
    if (kept <= budget || (columns === 1 && gridRows === 1)) {
      const out = new Int32Array(kept);
      let m = 0;
      for (let k = 0; k < n; k++) {
        if (keep[k]) {
          out[m++] = rows[k];
        }
      }
      return out;
    }
  }
}

/**
 * Mark the points kept on a columns × gridRows grid in `keep` (cleared first)
 * and return how many there are. Extremes are compared on the values
 * themselves, not on their grid positions.
 */
function markKept(
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  rows: Int32Array,
  tx: Float64Array,
  ty: Float64Array,
  columns: number,
  gridRows: number,
  keep: Uint8Array
): number {
  keep.fill(0);
  const n = rows.length;
  // Per column: index (into rows) of the min-x, max-x, min-y and max-y points; -1 = empty column.
  const minX = new Int32Array(columns).fill(-1);
  const maxX = new Int32Array(columns).fill(-1);
  const minY = new Int32Array(columns).fill(-1);
  const maxY = new Int32Array(columns).fill(-1);
  const occupied = new Uint8Array(columns * gridRows);
  let kept = 0;
  for (let k = 0; k < n; k++) {
    const c = Math.min(columns - 1, Math.floor(tx[k] * columns));
    const r = Math.min(gridRows - 1, Math.floor(ty[k] * gridRows));
    const cell = c * gridRows + r;
    if (occupied[cell] === 0) {
      occupied[cell] = 1;
      keep[k] = 1;
      kept++;
    }
    const i = rows[k];
    if (minX[c] < 0) {
      minX[c] = maxX[c] = minY[c] = maxY[c] = k;
      continue;
    }
    const xi = x[i];
    const yi = y[i];
    if (xi < x[rows[minX[c]]]) {
      minX[c] = k;
    }
    if (xi > x[rows[maxX[c]]]) {
      maxX[c] = k;
    }
    if (yi < y[rows[minY[c]]]) {
      minY[c] = k;
    }
    if (yi > y[rows[maxY[c]]]) {
      maxY[c] = k;
    }
  }
  for (let c = 0; c < columns; c++) {
    if (minX[c] < 0) {
      continue;
    }
    for (const k of [minX[c], maxX[c], minY[c], maxY[c]]) {
      if (keep[k] === 0) {
        keep[k] = 1;
        kept++;
      }
    }
  }
  return kept;
}

/**
 * Share a display budget between groups drawn on the same axes (e.g. points
 * inside and outside a fit window, or one isotherm each): groups smaller than
 * an equal share are drawn whole and the rest is shared equally by the others
 * ("water filling"). No share is below the smallest budget
 * {@link reduceForDisplay} accepts, so with more than budget / 8 groups the
 * shares add up to more than the budget.
 */
export function shareBudget(sizes: readonly number[], budget: number = DISPLAY_MAX_POINTS): number[] {
  const shares = sizes.map(n => Math.max(n, MIN_BUDGET));
  const order = sizes.map((_, g) => g).sort((a, b) => sizes[a] - sizes[b]);
  let left = budget;
  for (let k = 0; k < order.length; k++) {
    const g = order[k];
    const equal = Math.floor(left / (order.length - k));
    if (sizes[g] > equal) {
      for (let j = k; j < order.length; j++) {
        shares[order[j]] = Math.max(Math.floor(left / (order.length - k)), MIN_BUDGET);
      }
      break;
    }
    left -= sizes[g];
  }
  return shares;
}
