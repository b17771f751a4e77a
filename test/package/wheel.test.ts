/**
 * The wheel users pip-install: what it carries, and what a Jupyter server
 * makes of it once installed.
 *
 * - Contents: the prebuilt labextension (package.json with _build.load, the
 *   remoteEntry it names, the settings schema) and install.json under
 *   share/jupyter/labextensions/<npm name>; the version of package.json.
 * - Installed with pip into a fresh virtual environment made by Debian's
 *   python3-venv (with the system's site packages, so Debian's Jupyter
 *   packages are visible): a JupyterLab server side run by that
 *   environment's Python lists the extension as an enabled federated
 *   extension and serves its files and settings schema.
 * - Installed from a clean copy of the repository (no built labextension):
 *   the build hook (hatch_build.py) runs `npm run build`, or stops with a
 *   message saying what to run.
 */
import { type ChildProcess, execFileSync, spawn, spawnSync } from 'node:child_process';
import fs from 'node:fs';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

const root = path.resolve(__dirname, '..', '..');
const python = '/usr/bin/python3';
const NAME = 'jupyterlab-psiscape';
const pkg = JSON.parse(fs.readFileSync(path.join(root, 'package.json'), 'utf8')) as { version: string; jupyterlab: { outputDir: string } };
const builtDir = path.join(root, pkg.jupyterlab.outputDir);
/** package.json's version as Python packaging writes it (PEP 440). */
const version = execFileSync(python, ['-c', 'import sys; from packaging.version import Version; print(Version(sys.argv[1]))', pkg.version], {
  encoding: 'utf8'
}).trim();

const scratch: string[] = [];
function tempDir(prefix: string): string {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), prefix));
  scratch.push(dir);
  return dir;
}
afterAll(() => {
  for (const dir of scratch) {
    fs.rmSync(dir, { recursive: true, force: true });
  }
});

let wheelFile: string | undefined;
/** `npm run package` once for the whole file; returns the wheel's path. */
function buildWheel(): string {
  if (!wheelFile) {
    execFileSync(process.execPath, [path.join(root, 'scripts', 'package-wheel.mjs')], { cwd: root, stdio: 'pipe' });
    const wheel = fs.readdirSync(path.join(root, 'dist')).find(f => f.endsWith('.whl'));
    expect(wheel).toBeDefined();
    wheelFile = path.join(root, 'dist', wheel!);
  }
  return wheelFile;
}

/** A fresh virtual environment from Debian's python3-venv; returns its Python. */
function makeVenv(): { dir: string; py: string } {
  const dir = path.join(tempDir('psiscape-venv-'), 'venv');
  execFileSync(python, ['-m', 'venv', '--system-site-packages', dir], { stdio: 'pipe' });
  return { dir, py: path.join(dir, 'bin', 'python') };
}

/** pip install, offline, with no user or site pip configuration; never throws. */
function pipInstall(py: string, target: string, env: NodeJS.ProcessEnv = process.env) {
  const result = spawnSync(
    py,
    ['-m', 'pip', 'install', '--no-index', '--no-deps', '--no-build-isolation', '--no-cache-dir', '--disable-pip-version-check', '--no-input', target],
    { encoding: 'utf8', cwd: os.tmpdir(), env: { ...env, PIP_CONFIG_FILE: os.devNull }, timeout: 240000 }
  );
  return { status: result.status, output: `${result.stdout}\n${result.stderr}` };
}

/** The environment's view of the installed package, from outside the repository. */
function installedVersion(py: string): string {
  return execFileSync(py, ['-c', 'import jupyterlab_psiscape as m; print(m.__version__)'], { encoding: 'utf8', cwd: os.tmpdir() }).trim();
}

function readJson<T>(file: string): T {
  return JSON.parse(fs.readFileSync(file, 'utf8')) as T;
}

interface IBuiltPackage {
  name: string;
  jupyterlab: { _build: { load: string } };
}

