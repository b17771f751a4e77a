/**
 * Double-double arithmetic (≈ 32 significant digits from pairs of binary64
 * numbers) and exact decimal → double-double conversion.
 */
export type { IDoubleDouble, IDoubleDoubleArray } from './core';
export {
  dd,
  toNumber,
  isFiniteDD,
  twoSum,
  quickTwoSum,
  split,
  twoProd,
  add,
  sub,
  neg,
  mul,
  mulNumber,
  scale2,
  div,
  sqr,
  sqrt,
  abs,
  compare
} from './core';
export { DD_PI, DD_HALF_PI, DD_LN2, DD_E, DD_ONE, DD_ZERO } from './constants';
export { exp, expm1, log, pow, powInt } from './elementary';
export { sin, cos, tan, sinCos, atan, atan2 } from './trig';
export { decimalToDoubleDouble, DecimalFormatError } from './decimal';
