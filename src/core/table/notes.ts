/**
 * Wording of the 'truncated' and 'rounded' notes, with the two remedies:
 * read the underlying CSV file, or display the frame as text/csv.
 */
import type { IColumn, ITable, ITableNote, ITruncation } from './types';

/**
 * Two lines that make IPython publish a DataFrame `df` as full-precision CSV
 * (`display(..., raw=True)` publishes a MIME-keyed dict as is).
 */
export const CSV_DISPLAY_SNIPPET = "from IPython.display import display\ndisplay({'text/csv': df.to_csv()}, raw=True)";

const REMEDIES =
  'For every row at full precision, open the underlying CSV file, or display the frame as text/csv ' +
  `in the notebook (with your frame's name for df):\n${CSV_DISPLAY_SNIPPET}`;

/** Note for a display that showed only part of the frame. */
export function truncatedNote(t: ITruncation, source: string): ITableNote {
  const parts: string[] = [];
  if (t.totalRows !== null && t.totalRows > t.shownRows) {
    const gap = t.rowGapAt !== null ? ` (rows elided after row ${t.rowGapAt} are marked '...' in the display)` : '';
    parts.push(`only ${t.shownRows} of ${t.totalRows} rows are shown${gap}`);
  } else if (t.rowGapAt !== null) {
    parts.push(`rows were elided after row ${t.rowGapAt} (marked '...'); the total row count is not stated`);
  }
  if (t.totalColumns !== null && t.totalColumns > t.shownColumns) {
    parts.push(`only ${t.shownColumns} of ${t.totalColumns} data columns are shown`);
  } else if (t.totalColumns === null && parts.length === 0) {
    parts.push('some columns were elided (marked \'...\')');
  }
  return {
    kind: 'truncated',
    message: `This ${source} is truncated: ${parts.join('; ')}. The table holds only what was shown. ${REMEDIES}`
  };
}

/** Note for numbers shown rounded; lists the columns concerned. */
export function roundedNote(columns: readonly IColumn[], how: string): ITableNote | null {
  const rounded = columns.filter(c => c.shownDigits !== undefined);
  if (rounded.length === 0) {
    return null;
  }
  const names = rounded
    .slice(0, 6)
    .map(c => `'${c.header}' (${c.shownDigits} significant digits)`)
    .join(', ');
  const more = rounded.length > 6 ? ` and ${rounded.length - 6} more` : '';
  return {
    kind: 'rounded',
    message: `Numbers in ${names}${more} are as displayed: ${how}. ${REMEDIES}`
  };
}

/** Read pandas' "N rows × M columns" / "[N rows x M columns]" footer, if present. */
export function shapeFooter(text: string): { rows: number; columns: number } | null {
  // Bounded repeats and a digit lookbehind keep this linear on long runs of digits or spaces.
  const m = /(?<!\d)(\d{1,15})[ \t]{1,4}rows?[ \t]{0,4}[×x][ \t]{0,4}(\d{1,15})[ \t]{1,4}columns?/.exec(text);
  return m ? { rows: Number(m[1]), columns: Number(m[2]) } : null;
}

/**
 * Adds to a table read from a pandas display the 'truncated' note first
 * (when `hidden`, also setting `table.truncation`) and the 'rounded' note last.
 */
export function addDisplayNotes(table: ITable, truncation: ITruncation, hidden: boolean, source: string): void {
  if (hidden) {
    table.truncation = truncation;
    table.notes.unshift(truncatedNote(truncation, source));
  }
  const rounded = roundedNote(table.columns, 'pandas shows floats to 6 decimal places by default (display.precision)');
  if (rounded) {
    table.notes.push(rounded);
  }
}
