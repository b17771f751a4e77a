/** Vega-Lite spec builders for the field-sweep analyses. */
export type { ISweepChart } from './common';
export { buildArrottSpec, buildModifiedArrottSpec } from './arrott';
export type { IArrottChart, IArrottChartOptions } from './arrott';
export { buildKouvelFisherSpec } from './kouvel';
export { buildExponentWindowSpec } from './window';
export type { WindowExponent } from './window';
export { buildEntropySpec } from './entropy';
export { buildCollapseSpec } from './collapse';
