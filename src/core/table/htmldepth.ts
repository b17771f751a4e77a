/**
 * A cheap scan of HTML text that estimates element nesting depth before the
 * text reaches the HTML parser. Tree construction checks the stack of open
 * elements on many steps, so thousands of nested elements cost time that grows
 * with the square of the depth; markup nested deeper than the limit is refused
 * up front, with the table row and cell where it happens.
 */
import { TABLE_LIMITS, TableParseError } from './types';

/** Elements that never hold children. */
const VOID = new Set(['area', 'base', 'br', 'col', 'embed', 'hr', 'img', 'input', 'link', 'meta', 'param', 'source', 'track', 'wbr', 'keygen']);
/** Elements whose end tag may be omitted: a following sibling closes them, so they do not stack up. */
const SELF_CLOSING_SIBLINGS = new Set([
  'td', 'th', 'tr', 'li', 'p', 'option', 'optgroup', 'dt', 'dd', 'thead', 'tbody', 'tfoot', 'colgroup', 'caption', 'rt', 'rp', 'rb', 'rtc'
]);
/** Elements whose content is raw text, not markup. */
const RAW_TEXT = new Set(['script', 'style', 'textarea', 'title', 'xmp', 'iframe', 'noembed', 'noframes', 'plaintext']);

const TAG = /<!--[\s\S]*?(?:-->|$)|<(\/?)([a-zA-Z][^\s/>]*)[^>]*?(\/?)>/g;
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

/** Refuse HTML whose estimated nesting depth exceeds `limit`, naming the table row and cell where it does. */
export function checkHtmlDepth(html: string, limit: number = TABLE_LIMITS.maxDepth): void {
  const open: string[] = [];
  let rows = 0;
  let cells = 0;
  TAG.lastIndex = 0;
  let m: RegExpExecArray | null;
  while ((m = TAG.exec(html)) !== null) {
    if (m[2] === undefined) {
      continue;
    }
    const name = m[2].toLowerCase();
    const closing = m[1] === '/';
    if (!closing && name === 'tr') {
      rows++;
      cells = 0;
    } else if (!closing && (name === 'td' || name === 'th')) {
      cells++;
    }
    // In HTML `<div/>` still opens a div; only SVG and MathML content has self-closing tags.
    const selfClosing = m[3] === '/' && (open.includes('svg') || open.includes('math') || name === 'svg' || name === 'math');
    if (VOID.has(name) || SELF_CLOSING_SIBLINGS.has(name) || selfClosing) {
      continue;
    }
    if (closing) {
      const at = open.lastIndexOf(name);
      if (at >= 0) {
        open.length = at;
      }
      continue;
    }
    if (RAW_TEXT.has(name)) {
      TAG.lastIndex = skipRawText(html, name, TAG.lastIndex);
      continue;
    }
    open.push(name);
    if (open.length > limit) {
      const where = rows === 0 ? 'before the first table row' : `in table row ${rows}, column ${Math.max(cells, 1)}`;
      throw new TableParseError(
        `The HTML is nested more than ${limit} elements deep (at character ${m.index}, ${where}); a table needs far fewer.`
      );
    }
  }
}
