/**
 * inspectExpression: the normalised text and parameters of a good
 * expression, notes about names, and for a bad one what is wrong in our
 * words, where (index into the text as typed) and a caret under it; never
 * more than ~80 characters of the input in any message or caret line.
 */
import { describe, expect, it } from 'vitest';
import { inspectExpression, parseExpressionModel } from '../../../src/core/expr/index';
import { messageText } from '../../../src/core/messages';

const X = { xNames: ['x', 'T'], columnNames: ['T (K)', 'H (Oe)', 'M (emu)'] };

/** Code, position and caret column of the problem in `text`. */
function problem(text: string): { code: string; position: number | null; caretColumn: number | null; message: string } {
  const r = inspectExpression(text, X);
  expect(r.ok, text).toBe(false);
  expect(r.parameters).toEqual([]);
  const lines = r.caret?.split('\n') ?? null;
  if (lines) {
    expect(lines).toHaveLength(2);
    expect(lines[1].trim()).toBe('^');
  }
  return { code: r.error!.code, position: r.position, caretColumn: lines ? lines[1].indexOf('^') : null, message: messageText(r.error!) };
}

describe('inspectExpression on good expressions', () => {
  it('returns the text as it will be fitted and the parameters in order of appearance', () => {
    const r = inspectExpression('T < Tc ? A·(1 − T/Tc)^β : 0', X);
    expect(r).toEqual({
      ok: true,
      normalized: 'T < Tc ? A*(1 - T/Tc)^β : 0',
      parameters: ['Tc', 'A', 'β'],
      flags: [],
      error: null,
      position: null,
      caret: null
    });
  });

  it('flags names that look mistaken, and still accepts them', () => {
    const codes = (text: string): string[] => inspectExpression(text, X).flags.map((f) => f.code);
    expect(codes('A*x + Tc*TC')).toEqual(['expression.flag.parameter-typo']);
    expect(codes('beta*x + betta')).toEqual(['expression.flag.parameter-typo']);
    expect(codes('a1*x + a2 + tau1 + tau2 + b*x + c')).toEqual([]);
    expect(codes('a*sqr x')).toEqual(['expression.flag.function-typo']);
    expect(codes('a*exq x + b')).toEqual(['expression.flag.function-typo']);
    expect(codes('sin*x + a')).toEqual(['expression.flag.function-name']);
    expect(codes('a*x + q*k')).toEqual([]);
    expect(codes('a*x + h*m')).toEqual(['expression.flag.column', 'expression.flag.column']);
    expect(codes('a*x + M*b')).toEqual(['expression.flag.column']);
    expect(codes('a*t')).toEqual(['expression.flag.x-case']);
    expect(codes('a*x + E')).toEqual(['expression.flag.euler']);
    const typo = inspectExpression('A*x + Tc*TC', X).flags[0];
    expect(messageText(typo)).toBe('Tc and TC are two separate parameters; if they are meant to be one, write it the same way both times.');
  });
});

