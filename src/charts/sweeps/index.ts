/**
 * Vega-Lite spec builders for the field-sweep analyses, one per view of the
 * isotherm report. Each takes `(input, theme, options)` and returns an
 * {@link ISweepChart}: the spec, its row count, a title and a caption.
 */
export type { IDisplayUnit, ISweepChart, ISweepChartOptions, UnitOption } from './common';
export { displayUnit, fmt, fmtSigma, named } from './common';
export { buildArrottSpec, buildModifiedArrottSpec } from './arrott';
export type { IArrottChart, IArrottChartOptions, IArrottInput, IModifiedArrottInput } from './arrott';
export { buildKouvelFisherSpec } from './kouvel';
export { buildCriticalIsothermSpec } from './critical';
export type { ICriticalIsothermChart, ICriticalIsothermInput } from './critical';
export { buildCollapseSpec } from './collapse';
export type { ICollapseChart, ICollapseChartOptions, ICollapseInput } from './collapse';
export { BANERJEE_NEGATIVE, BANERJEE_NOT_NEGATIVE, buildBanerjeeSpec } from './banerjee';
export { buildExponentWindowSpec, DEFAULT_WINDOW_CLASSES } from './window';
export type { IWindowChartOptions, WindowExponent } from './window';
export { buildEntropySpec, entropyCaption, fieldChangeLabel } from './entropy';
export { buildEntropyMapSpec } from './entropy-map';
