/**
 * Checking one saved entry against the schema (ajv, compiled once on first
 * use) and what JSON Schema cannot say, with the first fault described in
 * plain words rather than in the validator's terms.
 */
import Ajv from 'ajv';
import type { ErrorObject, ValidateFunction } from 'ajv';
import { msg } from '../messages';
import type { ICoreMessage } from '../messages';
import { excerpt, isRecord, own, textExcerpt } from './json';
import type { JsonRecord } from './json';
import { SAVED_SCHEMA, SAVED_SCHEMA_ID } from './schema';

let entryValidator: ValidateFunction | null = null;

/** The compiled check of one entry (compiled on first use). */
function validator(): ValidateFunction {
  if (!entryValidator) {
    const ajv = new Ajv({ allErrors: false, allowUnionTypes: true, strict: true, strictRequired: false });
    ajv.addSchema(SAVED_SCHEMA);
    const compiled = ajv.getSchema(`${SAVED_SCHEMA_ID}#/definitions/analysis`);
    if (!compiled) {
      throw new Error('psiscape: the saved-analysis schema has no entry definition');
    }
    entryValidator = compiled;
  }
  return entryValidator;
}

/**
 * How an entry is named in messages: its position (from 1) and, when it has
 * one, its id.
 */
export function entryLabel(entry: unknown, index: number): string {
  const id = isRecord(entry) ? own(entry, 'id') : undefined;
  return typeof id === 'string' && id !== '' ? `${index + 1} (id ${excerpt(id)})` : String(index + 1);
}

/** JSON Pointer segments of a validator path. */
function segments(pointer: string): string[] {
  return pointer === '' ? [] : pointer.slice(1).split('/').map(s => s.replace(/~1/g, '/').replace(/~0/g, '~'));
}

/** The first schema failure in plain words. */
function describe(error: ErrorObject, label: string): ICoreMessage {
  const path = segments(error.instancePath);
  if (error.keyword === 'required') {
    path.push(String((error.params as { missingProperty?: string }).missingProperty ?? ''));
  }
  const [top, second, third] = path;
  switch (top) {
    case undefined:
      return msg('saved.entry-not-record', 'saved analysis %1 is not a record of named fields', label);
    case 'id':
      return msg('saved.entry-id', 'saved analysis %1 has no id (it must be text that is not empty)', label);
    case 'source':
      return second === 'outputIndex'
        ? msg('saved.entry-output-index', 'saved analysis %1: the output number of its source is not a whole number from 0', label)
        : msg('saved.entry-source', 'saved analysis %1: its source does not name the notebook, cell id, output number and content hash of its table', label);
    case 'columns':
      if (second === 'sigma') {
        return msg('saved.entry-sigma-column', 'saved analysis %1: its σ column is neither null nor a position (a whole number) with a header', label);
      }
      return second === 'x' || second === 'y'
        ? msg('saved.entry-column', 'saved analysis %1: its %2 column is not a position (a whole number) with a header', label, second)
        : msg('saved.entry-columns', 'saved analysis %1: its columns do not name an x column, a y column and a σ column (or null)', label);
    case 'snapshot':
      switch (second) {
        case 'headers':
          return msg('saved.entry-snapshot-headers', 'saved analysis %1: the headers of its saved data are not a list of text', label);
        case 'units':
          return msg('saved.entry-snapshot-units', 'saved analysis %1: the units of its saved data are not a list of text or null', label);
        case 'values':
          return third === undefined
            ? msg('saved.entry-snapshot-values', 'saved analysis %1: the values of its saved data are not a list of columns', label)
            : msg('saved.entry-snapshot-column', 'saved analysis %1: column %2 of its saved data is not a list of numbers (null for a missing value)', label, String(Number(third) + 1));
        case 'rows':
          return msg('saved.entry-snapshot-rows', 'saved analysis %1: the row count of its saved data is not a whole number from 0', label);
        case 'hash':
          return msg('saved.entry-snapshot-hash', 'saved analysis %1: the hash of its saved data is not 16 hexadecimal digits', label);
        default:
          return msg('saved.entry-snapshot', 'saved analysis %1 has no readable saved data (headers, units and the values of each column, or for a large table its row count and hash)', label);
      }
    case 'settings':
      switch (second) {
        case 'kind':
          return msg('saved.entry-kind', 'saved analysis %1: its analysis kind is not a name (text that is not empty)', label);
        case 'options':
          return third === undefined
            ? msg('saved.entry-options', 'saved analysis %1: its analysis options are not a record of named values', label)
            : msg('saved.entry-option', 'saved analysis %1: its option "%2" is not text, a number or true/false', label, textExcerpt(third));
        case 'window':
          return msg('saved.entry-window', 'saved analysis %1: its fit window is not a pair of numbers (null for an open end)', label);
        default:
          return msg('saved.entry-settings', 'saved analysis %1: its analysis settings are neither null nor a kind with options and a fit window', label);
      }
    default:
      return msg('saved.entry-invalid', 'saved analysis %1 does not match the saved format (at %2)', label, error.instancePath || '/');
  }
}

/** What the schema cannot say: one count for headers, units and columns; one length for all columns. */
function checkShape(entry: JsonRecord, label: string): ICoreMessage | null {
  const snapshot = own(entry, 'snapshot') as JsonRecord;
  const headers = own(snapshot, 'headers') as unknown[];
  const units = own(snapshot, 'units') as unknown[];
  if (own(snapshot, 'omitted') === true) {
    return headers.length === units.length
      ? null
      : msg('saved.entry-snapshot-units-count', 'saved analysis %1: its saved data has %2 headers and %3 units, which do not match', label, String(headers.length), String(units.length));
  }
  const values = own(snapshot, 'values') as unknown[][];
  if (headers.length !== units.length || headers.length !== values.length) {
    return msg('saved.entry-snapshot-count', 'saved analysis %1: its saved data has %2 headers, %3 units and %4 columns, which do not match', label, String(headers.length), String(units.length), String(values.length));
  }
  if (values.some(c => c.length !== values[0].length)) {
    return msg('saved.entry-snapshot-lengths', 'saved analysis %1: the columns of its saved data do not all have the same length', label);
  }
  return null;
}

/**
 * Check one entry in the version 2 form.
 *
 * @returns null when it is a valid entry, else the first fault in plain words.
 */
export function checkEntry(entry: unknown, label: string): ICoreMessage | null {
  const validate = validator();
  if (!validate(entry)) {
    const first = validate.errors?.[0];
    return first ? describe(first, label) : msg('saved.entry-invalid', 'saved analysis %1 does not match the saved format (at %2)', label, '/');
  }
  return checkShape(entry as JsonRecord, label);
}