describe('wheel', () => {
  let names: string[] = [];
  let prefix = '';
  let read: (name: string) => string;

  beforeAll(() => {
    const file = buildWheel();
    names = JSON.parse(execFileSync(python, ['-c', 'import sys, zipfile, json; print(json.dumps(zipfile.ZipFile(sys.argv[1]).namelist()))', file], { encoding: 'utf8' }));
    read = (name: string) => execFileSync(python, ['-c', 'import sys, zipfile; sys.stdout.write(zipfile.ZipFile(sys.argv[1]).read(sys.argv[2]).decode())', file, name], { encoding: 'utf8' });
    prefix = `jupyterlab_psiscape-${version}.data/data/share/jupyter/labextensions/${NAME}/`;
  }, 180000);

  it('should carry the version of package.json and the project URLs', () => {
    expect(path.basename(wheelFile!)).toBe(`jupyterlab_psiscape-${version}-py3-none-any.whl`);
    const metadata = read(`jupyterlab_psiscape-${version}.dist-info/METADATA`);
    expect(metadata).toMatch(new RegExp(`^Version: ${version.replace(/\./g, '\\.')}$`, 'm'));
    expect(metadata).toMatch(/^Project-URL: Homepage, https:\/\/github\.com\/psiscape\/psiscape$/m);
  });

  it('should hold the labextension package.json with a load entry that is in the wheel', () => {
    const built = JSON.parse(read(`${prefix}package.json`)) as IBuiltPackage & { version: string };
    expect(built.name).toBe(NAME);
    expect(built.version).toBe(pkg.version);
    const load = built.jupyterlab._build.load;
    expect(load).toMatch(/^static\/remoteEntry\.[0-9a-f]+\.js$/);
    expect(names).toContain(`${prefix}${load}`);
  });

  it('should hold install.json and the settings schema', () => {
    const install = JSON.parse(read(`${prefix}install.json`));
    expect(install.packageName).toBe('jupyterlab_psiscape');
    const schema = JSON.parse(read(`${prefix}schemas/${NAME}/plugin.json`));
    expect(schema.properties.pointSize.default).toBe(40);
  });

  it('should ship only the chunks of the current build', () => {
    const statics = names.filter(n => n.startsWith(`${prefix}static/`) && n.endsWith('.js'));
    const built = fs.readdirSync(path.join(builtDir, 'static')).filter(f => f.endsWith('.js'));
    expect(statics.map(n => path.basename(n)).sort()).toEqual(built.sort());
  });

  it('should not ship the build hook or the labextension inside the Python package', () => {
    expect(names.filter(n => n.startsWith('jupyterlab_psiscape/')).sort()).toEqual(['jupyterlab_psiscape/__init__.py']);
    expect(names.some(n => n.endsWith('hatch_build.py'))).toBe(false);
  });
});

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = net.createServer();
    server.once('error', reject);
    server.listen(0, '127.0.0.1', () => {
      const port = (server.address() as net.AddressInfo).port;
      server.close(() => resolve(port));
    });
  });
}

/** test/package/lab_server.py, run by `py`; resolves once it answers on /lab. */
async function startLabServer(py: string): Promise<{ child: ChildProcess; base: string; info: { prefix: string; labextensions_path: string[] }; log: () => string }> {
  const port = await freePort();
  const work = tempDir('psiscape-lab-');
  const child = spawn(py, [path.join(__dirname, 'lab_server.py'), String(port), work], { cwd: work, stdio: ['ignore', 'pipe', 'pipe'] });
  let out = '';
  let err = '';
  child.stdout!.on('data', d => (out += String(d)));
  child.stderr!.on('data', d => (err += String(d)));
  const base = `http://127.0.0.1:${port}`;
  const deadline = Date.now() + 90000;
  for (;;) {
    if (child.exitCode !== null) {
      throw new Error(`the Jupyter server stopped (status ${child.exitCode}):\n${err}`);
    }
    try {
      const res = await fetch(`${base}/lab`);
      if (res.ok) {
        break;
      }
    } catch {
      // not listening yet
    }
    if (Date.now() > deadline) {
      child.kill();
      throw new Error(`the Jupyter server did not answer within 90 s:\n${err}`);
    }
    await new Promise(r => setTimeout(r, 250));
  }
  return { child, base, info: JSON.parse(out.split('\n')[0]), log: () => err };
}

