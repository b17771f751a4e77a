/**
 * Runs an analysis task — several fits of one x–y job — by its type: the
 * model comparison (compare.ts), the exponent-against-window scan
 * (window-scan.ts) or the bootstrap (bootstrap.ts). The worker protocol calls
 * it for 'task' requests; tests call it directly.
 */
import { bootstrapJob } from './bootstrap';
import { compareModels } from './compare';
import type { AnalysisTask, AnalysisTaskResult, ITaskHooks } from './tasks-types';
import { windowScan } from './window-scan';

/** Run one task; a cancelled one answers `{ type: 'cancelled' }`. Bad input throws a core message error. */
export function runAnalysisTask(task: AnalysisTask, hooks: ITaskHooks = {}): AnalysisTaskResult {
  switch (task.type) {
    case 'compare': {
      const result = compareModels(task.job, hooks);
      return result ? { type: 'compare', result } : { type: 'cancelled' };
    }
    case 'window-scan': {
      const result = windowScan(task.job, { tMaxs: task.tMaxs }, hooks);
      return result ? { type: 'window-scan', result } : { type: 'cancelled' };
    }
    case 'bootstrap': {
      const result = bootstrapJob(task.job, { samples: task.samples, seed: task.seed }, hooks);
      return result ? { type: 'bootstrap', result } : { type: 'cancelled' };
    }
  }
}
