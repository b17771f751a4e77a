/** The Landau free-energy explorer widget and its pieces. */
export * from './explorer';
export * from './fields';
export * from './ranges';
export * from './patchable-view';