async function stop(child: ChildProcess): Promise<void> {
  if (child.exitCode !== null || child.signalCode !== null) {
    return;
  }
  const exited = new Promise(resolve => child.once('exit', resolve));
  child.kill('SIGTERM');
  const timer = setTimeout(() => child.kill('SIGKILL'), 10000);
  await exited;
  clearTimeout(timer);
}

describe('wheel installed into a fresh virtual environment', () => {
  let venv: { dir: string; py: string };
  let installed: string;

  beforeAll(() => {
    const wheel = buildWheel();
    venv = makeVenv();
    const result = pipInstall(venv.py, wheel);
    expect(result.status, result.output).toBe(0);
    installed = path.join(venv.dir, 'share', 'jupyter', 'labextensions', NAME);
  }, 180000);

  it('should place the labextension in the environment and report the version of package.json', () => {
    const built = readJson<IBuiltPackage>(path.join(builtDir, 'package.json'));
    const placed = readJson<IBuiltPackage>(path.join(installed, 'package.json'));
    expect(placed.jupyterlab._build.load).toBe(built.jupyterlab._build.load);
    expect(fs.existsSync(path.join(installed, placed.jupyterlab._build.load))).toBe(true);
    expect(readJson<{ packageName: string }>(path.join(installed, 'install.json')).packageName).toBe('jupyterlab_psiscape');
    expect(installedVersion(venv.py)).toBe(version);
  });

  it('should be listed, enabled, by a Jupyter server running with that environment', async () => {
    const server = await startLabServer(venv.py);
    try {
      // The server looks where JupyterLab looks; only the environment holds the extension.
      expect(server.info.prefix).toBe(venv.dir);
      const holders = server.info.labextensions_path.filter(dir => fs.existsSync(path.join(dir, NAME, 'package.json')));
      expect(holders).toEqual([path.join(venv.dir, 'share', 'jupyter', 'labextensions')]);

      // The page configuration JupyterLab's frontend starts from.
      const page = JSON.parse(await (await fetch(`${server.base}/lab`)).text()) as {
        federated_extensions: { name: string; load: string; extension?: string }[];
        disabledExtensions: string[];
        fullLabextensionsUrl: string;
        fullSettingsUrl: string;
      };
      const ours = page.federated_extensions.find(e => e.name === NAME);
      expect(ours, JSON.stringify(page.federated_extensions)).toBeDefined();
      const load = readJson<IBuiltPackage>(path.join(installed, 'package.json')).jupyterlab._build.load;
      expect(ours!.load).toBe(load);
      expect(ours!.extension).toBe('./extension');
      expect(page.disabledExtensions.filter(id => id === NAME || id.startsWith(`${NAME}:`))).toEqual([]);

      // Its entry point is served, and its settings schema is known to the server.
      const entry = await fetch(`${server.base}${page.fullLabextensionsUrl}/${NAME}/${load}`);
      expect(entry.status).toBe(200);
      expect(await entry.text()).toContain(NAME);
      const settings = await fetch(`${server.base}${page.fullSettingsUrl}/${NAME}:plugin`);
      expect(settings.status, server.log()).toBe(200);
      const plugin = (await settings.json()) as { id: string; schema: { properties: { pointSize: { default: number } } } };
      expect(plugin.id).toBe(`${NAME}:plugin`);
      expect(plugin.schema.properties.pointSize.default).toBe(40);
    } finally {
      await stop(server.child);
    }
  });
});

