/**
 * Physics models: Weiss/Brillouin mean field, Landau free energies and their
 * conventions, critical power laws, Curie–Weiss, Bean–Rodbell,
 * Landau–Devonshire, Landau–de Gennes, coupled order parameters, exact 2D
 * Ising and reference curves. Every result states the convention it used.
 */
export * from './errors';
export * from '../units/constants';
export * from './brillouin';
export * from './weiss';
export * from './weiss-fit';
export * from './landau/index';
export * from './critical/index';
export * from './universality';
export * from './curie-weiss';
export * from './bean-rodbell';
export * from './bean-rodbell-fit';
export * from './devonshire';
export * from './de-gennes';
export * from './coupled';
export * from './ising2d';
export * from './reference-curves';
