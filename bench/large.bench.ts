/**
 * Benchmark of large and hostile inputs in Node (never a test; prints figures,
 * asserts nothing):
 *   - a 200 000-row table → fit overlay spec built (display reduction included);
 *   - a 1 000 000-row CSV parsed (time, text size, peak memory);
 *   - a 15 MB CSV with a quote that never closes → refused;
 *   - 100 000 small HTML tables in one output → first table read.
 *
 *   npm run bench -- --only large.bench     (or: npx tsx bench/large.bench.ts)
 *   (`--only large` also runs bench/large-browser.bench.ts, which needs the built demo lab.)
 *
 * MB are 10⁶ characters of text or 10⁶ bytes of memory.
 * Each figure is the median of several runs after one warm-up run (the
 * warm-up is printed too: it is what a user meets first).
 */
import { writeFileSync } from 'node:fs';
import { availableParallelism, loadavg } from 'node:os';
import { setFlagsFromString } from 'node:v8';
import { runInNewContext } from 'node:vm';
import { buildFitOverlayChart } from '../src/charts/fit-overlay';
import type { IChartTheme } from '../src/charts/theme';
import { messageText } from '../src/core/messages';
import { parseMime } from '../src/core/table/index';
import type { ParseResult } from '../src/core/table/index';
import { mulberry32 } from '../src/core/numeric/random';

const theme: IChartTheme = { background: '#ffffff', text: '#222222', grid: '#dddddd', accent: '#2050b0', accent2: '#c05020', font: 'sans-serif' };

/** Millions of characters (text) or bytes (memory). */
function mb(n: number): number {
  return n / 1e6;
}

/** Full garbage collection, available without --expose-gc. */
function gc(): void {
  setFlagsFromString('--expose-gc');
  (runInNewContext('gc') as () => void)();
}

function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}

/** Wall times (ms) of `runs` calls after one warm-up call; the warm-up's own time is returned too. */
function timed<T>(runs: number, f: () => T): { first: number; median: number; last: T } {
  let t0 = performance.now();
  let last = f();
  const first = performance.now() - t0;
  const times: number[] = [];
  for (let k = 0; k < runs; k++) {
    t0 = performance.now();
    last = f();
    times.push(performance.now() - t0);
  }
  return { first, median: median(times), last };
}

/** pandas to_csv() text: unnamed index, T, M and an integer field column. */
function makeCsv(rows: number): string {
  const rand = mulberry32(2024);
  const blocks: string[] = [',T (K),M [emu/g],H_Oe\n'];
  for (let start = 0; start < rows; start += 10_000) {
    const parts: string[] = [];
    for (let i = start; i < Math.min(rows, start + 10_000); i++) {
      const t = 2 + (298 * i) / rows;
      parts.push(`${i},${t},${(80 * Math.sqrt(Math.max(0, 1 - t / 250)) + rand() - 0.5).toPrecision(17)},${Math.round(rand() * 90000) - 45000}\n`);
    }
    blocks.push(parts.join(''));
  }
  return blocks.join('');
}

function tableOf(r: ParseResult) {
  if (!r.ok) {
    throw new Error(`parse failed: ${messageText(r.message)}`);
  }
  return r.table;
}

/** Figures of one run (also written as JSON with `--json-part FILE`, for scripts/bench.mjs). */
export interface ILargeBenchResult {
  loadAverage1: number;
  cores: number;
  overlay: { rows: number; shown: number; firstMs: number; medianMs: number };
  csv: { rows: number; textMB: number; firstMs: number; medianMs: number; cpuMedianMs: number; peakRssDeltaMB: number };
  unclosedQuote: { textMB: number; firstMs: number; medianMs: number; message: string };
  htmlTables: { tables: number; textMB: number; firstMs: number; medianMs: number; note: string };
}

