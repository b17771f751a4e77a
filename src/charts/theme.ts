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
