/**
 * Reading single displayed cells: numbers (with NaN and ±inf as pandas and
 * CSV writers spell them; leniently, as typed or typeset by people, with
 * {@link readNumber}), booleans, ISO dates, and missing markers.
 */

/** Texts that mean "missing" in pandas displays and CSV files. */
const MISSING: ReadonlySet<string> = new Set(['', 'NaN', 'nan', '<NA>', 'NaT', 'None', 'null', 'NULL', 'N/A', 'n/a', '#N/A']);

/** True when a displayed cell means "missing". */
export function isMissingText(text: string): boolean {
  return MISSING.has(text);
}

/**
 * Further texts that mean "missing" where a number is expected (and only
 * there: in a text column they stay text): R's `NA`, the other spellings
 * pandas' read_csv takes as missing, and a lone dash (hyphen, en or em dash,
 * minus sign), which tables print for "no value".
 */
const MISSING_NUMBER: ReadonlySet<string> = new Set([
  'NA', '#NA', '#N/A N/A', 'NAN', '-NaN', '-nan', '-1.#IND', '1.#IND', '-1.#QNAN', '1.#QNAN', '-', '--', '—'
]);

/** True when a cell, trimmed and with its minus normalised ({@link numberText}), means "missing" where a number is expected. */
export function isMissingNumberText(text: string): boolean {
  return MISSING.has(text) || MISSING_NUMBER.has(text);
}

/**
 * Signs read as a minus: the minus sign U+2212 (typeset tables, Unicode-aware
 * writers), the figure dash U+2012 and en dash U+2013 (word processors turn a
 * typed hyphen before a number into one), the hyphen U+2010 and non-breaking
 * hyphen U+2011, and the small and full-width hyphen-minus U+FE63, U+FF0D.
 * The em dash is not among them: no writer puts it before a number, and on
 * its own it marks a missing value.
 */
const MINUS_LIKE = /[\u2010\u2011\u2012\u2013\u2212\uFE63\uFF0D]/g;

/**
 * A cell as a number reader sees it: without surrounding whitespace (spaces,
 * tabs, no-break spaces), every dash-like minus ({@link MINUS_LIKE}) written
 * as an ASCII hyphen-minus.
 */
export function numberText(text: string): string {
  return text.trim().replace(MINUS_LIKE, '-');
}

/** Infinity spelled without regard to case (`inf`, `INF`, `Infinity`) or as `∞`, with an optional sign. */
function infinityOf(text: string): number | undefined {
  const sign = text.charCodeAt(0) === 45 ? -1 : 1;
  const body = (text.charCodeAt(0) === 45 || text.charCodeAt(0) === 43 ? text.slice(1) : text).toLowerCase();
  return body === 'inf' || body === 'infinity' || body === '∞' ? sign * Infinity : undefined;
}

/**
 * Read one cell where a number is expected, leniently: surrounding whitespace,
 * a `+` sign, a Unicode or other dash-like minus (also in the exponent,
 * `1e−3`), exponents (`1e-3`, `1E+05`), and infinity in any case or as `∞`.
 * Returns the number (±Infinity included); NaN for a missing-value marker
 * (empty, `NaN`, `NA`, `N/A`, `None`, `null`, a lone dash…); undefined when
 * the cell is not a number. Thousands separators are a matter of the whole
 * column: see {@link groupedNumber}.
 */
export function readNumber(text: string): number | undefined {
  const fast = fastNumber(text);
  if (fast !== undefined) {
    return fast;
  }
  const t = numberText(text);
  if (isMissingNumberText(t)) {
    return NaN;
  }
  return parseNumber(t) ?? infinityOf(t);
}

/** Digits grouped by commas in threes, the first group 1–3 digits not starting with 0, then an optional decimal part. */
const GROUPED = /^([+-]?)([1-9]\d{0,2}(?:,\d{3})+)(\.\d+)?$/;

/** A number written with thousands separators, as read by {@link groupedNumber}. */
export interface IGroupedNumber {
  value: number;
  /**
   * True when the commas cannot be a decimal comma: two or more of them
   * (`1,234,567`), or a decimal point after them (`12,345.5`). A single group
   * (`1,003`) could also be 1.003 written with a decimal comma.
   */
  certain: boolean;
}

