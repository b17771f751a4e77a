/**
 * Asynchronous driver of `startFit`: runs trial steps in slices of about
 * `sliceMs` milliseconds and yields to the event loop between slices, so
 * that messages (e.g. a cancel request in a worker) are handled while a
 * long fit runs. Results are identical to `fitCurve`.
 */
import { startFit } from './fitCurve';
import type { IFitData, IFitModel, IFitOptions, IFitResult } from './types';

/** Default time slice between yields to the event loop, in milliseconds. */
export const DEFAULT_SLICE_MS = 20;

/**
 * Lets queued messages run. A MessageChannel round trip is used where
 * available (browsers clamp nested setTimeout(0) to ≥ 4 ms).
 */
function yieldToEventLoop(): Promise<void> {
  if (typeof MessageChannel !== 'undefined') {
    return new Promise((resolve) => {
      const channel = new MessageChannel();
      channel.port1.onmessage = () => {
        channel.port1.close();
        resolve();
      };
      channel.port2.postMessage(null);
    });
  }
  return new Promise((resolve) => setTimeout(resolve, 0));
}

/** Like `fitCurve`, but cooperative. Rejects with `FitInputError` for invalid inputs. */
export async function fitCurveAsync(
  model: IFitModel,
  data: IFitData,
  options: IFitOptions,
  sliceMs: number = DEFAULT_SLICE_MS
): Promise<IFitResult> {
  const run = startFit(model, data, options);
  let sliceStart = Date.now();
  for (;;) {
    const result = run.step();
    if (result !== null) {
      return result;
    }
    if (Date.now() - sliceStart >= sliceMs) {
      await yieldToEventLoop();
      sliceStart = Date.now();
    }
  }
}
