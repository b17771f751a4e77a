/** Landau 2-4-6 free energy (convention L, optional cubic term): landscape, derived quantities, paths, fits. */
export * from './conventions';
export * from './free-energy';
export * from './derived';
export * from './thermal';
export * from './paths';
export * from './fit';
export * from './explorer';
export * from './phase-diagram';
export * from './landscape-2d';
export * from './typed';
export * from './typed-loop';
export * from './typed-phase-diagram';
