/**
 * Cell readers and header/unit splitting. Expected values follow Python/pandas
 * spellings (common practice, no source) and ISO 8601 date forms.
 */
import { describe, expect, it } from 'vitest';
import {
  canonicalDates,
  decimalsShown,
  fastNumber,
  fixedDecimals,
  parseBoolean,
  parseDateParts,
  parseNumber,
  significantDigits
} from '../../../src/core/table/cells';
import { splitHeader } from '../../../src/core/table/units';

describe('parseNumber', () => {
  it('reads decimal, scientific and special spellings', () => {
    expect(parseNumber('12')).toBe(12);
    expect(parseNumber('-1.5')).toBe(-1.5);
    expect(parseNumber('.5')).toBe(0.5);
    expect(parseNumber('1.')).toBe(1);
    expect(parseNumber('1.000000e+10')).toBe(1e10);
    expect(parseNumber('2.5E-3')).toBe(0.0025);
    expect(parseNumber('inf')).toBe(Infinity);
    expect(parseNumber('-inf')).toBe(-Infinity);
    expect(parseNumber('Infinity')).toBe(Infinity);
    expect(parseNumber('NaN')).toBeNaN();
    expect(parseNumber('0.30000000000000004')).toBe(0.1 + 0.2);
  });
  it('rejects what Number() would misread', () => {
    for (const bad of ['', ' ', '0x10', '0b1', '0o7', '1_000', '1,000', ' 1', '1 ', 'e5', '1e', '1e+', '--1', '+-1', '.', '-', 'abc', '1.2.3', '\u00a01']) {
      expect(parseNumber(bad), JSON.stringify(bad)).toBeUndefined();
    }
  });
  it('fastNumber agrees with parseNumber whenever it answers', () => {
    for (const s of ['0', '-0', '12', '1.5', '-.5', '+3', '1e5', '1.5e-7', '0x1F', '0B1', '0o7', '', ' 1', '1 ', '1\u00a0', 'inf', '.', '-', '00012', '0.']) {
      const fast = fastNumber(s);
      if (fast !== undefined) {
        expect(Object.is(fast, parseNumber(s)), s).toBe(true);
      }
    }
    expect(fastNumber('0x1F')).toBeUndefined();
    expect(fastNumber('')).toBeUndefined();
    expect(fastNumber('1\u00a0')).toBeUndefined();
  });
});

describe('booleans and dates', () => {
  it('reads Python and JSON booleans only', () => {
    expect(parseBoolean('True')).toBe(true);
    expect(parseBoolean('false')).toBe(false);
    expect(parseBoolean('yes')).toBeUndefined();
    expect(parseBoolean('1')).toBeUndefined();
  });
  it('reads ISO dates and rejects impossible months', () => {
    expect(parseDateParts('2024-02-29')).toEqual({ date: '2024-02-29', time: null, zone: null });
    expect(parseDateParts('2024-01-01 12:00:00.500000+01:00')).toEqual({ date: '2024-01-01', time: '12:00:00.500000', zone: '+01:00' });
    expect(parseDateParts('2024-13-01')).toBeUndefined();
    expect(parseDateParts('01/02/2024')).toBeUndefined();
  });
  it('canonical ISO: date-only when all at midnight, else T-separated with trimmed fractions', () => {
    const p = (s: string) => parseDateParts(s) ?? null;
    expect(canonicalDates([p('2024-01-01'), p('2024-01-02 00:00:00'), null])).toEqual(['2024-01-01', '2024-01-02', null]);
    expect(canonicalDates([p('2024-01-01T00:00:00.000'), p('2024-01-02 13:30:15.250')])).toEqual([
      '2024-01-01T00:00:00',
      '2024-01-02T13:30:15.25'
    ]);
    expect(canonicalDates([p('2024-01-01 00:00:00+00:00')])).toEqual(['2024-01-01T00:00:00Z']);
  });
});

describe('digit counting', () => {
  it('counts significant digits as displayed', () => {
    expect(significantDigits('0.000120')).toBe(3);
    expect(significantDigits('1.234560e+05')).toBe(7);
    expect(significantDigits('120')).toBe(2);
    expect(significantDigits('1.50')).toBe(3);
    expect(significantDigits('-77.123457')).toBe(8);
  });
  it('counts decimals shown and fixed-notation decimals', () => {
    expect(decimalsShown('1.250')).toBe(3);
    expect(decimalsShown('2e5')).toBe(0);
    expect(fixedDecimals('1.23e-8')).toBe(10);
    expect(fixedDecimals('3e2')).toBe(0);
  });
});

describe('splitHeader', () => {
  const cases: [string, string, string | null][] = [
    ['T (K)', 'T', 'K'],
    ['M [emu/g]', 'M', 'emu/g'],
    ['H_Oe', 'H', 'Oe'],
    ['mu0H (T)', 'mu0H', 'T'],
    ['T_K', 'T', 'K'],
    ['M_emu/g', 'M', 'emu/g'],
    ['T_set', 'T_set', null],
    ['M_s', 'M_s', null],
    ['T_C', 'T_C', null],
    ['H_c', 'H_c', null],
    ['T', 'T', null],
    ['T (sample A)', 'T (sample A)', null],
    ['chi (arb. units)', 'chi', 'arb. units'],
    ['', '', null]
  ];
  for (const [header, name, unit] of cases) {
    it(`${JSON.stringify(header)} → ${name}, ${unit}`, () => {
      expect(splitHeader(header)).toEqual({ name, unit });
    });
  }
});
