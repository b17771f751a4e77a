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
  /**
   * Size factor of everything drawn (1 when omitted): font sizes, line and
   * stroke widths and dashes are multiplied by it, point areas by its square
   * (so a point's diameter grows by the same factor as a line's width). The
   * presenter view draws with the `presenterScale` setting here.
   */
  scale?: number;
}

/**
 * psiscape's own palette, defined here once: series colours and ramps for
 * light backgrounds and for dark ones. The series colours are the
 * Okabe–Ito hues (told apart with the common colour-vision deficiencies),
 * darkened for light backgrounds so each has a contrast of at least 4.5:1
 * on white, and brightened for dark ones so each has at least 7:1 on #111.
 */
export const PALETTE = Object.freeze({
  light: Object.freeze({
    categorical: Object.freeze(['#0072B2', '#C25400', '#007F5F', '#B4478A', '#8A6D00', '#7D4BA8']),
    /** Pale yellow through orange and red to deep purple: low values pale, near the background. */
    sequential: Object.freeze(['#FCF4C4', '#F9CF7A', '#F19A4B', '#D9603B', '#A63556', '#6B1F66', '#2E1646']),
    /** Blue through a pale neutral to red, lightness rising to the middle and falling on both sides. */
    diverging: Object.freeze(['#2166AC', '#4393C3', '#92C5DE', '#F7F7F7', '#F4A582', '#D6604D', '#B2182B'])
  }),
  dark: Object.freeze({
    categorical: Object.freeze(['#56B4E9', '#FF7A45', '#2CC79A', '#E48BC0', '#F0E442', '#A89BFF']),
    /** The light ramp reversed: low values dark, near the background. */
    sequential: Object.freeze(['#2E1646', '#6B1F66', '#A63556', '#D9603B', '#F19A4B', '#F9CF7A', '#FCF4C4']),
    /** Pale blue through a dark neutral to pale red, lightness falling to the middle. */
    diverging: Object.freeze(['#9CCBEA', '#4A93C8', '#245A8C', '#2A2A2E', '#9A3A2C', '#D8664F', '#F6AE8E'])
  })
});

/** Series colours when the theme gives none (the light-background set of {@link PALETTE}). */
export const DEFAULT_CATEGORICAL: readonly string[] = PALETTE.light.categorical;

/**
 * Sequential ramp when the theme gives none (light backgrounds): lightness
 * falling monotonically, so the order of the values survives colour-vision
 * deficiencies and greyscale printing.
 */
export const DEFAULT_SEQUENTIAL: readonly string[] = PALETTE.light.sequential;

/**
 * Diverging ramp when the theme gives none (light backgrounds): the sign
 * reads by hue and the size by lightness (also in greyscale).
 */
export const DEFAULT_DIVERGING: readonly string[] = PALETTE.light.diverging;

