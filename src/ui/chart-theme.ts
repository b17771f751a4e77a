/**
 * Reads chart colours from the active JupyterLab theme's CSS variables, so
 * charts follow light and dark themes without hard-coded colours.
 *
 * Series colours and the heat-map ramp may be set by a theme (or a user's
 * CSS) with `--jp-psiscape-chart-category-1` … `-12` and
 * `--jp-psiscape-chart-ramp-1` … `-12` (low to high); where none are set the
 * chart layer's own colour-blind-safe palette applies, its light or its dark
 * set by the background's luminance.
 *
 * `--jp-psiscape-chart-scale` (a number, set on a presenting panel) scales
 * every font, line and point; scaled up on a light background, the series
 * accents take the theme's darker brand and warning colours, for contrast on
 * a projector.
 */
import { paletteFor, relativeLuminance } from '../charts/theme';
import type { IChartTheme } from '../charts/theme';

/** CSS variable holding the chart size factor (unset: 1). */
export const CHART_SCALE_VARIABLE = '--jp-psiscape-chart-scale';

function cssVar(style: CSSStyleDeclaration, name: string): string {
  return style.getPropertyValue(name).trim();
}

/** The values of `--<prefix>-1`, `--<prefix>-2` … that are set, in order (at most 12). */
function cssList(style: CSSStyleDeclaration, prefix: string): string[] {
  const out: string[] = [];
  for (let k = 1; k <= 12; k++) {
    const v = cssVar(style, `${prefix}-${k}`);
    if (v) {
      out.push(v);
    }
  }
  return out;
}

/** The chart theme implied by the CSS variables in effect at `node`. */
export function readChartTheme(node: HTMLElement): IChartTheme {
  const style = getComputedStyle(node);
  const theme: IChartTheme = {
    background: cssVar(style, '--jp-layout-color0') || 'transparent',
    text: cssVar(style, '--jp-ui-font-color1') || 'currentColor',
    grid: cssVar(style, '--jp-border-color2') || 'currentColor',
    accent: cssVar(style, '--jp-brand-color1') || 'currentColor',
    accent2: cssVar(style, '--jp-warn-color1') || 'currentColor',
    font: cssVar(style, '--jp-ui-font-family') || 'sans-serif'
  };
  const palette = paletteFor(theme.background);
  const categorical = cssList(style, '--jp-psiscape-chart-category');
  theme.categorical = categorical.length > 0 ? categorical : palette.categorical.slice();
  const sequential = cssList(style, '--jp-psiscape-chart-ramp');
  theme.sequential = sequential.length >= 2 ? sequential : palette.sequential.slice();
  theme.diverging = palette.diverging.slice();
  const scale = Number.parseFloat(cssVar(style, CHART_SCALE_VARIABLE));
  if (Number.isFinite(scale) && scale > 0 && scale !== 1) {
    theme.scale = scale;
    const light = (relativeLuminance(theme.background) ?? 1) >= 0.18;
    if (scale > 1 && light) {
      theme.accent = cssVar(style, '--jp-brand-color0') || theme.accent;
      theme.accent2 = cssVar(style, '--jp-warn-color0') || theme.accent2;
    }
  }
  return theme;
}
