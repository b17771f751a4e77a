/**
 * Text normalisation of model expressions typed by users or printed in
 * reference files, before mathjs parses them:
 *
 * - `[ ]` → `( )`, `**` → `^`, function aliases (`arctan` → `atan`, `ln` → `log`, …);
 * - the product's own notation: `·` `×` `⋅` `∙` → `*`, `÷` → `/`, `−` `–` → `-`,
 *   `≤` `≥` `≠` → `<=` `>=` `!=`, `&&` `||` → `and` `or`, superscript powers
 *   (`x²` → `x^2`, `x⁻¹` → `x^(-1)`), subscript digits (`χ₀` → `χ0`), the micro
 *   sign `µ` → Greek `μ`, and `√`/`∛` applied to the name, number, call or
 *   parenthesis right after them (`√x` → `sqrt(x)`, `√(…)` → `sqrt(…)`, so
 *   `√x²` is `sqrt(x)^2`);
 * - line breaks, tabs and non-breaking spaces → spaces;
 * - an optional `lhs = rhs` form (see `splitEquation`).
 *
 * Numbers (`1.5e-3`, `2E6`) are copied unchanged. `normalizeWithMap` also
 * returns, for every character of the normalised text, the index of the
 * character of the original text it came from, so that an error found in
 * the normalised text can point into what the user typed.
 */
import { CoreMessageError, msg } from '../messages';
import type { ICoreMessage } from '../messages';

/** Function-name aliases accepted in expressions, mapped to the canonical name. */
export const FUNCTION_ALIASES: Readonly<Record<string, string>> = Object.freeze({
  arctan: 'atan',
  arcsin: 'asin',
  arccos: 'acos',
  arctanh: 'atanh',
  arcsinh: 'asinh',
  arccosh: 'acosh',
  ln: 'log'
});

/** Result of splitting `lhs = rhs`. */
export interface IEquationText {
  /** Left-hand side (response), or null when the text has no `=`. */
  lhs: string | null;
  /** Right-hand side (model). */
  rhs: string;
}

/** Normalised text with the way back to the original. */
export interface INormalizedText {
  /** Normalised, trimmed text. */
  readonly text: string;
  /**
   * `map[i]` is the index in the original text of normalised character `i`;
   * `map[text.length]` is the end of the meaningful original text.
   */
  readonly map: readonly number[];
}

/** Error in a model expression (syntax, unknown function, unsupported construct …). */
export class ExpressionError extends CoreMessageError {
  /**
   * @param detail what is wrong, in our words (a bare string is accepted
   *   for older callers and wrapped as it is)
   * @param position index into the text the user typed, or null
   */
  constructor(
    detail: ICoreMessage | string,
    readonly position: number | null = null
  ) {
    super(typeof detail === 'string' ? msg('expression.invalid', 'The expression cannot be used (%1).', detail) : detail);
    this.name = 'ExpressionError';
  }
}

/** Longest stretch of user text a message may quote. */
export const QUOTE_LIMIT = 40;

/** User text for a message: at most `limit` characters (an ellipsis marks the cut). */
export function quote(text: string, limit = QUOTE_LIMIT): string {
  const chars = Array.from(text);
  return chars.length <= limit ? text : `${chars.slice(0, limit - 1).join('')}…`;
}

/** Names for a message: at most `max` of them, each shortened, `…` when some are left out (≤ ~75 characters). */
export function nameList(names: readonly string[], max = 4): string {
  const shown = names.slice(0, max).map((n) => quote(n, 16));
  return names.length > max ? `${shown.join(', ')}, …` : shown.join(', ');
}

const ONE_TO_ONE: Readonly<Record<string, string>> = {
  '[': '(',
  ']': ')',
  '·': '*',
  '×': '*',
  '⋅': '*',
  '∙': '*',
  '∗': '*',
  '÷': '/',
  '−': '-',
  '–': '-',
  '‒': '-',
  '﹣': '-',
  µ: 'μ',
  '₀': '0',
  '₁': '1',
  '₂': '2',
  '₃': '3',
  '₄': '4',
  '₅': '5',
  '₆': '6',
  '₇': '7',
  '₈': '8',
  '₉': '9'
};

const SUPERSCRIPT_DIGITS: Readonly<Record<string, string>> = {
  '⁰': '0',
  '¹': '1',
  '²': '2',
  '³': '3',
  '⁴': '4',
  '⁵': '5',
  '⁶': '6',
  '⁷': '7',
  '⁸': '8',
  '⁹': '9'
};

