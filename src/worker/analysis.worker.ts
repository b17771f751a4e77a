/**
 * Web Worker entry for the analysis panel's fits: wires messages to the pure
 * handler in src/core/analysis/protocol.ts.
 */
import { handleAnalysisMessage } from '../core/analysis/protocol';
import type { AnalysisResponse } from '../core/analysis/protocol';

interface IWorkerScope {
  onmessage: ((event: MessageEvent<unknown>) => void) | null;
  postMessage(message: AnalysisResponse): void;
}

const scope = self as unknown as IWorkerScope;
scope.onmessage = event => {
  handleAnalysisMessage(event.data, message => scope.postMessage(message));
};
