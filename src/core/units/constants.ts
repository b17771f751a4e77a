/**
 * Physical constants (SI). Bohr magneton and μ0 are CODATA 2018 recommended
 * values; kB and N_A are exact since the 2019 SI redefinition
 * [C7 in REFERENCES.md].
 */
export const PHYS = {
  /** Bohr magneton, J/T (CODATA 2018). */
  muB: 9.2740100783e-24,
  /** Boltzmann constant, J/K (exact). */
  kB: 1.380649e-23,
  /** Avogadro constant, 1/mol (exact). */
  NA: 6.02214076e23,
  /** Vacuum permeability, N/A² (CODATA 2018). */
  mu0: 1.25663706212e-6,
  /** Vacuum permittivity, F/m (CODATA 2018). */
  eps0: 8.8541878128e-12
} as const;

/** Molar gas constant R = N_A kB, J/(mol K). */
export const R_GAS = PHYS.NA * PHYS.kB;

/** Name of the constant set, stored in results that use these numbers. */
export const CONSTANTS_SOURCE = 'CODATA 2018 (muB, mu0); exact SI 2019 (kB, N_A)';
