import { CoreMessageError, msg } from '../messages';
import type { ICoreMessage, MessageArg } from '../messages';
import { wholeNumber } from '../numeric/messageArgs';

/**
 * Error thrown when a physics routine receives invalid input (bad spin,
 * non-finite temperature, an unbounded free energy, …). Its `detail` (codes
 * `physics.*`) names the offending quantity and the accepted range.
 */
export class PhysicsInputError extends CoreMessageError {
  constructor(detail: ICoreMessage) {
    super(detail);
    this.name = 'PhysicsInputError';
  }
}

/** How a quantity is written for people: symbols instead of spelled-out Greek names. */
const SYMBOLS: Readonly<Record<string, string>> = { eta: 'η', tau: 'τ', lambda: 'λ', Tstar: 'T*', psi: 'ψ', phi: 'φ', chi: 'χ', sigma: 'σ' };

/** The symbol of a quantity for messages. */
export function symbolOf(name: string): string {
  return SYMBOLS[name] ?? name;
}

/** A value that may not be a number, as a message argument. */
function shown(v: unknown): MessageArg {
  return typeof v === 'number' ? v : String(v);
}

/** Throws `PhysicsInputError` unless `v` is a finite number. */
export function requireFinite(name: string, v: number): void {
  if (typeof v !== 'number' || !Number.isFinite(v)) {
    throw new PhysicsInputError(msg('physics.not-finite', '%1 must be a finite number, but it is %2.', symbolOf(name), shown(v)));
  }
}

/** Throws `PhysicsInputError` unless `v` is finite and > 0. */
export function requirePositive(name: string, v: number): void {
  requireFinite(name, v);
  if (!(v > 0)) {
    throw new PhysicsInputError(msg('physics.not-positive', '%1 must be above 0, but it is %2.', symbolOf(name), v));
  }
}

/** Columns of unequal length, e.g. `{ T: 10, M: 9 }`. */
export function lengthsDiffer(lengths: Readonly<Record<string, number>>): ICoreMessage {
  const names = Object.keys(lengths).map(symbolOf);
  const counts = Object.values(lengths).map(String);
  return msg('physics.lengths-differ', 'The columns %1 have different lengths (%2): give one value of each per point.', names.join(', '), counts.join(', '));
}

/** Fewer points than a fit needs. */
export function tooFewPoints(needed: number, got: number): ICoreMessage {
  return msg('physics.too-few-points', 'This fit needs at least %1 points, but there are %2.', needed, wholeNumber(got));
}

/** Point `i` (0-based) has a non-finite value of `name`. */
export function pointNotFinite(i: number, name: string, v: number): ICoreMessage {
  return msg('physics.point-not-finite', 'Point %1 has %2 = %3: every value must be a finite number.', wholeNumber(i + 1), symbolOf(name), shown(v));
}

/** Point `i` (0-based) has a temperature that is not a finite number of kelvin above 0. */
export function temperatureNotPositive(i: number, T: number): ICoreMessage {
  return msg('physics.temperature-not-positive', 'Point %1 has T = %2: every temperature must be a finite number of kelvin above 0.', wholeNumber(i + 1), shown(T));
}

function spinInvalid(J: unknown): ICoreMessage {
  return msg('physics.spin-invalid', 'The spin J must be a positive multiple of ½ (or ∞ for classical moments), but it is %1.', shown(J));
}

/**
 * Validates a total angular momentum quantum number: a positive multiple of
 * 1/2, or `Infinity` for the classical (Langevin) limit.
 */
export function requireSpin(J: number): void {
  if (J === Infinity) {
    return;
  }
  if (typeof J !== 'number' || !(J > 0) || !Number.isFinite(J)) {
    throw new PhysicsInputError(spinInvalid(J));
  }
  if (Math.abs(2 * J - Math.round(2 * J)) > 1e-12) {
    throw new PhysicsInputError(spinInvalid(J));
  }
}
