/**
 * Names in expressions: closeness of two names (typos), the comparable form
 * of a column header, and the variable names a header offers.
 */
import { NAME_START } from './normalize';

/**
 * Optimal-string-alignment distance: insertions, deletions, substitutions
 * and swaps of neighbours each count 1. Stops early above `limit`
 * (returns `limit + 1`).
 */
export function editDistance(a: string, b: string, limit = 2): number {
  if (Math.abs(a.length - b.length) > limit) {
    return limit + 1;
  }
  const n = a.length;
  const m = b.length;
  let prev2: number[] = [];
  let prev = Array.from({ length: m + 1 }, (_, j) => j);
  for (let i = 1; i <= n; i++) {
    const cur = [i];
    let rowMin = i;
    for (let j = 1; j <= m; j++) {
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      let v = Math.min(prev[j] + 1, cur[j - 1] + 1, prev[j - 1] + cost);
      if (i > 1 && j > 1 && a[i - 1] === b[j - 2] && a[i - 2] === b[j - 1]) {
        v = Math.min(v, prev2[j - 2] + 1);
      }
      cur.push(v);
      rowMin = Math.min(rowMin, v);
    }
    if (rowMin > limit) {
      return limit + 1;
    }
    prev2 = prev;
    prev = cur;
  }
  return Math.min(prev[m], limit + 1);
}

/** Header without its unit: `T (K)` → `T`, `M [emu/g]` → `M`, `H / Oe` → `H`. */
export function stripUnit(header: string): string {
  return header
    .replace(/\s*[([{][^()[\]{}]*[)\]}]\s*/g, ' ')
    .replace(/\s+\/\s*\S+\s*$/, '')
    .replace(/,\s*\S+\s*$/, '')
    .trim();
}

/** Comparable form of a header or a name: unit stripped, case and white space ignored. */
export function columnKey(header: string): string {
  return stripUnit(header).toLowerCase().replace(/\s+/g, '');
}

/**
 * Names an expression may use for a column: the header without its unit
 * when it is a valid name (`T (K)` → `T`), else with runs of other
 * characters turned into `_` (`sample temp` → `sample_temp`). Empty when
 * nothing usable is left (e.g. `1/T`).
 */
export function variableNamesFromHeader(header: string): string[] {
  const bare = stripUnit(header);
  const valid = (s: string): boolean => s.length > 0 && NAME_START.test(s[0]) && /^[\p{L}\p{N}_]+$/u.test(s);
  if (valid(bare)) {
    return [bare];
  }
  const joined = bare.replace(/[^\p{L}\p{N}_]+/gu, '_').replace(/^_+|_+$/g, '');
  return valid(joined) ? [joined] : [];
}

/**
 * True when two distinct parameter names look like one name mistyped: the
 * same apart from letter case (`Tc`, `TC`), or at distance 1 when both
 * have at least 3 characters and they do not differ in digits only
 * (`a1`/`a2`, `tau1`/`tau2` and `beta`/`beta2` are deliberate families).
 */
export function looksLikeTypo(a: string, b: string): boolean {
  if (a === b) {
    return false;
  }
  if (a.toLowerCase() === b.toLowerCase()) {
    return true;
  }
  if (a.length < 3 || b.length < 3 || editDistance(a, b, 1) !== 1) {
    return false;
  }
  const strip = (s: string): string => s.replace(/[0-9]/g, '');
  return strip(a) !== strip(b);
}
