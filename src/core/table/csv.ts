/**
 * CSV and TSV text (as written by `DataFrame.to_csv()`) parsed with papaparse.
 *
 * Fast path: papaparse streams the text in chunks (no typing, no header mode) and
 * every column is read straight into a growing Float64Array by a NumberReader,
 * which types it by the same rule as every other format. Only columns that turn
 * out not to be numeric are read a second time as text, so a large all-numeric
 * file never holds its cells as millions of strings at once. Header and cell
 * text is trimmed (`T, M, S` names columns T, M and S).
 */
import Papa from 'papaparse';
import type { ParseResult as PapaResult } from 'papaparse';
import { msg } from '../messages';
import { wholeNumber } from '../numeric/messageArgs';
import { cellTooLong, columnFromText, NumberReader, numberColumnRead } from './columns';
import type { INumbersRead } from './columns';
import { isPlainText, scanPlain } from './csvplain';
import { checkRowAndColumnCounts, checkTextSize } from './limits';
import type { IColumn, ITable, ITableNote } from './types';
import { TABLE_LIMITS, TableParseError } from './types';

const CHUNK_CHARS = 1 << 16;

function countChar(text: string, ch: string): number {
  let n = 0;
  for (let i = text.indexOf(ch); i >= 0; i = text.indexOf(ch, i + 1)) {
    n++;
  }
  return n;
}

/** Upper bound on data rows: line breaks plus one (a row spans several lines only when quoted). */
function rowCapacity(text: string): number {
  return Math.max(countChar(text, '\n'), countChar(text, '\r')) + 1;
}

interface IScan {
  header: string[];
  rows: number;
  short: number;
}

/**
 * Pieces of about CHUNK_CHARS characters cut at line breaks, line breaks removed
 * from the cut. Only for text without quote characters, where a line break always
 * ends a row. Returns null when the text has quotes or bare-CR line ends.
 */
function plainPieces(text: string): string[] | null {
  if (text.includes('"') || (text.includes('\r') && !text.includes('\r\n'))) {
    return null;
  }
  const pieces: string[] = [];
  const len = text.length;
  let start = 0;
  while (start < len) {
    const nl = start + CHUNK_CHARS < len ? text.indexOf('\n', start + CHUNK_CHARS) : -1;
    let end = nl < 0 ? len : nl;
    if (nl < 0 && text.charCodeAt(len - 1) === 10) {
      end = len - 1;
    }
    if (end > start && text.charCodeAt(end - 1) === 13) {
      end--;
    }
    pieces.push(text.slice(start, end));
    start = nl < 0 ? len : nl + 1;
  }
  return pieces;
}

/**
 * Run the text through papaparse, calling `onRow(row, index, header)` for every data
 * row after checking its width. Unquoted text is fed in line-aligned pieces (fast mode,
 * little garbage held); quoted text goes through papaparse's own chunked streaming.
 */
function scan(text: string, delimiter: string, what: 'CSV' | 'TSV', onRow: (row: string[], r: number, header: string[]) => void): IScan {
  let header: string[] | null = null;
  let rows = 0;
  let short = 0;
  let blanks = 0;
  const emit = (row: string[], h: string[]): void => {
    if (row.length > h.length) {
      throw new TableParseError(
        msg('table.csv.row-too-wide', 'Row %1 of the %2 text has %3 cells but the header has %4 columns.', wholeNumber(rows + 1), what, wholeNumber(row.length), wholeNumber(h.length))
      );
    }
    if (row.length < h.length) {
      short++;
    }
    if (rows >= TABLE_LIMITS.maxRows) {
      checkRowAndColumnCounts(rows + 1, h.length, what);
    }
    onRow(row, rows, h);
    rows++;
  };
  // Blank lines are skipped as pandas' read_csv does, except in a one-column file, where
  // an empty line between rows is a missing value (Python's csv module writes it as "").
  const flushBlanks = (h: string[], keep: number): void => {
    for (; blanks > keep; blanks--) {
      emit([''], h);
    }
    blanks = 0;
  };
  const take = (results: PapaResult<string[]>): void => {
    const hard = results.errors.find(e => e.type === 'Quotes');
    if (hard) {
      throw new TableParseError(
        typeof hard.row === 'number'
          ? msg('table.csv.unclosed-quote', 'The %1 text has an unclosed quote in row %2.', what, wholeNumber(rows + blanks + hard.row + (header === null ? 0 : 1)))
          : msg('table.csv.unclosed-quote-somewhere', 'The %1 text has an unclosed quote.', what)
      );
    }
    for (const row of results.data) {
      const blank = row.length === 1 && row[0] === '';
      if (header === null) {
        if (!blank) {
          header = row.map(h => h.trim());
          checkRowAndColumnCounts(0, header.length, what);
        }
        continue;
      }
      if (blank) {
        blanks += header.length === 1 ? 1 : 0;
        continue;
      }
      flushBlanks(header, 0);
      emit(row, header);
    }
  };
  const pieces = plainPieces(text);
  const newline = text.includes('\r\n') ? '\r\n' : '\n';
  let trailingBreak = 0;
  if (pieces !== null) {
    for (const piece of pieces) {
      if (piece === '') {
        take({ data: [['']], errors: [], meta: {} as PapaResult<string[]>['meta'] });
      } else {
        take(Papa.parse<string[]>(piece, { delimiter, newline, header: false, dynamicTyping: false, skipEmptyLines: false, fastMode: true }));
      }
    }
  } else {
    // With a string input papaparse runs every chunk synchronously before returning.
    Papa.parse<string[]>(text, {
      delimiter,
      header: false,
      dynamicTyping: false,
      skipEmptyLines: false,
      worker: false,
      chunkSize: CHUNK_CHARS,
      complete: () => undefined,
      chunk: take
    });
    // The last line break of the text ends the last row; it is not one more blank row.
    trailingBreak = /[\r\n]$/.test(text) ? 1 : 0;
  }
  const found = header as string[] | null;
  if (found === null) {
    throw new TableParseError(msg('table.csv.empty', 'The %1 text is empty: it has no header row.', what), 'no-table');
  }
  flushBlanks(found, trailingBreak);
  return { header: found, rows, short };
}

