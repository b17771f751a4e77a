/**
 * From HTML text to a rectangular grid of cell texts, via parse5's inert tree.
 * Nothing is executed or rendered: only text nodes are read; script, style and
 * template contents are skipped. Rowspan/colspan are expanded as the HTML table
 * model does (spans do not cross thead/tbody/tfoot sections).
 *
 * The text is parsed as a document, not as a fragment: parse5 finishes a
 * fragment by moving every top-level node out of its root one at a time, each
 * move removing the root's first child from an array, which takes time
 * quadratic in the number of top-level nodes (100 000 small tables: seconds).
 * Tables are found the same way in both trees. Only the first
 * `MAX_HTML_TABLES` (`./htmldepth.ts`) tables are parsed at all.
 */
import { parse } from 'parse5';
import type { DefaultTreeAdapterTypes } from 'parse5';
import { msg } from '../messages';
import type { ICoreMessage } from '../messages';
import { wholeNumber } from '../numeric/messageArgs';
import { checkHtmlDepth } from './htmldepth';
import { checkRowAndColumnCounts } from './limits';
import { TABLE_LIMITS, TableParseError } from './types';

type Node = DefaultTreeAdapterTypes.Node;
type Element = DefaultTreeAdapterTypes.Element;

/** One expanded grid cell. */
export interface IGridCell {
  text: string;
  /** From a `th` element. */
  isHeader: boolean;
}

/** The grid of one table: header rows (thead) and body rows. */
export interface IHtmlGrid {
  head: IGridCell[][];
  body: IGridCell[][];
  /** All text outside the chosen table (e.g. pandas' "N rows × M columns" line). */
  outsideText: string;
  /** How many tables the markup held (of those examined). */
  tableCount: number;
  /** True when the markup held more than `MAX_HTML_TABLES` tables and only that many were examined. */
  tablesCapped: boolean;
}

const SKIPPED = new Set(['script', 'style', 'template', 'noscript', 'iframe', 'object', 'svg', 'math']);

function isElement(n: Node): n is Element {
  return 'tagName' in n;
}

function children(n: Node): Node[] {
  return 'childNodes' in n ? n.childNodes : [];
}

function attr(el: Element, name: string): string | undefined {
  return el.attrs.find(a => a.name === name)?.value;
}

function span(el: Element, name: string, max: number): number {
  const v = Number.parseInt(attr(el, name) ?? '1', 10);
  return Number.isFinite(v) && v >= 1 ? Math.min(v, max) : 1;
}

/** Where a cell is: its section and its 1-based row (within the section) and column. */
interface ICellPlace {
  section: 'header' | 'body';
  row: number;
  column: number;
}

/** A cell nested deeper than the limit. */
function cellTooDeep(p: ICellPlace): ICoreMessage {
  return p.section === 'header'
    ? msg('table.html.header-cell-too-deep', 'The cell in header row %1, column %2 is nested more than %3 elements deep.', wholeNumber(p.row), wholeNumber(p.column), TABLE_LIMITS.maxDepth)
    : msg('table.html.body-cell-too-deep', 'The cell in body row %1, column %2 is nested more than %3 elements deep.', wholeNumber(p.row), wholeNumber(p.column), TABLE_LIMITS.maxDepth);
}

/** A cell holding more text than the limit. */
function cellTooLong(p: ICellPlace): ICoreMessage {
  const max = wholeNumber(TABLE_LIMITS.maxCellChars);
  return p.section === 'header'
    ? msg('table.html.header-cell-too-long', 'The cell in header row %1, column %2 holds more than %3 characters, the most that can be read.', wholeNumber(p.row), wholeNumber(p.column), max)
    : msg('table.html.body-cell-too-long', 'The cell in body row %1, column %2 holds more than %3 characters, the most that can be read.', wholeNumber(p.row), wholeNumber(p.column), max);
}

/** A cell whose spans would fill more grid cells than the budget. */
function cellSpansTooMuch(p: ICellPlace, rowspan: number, colspan: number): ICoreMessage {
  const args = [wholeNumber(p.row), wholeNumber(p.column), wholeNumber(rowspan), wholeNumber(colspan), wholeNumber(MAX_GRID_CELLS)];
  return p.section === 'header'
    ? msg('table.html.header-cell-spans', 'The cell in header row %1, column %2 spans %3 rows × %4 columns; the table would exceed %5 cells.', ...args)
    : msg('table.html.body-cell-spans', 'The cell in body row %1, column %2 spans %3 rows × %4 columns; the table would exceed %5 cells.', ...args);
}

/** Text of a subtree (iterative), whitespace collapsed; refuses over-deep or over-long cells. */
function cellText(cell: Element, where: () => ICellPlace): string {
  const parts: string[] = [];
  let length = 0;
  const stack: [Node, number][] = [[cell, 0]];
  while (stack.length > 0) {
    const [node, depth] = stack.pop() as [Node, number];
    if (depth > TABLE_LIMITS.maxDepth) {
      throw new TableParseError(cellTooDeep(where()));
    }
    if (node.nodeName === '#text') {
      const value = (node as DefaultTreeAdapterTypes.TextNode).value;
      length += value.length;
      if (length > TABLE_LIMITS.maxCellChars * 2) {
        throw new TableParseError(cellTooLong(where()));
      }
      parts.push(value);
      continue;
    }
    if (isElement(node) && node !== cell && SKIPPED.has(node.tagName)) {
      continue;
    }
    if (isElement(node) && node.tagName === 'br') {
      parts.push(' ');
    }
    const kids = children(node);
    for (let i = kids.length - 1; i >= 0; i--) {
      stack.push([kids[i], depth + 1]);
    }
  }
  const text = parts.join('').replace(/\s+/g, ' ').trim();
  if (text.length > TABLE_LIMITS.maxCellChars) {
    throw new TableParseError(cellTooLong(where()));
  }
  return text;
}

