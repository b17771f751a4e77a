/**
 * The catalogue of analysis kinds: the one place that lists what the panel
 * can run on two columns. Everything else — the panel's picker and option
 * controls, the worker's dispatch, the saved format's validation, the result
 * views — reads it from here. To add a kind, write its entry (see
 * `types.ts` and DEVELOPERS.md) and add it to {@link ANALYSIS_KINDS}.
 */
import { msg } from '../../messages';
import type { ICoreMessage } from '../../messages';
import { beanRodbellKind } from './bean-rodbell';
import { curieWeissKind } from './curie-weiss';
import { expressionKind } from './expression';
import { landauKind } from './landau';
import { powerLawCorrectedKind, powerLawKind } from './power-law';
import type { IAnalysisKind, OptionSpec, OptionValue } from './types';
import { weissKind } from './weiss';

/** Every analysis kind, in the order the picker shows them. */
export const ANALYSIS_KINDS = [powerLawKind, powerLawCorrectedKind, weissKind, curieWeissKind, landauKind, beanRodbellKind, expressionKind] as const;

/** The id of a catalogued kind. */
export type AnalysisKindId = (typeof ANALYSIS_KINDS)[number]['id'];

/** The kind a new analysis starts with. */
export const DEFAULT_KIND: AnalysisKindId = 'power-law';

const BY_ID: ReadonlyMap<string, IAnalysisKind> = new Map(ANALYSIS_KINDS.map(k => [k.id, k as IAnalysisKind]));

/** Whether this version knows a kind id. */
export function isKnownKind(id: string): id is AnalysisKindId {
  return BY_ID.has(id);
}

/** The catalogue entry of a kind, or null. */
export function kindById(id: string): IAnalysisKind | null {
  return BY_ID.get(id) ?? null;
}

/** The default options of a kind. */
export function defaultOptions(id: string): Record<string, OptionValue> {
  const kind = kindById(id);
  const out: Record<string, OptionValue> = {};
  for (const [key, spec] of Object.entries(kind?.options ?? {})) {
    out[key] = spec.default;
  }
  return out;
}

/** JSON has no ±∞: the saved form writes them as "inf" / "-inf". */
export function optionToJson(value: OptionValue): string | number | boolean {
  return typeof value === 'number' && !Number.isFinite(value) ? (Number.isNaN(value) ? 'nan' : value > 0 ? 'inf' : '-inf') : value;
}

/** Reads a saved option value back ("inf" / "-inf" for ±∞ in numeric choices). */
export function optionFromJson(spec: OptionSpec, value: unknown): OptionValue | undefined {
  if (spec.type === 'boolean') {
    return typeof value === 'boolean' ? value : undefined;
  }
  if (spec.type === 'text' || spec.type === 'column') {
    return typeof value === 'string' ? value : undefined;
  }
  const numeric = typeof spec.default === 'number';
  const v = numeric && value === 'inf' ? Infinity : numeric && value === '-inf' ? -Infinity : value;
  return spec.choices.some(c => c.value === v) ? (v as OptionValue) : undefined;
}

/** The label of a choice value, for messages. */
function choiceList(spec: OptionSpec): string {
  return spec.type === 'choice' ? spec.choices.map(c => String(optionToJson(c.value))).join(', ') : '';
}

/**
 * Check saved settings against the catalogue.
 *
 * @returns null when the kind is known and every option it knows holds an
 * allowed value (options it does not know are left alone), else why not.
 */
export function validateKindSettings(settings: { kind: string; options: Record<string, unknown> }): ICoreMessage | null {
  const kind = kindById(settings.kind);
  if (!kind) {
    return msg('saved.unknown-kind', 'the analysis kind "%1" is not one this psiscape knows', settings.kind.slice(0, 40));
  }
  for (const [key, spec] of Object.entries(kind.options)) {
    if (!(key in settings.options)) {
      continue;
    }
    const raw = settings.options[key];
    if (optionFromJson(spec, raw) === undefined) {
      return spec.type === 'choice'
        ? msg('saved.bad-choice', 'its option "%1" is %2, which is not one of %3', key, JSON.stringify(raw)?.slice(0, 40) ?? 'undefined', choiceList(spec))
        : msg('saved.bad-option-type', 'its option "%1" should be %2', key, spec.type === 'boolean' ? 'true or false' : spec.type === 'column' ? 'a column name' : 'text');
    }
  }
  return null;
}

/**
 * A kind's options from saved (or any untrusted) values: allowed values are
 * taken, missing or unreadable ones fall back to the defaults.
 */
export function optionsFromJson(id: string, options: Record<string, unknown>): Record<string, OptionValue> {
  const kind = kindById(id);
  const out = defaultOptions(id);
  for (const [key, spec] of Object.entries(kind?.options ?? {})) {
    const v = optionFromJson(spec, options[key]);
    if (v !== undefined) {
      out[key] = v;
    }
  }
  return out;
}

export type { IAnalysisKind, IKindModel, IKindResult, OptionSpec, OptionValue, ResultView, IChoiceOption, IBooleanOption, ITextOption, IColumnOption, IOptionChoice } from './types';