const TWO_CHAR: Readonly<Record<string, string>> = { '**': '^', '&&': ' and ', '||': ' or ' };
const SYMBOLS: Readonly<Record<string, string>> = { '≤': '<=', '≥': '>=', '≠': '!=' };
const ROOTS: Readonly<Record<string, string>> = { '√': 'sqrt', '∛': 'cbrt' };

/** Characters mathjs reads as letters of a name (without `$`, which we do not accept). */
export const NAME_START = /[A-Za-z_\u00C0-\u02AF\u0370-\u03FF\u2100-\u214F]/;
const NAME_PART = /[A-Za-z_0-9\u00C0-\u02AF\u0370-\u03FF\u2100-\u214F]/;

function isSpace(c: string): boolean {
  return /\s/.test(c) || c === '\u00A0' || c === '\u2009' || c === '\u202F' || c === '\u2007';
}

/** Builder of normalised text with its map. */
class Out {
  text = '';
  readonly map: number[] = [];
  push(s: string, origin: number): void {
    this.text += s;
    for (let j = 0; j < s.length; j++) {
      this.map.push(origin);
    }
  }
}

/**
 * Normalises `text` (see the module comment) and maps every normalised
 * character back to the original. Throws `ExpressionError` only for a `√`
 * with nothing it could apply to.
 */