/** Find the tables of a tree without recursion; returns tables in document order and the text outside them. */
function findTables(root: Node): { tables: Element[]; outside: string } {
  const tables: Element[] = [];
  const outside: string[] = [];
  const stack: Node[] = [root];
  while (stack.length > 0) {
    const node = stack.pop() as Node;
    if (node.nodeName === '#text') {
      outside.push((node as DefaultTreeAdapterTypes.TextNode).value);
      continue;
    }
    if (isElement(node) && node.tagName === 'table') {
      tables.push(node);
      continue;
    }
    if (isElement(node) && SKIPPED.has(node.tagName)) {
      continue;
    }
    const kids = children(node);
    for (let i = kids.length - 1; i >= 0; i--) {
      stack.push(kids[i]);
    }
  }
  return { tables, outside: outside.join(' ').replace(/\s+/g, ' ') };
}

/** Rows of a table grouped by section (thead first, then tbody/tr, then tfoot). */
function sections(table: Element): { head: Element[][]; body: Element[][] } {
  const head: Element[][] = [];
  const body: Element[][] = [];
  const loose: Element[] = [];
  const foot: Element[][] = [];
  for (const child of table.childNodes) {
    if (!isElement(child)) {
      continue;
    }
    const rows = child.childNodes.filter((r): r is Element => isElement(r) && r.tagName === 'tr');
    if (child.tagName === 'thead') {
      head.push(rows);
    } else if (child.tagName === 'tbody') {
      body.push(rows);
    } else if (child.tagName === 'tfoot') {
      foot.push(rows);
    } else if (child.tagName === 'tr') {
      loose.push(child);
    }
  }
  if (loose.length > 0) {
    body.push(loose);
  }
  return { head, body: [...body, ...foot] };
}

/** Expand one section's rows into grid rows (HTML table model for spans). */
/**
 * Most grid cells the span expansion may fill (10 million). Spans let a few bytes of
 * markup claim rows × columns cells, so the expansion itself is budgeted.
 */
export const MAX_GRID_CELLS = 10_000_000;

function expandSection(rows: Element[], firstRow: number, section: 'header' | 'body', budget: { cells: number }): IGridCell[][] {
  const grid: IGridCell[][] = rows.map(() => []);
  rows.forEach((tr, r) => {
    const out = grid[r];
    let c = 0;
    for (const cell of tr.childNodes) {
      if (!isElement(cell) || (cell.tagName !== 'td' && cell.tagName !== 'th')) {
        continue;
      }
      while (out[c] !== undefined) {
        c++;
      }
      const colspan = span(cell, 'colspan', TABLE_LIMITS.maxColumns + 1);
      const rowspan = span(cell, 'rowspan', rows.length - r);
      const col = c;
      const text = cellText(cell, () => ({ section, row: firstRow + r + 1, column: col + 1 }));
      const value: IGridCell = { text, isHeader: cell.tagName === 'th' };
      if (c + colspan > TABLE_LIMITS.maxColumns) {
        throw new TableParseError(
          msg(
            'table.html.row-too-wide',
            'Row %1 of the HTML table reaches column %2; at most %3 columns can be read.',
            wholeNumber(firstRow + r + 1),
            wholeNumber(c + colspan),
            wholeNumber(TABLE_LIMITS.maxColumns)
          )
        );
      }
      budget.cells += rowspan * colspan;
      if (budget.cells > MAX_GRID_CELLS) {
        throw new TableParseError(cellSpansTooMuch({ section, row: firstRow + r + 1, column: c + 1 }, rowspan, colspan));
      }
      for (let dr = 0; dr < rowspan; dr++) {
        for (let dc = 0; dc < colspan; dc++) {
          grid[r + dr][c + dc] = value;
        }
      }
      c += colspan;
    }
  });
  return grid;
}

/** Parse HTML text and return the grid of its first pandas table (class "dataframe"), else its first table. */
export function htmlGrid(html: string): IHtmlGrid | null {
  if (!/<table/i.test(html)) {
    return null;
  }
  const { tablesEndAt } = checkHtmlDepth(html);
  const tree = parse(tablesEndAt === null ? html : html.slice(0, tablesEndAt));
  const { tables, outside } = findTables(tree);
  if (tables.length === 0) {
    return null;
  }
  const table = tables.find(t => /(^|\s)dataframe(\s|$)/.test(attr(t, 'class') ?? '')) ?? tables[0];
  const { head, body } = sections(table);
  const budget = { cells: 0 };
  const headGrid: IGridCell[][] = [];
  for (const rows of head) {
    for (const row of expandSection(rows, headGrid.length, 'header', budget)) {
      headGrid.push(row);
    }
  }
  const bodyRowCount = body.reduce((n, rows) => n + rows.length, 0);
  checkRowAndColumnCounts(bodyRowCount, 0, 'HTML');
  const bodyGrid: IGridCell[][] = [];
  for (const rows of body) {
    for (const row of expandSection(rows, bodyGrid.length, 'body', budget)) {
      bodyGrid.push(row);
    }
  }
  return { head: headGrid, body: bodyGrid, outsideText: outside, tableCount: tables.length, tablesCapped: tablesEndAt !== null };
}
