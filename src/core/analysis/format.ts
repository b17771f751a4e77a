/**
 * Numbers with uncertainties, as people write them: the standard error to two
 * significant digits and the value to the same decimal place.
 */

/** "287.41 ± 0.05"; "1.2e-5 ± 3.0e-7"; "—" when there is no value; "± ?" when σ is not usable. */
export function formatWithError(value: number, sigma: number): string {
  if (!Number.isFinite(value)) {
    return '—';
  }
  if (!(Number.isFinite(sigma) && sigma > 0)) {
    return `${formatPlain(value)} ± ?`;
  }
  const exponent = Math.floor(Math.log10(sigma));
  const decimals = 1 - exponent;
  const magnitude = Math.abs(value) > 0 ? Math.floor(Math.log10(Math.abs(value))) : exponent;
  if (decimals > 6 || magnitude > 6 || magnitude < -4) {
    // Scientific: σ to two significant digits, value to the same power-of-ten place.
    const scale = Math.pow(10, magnitude);
    const digits = Math.max(1, magnitude - exponent + 1);
    return `${(value / scale).toFixed(digits)}e${magnitude} ± ${(sigma / scale).toFixed(digits)}e${magnitude}`;
  }
  const d = Math.max(0, decimals);
  return `${value.toFixed(d)} ± ${sigma.toFixed(d)}`;
}

/** Up to 6 significant digits, no trailing zeros. */
export function formatPlain(value: number): string {
  if (!Number.isFinite(value)) {
    return String(value);
  }
  return Number(value.toPrecision(6)).toString();
}
