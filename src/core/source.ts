/**
 * Where an analysis took its table from: a notebook, a cell and one of the
 * cell's outputs, plus a hash of that output's content so later changes can be
 * recognised.
 */

/** The origin of a table in a notebook. */
export interface ITableSource {
  /** Notebook path relative to the contents root. */
  notebookPath: string;
  /** nbformat cell id (stable across moves and re-execution). */
  cellId: string;
  /** Index of the output within the cell's outputs. */
  outputIndex: number;
  /** Hash of the output's MIME bundle ({@link hashBundle}). */
  contentHash: string;
}

/**
 * A 64-bit FNV-1a hash (two 32-bit lanes) of a MIME bundle, over its keys in
 * sorted order and their JSON text. Not cryptographic: it only tells whether an
 * output changed.
 */
export function hashBundle(bundle: Readonly<Record<string, unknown>>): string {
  let h1 = 0x811c9dc5;
  let h2 = 0xcbf29ce4;
  const feed = (text: string): void => {
    for (let i = 0; i < text.length; i++) {
      const c = text.charCodeAt(i);
      h1 = Math.imul(h1 ^ c, 0x01000193) >>> 0;
      h2 = Math.imul(h2 ^ c, 0x01000193 ^ 0x5bd1e995) >>> 0;
    }
  };
  for (const key of Object.keys(bundle).sort()) {
    feed(key);
    feed('\u0000');
    const value = bundle[key];
    feed(typeof value === 'string' ? value : JSON.stringify(value) ?? 'undefined');
    feed('\u0001');
  }
  return h1.toString(16).padStart(8, '0') + h2.toString(16).padStart(8, '0');
}
