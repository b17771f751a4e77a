// Helpers for end-to-end tests against a real Jupyter server and ipykernel:
// check the Debian Python packages, start demo/server/serve.py on a free
// loopback port (and always stop it), write notebooks, open them in the
// server-flavoured lab, edit and run cells.
import { spawn, spawnSync } from 'node:child_process';
import fs from 'node:fs';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { launch } from './browser.mjs';

const here = path.dirname(fileURLToPath(import.meta.url));
export const root = path.resolve(here, '..', '..');
export const PYTHON = process.env.PSISCAPE_PYTHON ?? '/usr/bin/python3';
const SERVE_PY = path.join(root, 'demo', 'server', 'serve.py');

/** Debian packages the real-server tests need, by the module they provide. */
const PYTHON_MODULES = {
  jupyter_server: 'python3-jupyter-server',
  jupyterlab_server: 'python3-jupyterlab-server',
  ipykernel: 'python3-ipykernel',
  pandas: 'python3-pandas'
};

/**
 * Why the real-server tests cannot run here, or null when they can.
 *
 * @returns {string | null}
 */
export function missingPython() {
  if (!fs.existsSync(PYTHON)) {
    return `${PYTHON} not found`;
  }
  const check = Object.keys(PYTHON_MODULES)
    .map(m => `\ntry:\n    import ${m}\nexcept Exception:\n    print(${JSON.stringify(m)})`)
    .join('');
  const run = spawnSync(PYTHON, ['-c', check], { encoding: 'utf8', timeout: 60000 });
  if (run.status !== 0) {
    return `${PYTHON} failed: ${run.stderr || run.error}`;
  }
  const missing = run.stdout.split('\n').filter(Boolean);
  if (missing.length) {
    const pkgs = missing.map(m => PYTHON_MODULES[m]).join(' ');
    return `${PYTHON} lacks ${missing.join(', ')} (install with: apt-get install -y ${pkgs})`;
  }
  return null;
}

/** A loopback port that was free a moment ago. */
function freePort() {
  return new Promise((resolve, reject) => {
    const probe = net.createServer();
    probe.once('error', reject);
    probe.listen(0, '127.0.0.1', () => {
      const { port } = probe.address();
      probe.close(() => resolve(port));
    });
  });
}

const sleep = ms => new Promise(resolve => setTimeout(resolve, ms));

/** Poll `url` until it answers 200, the process exits, or time runs out. */
async function waitForHttp(url, child, timeoutMs) {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    if (child.exitCode !== null || child.signalCode !== null) {
      return false;
    }
    try {
      const res = await fetch(url, { signal: AbortSignal.timeout(5000) });
      if (res.ok) {
        return true;
      }
    } catch {
      // not listening yet
    }
    await sleep(250);
  }
  return false;
}

/** Kill a whole process group (the server and anything it left behind). */
function killGroup(pid, signal) {
  try {
    process.kill(-pid, signal);
  } catch {
    // already gone
  }
}

/**
 * Start demo/server/serve.py with copies of `notebooks` in its root folder.
 * The server runs in its own process group; `stop()` asks it to shut down
 * (kernels included) and kills the group if it does not within 20 s.
 *
 * @param {{ notebooks: string[], timeoutMs?: number, withPsiscape?: boolean }} options
 *   withPsiscape false: the lab a collaborator without psiscape has
 * @returns {Promise<{ url: string, log: () => string, stop: () => Promise<void> }>}
 */
export async function startJupyter({ notebooks, timeoutMs = 90000, withPsiscape = true }) {
  let lastError = '';
  for (let attempt = 0; attempt < 3; attempt++) {
    const port = await freePort();
    const args = [SERVE_PY, '--port', String(port), '--log-level', 'INFO', ...notebooks.flatMap(n => ['--notebook', n]), ...(withPsiscape ? [] : ['--without-psiscape'])];
    const child = spawn(PYTHON, args, { cwd: root, detached: true, stdio: ['ignore', 'pipe', 'pipe'] });
    let output = '';
    const keep = chunk => {
      output = (output + chunk.toString()).slice(-20000);
    };
    child.stdout.on('data', keep);
    child.stderr.on('data', keep);
    const exited = new Promise(resolve => child.once('exit', resolve));
    // If this test process dies, do not leave the server behind.
    const onExit = () => killGroup(child.pid, 'SIGKILL');
    process.once('exit', onExit);

    const stop = async () => {
      process.removeListener('exit', onExit);
      if (child.exitCode === null && child.signalCode === null) {
        child.kill('SIGTERM');
        const done = await Promise.race([exited.then(() => true), sleep(20000).then(() => false)]);
        if (!done) {
          killGroup(child.pid, 'SIGKILL');
          await exited;
        }
      }
      // Anything still in the group (nothing, normally) goes too.
      killGroup(child.pid, 'SIGKILL');
    };

    const url = `http://127.0.0.1:${port}`;
    if (await waitForHttp(`${url}/api/status`, child, timeoutMs)) {
      return { url, log: () => output, stop };
    }
    await stop();
    lastError = output;
    if (!/address already in use/i.test(output)) {
      break;
    }
  }
  throw new Error(`the Jupyter server did not start:\n${lastError}`);
}

