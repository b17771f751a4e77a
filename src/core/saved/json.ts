/**
 * Plain JSON helpers for metadata that anyone may have written: own fields
 * only (a field named `__proto__` is data, not a prototype), equality that
 * ignores key order, and short excerpts for messages.
 */

export type JsonRecord = Record<string, unknown>;

/** A JSON object (not null, not an array). */
export function isRecord(v: unknown): v is JsonRecord {
  return typeof v === 'object' && v !== null && !Array.isArray(v);
}

/** An own field of a record (never an inherited one). */
export function own(record: JsonRecord, key: string): unknown {
  return Object.prototype.hasOwnProperty.call(record, key) ? record[key] : undefined;
}

/** Whether a record has an own field. */
export function has(record: JsonRecord, key: string): boolean {
  return Object.prototype.hasOwnProperty.call(record, key);
}

/** A record from entries, in their order (`__proto__` stays an own field). */
export function recordOf(entries: Iterable<readonly [string, unknown]>): JsonRecord {
  const out: JsonRecord = {};
  for (const [key, value] of entries) {
    Object.defineProperty(out, key, { value, enumerable: true, writable: true, configurable: true });
  }
  return out;
}

/** Deep equality of JSON values; key order is ignored, `undefined` fields count as absent. */
export function jsonEqual(a: unknown, b: unknown): boolean {
  if (a === b) {
    return true;
  }
  if (Array.isArray(a)) {
    if (!Array.isArray(b) || a.length !== b.length) {
      return false;
    }
    for (let i = 0; i < a.length; i++) {
      if (!jsonEqual(a[i], b[i])) {
        return false;
      }
    }
    return true;
  }
  if (isRecord(a) && isRecord(b)) {
    const ka = Object.keys(a).filter(k => a[k] !== undefined);
    const kb = Object.keys(b).filter(k => b[k] !== undefined);
    if (ka.length !== kb.length) {
      return false;
    }
    for (const k of ka) {
      if (!has(b, k) || !jsonEqual(a[k], b[k])) {
        return false;
      }
    }
    return true;
  }
  return false;
}

/** A short excerpt of a value for a message (its JSON text, cut to `max` characters). */
export function excerpt(v: unknown, max = 40): string {
  let text: string;
  try {
    text = v === undefined ? 'nothing' : (JSON.stringify(v) ?? String(v));
  } catch {
    text = String(v);
  }
  return text.length > max ? `${text.slice(0, max - 1)}…` : text;
}

/** Text cut to `max` characters for a message. */
export function textExcerpt(text: string, max = 40): string {
  return text.length > max ? `${text.slice(0, max - 1)}…` : text;
}
