/**
 * scripts/preflight.mjs, the first step of `npm test`: run for real, with a
 * fake `dpkg-query` first on PATH that reports a chosen set of packages as
 * installed, and no other change to the machine.
 */
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';

const root = path.resolve(__dirname, '..', '..');
const script = path.join(root, 'scripts', 'preflight.mjs');

const ALL = [
  'chromium',
  'python3-build',
  'python3-hatchling',
  'python3-wheel',
  'python3-venv',
  'python3-jupyter-server',
  'python3-jupyterlab-server',
  'python3-ipykernel',
  'python3-pandas',
  'python3-nbconvert'
];

const dirs: string[] = [];

/**
 * A folder holding a `dpkg-query` that answers like dpkg does: one line per
 * package it knows, with its status, and an error on stderr (exit status 1)
 * for the others. It also records how often it was called.
 */
function fakeDpkg(status: Record<string, string>): { bin: string; calls: string } {
  const bin = fs.mkdtempSync(path.join(os.tmpdir(), 'psiscape-dpkg-'));
  dirs.push(bin);
  const calls = path.join(bin, 'calls');
  const fake = `#!${process.execPath}
const fs = require('fs');
const status = ${JSON.stringify(status)};
fs.appendFileSync(${JSON.stringify(calls)}, JSON.stringify(process.argv.slice(2)) + '\\n');
const format = process.argv.find(a => a.startsWith('-f=') || a.startsWith('--showformat='));
if (!process.argv.includes('-W') || !format || !format.includes('\${db:Status-Status}')) {
  process.stderr.write('fake dpkg-query: unexpected arguments\\n');
  process.exit(2);
}
let code = 0;
for (const name of process.argv.slice(2).filter(a => !a.startsWith('-'))) {
  if (name in status) {
    process.stdout.write(name + '\\t' + status[name] + '\\n');
  } else {
    process.stderr.write('dpkg-query: no packages found matching ' + name + '\\n');
    code = 1;
  }
}
process.exit(code);
`;
  fs.writeFileSync(path.join(bin, 'dpkg-query'), fake, { mode: 0o755 });
  return { bin, calls };
}

function run(bin: string, args: string[] = []) {
  const result = spawnSync(process.execPath, [script, ...args], {
    encoding: 'utf8',
    env: { ...process.env, PATH: `${bin}${path.delimiter}${process.env.PATH ?? ''}` }
  });
  return { status: result.status, stdout: result.stdout, stderr: result.stderr };
}

function callsOf(calls: string): string[][] {
  return fs.existsSync(calls) ? fs.readFileSync(calls, 'utf8').trim().split('\n').map(l => JSON.parse(l) as string[]) : [];
}

const sudo = process.getuid?.() === 0 ? '' : 'sudo ';

afterAll(() => {
  for (const d of dirs) {
    fs.rmSync(d, { recursive: true, force: true });
  }
});

describe('preflight', () => {
  it('should list every package, space-separated, without asking dpkg', () => {
    const { bin, calls } = fakeDpkg({});
    const out = run(bin, ['--list']);
    expect(out.status).toBe(0);
    expect(out.stdout).toBe(`${ALL.join(' ')}\n`);
    expect(out.stderr).toBe('');
    expect(callsOf(calls)).toEqual([]);
  });

  it('should name every missing package and one install line on a bare machine, then fail', () => {
    const { bin, calls } = fakeDpkg({});
    const out = run(bin);
    expect(out.status).toBe(1);
    expect(out.stdout).toBe('');
    // One dpkg-query call for all packages.
    const made = callsOf(calls);
    expect(made).toHaveLength(1);
    expect(made[0].filter(a => !a.startsWith('-'))).toEqual(ALL);
    // One message: a heading, a line per package, the install line.
    const lines = out.stderr.trimEnd().split('\n');
    expect(lines[0]).toBe(`The tests need ${ALL.length} Debian packages that are not installed:`);
    expect(lines.filter(l => /^ {4}\S+ {2,}\S/.test(l)).map(l => l.trim().split(/\s+/)[0])).toEqual(ALL);
    const install = lines.filter(l => l.includes('apt-get install'));
    expect(install).toEqual([`    ${sudo}apt-get install -y --no-install-recommends ${ALL.join(' ')}`]);
    expect(out.stderr.match(/The tests need/g)).toHaveLength(1);
  });

  it('should name only the missing packages when some are installed', () => {
    const present = ['chromium', 'python3-build', 'python3-hatchling', 'python3-pandas'];
    const status: Record<string, string> = Object.fromEntries(present.map(p => [p, 'installed']));
    // Removed but with its configuration left behind: dpkg knows it, it is not installed.
    status['python3-venv'] = 'config-files';
    status['python3-wheel'] = 'half-installed';
    const { bin } = fakeDpkg(status);
    const out = run(bin);
    const missing = ALL.filter(p => !present.includes(p));
    expect(out.status).toBe(1);
    expect(out.stderr).toContain(`The tests need ${missing.length} Debian packages that are not installed:`);
    expect(out.stderr).toContain(`    ${sudo}apt-get install -y --no-install-recommends ${missing.join(' ')}\n`);
    for (const p of present) {
      expect(out.stderr).not.toMatch(new RegExp(`^ {4}${p} `, 'm'));
    }
  });

  it('should say "package" for a single missing one', () => {
    const { bin } = fakeDpkg(Object.fromEntries(ALL.filter(p => p !== 'python3-nbconvert').map(p => [p, 'installed'])));
    const out = run(bin);
    expect(out.status).toBe(1);
    expect(out.stderr).toContain('The tests need 1 Debian package that is not installed:');
    expect(out.stderr).toContain(`    ${sudo}apt-get install -y --no-install-recommends python3-nbconvert\n`);
  });

  it('should pass with one short line when everything is installed', () => {
    const { bin, calls } = fakeDpkg(Object.fromEntries(ALL.map(p => [p, 'installed'])));
    const out = run(bin);
    expect(out.status).toBe(0);
    expect(out.stderr).toBe('');
    expect(out.stdout.trimEnd().split('\n')).toHaveLength(1);
    expect(callsOf(calls)).toHaveLength(1);
  });

  it('should name every package when dpkg-query cannot be run', () => {
    const empty = fs.mkdtempSync(path.join(os.tmpdir(), 'psiscape-nodpkg-'));
    dirs.push(empty);
    const result = spawnSync(process.execPath, [script], { encoding: 'utf8', env: { ...process.env, PATH: empty } });
    expect(result.status).toBe(1);
    expect(result.stderr).toContain('dpkg-query could not be run');
    expect(result.stderr).toContain(`apt-get install -y --no-install-recommends ${ALL.join(' ')}\n`);
  });

  it('should be the first step of npm test', () => {
    const pkg = JSON.parse(fs.readFileSync(path.join(root, 'package.json'), 'utf8')) as { scripts: Record<string, string> };
    expect(pkg.scripts.test.startsWith('node scripts/preflight.mjs && ')).toBe(true);
  });
});
