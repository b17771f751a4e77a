/**
 * The unit of a fitted parameter, derived from the units of the x and y
 * columns: temperatures take the x unit, amplitudes and offsets the y unit,
 * a Curie constant y·x, exponents and spins none. A parameter not listed
 * (e.g. a typed model's) has no unit shown.
 */

/** Parameters measured in the units of x (temperatures). */
const X_UNIT = new Set(['Tc', 'T0', 'T1', 'T**', 'theta', 'θ']);
/** Parameters measured in the units of y (amplitudes, offsets, saturation values). */
const Y_UNIT = new Set(['Ms', 'A', 'y0', 'M0', 'chi0', 'χ0']);
/** Dimensionless parameters. */
const NONE = new Set(['beta', 'β', 'gamma', 'γ', 'delta', 'δ', 'J', '1/J', 'eta', 'η', 'aW', 'Delta', 'Δ']);

/**
 * The unit text of parameter `name` of a fit of y against x, '1' for a pure
 * number, or null when unknown (a column without a unit, or a parameter not
 * listed here).
 */
export function parameterUnit(name: string, xUnit: string | null, yUnit: string | null): string | null {
  if (NONE.has(name)) {
    return '1';
  }
  if (X_UNIT.has(name)) {
    return xUnit;
  }
  if (Y_UNIT.has(name)) {
    return yUnit;
  }
  if (name === 'C') {
    return xUnit && yUnit ? `${yUnit}·${xUnit}` : null;
  }
  return null;
}
