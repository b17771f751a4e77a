/**
 * Numbers with uncertainties, as people write them: the standard error to two
 * significant digits and the value to the same decimal place. The rounding
 * lives in report/notation.ts, shared by the panel and every export.
 */
export { formatConcise, formatPlain, formatWithError, roundWithError } from './report/notation';
export type { IRoundedWithError } from './report/notation';
