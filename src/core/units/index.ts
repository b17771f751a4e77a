/**
 * Units of measured columns: an isolated mathjs instance with oersted, emu,
 * Bohr magneton and formula unit; role-aware reading of a column's unit with
 * questions instead of guesses; conversions to and from SI; the physical
 * constants (SI) they and the physics share.
 */
export { PHYS, R_GAS, CONSTANTS_SOURCE } from './constants';
export { unitMath, parseMathUnit, normaliseUnitText } from './mathUnits';
export { readColumnUnit, toSI, fromSI } from './columnUnits';
export type { ColumnRole, MagnetisationBasis, IUnitConversion, INeedsUnit, IUnitRefusal, UnitAnswer } from './columnUnits';
export { muBPerFormulaUnit, massFromMolar, convertQuantity, UnitInputError, susceptibilityCgsToSI, magnetisationFromFourPiMGauss } from './magnetic';
export type { SusceptibilityKind } from './magnetic';
