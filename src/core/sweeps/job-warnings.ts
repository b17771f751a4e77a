/**
 * Warnings of the isotherm analysis, one per problem: the analyses each say
 * what limits them, often isotherm by isotherm; here every message with the
 * same code is said once, and the per-isotherm ones become one message that
 * names all the isotherms.
 */
import { formatNumberArg, msg } from '../messages';
import type { ICoreMessage, MessageArg } from '../messages';
import { uniqueMessages } from './types';

function temperatureOf(a: MessageArg | undefined): number {
  return typeof a === 'number' ? a : typeof a === 'object' && a !== null ? a.value : NaN;
}

/** Per-isotherm codes, with the one message naming every isotherm (first argument: the temperature). */
const PER_ISOTHERM: Record<string, (temperatures: string) => ICoreMessage> = {
  'sweeps.isotherm-spread': t =>
    msg('sweeps.job.isotherm-spread', 'The isotherms near %1 K each span more than twice the grouping tolerance: their temperatures may not be on one setpoint.', t),
  'sweeps.arrott.line-few-points': t =>
    msg('sweeps.job.line-few-points', 'The isotherms at %1 K have too few points in the high-field region for an uncertainty of their Arrott lines.', t)
};

/** Each problem once, in the order first met. */
export function mergeWarnings(warnings: readonly ICoreMessage[]): ICoreMessage[] {
  const temps = new Map<string, number[]>();
  const out: ICoreMessage[] = [];
  const seenCodes = new Set<string>();
  for (const w of uniqueMessages(warnings)) {
    if (w.code in PER_ISOTHERM) {
      const list = temps.get(w.code);
      if (list === undefined) {
        temps.set(w.code, [temperatureOf(w.args[0])]);
        out.push(w);
      } else {
        list.push(temperatureOf(w.args[0]));
      }
      continue;
    }
    if (!seenCodes.has(w.code)) {
      seenCodes.add(w.code);
      out.push(w);
    }
  }
  return out.map(w => {
    const list = temps.get(w.code);
    if (list === undefined || !(w.code in PER_ISOTHERM)) {
      return w;
    }
    const sorted = [...new Set(list.filter(Number.isFinite))].sort((a, b) => a - b);
    return PER_ISOTHERM[w.code](sorted.map(t => formatNumberArg(t, 5)).join(', '));
  });
}
