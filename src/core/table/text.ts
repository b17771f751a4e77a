/**
 * The plain pandas text repr (`repr(df)`), read as a last resort.
 *
 * pandas pads every field to a fixed width; values and column labels are
 * right-justified, index values left-justified. Fields are found as runs of
 * character positions that are not blank in every data line; a run whose
 * header is blank belongs to the labelled run on its right (e.g. the date
 * and time halves of a datetime). Leading unlabelled runs are index levels.
 * MultiIndex columns take several header lines (upper labels carry over to the
 * columns on their right); a names row below the header gives index names.
 */
import { msg } from '../messages';
import type { ICoreMessage } from '../messages';
import { wholeNumber } from '../numeric/messageArgs';
import { columnFromText } from './columns';
import { checkRowAndColumnCounts, checkTextSize } from './limits';
import { addDisplayNotes, shapeFooter } from './notes';
import { parseSeriesLines, seriesFooter } from './textseries';
import type { IColumn, ITable, ITableNote, ITruncation } from './types';
import { TABLE_LIMITS, TableParseError } from './types';

/** The text needs a header line and at least one row. */
const tooShort = (): ICoreMessage => msg('table.text.too-short', 'The text is not a pandas table display: it needs a header line and at least one row.');
const ELLIPSIS = new Set(['...', '..', '…']);

interface IField {
  start: number;
  end: number;
}

interface IBlock {
  index: IColumn[];
  data: IColumn[];
  rows: number;
  rowGapAt: number | null;
  elidedColumns: number;
  /** Notes of the block's index columns ('unreadable'); every wrapped block repeats the index. */
  indexNotes: ITableNote[];
  /** Notes of the block's data columns ('unreadable'). */
  dataNotes: ITableNote[];
}

function slice(line: string, f: IField): string {
  return line.slice(f.start, f.end).trim();
}

/** Runs of positions that are non-blank in at least one line. */
function fieldsOf(lines: readonly string[], width: number): IField[] {
  const used = new Uint8Array(width);
  for (const line of lines) {
    for (let p = 0; p < line.length; p++) {
      if (line.charCodeAt(p) !== 32) {
        used[p] = 1;
      }
    }
  }
  const fields: IField[] = [];
  for (let p = 0; p < width; p++) {
    if (used[p] === 1 && (p === 0 || used[p - 1] === 0)) {
      fields.push({ start: p, end: p + 1 });
    } else if (used[p] === 1) {
      fields[fields.length - 1].end = p + 1;
    }
  }
  return fields;
}

/** Blank a label at the very left: it is the columns' own name (`df.columns.name`), not a column. */
function withoutColumnsName(line: string): string {
  return /^\S/.test(line) ? line.replace(/^\S+/, m => ' '.repeat(m.length)) : line;
}

/** Parse a block whose first `headerCount` lines are column labels (more than one for MultiIndex columns). */
function parseBlock(raw: readonly string[], headerCount: number): IBlock {
  const lines = raw.map(l => (l.endsWith('\\') ? l.slice(0, -1) : l).trimEnd());
  if (lines.length < headerCount + 1) {
    throw new TableParseError(tooShort(), 'no-table');
  }
  const headerLines = lines.slice(0, headerCount).map(withoutColumnsName);
  const header = headerLines[headerCount - 1];
  let bodyStart = headerCount;
  const firstLabel = header.search(/\S/);
  const candidate = lines[headerCount];
  const namesRow = candidate.length > 0 && firstLabel > 0 && candidate.length <= firstLabel ? candidate : null;
  if (namesRow !== null) {
    bodyStart++;
  }
  const body = lines.slice(bodyStart);
  const width = lines.reduce((w, l) => Math.max(w, l.length), 0);
  const rowEnds = new Set(body.filter(l => !isEllipsisLine(l)).map(l => l.length));
  if (body.length === 0 || rowEnds.size > 1 || !rowEnds.has(lines[headerCount - 1].length)) {
    throw new TableParseError(msg('table.text.not-aligned', 'The text is not a pandas table display: its lines are not aligned in fixed-width columns.'), 'no-table');
  }
  const fields = fieldsOf(body.filter(l => !isEllipsisLine(l)), width);
  const nIndex = fields.findIndex(f => slice(header, f) !== '');
  if (nIndex <= 0) {
    throw new TableParseError(msg('table.text.no-index', 'The text is not a pandas table display: no index column was found left of the column labels.'), 'no-table');
  }
  const indexFields = fields.slice(0, nIndex);
  const dataFields: IField[] = [];
  let pendingStart: number | null = null;
  for (const f of fields.slice(nIndex)) {
    if (slice(header, { start: pendingStart ?? f.start, end: f.end }) === '' || slice(header, f) === '') {
      pendingStart ??= f.start;
      continue;
    }
    dataFields.push({ start: pendingStart ?? f.start, end: f.end });
    pendingStart = null;
  }
  if (pendingStart !== null || dataFields.length === 0) {
    throw new TableParseError(msg('table.text.unlabelled', 'The text is not a pandas table display: some of its columns have no label.'), 'no-table');
  }
  for (let k = 0; k < dataFields.length; k++) {
    const prevEnd = k === 0 ? indexFields[indexFields.length - 1].end : dataFields[k - 1].end;
    dataFields[k] = { start: Math.min(dataFields[k].start, prevEnd + 1), end: dataFields[k].end };
  }
  checkRowAndColumnCounts(body.length, nIndex + dataFields.length, 'text');
  let rowGapAt: number | null = null;
  const rows: string[] = [];
  const indexNotes: ITableNote[] = [];
  const dataNotes: ITableNote[] = [];
  for (const line of body) {
    if (isEllipsisLine(line)) {
      rowGapAt ??= rows.length;
    } else {
      rows.push(line);
    }
  }
  const index = indexFields.map((f, k) => {
    const cells: (string | null)[] = [];
    let previous: string | null = null;
    rows.forEach((line, r) => {
      let t = slice(line, f);
      if (t === '' && nIndex > 1 && k < nIndex - 1) {
        t = previous ?? '';
      }
      if (t.length > TABLE_LIMITS.maxCellChars) {
        throw new TableParseError(
          msg(
            'table.text.index-cell-too-long',
            'The cell in row %1, index level %2 holds %3 characters; at most %4 can be read.',
            wholeNumber(r + 1),
            k + 1,
            wholeNumber(t.length),
            wholeNumber(TABLE_LIMITS.maxCellChars)
          )
        );
      }
      previous = t;
      cells.push(t);
    });
    const nextStart = k + 1 < nIndex ? indexFields[k + 1].start : undefined;
    const name = namesRow !== null ? namesRow.slice(f.start, nextStart).trim() : '';
    return columnFromText(name || (nIndex === 1 ? 'index' : `level_${k}`), cells, { isIndex: true, displayed: true, notes: indexNotes });
  });
  let elidedColumns = 0;
  const data: IColumn[] = [];
  const upper: string[] = headerLines.slice(0, -1).map(() => '');
  for (const f of dataFields) {
    const levels = upper.map((previous, h) => {
      const t = slice(headerLines[h], f);
      upper[h] = t === '' ? previous : t;
      return upper[h];
    });
    const label = [...levels, slice(header, f)].filter(t => t !== '').join(' / ');
    const cells = rows.map(line => slice(line, f));
    if (ELLIPSIS.has(label) && cells.every(c => ELLIPSIS.has(c))) {
      elidedColumns++;
      continue;
    }
    data.push(columnFromText(label, cells, { isIndex: false, displayed: true, notes: dataNotes }));
  }
  return { index, data, rows: rows.length, rowGapAt, elidedColumns, indexNotes, dataNotes };
}

