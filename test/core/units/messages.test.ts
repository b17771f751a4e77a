/** Messages of the unit readers: questions, refusals and errors name the column and say what to give. */
import { describe, expect, it } from 'vitest';
import { messageText } from '../../../src/core/messages';
import type { ICoreMessage } from '../../../src/core/messages';
import { convertQuantity, massFromMolar, muBPerFormulaUnit, readColumnUnit, UnitInputError } from '../../../src/core/units/index';
import type { ColumnRole } from '../../../src/core/units/index';
import { expectGoodMessages, thrownMessage } from '../numeric/messageRules';

describe('unit messages', () => {
  it('questions and refusals of column units are good messages', () => {
    const cases: [string, string | null, ColumnRole][] = [
      ['T', null, 'temperature'],
      ['H', '', 'field'],
      ['M', null, 'magnetisation'],
      ['H', 'G', 'field'],
      ['M', 'kG', 'magnetisation'],
      ['M', 'gauss', 'magnetisation'],
      ['M', 'a.u.', 'magnetisation'],
      ['T', 'T', 'temperature'],
      ['T', 'Oe', 'temperature'],
      ['H', 'K', 'field'],
      ['M', 'T', 'magnetisation'],
      ['M', 'kg', 'magnetisation'],
      ['M', 'furlong', 'magnetisation']
    ];
    const out: ICoreMessage[] = [];
    for (const [column, unit, role] of cases) {
      const a = readColumnUnit(column, unit, role);
      expect(a.status, `${column} ${unit} ${role}`).not.toBe('ok');
      if (a.status !== 'ok') {
        expect(messageText(a.message)).toContain(`“${column}”`);
        out.push(a.message);
      }
    }
    expectGoodMessages(out);
    expect(new Set(out.map(m => m.code)).size).toBe(10);
  });

  it('errors are UnitInputErrors with good messages', () => {
    const out = [
      thrownMessage(() => muBPerFormulaUnit(1, 0), UnitInputError),
      thrownMessage(() => massFromMolar([1], Number.NaN), UnitInputError),
      thrownMessage(() => convertQuantity(1, 'blorp', 'A/m'), UnitInputError),
      thrownMessage(() => convertQuantity(1, 'Oe', 'K'), UnitInputError)
    ];
    expectGoodMessages(out);
    expect(out.map(m => m.code)).toEqual(['units.molar-mass-invalid', 'units.molar-mass-invalid', 'units.unknown', 'units.cannot-convert']);
  });
});
