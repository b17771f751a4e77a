/** FrameThrottle: requests before a frame share one run; cancel and failures settle the promise. */
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
});