/**
 * Write a one-code-cell notebook (python3 kernel) into a new temp folder.
 *
 * @param {string} name file name, e.g. "kernel-flow.ipynb"
 * @param {string[]} cells code cell sources
 * @returns {string} the file's path
 */
export function writeNotebook(name, cells) {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'psiscape-nb-'));
  const nb = {
    nbformat: 4,
    nbformat_minor: 5,
    metadata: {
      kernelspec: { name: 'python3', display_name: 'Python 3 (ipykernel)', language: 'python' },
      language_info: { name: 'python' }
    },
    cells: cells.map((source, i) => ({
      cell_type: 'code',
      id: `cell-${i + 1}`,
      metadata: {},
      execution_count: null,
      source,
      outputs: []
    }))
  };
  const file = path.join(dir, name);
  fs.writeFileSync(file, JSON.stringify(nb, null, 1));
  return file;
}

/**
 * Open a notebook of the server in a fresh browser and wait until the lab is
 * up, the notebook shown and its kernel idle.
 */
export async function openNotebook(baseUrl, name) {
  const browser = await launch();
  const page = browser.context.pages()[0] ?? (await browser.context.newPage());
  const errors = [];
  page.on('pageerror', e => errors.push(String(e)));
  try {
    await page.goto(`${baseUrl}/lab/tree/${encodeURIComponent(name)}`);
    await page.waitForSelector('body[data-lab-ready="true"]', { state: 'attached', timeout: 120000 });
    await page.waitForSelector('.jp-NotebookPanel .jp-Notebook .jp-Cell', { timeout: 60000 });
    await waitKernelIdle(page, 120000);
  } catch (reason) {
    await browser.close();
    throw reason;
  }
  return { browser, page, errors };
}

/** Wait until the current notebook's kernel is connected and idle. */
export async function waitKernelIdle(page, timeout = 60000) {
  await page.waitForFunction(
    () => {
      const panel = window.jupyterapp.shell.currentWidget;
      const kernel = panel?.sessionContext?.session?.kernel;
      return kernel?.connectionStatus === 'connected' && kernel.status === 'idle';
    },
    null,
    { timeout, polling: 200 }
  );
}

/**
 * Replace the source of code cell `index` by typing into its editor (select
 * all, then insert the text), and check the model holds exactly that text.
 */
export async function editCell(page, index, source) {
  const editor = page.locator('.jp-NotebookPanel .jp-Notebook .jp-Cell').nth(index).locator('.cm-content');
  await editor.click();
  await page.keyboard.press('Control+A');
  await page.keyboard.insertText(source);
  await page.waitForFunction(
    ([i, text]) => window.jupyterapp.shell.currentWidget?.content?.model?.cells.get(i).sharedModel.getSource() === text,
    [index, source],
    { timeout: 10000 }
  );
}

/**
 * Run code cell `index` in the kernel (the Run menu's command) and wait for
 * its new execution count and an idle kernel.
 *
 * @returns {Promise<number>} the execution count
 */
export async function runCell(page, index, timeout = 60000) {
  const before = await page.evaluate(i => window.jupyterapp.shell.currentWidget.content.model.cells.get(i).executionCount, index);
  // Not awaited in the page: a hung run must end in the wait's timeout below.
  await page.evaluate(i => {
    const panel = window.jupyterapp.shell.currentWidget;
    panel.content.activeCellIndex = i;
    panel.content.deselectAll();
    void window.jupyterapp.commands.execute('notebook:run-cell');
  }, index);
  const handle = await page.waitForFunction(
    ([i, prev]) => {
      const panel = window.jupyterapp.shell.currentWidget;
      const cell = panel.content.model.cells.get(i);
      const kernel = panel.sessionContext.session?.kernel;
      const count = cell.executionCount;
      return count !== null && count !== prev && kernel?.status === 'idle' ? count : false;
    },
    [index, before],
    { timeout, polling: 100 }
  );
  return handle.jsonValue();
}
