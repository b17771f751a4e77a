/**
 * Progress and cancellation passed from whoever runs an analysis job (the
 * worker protocol, tests) through to the fit engine.
 */
import type { IFitOptions } from '../fit/types';

/** Hooks of a running job. */
export interface IAnalysisHooks {
  onProgress?: IFitOptions['onProgress'];
  shouldStop?: IFitOptions['shouldStop'];
}