/**
 * A number written with commas between groups of three digits (`1,003`,
 * `-12,345.5`, `1,234,567`), given as {@link numberText} returns it; undefined
 * for anything else. Whether its column may be read that way is decided by the
 * column (a single group needs a decimal point elsewhere in the column, and no
 * cell of the column may use a decimal comma).
 */
export function groupedNumber(text: string): IGroupedNumber | undefined {
  if (text.length > 400 || text.indexOf(',') < 0) {
    return undefined;
  }
  const m = GROUPED.exec(text);
  if (!m) {
    return undefined;
  }
  const value = Number(`${m[1]}${m[2].replace(/,/g, '')}${m[3] ?? ''}`);
  return { value, certain: m[3] !== undefined || m[2].indexOf(',') !== m[2].lastIndexOf(',') };
}

/**
 * True for a number written with a decimal comma that cannot be a thousands
 * separator (`2,5`, `0,003`, `-12,75`, `,5`), given as {@link numberText}
 * returns it: its column writes decimals with commas, so none of its commas
 * are read as thousands separators.
 */
export function isDecimalComma(text: string): boolean {
  return text.length <= 400 && /^[+-]?\d*,\d+$/.test(text) && !GROUPED.test(text);
}

const POS_INF: ReadonlySet<string> = new Set(['inf', '+inf', 'Inf', '+Inf', 'Infinity', '+Infinity', 'INF', 'infinity']);
const NEG_INF: ReadonlySet<string> = new Set(['-inf', '-Inf', '-Infinity', '-INF', '-infinity']);

/**
 * Parse a decimal number as written by pandas, Python or a CSV writer.
 * Accepts `12`, `-1.5`, `.5`, `1e-7`, `1.000000e+10`, `inf`, `-inf`, `nan`.
 * Rejects hex, binary, thousands separators, underscores and empty text,
 * which `Number()` alone would accept or misread. Returns undefined for non-numbers.
 */
export function parseNumber(text: string): number | undefined {
  const n = text.length;
  if (n === 0 || n > 400) {
    return undefined;
  }
  let i = 0;
  let c = text.charCodeAt(0);
  if (c === 43 || c === 45) {
    i = 1;
  }
  let digits = 0;
  while (i < n && (c = text.charCodeAt(i)) >= 48 && c <= 57) {
    i++;
    digits++;
  }
  if (i < n && text.charCodeAt(i) === 46) {
    i++;
    while (i < n && (c = text.charCodeAt(i)) >= 48 && c <= 57) {
      i++;
      digits++;
    }
  }
  if (digits === 0) {
    return specialNumber(text);
  }
  if (i < n && ((c = text.charCodeAt(i)) === 101 || c === 69)) {
    i++;
    if (i < n && ((c = text.charCodeAt(i)) === 43 || c === 45)) {
      i++;
    }
    let expDigits = 0;
    while (i < n && (c = text.charCodeAt(i)) >= 48 && c <= 57) {
      i++;
      expDigits++;
    }
    if (expDigits === 0) {
      return undefined;
    }
  }
  return i === n ? Number(text) : undefined;
}

/**
 * Quick path for plain decimal numbers: `Number()` plus cheap checks of the first
 * and last characters, which rule out what `Number()` accepts but a table must not
 * (empty text, padding, hex/binary/octal prefixes). Returns undefined when unsure;
 * callers then fall back to {@link parseNumber}, which has the final word.
 */
export function fastNumber(text: string): number | undefined {
  const n = text.length;
  if (n === 0) {
    return undefined;
  }
  const first = text.charCodeAt(0);
  const last = text.charCodeAt(n - 1);
  if (!((first >= 48 && first <= 57) || first === 45 || first === 43 || first === 46) || !((last >= 48 && last <= 57) || last === 46)) {
    return undefined;
  }
  if (n > 1 && first === 48) {
    const second = text.charCodeAt(1) | 0x20;
    if (second === 120 || second === 98 || second === 111) {
      return undefined;
    }
  }
  const v = +text;
  return v === v ? v : undefined;
}

function specialNumber(text: string): number | undefined {
  if (POS_INF.has(text)) {
    return Infinity;
  }
  if (NEG_INF.has(text)) {
    return -Infinity;
  }
  if (text === 'NaN' || text === 'nan' || text === '-nan' || text === 'NAN') {
    return NaN;
  }
  return undefined;
}

