#!/usr/bin/env node
// `npm start`: build what is missing (extension, host, demo site) and serve the
// kernel-free demo lab on 127.0.0.1. Port: --port N, or PSISCAPE_PORT, else 8900.
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { buildDemo } from './build.mjs';
import { serve } from './serve.mjs';
import { ensureExtensionBuilt } from '../scripts/ensure-built.mjs';

const demoDir = path.dirname(fileURLToPath(import.meta.url));

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

const t0 = Date.now();
ensureExtensionBuilt();
buildDemo();
const server = await serve({ root: path.join(demoDir, 'dist'), host, port });
console.log(`[demo] ready in ${((Date.now() - t0) / 1000).toFixed(1)} s`);
console.log(`[demo] psiscape demo lab: http://${host}:${port}/lab/index.html`);
console.log('[demo] press Ctrl+C to stop');
process.on('SIGINT', () => server.close(() => process.exit(0)));
process.on('SIGTERM', () => server.close(() => process.exit(0)));