describe('inspectExpression on bad expressions', () => {
  it('says what is wrong in our words and points at it in the original text', () => {
    const cases: [string, string, number | null][] = [
      ['', 'expression.empty', null],
      ['A*exp(-x/T0 + c', 'expression.parenthesis.unclosed', 5],
      ['A*x) + c', 'expression.parenthesis.unopened', 3],
      ['A*x +', 'expression.syntax.end', 5],
      ['A*/x', 'expression.syntax.value', 2],
      ['A*x^^2', 'expression.syntax.value', 4],
      ['1.2.3*a', 'expression.syntax.unexpected', 3],
      ['a*x ? b', 'expression.syntax.conditional', 7],
      ['a @ x', 'expression.character.unknown', 2],
      ['a*x # b', 'expression.character.unknown', 4],
      ['a*x $ b', 'expression.character.unknown', 4],
      ['a % x', 'expression.character.percent', 2],
      ['a & x', 'expression.character.logic', 2],
      ["Tc' * x", 'expression.character.quote', 2],
      ['a*x; b', 'expression.character.semicolon', 3],
      ['A·exq(−x/T₀)', 'expression.function.typo', 2],
      ['A*tahn(x/Tc)', 'expression.function.typo', 2],
      ['A*sqr(x)', 'expression.function.typo', 2],
      ['A (1 - x/Tc)', 'expression.function.call', 0],
      ['a*gamma(x)', 'expression.function.unavailable', 2],
      ['a*atan2(x)', 'expression.function.arity', 2],
      ['a*x + 5 cm', 'expression.unit', 6],
      ['3 kg*x + a', 'expression.unit', 0],
      ['x to cm', 'expression.unit.conversion', 2],
      ['a*b!', 'expression.operator.factorial', 3],
      ['a.b*x', 'expression.construct.dot', 1],
      ['a:b', 'expression.construct.colon', 1],
      ['a*x + 1e400', 'expression.number.infinite', 6],
      ['true*a', 'expression.number.word', 0],
      ['√-x*a', 'expression.root.operand', 0],
      ['y = a*x = b', 'expression.equals', 8],
      ['= a*x', 'expression.response.empty', 0],
      ['y =', 'expression.model.empty', 3],
      ['T = a*x', 'expression.response.variable', 0],
      ['x + 1', 'expression.parameters.none', null],
      ['E*x', 'expression.parameters.constants', null]
    ];
    for (const [text, code, position] of cases) {
      const p = problem(text);
      expect([p.code, p.position], text).toEqual([code, position]);
      if (position !== null) {
        expect(p.caretColumn, text).toBe(Array.from(text.slice(0, position)).length);
      }
      // Our words: no mathjs error text.
      expect(p.message, text).not.toMatch(/\(char \d+\)|Value expected|Unexpected (end|operator|part)|Syntax error in part|Undefined symbol/);
    }
  });

  it('numbers characters from 1, as typed (after multi-character notation)', () => {
    expect(problem('A·x²·foo(x)').message).toBe(
      'Character 6: “foo(…)” reads as a call of a function named foo, which does not exist. To multiply, write foo*(…).'
    );
    expect(problem('a*x + 5 cm').message).toBe(
      'Character 7: “5 cm” reads as a quantity in cm. Expressions hold plain numbers in the units of your columns; if cm is a parameter, write the product with *, as in 5*cm.'
    );
    expect(problem('A*exp(-x/T0 + c').message).toBe('The parenthesis opened at character 6 is never closed.');
  });

  it('accepts a unit name written as a parameter elsewhere, or with an explicit *', () => {
    expect(inspectExpression('a*x + 2*cm', X).parameters).toEqual(['a', 'cm']);
    expect(inspectExpression('Ms*x + 2 Ms', X).parameters).toEqual(['Ms']);
    // T is the x variable here, though mathjs knows T as tesla.
    expect(inspectExpression('2 T + a', X).parameters).toEqual(['a']);
  });

  it('never quotes more than ~80 characters of the input in one message, however many names are involved', () => {
    const names = Array.from({ length: 26 }, (_, i) => `${'p'.repeat(30)}${String.fromCharCode(97 + i)}`);
    const tooMany = (() => {
      try {
        parseExpressionModel(`x + ${names.join(' + ')}`, { parameters: ['a'] });
      } catch (e) {
        return (e as Error).message;
      }
      return '';
    })();
    expect(tooMany).toMatch(/^Character 5: p+… is neither a parameter/);
    const noStart = inspectExpression(names.map((n) => `${n}*x`).join(' + '), X);
    expect(noStart.ok).toBe(true);
    const userChars = (t: string): number => (t.match(/p/g) ?? []).length;
    expect(noStart.flags.map((f) => f.code)).toEqual(new Array<string>(5).fill('expression.flag.parameter-typo'));
    for (const f of noStart.flags) {
      expect(userChars(messageText(f))).toBeLessThanOrEqual(80);
    }
    try {
      parseExpressionModel('1 + pi', { variables: ['x'], aliases: names });
    } catch (e) {
      expect(userChars((e as Error).message)).toBeLessThanOrEqual(80);
    }
  });

  it('never echoes more than ~80 characters of a long input', () => {
    const long = 'k'.repeat(100_000);
    const inputs = [
      `a*x + ${long}(`,
      `${long}(x) + a`,
      `a*x + ${long} @`,
      `a*x + 5 ${long}`,
      `${long}*x = ${long}`,
      `a*x + ${long}*b*c*(`,
      `${'b*'.repeat(50_000)}x +`,
      `${long}*x + ${long.toUpperCase()}`
    ];
    for (const text of inputs) {
      const r = inspectExpression(text, X);
      const texts = [r.error, ...r.flags].filter((m) => m !== null).map((m) => messageText(m));
      for (const t of texts) {
        expect(t.length, t.slice(0, 100)).toBeLessThan(400);
        expect(t).not.toContain('k'.repeat(81));
      }
      if (r.caret) {
        for (const line of r.caret.split('\n')) {
          expect(line.length).toBeLessThanOrEqual(82);
        }
      }
      // The same through parseExpressionModel's error.
      try {
        parseExpressionModel(text, { variables: ['x'] });
      } catch (e) {
        expect((e as Error).message.length).toBeLessThan(400);
      }
    }
    const far = inspectExpression(`${'a*x + '.repeat(200)}b*foo(x)`, X);
    const [line, caret] = far.caret!.split('\n');
    expect(line.startsWith('…')).toBe(true);
    expect(line.slice(caret.indexOf('^'), caret.indexOf('^') + 3)).toBe('foo');
  });

  it('reports nesting beyond what can be read without echoing it', () => {
    const deep = `a*x + ${'(b'.repeat(600)}${')'.repeat(600)}`;
    expect(problem(deep).code).toBe('expression.nesting');
    const chain = `a*x${' + a'.repeat(40_000)}`;
    const r = inspectExpression(chain, X);
    expect(r.ok ? 'ok' : r.error!.code).toMatch(/^(ok|expression\.depth)$/);
  });
});