/** Run the benchmark, print its report and return the figures. */
export function runLargeBench(): ILargeBenchResult {
  // 200 000-row table → overlay spec (the panel's chart of a fit of it).
  const overlayRows = 200_000;
  const overlayTable = tableOf(parseMime('text/csv', makeCsv(overlayRows)));
  const x = overlayTable.columns[1].values as Float64Array;
  const y = overlayTable.columns[2].values as Float64Array;
  const curve = { x: Array.from({ length: 300 }, (_, i) => 100 + (140 * i) / 299), y: Array.from({ length: 300 }, (_, i) => 80 * Math.sqrt(1 - (100 + (140 * i) / 299) / 250)) };
  const overlay = timed(9, () =>
    buildFitOverlayChart({ x, y, xTitle: 'T (K)', yTitle: 'M (emu/g)', window: { min: 100, max: 240 }, curve, curveLabel: 'fitted model', pointSize: 30, theme })
  );
  const shown = overlay.last.reduced?.shown ?? overlay.last.plotted;
  console.log(
    `large.bench: overlay spec of ${overlayRows} rows → ${shown} points drawn of ${overlay.last.plotted}: ` +
      `${overlay.median.toFixed(1)} ms (median of 9; first run ${overlay.first.toFixed(1)} ms)`
  );

  // 1 000 000-row CSV parsed.
  const csvRows = 1_000_000;
  const csv = makeCsv(csvRows);
  gc();
  const rssBefore = process.memoryUsage().rss;
  const cpuTimes: number[] = [];
  const csvRun = timed(3, () => {
    const c0 = process.cpuUsage();
    const t = tableOf(parseMime('text/csv', csv));
    const c = process.cpuUsage(c0);
    cpuTimes.push((c.user + c.system) / 1000);
    return t;
  });
  const peakRss = Math.max(process.resourceUsage().maxRSS * 1024, process.memoryUsage().rss);
  // CPU time of the process (all its threads, the garbage collector's included), median of the timed runs.
  const csvCpu = median(cpuTimes.slice(1));
  const csvMemory = mb(peakRss - rssBefore);
  console.log(
    `large.bench: CSV of ${csvRun.last.rowCount} rows (${mb(csv.length).toFixed(1)} MB of text) parsed: ` +
      `${csvRun.median.toFixed(0)} ms (median of 3; first run ${csvRun.first.toFixed(0)} ms); CPU ${csvCpu.toFixed(0)} ms (median; target ≤ 1000 ms: ${csvCpu <= 1000 ? 'PASS' : 'FAIL'}); ` +
      `peak RSS − RSS before ≤ ${csvMemory.toFixed(0)} MB (target ≤ 300 MB: ${csvMemory <= 300 ? 'PASS' : 'FAIL'})`
  );

  // 15 MB CSV whose quote opens in row 11 and never closes.
  const quoted = `T (K),M\n${'1.5,2.5\n'.repeat(10)}3,"x\n${'1.25,3.5\n'.repeat(Math.ceil(15_000_000 / 9))}`;
  const refusal = timed(5, () => parseMime('text/csv', quoted));
  const refusalText = refusal.last.ok ? 'read (not refused!)' : messageText(refusal.last.message);
  console.log(
    `large.bench: ${mb(quoted.length).toFixed(1)} MB CSV with an unclosed quote → "${refusalText}": ` +
      `${refusal.median.toFixed(1)} ms (median of 5; first run ${refusal.first.toFixed(1)} ms)`
  );

  // 100 000 small pandas tables in one HTML output.
  const tables = 100_000;
  const frame = '<table border="1" class="dataframe"><thead><tr style="text-align: right;"><th></th><th>T</th><th>M</th></tr></thead><tbody><tr><th>0</th><td>1.5</td><td>2.5</td></tr></tbody></table>\n';
  const html = frame.repeat(tables);
  const htmlRun = timed(5, () => tableOf(parseMime('text/html', html)));
  const note = htmlRun.last.notes.map(n => messageText(n.message)).join(' ');
  console.log(
    `large.bench: ${tables} HTML tables (${mb(html.length).toFixed(1)} MB) → first table read: ` +
      `${htmlRun.median.toFixed(0)} ms (median of 5; first run ${htmlRun.first.toFixed(0)} ms); note: ${note}`
  );

  const [load1] = loadavg();
  console.log(`large.bench: load average ${load1.toFixed(1)} on ${availableParallelism()} cores (wall times depend on it)`);
  return {
    loadAverage1: load1,
    cores: availableParallelism(),
    overlay: { rows: overlayRows, shown, firstMs: overlay.first, medianMs: overlay.median },
    csv: { rows: csvRows, textMB: mb(csv.length), firstMs: csvRun.first, medianMs: csvRun.median, cpuMedianMs: csvCpu, peakRssDeltaMB: csvMemory },
    unclosedQuote: { textMB: mb(quoted.length), firstMs: refusal.first, medianMs: refusal.median, message: refusalText },
    htmlTables: { tables, textMB: mb(html.length), firstMs: htmlRun.first, medianMs: htmlRun.median, note }
  };
}

const isMain = typeof process !== 'undefined' && process.argv[1] !== undefined && /large\.bench\.(ts|cjs)$/.test(process.argv[1]);
if (isMain) {
  const result = runLargeBench();
  const at = process.argv.indexOf('--json-part');
  if (at >= 0 && process.argv[at + 1] !== undefined) {
    writeFileSync(process.argv[at + 1], `${JSON.stringify(result, null, 1)}\n`);
  }
}