/** One header line, else two to four (MultiIndex columns): the first reading that fits. */
function parseBlockAnyHeader(raw: readonly string[]): IBlock {
  let first: unknown = null;
  for (let h = 1; h <= Math.min(4, raw.length - 1); h++) {
    try {
      return parseBlock(raw, h);
    } catch (e) {
      if (!(e instanceof TableParseError) || e.reason !== 'no-table') {
        throw e;
      }
      first ??= e;
    }
  }
  throw first ?? new TableParseError(tooShort(), 'no-table');
}

function isEllipsisLine(line: string): boolean {
  const tokens = line.trim().split(/\s+/);
  return tokens.length > 0 && tokens.every(t => ELLIPSIS.has(t));
}

/** Parse the plain-text repr of a pandas DataFrame. */
export function parsePandasText(text: string): ITable {
  checkTextSize(text.length, 'text');
  const lines = text.replace(/\r\n?/g, '\n').split('\n');
  while (lines.length > 0 && lines[lines.length - 1].trim() === '') {
    lines.pop();
  }
  let footer: { rows: number; columns: number } | null = null;
  if (lines.length > 0 && /^\[\d+ rows x \d+ columns\]$/.test(lines[lines.length - 1].trim())) {
    footer = shapeFooter(lines.pop() as string);
  }
  const series = lines.length > 1 ? seriesFooter(lines[lines.length - 1]) : null;
  if (series !== null) {
    return parseSeriesLines(lines.slice(0, -1), series);
  }
  if (lines.length > 0 && lines[0].startsWith('Empty DataFrame')) {
    throw new TableParseError(msg('table.text.empty-frame', 'The text shows an empty DataFrame (no rows).'), 'no-table');
  }
  const blocks: string[][] = [[]];
  for (const line of lines) {
    if (line.trim() === '') {
      if (blocks[blocks.length - 1].length > 0) {
        blocks.push([]);
      }
    } else {
      blocks[blocks.length - 1].push(line);
    }
  }
  const parsed = blocks.filter(b => b.length > 0).map(parseBlockAnyHeader);
  if (parsed.length === 0) {
    throw new TableParseError(msg('table.text.empty', 'The text is not a pandas table display: it is empty.'), 'no-table');
  }
  const first = parsed[0];
  const bad = parsed.findIndex(b => b.rows !== first.rows);
  if (bad > 0) {
    throw new TableParseError(
      msg(
        'table.text.blocks-differ',
        'The text is not a pandas table display: wrapped block %1 has %2 rows but block 1 has %3.',
        bad + 1,
        wholeNumber(parsed[bad].rows),
        wholeNumber(first.rows)
      ),
      'no-table'
    );
  }
  const columns = [...first.index, ...parsed.flatMap(b => b.data)];
  // Every wrapped block repeats the index: its notes come from the first block only.
  const notes: ITableNote[] = [...first.indexNotes, ...parsed.flatMap(b => b.dataNotes)];
  const table: ITable = { columns, rowCount: first.rows, format: 'pandas-text', notes };
  const dataColumns = columns.length - first.index.length;
  const elided = parsed.reduce((n, b) => n + b.elidedColumns, 0);
  const truncation: ITruncation = {
    shownRows: first.rows,
    totalRows: footer?.rows ?? null,
    shownColumns: dataColumns,
    totalColumns: footer?.columns ?? null,
    rowGapAt: first.rowGapAt
  };
  const hidden = first.rowGapAt !== null || elided > 0 || (footer !== null && (footer.rows > first.rows || footer.columns > dataColumns));
  addDisplayNotes(table, truncation, hidden, 'text');
  return table;
}
