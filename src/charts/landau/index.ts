/** Landau free-energy charts: the landscape F(ψ) and the branches ψ(T). */
export * from './common';
export * from './trace';
export * from './landscape';
export * from './branches';
export * from './phase-diagram';
export * from './landscape-2d';
export * from './loop';
