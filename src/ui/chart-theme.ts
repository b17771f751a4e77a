/**
 * Reads chart colours from the active JupyterLab theme's CSS variables, so
 * charts follow light and dark themes without hard-coded colours.
 *
 * Series colours and the heat-map ramp may be set by a theme (or a user's
 * CSS) with `--jp-psiscape-chart-category-1` … `-12` and
 * `--jp-psiscape-chart-ramp-1` … `-12` (low to high); where none are set the
 * chart layer's own colour-blind-safe defaults apply.
 */
import type { IChartTheme } from '../charts/theme';

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
  const categorical = cssList(style, '--jp-psiscape-chart-category');
  if (categorical.length > 0) {
    theme.categorical = categorical;
  }
  const sequential = cssList(style, '--jp-psiscape-chart-ramp');
  if (sequential.length >= 2) {
    theme.sequential = sequential;
  }
  return theme;
}
