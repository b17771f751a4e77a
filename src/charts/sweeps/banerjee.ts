/**
 * Banerjee criterion as evidence [B10 in REFERENCES.md]: the most negative
 * local slope d(H/M)/d(M²) of each Arrott isotherm against T, with ±σ error
 * bars and a rule at zero. Isotherms whose slope is significantly negative
 * are marked by both colour and shape (a downward triangle), so the marking
 * survives colour-vision deficiencies and greyscale.
 */
import type { IBanerjeeEvidence } from '../../core/sweeps/index';
import type { ChartLayer, ColorDef, Field } from '../frame';
import { layeredChart } from '../frame';
import type { IChartTheme } from '../theme';
import type { ISweepChart, ISweepChartOptions } from './common';
import { displayUnit, finite, finiteRows, frameTitle } from './common';

/** Legend entry of the significantly negative slopes. */
export const BANERJEE_NEGATIVE = 'significantly negative';
/** Legend entry of the others. */
export const BANERJEE_NOT_NEGATIVE = 'not significantly negative';

/** Builds the Banerjee chart; a null input gives an empty chart saying there is none. */
export function buildBanerjeeSpec(evidence: IBanerjeeEvidence | null, theme: IChartTheme, options: ISweepChartOptions = {}): ISweepChart {
  const hu = displayUnit(options.fieldUnit, 'A/m');
  const mu = displayUnit(options.magnetisationUnit, 'A/m');
  // d(H/M)/d(M²) scales as field / magnetisation³.
  const k = hu.perSI / mu.perSI ** 3;
  const rows = finiteRows(
    (evidence?.isotherms ?? []).map(b => {
      const v = b.minLocalSlope.value * k;
      const s = finite(b.minLocalSlope.sigma) ? Math.abs(b.minLocalSlope.sigma * k) : 0;
      return { T: b.T, slope: v, lo: v - s, hi: v + s, kind: b.negative ? BANERJEE_NEGATIVE : BANERJEE_NOT_NEGATIVE };
    })
  );
  const domain = [BANERJEE_NEGATIVE, BANERJEE_NOT_NEGATIVE];
  const color: ColorDef<Field> = { field: 'kind', type: 'nominal', title: 'local slope', scale: { domain, range: [theme.accent2, theme.accent] } };
  const yTitle = `most negative local slope d(H/M)/d(M²) ((${hu.unit}/${mu.unit}) per (${mu.unit})²)`;
  const layer: ChartLayer[] = [
    {
      data: { values: [{ zero: 0 }] },
      mark: { type: 'rule', color: theme.text, strokeWidth: 1, opacity: 0.7 },
      encoding: { y: { field: 'zero', type: 'quantitative' } }
    },
    {
      data: { values: rows },
      mark: { type: 'rule', strokeWidth: 1 },
      encoding: {
        x: { field: 'T', type: 'quantitative', title: 'T (K)', scale: { zero: false } },
        y: { field: 'lo', type: 'quantitative', title: yTitle },
        y2: { field: 'hi' },
        color
      }
    },
    {
      data: { values: rows },
      mark: { type: 'point', filled: true, size: 60, tooltip: true },
      encoding: {
        x: { field: 'T', type: 'quantitative' },
        y: { field: 'slope', type: 'quantitative' },
        color,
        shape: { field: 'kind', type: 'nominal', title: 'local slope', scale: { domain, range: ['triangle-down', 'circle'] } }
      }
    }
  ];
  const title = 'Banerjee criterion';
  const n = evidence?.isotherms.length ?? 0;
  const neg = evidence ? evidence.isotherms.filter(b => b.negative).length : 0;
  const caption =
    evidence === null || n === 0
      ? 'No isotherms for the Banerjee criterion'
      : neg > 0
        ? `${neg} of ${n} isotherms have a significantly negative slope (evidence, not proof, of a first-order transition)`
        : `None of ${n} isotherms has a significantly negative slope`;
  return {
    spec: layeredChart(layer, {
      description: `Banerjee criterion: most negative local Arrott slope of each isotherm against T with ±σ bars; significantly negative ones marked by colour and a downward triangle. ${caption}`,
      theme,
      title: frameTitle(title, caption, options),
      height: options.height
    }),
    rows: 1 + 2 * rows.length,
    title,
    caption
  };
}
