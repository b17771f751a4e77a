/**
 * The plain pandas text repr of a Series (`repr(s)`): index and values on each
 * line, then a footer `Name: x, Length: N, dtype: float64`. Index values are
 * left-justified and followed by at least two spaces; values are right-justified.
 */
import { msg } from '../messages';
import { wholeNumber } from '../numeric/messageArgs';
import { columnFromText } from './columns';
import { checkRowAndColumnCounts } from './limits';
import { addDisplayNotes } from './notes';
import type { ITable, ITableNote, ITruncation } from './types';
import { TABLE_LIMITS, TableParseError } from './types';

const FOOTER = /^(?:Name: (.*?), )?(?:Length: (\d+), )?(?:Freq: \S+, )?dtype: \S+$/;

/** The footer of a Series repr, when the last line is one. */
export function seriesFooter(line: string): { name: string | null; length: number | null } | null {
  const m = FOOTER.exec(line.trim());
  return m ? { name: m[1] ?? null, length: m[2] !== undefined ? Number(m[2]) : null } : null;
}

/** Parse the lines of a Series repr (footer already removed). */
export function parseSeriesLines(lines: readonly string[], footer: { name: string | null; length: number | null }): ITable {
  let body = lines.slice();
  let indexName: string | null = null;
  if (body.length > 1 && /^\S+$/.test(body[0].trim()) && !/\s{2,}\S/.test(body[0])) {
    indexName = body[0].trim();
    body = body.slice(1);
  }
  if (body.length === 0) {
    throw new TableParseError(msg('table.text.empty-series', 'The text shows an empty Series (no rows).'), 'no-table');
  }
  checkRowAndColumnCounts(body.length, 2, 'text');
  const index: string[] = [];
  const values: string[] = [];
  let rowGapAt: number | null = null;
  body.forEach((line, r) => {
    if (/^\s*\.\.\.?\s*$/.test(line)) {
      rowGapAt ??= index.length;
      return;
    }
    const m = /^(\S.*?)\s{2,}(\S.*)$/.exec(line.trimEnd());
    if (!m) {
      throw new TableParseError(msg('table.text.not-series', 'The text is not a pandas Series display: line %1 has no index and value.', wholeNumber(r + 1)), 'no-table');
    }
    if (m[1].length > TABLE_LIMITS.maxCellChars || m[2].length > TABLE_LIMITS.maxCellChars) {
      throw new TableParseError(
        msg('table.text.series-cell-too-long', 'The cell in row %1 holds more than %2 characters, the most that can be read.', wholeNumber(r + 1), wholeNumber(TABLE_LIMITS.maxCellChars))
      );
    }
    index.push(m[1].trim());
    values.push(m[2].trim());
  });
  const notes: ITableNote[] = [];
  const columns = [
    columnFromText(indexName ?? 'index', index, { isIndex: true, displayed: true, notes }),
    columnFromText(footer.name ?? '0', values, { isIndex: false, displayed: true, notes })
  ];
  const table: ITable = { columns, rowCount: index.length, format: 'pandas-text', notes };
  const truncation: ITruncation = { shownRows: index.length, totalRows: footer.length, shownColumns: 1, totalColumns: 1, rowGapAt };
  addDisplayNotes(table, truncation, rowGapAt !== null || (footer.length !== null && footer.length > index.length), 'text');
  return table;
}
