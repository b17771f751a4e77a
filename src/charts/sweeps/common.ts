/**
 * Shared pieces of the sweep chart builders: the top-level frame and the
 * rounding of numbers placed in data rows.
 */
import type { TopLevelSpec } from 'vega-lite';
import type { IChartTheme } from '../theme';
import { themeConfig } from '../theme';

/** Layers and data of a chart, without the frame. */
export interface IChartBody {
  description: string;
  layer: unknown[];
  /** Number of data rows over all layers. */
  rows: number;
}

/** A spec with how many rows it plots. */
export interface ISweepChart {
  spec: TopLevelSpec;
  rows: number;
}

/** Wraps layers into a themed top-level layered spec. */
export function frame(body: IChartBody, theme: IChartTheme, height = 300): ISweepChart {
  const spec = {
    $schema: 'https://vega.github.io/schema/vega-lite/v6.json',
    description: body.description,
    width: 'container',
    height,
    autosize: { type: 'fit', contains: 'padding' },
    layer: body.layer,
    config: themeConfig(theme)
  } as unknown as TopLevelSpec;
  return { spec, rows: body.rows };
}

/** True for a finite number. */
export function finite(v: number): boolean {
  return typeof v === 'number' && Number.isFinite(v);
}
