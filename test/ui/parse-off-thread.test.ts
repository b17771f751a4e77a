/**
 * Large table outputs are parsed in the analysis worker, small ones at once:
 * the routing by size, the worker's parse reply, and the buffers it transfers.
 */
import { describe, expect, it, vi } from 'vitest';
import { handleAnalysisMessage, parseTransfer } from '../../src/core/analysis/protocol';
import type { AnalysisResponse } from '../../src/core/analysis/protocol';
import { AnalysisWorkerHost } from '../../src/ui/analysis-runner';
import { MAIN_THREAD_PARSE_CHARS, parseOffThread, sourceSize } from '../../src/ui/parse-off-thread';

function csv(rows: number): string {
  const lines = ['T (K),M (emu/g)'];
  for (let i = 0; i < rows; i++) {
    lines.push(`${(10 + i * 0.01).toFixed(2)},${(100 - i * 0.001).toFixed(4)}`);
  }
  return lines.join('\n');
}

describe('parseOffThread', () => {
  it('should parse a small output at once, without the worker', async () => {
    const host = new AnalysisWorkerHost({ workerFactory: () => null });
    const spy = vi.spyOn(host, 'parse');
    const result = await parseOffThread({ bundle: { 'text/csv': csv(10) } }, host);
    expect(spy).not.toHaveBeenCalled();
    expect(result.ok && result.table.rowCount).toBe(10);
  });

  it('should send a large output to the worker and get the same table back', async () => {
    const text = csv(20000);
    expect(sourceSize({ mime: 'text/csv', text })).toBeGreaterThan(MAIN_THREAD_PARSE_CHARS);
    const host = new AnalysisWorkerHost({ workerFactory: () => null });
    const spy = vi.spyOn(host, 'parse');
    const result = await parseOffThread({ mime: 'text/csv', text }, host);
    expect(spy).toHaveBeenCalledTimes(1);
    expect(result.ok).toBe(true);
    if (result.ok) {
      expect(result.table.rowCount).toBe(20000);
      expect(result.table.columns[1].values).toBeInstanceOf(Float64Array);
      expect((result.table.columns[1].values as Float64Array)[19999]).toBeCloseTo(80.001, 10);
    }
  });

  it('should answer a parse request in the worker protocol, and list each number column’s buffer once', () => {
    const replies: AnalysisResponse[] = [];
    handleAnalysisMessage({ id: 5, kind: 'parse', source: { bundle: { 'text/csv': csv(50) } } }, r => replies.push(r));
    expect(replies).toHaveLength(1);
    const reply = replies[0];
    expect(reply.kind).toBe('parsed');
    if (reply.kind === 'parsed') {
      expect(reply.id).toBe(5);
      const buffers = parseTransfer(reply.result);
      expect(buffers.length).toBe(new Set(buffers).size);
      expect(buffers.length).toBeGreaterThanOrEqual(1);
    }
  });

  it('should turn an output without a table into a parse result with a message, not an exception', async () => {
    const host = new AnalysisWorkerHost({ workerFactory: () => null });
    const result = await host.parse({ bundle: { 'image/png': 'iVBOR' } });
    expect(result.ok).toBe(false);
    if (!result.ok) {
      expect(result.message.code).toMatch(/^table\./);
    }
  });
});
