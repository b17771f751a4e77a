/** A small fitted analysis and its saved form, for the notebook-output tests. */
import { AnalysisSession } from '../../src/core/analysis/session';
import { runAnalysisJob } from '../../src/core/analysis';
import type { IAnalysisOutcome } from '../../src/core/analysis';
import type { ISavedAnalysis } from '../../src/core/saved';
import { parseMime } from '../../src/core/table';
import { weissMagnetisation } from '../../src/core/physics/weiss';

export { buildReport, notebookOutputs } from '../../src/core/analysis/report';

/** Spin-½ Weiss data (REFERENCE.md B1) with a deterministic wiggle, fitted; the y header as given. */
export function runAnalysisJobForTest(yHeader: string): { outcome: IAnalysisOutcome; saved: ISavedAnalysis } {
  const T = Array.from({ length: 40 }, (_, i) => 20 + 7 * i);
  const m = weissMagnetisation(0.5, T.map(t => t / 250));
  const M = T.map((_, i) => 80 * m[i] + 0.3 * Math.sin(7 * i));
  const csv = [`T (K),"${yHeader.replace(/"/g, '""')}"`, ...T.map((t, i) => `${t},${M[i].toFixed(5)}`)].join('\n');
  const session = new AnalysisSession({ id: 'inline-1', source: { notebookPath: 'n.ipynb', cellId: 'c1', outputIndex: 0, contentHash: '0000000000000000' } });
  session.setParse(parseMime('text/csv', csv));
  session.setKind('weiss');
  const outcome = runAnalysisJob({ kind: 'weiss', x: T, y: M, window: { min: 0, max: 1000 }, options: { J: 0.5 } });
  const saved = session.toSaved()!;
  return { outcome, saved: { ...saved, settings: { kind: 'weiss', options: { J: 0.5 }, window: { min: 0, max: 1000 } } } };
}
