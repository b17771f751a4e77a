/**
 * Shared pieces of the Landau chart builders: the kinds of stationary points
 * with their legend order, and the themed top-level frame.
 */
import type { TopLevelSpec } from 'vega-lite';
import type { StationaryKind } from '../../core/physics/landau/index';
import type { IChartTheme } from '../theme';
import { themeConfig } from '../theme';

/** Kinds of stationary point, as classified by the Landau numerics. */
export type LandauPointKind = StationaryKind;

/** Legend order of the kinds. */
export const KIND_ORDER: readonly LandauPointKind[] = ['stable', 'metastable', 'unstable', 'inflection'];

/** Display text of each kind (translated by the caller). */
export type IKindLabels = Record<LandauPointKind, string>;

/** English kind labels used when the caller gives none. */
export const DEFAULT_KIND_LABELS: IKindLabels = {
  stable: 'stable',
  metastable: 'metastable',
  unstable: 'unstable',
  inflection: 'inflection'
};

/** Colour of each kind: stable = accent, metastable = accent2, unstable = text, inflection = grid. */
export function kindColours(theme: IChartTheme): Record<LandauPointKind, string> {
  return { stable: theme.accent, metastable: theme.accent2, unstable: theme.text, inflection: theme.grid };
}

/** A spec with the number of data rows it plots. */
export interface ILandauChart {
  spec: TopLevelSpec;
  rows: number;
}

/** True for a finite number. */
export function finite(v: number): boolean {
  return typeof v === 'number' && Number.isFinite(v);
}

/** Wraps layers into a themed top-level layered spec. */
export function frame(description: string, layer: unknown[], theme: IChartTheme, resolve?: Record<string, unknown>): TopLevelSpec {
  return {
    $schema: 'https://vega.github.io/schema/vega-lite/v6.json',
    description,
    width: 'container',
    height: 300,
    autosize: { type: 'fit', contains: 'padding' },
    layer,
    ...(resolve ? { resolve } : {}),
    config: themeConfig(theme)
  } as unknown as TopLevelSpec;
}

/**
 * Encoding of the stationary-point kind by one visual channel: the kinds
 * `shown` (in legend order) with their labels mapped to `range(kind)`.
 */
export function kindEncoding(
  title: string,
  shown: readonly LandauPointKind[],
  labels: IKindLabels,
  range: (kind: LandauPointKind) => unknown,
  legend: boolean
): Record<string, unknown> {
  return {
    field: 'kind',
    type: 'nominal',
    title,
    scale: { domain: shown.map(k => labels[k]), range: shown.map(range) },
    ...(legend ? { legend: { orient: 'bottom' } } : {})
  };
}
