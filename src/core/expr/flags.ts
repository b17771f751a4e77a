/**
 * Notes about names in an expression that are valid but probably not what
 * was meant: a parameter named like a table column or like the x variable
 * in another letter case (it would be fitted as a free parameter, not read
 * from the data), a function name written without its parenthesis or
 * misspelt before an implicit product (`sqr x`), two parameters that differ
 * by one character (`Tc`, `TC`), `E` taken as Euler's number, and a
 * number followed by a one-letter unit name (`300 K`), read as a product
 * with a parameter.
 */
import { isOperatorNode, isSymbolNode } from 'mathjs';
import type { MathNode } from 'mathjs';
import { msg } from '../messages';
import type { ICoreMessage } from '../messages';
import type { IAnalysedExpression } from './analyse';
import { isUnitName, numberLike, suggestFunction, unitSymbol } from './check';
import { SUPPORTED_FUNCTIONS, valueChildren } from './compile';
import { columnKey, looksLikeTypo } from './names';
import { FUNCTION_ALIASES, quote } from './normalize';

/** Names that tell how a parameter could be mistaken. */
export interface INameContext {
  /** Names of the x variable (the fitted x column). */
  readonly xNames: readonly string[];
  /** Headers of the table's columns. */
  readonly columnNames: readonly string[];
}

/** Names directly followed by an implicit product (`sqr x`), where a misspelt function would stand. */
function implicitHeads(node: MathNode, out = new Set<string>()): Set<string> {
  const stack: MathNode[] = [node];
  while (stack.length > 0) {
    const n = stack.pop()!;
    if (isOperatorNode(n) && n.fn === 'multiply' && n.implicit === true && isSymbolNode(n.args[0])) {
      out.add(n.args[0].name);
    }
    stack.push(...valueChildren(n));
  }
  return out;
}

/** One-letter unit names written right after a number (`300 K`), where a unit may have been meant. */
function letterUnits(node: MathNode, xNames: readonly string[]): string[] {
  const out: string[] = [];
  const stack: MathNode[] = [node];
  while (stack.length > 0) {
    const n = stack.pop()!;
    if (isOperatorNode(n) && n.fn === 'multiply' && n.implicit === true && numberLike(n.args[0])) {
      const u = unitSymbol(n.args[1]);
      if (u !== null && Array.from(u).length === 1 && !xNames.includes(u) && isUnitName(u) && !out.includes(u)) {
        out.push(u);
      }
    }
    stack.push(...valueChildren(n));
  }
  return out;
}

/** At most this many notes about pairs of similar parameters. */
const MAX_PAIR_FLAGS = 5;

/**
 * Notes about `parameters` (the free parameters found) and `symbols` (all
 * names of the right-hand side) of an analysed expression.
 */
export function nameFlags(
  parameters: readonly string[],
  symbols: readonly string[],
  analysed: IAnalysedExpression,
  context: INameContext
): ICoreMessage[] {
  const flags: ICoreMessage[] = [];
  const xKeys = new Set(context.xNames.map(columnKey));
  const functions = new Set([...SUPPORTED_FUNCTIONS, ...Object.keys(FUNCTION_ALIASES)].map((f) => f.toLowerCase()));
  const heads = implicitHeads(analysed.rhsNode);
  for (const p of parameters) {
    const key = columnKey(p);
    const shown = quote(p, 24);
    const xMatch = context.xNames.find((x) => columnKey(x) === key);
    if (xMatch !== undefined) {
      flags.push(
        msg(
          'expression.flag.x-case',
          '%1 is not the x variable %2 (names are case-sensitive), so %1 is fitted as a free parameter. Write %2 to use the x column.',
          shown,
          quote(xMatch, 24)
        )
      );
      continue;
    }
    const column = context.columnNames.find((c) => columnKey(c) === key && !xKeys.has(columnKey(c)));
    if (column !== undefined) {
      flags.push(
        msg(
          'expression.flag.column',
          '%1 has the name of the column “%2”, but only the x column enters the model: %1 is fitted as a free parameter, not read from that column.',
          shown,
          quote(column, 32)
        )
      );
      continue;
    }
    if (functions.has(p.toLowerCase())) {
      flags.push(
        msg('expression.flag.function-name', '%1 is a function name written without parentheses, so it is fitted as a parameter; to call the function write %1(…).', shown)
      );
      continue;
    }
    if (heads.has(p)) {
      const suggestion = suggestFunction(p);
      if (suggestion !== null) {
        flags.push(
          msg('expression.flag.function-typo', '%1 looks like the function %2 misspelt; as written it is a parameter multiplied by what follows.', shown, suggestion)
        );
      }
    }
  }
  let pairs = 0;
  for (let i = 0; i < parameters.length && pairs < MAX_PAIR_FLAGS; i++) {
    for (let j = i + 1; j < parameters.length && pairs < MAX_PAIR_FLAGS; j++) {
      if (looksLikeTypo(parameters[i], parameters[j])) {
        flags.push(
          msg('expression.flag.parameter-typo', '%1 and %2 are two separate parameters; if they are meant to be one, write it the same way both times.', quote(parameters[i], 24), quote(parameters[j], 24))
        );
        pairs++;
      }
    }
  }
  for (const u of letterUnits(analysed.rhsNode, context.xNames)) {
    if (parameters.includes(u)) {
      flags.push(
        msg(
          'expression.flag.unit-letter',
          'A number followed by %1 is read as that number times the parameter %1; if %1 is meant as a unit, write plain numbers in the units of your columns instead.',
          u
        )
      );
    }
  }
  if (symbols.includes('E') && !parameters.includes('E')) {
    flags.push(msg('expression.flag.euler', 'E is Euler’s number 2.718… here, not a parameter; name a parameter differently (e.g. E0) to fit it.'));
  }
  return flags;
}