/**
 * The line break papaparse settles on for quoted text: its guess over the first
 * chunk it is given, with quoted parts removed (papaparse's `guessLineEndings`).
 */
function guessNewline(text: string): '\n' | '\r\n' | '\r' {
  const head = text.slice(0, CHUNK_CHARS).replace(/"[^]*?"/g, '');
  const r = head.split('\r');
  const n = head.split('\n');
  if (r.length === 1 || (n.length > 1 && n[0].length < r[0].length)) {
    return '\n';
  }
  const withN = r.filter(part => part[0] === '\n').length;
  return withN >= r.length / 2 ? '\r\n' : '\r';
}

function isSpaceCode(c: number): boolean {
  return c === 32 || (c >= 9 && c <= 13) || c === 0xa0 || c === 0xfeff || c === 0x1680 || (c >= 0x2000 && c <= 0x200a) || c === 0x2028 || c === 0x2029 || c === 0x202f || c === 0x205f || c === 0x3000;
}

/**
 * Refuse text with a quoted field that never closes, naming the row where its
 * quote opens, in one linear pass. papaparse streams such text in
 * chunks, re-reading the ever longer unfinished row with every chunk, which
 * takes time quadratic in its length (a 15 MB file: seconds; 32 MB: out of
 * memory). The pass follows papaparse's rules for quoted fields: a quote opens
 * a field only as the field's first character; inside, `""` is a quote; a quote
 * followed by optional white space and the delimiter, the line break or the end
 * of the text closes it; any other quote is kept as text and the search goes on.
 * Rows are numbered as the parser numbers them (data rows from 1, blank lines
 * skipped unless the header has one column).
 */
export function refuseUnclosedQuote(text: string, delimiter: string, what: 'CSV' | 'TSV'): void {
  const len = text.length;
  const newline = guessNewline(text);
  const nlLast = newline.charCodeAt(newline.length - 1);
  const start = text.charCodeAt(0) === 0xfeff ? 1 : 0;
  const delim = delimiter.charCodeAt(0);
  // Records: the one being read starts at recordStart; before the header is found, whether it has a delimiter.
  let recordStart = start;
  let headerFound = false;
  let headerWide = false;
  let delimiterInRecord = false;
  let dataRows = 0;
  let blankDataRows = 0;
  let nextNewline = -2;
  const endRecord = (end: number, next: number): void => {
    const body = end - recordStart <= 8 ? text.slice(recordStart, end) : null;
    // papaparse gives [''] for an empty line and for a lone "" (white space after it allowed).
    const blank = body !== null && (body === '' || (/^""\s*$/.test(body) && !body.includes(delimiter)));
    if (!headerFound) {
      if (!blank) {
        headerFound = true;
        headerWide = delimiterInRecord;
      }
    } else if (blank) {
      blankDataRows++;
    } else {
      dataRows++;
    }
    recordStart = next;
    delimiterInRecord = false;
  };
  /** Ends the records whose line breaks lie in [from, to), a stretch outside quoted fields. */
  const unquoted = (from: number, to: number): void => {
    for (;;) {
      if (nextNewline !== -1 && nextNewline < from) {
        nextNewline = text.indexOf(newline, from);
      }
      const stop = nextNewline < 0 || nextNewline >= to ? to : nextNewline;
      if (!headerFound && !delimiterInRecord && stop > from && text.slice(from, stop).includes(delimiter)) {
        delimiterInRecord = true;
      }
      if (stop === to) {
        return;
      }
      endRecord(nextNewline, nextNewline + newline.length);
      from = nextNewline + newline.length;
    }
  };
  let pos = start;
  let atFieldStart = true;
  for (;;) {
    const open = text.indexOf('"', pos);
    if (open < 0) {
      return;
    }
    unquoted(pos, open);
    const before = open > start ? text.charCodeAt(open - 1) : -1;
    const opensField = open === pos ? atFieldStart : before === delim || (before === nlLast && open === recordStart);
    if (!opensField) {
      pos = open + 1;
      atFieldStart = false;
      continue;
    }
    let q = open;
    let closed = false;
    for (;;) {
      q = text.indexOf('"', q + 1);
      if (q < 0) {
        break;
      }
      if (q === len - 1) {
        return;
      }
      if (text.charCodeAt(q + 1) === 34) {
        q++;
        continue;
      }
      let k = q + 1;
      while (k < len && text.charCodeAt(k) !== delim && !text.startsWith(newline, k) && isSpaceCode(text.charCodeAt(k))) {
        k++;
      }
      if (k < len && text.charCodeAt(k) === delim) {
        if (!headerFound) {
          delimiterInRecord = true;
        }
        pos = k + 1;
        closed = true;
        break;
      }
      if (k < len && text.startsWith(newline, k)) {
        endRecord(k, k + newline.length);
        pos = k + newline.length;
        closed = true;
        break;
      }
    }
    if (!closed) {
      throw new TableParseError(
        headerFound
          ? msg('table.csv.unclosed-quote', 'The %1 text has an unclosed quote in row %2.', what, wholeNumber(dataRows + (headerWide ? 0 : blankDataRows) + 1))
          : msg('table.csv.unclosed-quote-header', 'The %1 text has an unclosed quote in its header row.', what)
      );
    }
    atFieldStart = true;
  }
}

