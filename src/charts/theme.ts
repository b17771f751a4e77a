/**
 * Colours and font a chart is drawn with. The UI layer reads them from the
 * JupyterLab theme's CSS variables, so charts follow light and dark themes;
 * spec builders only place them in the Vega-Lite `config`.
 */
import type { Config } from 'vega-lite';

/** Colours and font of a chart (CSS colour strings and a font family). */
export interface IChartTheme {
  /** Plot background. */
  background: string;
  /** Axis labels, titles and legend text. */
  text: string;
  /** Grid lines and axis domain. */
  grid: string;
  /** Colour of data marks. */
  accent: string;
  /** Colour of a second series (fits, overlays). */
  accent2: string;
  /** Font family for all chart text. */
  font: string;
  /**
   * Colours of unordered series (one per field change, per H_min …), in
   * order; {@link DEFAULT_CATEGORICAL} when omitted.
   */
  categorical?: readonly string[];
  /**
   * Sequential ramp from the lowest to the highest value of a colour scale
   * (heat maps), at least two colours; {@link DEFAULT_SEQUENTIAL} when omitted.
   */
  sequential?: readonly string[];
  /**
   * Diverging ramp from the most negative to the most positive value of a
   * scale centred on zero (correlations), at least three colours, an odd
   * number so the middle one sits at zero; {@link DEFAULT_DIVERGING} when
   * omitted.
   */
  diverging?: readonly string[];
}

/**
 * Series colours when the theme gives none: the Okabe–Ito palette (told
 * apart with the common colour-vision deficiencies), its black left out so
 * it reads on dark backgrounds too.
 */
export const DEFAULT_CATEGORICAL: readonly string[] = Object.freeze(['#0072B2', '#E69F00', '#009E73', '#CC79A7', '#56B4E9', '#D55E00', '#F0E442']);

/**
 * Sequential ramp when the theme gives none: pale yellow through orange and
 * red to deep purple, lightness falling monotonically, so the order of the
 * values survives colour-vision deficiencies and greyscale printing.
 */
export const DEFAULT_SEQUENTIAL: readonly string[] = Object.freeze(['#FCF4C4', '#F9CF7A', '#F19A4B', '#D9603B', '#A63556', '#6B1F66', '#2E1646']);

/**
 * Diverging ramp when the theme gives none: blue through a pale neutral to
 * red, lightness rising to the middle and falling again on both sides, so
 * the sign reads by hue and the size by lightness (also in greyscale).
 */
export const DEFAULT_DIVERGING: readonly string[] = Object.freeze(['#2166AC', '#4393C3', '#92C5DE', '#F7F7F7', '#F4A582', '#D6604D', '#B2182B']);

/** The theme's series colours, or {@link DEFAULT_CATEGORICAL}. */
export function categoricalColours(theme: IChartTheme): string[] {
  const own = (theme.categorical ?? []).filter(c => typeof c === 'string' && c.length > 0);
  return own.length > 0 ? own.slice() : DEFAULT_CATEGORICAL.slice();
}

/** The theme's sequential ramp (low to high), or {@link DEFAULT_SEQUENTIAL}. */
export function sequentialColours(theme: IChartTheme): string[] {
  const own = (theme.sequential ?? []).filter(c => typeof c === 'string' && c.length > 0);
  return own.length >= 2 ? own.slice() : DEFAULT_SEQUENTIAL.slice();
}

/** The theme's diverging ramp (negative to positive), or {@link DEFAULT_DIVERGING}. */
export function divergingColours(theme: IChartTheme): string[] {
  const own = (theme.diverging ?? []).filter(c => typeof c === 'string' && c.length > 0);
  return own.length >= 3 ? own.slice() : DEFAULT_DIVERGING.slice();
}

/** Vega-Lite `config` block for a theme. */
export function themeConfig(theme: IChartTheme): Config {
  return {
    background: theme.background,
    font: theme.font,
    view: { stroke: theme.grid },
    axis: {
      domainColor: theme.grid,
      gridColor: theme.grid,
      gridOpacity: 0.5,
      tickColor: theme.grid,
      labelColor: theme.text,
      titleColor: theme.text
    },
    legend: { labelColor: theme.text, titleColor: theme.text },
    title: { color: theme.text }
  };
}
