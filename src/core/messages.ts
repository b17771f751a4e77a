/**
 * Messages that core code returns for people to read. Core never formats
 * user-facing text itself: it returns a stable `code`, an English template
 * with `%1`, `%2`… placeholders (the translation key, as in gettext), and the
 * arguments. The UI passes `text` and the formatted arguments through
 * JupyterLab's ITranslator, so every message is translatable and numbers are
 * rounded by one formatter to what matters.
 *
 * Templates are written as string literals at the call of {@link msg}, so a
 * string extractor configured with the keyword `msg` (argument 2) finds them.
 */

/**
 * One argument of a message. Plain numbers are shown with 4 significant
 * digits; `{ value, digits }` sets the significant digits; strings are shown
 * as they are.
 */
export type MessageArg = string | number | { value: number; digits: number };

/** A message for people, in our own words. */
export interface ICoreMessage {
  /** Stable identifier (`area.what`), for tests and for code that reacts to a message. */
  readonly code: string;
  /** English template with `%1`… placeholders: the translation key. */
  readonly text: string;
  readonly args: readonly MessageArg[];
}

/** Build a message. */
export function msg(code: string, text: string, ...args: MessageArg[]): ICoreMessage {
  return { code, text, args };
}

/** A number rounded to `digits` significant digits, without trailing zeros or a needless exponent. */
export function formatNumberArg(value: number, digits = 4): string {
  if (Number.isNaN(value)) {
    return 'NaN';
  }
  if (!Number.isFinite(value)) {
    return value > 0 ? '∞' : '−∞';
  }
  if (value === 0) {
    return '0';
  }
  const abs = Math.abs(value);
  let text: string;
  if (abs >= 1e-4 && abs < 1e9) {
    text = Number(value.toPrecision(digits)).toString();
    if (/e/.test(text)) {
      text = value.toPrecision(digits);
    }
  } else {
    const [mantissa, exponent] = value.toExponential(digits - 1).split('e');
    text = `${mantissa.replace(/\.?0+$/, '')}e${Number(exponent)}`;
  }
  return text.replace(/^-/, '−');
}

/** The arguments of a message as strings. */
export function formatArgs(message: ICoreMessage): string[] {
  return message.args.map(a => (typeof a === 'string' ? a : typeof a === 'number' ? formatNumberArg(a) : formatNumberArg(a.value, a.digits)));
}

/**
 * The English text of a message, placeholders filled (for logs, errors'
 * `.message` and tests; the UI translates instead).
 */
export function messageText(message: ICoreMessage): string {
  const args = formatArgs(message);
  return message.text.replace(/%(\d+)/g, (whole, n: string) => args[Number(n) - 1] ?? whole);
}

/** An error whose text is a {@link ICoreMessage}; `message` holds its English text. */
export class CoreMessageError extends Error {
  constructor(readonly detail: ICoreMessage) {
    super(messageText(detail));
    this.name = 'CoreMessageError';
  }
}

/** The message of anything thrown: its `detail` when it carries one, else its text under a generic code. */
export function messageOf(error: unknown): ICoreMessage {
  const detail = (error as { detail?: unknown } | null)?.detail;
  if (detail && typeof detail === 'object' && typeof (detail as ICoreMessage).code === 'string' && typeof (detail as ICoreMessage).text === 'string') {
    return detail as ICoreMessage;
  }
  return msg('error.unexpected', 'Something went wrong inside psiscape: %1', error instanceof Error ? error.message : String(error));
}
