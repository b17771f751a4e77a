/**
 * What every core message must satisfy, checked on messages that code
 * actually returned or threw: a stable code, a template whose placeholders
 * match its arguments, no internals in the text, and numbers rounded.
 */
import { expect } from 'vitest';
import { CoreMessageError, formatArgs, messageOf, messageText } from '../../../src/core/messages';
import type { ICoreMessage } from '../../../src/core/messages';

/** `area.what` (more dotted parts allowed), lower case. */
export const CODE = /^[a-z]+(\.[a-z0-9-]+)+$/;

/** Internals and placeholders-gone-wrong that must never be part of a template. */
export const FORBIDDEN_IN_TEMPLATES = ['ftol', 'gtol', 'xtol', 'options.', 'undefined', 'NaN'];

/** Most significant digits a formatted number may show unless `{ value, digits }` asked for more. */
const MAX_DIGITS = 6;

function significantDigits(text: string): number {
  const mantissa = text.replace(/^[−-]/, '').split('e')[0].replace('.', '').replace(/^0+/, '');
  return mantissa.length;
}

/** The placeholder numbers of a template, as a sorted list of distinct numbers. */
export function placeholders(template: string): number[] {
  const found = new Set<number>();
  for (const m of template.matchAll(/%(\d+)/g)) {
    found.add(Number(m[1]));
  }
  return [...found].sort((a, b) => a - b);
}

/** Everything wrong with one message (empty when it is fine). */
export function messageProblems(m: ICoreMessage): string[] {
  const out: string[] = [];
  if (typeof m?.code !== 'string' || !CODE.test(m.code)) {
    out.push(`code ${JSON.stringify(m?.code)} is not of the form area.what`);
  }
  if (typeof m?.text !== 'string' || m.text.trim() === '') {
    out.push('empty template');
    return out;
  }
  const wanted = Array.from({ length: m.args.length }, (_, i) => i + 1);
  const got = placeholders(m.text);
  if (JSON.stringify(got) !== JSON.stringify(wanted)) {
    out.push(`placeholders ${JSON.stringify(got)} do not match ${m.args.length} arguments`);
  }
  for (const word of FORBIDDEN_IN_TEMPLATES) {
    if (m.text.includes(word)) {
      out.push(`template contains "${word}"`);
    }
  }
  const formatted = formatArgs(m);
  m.args.forEach((a, i) => {
    if (typeof a === 'number' && significantDigits(formatted[i]) > MAX_DIGITS) {
      out.push(`argument ${i + 1} shows ${formatted[i]}: more than ${MAX_DIGITS} significant digits`);
    }
    if (typeof a === 'string') {
      // A number pasted into a string argument escapes the formatter.
      for (const n of a.matchAll(/\d+\.\d{7,}/g)) {
        out.push(`argument ${i + 1} holds the unrounded number ${n[0]}`);
      }
    }
    if (typeof a === 'object' && !(Number.isInteger(a.digits) && a.digits >= 1 && a.digits <= 17)) {
      out.push(`argument ${i + 1} asks for ${a.digits} digits`);
    }
  });
  if (/%\d/.test(messageText(m))) {
    out.push('a placeholder is left in the text');
  }
  return out;
}

/** Asserts that every message is fine; returns how many were checked. */
export function expectGoodMessages(messages: readonly (ICoreMessage | null | undefined)[]): number {
  const problems: string[] = [];
  let n = 0;
  for (const m of messages) {
    if (m === null || m === undefined) {
      continue;
    }
    n++;
    for (const p of messageProblems(m)) {
      problems.push(`${m.code}: ${p} — ${JSON.stringify(m.text)}`);
    }
  }
  expect(problems).toEqual([]);
  return n;
}

/**
 * The message of what `fn` throws: it must throw a CoreMessageError of class
 * `type` whose `message` is the English text of its `detail`.
 */
export function thrownMessage(fn: () => unknown, type: abstract new (...args: never[]) => Error): ICoreMessage {
  let caught: unknown = null;
  try {
    fn();
  } catch (e) {
    caught = e;
  }
  expect(caught, 'expected a throw').toBeInstanceOf(type);
  expect(caught).toBeInstanceOf(CoreMessageError);
  const detail = (caught as CoreMessageError).detail;
  expect((caught as Error).message).toBe(messageText(detail));
  expect((caught as Error).name).toBe(type.name);
  return messageOf(caught);
}
