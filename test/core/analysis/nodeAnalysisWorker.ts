/**
 * Node `worker_threads` host of the analysis protocol, for tests: the same
 * wiring as src/worker/analysis.worker.ts with Node's message port.
 */
import { parentPort } from 'node:worker_threads';
import { handleAnalysisMessage } from '../../../src/core/analysis/protocol';

const port = parentPort;
if (port) {
  port.on('message', (data: unknown) => {
    handleAnalysisMessage(data, message => port.postMessage(message));
  });
}