function tooLong(cell: string, r: number, c: number, header: readonly string[]): TableParseError {
  return cellTooLong(cell.length, r, c, header[c] ?? '');
}

/**
 * Parse delimited text with a header row. Leading header cells that are empty are
 * pandas' unnamed index levels (what `to_csv()` writes) and become index columns
 * ('index', or 'level_0', 'level_1', … for a MultiIndex). A named index cannot be
 * told from a column in CSV and is read as a column.
 */
export function parseDelimited(text: string, delimiter: ',' | '\t'): ITable {
  const format = delimiter === ',' ? 'csv' : 'tsv';
  const what = format === 'csv' ? 'CSV' : 'TSV';
  checkTextSize(text.length, what);
  if (text.includes('"')) {
    refuseUnclosedQuote(text, delimiter, what);
  }
  const capacity = rowCapacity(text);
  let readers: (NumberReader | null)[] = [];
  const plain = isPlainText(text) ? scanPlain(text, delimiter, what, capacity) : null;
  if (plain !== null) {
    readers = plain.readers;
  }
  const first = plain ?? scan(text, delimiter, what, (row, r, header) => {
    if (r === 0) {
      readers = header.map(() => new NumberReader(capacity));
    }
    for (let c = 0; c < readers.length; c++) {
      const reader = readers[c];
      if (reader === null) {
        continue;
      }
      const cell = c < row.length ? row[c] : null;
      if (cell !== null && cell.length > TABLE_LIMITS.maxCellChars) {
        throw tooLong(cell, r, c, header);
      }
      reader.text(cell);
      if (reader.givenUp) {
        readers[c] = null;
      }
    }
  });
  const { header, rows: rowCount, short } = first;
  if (readers.length < header.length) {
    readers = header.map(() => new NumberReader(0));
  }
  const numbers: (INumbersRead | null)[] = readers.map(reader => (reader === null ? null : reader.finish()));
  const textColumns = header.map((_, c) => numbers[c] === null);
  const cells: (string | null)[][] = header.map((_, c) => (textColumns[c] ? new Array<string | null>(rowCount) : []));
  if (textColumns.some(Boolean)) {
    scan(text, delimiter, what, (row, r) => {
      for (let c = 0; c < header.length; c++) {
        if (!textColumns[c]) {
          continue;
        }
        const cell = c < row.length ? row[c] : null;
        if (cell !== null && cell.length > TABLE_LIMITS.maxCellChars) {
          throw tooLong(cell, r, c, header);
        }
        cells[c][r] = cell === null ? null : cell.trim();
      }
    });
  }
  const notes: ITableNote[] = [];
  let indexLevels = 0;
  while (indexLevels < header.length - 1 && header[indexLevels] === '') {
    indexLevels++;
  }
  const columns: IColumn[] = header.map((h, c) => {
    const isIndex = c < indexLevels;
    const name = !isIndex ? h : indexLevels === 1 ? 'index' : `level_${c}`;
    const read = numbers[c];
    if (read !== null) {
      return numberColumnRead(name, read, isIndex, notes);
    }
    return columnFromText(name, cells[c], { isIndex, displayed: false, notes });
  });
  if (short > 0) {
    notes.push({
      kind: 'info',
      message: msg('table.csv.short-rows', 'Rows with fewer cells than the header: %1; their missing cells are read as missing values.', wholeNumber(short))
    });
  }
  return { columns, rowCount, format, notes };
}
