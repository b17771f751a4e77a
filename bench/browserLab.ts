/**
 * The demo lab for the browser benches: builds what is missing, serves it on
 * loopback and opens it in Debian's Chromium (the same helpers as the
 * end-to-end tests), and the few Playwright calls the benches use.
 */

/** The Playwright locator calls the benches use. */
export interface ILocator {
  first(): ILocator;
  last(): ILocator;
  locator(selector: string, options?: Record<string, unknown>): ILocator;
  selectOption(value: string): Promise<unknown>;
  click(): Promise<void>;
  fill(text: string): Promise<void>;
  press(key: string): Promise<void>;
  count(): Promise<number>;
  textContent(): Promise<string | null>;
  waitFor(options?: Record<string, unknown>): Promise<void>;
}

/** The Playwright page calls the benches use; page code is passed as source text (never transpiled). */
export interface IPage {
  locator(selector: string, options?: Record<string, unknown>): ILocator;
  evaluate<T>(source: string): Promise<T>;
  waitForFunction(source: string, arg?: unknown, options?: Record<string, unknown>): Promise<unknown>;
  on(event: 'worker', listener: () => void): void;
}

interface ILabHelpers {
  startServer(): Promise<{ server: { close(cb: () => void): void }; url: string }>;
  openLab(url: string): Promise<{ browser: { close(): Promise<void> }; page: IPage }>;
  contextMenu(page: IPage, locator: ILocator, label: string): Promise<void>;
}

/** An open demo lab. */
export interface IBenchLab {
  page: IPage;
  /** ms from navigation to the demo notebook shown. */
  startupMs: number;
  contextMenu(locator: ILocator, label: string): Promise<void>;
  close(): Promise<void>;
}

/** The file given with `--json-part FILE`, or null. */
export function jsonPartArg(): string | null {
  const i = process.argv.indexOf('--json-part');
  return i >= 0 ? (process.argv[i + 1] ?? null) : null;
}

/** Build what is missing, serve the demo lab and open it in a fresh Chromium profile. */
export async function openBenchLab(): Promise<IBenchLab> {
  const { ensureExtensionBuilt } = (await import('../scripts/ensure-built.mjs')) as { ensureExtensionBuilt(): void };
  const { requireChromium } = (await import('../test/e2e/browser.mjs')) as { requireChromium(): void };
  requireChromium();
  ensureExtensionBuilt();
  const { buildDemo } = (await import('../demo/build.mjs')) as { buildDemo(): void };
  buildDemo();
  const lab = (await import('../test/e2e/lab.mjs')) as ILabHelpers;
  const { server, url } = await lab.startServer();
  const t0 = Date.now();
  const { browser, page } = await lab.openLab(url);
  return {
    page,
    startupMs: Date.now() - t0,
    contextMenu: (locator, label) => lab.contextMenu(page, locator, label),
    close: async () => {
      await browser.close();
      await new Promise<void>(resolve => server.close(resolve));
    }
  };
}
