/**
 * CSV and TSV text (as written by `DataFrame.to_csv()`) parsed with papaparse.
 */
import Papa from 'papaparse';
import { columnFromText, describeColumn } from './columns';
import { checkRowAndColumnCounts, checkTextSize } from './limits';
import type { IColumn, ITable, ITableNote } from './types';
import { TABLE_LIMITS, TableParseError } from './types';

/**
 * Parse delimited text with a header row. A first header cell that is empty is
 * taken as pandas' unnamed index (what `to_csv()` writes) and becomes an index column.
 */
export function parseDelimited(text: string, delimiter: ',' | '\t'): ITable {
  const format = delimiter === ',' ? 'csv' : 'tsv';
  const what = format.toUpperCase();
  checkTextSize(text.length, `The ${what} text`);
  const result = Papa.parse<string[]>(text, { delimiter, header: false, skipEmptyLines: true, dynamicTyping: false });
  const hard = result.errors.find(e => e.type === 'Quotes');
  if (hard) {
    const row = typeof hard.row === 'number' ? `row ${hard.row + 1}` : 'a row';
    throw new TableParseError(`The ${what} text has an unclosed quote in ${row}: ${hard.message}.`);
  }
  const rows = result.data;
  if (rows.length === 0) {
    throw new TableParseError(`The ${what} text is empty: it has no header row.`);
  }
  const header = rows[0].map(h => h.trim());
  const rowCount = rows.length - 1;
  checkRowAndColumnCounts(rowCount, header.length, what);
  const notes: ITableNote[] = [];
  let short = 0;
  const cells: (string | null)[][] = header.map(() => new Array<string | null>(rowCount));
  for (let r = 0; r < rowCount; r++) {
    const row = rows[r + 1];
    if (row.length > header.length) {
      throw new TableParseError(
        `Row ${r + 1} of the ${what} text has ${row.length} cells but the header has ${header.length} columns.`
      );
    }
    if (row.length < header.length) {
      short++;
    }
    for (let c = 0; c < header.length; c++) {
      const cell = c < row.length ? row[c] : null;
      if (cell !== null && cell.length > TABLE_LIMITS.maxCellChars) {
        throw new TableParseError(
          `The cell in row ${r + 1}, ${describeColumn(c, header[c])} holds ${cell.length} characters; the limit is ${TABLE_LIMITS.maxCellChars}.`
        );
      }
      cells[c][r] = cell;
    }
    rows[r + 1] = [];
  }
  if (short > 0) {
    notes.push({ kind: 'info', message: `${short} row(s) had fewer cells than the header; the missing cells are read as missing values.` });
  }
  const hasIndex = header.length > 1 && header[0] === '';
  const columns: IColumn[] = header.map((h, c) =>
    hasIndex && c === 0
      ? columnFromText('index', cells[c], { isIndex: true, displayed: false })
      : columnFromText(h, cells[c], { isIndex: false, displayed: false })
  );
  return { columns, rowCount, format, notes };
}
