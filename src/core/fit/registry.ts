/**
 * Named fit models that can be requested by name through the worker
 * protocol. Physics modules register a factory (params → IFitModel); the
 * worker bundle must import the modules that register them.
 */
import { FitInputError } from './types';
import type { IFitModel } from './types';

/** Builds a model from JSON-serialisable parameters (closing over its own columns if needed). */
export type FitModelFactory = (params: unknown) => IFitModel;

/** A name → factory map. */
export class FitModelRegistry {
  private readonly factories = new Map<string, FitModelFactory>();

  /** Registers (or replaces) `name`. */
  register(name: string, factory: FitModelFactory): void {
    if (typeof name !== 'string' || name === '') {
      throw new FitInputError('model name must be a non-empty string');
    }
    this.factories.set(name, factory);
  }

  /** True when `name` is registered. */
  has(name: string): boolean {
    return this.factories.has(name);
  }

  /** Registered names, sorted. */
  names(): string[] {
    return [...this.factories.keys()].sort();
  }

  /** Creates the model `name` with `params`; throws `FitInputError` for unknown names. */
  create(name: string, params: unknown): IFitModel {
    const factory = this.factories.get(name);
    if (!factory) {
      throw new FitInputError(`unknown model "${name}"; registered: ${this.names().join(', ') || 'none'}`);
    }
    return factory(params);
  }
}

/** The registry used by the worker protocol unless another is given. */
export const defaultFitModelRegistry = new FitModelRegistry();
