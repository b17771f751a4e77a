/**
 * Error thrown when a physics routine receives invalid input (bad spin,
 * non-finite temperature, an unbounded free energy, …). The message names the
 * offending argument and the accepted range.
 */
export class PhysicsInputError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'PhysicsInputError';
  }
}

/** Throws `PhysicsInputError` unless `v` is a finite number. */
export function requireFinite(name: string, v: number): void {
  if (typeof v !== 'number' || !Number.isFinite(v)) {
    throw new PhysicsInputError(`${name} must be a finite number, got ${String(v)}`);
  }
}

/** Throws `PhysicsInputError` unless `v` is finite and > 0. */
export function requirePositive(name: string, v: number): void {
  requireFinite(name, v);
  if (!(v > 0)) {
    throw new PhysicsInputError(`${name} must be > 0, got ${v}`);
  }
}

/**
 * Validates a total angular momentum quantum number: a positive multiple of
 * 1/2, or `Infinity` for the classical (Langevin) limit.
 */
export function requireSpin(J: number): void {
  if (J === Infinity) {
    return;
  }
  requirePositive('J', J);
  if (Math.abs(2 * J - Math.round(2 * J)) > 1e-12) {
    throw new PhysicsInputError(`J must be a positive multiple of 1/2 or Infinity, got ${J}`);
  }
}
