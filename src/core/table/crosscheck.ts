/**
 * Checks of a dataresource table against the other MIME types of the same
 * output. pandas builds the dataresource from `df.head(display.max_rows)` and
 * writes ±inf as null; the text/HTML displays of the same output state the full
 * shape and show infinities, so they can reveal truncation and restore ±inf.
 */
import { msg } from '../messages';
import type { ICoreMessage } from '../messages';
import { wholeNumber } from '../numeric/messageArgs';
import { shapeFooter, truncatedNotes } from './notes';
import type { ITable, ParseResult } from './types';

function textOf(v: unknown): string | null {
  if (typeof v === 'string') {
    return v;
  }
  if (Array.isArray(v) && v.every(p => typeof p === 'string')) {
    return v.join('');
  }
  return null;
}

/** pandas' shape footer from the text or HTML display of the same output, if any. */
function displayedShape(data: Readonly<Record<string, unknown>>): { rows: number; columns: number } | null {
  const plain = textOf(data['text/plain']);
  if (plain !== null) {
    const lastLine = plain.trimEnd().split('\n').pop() ?? '';
    const shape = /^\[\d+ rows x \d+ columns\]$/.test(lastLine.trim()) ? shapeFooter(lastLine) : null;
    if (shape) {
      return shape;
    }
  }
  const html = textOf(data['text/html']);
  if (html !== null) {
    const tail = html.slice(html.lastIndexOf('</table>') + 1);
    return /<p>\d+ rows × \d+ columns<\/p>/.test(tail) ? shapeFooter(tail) : null;
  }
  return null;
}

/** Add truncation and restore ±inf in a dataresource table from the displays beside it. */
export function crossCheckDataResource(
  table: ITable,
  data: Readonly<Record<string, unknown>>,
  parse: (mime: string, payload: unknown) => ParseResult | { ok: false; message: ICoreMessage }
): void {
  const shape = displayedShape(data);
  const dataColumns = table.columns.filter(c => !c.isIndex).length;
  if (shape !== null && (shape.rows > table.rowCount || shape.columns > dataColumns)) {
    table.truncation = {
      shownRows: table.rowCount,
      totalRows: shape.rows,
      shownColumns: dataColumns,
      totalColumns: shape.columns,
      rowGapAt: null
    };
    table.notes.unshift(...truncatedNotes(table.truncation, 'dataresource'));
  }
  const hasNaN = table.columns.some(c => c.values instanceof Float64Array && c.values.some(v => Number.isNaN(v)));
  const displayMime = data['text/html'] !== undefined ? 'text/html' : data['text/plain'] !== undefined ? 'text/plain' : null;
  if (!hasNaN || displayMime === null) {
    return;
  }
  const shown = parse(displayMime, data[displayMime]);
  if (!shown.ok) {
    return;
  }
  const leading = Math.min(table.rowCount, shown.table.truncation?.rowGapAt ?? shown.table.rowCount);
  let restored = 0;
  for (const column of table.columns) {
    const twin = shown.table.columns.find(c => c.header === column.header && c.isIndex === column.isIndex);
    if (!(column.values instanceof Float64Array) || twin === undefined || !(twin.values instanceof Float64Array)) {
      continue;
    }
    for (let r = 0; r < leading; r++) {
      const v = twin.values[r];
      if (Number.isNaN(column.values[r]) && (v === Infinity || v === -Infinity)) {
        column.values[r] = v;
        restored++;
      }
    }
  }
  if (restored > 0) {
    table.notes.push({
      kind: 'info',
      message: msg(
        'table.restored-infinities',
        'pandas writes ±inf as null in dataresource JSON; infinite values restored from the %1 display of the same output: %2.',
        displayMime,
        wholeNumber(restored)
      )
    });
  }
}
