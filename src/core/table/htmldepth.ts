/**
 * A linear scan of HTML text, run before the text reaches the HTML parser, that
 * refuses markup whose shape would make tree building slow: nesting deeper than
 * the limit (tree construction checks the stack of open elements on many steps,
 * so cost grows with depth × elements) and tags with a huge number of attributes
 * (duplicate-attribute checks grow with their square). The scan follows the HTML
 * tokenizer closely enough for this (tag names run to whitespace, '/' or '>';
 * quoted attribute values may hold '>'), visits every character a bounded number
 * of times, and names the table row and cell where a limit is hit.
 */
import { msg } from '../messages';
import type { ICoreMessage } from '../messages';
import { wholeNumber } from '../numeric/messageArgs';
import { TABLE_LIMITS, TableParseError } from './types';

/** Elements that never hold children. */
const VOID = new Set(['area', 'base', 'br', 'col', 'embed', 'hr', 'img', 'input', 'link', 'meta', 'param', 'source', 'track', 'wbr', 'keygen']);
/** Elements whose end tag may be omitted: a following sibling closes them, so they do not stack up. */
const SELF_CLOSING_SIBLINGS = new Set([
  'td', 'th', 'tr', 'li', 'p', 'option', 'optgroup', 'dt', 'dd', 'thead', 'tbody', 'tfoot', 'colgroup', 'caption', 'rt', 'rp', 'rb', 'rtc'
]);
/** Elements whose content is raw text, not markup. */
const RAW_TEXT = new Set(['script', 'style', 'textarea', 'title', 'xmp', 'iframe', 'noembed', 'noframes', 'plaintext']);

/** Most attributes one tag may carry. */
export const MAX_ATTRIBUTES = 256;

/**
 * Most tables (not nested in another table) of one output that are examined.
 * Parsing costs tens of microseconds per table, so 100 000 small tables took
 * seconds; a table output rarely holds more than a few.
 */
export const MAX_HTML_TABLES = 1000;

/** What the scan found besides refusals. */
export interface IHtmlScan {
  /**
   * Where the first table past {@link MAX_HTML_TABLES} starts (the `<` of its
   * tag); null when there are no more tables than that. The text before it
   * holds the tables that are examined.
   */
  tablesEndAt: number | null;
}

const rawEnd = new Map<string, RegExp>();

/** Position of the end tag closing a raw-text element, or the end of the text. */
function skipRawText(html: string, name: string, from: number): number {
  let re = rawEnd.get(name);
  if (re === undefined) {
    re = new RegExp(`</${name}`, 'ig');
    rawEnd.set(name, re);
  }
  re.lastIndex = from;
  const m = re.exec(html);
  return m === null ? html.length : m.index;
}

function isSpace(c: number): boolean {
  return c === 32 || c === 9 || c === 10 || c === 12 || c === 13;
}

function isLetter(c: number): boolean {
  return (c >= 65 && c <= 90) || (c >= 97 && c <= 122);
}

interface ITag {
  name: string;
  closing: boolean;
  selfClosing: boolean;
  attributes: number;
  /** Index just after the tag's '>'; -1 when the text ends inside the tag. */
  end: number;
}

/** Read the tag starting at `i` (html[i] === '<', followed by a letter or '/' + letter). */
function readTag(html: string, i: number): ITag {
  const n = html.length;
  const closing = html.charCodeAt(i + 1) === 47;
  let j = i + (closing ? 2 : 1);
  const nameStart = j;
  while (j < n && !isSpace(html.charCodeAt(j)) && html.charCodeAt(j) !== 47 && html.charCodeAt(j) !== 62) {
    j++;
  }
  const name = html.slice(nameStart, j).toLowerCase();
  let attributes = 0;
  let selfClosing = false;
  while (j < n) {
    const c = html.charCodeAt(j);
    if (c === 62) {
      return { name, closing, selfClosing, attributes, end: j + 1 };
    }
    if (isSpace(c)) {
      j++;
      continue;
    }
    if (c === 47) {
      selfClosing = html.charCodeAt(j + 1) === 62;
      j++;
      continue;
    }
    attributes++;
    // The first character always belongs to the name (even '='), so the scan always advances.
    j++;
    while (j < n && !isSpace(html.charCodeAt(j)) && html.charCodeAt(j) !== 47 && html.charCodeAt(j) !== 62 && html.charCodeAt(j) !== 61) {
      j++;
    }
    while (j < n && isSpace(html.charCodeAt(j))) {
      j++;
    }
    if (html.charCodeAt(j) !== 61) {
      continue;
    }
    j++;
    while (j < n && isSpace(html.charCodeAt(j))) {
      j++;
    }
    const q = html.charCodeAt(j);
    if (q === 34 || q === 39) {
      const close = html.indexOf(q === 34 ? '"' : "'", j + 1);
      if (close < 0) {
        return { name, closing, selfClosing, attributes, end: -1 };
      }
      j = close + 1;
    } else {
      while (j < n && !isSpace(html.charCodeAt(j)) && html.charCodeAt(j) !== 62) {
        j++;
      }
    }
  }
  return { name, closing, selfClosing, attributes, end: -1 };
}