describe('pip install from a clean copy of the repository', () => {
  let venv: { dir: string; py: string };

  /** The repository's files as a clone has them: tracked and unignored ones, nothing built. */
  function cleanCopy(): string {
    const copy = path.join(tempDir('psiscape-clone-'), 'psiscape');
    const listed = execFileSync('git', ['ls-files', '-z', '--cached', '--others', '--exclude-standard'], { cwd: root, encoding: 'utf8' });
    for (const rel of listed.split('\0').filter(Boolean)) {
      const from = path.join(root, rel);
      if (fs.existsSync(from)) {
        fs.mkdirSync(path.dirname(path.join(copy, rel)), { recursive: true });
        fs.copyFileSync(from, path.join(copy, rel));
      }
    }
    expect(fs.existsSync(path.join(copy, pkg.jupyterlab.outputDir))).toBe(false);
    expect(fs.existsSync(path.join(copy, 'hatch_build.py'))).toBe(true);
    return copy;
  }

  beforeAll(() => {
    venv = makeVenv();
  }, 120000);

  it('should stop with the command to run when the npm packages are not installed', () => {
    const copy = cleanCopy();
    const result = pipInstall(venv.py, copy);
    expect(result.status).not.toBe(0);
    expect(result.output).toContain(`The JupyterLab extension is not built (${pkg.jupyterlab.outputDir}/package.json is missing)`);
    expect(result.output).toContain(`Run \`npm ci && npm run build\` in ${copy}, then install again.`);
    expect(result.output).not.toContain('Traceback');
    expect(fs.existsSync(path.join(venv.dir, 'share', 'jupyter', 'labextensions', NAME))).toBe(false);
  });

  it('should stop with the command to run when npm is not found', () => {
    const copy = cleanCopy();
    fs.mkdirSync(path.join(copy, 'node_modules'));
    const result = pipInstall(venv.py, copy, { ...process.env, PATH: tempDir('psiscape-nopath-') });
    expect(result.status).not.toBe(0);
    expect(result.output).toContain('and npm was not found');
    expect(result.output).toContain(`run \`npm ci && npm run build\` in ${copy}, then install again.`);
    expect(fs.existsSync(path.join(venv.dir, 'share', 'jupyter', 'labextensions', NAME))).toBe(false);
  });

  it('should run npm run build itself when npm and the npm packages are there', () => {
    const copy = cleanCopy();
    // Stands in for the npm packages; the stand-in npm below does not read them.
    fs.mkdirSync(path.join(copy, 'node_modules'));
    // An `npm` first on PATH that records how it was called and produces the
    // labextension as `npm run build` does (a copy of this checkout's build,
    // which `npm run package` above made sure exists). The real build is what
    // `npm run build` does everywhere else in the tests.
    const bin = tempDir('psiscape-npm-');
    const calls = path.join(bin, 'calls.jsonl');
    fs.writeFileSync(
      path.join(bin, 'npm'),
      `#!${process.execPath}
const fs = require('fs');
const path = require('path');
fs.appendFileSync(${JSON.stringify(calls)}, JSON.stringify({ args: process.argv.slice(2), cwd: process.cwd() }) + '\\n');
if (process.argv.slice(2).join(' ') !== 'run build') process.exit(3);
fs.cpSync(${JSON.stringify(builtDir)}, path.join(process.cwd(), ${JSON.stringify(pkg.jupyterlab.outputDir)}), { recursive: true });
`,
      { mode: 0o755 }
    );
    buildWheel();
    const result = pipInstall(venv.py, copy, { ...process.env, PATH: `${bin}${path.delimiter}${process.env.PATH ?? ''}` });
    expect(result.status, result.output).toBe(0);
    const made = fs
      .readFileSync(calls, 'utf8')
      .trim()
      .split('\n')
      .map(l => JSON.parse(l) as { args: string[]; cwd: string });
    expect(made).toEqual([{ args: ['run', 'build'], cwd: fs.realpathSync(copy) }]);
    const placed = path.join(venv.dir, 'share', 'jupyter', 'labextensions', NAME, 'package.json');
    expect(readJson<IBuiltPackage>(placed).jupyterlab._build.load).toBe(readJson<IBuiltPackage>(path.join(builtDir, 'package.json')).jupyterlab._build.load);
    expect(installedVersion(venv.py)).toBe(version);
  });
});
