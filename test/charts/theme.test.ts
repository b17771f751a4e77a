/**
 * The chart theme's scale: themeConfig multiplies font sizes and stroke widths
 * by it and point areas by its square; the frame scales every size a builder
 * wrote; scale 1 leaves a spec as it was; the palette's colours reach the
 * contrast they are chosen for on white and on JupyterLab's dark background.
 */
import { describe, expect, it } from 'vitest';
import type { TopLevelSpec } from 'vega-lite';
import { buildFitOverlaySpec } from '../../src/charts/fit-overlay';
import { buildWindowScanSpec } from '../../src/charts/temperature/index';
import { CHART_FONT_SIZES, contrastRatio, PALETTE, paletteFor, relativeLuminance, scaleBody, themeConfig, themeScale } from '../../src/charts/theme';
import type { IChartTheme } from '../../src/charts/theme';
import { distinctTheme } from './sweeps/helpers';

interface IMarkLayer {
  mark: { type: string; size?: number; strokeWidth?: number; fontSize?: number; opacity?: number; strokeDash?: number[] };
}

function marks(spec: TopLevelSpec): IMarkLayer['mark'][] {
  const out: IMarkLayer['mark'][] = [];
  const walk = (node: unknown): void => {
    if (node && typeof node === 'object') {
      const n = node as { mark?: unknown; layer?: unknown[] };
      if (n.mark && typeof n.mark === 'object') {
        out.push(n.mark as IMarkLayer['mark']);
      }
      (n.layer ?? []).forEach(walk);
    }
  };
  walk(spec);
  return out;
}

const overlay = (theme: IChartTheme) =>
  buildFitOverlaySpec({ x: [1, 2, 3, 4], y: [4, 3, 2, 1], xTitle: 'T (K)', yTitle: 'M', window: { min: 1, max: 3 }, curve: { x: [1, 3], y: [4, 2] }, curveLabel: 'fit', pointSize: 40, theme });

describe('theme scale', () => {
  it('should read the scale only when it is a positive finite number', () => {
    expect(themeScale(distinctTheme)).toBe(1);
    expect(themeScale({ ...distinctTheme, scale: 1.6 })).toBe(1.6);
    for (const bad of [0, -2, Number.NaN, Number.POSITIVE_INFINITY]) {
      expect(themeScale({ ...distinctTheme, scale: bad })).toBe(1);
    }
  });

  it('should multiply every font size and stroke width by the scale and point areas by its square', () => {
    const plain = themeConfig(distinctTheme) as Record<string, Record<string, number>>;
    const big = themeConfig({ ...distinctTheme, scale: 1.6 }) as Record<string, Record<string, number>>;
    expect(plain.axis.labelFontSize).toBe(CHART_FONT_SIZES.label);
    expect(big.axis.labelFontSize).toBeCloseTo(CHART_FONT_SIZES.label * 1.6, 10);
    // 12 px axis labels at the default presenter scale are at least 18 px.
    expect(big.axis.labelFontSize).toBeGreaterThanOrEqual(18);
    for (const [group, key] of [
      ['axis', 'titleFontSize'],
      ['legend', 'labelFontSize'],
      ['legend', 'titleFontSize'],
      ['title', 'fontSize'],
      ['title', 'subtitleFontSize'],
      ['text', 'fontSize'],
      ['line', 'strokeWidth'],
      ['rule', 'strokeWidth'],
      ['axis', 'domainWidth'],
      ['axis', 'tickWidth'],
      ['axis', 'gridWidth']
    ]) {
      expect(big[group][key], `${group}.${key}`).toBeCloseTo(plain[group][key] * 1.6, 2);
    }
    expect(big.point.size).toBeCloseTo(plain.point.size * 1.6 * 1.6, 2);
    expect(big.legend.symbolSize).toBeCloseTo(plain.legend.symbolSize * 1.6 * 1.6, 2);
    // Scaled up, axis lines and ticks are drawn in the text colour, not the faint grid colour.
    expect(plain.axis.domainColor).toBe(distinctTheme.grid);
    expect(big.axis.domainColor).toBe(distinctTheme.text);
  });

  it("should scale the sizes a builder wrote in the frame, and leave the spec unchanged at scale 1", () => {
    const plain = overlay(distinctTheme);
    const big = overlay({ ...distinctTheme, scale: 2 });
    expect(scaleBody({ layer: [] }, distinctTheme)).toEqual({ layer: [] });
    const [p, b] = [marks(plain), marks(big)];
    expect(b.length).toBe(p.length);
    const points = p.findIndex(m => m.type === 'point');
    expect(p[points].size).toBe(40);
    expect(b[points].size).toBe(160);
    const line = p.findIndex(m => m.type === 'line');
    expect(b[line].strokeWidth).toBe(p[line].strokeWidth! * 2);
    // Text marks: font sizes grow, faint text becomes opaque.
    const scan = (theme: IChartTheme) =>
      buildWindowScanSpec({ cells: [{ tMax: 0.05, beta: { value: 0.35, sigma: 0.01 }, verdict: 'fits' }], classes: [{ id: 'mf', label: 'mean field', beta: 0.5 }], suggested: 0.05, exponentLabel: 'β' }, theme).spec;
    const texts = marks(scan({ ...distinctTheme, scale: 2 })).filter(m => m.type === 'text');
    const plainTexts = marks(scan(distinctTheme)).filter(m => m.type === 'text');
    expect(texts.length).toBeGreaterThan(0);
    texts.forEach((m, k) => {
      expect(m.fontSize).toBe(plainTexts[k].fontSize! * 2);
      expect(m.opacity ?? 1).toBe(1);
    });
  });
});

