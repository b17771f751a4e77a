/**
 * What psiscape costs every JupyterLab load (never a test): the demo lab from
 * navigation to an idle demo notebook (cells and table outputs rendered, lab
 * restored), in Debian's Chromium with a fresh profile each run, with psiscape
 * and without it (the same page with no federated extension listed). Runs
 * alternate between the two so that machine load falls on both alike.
 *
 *   npm run bench -- --only startup [--runs N]     (builds what is missing first)
 *
 * Prints median, 90th percentile and range of each, the difference of the
 * medians against its target (≤ 100 ms), and psiscape's own bytes fetched at
 * start-up. With --json-part FILE writes the figures as JSON.
 */
import { writeFileSync } from 'node:fs';
import * as zlib from 'node:zlib';
import { jsonPartArg } from './browserLab';

const TARGET_MS = 100;
const EXTENSION_PATH = '/extensions/jupyterlab-psiscape/';

interface IResponse {
  url(): string;
  status(): number;
  body(): Promise<Buffer>;
}
interface IRoute {
  fetch(): Promise<{ text(): Promise<string> }>;
  fulfill(options: { response?: unknown; body: string; contentType?: string }): Promise<void>;
}
interface IPage {
  route(pattern: string, handler: (route: IRoute) => Promise<void>): Promise<void>;
  on(event: 'response', listener: (response: IResponse) => void): void;
  goto(url: string): Promise<unknown>;
  waitForFunction(source: string, arg?: unknown, options?: Record<string, unknown>): Promise<unknown>;
  evaluate<T>(source: string): Promise<T>;
}
interface IBrowser {
  context: { pages(): IPage[]; newPage(): Promise<IPage> };
  close(): Promise<void>;
}

function stats(samples: number[]): { median: number; p90: number; min: number; max: number } {
  const s = [...samples].sort((a, b) => a - b);
  const at = (q: number): number => s[Math.min(s.length - 1, Math.floor(q * (s.length - 1) + 0.5))];
  return { median: at(0.5), p90: at(0.9), min: s[0], max: s[s.length - 1] };
}

/** Idle notebook: the lab says it is ready, the demo's table outputs are drawn, and nothing is pending for a frame. */
const IDLE = `(() => document.body.dataset.demoReady === 'true' && document.querySelector('.jp-Notebook .jp-OutputArea-output table.dataframe') !== null)()`;

async function oneStart(launch: () => Promise<IBrowser>, url: string, withPsiscape: boolean): Promise<{ ms: number; gzipBytes: number }> {
  const browser = await launch();
  try {
    const page = browser.context.pages()[0] ?? (await browser.context.newPage());
    let gzipBytes = 0;
    page.on('response', response => {
      if (new URL(response.url()).pathname.startsWith(EXTENSION_PATH) && response.status() === 200) {
        void response.body().then(
          body => (gzipBytes += zlib.gzipSync(body, { level: 9 }).length),
          () => undefined
        );
      }
    });
    if (!withPsiscape) {
      // The same page with no prebuilt extension listed in its configuration.
      await page.route('**/lab/index.html', async route => {
        const response = await route.fetch();
        const html = (await response.text()).replace(/"federated_extensions":\[[^\]]*\]/, '"federated_extensions":[]');
        await route.fulfill({ response, body: html, contentType: 'text/html; charset=utf-8' });
      });
    }
    await page.goto(`${url}/lab/index.html`);
    await page.waitForFunction(IDLE, undefined, { polling: 'raf', timeout: 120000 });
    const ms = await page.evaluate<number>('performance.now()');
    return { ms, gzipBytes };
  } finally {
    await browser.close();
  }
}

async function main(): Promise<void> {
  const runsArg = process.argv.indexOf('--runs');
  const runs = runsArg > 0 ? Number(process.argv[runsArg + 1]) : 12;
  const jsonPart = jsonPartArg();
  const { ensureExtensionBuilt } = (await import('../scripts/ensure-built.mjs')) as { ensureExtensionBuilt(): void };
  const { requireChromium, launch } = (await import('../test/e2e/browser.mjs')) as { requireChromium(): void; launch(): Promise<IBrowser> };
  requireChromium();
  ensureExtensionBuilt();
  const { buildDemo } = (await import('../demo/build.mjs')) as { buildDemo(): void };
  buildDemo();
  const { startServer } = (await import('../test/e2e/lab.mjs')) as { startServer(): Promise<{ server: { close(cb: () => void): void }; url: string }> };
  const { server, url } = await startServer();
  const withIt: number[] = [];
  const without: number[] = [];
  let bytes = 0;
  try {
    // One warm-up of each (the server's file cache, Chromium's own start), not counted.
    await oneStart(launch, url, true);
    await oneStart(launch, url, false);
    for (let i = 0; i < runs; i++) {
      const order = i % 2 === 0 ? [true, false] : [false, true];
      for (const flag of order) {
        const { ms, gzipBytes } = await oneStart(launch, url, flag);
        (flag ? withIt : without).push(ms);
        if (flag) {
          bytes = gzipBytes;
        }
      }
    }
  } finally {
    await new Promise<void>(resolve => server.close(resolve));
  }
  const a = stats(withIt);
  const b = stats(without);
  const diff = a.median - b.median;
  const fmt = (s: ReturnType<typeof stats>): string => `median ${s.median.toFixed(0)} ms, p90 ${s.p90.toFixed(0)} ms, range ${s.min.toFixed(0)}–${s.max.toFixed(0)} ms`;
  console.log(`demo lab → idle notebook, ${runs} runs each, fresh Chromium profile per run`);
  console.log(`  with psiscape:    ${fmt(a)}`);
  console.log(`  without psiscape: ${fmt(b)}`);
  console.log(`  difference of medians: ${diff.toFixed(0)} ms (target ≤ ${TARGET_MS} ms): ${diff <= TARGET_MS ? 'PASS' : 'FAIL'}`);
  console.log(`  psiscape's own files fetched at start-up: ${(bytes / 1024).toFixed(1)} kB gzip`);
  if (jsonPart) {
    writeFileSync(jsonPart, JSON.stringify({ runs, withPsiscape: a, withoutPsiscape: b, differenceMs: diff, targetMs: TARGET_MS, startupGzipBytes: bytes }));
  }
}

main().catch(error => {
  console.error(error instanceof Error ? error.message : error);
  process.exit(1);
});
