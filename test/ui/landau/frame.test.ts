/**
 * FrameThrottle: the first request runs at once (a microtask later), later
 * ones of the same frame or made during a run share one run at the next
 * frame; cancel and failures settle the promise.
 */
import { describe, expect, it, vi } from 'vitest';
import { FrameThrottle } from '../../../src/ui/landau/frame';

describe('FrameThrottle', () => {
  it('should run once for all requests made before the frame', async () => {
    const run = vi.fn(() => Promise.resolve());
    const t = new FrameThrottle(run, () => undefined);
    const a = t.request();
    const b = t.request();
    expect(a).toBe(b);
    expect(run).not.toHaveBeenCalled();
    await t.settled;
    expect(run).toHaveBeenCalledTimes(1);
    expect(t.runs).toBe(1);
    await t.request();
    expect(run).toHaveBeenCalledTimes(2);
  });

  it('should drop a pending run on cancel and still settle', async () => {
    const run = vi.fn(() => Promise.resolve());
    const t = new FrameThrottle(run, () => undefined);
    const p = t.request();
    t.cancel();
    await p;
    await new Promise(r => requestAnimationFrame(() => r(undefined)));
    expect(run).not.toHaveBeenCalled();
  });

  it('should report a failed run and settle', async () => {
    const onError = vi.fn();
    const t = new FrameThrottle(() => Promise.reject(new Error('boom')), onError);
    await t.request();
    expect(onError).toHaveBeenCalledTimes(1);
    expect((onError.mock.calls[0][0] as Error).message).toBe('boom');
  });

  it('should run the first request of a quiet spell before the next frame', async () => {
    const run = vi.fn(() => Promise.resolve());
    const t = new FrameThrottle(run, () => undefined);
    let framed = false;
    requestAnimationFrame(() => (framed = true));
    await t.request();
    expect(run).toHaveBeenCalledTimes(1);
    expect(framed).toBe(false);
  });

  it('should give requests made during a run one more run, after that run', async () => {
    let release!: () => void;
    const order: string[] = [];
    let calls = 0;
    const run = vi.fn(() => {
      calls++;
      order.push(`start ${calls}`);
      if (calls === 1) {
        return new Promise<void>(r => (release = () => {
          order.push('end 1');
          r();
        }));
      }
      return Promise.resolve();
    });
    const t = new FrameThrottle(run, () => undefined);
    const first = t.request();
    await Promise.resolve();
    expect(run).toHaveBeenCalledTimes(1);
    const second = t.request();
    const third = t.request();
    expect(second).toBe(third);
    expect(second).not.toBe(first);
    await new Promise(r => requestAnimationFrame(() => r(undefined)));
    expect(run).toHaveBeenCalledTimes(1);
    release();
    await second;
    expect(order).toEqual(['start 1', 'end 1', 'start 2']);
    expect(t.runs).toBe(2);
  });
});
