/**
 * Why an analysis job could not run: a message naming the input at fault.
 */
import { CoreMessageError } from '../messages';
import type { ICoreMessage } from '../messages';

/** Bad input to an analysis job (window, options, points). */
export class AnalysisInputError extends CoreMessageError {
  constructor(detail: ICoreMessage) {
    super(detail);
    this.name = 'AnalysisInputError';
  }
}
