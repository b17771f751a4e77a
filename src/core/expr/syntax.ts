/**
 * Reading normalised expression text: a character and parenthesis scan that
 * finds the common typing mistakes with their exact place, mathjs parsing
 * with its errors reworded in our own words, token locations for errors
 * found later in the tree, and the two-line caret display.
 *
 * Positions handed out are indices into the ORIGINAL text (through the map
 * of `normalizeWithMap`); messages number characters from 1. No message
 * quotes more than `QUOTE_LIMIT` characters of what the user typed.
 */
import { parse } from '../numeric/mathjs';
import type { MathNode } from 'mathjs';
import { msg } from '../messages';
import { ExpressionError, NAME_START, quote } from './normalize';
import type { INormalizedText } from './normalize';

/** Deepest parenthesis nesting we read (mathjs' recursive parser stops a few hundred levels down). */
export const MAX_NESTING = 100;

/** Index into the original text of normalised index `i` (the end maps to the end). */
export function originalIndex(n: INormalizedText, i: number): number {
  const k = Math.max(0, Math.min(i, n.map.length - 1));
  return n.map[k];
}

/** 1-based character number (code points) of original index `pos` in `text`, as shown to people. */
export function characterNumber(text: string, pos: number): number {
  return Array.from(text.slice(0, Math.max(0, pos))).length + 1;
}

/** Error at normalised index `i`, with `%N` placeholders already in `detail`. */
function errorAt(n: INormalizedText, original: string, i: number, build: (charNo: number, pos: number) => ReturnType<typeof msg>): ExpressionError {
  const pos = originalIndex(n, i);
  return new ExpressionError(build(characterNumber(original, pos), pos), pos);
}

const OPERATOR_CHARS = '+-*/^(),.<>=!?: ';

function isNameChar(c: string): boolean {
  return NAME_START.test(c) || /[0-9]/.test(c) || (c >= '\uD800' && c <= '\uDFFF');
}

/** A character outside names, numbers and the operators we read; its message. */
function unknownCharacter(c: string, charNo: number, pos: number): ExpressionError {
  let detail;
  if (c === '&' || c === '|') {
    detail = msg('expression.character.logic', 'Character %1 (“%2”): combine conditions with “and” / “or” (or && / ||).', charNo, c);
  } else if (c === '%') {
    detail = msg('expression.character.percent', 'Character %1 (“%2”): percentages and remainders are not supported; write a percentage as a number (5 %2 → 0.05).', charNo, '%');
  } else if (c === '"' || c === "'" || c === '`' || c === '‘' || c === '’' || c === '“' || c === '”') {
    detail = msg('expression.character.quote', 'Character %1 (%2): quotes and primes are not part of expressions; write names without them (Tc2 rather than Tc′).', charNo, c);
  } else if (c === ';') {
    detail = msg('expression.character.semicolon', 'Character %1 (“;”): a model is one formula; remove the semicolon.', charNo);
  } else {
    detail = msg('expression.character.unknown', 'Character %1 (“%2”) is not understood in an expression.', charNo, c);
  }
  return new ExpressionError(detail, pos);
}

/**
 * Checks the characters and the parentheses of the normalised text: unknown
 * characters, a `)` without `(`, a `(` never closed, nesting deeper than
 * `MAX_NESTING`. Throws `ExpressionError` at the first problem.
 */
export function scanText(n: INormalizedText, original: string): void {
  const s = n.text;
  const open: number[] = [];
  for (let i = 0; i < s.length; i++) {
    const c = s[i];
    if (c === '(') {
      open.push(i);
      if (open.length > MAX_NESTING) {
        throw errorAt(n, original, i, (k) =>
          msg('expression.nesting', 'The expression is nested more than %1 parentheses deep (at character %2), more than psiscape reads.', MAX_NESTING, k)
        );
      }
    } else if (c === ')') {
      if (open.length === 0) {
        throw errorAt(n, original, i, (k) => msg('expression.parenthesis.unopened', 'The closing parenthesis at character %1 has no opening one.', k));
      }
      open.pop();
    } else if (!isNameChar(c) && !OPERATOR_CHARS.includes(c)) {
      const pos = originalIndex(n, i);
      const cp = String.fromCodePoint(original.codePointAt(pos) ?? c.charCodeAt(0));
      throw unknownCharacter(cp, characterNumber(original, pos), pos);
    }
  }
  if (open.length > 0) {
    const at = open[open.length - 1];
    throw errorAt(n, original, at, (k) =>
      msg('expression.parenthesis.unclosed', 'The parenthesis opened at character %1 is never closed.', k)
    );
  }
}

/**
 * Parses `part` (a slice of the normalised text starting at `offset`) with
 * mathjs, rewording its errors. Throws `ExpressionError`.
 */
