/**
 * Benchmark: parse a 1e6-row, 4-column CSV (pandas to_csv style: unnamed
 * index + 3 float columns) with the table parser. Target: ≤ 1 s and ≤ 300 MB.
 *
 * Run alone: npx tsx bench/table.bench.ts   (or import and call runTableBench()).
 * Prints wall time, RSS and heap before/after, and the process's peak RSS (getrusage maxrss)
 * reached during the parse, relative to the RSS just before it.
 */
import { writeFileSync } from 'node:fs';
import { availableParallelism, loadavg } from 'node:os';
import { setFlagsFromString } from 'node:v8';
import { runInNewContext } from 'node:vm';
import { messageText } from '../src/core/messages';
import { parseMime } from '../src/core/table/index';
import { mulberry32 } from '../src/core/numeric/random';

const ROWS = 1_000_000;
const TIME_TARGET_MS = 1000;
const MEMORY_TARGET_MB = 300;


/** pandas to_csv() style text: unnamed index, temperature grid, 17-digit floats, integers. Built in blocks to keep its own peak low. */
function makeCsv(rows: number): string {
  const rand = mulberry32(12345);
  const blocks: string[] = [',T (K),M [emu/g],H_Oe\n'];
  for (let start = 0; start < rows; start += 10_000) {
    const parts: string[] = [];
    for (let i = start; i < Math.min(rows, start + 10_000); i++) {
      const t = 2 + (298 * i) / rows;
      parts.push(`${i},${t},${(rand() * 50).toPrecision(17)},${Math.round(rand() * 90000) - 45000}\n`);
    }
    blocks.push(parts.join(''));
  }
  return blocks.join('');
}

function mb(bytes: number): string {
  return (bytes / 1048576).toFixed(1);
}

/** Full garbage collection, available without --expose-gc. */
function gc(): void {
  setFlagsFromString('--expose-gc');
  const collect = runInNewContext('gc') as () => void;
  collect();
}

/** Figures of one run (also written as JSON with `--json-part FILE`, for scripts/bench.mjs). */
export interface ITableBenchResult {
  rows: number;
  columns: number;
  textMB: number;
  wallMs: number;
  cpuMs: number;
  loadAverage1: number;
  rssBeforeMB: number;
  rssAfterMB: number;
  peakRssDeltaMB: number;
  heapUsedDeltaMB: number;
  targets: { wallMs: number; memoryMB: number };
  meetsTargets: boolean;
  error?: string;
}

/** Run the benchmark, print its report and return the figures. */
export function runTableBench(): ITableBenchResult {
  const text = makeCsv(ROWS);
  gc();
  const before = process.memoryUsage();
  const cpu0 = process.cpuUsage();
  const t0 = performance.now();
  const result = parseMime('text/csv', text);
  const ms = performance.now() - t0;
  const cpu = process.cpuUsage(cpu0);
  const cpuMs = (cpu.user + cpu.system) / 1000;
  const after = process.memoryUsage();
  // maxRSS is in kilobytes and covers the whole process life; text generation came before `before`.
  const peakRss = Math.max(process.resourceUsage().maxRSS * 1024, after.rss);
  const base: ITableBenchResult = {
    rows: ROWS,
    columns: 4,
    textMB: text.length / 1048576,
    wallMs: ms,
    cpuMs,
    loadAverage1: loadavg()[0],
    rssBeforeMB: before.rss / 1048576,
    rssAfterMB: after.rss / 1048576,
    peakRssDeltaMB: (peakRss - before.rss) / 1048576,
    heapUsedDeltaMB: (after.heapUsed - before.heapUsed) / 1048576,
    targets: { wallMs: TIME_TARGET_MS, memoryMB: MEMORY_TARGET_MB },
    meetsTargets: false
  };
  if (!result.ok) {
    console.log(`table.bench: parse failed: ${messageText(result.message)}`);
    return { ...base, error: messageText(result.message) };
  }
  const rssDelta = after.rss - before.rss;
  const heapDelta = after.heapUsed - before.heapUsed;
  const kinds = result.table.columns.map(c => `${c.header}:${c.kind}`).join(', ');
  console.log(`table.bench: ${ROWS} rows × 4 columns CSV (${mb(text.length)} MB of text) → ${result.table.rowCount} rows [${kinds}]`);
  const [load1] = loadavg();
  console.log(
    `table.bench: time ${ms.toFixed(0)} ms wall, ${cpuMs.toFixed(0)} ms CPU (user+sys, includes GC threads) ` +
      `(target ≤ ${TIME_TARGET_MS} ms; load average ${load1.toFixed(1)} on ${availableParallelism()} cores)`
  );
  console.log(
    `table.bench: rss before ${mb(before.rss)} MB, after ${mb(after.rss)} MB (Δ ${mb(rssDelta)} MB), peak ${mb(peakRss)} MB; ` +
      `heapUsed Δ ${mb(heapDelta)} MB; external+arrayBuffers after ${mb(after.external + after.arrayBuffers)} MB (target ≤ ${MEMORY_TARGET_MB} MB)`
  );
  console.log(`table.bench: peak during parse − rss before = ${mb(peakRss - before.rss)} MB`);
  const ok = ms <= TIME_TARGET_MS && peakRss - before.rss <= MEMORY_TARGET_MB * 1048576;
  console.log(`table.bench: ${ok ? 'PASS' : 'FAIL'} (wall time depends on machine load; CPU time is the steadier figure)`);
  return { ...base, meetsTargets: ok };
}

const isMain = typeof process !== 'undefined' && process.argv[1] !== undefined && /table\.bench\.(ts|cjs)$/.test(process.argv[1]);
if (isMain) {
  const result = runTableBench();
  const at = process.argv.indexOf('--json-part');
  if (at >= 0 && process.argv[at + 1] !== undefined) {
    writeFileSync(process.argv[at + 1], `${JSON.stringify(result, null, 1)}\n`);
  }
  // A missed target is reported, not an error; a failed parse is.
  process.exitCode = result.error === undefined ? 0 : 1;
}