describe('palette', () => {
  it('should pick the set by the background', () => {
    expect(paletteFor('#ffffff')).toBe(PALETTE.light);
    expect(paletteFor('white')).toBe(PALETTE.light);
    expect(paletteFor('#111')).toBe(PALETTE.dark);
    expect(paletteFor('rgb(30, 30, 30)')).toBe(PALETTE.dark);
    expect(paletteFor('transparent')).toBe(PALETTE.light);
    expect(relativeLuminance('#000000')).toBe(0);
    expect(relativeLuminance('#ffffff')).toBeCloseTo(1, 12);
  });

  it('should give series colours of at least 4.5:1 on white and 7:1 on #111, all different', () => {
    for (const c of PALETTE.light.categorical) {
      expect(contrastRatio(c, '#ffffff'), c).toBeGreaterThanOrEqual(4.5);
    }
    for (const c of PALETTE.dark.categorical) {
      expect(contrastRatio(c, '#111111'), c).toBeGreaterThanOrEqual(7);
    }
    for (const set of [PALETTE.light.categorical, PALETTE.dark.categorical]) {
      expect(new Set(set.map(c => c.toLowerCase())).size).toBe(set.length);
    }
  });

  it('should order the ramps by lightness: sequential monotonic, diverging with its extreme in the middle', () => {
    const lum = (list: readonly string[]) => list.map(c => relativeLuminance(c)!);
    const monotonic = (v: number[], sign: 1 | -1) => v.every((x, i) => i === 0 || sign * (x - v[i - 1]) > 0);
    expect(monotonic(lum(PALETTE.light.sequential), -1)).toBe(true);
    expect(monotonic(lum(PALETTE.dark.sequential), 1)).toBe(true);
    for (const [set, sign] of [
      [PALETTE.light.diverging, 1],
      [PALETTE.dark.diverging, -1]
    ] as const) {
      const l = lum(set);
      const mid = (l.length - 1) / 2;
      expect(monotonic(l.slice(0, mid + 1), sign)).toBe(true);
      expect(monotonic(l.slice(mid), (-sign) as 1 | -1)).toBe(true);
    }
  });
});
