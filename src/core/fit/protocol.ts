/**
 * Message protocol for running fits off the main thread. Pure: the handler
 * receives messages and posts responses through a callback, so it runs the
 * same in a Web Worker, a Node worker thread or in-thread.
 *
 * Requests:  { id, kind: 'fit', modelSpec, data, options }  |  { id, kind: 'cancel' }
 * Responses: { id, kind: 'progress', … } | { id, kind: 'result', result } | { id, kind: 'error', error }
 *
 * A cancelled fit answers with a normal 'result' whose `converged` is false
 * and `reason` is 'cancelled', holding the best point found so far.
 */
import { parseExpressionModel } from '../expr/expressionModel';
import type { IExpressionModelOptions } from '../expr/expressionModel';
import { fitCurveAsync, DEFAULT_SLICE_MS } from './fitAsync';
import { defaultFitModelRegistry } from './registry';
import type { FitModelRegistry } from './registry';
import type { IFitData, IFitModel, IFitOptions, IFitResult } from './types';

/** A model given as an expression (see `parseExpressionModel`). */
export interface IExpressionModelSpec extends IExpressionModelOptions {
  kind: 'expression';
  expression: string;
}

/** A model registered by name in the handler's registry. */
export interface IRegisteredModelSpec {
  kind: 'registered';
  name: string;
  params?: unknown;
}

/** Model description: an expression string, or one of the specs above. */
export type FitModelSpec = string | IExpressionModelSpec | IRegisteredModelSpec;

/** Fit options that can cross a thread boundary (no callbacks). */
export type SerializableFitOptions = Omit<IFitOptions, 'onProgress' | 'shouldStop'>;

/** Starts a fit. */
export interface IFitRequest {
  id: string;
  kind: 'fit';
  modelSpec: FitModelSpec;
  data: IFitData;
  options: SerializableFitOptions;
  /** Minimum interval between progress messages in ms (default 100; 0 = every step). */
  progressIntervalMs?: number;
}

/** Cancels the fit with the same id. */
export interface ICancelRequest {
  id: string;
  kind: 'cancel';
}

export type FitRequest = IFitRequest | ICancelRequest;

export interface IProgressResponse {
  id: string;
  kind: 'progress';
  iteration: number;
  evaluations: number;
  cost: number;
}

export interface IResultResponse {
  id: string;
  kind: 'result';
  result: IFitResult;
}

export interface IErrorResponse {
  id: string;
  kind: 'error';
  error: { name: string; message: string };
}

export type FitResponse = IProgressResponse | IResultResponse | IErrorResponse;

/** Default minimum interval between progress messages, in ms. */
export const DEFAULT_PROGRESS_INTERVAL_MS = 100;

function isRecord(v: unknown): v is Record<string, unknown> {
  return typeof v === 'object' && v !== null;
}

/** Builds the model described by `spec`. Throws `ExpressionError` / `FitInputError`. */
export function modelFromSpec(spec: FitModelSpec, registry: FitModelRegistry = defaultFitModelRegistry): IFitModel {
  if (typeof spec === 'string') {
    return parseExpressionModel(spec);
  }
  if (isRecord(spec) && spec.kind === 'expression' && typeof spec.expression === 'string') {
    return parseExpressionModel(spec.expression, {
      variables: spec.variables,
      columns: spec.columns,
      constants: spec.constants,
      parameters: spec.parameters,
      symbolicJacobian: spec.symbolicJacobian
    });
  }
  if (isRecord(spec) && spec.kind === 'registered' && typeof spec.name === 'string') {
    return registry.create(spec.name, spec.params);
  }
  throw new TypeError('modelSpec must be an expression string, {kind: "expression", …} or {kind: "registered", …}');
}

/** Dispatches protocol messages; one instance per worker. */
export class FitProtocolHandler {
  private readonly cancelled = new Set<string>();
  private readonly running = new Set<string>();

  constructor(
    private readonly post: (message: FitResponse) => void,
    private readonly registry: FitModelRegistry = defaultFitModelRegistry,
    private readonly sliceMs: number = DEFAULT_SLICE_MS
  ) {}

  /** Handles one incoming message; returns when a started fit has finished. */
  async handle(message: unknown): Promise<void> {
    if (!isRecord(message) || typeof message.id !== 'string') {
      this.post({ id: '', kind: 'error', error: { name: 'TypeError', message: 'message must have a string id' } });
      return;
    }
    const id = message.id;
    if (message.kind === 'cancel') {
      if (this.running.has(id)) {
        this.cancelled.add(id);
      }
      return;
    }
    if (message.kind !== 'fit') {
      this.post({ id, kind: 'error', error: { name: 'TypeError', message: `unknown message kind ${String(message.kind)}` } });
      return;
    }
    await this.runFit(message as unknown as IFitRequest);
  }

  private async runFit(request: IFitRequest): Promise<void> {
    const { id } = request;
    const interval = request.progressIntervalMs ?? DEFAULT_PROGRESS_INTERVAL_MS;
    let lastProgress = -Infinity;
    this.running.add(id);
    try {
      if (!isRecord(request.options) || !isRecord(request.data)) {
        throw new TypeError('fit request needs data and options objects');
      }
      const model = modelFromSpec(request.modelSpec, this.registry);
      const options: IFitOptions = {
        ...request.options,
        shouldStop: () => this.cancelled.has(id),
        onProgress: (p) => {
          const now = Date.now();
          if (now - lastProgress >= interval) {
            lastProgress = now;
            this.post({ id, kind: 'progress', ...p });
          }
        }
      };
      const result = await fitCurveAsync(model, request.data, options, this.sliceMs);
      this.post({ id, kind: 'result', result });
    } catch (err) {
      const e = err instanceof Error ? err : new Error(String(err));
      this.post({ id, kind: 'error', error: { name: e.name, message: e.message } });
    } finally {
      this.running.delete(id);
      this.cancelled.delete(id);
    }
  }
}
