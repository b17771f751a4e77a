/**
 * pandas HTML tables (`DataFrame._repr_html_()`, `to_html()`, Styler output):
 * index columns, MultiIndex headers and rows, elided rows/columns, rounding.
 */
import { columnFromText } from './columns';
import { MAX_HTML_TABLES } from './htmldepth';
import { htmlGrid } from './htmlgrid';
import type { IGridCell } from './htmlgrid';
import { msg } from '../messages';
import { wholeNumber } from '../numeric/messageArgs';
import { checkTextSize } from './limits';
import { addDisplayNotes, shapeFooter } from './notes';
import type { IColumn, ITable, ITableNote, ITruncation } from './types';
import { TableParseError } from './types';

const ELLIPSIS = new Set(['...', '…', '⋮', '⋯']);

function text(row: readonly (IGridCell | undefined)[], c: number): string {
  return row[c]?.text ?? '';
}

function isEllipsisRow(row: readonly (IGridCell | undefined)[]): boolean {
  return row.length > 0 && row.every(cell => cell !== undefined && ELLIPSIS.has(cell.text));
}

function leadingHeaders(row: readonly (IGridCell | undefined)[]): number {
  let n = 0;
  while (n < row.length && row[n]?.isHeader === true) {
    n++;
  }
  return n;
}

/** Unnamed index levels are called as pandas' reset_index names them. */
function indexName(level: number, levels: number): string {
  return levels === 1 ? 'index' : `level_${level}`;
}

/** Parse a pandas HTML table. */
export function parsePandasHtml(html: string): ITable {
  checkTextSize(html.length, 'HTML');
  const grid = htmlGrid(html);
  if (grid === null) {
    throw new TableParseError(msg('table.html.no-table', 'The HTML holds no table.'), 'no-table');
  }
  const head = grid.head.slice();
  const body = grid.body.filter(r => r.length > 0);
  if (head.length === 0 && body.length > 0 && body[0].every(c => c?.isHeader === true)) {
    head.push(body.shift() as IGridCell[]);
  }
  let width = 0;
  for (const r of [head, body]) {
    for (const row of r) {
      width = Math.max(width, row.length);
    }
  }
  if (width === 0) {
    throw new TableParseError(msg('table.html.empty', 'The HTML table is empty: it has no cells.'), 'no-table');
  }
  const firstData = body.find(r => !isEllipsisRow(r));
  let nIndex = firstData ? leadingHeaders(firstData) : head.length > 0 && text(head[0], 0) === '' ? 1 : 0;
  nIndex = width > 1 ? Math.min(nIndex, width - 1) : 0;

  let indexNames: string[] = [];
  const last = head[head.length - 1];
  if (nIndex > 0 && last !== undefined) {
    const dataEmpty = Array.from({ length: width - nIndex }, (_, k) => text(last, nIndex + k)).every(t => t === '');
    const idxNames = Array.from({ length: nIndex }, (_, k) => text(last, k));
    if (dataEmpty && idxNames.some(t => t !== '')) {
      indexNames = idxNames;
      head.pop();
    }
  }

  const headers: string[] = [];
  for (let c = 0; c < width; c++) {
    if (c < nIndex) {
      headers.push(indexNames[c] || indexName(c, nIndex));
      continue;
    }
    const levels: string[] = [];
    for (let h = 0; h < head.length; h++) {
      const t = text(head[h], c);
      const spannedFromAbove = h > 0 && head[h][c] !== undefined && head[h][c] === head[h - 1][c];
      if (t !== '' && !spannedFromAbove) {
        levels.push(t);
      }
    }
    headers.push(head.length === 0 ? `column ${c - nIndex + 1}` : levels.join(' / '));
  }

  let rowGapAt: number | null = null;
  const rows: (IGridCell | undefined)[][] = [];
  for (const row of body) {
    if (isEllipsisRow(row)) {
      rowGapAt ??= rows.length;
      continue;
    }
    rows.push(row);
  }
  const keep: number[] = [];
  let elidedColumns = 0;
  for (let c = 0; c < width; c++) {
    const elided = c >= nIndex && ELLIPSIS.has(headers[c]) && rows.every(r => ELLIPSIS.has(text(r, c)));
    if (elided) {
      elidedColumns++;
    } else {
      keep.push(c);
    }
  }

  const notes: ITableNote[] = [];
  let short = 0;
  for (const r of rows) {
    if (r.length < width || r.some(c => c === undefined)) {
      short++;
    }
  }
  const columns: IColumn[] = keep.map(c =>
    columnFromText(
      headers[c],
      rows.map(r => (r[c] === undefined ? null : text(r, c))),
      { isIndex: c < nIndex, displayed: true, notes }
    )
  );
  if (short > 0) {
    notes.push({
      kind: 'info',
      message: msg('table.html.short-rows', 'Rows of the HTML table with fewer cells than the header: %1; their missing cells are read as missing values.', wholeNumber(short))
    });
  }
  if (grid.tablesCapped) {
    notes.push({
      kind: 'info',
      message: msg('table.html.too-many-tables', 'The HTML holds more than %1 tables; only the first %1 were examined, and the first pandas table among them was read.', wholeNumber(MAX_HTML_TABLES))
    });
  } else if (grid.tableCount > 1) {
    notes.push({ kind: 'info', message: msg('table.html.several-tables', 'The HTML holds %1 tables; the first pandas table was read.', grid.tableCount) });
  }
  const table: ITable = { columns, rowCount: rows.length, format: 'pandas-html', notes };
  const dataColumns = columns.filter(c => !c.isIndex).length;
  const footer = shapeFooter(grid.outsideText);
  const truncation: ITruncation = {
    shownRows: rows.length,
    totalRows: footer?.rows ?? null,
    shownColumns: dataColumns,
    totalColumns: footer?.columns ?? null,
    rowGapAt
  };
  const rowsHidden = rowGapAt !== null || (footer !== null && footer.rows > rows.length);
  const colsHidden = elidedColumns > 0 || (footer !== null && footer.columns > dataColumns);
  addDisplayNotes(table, truncation, rowsHidden || colsHidden, 'html');
  return table;
}