/** Parse `True`/`False` (any case); undefined otherwise. */
export function parseBoolean(text: string): boolean | undefined {
  switch (text) {
    case 'True':
    case 'true':
    case 'TRUE':
      return true;
    case 'False':
    case 'false':
    case 'FALSE':
      return false;
    default:
      return undefined;
  }
}

const ISO_DATE =
  /^(\d{4}-\d{2}-\d{2})(?:[ T](\d{2}:\d{2}(?::\d{2}(?:\.\d{1,9})?)?))?\s*(Z|[+-]\d{2}:?\d{2})?$/;

/** Parts of an ISO date-time as displayed. */
export interface IDateParts {
  date: string;
  time: string | null;
  zone: string | null;
}

/** Split an ISO 8601 / pandas date-time text into parts; undefined when it is not one. */
export function parseDateParts(text: string): IDateParts | undefined {
  const m = ISO_DATE.exec(text);
  if (!m) {
    return undefined;
  }
  const [y, mo, d] = m[1].split('-').map(Number);
  if (mo < 1 || mo > 12 || d < 1 || d > 31 || y < 1) {
    return undefined;
  }
  return { date: m[1], time: m[2] ?? null, zone: m[3] ?? null };
}

/**
 * Canonical ISO strings for a datetime column, the way pandas writes CSV:
 * date only (`2024-01-05`) when every value is at midnight without zone, else
 * `YYYY-MM-DDTHH:MM:SS[.fff]` (trailing fractional zeros dropped) plus the zone
 * (`+00:00` written as `Z`).
 */
export function canonicalDates(parts: (IDateParts | null)[]): (string | null)[] {
  const dateOnly = parts.every(p => p === null || (p.zone === null && (p.time === null || /^00:00(?::00(?:\.0+)?)?$/.test(p.time))));
  return parts.map(p => {
    if (p === null) {
      return null;
    }
    if (dateOnly) {
      return p.date;
    }
    let time = p.time ?? '00:00:00';
    if (time.length === 5) {
      time += ':00';
    }
    time = time.replace(/(\.\d*?)0+$/, '$1').replace(/\.$/, '');
    let zone = p.zone ?? '';
    if (zone === '+00:00' || zone === '+0000' || zone === '-00:00') {
      zone = 'Z';
    } else if (/^[+-]\d{4}$/.test(zone)) {
      zone = `${zone.slice(0, 3)}:${zone.slice(3)}`;
    }
    return `${p.date}T${time}${zone}`;
  });
}

/**
 * Significant digits shown in a displayed number (`0.000120` → 3, `1.234560e+05` → 7,
 * `120` → 3, `1.50` → 3). Trailing zeros after a decimal point count; those of an
 * integer without a point do not. Returns 0 for non-finite or zero values.
 */
export function significantDigits(text: string): number {
  let mantissa = text;
  const e = mantissa.search(/[eE]/);
  if (e >= 0) {
    mantissa = mantissa.slice(0, e);
  }
  mantissa = mantissa.replace(/^[+-]/, '');
  const hasPoint = mantissa.includes('.');
  let digits = mantissa.replace('.', '').replace(/^0+/, '');
  if (!hasPoint) {
    digits = digits.replace(/0+$/, '');
  }
  return /^\d*$/.test(digits) ? digits.length : 0;
}

/** Digits after the decimal point of a displayed number's mantissa (`1.250` → 3, `2e5` → 0). */
export function decimalsShown(text: string): number {
  const e = text.search(/[eE]/);
  const mantissa = e >= 0 ? text.slice(0, e) : text;
  const point = mantissa.indexOf('.');
  return point < 0 ? 0 : mantissa.length - point - 1;
}

/** Decimal places of a number written in fixed or scientific notation (`1.23e-8` → 10, `2.5` → 1, `3e2` → 0). */
export function fixedDecimals(text: string): number {
  const e = text.search(/[eE]/);
  const exponent = e >= 0 ? Number(text.slice(e + 1)) : 0;
  return Math.max(0, decimalsShown(text) - (Number.isFinite(exponent) ? exponent : 0));
}
