#!/usr/bin/env node
// `npm start`: build what is missing and serve the kernel-free demo lab on
// 127.0.0.1, saying what it is doing. The labextension (TypeScript, then
// JupyterLab's builder) and the lab frontend (webpack) are independent, so
// they build side by side; then the demo site is assembled and served.
// Port: --port N, or PSISCAPE_PORT, else 8900.
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { assembleDemo, buildHostStep, hostUpToDate } from './build.mjs';
import { serve } from './serve.mjs';
import { ensureExtensionBuiltStep, extensionUpToDate } from '../scripts/ensure-built.mjs';
import { progress } from '../scripts/steps.mjs';

const demoDir = path.dirname(fileURLToPath(import.meta.url));
const TAG = 'start';

function option(name) {
  const i = process.argv.indexOf(`--${name}`);
  return i > 0 ? process.argv[i + 1] : undefined;
}

const port = Number(option('port') ?? process.env.PSISCAPE_PORT ?? 8900);
if (!Number.isInteger(port) || port <= 0 || port > 65535) {
  console.error(`invalid port: ${option('port') ?? process.env.PSISCAPE_PORT}`);
  process.exit(2);
}
const host = '127.0.0.1';

const extensionReady = extensionUpToDate();
const hostReady = hostUpToDate();
progress(TAG, `labextension ${extensionReady ? 'up to date' : 'to build'}; lab frontend ${hostReady ? 'up to date' : 'to build'}`);
try {
  await Promise.all([ensureExtensionBuiltStep(TAG), buildHostStep(TAG)]);
} catch (error) {
  console.error(`[${TAG}] ${error.message}`);
  process.exit(1);
}
progress(TAG, 'assembling the demo site…');
assembleDemo();
const server = await serve({ root: path.join(demoDir, 'dist'), host, port });
progress(TAG, `serving the psiscape demo lab: http://${host}:${port}/lab/index.html`);
console.log(`[${TAG}] press Ctrl+C to stop`);
process.on('SIGINT', () => server.close(() => process.exit(0)));
process.on('SIGTERM', () => server.close(() => process.exit(0)));