export function parsePart(part: string, offset: number, n: INormalizedText, original: string): MathNode {
  try {
    return parse(part);
  } catch (err) {
    if (err instanceof RangeError) {
      throw new ExpressionError(
        msg('expression.depth', 'The expression is too deeply nested or too long to read; split it into simpler terms.'),
        null
      );
    }
    const raw = err instanceof Error ? err.message : '';
    const charProp = (err as { char?: unknown }).char;
    const local = typeof charProp === 'number' ? Math.max(0, charProp - 1) : part.length;
    const at = offset + Math.min(local, part.length);
    const token = quote(part.slice(local, local + 1) || '', 8);
    if (/conditional/.test(raw)) {
      throw errorAt(n, original, at, (k) =>
        msg('expression.syntax.conditional', 'A conditional is incomplete at character %1: write condition ? value if true : value if false.', k)
      );
    }
    if (/^Unexpected end of expression/.test(raw) || local >= part.length) {
      throw errorAt(n, original, offset + part.length, () =>
        msg('expression.syntax.end', 'The expression ends too early: a number, a name or a parenthesis is missing at its end.')
      );
    }
    if (/^Value expected/.test(raw)) {
      throw errorAt(n, original, at, (k) =>
        msg('expression.syntax.value', 'A number, a name or a parenthesis is missing before “%2” at character %1.', k, token)
      );
    }
    if (/^Unexpected operator/.test(raw)) {
      throw errorAt(n, original, at, (k) => msg('expression.syntax.operator', 'The operator “%2” at character %1 is out of place.', k, token));
    }
    if (/^Parenthesis \) expected/.test(raw)) {
      throw errorAt(n, original, at, (k) => msg('expression.syntax.parenthesis', 'A closing parenthesis is missing at character %1.', k));
    }
    if (/^Digit expected/.test(raw)) {
      throw errorAt(n, original, at, (k) => msg('expression.syntax.digit', 'A digit is expected at character %1 (numbers are written like 12, 0.5 or 1.5e-3).', k));
    }
    if (/^(Unexpected part|Syntax error in part)/.test(raw)) {
      throw errorAt(n, original, at, (k) => msg('expression.syntax.unexpected', 'The expression cannot be read from character %1 (“%2”) on.', k, token));
    }
    throw errorAt(n, original, at, (k) => msg('expression.syntax.other', 'The expression cannot be read at character %1.', k));
  }
}

/** A name, a number or another character of normalised text, with its normalised index. */
export interface IToken {
  kind: 'name' | 'number' | 'other';
  text: string;
  start: number;
}

/** Splits normalised text into names, numbers and single other characters (spaces dropped). */
export function tokenize(s: string): IToken[] {
  const out: IToken[] = [];
  let i = 0;
  while (i < s.length) {
    const c = s[i];
    if (c === ' ') {
      i++;
      continue;
    }
    const num = /^(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?/.exec(s.slice(i, i + 64));
    if (num && /[0-9.]/.test(c)) {
      out.push({ kind: 'number', text: num[0], start: i });
      i += num[0].length;
      continue;
    }
    if (isNameChar(c)) {
      let j = i + 1;
      while (j < s.length && isNameChar(s[j])) {
        j++;
      }
      out.push({ kind: 'name', text: s.slice(i, j), start: i });
      i = j;
      continue;
    }
    out.push({ kind: 'other', text: c, start: i });
    i++;
  }
  return out;
}

/** Where things are in one side of the equation (normalised indices). */
export class Locator {
  private readonly _tokens: IToken[];

  constructor(
    readonly n: INormalizedText,
    readonly original: string,
    from: number,
    to: number
  ) {
    this._tokens = tokenize(n.text.slice(from, to)).map((t) => ({ ...t, start: t.start + from }));
  }

  /** First name token `name` (a call when `call`), else null. */
  name(name: string, call?: boolean): number | null {
    const t = this._tokens;
    for (let i = 0; i < t.length; i++) {
      if (t[i].kind === 'name' && t[i].text === name && (call === undefined || (t[i + 1]?.text === '(') === call)) {
        return t[i].start;
      }
    }
    return null;
  }

  /** A number directly followed by the name `unit` (`5 cm`), else the name itself. */
  quantity(unit: string): { at: number | null; text: string } {
    const t = this._tokens;
    for (let i = 1; i < t.length; i++) {
      if (t[i].kind === 'name' && t[i].text === unit && (t[i - 1].kind === 'number' || t[i - 1].text === ')')) {
        const from = t[i - 1].kind === 'number' ? t[i - 1].start : t[i].start;
        return { at: from, text: this.n.text.slice(from, t[i].start + unit.length) };
      }
    }
    return { at: this.name(unit), text: unit };
  }

  /** First number token whose text satisfies `test`, else null. */
  number(test: (text: string) => boolean): number | null {
    const t = this._tokens.find((tok) => tok.kind === 'number' && test(tok.text));
    return t ? t.start : null;
  }

  /** First occurrence of the operator text `op` outside names and numbers. */
  operator(op: string): number | null {
    const t = this._tokens;
    for (let i = 0; i < t.length; i++) {
      if (t[i].kind === 'other' && this.n.text.startsWith(op, t[i].start)) {
        return t[i].start;
      }
      if (t[i].kind === 'name' && t[i].text === op) {
        return t[i].start;
      }
    }
    return null;
  }

  /** Original index and 1-based character number of normalised index `i` (null stays null). */
  place(i: number | null): { pos: number | null; charNo: number | null } {
    if (i === null) {
      return { pos: null, charNo: null };
    }
    const pos = originalIndex(this.n, i);
    return { pos, charNo: characterNumber(this.original, pos) };
  }
}

/** Width of the text shown above the caret. */
export const CARET_WIDTH = 80;

/**
 * Two lines: the original text (one line, shortened around `pos` with `…`
 * when longer than `CARET_WIDTH` characters) and a line with `^` under the
 * character at `pos` (or just after the end).
 */
export function caretLines(text: string, pos: number): string {
  const chars = Array.from(text.replace(/[\r\n\t\v\f]/g, ' '));
  const at = Math.min(characterNumber(text, pos) - 1, chars.length);
  let start = 0;
  let end = chars.length;
  if (chars.length > CARET_WIDTH) {
    start = Math.max(0, Math.min(at - Math.floor(CARET_WIDTH / 2), chars.length - CARET_WIDTH));
    end = Math.min(chars.length, start + CARET_WIDTH);
  }
  const head = start > 0 ? '…' : '';
  const tail = end < chars.length ? '…' : '';
  const line = head + chars.slice(start, end).join('') + tail;
  return `${line}\n${' '.repeat(head.length + at - start)}^`;
}
