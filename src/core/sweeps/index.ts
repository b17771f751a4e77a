/**
 * Field-sweep (M(H) isotherm) analyses: isotherm families from long-format
 * tables, demagnetisation, Arrott and modified Arrott plots, Kouvel–Fisher,
 * critical isotherm, scaling collapse, exponents against the fit window and
 * the magnetic entropy change. SI inside; every result states its conventions.
 */
export * from './types';
export * from './demag';
export * from './table';
export * from './sets';
export * from './lines';
export * from './banerjee';
export * from './arrott';
export * from './powerfit';
export * from './map';
export * from './global';
export * from './eos';
export * from './kouvel';
export * from './critical';
export * from './collapse';
export * from './window';
export * from './entropy';
export * from './analysis';
export * from './display';
export * from './bootstrap';
export * from './hysteresis';
export * from './eos-model';
export * from './eos-start';
export * from './eos-verdict';
export * from './agreement';
export * from './chart-safe';
export * from './job-types';
export * from './job-controls';
export * from './job-points';
export * from './job-primary';
export * from './job-warnings';
export * from './job-window';
export * from './job';
