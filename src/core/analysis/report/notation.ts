/**
 * A value with its standard uncertainty, rounded as people write it: the
 * uncertainty to two significant digits and the value to the same decimal
 * place (JCGM 100:2008, GUM §7.2.6, "at most two significant digits"; common
 * practice to use exactly two). Written either as "value ± σ" or in the
 * concise form "value(σ in the last digits)" of GUM §7.2.2, e.g.
 * 100.02147(35) [REFERENCES.md N16].
 */

/** A value and its uncertainty rounded to the same decimal place, as text; `exponent` is the common power of ten in scientific form. */
export interface IRoundedWithError {
  value: string;
  sigma: string;
  /** Common power of ten (both texts are mantissas), or null in fixed notation. */
  exponent: number | null;
}

/** Round `value` and `sigma` together; null when there is no value or no usable σ (σ not finite or not positive). */
export function roundWithError(value: number, sigma: number): IRoundedWithError | null {
  if (!Number.isFinite(value) || !(Number.isFinite(sigma) && sigma > 0)) {
    return null;
  }
  const exponent = Math.floor(Math.log10(sigma));
  const decimals = 1 - exponent;
  const magnitude = Math.abs(value) > 0 ? Math.floor(Math.log10(Math.abs(value))) : exponent;
  if (decimals > 6 || magnitude > 6 || magnitude < -4) {
    // Scientific: σ to two significant digits, value to the same power-of-ten place.
    const scale = Math.pow(10, magnitude);
    const digits = Math.max(1, magnitude - exponent + 1);
    return { value: (value / scale).toFixed(digits), sigma: (sigma / scale).toFixed(digits), exponent: magnitude };
  }
  const d = Math.max(0, decimals);
  return { value: value.toFixed(d), sigma: sigma.toFixed(d), exponent: null };
}

/** Up to 6 significant digits, no trailing zeros. */
export function formatPlain(value: number): string {
  if (!Number.isFinite(value)) {
    return String(value);
  }
  return Number(value.toPrecision(6)).toString();
}

/** "287.41 ± 0.05"; "1.2e-5 ± 3.0e-7"; "—" when there is no value; "± ?" when σ is not usable. */
export function formatWithError(value: number, sigma: number): string {
  if (!Number.isFinite(value)) {
    return '—';
  }
  const r = roundWithError(value, sigma);
  if (r === null) {
    return `${formatPlain(value)} ± ?`;
  }
  return r.exponent === null ? `${r.value} ± ${r.sigma}` : `${r.value}e${r.exponent} ± ${r.sigma}e${r.exponent}`;
}

/**
 * The concise form: "287.30(40)", "0.466(17)", "1.23(45)e-5"; when σ reaches
 * past the decimal point, its digits are written in full: "1234(56)",
 * "12.3(1.5)". "—" without a value; the plain value and "(?)" without σ.
 */
export function formatConcise(value: number, sigma: number): string {
  if (!Number.isFinite(value)) {
    return '—';
  }
  const r = roundWithError(value, sigma);
  if (r === null) {
    return `${formatPlain(value)}(?)`;
  }
  const point = r.value.indexOf('.');
  const decimals = point < 0 ? 0 : r.value.length - point - 1;
  // σ in units of the value's last digit, unless σ itself has digits before the point.
  const sigmaLast = Math.round(Number(r.sigma) * Math.pow(10, decimals));
  const inner = decimals > 0 && Number(r.sigma) >= 1 ? r.sigma : String(sigmaLast);
  const text = `${r.value}(${inner})`;
  return r.exponent === null ? text : `${text}e${r.exponent}`;
}
