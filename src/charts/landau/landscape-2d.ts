/**
 * Landscape of two order parameters F(ψ, φ) as a heat map on the theme's
 * sequential ramp, with its minima as points (the global ones ringed). A big
 * grid is drawn at most `maxCells` per axis (every k-th node), so a view
 * stays quick to draw; the minima are exact.
 */
import type { ChartLayer } from '../frame';
import { layeredChart } from '../frame';
import type { IChartTheme } from '../theme';
import { sequentialColours } from '../theme';
import type { ILandauChart } from './common';
import { finite } from './common';

/** Texts of the chart (translated by the caller). */
export interface ILandscape2dLabels {
  title: string;
  psi: string;
  phi: string;
  F: string;
  minimum: string;
  global: string;
}

/** Input of {@link buildLandscape2dSpec}. */
export interface ILandscape2dChartOptions {
  n: number;
  psi: ArrayLike<number>;
  phi: ArrayLike<number>;
  /** Row-major: index j·n + i is (ψ[i], φ[j]). */
  F: ArrayLike<number>;
  minima: readonly { psi: number; phi: number; F: number; global: boolean; label?: string }[];
  theme: IChartTheme;
  labels?: Partial<ILandscape2dLabels>;
  /** Most cells drawn per axis (default 80). */
  maxCells?: number;
  /** The title is a parameter, so a drawn view takes new rows and title in place ({@link landscape2dRows}); default false. */
  patchable?: boolean;
}

/** Rows of every dataset, by name (for in-place updates of a drawn view). */
export function landscape2dRows(options: ILandscape2dChartOptions): Record<string, Record<string, unknown>[]> {
  const { n, psi, phi, F } = options;
  const labels = labels2d(options.labels);
  const step = Math.max(1, Math.ceil(n / Math.max(2, options.maxCells ?? 80)));
  const cells: Record<string, unknown>[] = [];
  const dp = (psi[n - 1] - psi[0]) / (n - 1);
  const dq = (phi[n - 1] - phi[0]) / (n - 1);
  for (let j = 0; j < n; j += step) {
    for (let i = 0; i < n; i += step) {
      const f = F[j * n + i];
      if (finite(f) && finite(psi[i]) && finite(phi[j])) {
        const w = Math.min(step, n - i);
        const hgt = Math.min(step, n - j);
        cells.push({ psi: psi[i] - dp / 2, psi2: psi[i] - dp / 2 + w * dp, phi: phi[j] - dq / 2, phi2: phi[j] - dq / 2 + hgt * dq, F: f });
      }
    }
  }
  const minima = options.minima
    .filter(m => finite(m.psi) && finite(m.phi) && finite(m.F))
    .map(m => ({ psi: m.psi, phi: m.phi, F: m.F, text: m.label ?? (m.global ? labels.global : labels.minimum), global: m.global ? 1 : 0 }));
  return { landscape2d_cells: cells, landscape2d_minima: minima, landscape2d_global: minima.filter(m => m.global === 1) };
}

function labels2d(given: Partial<ILandscape2dLabels> | undefined): ILandscape2dLabels {
  return { title: 'F(ψ, φ)', psi: 'ψ', phi: 'φ', F: 'F', minimum: 'minimum', global: 'global minimum', ...given };
}

/** Heat map with minima; datasets named for in-place updates. */
export function buildLandscape2dSpec(options: ILandscape2dChartOptions): ILandauChart {
  const { theme } = options;
  const labels = labels2d(options.labels);
  const rows = landscape2dRows(options);
  const psiDomain: [number, number] = [options.psi[0], options.psi[options.n - 1]];
  const phiDomain: [number, number] = [options.phi[0], options.phi[options.n - 1]];
  const layer: ChartLayer[] = [
    {
      name: 'landscape2d_cells',
      data: { name: 'landscape2d_cells', values: rows.landscape2d_cells },
      mark: { type: 'rect', clip: true },
      encoding: {
        x: { field: 'psi', type: 'quantitative', title: labels.psi, scale: { domain: psiDomain, zero: false, nice: false } },
        x2: { field: 'psi2' },
        y: { field: 'phi', type: 'quantitative', title: labels.phi, scale: { domain: phiDomain, zero: false, nice: false } },
        y2: { field: 'phi2' },
        color: { field: 'F', type: 'quantitative', title: labels.F, scale: { range: sequentialColours(theme), zero: false }, legend: { orient: 'right', gradientLength: 160 } }
      }
    },
    {
      name: 'landscape2d_minima',
      data: { name: 'landscape2d_minima', values: rows.landscape2d_minima },
      mark: { type: 'point', filled: true, size: 110, color: theme.accent, stroke: theme.background, strokeWidth: 1.5, clip: true, tooltip: true },
      encoding: {
        x: { field: 'psi', type: 'quantitative' },
        y: { field: 'phi', type: 'quantitative' },
        tooltip: [
          { field: 'text', type: 'nominal', title: labels.minimum },
          { field: 'psi', type: 'quantitative', title: labels.psi, format: '.6~g' },
          { field: 'phi', type: 'quantitative', title: labels.phi, format: '.6~g' },
          { field: 'F', type: 'quantitative', title: labels.F, format: '.6~g' }
        ]
      }
    },
    {
      name: 'landscape2d_global',
      data: { name: 'landscape2d_global', values: rows.landscape2d_global },
      mark: { type: 'point', filled: false, size: 360, stroke: theme.accent, strokeWidth: 2.5, clip: true },
      encoding: { x: { field: 'psi', type: 'quantitative' }, y: { field: 'phi', type: 'quantitative' } }
    }
  ];
  const spec = layeredChart(layer, { description: `${labels.title}: ${labels.F} over ${labels.psi} and ${labels.phi} as colour, with ${rows.landscape2d_minima.length} minima`, title: labels.title, theme, height: 340, liveTitle: options.patchable === true });
  return { spec, rows: rows.landscape2d_cells.length + rows.landscape2d_minima.length };
}
