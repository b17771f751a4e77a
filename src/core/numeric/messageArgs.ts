/**
 * Message arguments that must not be rounded: counts (rows, points,
 * characters, evaluations) are shown with every digit, since "12350 rows"
 * for 12345 would be wrong, not merely short.
 */
import type { MessageArg } from '../messages';

/** A whole number shown exactly (plain numbers are rounded to 4 significant digits). */
export function wholeNumber(n: number): MessageArg {
  if (!Number.isFinite(n) || Math.abs(n) < 1e4) {
    return n;
  }
  return { value: n, digits: Math.min(17, Math.floor(Math.log10(Math.abs(n))) + 1) };
}
