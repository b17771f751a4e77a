/**
 * Node `worker_threads` host of the fit protocol, for tests: the same
 * wiring as src/worker/fit.worker.ts with Node's message port.
 */
import { parentPort } from 'node:worker_threads';
import { FitProtocolHandler } from '../../../src/core/fit/protocol';

const port = parentPort;
if (port) {
  const handler = new FitProtocolHandler((message) => port.postMessage(message));
  port.on('message', (data: unknown) => {
    void handler.handle(data);
  });
}
