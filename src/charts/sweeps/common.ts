/**
 * Shared pieces of the sweep chart builders: what a builder returns, the
 * options every builder takes, display units, number labels that never read
 * "NaN", and the test for numbers placed in data rows. The frame is
 * `../frame.ts`.
 */
import type { TopLevelSpec } from 'vega-lite';
import { formatNumberArg } from '../../core/messages';
import type { IValueSigma } from '../../core/sweeps/index';

/** A spec with how many rows it plots and the words that go with it. */
export interface ISweepChart {
  spec: TopLevelSpec;
  /** Number of data rows over all layers. */
  rows: number;
  /** Short title of the view (plain text, English; never contains "NaN"). */
  title: string;
  /**
   * One line with the numbers the view rests on (Tc, exponents, cost …),
   * or a plain statement that they are unknown; '' when there is nothing to say.
   */
  caption: string;
}

/**
 * A unit to show a quantity in: its name and its size, as how many of it
 * make one SI unit (shown value = SI value × perSI; e.g. Oe: perSI = 4π/1000).
 */
export interface IDisplayUnit {
  unit: string;
  perSI: number;
}

/**
 * A display unit, or the name of the unit the values already are in (no
 * conversion: the set's own magnetisation unit, or 'A/m' for fields).
 */
export type UnitOption = string | IDisplayUnit;

/** Options every sweep builder takes. */
export interface ISweepChartOptions {
  /** Unit of the field on axes, in legends and captions (default A/m, the set's unit). */
  fieldUnit?: UnitOption;
  /** Unit of the magnetisation (default A/m; pass the set's `magnetisationUnit` for a mass magnetisation). */
  magnetisationUnit?: UnitOption;
  /** 'internal' (H_int = H_a − N_d·M) or 'applied' field, written into axis titles (default 'internal'). */
  fieldKind?: 'internal' | 'applied';
  /** Most points drawn (default `DISPLAY_MAX_POINTS`); more are reduced for display. */
  maxPoints?: number;
  /** Draw the title and caption above the chart (default false: the page shows them). */
  showTitle?: boolean;
  /** Height in px (frame default when omitted). */
  height?: number;
}

/** True for a finite number. */
export function finite(v: number): boolean {
  return typeof v === 'number' && Number.isFinite(v);
}

/** The display unit of an option; a bad size falls back to the SI unit. */
export function displayUnit(u: UnitOption | undefined, si: string): IDisplayUnit {
  if (u === undefined) {
    return { unit: si, perSI: 1 };
  }
  if (typeof u === 'string') {
    return { unit: u || si, perSI: 1 };
  }
  return finite(u.perSI) && u.perSI > 0 && u.unit ? { unit: u.unit, perSI: u.perSI } : { unit: si, perSI: 1 };
}

/** A finite number as text (`digits` significant digits), else `missing`. */
export function fmt(v: number, digits = 4, missing = 'unknown'): string {
  return finite(v) ? formatNumberArg(v, digits) : missing;
}

/** "value ± σ" from finite numbers only: the value alone without a finite σ, `missing` without a finite value. */
export function fmtSigma(v: IValueSigma | null | undefined, digits = 4, missing = 'unknown'): string {
  if (!v || !finite(v.value)) {
    return missing;
  }
  return finite(v.sigma) && v.sigma > 0 ? `${formatNumberArg(v.value, digits)} ± ${formatNumberArg(v.sigma, 2)}` : formatNumberArg(v.value, digits);
}

/** How the field is named in axis titles. */
export function fieldWords(kind: 'internal' | 'applied' | undefined): { name: string; symbol: string } {
  return kind === 'applied' ? { name: 'applied field', symbol: 'H_a' } : { name: 'internal field', symbol: 'H_int' };
}

/** The rows whose every numeric value is finite (strings and booleans pass). */
export function finiteRows<R extends object>(rows: readonly R[]): R[] {
  return rows.filter(r => Object.values(r).every(v => typeof v !== 'number' || Number.isFinite(v)));
}

/** The frame's title for a chart: title and caption when asked for, else none. */
export function frameTitle(title: string, caption: string, options: ISweepChartOptions | undefined): { text: string; subtitle?: string } | undefined {
  if (!options?.showTitle) {
    return undefined;
  }
  return caption ? { text: title, subtitle: caption } : { text: title };
}

/** "name = value ± σ unit" from finite numbers, else "name unknown". */
export function named(name: string, v: IValueSigma | null | undefined, unit = '', digits = 4): string {
  return v && finite(v.value) ? `${name} = ${fmtSigma(v, digits)}${unit ? ` ${unit}` : ''}` : `${name} unknown`;
}
