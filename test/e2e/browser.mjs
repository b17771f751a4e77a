// Launches Debian's Chromium through playwright-core. Never downloads a browser.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { chromium } from 'playwright-core';

export const CHROMIUM = process.env.PSISCAPE_CHROMIUM ?? '/usr/bin/chromium';

/** Stop with a message saying how to install Chromium when it is missing. */
export function requireChromium() {
  if (!fs.existsSync(CHROMIUM)) {
    console.error(
      `Chromium was not found at ${CHROMIUM}.\n` +
        'The end-to-end tests drive Debian\'s Chromium; install it with:\n' +
        '    sudo apt-get install -y chromium\n' +
        '(or point PSISCAPE_CHROMIUM at another Chromium binary).'
    );
    process.exit(1);
  }
}

/** A fresh persistent context in a new user-data dir. */
export async function launch({ colorScheme = 'light' } = {}) {
  const userDataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'psiscape-chromium-'));
  const context = await chromium.launchPersistentContext(userDataDir, {
    executablePath: CHROMIUM,
    headless: true,
    viewport: { width: 1400, height: 900 },
    colorScheme,
    args: [
      '--headless',
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync'
    ]
  });
  return {
    context,
    async close() {
      await context.close();
      fs.rmSync(userDataDir, { recursive: true, force: true });
    }
  };
}
