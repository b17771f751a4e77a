/**
 * The task request of the analysis worker protocol (model comparison, window
 * scan, bootstrap): the result is the task's own, progress is throttled, a
 * raised cancel flag answers as cancelled, and a request it cannot read
 * answers as failed. Data: spin-½ Weiss mean field M = Ms·m(T/Tc),
 * m = tanh(m/τ) (REFERENCE.md B1), invented Tc = 250 K, Ms = 90, 0.3 % noise.
 */
import { describe, expect, it } from 'vitest';
import { handleAnalysisMessage } from '../../../src/core/analysis/protocol';
import type { AnalysisResponse, ITaskRequest } from '../../../src/core/analysis/protocol';
import { weissMagnetisation } from '../../../src/core/physics/weiss';
import { mulberry32 } from '../../../src/core/numeric/random';

function weissJob() {
  const uniform = mulberry32(7);
  // Box–Muller normal deviates from the seeded uniform generator.
  const rand = (): number => Math.sqrt(-2 * Math.log(1 - uniform())) * Math.cos(2 * Math.PI * uniform());
  const x = Array.from({ length: 40 }, (_, i) => 20 + 6 * i);
  const y = x.map(T => {
    const m = T < 250 ? weissMagnetisation(0.5, [T / 250])[0] : 0;
    return 90 * m * (1 + 0.003 * rand()) + 0.05 * rand();
  });
  return { kind: 'weiss', x, y, window: { min: -Infinity, max: Infinity }, options: {} };
}

function replies(request: unknown): AnalysisResponse[] {
  const out: AnalysisResponse[] = [];
  let clock = 0;
  handleAnalysisMessage(request, r => out.push(r), () => (clock += 40));
  return out;
}

describe('task requests', () => {
  it('compare: throttled progress, then the comparison', () => {
    const out = replies({ id: 4, kind: 'task', task: { type: 'compare', job: weissJob() } } satisfies ITaskRequest);
    const last = out.at(-1)!;
    expect(last.kind).toBe('task-done');
    const result = last.kind === 'task-done' ? last.result : null;
    expect(result?.type).toBe('compare');
    expect(result?.type === 'compare' && result.result.models.length).toBeGreaterThanOrEqual(4);
    const progress = out.filter(r => r.kind === 'task-progress');
    expect(progress.length).toBeGreaterThan(0);
    // 40 ms a tick against a 100 ms throttle: at most every third report gets through.
    expect(progress.length).toBeLessThan(out.length);
  });

  it('bootstrap: a raised cancel flag answers as cancelled', () => {
    const flag = new Int32Array(new SharedArrayBuffer(4));
    Atomics.store(flag, 0, 1);
    const out = replies({ id: 5, kind: 'task', task: { type: 'bootstrap', job: weissJob(), samples: 50, seed: 1 }, cancelFlag: flag });
    expect(out.at(-1)).toEqual({ id: 5, kind: 'cancelled', best: null });
  });

  it('refuses a task it does not know, and a bad job, in words', () => {
    const unknown = replies({ id: 6, kind: 'task', task: { type: 'dance', job: weissJob() } });
    expect(unknown.at(-1)?.kind).toBe('failed');
    const bad = replies({ id: 7, kind: 'task', task: { type: 'bootstrap', job: { ...weissJob(), kind: 'no-such-kind' }, samples: 20, seed: 1 } });
    expect(bad.at(-1)?.kind).toBe('failed');
    expect(bad.at(-1)?.kind === 'failed' && bad.at(-1)).toMatchObject({ message: { code: expect.any(String) } });
  });
});
