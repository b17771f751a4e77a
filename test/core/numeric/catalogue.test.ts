/**
 * The message catalogue of the numerical core (fit, physics, sweeps, table,
 * units, numeric), read from the source: every message is built by `msg`
 * with a literal code and a literal English template (what a string
 * extractor keyed on `msg` finds), each code has one template, and no
 * template leaks internals. The tests beside each area check messages that
 * code really returns (placeholders against arguments, rounding).
 */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { CODE, FORBIDDEN_IN_TEMPLATES, placeholders } from './messageRules';

const ROOT = join(__dirname, '../../../src/core');
const AREAS = ['fit', 'physics', 'sweeps', 'table', 'units', 'numeric'];

function sources(dir: string): string[] {
  return readdirSync(dir).flatMap(name => {
    const path = join(dir, name);
    return statSync(path).isDirectory() ? sources(path) : name.endsWith('.ts') ? [path] : [];
  });
}

/** Source without comments (a `msg(` in a comment is not a call). */
function code(text: string): string {
  return text.replace(/\/\*[\s\S]*?\*\//g, '').replace(/(^|[^:'"])\/\/.*$/gm, '$1');
}

const CALL = /\bmsg\(/g;
const LITERAL_CALL = /\bmsg\(\s*'([^'\\]*)'\s*,\s*'((?:[^'\\]|\\.)*)'/g;

interface IEntry {
  file: string;
  code: string;
  template: string;
}

const entries: IEntry[] = [];
const calls: { file: string; count: number; literal: number }[] = [];
for (const area of AREAS) {
  for (const file of sources(join(ROOT, area))) {
    const text = code(readFileSync(file, 'utf8'));
    const all = [...text.matchAll(CALL)].length;
    const literal = [...text.matchAll(LITERAL_CALL)];
    calls.push({ file, count: all, literal: literal.length });
    for (const m of literal) {
      entries.push({ file, code: m[1], template: m[2] });
    }
  }
}

describe('message catalogue of fit, physics, sweeps, table, units and numeric', () => {
  it('every msg call has a literal code and a literal template', () => {
    expect(calls.filter(c => c.count !== c.literal).map(c => c.file)).toEqual([]);
    expect(entries.length).toBeGreaterThan(200);
  });

  it('codes are area.what', () => {
    expect(entries.filter(e => !CODE.test(e.code)).map(e => e.code)).toEqual([]);
  });

  it('each code has one template', () => {
    const byCode = new Map<string, Set<string>>();
    for (const e of entries) {
      byCode.set(e.code, (byCode.get(e.code) ?? new Set()).add(e.template));
    }
    expect([...byCode].filter(([, t]) => t.size > 1).map(([c]) => c)).toEqual([]);
  });

  it('templates leak no internals and number their placeholders from %1 without gaps', () => {
    const bad = entries.filter(e => FORBIDDEN_IN_TEMPLATES.some(w => e.template.includes(w)));
    expect(bad.map(e => `${e.code}: ${e.template}`)).toEqual([]);
    const gaps = entries.filter(e => placeholders(e.template).some((n, i) => n !== i + 1));
    expect(gaps.map(e => `${e.code}: ${e.template}`)).toEqual([]);
  });

  it('templates are sentences: no lower-case word first (symbols, formulas and names excepted), a full stop last', () => {
    const formula = /^[A-Za-zα-ωΔψφχσ0-9/()·]+ = /;
    const lowerFirst = (t: string): boolean => /^[a-z]{2,}/.test(t) && !/^pandas\b/.test(t);
    const ending = (t: string): boolean => /[.)]$/.test(t) || /\\n%\d$/.test(t);
    const bad = entries.filter(e => !formula.test(e.template) && (lowerFirst(e.template) || !ending(e.template)));
    expect(bad.map(e => `${e.code}: ${e.template}`)).toEqual([]);
  });
});
