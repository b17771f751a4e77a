/**
 * First pass over plain delimited text (no quote characters, no carriage
 * returns, at least two columns), without papaparse: lines and cells are
 * found by searching the text, and each cell that is a plain decimal number
 * is read from the text where it stands (`readPlainNumber`), so a large
 * all-numeric file makes no string per cell. Other cells are cut out and
 * read the ordinary way. The outcome is the one papaparse's fast mode and
 * the CSV reader give for such text: the first non-empty line is the header
 * (cells trimmed), empty lines are skipped, a row wider than the header is
 * refused, a shorter one has missing cells.
 */
import { msg } from '../messages';
import { wholeNumber } from '../numeric/messageArgs';
import { cellTooLong, NumberReader } from './columns';
import { checkRowAndColumnCounts } from './limits';
import { readPlainNumber } from './plainnumbers';
import type { IPlainNumber } from './plainnumbers';
import { TABLE_LIMITS, TableParseError } from './types';

/** What the first pass found: header, row count, rows shorter than the header, and a reader per column (null once a column is not numeric). */
export interface IPlainScan {
  header: string[];
  rows: number;
  short: number;
  readers: (NumberReader | null)[];
}

/** True when `scanPlain` applies to the text. */
export function isPlainText(text: string): boolean {
  return text.indexOf('"') < 0 && text.indexOf('\r') < 0 && text.charCodeAt(0) !== 0xfeff;
}

/**
 * The first pass over plain text (see `isPlainText`); null when the header
 * has fewer than two columns (blank lines then are values, left to the
 * general reader). `capacity` bounds the number of data rows.
 */
export function scanPlain(text: string, delimiter: string, what: 'CSV' | 'TSV', capacity: number): IPlainScan | null {
  const len = text.length;
  const delim = delimiter.charCodeAt(0);
  let pos = 0;
  // header: the first non-empty line
  let header: string[] | null = null;
  while (pos < len && header === null) {
    let nl = text.indexOf('\n', pos);
    if (nl < 0) {
      nl = len;
    }
    if (nl > pos) {
      header = text.slice(pos, nl).split(delimiter).map(h => h.trim());
    }
    pos = nl + 1;
  }
  if (header === null) {
    return null;
  }
  checkRowAndColumnCounts(0, header.length, what);
  const width = header.length;
  if (width < 2) {
    return null;
  }
  const readers: (NumberReader | null)[] = header.map(() => new NumberReader(capacity));
  const number: IPlainNumber = { value: 0, point: false };
  let rows = 0;
  let short = 0;
  while (pos < len) {
    let nl = text.indexOf('\n', pos);
    if (nl < 0) {
      nl = len;
    }
    if (nl === pos) {
      pos = nl + 1;
      continue;
    }
    if (rows >= TABLE_LIMITS.maxRows) {
      checkRowAndColumnCounts(rows + 1, width, what);
    }
    let start = pos;
    let c = 0;
    for (;;) {
      let end = start;
      while (end < nl && text.charCodeAt(end) !== delim) {
        end++;
      }
      if (c >= width) {
        let cells = c + 1;
        for (let k = end; k < nl; k++) {
          cells += text.charCodeAt(k) === delim ? 1 : 0;
        }
        throw new TableParseError(
          msg('table.csv.row-too-wide', 'Row %1 of the %2 text has %3 cells but the header has %4 columns.', wholeNumber(rows + 1), what, wholeNumber(cells), wholeNumber(width))
        );
      }
      if (end - start > TABLE_LIMITS.maxCellChars) {
        throw cellTooLong(end - start, rows, c, header[c]);
      }
      const reader = readers[c];
      if (reader !== null) {
        const read = readPlainNumber(text, start, end, number);
        if (read !== undefined) {
          reader.plain(read.value, read.point);
        } else {
          reader.text(text.slice(start, end));
          if (reader.givenUp) {
            readers[c] = null;
          }
        }
      }
      c++;
      if (end >= nl) {
        break;
      }
      start = end + 1;
    }
    if (c < width) {
      short++;
      for (; c < width; c++) {
        readers[c]?.text(null);
      }
    }
    rows++;
    pos = nl + 1;
  }
  return { header, rows, short, readers };
}
