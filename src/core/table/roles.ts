/**
 * Which columns of a table can be plotted, and the default x/y pair.
 */
import type { IColumn, ITable } from './types';

/** A plottable (numeric) column and its position in the table. */
export interface IPlottableColumn {
  index: number;
  column: IColumn;
  /** Header with unit, as shown on axes and in pickers. */
  label: string;
}

/** Axis label of a column: its name with the unit in parentheses when known. */
export function columnLabel(column: IColumn): string {
  return column.unit ? `${column.name} (${column.unit})` : column.name;
}

/** Numeric columns of a table, in table order. */
export function plottableColumns(table: ITable): IPlottableColumn[] {
  const out: IPlottableColumn[] = [];
  table.columns.forEach((column, index) => {
    if (column.kind === 'number') {
      out.push({ index, column, label: columnLabel(column) });
    }
  });
  return out;
}

/**
 * Default pair: x is the first numeric data column, y the next one. Index
 * columns are used only when there are not enough data columns.
 *
 * @returns null when fewer than two numeric columns exist.
 */
export function defaultPair(columns: IPlottableColumn[]): { x: number; y: number } | null {
  if (columns.length < 2) {
    return null;
  }
  const data = columns.filter(c => !c.column.isIndex);
  const pool = data.length >= 2 ? data : columns;
  return { x: pool[0].index, y: pool[1].index };
}

/**
 * The column most likely to hold the standard deviations of column `y`:
 * `sigma_<y>`, `<y>_err`, `<y>_sigma`, `d<y>`, `err_<y>`, or a lone `sigma`/`err`/`error`
 * column. Returns its index, or null.
 */
export function guessSigmaColumn(columns: IPlottableColumn[], y: number): number | null {
  const target = columns.find(c => c.index === y);
  if (!target) {
    return null;
  }
  const name = target.column.name.toLowerCase();
  const wanted = new Set([`sigma_${name}`, `${name}_err`, `${name}_sigma`, `d${name}`, `err_${name}`, `${name}_error`]);
  const named = columns.find(c => c.index !== y && wanted.has(c.column.name.toLowerCase()));
  if (named) {
    return named.index;
  }
  const generic = columns.filter(c => c.index !== y && ['sigma', 'err', 'error', 'std'].includes(c.column.name.toLowerCase()));
  return generic.length === 1 ? generic[0].index : null;
}

/** The columns of a long-format table of M(H) isotherms. */
export type IsothermRole = 'temperature' | 'field' | 'magnetisation';

/** Header names (without unit) that suggest each isotherm role. */
const ISOTHERM_NAMES: Record<IsothermRole, RegExp> = {
  temperature: /^(t|temp|temperature|t_?set|t_?sample)\b/i,
  field: /^(h|b|mu0_?h|μ0h|field|h_?applied)\b/i,
  magnetisation: /^(m|moment|magnetisation|magnetization|sigma)\b/i
};

/**
 * The first numeric column whose name suggests each isotherm role (index into
 * the table's columns), or null; and whether the table looks like field
 * sweeps at all (three numeric columns, one of them a field).
 */
export function guessIsothermRoles(table: ITable | null): { looksLikeSweeps: boolean; roles: Record<IsothermRole, number | null> } {
  const numeric = plottableColumns(table ?? { columns: [], rowCount: 0, format: 'csv', notes: [] });
  const find = (role: IsothermRole) => numeric.find(c => ISOTHERM_NAMES[role].test(c.column.name))?.index ?? null;
  const roles = { temperature: find('temperature'), field: find('field'), magnetisation: find('magnetisation') };
  return { looksLikeSweeps: numeric.length >= 3 && roles.field !== null, roles };
}
