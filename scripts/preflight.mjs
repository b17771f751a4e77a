#!/usr/bin/env node
// First step of `npm test`: are the Debian packages the tests use installed?
// One dpkg-query call checks all of them; if any is missing, one message names
// every missing package and the one apt-get line that installs them, and the
// script exits with status 1 before anything is built.
//
//   node scripts/preflight.mjs          check (silent apart from one line when all is present)
//   node scripts/preflight.mjs --list   print the package names, space-separated (for CI set-up)
//
// Uses only Node's own modules: CI calls `--list` before `npm ci`.
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import process from 'node:process';
import { fileURLToPath } from 'node:url';

/** Every Debian package the tests need, with what needs it. */
export const SYSTEM_PACKAGES = [
  ['chromium', 'browser tests: playwright-core drives /usr/bin/chromium'],
  ['python3-build', 'wheel test: python3 -m build'],
  ['python3-hatchling', 'wheel test: the build backend'],
  ['python3-wheel', 'wheel test: wheel support for the build'],
  ['python3-venv', 'wheel test: a fresh virtual environment to install into'],
  ['python3-jupyter-server', 'wheel test and real-server browser tests: the Jupyter server'],
  ['python3-jupyterlab-server', 'wheel test and real-server browser tests: JupyterLab\'s server side'],
  ['python3-ipykernel', 'real-server browser tests: the Python kernel'],
  ['python3-pandas', 'real-server browser tests: DataFrame outputs'],
  ['python3-nbconvert', 'real-server browser tests: used by the Jupyter server']
].map(([name, why]) => ({ name, why }));

export const PACKAGE_NAMES = SYSTEM_PACKAGES.map(p => p.name);

/**
 * Names of the packages in `names` that dpkg does not report as installed.
 * Returns null when dpkg-query cannot be run at all (not a Debian system).
 */
export function missingPackages(names) {
  // dpkg-query prints one line per package it knows (installed or not) and
  // complains on stderr about the ones it has never heard of; its exit status
  // is 1 in that case, so the status alone says nothing about which.
  const result = spawnSync('dpkg-query', ['-W', '-f=${Package}\\t${db:Status-Status}\\n', ...names], {
    encoding: 'utf8'
  });
  if (result.error) {
    return null;
  }
  const installed = new Set();
  for (const line of result.stdout.split('\n')) {
    const [name, status] = line.split('\t');
    if (name && status?.trim() === 'installed') {
      installed.add(name.split(':')[0]);
    }
  }
  return names.filter(name => !installed.has(name));
}

function installLine(names) {
  const asRoot = typeof process.getuid === 'function' && process.getuid() === 0;
  return `${asRoot ? '' : 'sudo '}apt-get install -y --no-install-recommends ${names.join(' ')}`;
}

function report(missing, dpkgAvailable) {
  const width = Math.max(...missing.map(name => name.length));
  const lines = [];
  if (dpkgAvailable) {
    lines.push(`The tests need ${missing.length} Debian package${missing.length === 1 ? '' : 's'} that ${missing.length === 1 ? 'is' : 'are'} not installed:`);
  } else {
    lines.push('The tests need these Debian packages, and dpkg-query could not be run to check them (this set-up expects Debian 12):');
  }
  for (const name of missing) {
    const why = SYSTEM_PACKAGES.find(p => p.name === name)?.why ?? '';
    lines.push(`    ${name.padEnd(width)}  ${why}`);
  }
  lines.push('Install them all with:', `    ${installLine(missing)}`);
  lines.push('(run apt-get update first if apt-get cannot find them), then run npm test again.');
  return lines.join('\n');
}

function main(argv) {
  if (argv.includes('--list')) {
    process.stdout.write(`${PACKAGE_NAMES.join(' ')}\n`);
    return 0;
  }
  const unknown = argv.filter(a => a !== '--list');
  if (unknown.length > 0) {
    process.stderr.write(`preflight: unknown argument ${unknown[0]}; use --list or no argument\n`);
    return 2;
  }
  const missing = missingPackages(PACKAGE_NAMES);
  if (missing === null) {
    process.stderr.write(`${report(PACKAGE_NAMES, false)}\n`);
    return 1;
  }
  if (missing.length > 0) {
    process.stderr.write(`${report(missing, true)}\n`);
    return 1;
  }
  process.stdout.write(`preflight: all ${PACKAGE_NAMES.length} Debian packages the tests need are installed\n`);
  return 0;
}

if (process.argv[1] && fs.realpathSync(fileURLToPath(import.meta.url)) === fs.realpathSync(process.argv[1])) {
  process.exitCode = main(process.argv.slice(2));
}
