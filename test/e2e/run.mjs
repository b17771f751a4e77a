#!/usr/bin/env node
// End-to-end suite: builds what is missing, then runs every *.e2e.mjs file with
// node's test runner against the built demo lab in Debian's Chromium.
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { requireChromium } from './browser.mjs';
import { ensureExtensionBuilt } from '../../scripts/ensure-built.mjs';

const here = path.dirname(fileURLToPath(import.meta.url));
const root = path.resolve(here, '..', '..');
requireChromium();

ensureExtensionBuilt();
const { buildDemo } = await import('../../demo/build.mjs');
buildDemo();

const files = fs.readdirSync(here).filter(f => f.endsWith('.e2e.mjs')).map(f => path.join(here, f));
const result = spawnSync(process.execPath, ['--test', '--test-concurrency=1', ...files], { stdio: 'inherit', cwd: root });
process.exit(result.status ?? 1);