/**
 * Refuse HTML nested deeper than `limit` or with an over-long attribute list,
 * naming the table row and cell; find where the first table past `maxTables`
 * starts. The scan stops there: only the text before it is parsed.
 */
export function checkHtmlDepth(html: string, limit: number = TABLE_LIMITS.maxDepth, maxTables: number = MAX_HTML_TABLES): IHtmlScan {
  const open: string[] = [];
  let rows = 0;
  let cells = 0;
  let tables = 0;
  let tableDepth = 0;
  const tooManyAttributes = (name: string, attributes: number): ICoreMessage =>
    rows === 0
      ? msg('table.html.attributes-before-rows', 'A <%1> tag before the first table row has %2 attributes; at most %3 can be read.', name, wholeNumber(attributes), MAX_ATTRIBUTES)
      : msg(
          'table.html.attributes',
          'A <%1> tag in table row %2, column %3 has %4 attributes; at most %5 can be read.',
          name,
          wholeNumber(rows),
          wholeNumber(Math.max(cells, 1)),
          wholeNumber(attributes),
          MAX_ATTRIBUTES
        );
  const tooDeep = (at: number): ICoreMessage =>
    rows === 0
      ? msg('table.html.too-deep-before-rows', 'The HTML is nested more than %1 elements deep (at character %2, before the first table row); a table needs far fewer.', limit, wholeNumber(at))
      : msg(
          'table.html.too-deep',
          'The HTML is nested more than %1 elements deep (at character %2, in table row %3, column %4); a table needs far fewer.',
          limit,
          wholeNumber(at),
          wholeNumber(rows),
          wholeNumber(Math.max(cells, 1))
        );
  let i = html.indexOf('<');
  while (i >= 0 && i < html.length - 1) {
    const next = html.charCodeAt(i + 1);
    let resume: number;
    if (next === 33 || next === 63) {
      // Comment (<!-- ... -->), doctype or bogus comment (<!x ...>, <?x ...>).
      const isComment = html.startsWith('<!--', i);
      const close = isComment ? html.indexOf('-->', i + 4) : html.indexOf('>', i + 2);
      resume = close < 0 ? html.length : close + (isComment ? 3 : 1);
    } else if (isLetter(next) || (next === 47 && isLetter(html.charCodeAt(i + 2)))) {
      const tag = readTag(html, i);
      if (tag.attributes > MAX_ATTRIBUTES) {
        throw new TableParseError(tooManyAttributes(tag.name.slice(0, 20), tag.attributes));
      }
      if (tag.name === 'table') {
        if (tag.closing) {
          tableDepth = Math.max(0, tableDepth - 1);
        } else if (tableDepth++ === 0 && ++tables > maxTables) {
          return { tablesEndAt: i };
        }
      }
      if (tag.end < 0) {
        return { tablesEndAt: null };
      }
      resume = tag.end;
      if (!tag.closing && tag.name === 'tr') {
        rows++;
        cells = 0;
      } else if (!tag.closing && (tag.name === 'td' || tag.name === 'th')) {
        cells++;
      }
      // In HTML `<div/>` still opens a div; only SVG and MathML content has self-closing tags.
      const foreign = tag.selfClosing && (open.includes('svg') || open.includes('math') || tag.name === 'svg' || tag.name === 'math');
      if (tag.closing) {
        const at = open.lastIndexOf(tag.name);
        if (at >= 0) {
          open.length = at;
        }
      } else if (RAW_TEXT.has(tag.name)) {
        resume = skipRawText(html, tag.name, resume);
      } else if (!VOID.has(tag.name) && !SELF_CLOSING_SIBLINGS.has(tag.name) && !foreign) {
        open.push(tag.name);
        if (open.length > limit) {
          throw new TableParseError(tooDeep(i));
        }
      }
    } else {
      resume = i + 1;
    }
    i = html.indexOf('<', resume);
  }
  return { tablesEndAt: null };
}
