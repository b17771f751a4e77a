/**
 * Web Worker entry for fits: wires messages to the pure protocol handler.
 * Models requested by name must be registered in `defaultFitModelRegistry`
 * by modules imported into this bundle.
 */
import { FitProtocolHandler } from '../core/fit/protocol';
import type { FitResponse } from '../core/fit/protocol';

interface IWorkerScope {
  onmessage: ((event: MessageEvent<unknown>) => void) | null;
  postMessage(message: FitResponse): void;
}

const scope = self as unknown as IWorkerScope;
const handler = new FitProtocolHandler((message) => scope.postMessage(message));
scope.onmessage = (event) => {
  void handler.handle(event.data);
};
