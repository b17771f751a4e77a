/**
 * The worker protocol gives results identical to direct `fitCurve` calls,
 * reports progress and errors, and a cancel returns the best point so far.
 */
import { createRequire } from 'node:module';
import * as path from 'node:path';
import { Worker } from 'node:worker_threads';
import { describe, expect, it } from 'vitest';
import {
  FitModelRegistry,
  FitProtocolHandler,
  fitCurve
} from '../../../src/core/fit/index';
import type { FitResponse, IFitRequest, IResultResponse } from '../../../src/core/fit/index';
import { parseExpressionModel } from '../../../src/core/expr/index';
import { decay, linspace } from './models';
import { mulberry32, normalGenerator } from './prng';

const x = linspace(0, 5, 40);
const g = normalGenerator(mulberry32(77));
const y = x.map((v) => 1.5 * Math.exp(-0.6 * v) + 0.2 + 0.02 * g());

function inThread(registry?: FitModelRegistry): { handler: FitProtocolHandler; messages: FitResponse[] } {
  const messages: FitResponse[] = [];
  const handler = new FitProtocolHandler((m) => messages.push(m), registry);
  return { handler, messages };
}

function resultOf(messages: FitResponse[], id: string): IResultResponse {
  const r = messages.find((m) => m.id === id && m.kind === 'result');
  if (!r || r.kind !== 'result') {
    throw new Error(`no result for ${id}: ${JSON.stringify(messages.filter((m) => m.kind === 'error'))}`);
  }
  return r;
}

describe('fit protocol in-thread', () => {
  it('expression spec gives exactly the direct result', async () => {
    const { handler, messages } = inThread();
    const request: IFitRequest = {
      id: 'a',
      kind: 'fit',
      modelSpec: 'a*exp(-b*x) + c',
      data: { x, y },
      options: { start: [1, 1, 0] },
      progressIntervalMs: 0
    };
    await handler.handle(request);
    const direct = fitCurve(parseExpressionModel('a*exp(-b*x) + c'), { x, y }, { start: [1, 1, 0] });
    expect(resultOf(messages, 'a').result).toEqual(direct);
    expect(messages.some((m) => m.kind === 'progress')).toBe(true);
  });

  it('registered model spec gives exactly the direct result', async () => {
    const registry = new FitModelRegistry();
    registry.register('decay', () => decay);
    const { handler, messages } = inThread(registry);
    await handler.handle({ id: 'r', kind: 'fit', modelSpec: { kind: 'registered', name: 'decay' }, data: { x, y }, options: { start: [1, 1, 0] } });
    expect(resultOf(messages, 'r').result).toEqual(fitCurve(decay, { x, y }, { start: [1, 1, 0] }));
  });

  it('answers bad requests with error messages', async () => {
    const { handler, messages } = inThread();
    await handler.handle({ id: 'e1', kind: 'fit', modelSpec: 'a*exp(-b*x', data: { x, y }, options: { start: [1, 1] } });
    await handler.handle({ id: 'e2', kind: 'fit', modelSpec: 'a*x', data: { x, y: y.slice(1) }, options: { start: [1] } });
    await handler.handle({ id: 'e3', kind: 'fit', modelSpec: { kind: 'registered', name: 'nope' }, data: { x, y }, options: { start: [1] } });
    await handler.handle({ id: 'e4', kind: 'bogus' });
    await handler.handle('not a message');
    const errors = messages.filter((m) => m.kind === 'error');
    expect(errors.map((m) => m.id)).toEqual(['e1', 'e2', 'e3', 'e4', '']);
    expect(errors[0].kind === 'error' && errors[0].error.name).toBe('ExpressionError');
    expect(errors[1].kind === 'error' && errors[1].error.message).toMatch(/data\.y has length 39/);
    expect(errors[2].kind === 'error' && errors[2].error.message).toMatch(/unknown model "nope"/);
  });

  it('cancel returns the best point so far, flagged', async () => {
    // A slow model so the fit spans several event-loop slices.
    const slow = {
      parameters: ['a', 'b', 'c'],
      evaluate(p: Float64Array, xs: Float64Array, out: Float64Array) {
        const until = Date.now() + 2;
        while (Date.now() < until) {
          // busy wait
        }
        decay.evaluate(p, xs, out);
      }
    };
    const registry = new FitModelRegistry();
    registry.register('slow', () => slow);
    const messages: FitResponse[] = [];
    const handler = new FitProtocolHandler(
      (m) => {
        messages.push(m);
        if (m.kind === 'progress' && m.iteration >= 1) {
          void handler.handle({ id: 'c', kind: 'cancel' });
        }
      },
      registry,
      5
    );
    await handler.handle({
      id: 'c',
      kind: 'fit',
      modelSpec: { kind: 'registered', name: 'slow' },
      data: { x, y },
      options: { start: [10, 5, 3] },
      progressIntervalMs: 0
    });
    const r = resultOf(messages, 'c').result;
    expect(r.converged).toBe(false);
    expect(r.reason).toBe('cancelled');
    const progressCosts = messages.flatMap((m) => (m.kind === 'progress' ? [m.cost] : []));
    expect(r.chi2).toBe(Math.min(...progressCosts));
    const full = fitCurve(decay, { x, y }, { start: [10, 5, 3] });
    expect(r.iterations).toBeLessThan(full.iterations);
  });
});

describe('fit protocol through a Node worker thread', () => {
  it('gives exactly the direct result and honours cancel', async () => {
    // The worker loads the TypeScript host through tsx's CommonJS register API.
    const req = createRequire(__filename);
    const bootstrap = `require(${JSON.stringify(req.resolve('tsx/cjs/api'))}).register();
require(${JSON.stringify(path.resolve(__dirname, 'nodeFitWorker.ts'))});`;
    const worker = new Worker(bootstrap, { eval: true });
    const failed = new Promise<never>((_, reject) => worker.on('error', reject));
    try {
      const received: FitResponse[] = [];
      const done = (id: string): Promise<FitResponse> =>
        new Promise((resolve) => {
          const listener = (m: FitResponse): void => {
            received.push(m);
            if (m.id === id && (m.kind === 'result' || m.kind === 'error')) {
              worker.off('message', listener);
              resolve(m);
            }
          };
          worker.on('message', listener);
        });
      const pending = done('w1');
      worker.postMessage({ id: 'w1', kind: 'fit', modelSpec: 'a*exp(-b*x) + c', data: { x, y }, options: { start: [1, 1, 0] } });
      const m = await Promise.race([pending, failed]);
      const direct = fitCurve(parseExpressionModel('a*exp(-b*x) + c'), { x, y }, { start: [1, 1, 0] });
      expect(m.kind === 'result' && m.result).toEqual(direct);

      // A large fit cancelled right after it starts.
      const big = linspace(0, 5, 200000);
      const bigY = big.map((v) => 1.5 * Math.exp(-0.6 * v) + 0.2);
      const pending2 = done('w2');
      worker.postMessage({ id: 'w2', kind: 'fit', modelSpec: 'a*exp(-b*x) + c', data: { x: big, y: bigY }, options: { start: [10, 5, 3] } });
      worker.postMessage({ id: 'w2', kind: 'cancel' });
      const m2 = await Promise.race([pending2, failed]);
      expect(m2.kind).toBe('result');
      if (m2.kind === 'result') {
        expect(m2.result.reason).toBe('cancelled');
        expect(m2.result.converged).toBe(false);
        expect(m2.result.values).toHaveLength(3);
      }
    } finally {
      await worker.terminate();
    }
  });
});
