/**
 * The one top-level frame of every chart: the Vega-Lite schema, an
 * accessible description, an optional title, the full container width with
 * axes and legends kept inside (autosize fit, padding included), and the
 * theme's config (background, font, axis, legend and title colours). A chart
 * body is either layers or a single view; both are typed with Vega-Lite's own
 * spec types, so a builder never needs a cast.
 */
import type { TopLevelSpec } from 'vega-lite';
import type { Field } from 'vega-lite/types_unstable/channeldef.js';
import type { LayerSpec, TopLevelUnitSpec, UnitSpec } from 'vega-lite/types_unstable/spec/index.js';
import type { IChartTheme } from './theme';
import { scaleBody, themeConfig } from './theme';

/** Vega-Lite's channel definitions, for encodings shared by several layers. */
export type { ColorDef, Field, PositionFieldDef } from 'vega-lite/types_unstable/channeldef.js';

/** The Vega-Lite version every spec is written for. */
export const VEGA_LITE_SCHEMA = 'https://vega.github.io/schema/vega-lite/v6.json';

/**
 * Name of the parameter holding a live title's text: a drawn view takes a new
 * title through this signal, with no new spec (see {@link IChartFrame.liveTitle}).
 */
export const TITLE_PARAM = 'chart_title';

/** Height of a chart in px unless its builder says otherwise. */
export const DEFAULT_CHART_HEIGHT = 300;

/** One layer of a layered chart: a single view or a nested layer. */
export type ChartLayer = UnitSpec<Field> | LayerSpec<Field>;

/** How the layers of a chart share or separate scales, axes and legends. */
export type ChartResolve = NonNullable<LayerSpec<Field>['resolve']>;

/** The body of a single-view chart (data, mark, encoding …) without the frame. */
export type ChartView = Omit<TopLevelUnitSpec<Field>, '$schema' | 'description' | 'title' | 'width' | 'height' | 'autosize' | 'config'>;

/** What the frame needs besides the body. */
export interface IChartFrame {
  /** Accessible description of the chart. */
  description: string;
  theme: IChartTheme;
  /** Title drawn above the chart, optionally with a subtitle (one line, or one string per line); none when omitted. */
  title?: string | { text: string; subtitle?: string | string[] };
  /** Height in px (default {@link DEFAULT_CHART_HEIGHT}). */
  height?: number;
  /** The title's text is the {@link TITLE_PARAM} parameter (its value the title given), so a view can change it in place. */
  liveTitle?: boolean;
}

/** A title no wider than the plot: a longer one ends in an ellipsis (the description keeps it whole). */
const TITLE_LIMIT = { expr: 'width' };

function titleOf(frame: IChartFrame): object {
  if (frame.title === undefined) {
    return {};
  }
  const given = typeof frame.title === 'string' ? { text: frame.title } : frame.title;
  if (!frame.liveTitle) {
    return { title: { ...given, limit: TITLE_LIMIT } };
  }
  return { params: [{ name: TITLE_PARAM, value: given.text }], title: { ...given, text: { expr: TITLE_PARAM }, limit: TITLE_LIMIT } };
}

function envelope(frame: IChartFrame) {
  return {
    $schema: VEGA_LITE_SCHEMA,
    description: frame.description,
    ...titleOf(frame),
    width: 'container' as const,
    height: frame.height ?? DEFAULT_CHART_HEIGHT,
    autosize: { type: 'fit' as const, contains: 'padding' as const }
  };
}

/** A themed top-level layered spec; `resolve` separates scales or legends of the layers. */
export function layeredChart(layer: ChartLayer[], frame: IChartFrame, resolve?: ChartResolve): TopLevelSpec {
  return {
    ...envelope(frame),
    layer: scaleBody(layer, frame.theme),
    ...(resolve ? { resolve } : {}),
    config: themeConfig(frame.theme)
  };
}

/** A themed top-level single-view spec. */
export function singleViewChart(view: ChartView, frame: IChartFrame): TopLevelSpec {
  return {
    ...envelope(frame),
    ...scaleBody(view, frame.theme),
    config: themeConfig(frame.theme)
  };
}