/** Relative luminance (WCAG 2) of a `#rgb` / `#rrggbb` / `rgb()` / `rgba()` colour, or null when it cannot be read. */
export function relativeLuminance(colour: string): number | null {
  const c = colour.trim().toLowerCase();
  let rgb: number[] | null = null;
  const hex = /^#([0-9a-f]{3}|[0-9a-f]{6})$/.exec(c);
  if (hex) {
    const h = hex[1].length === 3 ? hex[1].replace(/./g, d => d + d) : hex[1];
    rgb = [0, 2, 4].map(i => parseInt(h.slice(i, i + 2), 16));
  } else {
    const fn = /^rgba?\(\s*([\d.]+)[\s,]+([\d.]+)[\s,]+([\d.]+)/.exec(c);
    if (fn) {
      rgb = [fn[1], fn[2], fn[3]].map(Number);
    } else if (c === 'white') {
      rgb = [255, 255, 255];
    } else if (c === 'black') {
      rgb = [0, 0, 0];
    }
  }
  if (!rgb || rgb.some(v => !Number.isFinite(v))) {
    return null;
  }
  const [r, g, b] = rgb.map(v => {
    const s = Math.min(255, Math.max(0, v)) / 255;
    return s <= 0.03928 ? s / 12.92 : ((s + 0.055) / 1.055) ** 2.4;
  });
  return 0.2126 * r + 0.7152 * g + 0.0722 * b;
}

/** WCAG contrast ratio of two colours (1 to 21), or null when either cannot be read. */
export function contrastRatio(a: string, b: string): number | null {
  const la = relativeLuminance(a);
  const lb = relativeLuminance(b);
  return la === null || lb === null ? null : (Math.max(la, lb) + 0.05) / (Math.min(la, lb) + 0.05);
}

/** The palette for a background colour: the dark set on dark backgrounds, else the light set. */
export function paletteFor(background: string): (typeof PALETTE)['light'] {
  const l = relativeLuminance(background);
  return l !== null && l < 0.18 ? PALETTE.dark : PALETTE.light;
}

/** The theme's size factor: {@link IChartTheme.scale} when a positive finite number, else 1. */
export function themeScale(theme: IChartTheme): number {
  const s = theme.scale;
  return typeof s === 'number' && Number.isFinite(s) && s > 0 ? s : 1;
}

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

/** Font sizes in px at scale 1 (axis labels 12 px, so 1.6 × gives 19 px on a projector). */
export const CHART_FONT_SIZES = Object.freeze({ label: 12, axisTitle: 13, legendLabel: 12, legendTitle: 12, title: 14, subtitle: 12, text: 11 });

/**
 * Vega-Lite `config` block for a theme: colours, font, font sizes and the
 * default widths and sizes of marks (all times {@link IChartTheme.scale}),
 * and the theme's own colours as every named colour range, so a scale
 * without an explicit range still never reaches a chart library's scheme.
 */
export function themeConfig(theme: IChartTheme): Config {
  const s = themeScale(theme);
  const f = CHART_FONT_SIZES;
  const px = (v: number): number => Math.round(v * s * 100) / 100;
  const area = (v: number): number => Math.round(v * s * s * 100) / 100;
  // Scaled up (a projector), axis lines and ticks take the text colour: the grid colour is faint by design.
  const strong = s > 1 ? theme.text : theme.grid;
  return {
    background: theme.background,
    font: theme.font,
    view: { stroke: theme.grid, strokeWidth: px(1) },
    axis: {
      domainColor: strong,
      domainWidth: px(1),
      gridColor: theme.grid,
      gridOpacity: s > 1 ? 0.8 : 0.5,
      gridWidth: px(1),
      tickColor: strong,
      tickWidth: px(1),
      tickSize: px(5),
      labelColor: theme.text,
      labelFontSize: px(f.label),
      labelPadding: px(2),
      titleColor: theme.text,
      titleFontSize: px(f.axisTitle),
      titlePadding: px(4)
    },
    legend: {
      labelColor: theme.text,
      labelFontSize: px(f.legendLabel),
      titleColor: theme.text,
      titleFontSize: px(f.legendTitle),
      symbolSize: area(100),
      symbolStrokeWidth: px(1.5)
    },
    title: { color: theme.text, fontSize: px(f.title), subtitleColor: theme.text, subtitleFontSize: px(f.subtitle) },
    mark: { color: theme.accent },
    text: { fontSize: px(f.text), color: theme.text },
    line: { strokeWidth: px(2) },
    rule: { strokeWidth: px(1), color: theme.text },
    point: { size: area(30), strokeWidth: px(2) },
    circle: { size: area(30) },
    square: { size: area(30) },
    range: {
      category: categoricalColours(theme),
      ordinal: sequentialColours(theme),
      ramp: sequentialColours(theme),
      heatmap: sequentialColours(theme),
      diverging: divergingColours(theme)
    }
  };
}

/** Mark properties that are lengths in px (multiplied by the scale). */
const LENGTHS = ['strokeWidth', 'fontSize', 'dx', 'dy', 'xOffset', 'yOffset', 'thickness', 'cornerRadius', 'radius'] as const;

/** Makes a mark definition bolder on a projector: text fully opaque, faint strokes stronger. */
function scaledMark(mark: Record<string, unknown>, s: number): Record<string, unknown> {
  const out: Record<string, unknown> = { ...mark };
  for (const k of LENGTHS) {
    if (typeof out[k] === 'number') {
      out[k] = Math.round((out[k] as number) * s * 100) / 100;
    }
  }
  if (typeof out.size === 'number') {
    // Text marks' size is a font size; every other mark's is an area.
    out.size = Math.round((out.size as number) * (out.type === 'text' ? s : s * s) * 100) / 100;
  }
  if (Array.isArray(out.strokeDash)) {
    out.strokeDash = (out.strokeDash as unknown[]).map(v => (typeof v === 'number' ? v * s : v));
  }
  if (s > 1 && typeof out.opacity === 'number') {
    // On a projector text is fully opaque and lines and points nearly so; a deliberately
    // faint mark (a halo, a band, below 0.3) keeps its faintness.
    const o = out.opacity as number;
    out.opacity = out.type === 'text' ? 1 : o < 0.3 ? o : Math.max(o, 0.85);
  }
  return out;
}

/** Scales `value` channels of an encoding that are lengths or areas. */
function scaledEncoding(encoding: Record<string, unknown>, s: number, text: boolean): Record<string, unknown> {
  const out: Record<string, unknown> = { ...encoding };
  const scaleValue = (channel: string, factor: number): void => {
    const def = out[channel];
    if (def && typeof def === 'object' && typeof (def as { value?: unknown }).value === 'number') {
      out[channel] = { ...(def as object), value: Math.round((def as { value: number }).value * factor * 100) / 100 };
    }
  };
  scaleValue('strokeWidth', s);
  scaleValue('size', text ? s : s * s);
  return out;
}

/**
 * A chart body (a view or a tree of layers) with every explicit size, width
 * and font size a builder wrote multiplied by the theme's scale (areas by its
 * square); returned unchanged at scale 1. The frame of every chart applies it,
 * so builders write sizes for scale 1 only.
 */
export function scaleBody<T>(body: T, theme: IChartTheme): T {
  const s = themeScale(theme);
  if (s === 1) {
    return body;
  }
  const walk = (node: unknown): unknown => {
    if (Array.isArray(node)) {
      return node.map(walk);
    }
    if (node === null || typeof node !== 'object') {
      return node;
    }
    const obj = node as Record<string, unknown>;
    const out: Record<string, unknown> = { ...obj };
    let isText = false;
    if (obj.mark !== undefined) {
      if (typeof obj.mark === 'string') {
        isText = obj.mark === 'text';
      } else if (obj.mark && typeof obj.mark === 'object') {
        out.mark = scaledMark(obj.mark as Record<string, unknown>, s);
        isText = (obj.mark as { type?: unknown }).type === 'text';
      }
    }
    if (obj.encoding && typeof obj.encoding === 'object') {
      out.encoding = scaledEncoding(obj.encoding as Record<string, unknown>, s, isText);
    }
    for (const k of ['layer', 'hconcat', 'vconcat', 'concat'] as const) {
      if (Array.isArray(obj[k])) {
        out[k] = (obj[k] as unknown[]).map(walk);
      }
    }
    if (obj.spec && typeof obj.spec === 'object') {
      out.spec = walk(obj.spec);
    }
    return out;
  };
  return walk(body) as T;
}
