/**
 * Reads chart colours from the active JupyterLab theme's CSS variables, so
 * charts follow light and dark themes without hard-coded colours.
 */
import type { IChartTheme } from '../charts/theme';

function cssVar(style: CSSStyleDeclaration, name: string): string {
  return style.getPropertyValue(name).trim();
}

/** The chart theme implied by the CSS variables in effect at `node`. */
export function readChartTheme(node: HTMLElement): IChartTheme {
  const style = getComputedStyle(node);
  return {
    background: cssVar(style, '--jp-layout-color0') || 'transparent',
    text: cssVar(style, '--jp-ui-font-color1') || 'currentColor',
    grid: cssVar(style, '--jp-border-color2') || 'currentColor',
    accent: cssVar(style, '--jp-brand-color1') || 'currentColor',
    accent2: cssVar(style, '--jp-warn-color1') || 'currentColor',
    font: cssVar(style, '--jp-ui-font-family') || 'sans-serif'
  };
}
