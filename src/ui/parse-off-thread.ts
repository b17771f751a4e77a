/**
 * Parsing tables without holding the page: small outputs are parsed at once
 * on the page's thread (no wait for the worker), large ones in the analysis
 * worker, whose number columns come back as transferred Float64Arrays.
 */
import type { ParseSource } from '../core/analysis/protocol';
import { parseSource } from '../core/analysis/protocol';
import type { ParseResult } from '../core/table';
import { AnalysisWorkerHost } from './analysis-runner';

/** Outputs up to this many characters (about 2 000 rows of a few columns) are parsed on the page's thread. */
export const MAIN_THREAD_PARSE_CHARS = 100_000;

/** Rough size of a source in characters, without serialising it. */
export function sourceSize(source: ParseSource): number {
  if ('text' in source) {
    return source.text.length;
  }
  let size = 0;
  for (const value of Object.values(source.bundle)) {
    if (typeof value === 'string') {
      size += value.length;
    } else if (value && typeof value === 'object') {
      const data = (value as { data?: unknown }).data;
      // dataresource: a list of row objects; a few dozen characters a row is typical.
      size += Array.isArray(data) ? data.length * 40 : 1000;
    }
  }
  return size;
}

/** Parse `source`, in the shared analysis worker when it is large. */
export function parseOffThread(source: ParseSource, host: AnalysisWorkerHost = AnalysisWorkerHost.shared()): Promise<ParseResult> {
  return sourceSize(source) <= MAIN_THREAD_PARSE_CHARS ? Promise.resolve(parseSource(source)) : host.parse(source);
}
