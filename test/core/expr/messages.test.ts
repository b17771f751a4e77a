/**
 * Messages of the expression area: read from the source, every `msg` call
 * has a literal `expression.*` code and a literal English template (what a
 * string extractor keyed on `msg` finds), each code one template, written
 * as a sentence; and messages really returned carry as many arguments as
 * their template has placeholders.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { guessStarts, inspectExpression, parseExpressionModel } from '../../../src/core/expr/index';
import type { ExpressionError } from '../../../src/core/expr/index';
import { messageText } from '../../../src/core/messages';
import type { ICoreMessage } from '../../../src/core/messages';

const DIR = join(__dirname, '../../../src/core/expr');
const CALL = /\bmsg\(/g;
const LITERAL = /\bmsg\(\s*'([^'\\]*)'\s*,\s*(?:'((?:[^'\\]|\\.)*)'|"((?:[^"\\]|\\.)*)")/g;

function code(text: string): string {
  return text.replace(/\/\*[\s\S]*?\*\//g, '').replace(/(^|[^:'"])\/\/.*$/gm, '$1');
}

const entries: { file: string; code: string; template: string }[] = [];
const counts: { file: string; calls: number; literal: number }[] = [];
for (const name of readdirSync(DIR).filter((f) => f.endsWith('.ts'))) {
  const text = code(readFileSync(join(DIR, name), 'utf8'));
  const literal = [...text.matchAll(LITERAL)];
  counts.push({ file: name, calls: [...text.matchAll(CALL)].length, literal: literal.length });
  for (const m of literal) {
    entries.push({ file: name, code: m[1], template: m[2] ?? m[3] });
  }
}

function placeholders(template: string): number[] {
  return [...new Set([...template.matchAll(/%(\d+)/g)].map((m) => Number(m[1])))].sort((a, b) => a - b);
}

describe('expression messages', () => {
  it('are literal msg calls with expression.* codes, one template per code, written as sentences', () => {
    expect(counts.filter((c) => c.calls !== c.literal).map((c) => c.file)).toEqual([]);
    expect(entries.length).toBeGreaterThan(60);
    expect(entries.filter((e) => !/^expression(\.[a-z0-9-]+)+$/.test(e.code)).map((e) => e.code)).toEqual([]);
    const byCode = new Map<string, Set<string>>();
    for (const e of entries) {
      byCode.set(e.code, (byCode.get(e.code) ?? new Set()).add(e.template));
    }
    expect([...byCode].filter(([, t]) => t.size > 1).map(([c]) => c)).toEqual([]);
    expect(entries.filter((e) => placeholders(e.template).some((n, i) => n !== i + 1)).map((e) => e.code)).toEqual([]);
    expect(entries.filter((e) => !/[.)]$/.test(e.template) || /^[a-z]{2,}/.test(e.template)).map((e) => e.code)).toEqual([]);
  });

  it('returned messages fill every placeholder', () => {
    const seen: ICoreMessage[] = [];
    const texts = ['', 'a*(x', 'a*x)', 'a*x +', 'a*/x', 'a @ x', 'a*foo(x)', 'a*exq(x)', 'a*gamma(x)', 'a*atan2(x)', 'a*x + 5 cm', 'x to cm', 'a*b!', 'a.b', 'a:b', 'true*a', 'a*x + 1e400', 'y = a = b', 'x + 1', 'E*x', 'x = a*x', '√-x', 'a % x'];
    for (const t of texts) {
      const r = inspectExpression(t, { xNames: ['x'] });
      if (r.error) {
        seen.push(r.error);
      }
    }
    seen.push(...inspectExpression('Tc*x + TC + t + sin*H + sqr x + E + 300 K', { xNames: ['x', 'T'], columnNames: ['H (Oe)'] }).flags);
    seen.push(...guessStarts(parseExpressionModel('A*log(-Tc - 1e9 - x)'), [1, 2], [1, 2], { A: Number.NaN }).problems);
    seen.push(...parseExpressionModel((() => {
      let t = 'x';
      for (let i = 0; i < 30; i++) {
        t = `(${t})^(a${i}*x)`;
      }
      return t;
    })()).notes);
    try {
      parseExpressionModel('a*x + q', { parameters: ['a'] });
    } catch (e) {
      seen.push((e as ExpressionError).detail);
    }
    expect(new Set(seen.map((m) => m.code)).size).toBeGreaterThan(25);
    for (const m of seen) {
      expect(placeholders(m.text), m.code).toEqual(m.args.map((_, i) => i + 1));
      expect(messageText(m), m.code).not.toMatch(/%\d/);
    }
  });
});
