/**
 * Snapshots of the plotted columns: copied with their values while small,
 * and above {@link SNAPSHOT_CELL_LIMIT} cells kept as headers, units, a row
 * count and a hash, so a large table is neither copied into the notebook nor
 * serialised again on every change.
 */
import type { ISavedSnapshotOmitted, ISavedSnapshotValues, SavedSnapshot } from './types';
import { isSnapshotOmitted, SNAPSHOT_CELL_LIMIT } from './types';

const PRIME = 0x01000193;
const BASIS_1 = 0x811c9dc5;
const BASIS_2 = 0x050c5d1f;

const scratch = new Float64Array(1);
const words = new Uint32Array(scratch.buffer);
/** Which 32-bit word of a float64 holds its low (first little-endian) bytes on this machine. */
const LOW = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1 ? 0 : 1;
/** The quiet NaN 0x7ff8000000000000 as (low, high) words: a missing value. */
const MISSING_LOW = 0;
const MISSING_HIGH = 0x7ff80000;

/** Hashes of value arrays already hashed (a snapshot passed again is not hashed again). */
const hashCache = new WeakMap<object, string>();

/**
 * The hash of snapshot values: two 32-bit FNV-1a hashes (prime 16777619,
 * offset bases 2166136261 and 84696351) over the values column after column,
 * each value as its IEEE-754 binary64 little-endian bytes, a missing value
 * (null, NaN, ±∞) as the bytes of 0x7ff8000000000000; 16 lowercase hex
 * digits. Typed arrays of a live table hash like the saved lists.
 */
export function hashSnapshotValues(values: readonly ArrayLike<number | null>[]): string {
  const cached = hashCache.get(values);
  if (cached !== undefined) {
    return cached;
  }
  let h1 = BASIS_1;
  let h2 = BASIS_2;
  for (const column of values) {
    const n = column.length;
    for (let r = 0; r < n; r++) {
      const v = column[r];
      let lo = MISSING_LOW;
      let hi = MISSING_HIGH;
      if (typeof v === 'number' && Number.isFinite(v)) {
        scratch[0] = v;
        lo = words[LOW];
        hi = words[1 - LOW];
      }
      // FNV-1a over the 8 little-endian bytes: low word first, least significant byte first.
      for (let k = 0; k < 2; k++) {
        const w = k === 0 ? lo : hi;
        const b0 = w & 0xff;
        const b1 = (w >>> 8) & 0xff;
        const b2 = (w >>> 16) & 0xff;
        const b3 = w >>> 24;
        h1 = Math.imul(h1 ^ b0, PRIME);
        h1 = Math.imul(h1 ^ b1, PRIME);
        h1 = Math.imul(h1 ^ b2, PRIME);
        h1 = Math.imul(h1 ^ b3, PRIME);
        h2 = Math.imul(h2 ^ b0, PRIME);
        h2 = Math.imul(h2 ^ b1, PRIME);
        h2 = Math.imul(h2 ^ b2, PRIME);
        h2 = Math.imul(h2 ^ b3, PRIME);
      }
    }
  }
  h1 >>>= 0;
  h2 >>>= 0;
  const hash = h1.toString(16).padStart(8, '0') + h2.toString(16).padStart(8, '0');
  hashCache.set(values, hash);
  return hash;
}

/** Rows of a snapshot (0 without columns). */
export function snapshotRows(snapshot: SavedSnapshot): number {
  return isSnapshotOmitted(snapshot) ? snapshot.rows : (snapshot.values[0]?.length ?? 0);
}

/**
 * A snapshot of plotted columns in the form it is saved: values (missing or
 * non-finite as null) up to {@link SNAPSHOT_CELL_LIMIT} cells, else headers,
 * units, rows and hash. Build it once per choice of columns and pass the same
 * object on every save: its hash is computed once.
 */
export function snapshotOf(headers: readonly string[], units: readonly (string | null)[], columns: readonly ArrayLike<number | null>[]): SavedSnapshot {
  const rows = columns[0]?.length ?? 0;
  if (rows * columns.length > SNAPSHOT_CELL_LIMIT) {
    return { headers: [...headers], units: [...units], rows, hash: hashSnapshotValues(columns), omitted: true };
  }
  return {
    headers: [...headers],
    units: [...units],
    values: columns.map(c => Array.from(c as ArrayLike<number | null>, v => (typeof v === 'number' && Number.isFinite(v) ? v : null)))
  };
}

/** The JSON form of a snapshot about to be saved (see {@link snapshotOf}). */
export function snapshotToJson(snapshot: SavedSnapshot): ISavedSnapshotValues | ISavedSnapshotOmitted {
  if (isSnapshotOmitted(snapshot)) {
    return { headers: [...snapshot.headers], units: [...snapshot.units], rows: snapshot.rows, hash: snapshot.hash, omitted: true };
  }
  const rows = snapshot.values[0]?.length ?? 0;
  if (rows * snapshot.values.length > SNAPSHOT_CELL_LIMIT) {
    return { headers: [...snapshot.headers], units: [...snapshot.units], rows, hash: hashSnapshotValues(snapshot.values), omitted: true };
  }
  return snapshotOf(snapshot.headers, snapshot.units, snapshot.values) as ISavedSnapshotValues;
}
