/**
 * Wording of the 'truncated' and 'rounded' notes, with the two remedies:
 * read the underlying CSV file, or display the frame as text/csv.
 */
import { msg } from '../messages';
import type { ICoreMessage } from '../messages';
import { wholeNumber } from '../numeric/messageArgs';
import { shortHeader } from './limits';
import type { IColumn, ITable, ITableNote, ITruncation } from './types';

/**
 * Two lines that make IPython publish a DataFrame `df` as full-precision CSV
 * (`display(..., raw=True)` publishes a MIME-keyed dict as is).
 */
export const CSV_DISPLAY_SNIPPET = "from IPython.display import display\ndisplay({'text/csv': df.to_csv()}, raw=True)";

/** Where a truncated table came from: a pandas HTML or text display, or a dataresource payload. */
export type TruncatedSource = 'html' | 'text' | 'dataresource';

/** The first 'truncated' note: what kind of output was cut, and the remedy. */
function truncatedHeadline(source: TruncatedSource): ICoreMessage {
  switch (source) {
    case 'html':
      return msg(
        'table.truncated.html',
        'This HTML display is truncated: the table holds only what was shown. For every row at full precision, open the underlying CSV file, or display the frame as text/csv in the notebook (with your frame’s name for df):\n%1',
        CSV_DISPLAY_SNIPPET
      );
    case 'text':
      return msg(
        'table.truncated.text',
        'This text display is truncated: the table holds only what was shown. For every row at full precision, open the underlying CSV file, or display the frame as text/csv in the notebook (with your frame’s name for df):\n%1',
        CSV_DISPLAY_SNIPPET
      );
    default:
      return msg(
        'table.truncated.dataresource',
        'This dataresource output is truncated (pandas sends only the first display.max_rows rows): the table holds only what was sent. For every row at full precision, open the underlying CSV file, or display the frame as text/csv in the notebook (with your frame’s name for df):\n%1',
        CSV_DISPLAY_SNIPPET
      );
  }
}

/**
 * Notes for a display that showed only part of the frame: the kind of output
 * and the remedy, then what was cut (rows, columns), all of kind 'truncated'.
 */
export function truncatedNotes(t: ITruncation, source: TruncatedSource): ITableNote[] {
  const parts: ICoreMessage[] = [];
  if (t.totalRows !== null && t.totalRows > t.shownRows) {
    parts.push(
      t.rowGapAt !== null
        ? msg('table.truncated.rows-gap', 'Only %1 of %2 rows are shown; the rows elided after row %3 are marked “...” in the display.', wholeNumber(t.shownRows), wholeNumber(t.totalRows), wholeNumber(t.rowGapAt))
        : msg('table.truncated.rows', 'Only %1 of %2 rows are shown.', wholeNumber(t.shownRows), wholeNumber(t.totalRows))
    );
  } else if (t.rowGapAt !== null) {
    parts.push(msg('table.truncated.gap', 'Rows were elided after row %1 (marked “...”); the display does not state how many rows there are.', wholeNumber(t.rowGapAt)));
  }
  if (t.totalColumns !== null && t.totalColumns > t.shownColumns) {
    parts.push(msg('table.truncated.columns', 'Only %1 of %2 data columns are shown.', wholeNumber(t.shownColumns), wholeNumber(t.totalColumns)));
  } else if (t.totalColumns === null && parts.length === 0) {
    parts.push(msg('table.truncated.columns-elided', 'Some columns were elided (marked “...”).'));
  }
  return [truncatedHeadline(source), ...parts].map(message => ({ kind: 'truncated', message }));
}

/** How the numbers of a table were rounded: by pandas' display, or by pandas' to_json. */
export type RoundedBy = 'display' | 'json';

