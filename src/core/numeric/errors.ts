/** Error for invalid input to a numerical routine (codes `numeric.*`); `message` holds its English text. */
import { CoreMessageError } from '../messages';
import type { ICoreMessage } from '../messages';

/** Invalid input to a numerical routine, e.g. a polynomial with a non-finite coefficient. */
export class NumericInputError extends CoreMessageError {
  constructor(detail: ICoreMessage) {
    super(detail);
    this.name = 'NumericInputError';
  }
}