export function normalizeWithMap(text: string): INormalizedText {
  // 1:1 substitutions first (indices are unchanged).
  const chars: string[] = [];
  for (let i = 0; i < text.length; i++) {
    const c = text[i];
    chars.push(Object.prototype.hasOwnProperty.call(ONE_TO_ONE, c) ? ONE_TO_ONE[c] : isSpace(c) ? ' ' : c);
  }
  const s = chars.join('');
  const out = new Out();
  /** Closers owed after the next operand (one entry per pending √). */
  let pendingRoots = 0;
  /** For each open parenthesis: closers to write after its `)`. */
  const parenClosers: number[] = [];
  let i = 0;
  const closeOperand = (count: number, origin: number): void => {
    for (let j = 0; j < count; j++) {
      out.push(')', origin);
    }
  };
  const skipSpaces = (from: number): number => {
    let j = from;
    while (j < s.length && s[j] === ' ') {
      j++;
    }
    return j;
  };
  while (i < s.length) {
    const c = s[i];
    const two = s.slice(i, i + 2);
    if (Object.prototype.hasOwnProperty.call(ROOTS, c)) {
      const next = skipSpaces(i + 1);
      const n = s[next];
      if (n === '(') {
        // √(…) is the call itself.
        out.push(ROOTS[c], i);
        i = next;
        continue;
      }
      out.push(`${ROOTS[c]}(`, i);
      pendingRoots++;
      if (n === undefined || !(n === '.' || /[0-9]/.test(n) || NAME_START.test(n) || Object.prototype.hasOwnProperty.call(ROOTS, n))) {
        throw new ExpressionError(
          msg('expression.root.operand', 'The root sign at character %1 must be followed by a name, a number or a parenthesis, e.g. √x or √(1 - x).', i + 1),
          i
        );
      }
      i = next;
      continue;
    }
    if (c === '(') {
      out.push('(', i);
      parenClosers.push(pendingRoots);
      pendingRoots = 0;
      i++;
      continue;
    }
    if (c === ')') {
      out.push(')', i);
      closeOperand(parenClosers.pop() ?? 0, i);
      i++;
      continue;
    }
    if (/[0-9.]/.test(c) && (c !== '.' || /[0-9]/.test(s[i + 1] ?? ''))) {
      // A number: digits, decimals, an exponent (copied as typed).
      const m = /^(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?/.exec(s.slice(i));
      const token = m ? m[0] : c;
      out.push(token, i);
      for (let j = 1; j < token.length; j++) {
        out.map[out.map.length - token.length + j] = i + j;
      }
      i += token.length;
      closeOperand(pendingRoots, i - 1);
      pendingRoots = 0;
      continue;
    }
    if (NAME_START.test(c) || (c >= '\uD800' && c <= '\uDBFF')) {
      let j = i + 1;
      while (j < s.length && (NAME_PART.test(s[j]) || (s[j] >= '\uD800' && s[j] <= '\uDFFF'))) {
        j++;
      }
      const name = s.slice(i, j);
      const after = skipSpaces(j);
      const isCall = s[after] === '(';
      const canonical = isCall && Object.prototype.hasOwnProperty.call(FUNCTION_ALIASES, name) ? FUNCTION_ALIASES[name] : name;
      for (let k = 0; k < canonical.length; k++) {
        out.push(canonical[k], canonical === name ? i + k : i);
      }
      if (isCall) {
        // The call's parenthesis carries the closers of √ before the name.
        if (canonical === name) {
          for (let k = j; k < after; k++) {
            out.push(' ', k);
          }
        }
        out.push('(', after);
        parenClosers.push(pendingRoots);
        pendingRoots = 0;
        i = after + 1;
      } else {
        closeOperand(pendingRoots, j - 1);
        pendingRoots = 0;
        i = j;
      }
      continue;
    }
    if (Object.prototype.hasOwnProperty.call(SUPERSCRIPT_DIGITS, c) || ((c === '⁻' || c === '⁺') && Object.prototype.hasOwnProperty.call(SUPERSCRIPT_DIGITS, s[i + 1] ?? ''))) {
      let j = i;
      let sign = '';
      if (s[j] === '⁻' || s[j] === '⁺') {
        sign = s[j] === '⁻' ? '-' : '';
        j++;
      }
      let digits = '';
      while (j < s.length && Object.prototype.hasOwnProperty.call(SUPERSCRIPT_DIGITS, s[j])) {
        digits += SUPERSCRIPT_DIGITS[s[j]];
        j++;
      }
      out.push(sign ? `^(-${digits})` : `^${digits}`, i);
      if (/[0-9.]/.test(s[j] ?? '')) {
        // x²3 is x²·3, not x^23.
        out.push('*', j - 1);
      }
      i = j;
      continue;
    }
    if (Object.prototype.hasOwnProperty.call(TWO_CHAR, two)) {
      out.push(TWO_CHAR[two], i);
      i += 2;
      continue;
    }
    if (Object.prototype.hasOwnProperty.call(SYMBOLS, c)) {
      out.push(SYMBOLS[c], i);
      i++;
      continue;
    }
    out.push(c, i);
    i++;
  }
  // Trim, keeping the map aligned.
  const full = out.text;
  const start = full.length - full.trimStart().length;
  const trimmed = full.trim();
  const map = out.map.slice(start, start + trimmed.length);
  const endOrigin = trimmed.length > 0 ? map[map.length - 1] + 1 : text.trimEnd().length;
  map.push(Math.min(endOrigin, text.length));
  return { text: trimmed, map };
}

/** Applies the mappings of `normalizeWithMap` and returns the text alone. */
export function normalizeExpressionText(text: string): string {
  return normalizeWithMap(text).text;
}

/** Splits a normalised `lhs = rhs` text at its single `=` (not `==`, `<=`, `>=`, `!=`). Throws `ExpressionError` for a second `=`. */
export function splitEquation(text: string): IEquationText {
  const split = splitEquationAt(text);
  if (split.equals.length > 1) {
    throw new ExpressionError(
      msg('expression.equals.count', "An equation has at most one '=' (response = model): this one has %1.", split.equals.length),
      split.equals[1]
    );
  }
  return { lhs: split.lhs, rhs: split.rhs };
}

/** `splitEquation` with the offsets of both sides and of every `=` in `text`. */
export interface IEquationSplit extends IEquationText {
  lhsOffset: number;
  rhsOffset: number;
  /** Offsets of the `=` signs (more than one is an error the caller reports). */
  equals: number[];
}

/** Splits at the first `=`, with offsets; the caller checks `equals.length`. */
export function splitEquationAt(text: string): IEquationSplit {
  const equals: number[] = [];
  const re = /(?<![<>=!])=(?!=)/g;
  for (let m = re.exec(text); m !== null; m = re.exec(text)) {
    equals.push(m.index);
  }
  const trimmedAt = (from: number, to: number): { part: string; offset: number } => {
    const raw = text.slice(from, to);
    return { part: raw.trim(), offset: from + (raw.length - raw.trimStart().length) };
  };
  if (equals.length === 0) {
    const r = trimmedAt(0, text.length);
    return { lhs: null, rhs: r.part, lhsOffset: 0, rhsOffset: r.offset, equals };
  }
  const l = trimmedAt(0, equals[0]);
  const r = trimmedAt(equals[0] + 1, equals.length > 1 ? equals[1] : text.length);
  return { lhs: l.part, rhs: r.part, lhsOffset: l.offset, rhsOffset: r.offset, equals };
}
