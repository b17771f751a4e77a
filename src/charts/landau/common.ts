/**
 * Shared pieces of the Landau chart builders: the kinds of stationary points
 * with their legend order, colours and encoding. The frame is `../frame.ts`.
 */
import type { TopLevelSpec } from 'vega-lite';
import type { StationaryKind } from '../../core/physics/landau/index';
import type { IChartTheme } from '../theme';

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

/**
 * A nominal encoding of the stationary-point kind: the kinds' labels as the
 * scale domain, mapped to one value of a visual channel each (colour, shape
 * or dash pattern), with or without a legend at the bottom.
 */
export interface IKindEncoding<V extends string | number[]> {
  field: 'kind';
  type: 'nominal';
  title: string;
  scale: { domain: string[]; range: V[] };
  legend?: { orient: 'bottom' };
}

/**
 * Encoding of the stationary-point kind by one visual channel: the kinds
 * `shown` (in legend order) with their labels mapped to `range(kind)`.
 */
export function kindEncoding<V extends string | number[]>(
  title: string,
  shown: readonly LandauPointKind[],
  labels: IKindLabels,
  range: (kind: LandauPointKind) => V,
  legend: boolean
): IKindEncoding<V> {
  return {
    field: 'kind',
    type: 'nominal',
    title,
    scale: { domain: shown.map(k => labels[k]), range: shown.map(range) },
    ...(legend ? { legend: { orient: 'bottom' } } : {})
  };
}
