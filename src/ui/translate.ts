/**
 * Core messages in the user's language: the template of a {@link ICoreMessage}
 * is the translation key, its arguments are formatted by core's one number
 * formatter (rounded to what matters) and filled in by ITranslator.
 */
import type { TranslationBundle } from '@jupyterlab/translation';
import type { ICoreMessage } from '../core/messages';
import { formatArgs } from '../core/messages';

/** Translate one core message. */
export function translateMessage(trans: TranslationBundle, message: ICoreMessage): string {
  // The key comes from core's message catalogue (extracted with the keyword `msg`).
  return trans.__(message.text, ...formatArgs(message));
}
