/**
 * Web Worker entry of the one analysis worker: wires messages to the pure
 * handler in src/core/analysis/protocol.ts. Jobs run one at a time, in the
 * order they arrive (the client sends the next one when a job ends).
 */
import { handleAnalysisMessage, parseTransfer } from '../core/analysis/protocol';
import type { AnalysisResponse } from '../core/analysis/protocol';

interface IWorkerScope {
  onmessage: ((event: MessageEvent<unknown>) => void) | null;
  postMessage(message: AnalysisResponse, transfer?: Transferable[]): void;
}

const scope = self as unknown as IWorkerScope;
scope.onmessage = event => {
  handleAnalysisMessage(event.data, message => scope.postMessage(message, message.kind === 'parsed' ? parseTransfer(message.result) : []));
};
