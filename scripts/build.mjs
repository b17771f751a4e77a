#!/usr/bin/env node
// `npm run build`: TypeScript first (the builder needs lib/), then the labextension.
import { execFileSync } from 'node:child_process';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const run = (cmd, args) => execFileSync(cmd, args, { stdio: 'inherit', cwd: root });
const t0 = Date.now();
run(process.execPath, [path.join(root, 'node_modules/typescript/bin/tsc'), '-p', 'tsconfig.json']);
const t1 = Date.now();
run(process.execPath, [path.join(root, 'scripts/build-labextension.mjs'), ...process.argv.slice(2)]);
const t2 = Date.now();
console.log(`build: tsc ${((t1 - t0) / 1000).toFixed(1)} s, labextension ${((t2 - t1) / 1000).toFixed(1)} s`);
