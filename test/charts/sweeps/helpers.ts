/**
 * Checks shared by the sweep chart tests: compiling without a single
 * Vega-Lite warning, no non-finite number anywhere in a spec, no "NaN" or
 * "Infinity" in any text, and every colour of a spec taken from the theme.
 */
import { expect } from 'vitest';
import { compile } from 'vega-lite';
import type { TopLevelSpec } from 'vega-lite';
import type { ISweepChart } from '../../../src/charts/sweeps/index';
import { categoricalColours, divergingColours, sequentialColours } from '../../../src/charts/theme';
import type { IChartTheme } from '../../../src/charts/theme';

/** A theme of colours no library default uses, so each one found in a spec came from it. */
export const distinctTheme: IChartTheme = {
  background: '#fefdfc',
  text: '#0a0b0c',
  grid: '#d1d2d3',
  accent: '#123abc',
  accent2: '#cba321',
  font: 'serif',
  categorical: ['#a10101', '#02b202', '#0303c3', '#d404d4', '#05e5e5'],
  sequential: ['#f7f1e1', '#c08a40', '#602010'],
  diverging: ['#1a2b8c', '#8c9ad0', '#eeeef0', '#d09a8c', '#8c2b1a']
};

/** Every colour the theme draws with (its series colours and ramps, or theme.ts's own where it gives none), lower case. */
export function themeColours(theme: IChartTheme): Set<string> {
  return new Set([theme.background, theme.text, theme.grid, theme.accent, theme.accent2, ...categoricalColours(theme), ...sequentialColours(theme), ...divergingColours(theme)].map(c => c.toLowerCase()));
}

/** Compiles the spec; fails on any Vega-Lite warning or error. */
export function compilesCleanly(spec: TopLevelSpec): void {
  const said: string[] = [];
  const logger = {
    level(): number {
      return 2;
    },
    error(...args: unknown[]) {
      said.push(`error: ${args.join(' ')}`);
      return this;
    },
    warn(...args: unknown[]) {
      said.push(`warn: ${args.join(' ')}`);
      return this;
    },
    info() {
      return this;
    },
    debug() {
      return this;
    }
  };
  const out = compile(spec, { logger: logger as never });
  expect(said).toEqual([]);
  expect(Array.isArray((out.spec as { data?: unknown[] }).data)).toBe(true);
}

/** Paths of every number in `value` that is not finite (JSON would silently write them as null). */
export function nonFinitePaths(value: unknown, path = '$'): string[] {
  if (typeof value === 'number') {
    return Number.isFinite(value) ? [] : [path];
  }
  if (Array.isArray(value)) {
    return value.flatMap((v, i) => nonFinitePaths(v, `${path}[${i}]`));
  }
  if (value !== null && typeof value === 'object') {
    return Object.entries(value).flatMap(([k, v]) => nonFinitePaths(v, `${path}.${k}`));
  }
  return [];
}

/** Every string in `value`. */
export function strings(value: unknown): string[] {
  if (typeof value === 'string') {
    return [value];
  }
  if (Array.isArray(value)) {
    return value.flatMap(strings);
  }
  if (value !== null && typeof value === 'object') {
    return Object.values(value).flatMap(strings);
  }
  return [];
}

/** Every CSS hex colour in the spec's strings. */
export function coloursIn(spec: TopLevelSpec): Set<string> {
  const out = new Set<string>();
  for (const s of strings(spec)) {
    for (const m of s.match(/#[0-9a-f]{6}\b|#[0-9a-f]{3}\b/gi) ?? []) {
      out.add(m.toLowerCase());
    }
  }
  return out;
}

/** The common checks: compiles cleanly, finite numbers only, no NaN text, theme colours only, no colour scheme. */
export function checkChart(chart: ISweepChart, theme: IChartTheme = distinctTheme): void {
  compilesCleanly(chart.spec);
  expect(nonFinitePaths(chart.spec)).toEqual([]);
  for (const s of [chart.title, chart.caption, ...strings(chart.spec)]) {
    expect(s).not.toMatch(/NaN|Infinity|∞|undefined|null/);
  }
  const allowed = themeColours(theme);
  for (const c of coloursIn(chart.spec)) {
    expect(allowed.has(c), `colour ${c} is not the theme's`).toBe(true);
  }
  expect(JSON.stringify(chart.spec)).not.toContain('"scheme"');
  expect(chart.title.length).toBeGreaterThan(0);
}

interface ILayer {
  data: { values: Record<string, unknown>[] };
  mark: string | { type: string; color?: string };
  encoding: Record<string, { field?: string; scale?: { range?: unknown; domain?: unknown; type?: string } }>;
}

/** The layers of a layered spec. */
export function layers(spec: TopLevelSpec): ILayer[] {
  return (spec as unknown as { layer: ILayer[] }).layer;
}

/** The mark type of a layer. */
export function markOf(l: ILayer): string {
  return typeof l.mark === 'string' ? l.mark : l.mark.type;
}