/** Note for numbers shown rounded; lists the columns concerned with the significant digits shown. */
export function roundedNote(columns: readonly IColumn[], by: RoundedBy): ITableNote | null {
  const rounded = columns.filter(c => c.shownDigits !== undefined);
  if (rounded.length === 0) {
    return null;
  }
  const names =
    rounded
      .slice(0, 6)
      .map(c => `“${shortHeader(c.header)}” (${c.shownDigits})`)
      .join(', ') + (rounded.length > 6 ? ', …' : '');
  return {
    kind: 'rounded',
    message:
      by === 'display'
        ? msg(
            'table.rounded.display',
            'Numbers in %1 (significant digits shown in brackets) are as displayed: pandas shows floats to 6 decimal places by default (display.precision). For every row at full precision, open the underlying CSV file, or display the frame as text/csv in the notebook (with your frame’s name for df):\n%2',
            names,
            CSV_DISPLAY_SNIPPET
          )
        : msg(
            'table.rounded.json',
            'Numbers in %1 (significant digits shown in brackets) are as sent: pandas’ dataresource JSON (to_json) writes floats to 10 decimal places. For every row at full precision, open the underlying CSV file, or display the frame as text/csv in the notebook (with your frame’s name for df):\n%2',
            names,
            CSV_DISPLAY_SNIPPET
          )
  };
}

/** Most rows an 'unreadable' note lists by number; the rest are counted. */
export const LISTED_ROWS = 10;

/** The cells of a number column that could not be read as numbers. */
export interface IUnreadableCells {
  /** How many cells could not be read. */
  count: number;
  /** How many cells of the column are filled (neither empty nor a missing-value marker). */
  filled: number;
  /** The first {@link LISTED_ROWS} of their rows, 0-based data rows in order. */
  rows: number[];
  /** The text of the first of them. */
  example: string;
}

/** A cell's text shortened and put on one line, for notes. */
function shortCell(text: string): string {
  const line = text.replace(/\s+/g, ' ').trim();
  return line.length > 24 ? `${line.slice(0, 24)}…` : line;
}

/**
 * The 'unreadable' note of a number column some of whose cells could not be
 * read as numbers (they are NaN, left out like missing values): the column,
 * the 1-based data rows (the first {@link LISTED_ROWS}, then how many more)
 * and the text of the first such cell.
 */
export function unreadableNote(header: string, cells: IUnreadableCells): ITableNote {
  const column = shortHeader(header);
  const example = shortCell(cells.example);
  const rows = cells.rows.map(r => String(r + 1)).join(', ');
  let message: ICoreMessage;
  if (cells.count === 1) {
    message = msg(
      'table.unreadable.one',
      'Column “%1” is read as numbers, but the value in data row %2 (“%3”) could not be read as a number; it is left out.',
      column,
      wholeNumber(cells.rows[0] + 1),
      example
    );
  } else if (cells.count <= LISTED_ROWS) {
    message = msg(
      'table.unreadable.some',
      'Column “%1” is read as numbers, but %2 of its %3 values could not be read as numbers (the first: “%4”); they are left out: data rows %5.',
      column,
      wholeNumber(cells.count),
      wholeNumber(cells.filled),
      example,
      rows
    );
  } else {
    message = msg(
      'table.unreadable.many',
      'Column “%1” is read as numbers, but %2 of its %3 values could not be read as numbers (the first: “%4”); they are left out: data rows %5 and %6 more.',
      column,
      wholeNumber(cells.count),
      wholeNumber(cells.filled),
      example,
      rows,
      wholeNumber(cells.count - cells.rows.length)
    );
  }
  return { kind: 'unreadable', message };
}

/** Read pandas' "N rows × M columns" / "[N rows x M columns]" footer, if present. */
export function shapeFooter(text: string): { rows: number; columns: number } | null {
  // Bounded repeats and a digit lookbehind keep this linear on long runs of digits or spaces.
  const m = /(?<!\d)(\d{1,15})[ \t]{1,4}rows?[ \t]{0,4}[×x][ \t]{0,4}(\d{1,15})[ \t]{1,4}columns?/.exec(text);
  return m ? { rows: Number(m[1]), columns: Number(m[2]) } : null;
}

/**
 * Adds to a table read from a pandas display the 'truncated' notes first
 * (when `hidden`, also setting `table.truncation`) and the 'rounded' note last.
 */
export function addDisplayNotes(table: ITable, truncation: ITruncation, hidden: boolean, source: 'html' | 'text'): void {
  if (hidden) {
    table.truncation = truncation;
    table.notes.unshift(...truncatedNotes(truncation, source));
  }
  const rounded = roundedNote(table.columns, 'display');
  if (rounded) {
    table.notes.push(rounded);
  }
}
