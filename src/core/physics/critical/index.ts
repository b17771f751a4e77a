/** Critical power laws, effective exponents against the fit window. */
export * from './power-law';
export * from './window';
